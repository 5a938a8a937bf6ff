package tet

import (
	"errors"
	"fmt"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// Potential is a function V of (x, y, z) on a mesh, held tetrahedron by
// tetrahedron as a model
//
//	V(v_0 + λ_1 (v_1 − v_0) + λ_2 (v_2 − v_0) + λ_3 (v_3 − v_0)) ∈ Σ_κ w_κ B^q_κ(λ) + R_T
//
// (v_i the exact vertices of T in local order, λ the barycentric
// coordinates) with interval Bernstein coefficients w and a remainder
// interval R_T, and with an enclosure of the range of V over T. A
// polynomial V of degree ≤ q has R_T = 0. The models are computed once and
// serve every assembly on that mesh.
type Potential struct {
	mesh  *Mesh
	q     int
	bern  [][]interval.I
	rem   []interval.I
	rng   []interval.I
	exact bool
	expr  *formula.Expr

	// inverseOf and shift are set on the models made by InverseShifted:
	// they enclose 1/(V + shift) for the potential inverseOf.
	inverseOf *Potential
	shift     interval.I
}

// maxExactDegree is the largest polynomial degree of V for which
// NewPotential raises the order to make the model exact (higher degrees
// keep the requested order and a remainder; the triple tables grow like
// q³p⁶).
const maxExactDegree = 6

// NewPotential builds the models of v (variables x, y, z; parameters
// bound) of Taylor order q ≥ max(order, 1) on every tetrahedron of m, from
// formula.Expr.Model3 in the reference coordinates (ξ, η, ζ) = (λ_1, λ_2,
// λ_3). If v is a polynomial of degree ≤ maxExactDegree
// (formula.Expr.PolynomialDegree) its degree is used when larger, so that
// the model is exact (R_T = 0). The
// monomials ξ^i η^j ζ^l are rewritten in the degree-q Bernstein basis by
// the exact monomial identity of tables.go. The range of V over T is the
// hull of the Bernstein coefficients plus R_T (range identity),
// intersected with formula.RangeTetrahedron when that succeeds (both
// contain the range). On a tetrahedron where abs, min or max has a kink
// that neither the tetrahedron (affine arguments) nor its bounding box
// decides (a *formula.SmoothnessError), the model
// is the range model: every coefficient the midpoint m of the range
// enclosure r and R_T = r − m, valid since the B^q_κ sum to 1. Any other
// error of a model is returned with the tetrahedron where it arose.
func NewPotential(m *Mesh, v *formula.Expr, order int) (*Potential, error) {
	if v == nil {
		panic("tet: nil potential expression")
	}
	q := max(order, 1)
	if d, ok := v.PolynomialDegree("x", "y", "z"); ok && d <= maxExactDegree {
		q = max(q, d)
	}
	trip := monomialTriples(q)
	w := monomialTable(q).IV
	nq := dim3(q)
	pot := &Potential{mesh: m, q: q, exact: true, expr: v,
		bern: make([][]interval.I, len(m.tets)), rem: make([]interval.I, len(m.tets)), rng: make([]interval.I, len(m.tets))}
	for t := range m.tets {
		vert := m.Vertices(t)
		direct, derr := v.RangeTetrahedron(vert)
		mod, err := v.Model3(vert, q)
		if err != nil {
			var kink *formula.SmoothnessError
			if !errors.As(err, &kink) || derr != nil || !direct.IsBounded() {
				return nil, fmt.Errorf("tet: potential on tetrahedron %d: %w", t, err)
			}
			mid := interval.Point(direct.Mid())
			b := make([]interval.I, nq)
			for i := range b {
				b[i] = mid
			}
			pot.bern[t], pot.rem[t], pot.rng[t] = b, direct.Sub(mid), direct
			pot.exact = false
			continue
		}
		b := make([]interval.I, nq)
		for k, g := range trip {
			c := mod.C[g[0]][g[1]][g[2]]
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
		if derr == nil {
			if s, ok := r.Intersection(direct); ok {
				r = s
			}
		}
		pot.rng[t] = r
	}
	return pot, nil
}

func hull(b []interval.I) interval.I {
	r := b[0]
	for _, c := range b[1:] {
		r = r.Hull(c)
	}
	return r
}

// Mesh returns the mesh the models live on.
func (v *Potential) Mesh() *Mesh { return v.mesh }

// Degree returns the degree q of the Bernstein parts.
func (v *Potential) Degree() int { return v.q }

// Model returns the Bernstein coefficients (degree Degree(), in
// multiIndex order) and the remainder on tetrahedron t. The slice must not
// be modified.
func (v *Potential) Model(t int) (bern []interval.I, rem interval.I) { return v.bern[t], v.rem[t] }

// MultiIndices returns the multi-indices of degree Degree() in the order
// of Model's coefficients (a new slice).
func (v *Potential) MultiIndices() [][4]int {
	return append([][4]int(nil), multiIndex(4, v.q).alpha...)
}

// Range returns an enclosure of V over tetrahedron t.
func (v *Potential) Range(t int) interval.I { return v.rng[t] }

// Exact reports whether every remainder is [0, 0].
func (v *Potential) Exact() bool { return v.exact }

// InverseShifted returns the models of w = 1/(V + γ) on the same mesh, of
// Taylor order ≥ order (the weight of Lehmann–Goerisch flux terms). It
// returns a *SignError unless V + γ > 0 is verified on every tetrahedron
// (by the range enclosures of v), so that w is defined and smooth wherever
// V is.
func (v *Potential) InverseShifted(gamma interval.I, order int) (*Potential, error) {
	for t := range v.mesh.tets {
		if g := v.rng[t].Add(gamma); !(g.Lo > 0) || !g.IsBounded() {
			return nil, &SignError{What: "V + γ", Tetrahedron: t, Vertices: v.mesh.Vertices(t), Range: g, Need: "> 0"}
		}
	}
	if len(v.expr.Vars()) == 0 {
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
// positive) is not verified so on a tetrahedron.
type SignError struct {
	What        string           // e.g. "V + γ"
	Tetrahedron int              // tetrahedron index
	Vertices    [4][3]interval.I // its vertex enclosures
	Range       interval.I       // the enclosure that failed the test
	Need        string           // "≥ 0" or "> 0"
}

func (e *SignError) Error() string {
	v := e.Vertices
	return fmt.Sprintf("tet: %s is not verified %s on tetrahedron %d with vertices (%g, %g, %g), (%g, %g, %g), (%g, %g, %g), (%g, %g, %g): enclosure %v (hint: choose a larger shift γ or a finer mesh)",
		e.What, e.Need, e.Tetrahedron, v[0][0].Mid(), v[0][1].Mid(), v[0][2].Mid(), v[1][0].Mid(), v[1][1].Mid(), v[1][2].Mid(),
		v[2][0].Mid(), v[2][1].Mid(), v[2][2].Mid(), v[3][0].Mid(), v[3][1].Mid(), v[3][2].Mid(), e.Range)
}

// errUnboundedModel reports a model that is not finite.
var errUnboundedModel = errors.New("tet: potential model is not bounded on a tetrahedron")
