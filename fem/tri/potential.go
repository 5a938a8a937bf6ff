package tri

import (
	"errors"
	"fmt"

	"gapcert/fem/mesh"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// Potential is a function V of (x, y) on a mesh, held triangle by triangle
// as a model
//
//	V(v_0 + λ_1 (v_1 − v_0) + λ_2 (v_2 − v_0)) ∈ Σ_κ w_κ B^q_κ(λ) + R_T
//
// (v_i the exact vertices of T in local order, λ the barycentric
// coordinates) with interval Bernstein coefficients w and a remainder
// interval R_T, and with an enclosure of the range of V over T. A
// polynomial V of degree ≤ q is exact (R_T = 0). The models are computed
// once and serve every assembly on that mesh.
type Potential struct {
	mesh  *mesh.Mesh
	q     int
	bern  [][]interval.I
	rem   []interval.I
	rng   []interval.I
	exact bool

	expr      *formula.Expr // the expression modelled
	inverseOf *Potential    // set by InverseShifted: this models 1/(inverseOf + shift)
	shift     interval.I
}

// maxExactDegree is the largest polynomial degree of V for which
// NewPotential raises the order to make the model exact (higher degrees
// keep the requested order and a remainder; the tables grow like q²).
const maxExactDegree = 12

// NewPotential builds the models of v (variables x, y; parameters bound) of
// Taylor order ≥ order on every triangle of m, from formula.Expr.Model2 in
// the reference coordinates (ξ, η) = (λ_1, λ_2). If v is a polynomial of
// degree ≤ maxExactDegree its degree is used when larger, so that the
// model is exact. The monomials
// ξ^i η^j are rewritten in the degree-q Bernstein basis by the exact
// monomial identity of tables.go. The range of V over T is the hull of the
// Bernstein coefficients plus R_T (range identity), intersected with
// formula.RangeTriangle when that succeeds (both contain the range). On a
// triangle where abs, min or max has a kink inside (no Taylor model, a
// *formula.SmoothnessError), the model is the range model of rangeModel.
// Any other error of a model (a domain error) is returned with the
// triangle where it arose.
func NewPotential(m *mesh.Mesh, v *formula.Expr, order int) (*Potential, error) {
	if v == nil {
		panic("tri: nil potential expression")
	}
	q := max(order, 1)
	if p, ok := v.Polynomial(); ok && p.Degree() <= maxExactDegree {
		q = max(q, p.Degree())
	}
	pairs := monomialPairs(q)
	w := monomialTable(q).IV
	nq := dim(q)
	pot := &Potential{mesh: m, q: q, exact: true, expr: v,
		bern: make([][]interval.I, len(m.Tris)), rem: make([]interval.I, len(m.Tris)), rng: make([]interval.I, len(m.Tris))}
	for t := range m.Tris {
		vert := m.Vertices(t)
		mod, err := v.Model2(vert, q)
		if err != nil {
			var kink *formula.SmoothnessError
			if !errors.As(err, &kink) {
				return nil, fmt.Errorf("tri: potential on triangle %d %v: %w", t, vert, err)
			}
			// A kink of abs, min or max inside T: no Taylor model
			// exists, so the range model V ∈ mid + (range − mid) is used.
			b, rem, rng, ok := rangeModel(v, vert, nq)
			if !ok {
				return nil, fmt.Errorf("tri: potential on triangle %d %v: %w", t, vert, err)
			}
			pot.bern[t], pot.rem[t], pot.rng[t] = b, rem, rng
			pot.exact = false
			continue
		}
		b := make([]interval.I, nq)
		for k, ij := range pairs {
			c := mod.C[ij[0]][ij[1]]
			if c.Lo == 0 && c.Hi == 0 {
				continue
			}
			row := w[k*nq : (k+1)*nq]
			for d := range b {
				if row[d].Hi != 0 {
					b[d] = b[d].Add(c.Mul(row[d]))
				}
			}
		}
		pot.bern[t], pot.rem[t] = b, mod.R
		if mod.R != (interval.I{}) {
			pot.exact = false
		}
		r := hull(b).Add(mod.R)
		var direct interval.I
		if direct, err = v.RangeTriangle(vert); err == nil {
			if s, ok := r.Intersection(direct); ok {
				r = s
			}
		}
		pot.rng[t] = r
	}
	return pot, nil
}

// rangeModel returns the model of v on the triangle vert made of its range
// alone: every Bernstein coefficient (nq of them) the float m nearest the
// midpoint of an enclosure r of the range of v over the triangle
// (formula.RangeTriangle), and the remainder r − m. Since the Bernstein
// basis sums to 1 the polynomial part is the constant m, and V ∈ m +
// (r − m) on T for every point: a valid model of any V with a bounded
// range, whatever its smoothness, with remainder O(h·Lipschitz constant).
// ok is false if the range is not enclosed.
func rangeModel(v *formula.Expr, vert [3][2]interval.I, nq int) (bern []interval.I, rem, rng interval.I, ok bool) {
	r, err := v.RangeTriangle(vert)
	if err != nil || !r.IsBounded() {
		return nil, interval.I{}, interval.I{}, false
	}
	mid := interval.Point(r.Mid())
	bern = make([]interval.I, nq)
	for i := range bern {
		bern[i] = mid
	}
	return bern, r.Sub(mid), r, true
}

func hull(b []interval.I) interval.I {
	r := b[0]
	for _, c := range b[1:] {
		r = r.Hull(c)
	}
	return r
}

// Mesh returns the mesh the models live on.
func (v *Potential) Mesh() *mesh.Mesh { return v.mesh }

// Degree returns the degree q of the Bernstein parts.
func (v *Potential) Degree() int { return v.q }

// Model returns the Bernstein coefficients (degree Degree(), in the order
// of the multi-indices (q − i − j, i, j)) and the remainder on triangle t.
// The slice must not be modified.
func (v *Potential) Model(t int) (bern []interval.I, rem interval.I) { return v.bern[t], v.rem[t] }

// Range returns an enclosure of V over triangle t.
func (v *Potential) Range(t int) interval.I { return v.rng[t] }

// Exact reports whether every remainder is [0, 0].
func (v *Potential) Exact() bool { return v.exact }

// InverseShifted returns the models of w = 1/(V + γ) on the same mesh, of
// Taylor order ≥ order, from the expression formula.Div(1, V + γ) (the
// weight of the Lehmann–Goerisch flux terms, package doc, Lehmann–Goerisch
// fluxes). It returns a
// *SignError unless V + γ > 0 is verified on every triangle (by the range
// enclosures of v), so that w is defined and smooth wherever V is.
func (v *Potential) InverseShifted(gamma interval.I, order int) (*Potential, error) {
	for t := range v.mesh.Tris {
		if g := v.rng[t].Add(gamma); !(g.Lo > 0) || !g.IsBounded() {
			return nil, &SignError{What: "V + γ", Triangle: t, Vertices: v.mesh.Vertices(t), Range: g, Need: "> 0"}
		}
	}
	if poly, ok := v.expr.Polynomial(); ok && poly.Degree() == 0 {
		order = 1 // 1/(V + γ) is constant: its order-1 model is exact
	}
	we := formula.Div(formula.Const(interval.I{Lo: 1, Hi: 1}), formula.Add(v.expr, formula.Const(gamma)))
	w, err := NewPotential(v.mesh, we, order)
	if err != nil {
		return nil, err
	}
	w.inverseOf, w.shift = v, gamma
	return w, nil
}

// SignError reports that a quantity a theorem requires nonnegative (or
// positive) is not verified so on a triangle.
type SignError struct {
	What     string           // e.g. "V + γ"
	Triangle int              // triangle index
	Vertices [3][2]interval.I // its vertex enclosures
	Range    interval.I       // the enclosure that failed the test
	Need     string           // "≥ 0" or "> 0"
}

func (e *SignError) Error() string {
	v := e.Vertices
	return fmt.Sprintf("tri: %s is not verified %s on triangle %d with vertices (%g, %g), (%g, %g), (%g, %g): enclosure %v (hint: choose a larger shift γ or a finer mesh)",
		e.What, e.Need, e.Triangle, v[0][0].Mid(), v[0][1].Mid(), v[1][0].Mid(), v[1][1].Mid(), v[2][0].Mid(), v[2][1].Mid(), e.Range)
}

// errUnbounded reports a model that is not finite.
var errUnbounded = errors.New("tri: potential model is not bounded on a triangle")
