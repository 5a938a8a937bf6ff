package line

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// ModelFunc returns a Taylor model of a function f on the cell [a, b]:
// coefficients c_0..c_q and a remainder interval R such that for every
// exact a ∈ A, b ∈ B and ξ ∈ [0, 1]
//
//	f(a + ξ(b − a)) ∈ Σ_j c_j ξ^j + R.
//
// This is the contract of formula.Expr.Model1 (variable x), so an
// expression e is adapted by
//
//	func(a, b interval.I, q int) ([]interval.I, interval.I, error) {
//		m, err := e.Model1(a, b, q)
//		return m.C, m.R, err
//	}
type ModelFunc func(a, b interval.I, order int) (coef []interval.I, rem interval.I, err error)

// Potential is a function of x on a mesh, held cell by cell as a model
// f(x_k + ξ h_k) ∈ P_k(ξ) + R_k for ξ ∈ [0, 1] with P_k a polynomial in
// Bernstein form (interval coefficients) and R_k an interval. A polynomial
// potential is exact (R_k = 0). The models are computed once, when the
// Potential is made, and serve every assembly on that mesh.
type Potential struct {
	mesh *Mesh
	bern [][]interval.I
	rem  []interval.I
	rng  []interval.I

	// For a weight made by InverseShifted: the potential and shift it
	// inverts (Flux.LGMatrix checks them).
	inverseOf *Potential
	shift     interval.I

	// For a Potential made by FromExpr: the expression and Taylor order.
	expr  *formula.Expr
	order int
}

// NewPotential builds the cell models of f of the given Taylor order on m.
// The error of a model (for instance a domain error) is returned with the
// cell where it arose.
func NewPotential(m *Mesh, f ModelFunc, order int) (*Potential, error) {
	if order < 0 {
		panic("line: negative Taylor order")
	}
	v := newPotential(m)
	for k := 0; k < m.Cells(); k++ {
		c, r, err := f(m.Nodes[k], m.Nodes[k+1], order)
		if err != nil {
			return nil, fmt.Errorf("line: potential on cell %d [%v, %v]: %w", k, m.Nodes[k], m.Nodes[k+1], err)
		}
		if len(c) == 0 {
			c = []interval.I{{}}
		}
		b := make([]interval.I, len(c))
		bernFromMonomial(b, c)
		v.set(k, b, r)
	}
	return v, nil
}

// PolynomialPotential returns the exact model (R = 0) of the polynomial
// V(x) = Σ_j coef[j] x^j, for every choice of exact coefficients in the
// enclosures coef[j]. On cell k with exact left node a and length h the
// ξ-coefficients are Σ_(j≥i) coef[j] C(j,i) a^(j−i) h^i, enclosed by
// evaluating with a ∈ Nodes[k], h ∈ H(k).
func PolynomialPotential(m *Mesh, coef []interval.I) *Potential {
	if len(coef) == 0 {
		coef = []interval.I{{}}
	}
	v := newPotential(m)
	d := len(coef) - 1
	xiCoef := make([]interval.I, d+1)
	for k := 0; k < m.Cells(); k++ {
		a, h := m.Nodes[k], m.H(k)
		for i := 0; i <= d; i++ {
			acc := interval.I{}
			for j := i; j <= d; j++ {
				bin := float64(binom(j, i).Int64())
				acc = acc.Add(coef[j].Mul(a.PowInt(j - i)).MulF(bin))
			}
			xiCoef[i] = acc.Mul(h.PowInt(i))
		}
		b := make([]interval.I, d+1)
		bernFromMonomial(b, xiCoef)
		v.set(k, b, interval.I{})
	}
	return v
}

func newPotential(m *Mesh) *Potential {
	n := m.Cells()
	return &Potential{mesh: m, bern: make([][]interval.I, n), rem: make([]interval.I, n), rng: make([]interval.I, n)}
}

func (v *Potential) set(k int, b []interval.I, r interval.I) {
	v.bern[k], v.rem[k] = b, r
	v.rng[k] = bernRange(b).Add(r)
}

// Mesh returns the mesh the models live on.
func (v *Potential) Mesh() *Mesh { return v.mesh }

// Model returns the Bernstein coefficients of P_k and the remainder R_k:
// f(x_k + ξ h_k) ∈ Σ_i bern[i] B^q_i(ξ) + R_k for all ξ ∈ [0, 1]. The
// returned slice must not be modified.
func (v *Potential) Model(k int) (bern []interval.I, rem interval.I) { return v.bern[k], v.rem[k] }

// Range returns an enclosure of f over cell k: the hull of the Bernstein
// coefficients plus the remainder (range identity, tables.go).
func (v *Potential) Range(k int) interval.I { return v.rng[k] }

// Exact reports whether every remainder is [0, 0] (the models are f).
func (v *Potential) Exact() bool {
	for _, r := range v.rem {
		if r != (interval.I{}) {
			return false
		}
	}
	return true
}

// SignError reports that a quantity required positive (or nonnegative) by a
// theorem's hypothesis is not verified so on a cell.
type SignError struct {
	What  string     // e.g. "V + γ"
	Cell  int        // cell index
	Cell0 interval.I // left node of the cell
	Cell1 interval.I // right node of the cell
	Range interval.I // the enclosure that failed the test
	Need  string     // "> 0" or "≥ 0"
}

func (e *SignError) Error() string {
	return fmt.Sprintf("line: %s is not verified %s on cell %d [%g, %g]: enclosure %v (choose a larger shift γ or a finer mesh)",
		e.What, e.Need, e.Cell, e.Cell0.Lo, e.Cell1.Hi, e.Range)
}

// InverseShifted returns a Potential enclosing the weight w = 1/(V + γ)
// on every cell (V = v), with polynomial part of the given order. It
// returns a *SignError unless V + γ > 0 is verified on every cell.
//
// On a cell, with g = V + γ ∈ P + γ + R and G ⊇ range(g) (G.Lo > 0), a
// polynomial Q is chosen in floating point (the interpolant of
// 1/(mid P + mid γ) at Chebyshev points, with float Bernstein coefficients
// taken as exact; a choice). Then exactly
//
//	1/g − Q = (1 − gQ)/g = (E − (g − P − γ)Q)/g,   E = 1 − (P + γ)Q,
//
// so for every ξ, 1/g(ξ) − Q(ξ) ∈ (range(E) − R·range(Q)) / G, where E is
// formed by the exact Bernstein product in interval arithmetic. This is
// the remainder of the returned model; a poor choice of Q only widens it.
func (v *Potential) InverseShifted(gamma interval.I, order int) (*Potential, error) {
	if order < 0 {
		panic("line: negative order")
	}
	m := v.mesh
	w := newPotential(m)
	w.inverseOf, w.shift = v, gamma
	for k := 0; k < m.Cells(); k++ {
		p, r := v.bern[k], v.rem[k]
		g := v.rng[k].Add(gamma)
		if !(g.Lo > 0) || !g.IsBounded() {
			return nil, &SignError{What: "V + γ", Cell: k, Cell0: m.Nodes[k], Cell1: m.Nodes[k+1], Range: g, Need: "> 0"}
		}
		q := chooseReciprocal(p, gamma.Mid(), order)
		qb := make([]interval.I, order+1)
		for i, c := range q {
			qb[i] = interval.Point(c)
		}
		ps := make([]interval.I, len(p))
		for i := range p {
			ps[i] = p[i].Add(gamma)
		}
		e := make([]interval.I, len(p)+order)
		bernProduct(e, ps, qb)
		for i := range e {
			e[i] = interval.I{Lo: 1, Hi: 1}.Sub(e[i])
		}
		num := bernRange(e).Sub(r.Mul(bernRange(qb)))
		w.set(k, qb, num.Div(g))
	}
	return w, nil
}

// chooseReciprocal returns the Bernstein coefficients (degree order) of
// the polynomial interpolating 1/(P(ξ) + s) at the order+1 Chebyshev points
// of [0, 1], where P has the Bernstein coefficients p (midpoints used).
// Floating point (gonum LU): a choice. The coefficients are used as exact
// floats, so no conversion error enters the verified remainder.
func chooseReciprocal(p []interval.I, s float64, order int) []float64 {
	// The shift is added to the coefficients (in interval arithmetic, then
	// the midpoint) before evaluation: for V bounded below by a large
	// constant and s near −inf V, evaluating P and adding s afterwards
	// would cancel the constant and lose the digits of P + s.
	pm := make([]float64, len(p))
	for i, c := range p {
		pm[i] = c.AddF(s).Mid()
	}
	work := make([]float64, max(len(p), order+1))
	n1 := order + 1
	a := mat.NewDense(n1, n1, nil)
	rhs := mat.NewVecDense(n1, nil)
	unit := make([]float64, n1)
	for i := 0; i < n1; i++ {
		xi := 0.5 - 0.5*math.Cos(float64(2*i+1)*math.Pi/float64(2*n1))
		rhs.SetVec(i, 1/deCasteljau(pm, xi, work))
		for j := 0; j < n1; j++ {
			for k := range unit {
				unit[k] = 0
			}
			unit[j] = 1
			a.Set(i, j, deCasteljau(unit, xi, work))
		}
	}
	var x mat.VecDense
	out := make([]float64, n1)
	if err := x.SolveVec(a, rhs); err != nil {
		c := 1 / deCasteljau(pm, 0.5, work)
		for i := range out {
			out[i] = c
		}
		return out
	}
	for i := range out {
		out[i] = x.AtVec(i)
		if math.IsNaN(out[i]) || math.IsInf(out[i], 0) {
			out[i] = 0
		}
	}
	return out
}
