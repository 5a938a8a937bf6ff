package problem

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"strconv"

	"gapcert/fem/boundary"
)

// Canonical returns the canonical JSON text of p: no insignificant
// whitespace, object keys sorted, every number as its canonical exact text
// (Number.Text) in a string, the potential as its canonical formula text
// with parameter names unbound, the boundary as the explicit per-side list,
// every default filled in, the polygon in counterclockwise order and the
// polyhedron's faces outward;
// "points" appears only when the problem has points.
// Parse(p.Canonical()) gives a problem with the same Canonical text.
func (p *Problem) Canonical() []byte {
	var b bytes.Buffer
	b.WriteString(`{"boundary":[`)
	boundaryList := p.Boundary
	if p.product != nil {
		boundaryList = nil
		b.Write(p.productCanonical("boundary")[1:]) // without its "[", which is written already
		b.Truncate(b.Len() - 1)                     // and its "]", written below
	}
	for i, bc := range boundaryList {
		if i > 0 {
			b.WriteByte(',')
		}
		switch bc.Kind {
		case boundary.Robin:
			b.WriteString(`{"robin":`)
			writeString(&b, bc.Alpha.Text)
			b.WriteByte('}')
		default:
			writeString(&b, bc.Kind.String())
		}
	}
	b.WriteString(`],"claims":[`)
	for i, c := range p.Claims {
		if i > 0 {
			b.WriteByte(',')
		}
		writeString(&b, c)
	}
	b.WriteString(`],"domain":{`)
	if p.product != nil {
		d := p.productCanonical("domain")
		b.Write(d[1 : len(d)-1]) // "product":[…]
	} else if p.Dim == 1 {
		b.WriteString(`"interval":[`)
		writeString(&b, p.Interval[0].Text)
		b.WriteByte(',')
		writeString(&b, p.Interval[1].Text)
		b.WriteByte(']')
	} else if p.Polyhedron != nil {
		p.Polyhedron.writeCanonical(&b)
	} else {
		b.WriteString(`"polygon":[`)
		for i, v := range p.Vertices {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteByte('[')
			writeString(&b, v[0].Text)
			b.WriteByte(',')
			writeString(&b, v[1].Text)
			b.WriteByte(']')
		}
		b.WriteByte(']')
	}
	b.WriteString(`},"eigenvalues":`)
	b.WriteString(strconv.Itoa(p.Eigenvalues))
	b.WriteString(`,"name":`)
	writeString(&b, p.Name)
	b.WriteString(`,"parameters":{`)
	for i, name := range p.sortedParamNames() {
		if i > 0 {
			b.WriteByte(',')
		}
		writeString(&b, name)
		b.WriteByte(':')
		writeString(&b, p.Params[name].Text)
	}
	b.WriteByte('}')
	if len(p.Points) > 0 {
		// Written only when present, so that the canonical text (and hash)
		// of a problem without points is what it was before the key existed.
		b.WriteString(`,"points":[`)
		for i, pt := range p.Points {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteByte('[')
			for j, c := range pt {
				if j > 0 {
					b.WriteByte(',')
				}
				writeString(&b, c.Text)
			}
			b.WriteByte(']')
		}
		b.WriteByte(']')
	}
	b.WriteString(`,"potential":`)
	writeString(&b, p.potentialText)
	b.WriteString(`,"target":{"relative_width":`)
	writeString(&b, p.RelWidth.Text)
	b.WriteString(`}}`)
	return b.Bytes()
}

// writeString writes s as a JSON string (without HTML escaping, so that
// claims keep their "<" and ">").
func writeString(b *bytes.Buffer, s string) {
	var t bytes.Buffer
	enc := json.NewEncoder(&t)
	enc.SetEscapeHTML(false)
	_ = enc.Encode(s) // a string always encodes
	b.Write(bytes.TrimSuffix(t.Bytes(), []byte("\n")))
}

// SHA256 returns the lowercase hex SHA-256 digest of p.Canonical().
func (p *Problem) SHA256() string {
	sum := sha256.Sum256(p.Canonical())
	return hex.EncodeToString(sum[:])
}
