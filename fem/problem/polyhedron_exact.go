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

// xnum is a number built from the polyhedron's coordinates: exact (a surd)
// when every coordinate is one, else only its enclosure. The zero value is
// 0 in both kinds (an operation with an exact operand is exact; the
// coordinates of one polyhedron are all of one kind).
type xnum struct {
	s     algebraic.Surd
	v     interval.I
	exact bool
}

func (a xnum) add(b xnum) xnum {
	if a.exact || b.exact {
		return xnum{s: a.s.Add(b.s), exact: true}
	}
	return xnum{v: a.v.Add(b.v)}
}

func (a xnum) sub(b xnum) xnum {
	if a.exact || b.exact {
		return xnum{s: a.s.Sub(b.s), exact: true}
	}
	return xnum{v: a.v.Sub(b.v)}
}

func (a xnum) mul(b xnum) xnum {
	if a.exact || b.exact {
		return xnum{s: a.s.Mul(b.s), exact: true}
	}
	return xnum{v: a.v.Mul(b.v)}
}

// scale returns q·a for a rational q.
func (a xnum) scale(q *big.Rat) xnum {
	if a.exact {
		return xnum{s: a.s.Scale(q), exact: true}
	}
	return xnum{v: a.v.Mul(decimalio.FromRat(q))}
}

// enclose encloses the value.
func (a xnum) enclose() interval.I {
	if a.exact {
		if r, ok := a.s.Rat(); ok {
			return decimalio.FromRat(r)
		}
		return a.s.Enclose()
	}
	return a.v
}

// sign returns the sign of the value; ok is false when it is not decided.
func (a xnum) sign() (int, bool) {
	if a.exact {
		if a.s.IsZero() {
			return 0, true
		}
		if r, ok := a.s.Rat(); ok {
			return r.Sign(), true
		}
		s, ok := signOf(a.s.Enclose())
		return s, ok && s != 0
	}
	return signOf(a.v)
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

func (a vec3) enclose() [3]interval.I {
	return [3]interval.I{a[0].enclose(), a[1].enclose(), a[2].enclose()}
}

// orient3 returns the sign of det(b − a, c − a, d − a): +1 when the
// tetrahedron (a, b, c, d) is positively oriented (d on the side of the
// plane abc into which (b − a) × (c − a) points), −1 for the other side,
// 0 when the four points are coplanar.
func orient3(a, b, c, d vec3) (int, bool) {
	return b.sub(a).cross(c.sub(a)).dot(d.sub(a)).sign()
}

// exactPoints returns the vertices as vec3: surds when every coordinate
// is read exactly as one (package algebraic), else enclosures.
func exactPoints(vs [][3]Number) []vec3 {
	out := make([]vec3, len(vs))
	exact := true
	for i, p := range vs {
		for k, n := range p {
			if !exact {
				break
			}
			if n.Rat != nil {
				out[i][k] = xnum{s: algebraic.NewSurd(n.Rat), exact: true}
				continue
			}
			s, ok := algebraic.ReadSurd(n.Text, n.Val)
			if !ok {
				exact = false
				break
			}
			out[i][k] = xnum{s: s, exact: true}
		}
	}
	if exact {
		return out
	}
	for i, p := range vs {
		for k, n := range p {
			out[i][k] = xnum{v: n.Val}
		}
	}
	return out
}
