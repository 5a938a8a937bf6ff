package problem

import (
	"math/big"

	"gapcert/interval"
	"gapcert/interval/algebraic"
	"gapcert/interval/decimalio"
)

// This file holds the exact arithmetic of the polyhedron's predicates.
// When every coordinate is a surd Σ q_i·√r_i (rationals included; package
// interval/algebraic reads the constant formulas), each predicate is a
// polynomial in the coordinates and so a surd, computed exactly: its sign
// is 0 exactly when the normalised surd has no term (Besicovitch's
// theorem, see package algebraic), the sign of its rational value when it
// is rational, and otherwise the sign of its enclosure when that excludes
// 0. When some coordinate is not a surd the predicates are computed on the
// coordinates' enclosures and decide a sign only when the enclosure
// excludes 0 or is the point 0, so that every exact value inside has that
// sign. An undecided sign is reported; it is never guessed.

// xnum is a number built from the polyhedron's coordinates: exact (a surd,
// or an element of one cyclotomic field) when every coordinate is one,
// else only its enclosure. The zero value is the number 0 of any kind:
// an operation takes the kind of its exact operand (the coordinates of one
// polyhedron are all of one kind).
//
// An exact xnum may carry an enclosure of its value too (hasV, set for the
// coordinates and the apex candidates): the predicates are first evaluated
// on these enclosures, a filter that settles most signs at once, and
// exactly only when the enclosure of the result contains 0 (a sign decided
// from enclosures holds for the exact value inside them).
type xnum struct {
	kind numKind
	s    algebraic.Surd
	c    algebraic.Cyclotomic
	v    interval.I
	hasV bool
}

// numKind says how an xnum is held.
type numKind uint8

const (
	enclosed   numKind = iota // only an enclosure
	surd                      // exact, Σ q_i·√r_i
	cyclotomic                // exact, in Q(ζ_m)
)

// like returns a converted to b's kind when a is the zero value.
func (a xnum) like(b xnum) xnum {
	if a.kind != enclosed || b.kind == enclosed {
		return a
	}
	switch b.kind {
	case surd:
		return xnum{kind: surd}
	default:
		return xnum{kind: cyclotomic, c: b.c.Scale(new(big.Rat))}
	}
}

func (a xnum) add(b xnum) xnum {
	a, b = a.like(b), b.like(a)
	switch a.kind {
	case surd:
		return xnum{kind: surd, s: a.s.Add(b.s)}
	case cyclotomic:
		return xnum{kind: cyclotomic, c: a.c.Add(b.c)}
	}
	return xnum{v: a.v.Add(b.v)}
}

func (a xnum) sub(b xnum) xnum {
	a, b = a.like(b), b.like(a)
	switch a.kind {
	case surd:
		return xnum{kind: surd, s: a.s.Sub(b.s)}
	case cyclotomic:
		return xnum{kind: cyclotomic, c: a.c.Sub(b.c)}
	}
	return xnum{v: a.v.Sub(b.v)}
}

func (a xnum) mul(b xnum) xnum {
	a, b = a.like(b), b.like(a)
	switch a.kind {
	case surd:
		return xnum{kind: surd, s: a.s.Mul(b.s)}
	case cyclotomic:
		return xnum{kind: cyclotomic, c: a.c.Mul(b.c)}
	}
	return xnum{v: a.v.Mul(b.v)}
}

// scale returns q·a for a rational q.
func (a xnum) scale(q *big.Rat) xnum {
	switch a.kind {
	case surd:
		return xnum{kind: surd, s: a.s.Scale(q)}
	case cyclotomic:
		return xnum{kind: cyclotomic, c: a.c.Scale(q)}
	}
	return xnum{v: a.v.Mul(decimalio.FromRat(q))}
}

// rat returns the value when it is an exact rational.
func (a xnum) rat() (*big.Rat, bool) {
	switch a.kind {
	case surd:
		return a.s.Rat()
	case cyclotomic:
		return a.c.Rat()
	}
	return nil, false
}

// enclose encloses the value.
func (a xnum) enclose() interval.I {
	if r, ok := a.rat(); ok {
		return decimalio.FromRat(r)
	}
	switch a.kind {
	case surd:
		return a.s.Enclose()
	case cyclotomic:
		return a.c.Enclose()
	}
	return a.v
}

// sign returns the sign of the value; ok is false when it is not decided.
func (a xnum) sign() (int, bool) {
	zero := false
	switch a.kind {
	case surd:
		zero = a.s.IsZero()
	case cyclotomic:
		zero = a.c.IsZero()
	default:
		return signOf(a.v)
	}
	if zero {
		return 0, true
	}
	if r, ok := a.rat(); ok {
		return r.Sign(), true
	}
	s, ok := signOf(a.enclose())
	return s, ok && s != 0
}

// vec3 is a point or vector of three xnum.
type vec3 [3]xnum

func (a vec3) sub(b vec3) vec3 { return vec3{a[0].sub(b[0]), a[1].sub(b[1]), a[2].sub(b[2])} }
func (a vec3) add(b vec3) vec3 { return vec3{a[0].add(b[0]), a[1].add(b[1]), a[2].add(b[2])} }

func (a vec3) scale(q *big.Rat) vec3 {
	return vec3{a[0].scale(q), a[1].scale(q), a[2].scale(q)}
}

func (a vec3) cross(b vec3) vec3 {
	return vec3{
		a[1].mul(b[2]).sub(a[2].mul(b[1])),
		a[2].mul(b[0]).sub(a[0].mul(b[2])),
		a[0].mul(b[1]).sub(a[1].mul(b[0])),
	}
}

func (a vec3) dot(b vec3) xnum {
	return a[0].mul(b[0]).add(a[1].mul(b[1])).add(a[2].mul(b[2]))
}

func (a vec3) neg() vec3 {
	var z vec3
	return z.sub(a)
}

func (a vec3) enclose() [3]interval.I {
	return [3]interval.I{a[0].enclose(), a[1].enclose(), a[2].enclose()}
}

// orient3 returns the sign of det(b − a, c − a, d − a): +1 when the
// tetrahedron (a, b, c, d) is positively oriented (d on the side of the
// plane abc into which (b − a) × (c − a) points), −1 for the other side,
// 0 when the four points are coplanar.
func orient3(a, b, c, d vec3) (int, bool) {
	if s, ok := filtered(func(a, b, c, d vec3) xnum { return b.sub(a).cross(c.sub(a)).dot(d.sub(a)) }, a, b, c, d); ok {
		return s, true
	}
	return b.sub(a).cross(c.sub(a)).dot(d.sub(a)).sign()
}

// filtered evaluates f on the enclosures of exact points that carry them
// and returns the sign when the enclosure decides it; ok is false when
// the points are not exact, lack enclosures, or the sign is undecided.
func filtered(f func(a, b, c, d vec3) xnum, pts ...vec3) (int, bool) {
	var e [4]vec3
	for i, p := range pts {
		for k := range 3 {
			if p[k].kind == enclosed || !p[k].hasV {
				return 0, false
			}
			e[i][k] = xnum{v: p[k].v}
		}
	}
	return f(e[0], e[1], e[2], e[3]).sign()
}

// withEnclosure returns a with the enclosure of each coordinate attached.
func (a vec3) withEnclosure() vec3 {
	for k := range 3 {
		if a[k].kind != enclosed {
			a[k].v, a[k].hasV = a[k].enclose(), true
		}
	}
	return a
}

// exactPoints returns the vertices as vec3: surds when every coordinate
// is read exactly as one, else elements of the smallest cyclotomic field
// holding every coordinate when each is read as a sum of rational
// multiples of roots of unity (cos and sin of rational multiples of π;
// package algebraic), else enclosures.
func exactPoints(vs [][3]Number) []vec3 {
	out := make([]vec3, len(vs))
	if surds, ok := readExact(vs, algebraic.NewSurd, algebraic.ReadSurd); ok {
		for i, p := range surds {
			for k := range 3 {
				out[i][k] = xnum{kind: surd, s: p[k], v: vs[i][k].Val, hasV: true}
			}
		}
		return out
	}
	if sums, ok := readExact(vs, algebraic.NewRootSum, algebraic.ReadRootSum); ok {
		all := make([]algebraic.RootSum, 0, 3*len(sums))
		for _, p := range sums {
			all = append(all, p[:]...)
		}
		if f, ok := algebraic.CyclotomicFieldOf(all...); ok {
			for i, p := range sums {
				for k := range 3 {
					out[i][k] = xnum{kind: cyclotomic, c: f.Element(p[k]), v: vs[i][k].Val, hasV: true}
				}
			}
			return out
		}
	}
	for i, p := range vs {
		for k, n := range p {
			out[i][k] = xnum{v: n.Val}
		}
	}
	return out
}

// readExact reads every coordinate exactly: a rational with fromRat, a
// constant formula (its canonical text, guarded by its enclosure) with
// read.
func readExact[T any](vs [][3]Number, fromRat func(*big.Rat) T, read func(string, interval.I) (T, bool)) ([][3]T, bool) {
	out := make([][3]T, len(vs))
	for i, p := range vs {
		for k, n := range p {
			if n.Rat != nil {
				out[i][k] = fromRat(n.Rat)
				continue
			}
			v, ok := read(n.Text, n.Val)
			if !ok {
				return nil, false
			}
			out[i][k] = v
		}
	}
	return out, true
}
