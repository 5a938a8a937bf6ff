package cover

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math/big"
	"os"
	"path/filepath"
	"reflect"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
	"gapcert/interval/decimalio"
)

// CellFormat is the format identifier of a cell certificate.
const CellFormat = "gapcert.cover-cell/v1"

// Cell is the certificate of one cell of a cover: the cell's exact bounds,
// the family it belongs to (its file, whole), the order of the eigenvalues
// in each parameter (the rules' decisions), its two corner certificates
// (files beside it, named and hashed), the enclosures of the claim
// quantities over the cell and the verdicts of the claims there.
type Cell struct {
	Format string `json:"format"`
	// Family is the family file's text, FamilySHA256 its SHA-256.
	Family       string `json:"family"`
	FamilySHA256 string `json:"family_sha256"`
	// Bounds are the cell's exact bounds, one per parameter in the
	// family's order.
	Bounds []ParamBounds `json:"bounds"`
	// Order is the family's Dependences.
	Order []Dependence `json:"order"`
	// Low and High are the corners whose certificates bound every
	// eigenvalue on the cell from below and from above; for a moving
	// triangle (GeometryRule) both are the reference triangle at the
	// cell's centre.
	Low  CornerRef `json:"low"`
	High CornerRef `json:"high"`
	// Quantities enclose each claim quantity over the cell.
	Quantities map[string]certs.Bound `json:"quantities"`
	Claims     []certs.ClaimResult    `json:"claims"`
	// Verdict is the least favourable verdict over Claims.
	Verdict    string           `json:"verdict"`
	Provenance certs.Provenance `json:"provenance"`
}

// ParamBounds is a parameter's range on a cell, in exact text.
type ParamBounds struct {
	Name string `json:"name"`
	Lo   string `json:"lo"`
	Hi   string `json:"hi"`
}

// CornerRef names a corner certificate: the corner's exact parameter
// values, the hash of its problem, the certificate's file (beside the
// cell certificate) and the SHA-256 of that file.
type CornerRef struct {
	Values            map[string]string `json:"values"`
	ProblemSHA256     string            `json:"problem_sha256"`
	File              string            `json:"file"`
	CertificateSHA256 string            `json:"certificate_sha256"`
}

// IsCell reports whether data is a JSON object whose "format" is
// CellFormat (so that a reader of several kinds of files can dispatch).
func IsCell(data []byte) bool {
	var head struct {
		Format string `json:"format"`
	}
	_ = json.Unmarshal(data, &head)
	return head.Format == CellFormat
}

// Marshal returns the cell certificate as indented JSON with a trailing
// newline.
func (c *Cell) Marshal() ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(c); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// UnmarshalCell reads a cell certificate strictly (package strictjson: no
// repeated, unknown or case-variant key at any depth) and demands the
// format CellFormat.
func UnmarshalCell(data []byte) (*Cell, error) {
	var c Cell
	if err := strictjson.Decode(data, &c); err != nil {
		return nil, certs.AsFormatError("", err)
	}
	if c.Format != CellFormat {
		return nil, &certs.FormatError{Path: "format", Msg: fmt.Sprintf("%q is not %q", c.Format, CellFormat)}
	}
	return &c, nil
}

// Box returns the cell's bounds as exact rationals, checked against the
// family's parameters (names in order, lo < hi inside the range).
func (c *Cell) Box(f *Family) (Box, error) {
	if len(c.Bounds) != len(f.Params) {
		return Box{}, &certs.FormatError{Path: "bounds", Msg: fmt.Sprintf("%d bounds for %d parameters", len(c.Bounds), len(f.Params))}
	}
	var b Box
	for j, pb := range c.Bounds {
		path := fmt.Sprintf("bounds[%d]", j)
		if pb.Name != f.Params[j].Name {
			return Box{}, &certs.FormatError{Path: path + ".name", Msg: fmt.Sprintf("%q is not the family's parameter %q", pb.Name, f.Params[j].Name)}
		}
		lo, err1 := decimalio.ParseRat(pb.Lo)
		hi, err2 := decimalio.ParseRat(pb.Hi)
		if err1 != nil || err2 != nil {
			return Box{}, &certs.FormatError{Path: path, Msg: "bounds are not exact numbers"}
		}
		if lo.Cmp(hi) >= 0 || lo.Cmp(f.Params[j].Lo) < 0 || hi.Cmp(f.Params[j].Hi) > 0 {
			return Box{}, &certs.FormatError{Path: path, Msg: fmt.Sprintf("[%s, %s] is not a range inside [%s, %s]", pb.Lo, pb.Hi, problem.RatText(f.Params[j].Lo), problem.RatText(f.Params[j].Hi))}
		}
		b.Lo, b.Hi = append(b.Lo, lo), append(b.Hi, hi)
	}
	return b, nil
}

func boundsOf(f *Family, b Box) []ParamBounds {
	out := make([]ParamBounds, len(f.Params))
	for j, p := range f.Params {
		out[j] = ParamBounds{Name: p.Name, Lo: problem.RatText(b.Lo[j]), Hi: problem.RatText(b.Hi[j])}
	}
	return out
}

func valuesOf(f *Family, v []*big.Rat) map[string]string {
	m := map[string]string{}
	for j, p := range f.Params {
		m[p.Name] = problem.RatText(v[j])
	}
	return m
}

func sha256Hex(data []byte) string {
	sum := sha256.Sum256(data)
	return hex.EncodeToString(sum[:])
}

// buildCell returns the cell certificate of b from its certified corners
// (corner files named by CornerFileName).
func (f *Family) buildCell(b Box, low, high corner, lowSHA, highSHA string, prov certs.Provenance) (*Cell, error) {
	env, claims, err := f.cellClaims(b, low, high)
	if err != nil {
		return nil, err
	}
	lv, hv := f.Corners(b)
	q := map[string]certs.Bound{}
	for name, v := range env {
		if name == "pi" || name == "e" {
			continue
		}
		q[name] = newBound(v)
	}
	return &Cell{
		Format: CellFormat, Family: string(f.data), FamilySHA256: f.SHA256,
		Bounds: boundsOf(f, b), Order: f.Dependences,
		Low:        CornerRef{Values: valuesOf(f, lv), ProblemSHA256: low.cert.ProblemSHA256, File: CornerFileName(low.cert.ProblemSHA256), CertificateSHA256: lowSHA},
		High:       CornerRef{Values: valuesOf(f, hv), ProblemSHA256: high.cert.ProblemSHA256, File: CornerFileName(high.cert.ProblemSHA256), CertificateSHA256: highSHA},
		Quantities: q, Claims: claims, Verdict: worstVerdict(claims), Provenance: prov,
	}, nil
}

// CornerVerifier verifies corner certificate files, each once: Verify
// returns the certificate in file path if its bytes hash to sha (""
// accepts any), it verifies (certify.Check) and it records the problem
// with hash problemSHA256. It is safe for concurrent use only through
// one goroutine at a time per file (the engine calls it so).
type CornerVerifier struct {
	verified map[string]*certs.Certificate // by certificate SHA-256
	memory   int64                         // budget of each recomputation
}

// NewCornerVerifier returns an empty verifier whose recomputations have
// the memory budget memory (certify.CheckWithin; 0: certify.DefaultMemory).
func NewCornerVerifier(memory int64) *CornerVerifier {
	return &CornerVerifier{verified: map[string]*certs.Certificate{}, memory: memory}
}

// Verify reads and verifies one corner certificate file.
func (v *CornerVerifier) Verify(path, sha, problemSHA256 string) (*certs.Certificate, string, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, "", err
	}
	got := sha256Hex(data)
	if sha != "" && got != sha {
		return nil, "", fmt.Errorf("%s has SHA-256 %s, not the recorded %s", filepath.Base(path), got, sha)
	}
	if c, ok := v.verified[got]; ok {
		if c.ProblemSHA256 != problemSHA256 {
			return nil, "", fmt.Errorf("%s records problem %s, not %s", filepath.Base(path), c.ProblemSHA256, problemSHA256)
		}
		return c, got, nil
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		return nil, "", fmt.Errorf("%s: %v", filepath.Base(path), err)
	}
	if c.ProblemSHA256 != problemSHA256 {
		return nil, "", fmt.Errorf("%s records problem %s, not %s", filepath.Base(path), c.ProblemSHA256, problemSHA256)
	}
	if err := certify.CheckWithin(data, v.memory); err != nil {
		return nil, "", fmt.Errorf("%s does not verify: %v", filepath.Base(path), err)
	}
	v.verified[got] = c
	return c, got, nil
}

// MismatchError lists the differences between a cell certificate and its
// recomputation.
type MismatchError struct {
	Problems []string
}

func (e *MismatchError) Error() string {
	var b bytes.Buffer
	b.WriteString("the cell certificate does not verify:")
	for _, p := range e.Problems {
		b.WriteString("\n  - " + p)
	}
	return b.String()
}

// CheckCell re-verifies the cell certificate data whose corner files lie
// in dir: it reads the certificate strictly, parses its family (the rules'
// decisions included) and demands the recorded hash, checks the bounds
// lie in the family's box, recomputes the order of the eigenvalues and
// the two corners, demands that each corner file hash to its recorded
// SHA-256, verify (certify.Check) and hold the family's problem at that
// corner, and recomputes the cell's quantities, claims and verdict from
// them, demanding equality field by field (provenance aside). A defect of
// layout is a *certs.FormatError, a difference a *MismatchError.
func CheckCell(data []byte, dir string, v *CornerVerifier) (*Cell, *Family, error) {
	c, err := UnmarshalCell(data)
	if err != nil {
		return nil, nil, err
	}
	if v == nil {
		v = NewCornerVerifier(0)
	}
	var mm []string
	if sha256Hex([]byte(c.Family)) != c.FamilySHA256 {
		return nil, nil, &MismatchError{Problems: []string{"family_sha256 is not the SHA-256 of family"}}
	}
	f, err := ParseFamily([]byte(c.Family))
	if err != nil {
		return nil, nil, &MismatchError{Problems: []string{"family: " + err.Error()}}
	}
	b, err := c.Box(f)
	if err != nil {
		return nil, nil, err
	}
	if !reflect.DeepEqual(jsonValue(c.Order), jsonValue(f.Dependences)) {
		mm = append(mm, "order differs from the rules' decisions on the family")
	}
	lv, hv := f.Corners(b)
	var corners [2]corner
	var shas [2]string
	for i, ref := range []CornerRef{c.Low, c.High} {
		name := [2]string{"low", "high"}[i]
		vals := [2][]*big.Rat{lv, hv}[i]
		p, err := f.Problem(vals)
		if err != nil {
			return nil, nil, err
		}
		if !reflect.DeepEqual(ref.Values, valuesOf(f, vals)) {
			mm = append(mm, fmt.Sprintf("%s.values are not the %s corner of the cell (%v)", name, name, valuesOf(f, vals)))
		}
		if ref.ProblemSHA256 != p.SHA256() || ref.File != CornerFileName(p.SHA256()) {
			mm = append(mm, fmt.Sprintf("%s: problem %s (file %s) is not the family's problem at the corner (%s)", name, ref.ProblemSHA256, ref.File, p.SHA256()))
			continue
		}
		cert, sha, err := v.Verify(filepath.Join(dir, ref.File), ref.CertificateSHA256, ref.ProblemSHA256)
		if err != nil {
			mm = append(mm, name+": "+err.Error())
			continue
		}
		corners[i], shas[i] = corner{problem: p, cert: cert}, sha
	}
	if len(mm) > 0 {
		return nil, nil, &MismatchError{Problems: mm}
	}
	re, err := f.buildCell(b, corners[0], corners[1], shas[0], shas[1], c.Provenance)
	if err != nil {
		return nil, nil, &MismatchError{Problems: []string{"recomputation: " + err.Error()}}
	}
	for _, d := range []struct {
		path      string
		got, want any
	}{
		{"quantities", c.Quantities, re.Quantities},
		{"claims", c.Claims, re.Claims},
		{"verdict", c.Verdict, re.Verdict},
		{"bounds", c.Bounds, re.Bounds},
	} {
		if !reflect.DeepEqual(jsonValue(d.got), jsonValue(d.want)) {
			mm = append(mm, fmt.Sprintf("%s differs from the recomputation", d.path))
		}
	}
	if len(mm) > 0 {
		return nil, nil, &MismatchError{Problems: mm}
	}
	return c, f, nil
}

// jsonValue returns v as a generic JSON value, for comparisons that do
// not depend on nil versus empty lists.
func jsonValue(v any) any {
	data, _ := json.Marshal(v)
	var out any
	_ = json.Unmarshal(data, &out)
	return out
}
