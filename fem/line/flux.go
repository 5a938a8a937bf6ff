package line

import (
	"errors"

	"gapcert/enclose"
	"gapcert/enclose/band"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
)

// Flux is the space of fluxes σ for the Lehmann–Goerisch bounds (package
// temple; package doc, Lehmann–Goerisch fluxes) in one dimension, where
// H(div) = H¹: continuous piecewise
// polynomials of degree q (the hierarchical basis of space), unconstrained
// at Dirichlet ends and at Robin ends with α verified > 0, and σ = 0 at the
// other ends (Neumann, or α not verified positive).
//
// With c = V + γ > 0, n = −1 at a and +1 at b, and
//
//	w = (σ, (ũ + σ')/√c, −σn/√α at Robin ends),
//
// every φ ∈ H satisfies (Tφ, w)_X = ∫φ'σ + ∫φ(ũ + σ') − Σ_R φσn
// = ∫φũ + [φσ]_a^b − Σ_R φσn = ∫φũ = b(φ, ũ): the end term vanishes at
// Dirichlet ends (φ = 0), at constrained ends (σ = 0) and cancels at Robin
// ends. That is the hypothesis of the Lehmann–Goerisch theorem, for any σ
// in this space; the choice of σ only affects sharpness.
//
// References:
//
//	H. Behnke, F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: J. Herzberger (ed.), Topics in Validated Computations,
//	1994.
//	T. Vejchodský, Flux reconstructions in the Lehmann–Goerisch method for
//	lower bounds on eigenvalues, arXiv:1801.02561 (2018).
//	T. Vejchodský, Three methods for two-sided bounds of eigenvalues – a
//	comparison, arXiv:1602.08961 (2016).
type Flux struct {
	space
	ends
}

// NewFlux returns the degree-q flux space on m for the given end
// conditions (as for NewLagrange).
func NewFlux(m *Mesh, q int, left, right boundary.Condition) *Flux {
	e := newEnds(left, right)
	return &Flux{space: newSpace(m, q, fluxConstrained(left), fluxConstrained(right)), ends: e}
}

// N returns the dimension.
func (f *Flux) N() int { return f.n }

// Degree returns q.
func (f *Flux) Degree() int { return f.p }

// Eval returns the value of the flux with coefficients vec at x
// (floating point; approximate).
func (f *Flux) Eval(vec []float64, x float64) float64 { return f.eval(vec, x) }

// Interpolate returns the projection-based interpolant of g (derivative dg)
// in the flux space (floating point; a choice; see Lagrange.Interpolate).
func (f *Flux) Interpolate(g, dg func(x float64) float64) []float64 {
	return f.space.interpolate(g, dg)
}

// ErrWeightMismatch is returned by LGMatrix when w was not made by
// v.InverseShifted(gamma, ·) or v.InverseShiftedExpr(gamma, ·): only then
// is w known to enclose 1/(V + γ).
var ErrWeightMismatch = errors.New("line: the weight must be v.InverseShifted(gamma) or v.InverseShiftedExpr(gamma) for the same v and gamma")

// LGMatrix returns the interval matrix of the Lehmann–Goerisch bounds, for
// the trial functions ũ_i (the coefficient vectors trial[i] in s) and
// fluxes σ_i (flux[i] in f):
//
//	a2_ij ⊇ ∫σ_iσ_j + ∫(ũ_i + σ_i')(ũ_j + σ_j')/c + Σ_(Robin ends, α>0) σ_i σ_j/α,
//
// c = V + γ, valid for every exact input inside the enclosures. The other
// two matrices of the theorem, a(ũ_i, ũ_j) + γ b(ũ_i, ũ_j) and
// b(ũ_i, ũ_j), are s.RitzMatrices(trial, v, gamma); for the first N of a
// larger set of vectors they are bit for bit the leading N×N blocks of
// that set's Ritz matrices (each entry is accumulated from its own two
// vectors only). ∫σ_iσ_j is
// h·c_iᵀ M_loc c_j with the exact local mass matrix (as in RitzMatrices). The weight
// w must be v.InverseShifted(gamma, ·) or v.InverseShiftedExpr(gamma, ·)
// (else ErrWeightMismatch): its cell
// models Q + R_w enclose 1/c, and the R_w part is bounded by
// r_mid ∫fg ± r_rad ‖f‖‖g‖ as in RitzMatrices. On a cell of length h,
// (ũ + σ')(x_k + ξh) = ũ(ξ) + σ̃'(ξ)/h is formed in Bernstein form of degree
// max(p, q−1) (exact elevation), and ∫ = h∫_0^1.
func (f *Flux) LGMatrix(s *Lagrange, trial [][]float64, flux [][]float64, v, w *Potential, gamma interval.I) (*enclose.Sym, error) {
	if f.mesh != s.mesh {
		panic("line: flux and trial spaces on different meshes")
	}
	if len(trial) != len(flux) {
		panic("line: as many fluxes as trial functions are needed")
	}
	for _, x := range flux {
		if len(x) != f.n {
			panic("line: flux coefficient vector length mismatch")
		}
	}
	if w == nil || v == nil || w.inverseOf != v || w.shift != gamma {
		return nil, ErrWeightMismatch
	}
	s.checkVecs(trial)
	nv := len(trial)
	p, q := s.p, f.p
	d := max(p, q-1)
	acc := ritz.NewAccumulator(nv)
	uw := newCellWork(p, nv)
	sw := newCellWork(q, nv)
	gd := tripleTable(0, d, d).IV
	fi := make([][]interval.I, nv)
	gfi := make([][]interval.I, nv)
	wfi := make([][]interval.I, nv)
	ffi := make([]interval.I, nv)
	for i := range fi {
		fi[i], gfi[i], wfi[i] = make([]interval.I, d+1), make([]interval.I, d+1), make([]interval.I, d+1)
	}
	tmp := make([]interval.I, d+1)
	wg := make([]interval.I, (d+1)*(d+1))
	for c := 0; c < s.mesh.Cells(); c++ {
		h := s.mesh.H(c)
		hinv := h.Recip()
		for i := 0; i < nv; i++ {
			s.localCoef(uw.cf[i], trial[i], c)
			bernstein.ApplyF(uw.u[i], s.basis.IV, uw.cf[i])
			f.localCoef(sw.cf[i], flux[i], c)
			bernstein.ApplyF(sw.u[i], f.basis.IV, sw.cf[i])
			bernstein.ApplyF(sw.gu[i], sw.mloc, sw.cf[i])
			bernDeriv(sw.d[i], sw.u[i])
			bernElevate(fi[i], uw.u[i])
			bernElevate(tmp, sw.d[i])
			for k := range fi[i] {
				fi[i][k] = fi[i][k].Add(tmp[k].Mul(hinv))
			}
			bernstein.ApplyI(gfi[i], gd, fi[i])
			ffi[i] = bernstein.DotI(fi[i], gfi[i])
		}
		bern, rem := w.Model(c)
		bernstein.WeightedGram(wg, tripleTable(len(bern)-1, d, d).IV, bern, interval.Point(rem.Mid()), d+1)
		for i := 0; i < nv; i++ {
			bernstein.ApplyI(wfi[i], wg, fi[i])
		}
		rrad := rem.Rad()
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				t := bernstein.DotF(sw.cf[j], sw.gu[i]).Add(bernstein.DotI(fi[j], wfi[i]))
				t = h.Mul(t)
				if r := bernstein.RemainderBound(rrad, ffi[i].Hi, ffi[j].Hi); r != 0 {
					r = interval.MulUp(r, h.Hi)
					t = t.Add(interval.I{Lo: -r, Hi: r})
				}
				acc.Add(i, j, t)
			}
		}
	}
	f.endTerms(acc, flux)
	return acc.Sym(), nil
}

// ErrFluxFactor is returned by MinimizeApprox when the float
// factorization of its least-squares system fails.
var ErrFluxFactor = errors.New("the flux least-squares system could not be factored")

// MinimizeApprox returns, for each trial function ũ (the coefficient
// vectors trial[i] in s), the flux σ of this space that minimises
// ‖w‖²_X = ‖σ‖² + ‖(ũ + σ')/√c‖² + Σ_Robin σ(e)²/α, with 1/c taken from w
// (midpoints): the solution of the normal equations, for all τ,
//
//	(σ, τ) + ((σ' + ũ)/c, τ') + Σ_Robin σ τ/α = 0.
//
// The system matrix does not depend on ũ: one banded SPD factorization in
// floating point and one solve per trial function. A choice: any σ is
// admissible. It returns ErrFluxFactor if the factorization fails.
func (f *Flux) MinimizeApprox(s *Lagrange, trial [][]float64, w *Potential) ([][]float64, error) {
	if s.mesh != f.mesh || w.mesh != f.mesh {
		panic("line: spaces and weight on different meshes")
	}
	s.checkVecs(trial)
	p, q := s.p, f.p
	q1 := q + 1
	g := band.NewSym(f.n, q)
	rhs := make([][]float64, len(trial))
	for i := range rhs {
		rhs[i] = make([]float64, f.n)
	}
	T := f.basis.FL
	D := make([]float64, q*q1) // derivative of the flux basis, degree q−1
	for i := 0; i < q; i++ {
		for l := 0; l < q1; l++ {
			D[i*q1+l] = float64(q) * (T[(i+1)*q1+l] - T[i*q1+l])
		}
	}
	mref := congruenceF(T, tripleTable(0, q, q).FL, q1, q1)
	gq1 := tripleTable(0, q-1, q-1).FL
	gpq := tripleTable(0, p, q-1).FL
	ub := make([][]float64, len(trial))
	for i := range ub {
		ub[i] = make([]float64, p+1)
	}
	c := make([]float64, p+1)
	wq := make([]float64, q*q)
	wpq := make([]float64, (p+1)*q)
	kloc, work := make([]float64, q1*q1), make([]float64, q*q1)
	for cell := 0; cell < f.mesh.Cells(); cell++ {
		h := f.mesh.H(cell).Mid()
		bern, rem := w.Model(cell)
		r := len(bern) - 1
		t3 := tripleTable(r, q-1, q-1).FL
		t3u := tripleTable(r, p, q-1).FL
		rm := rem.Mid()
		for ab := range wq {
			wq[ab] = rm * gq1[ab]
		}
		for ab := range wpq {
			wpq[ab] = rm * gpq[ab]
		}
		for k := 0; k <= r; k++ {
			wk := bern[k].Mid()
			for ab := range wq {
				wq[ab] += wk * t3[k*q*q+ab]
			}
			for ab := range wpq {
				wpq[ab] += wk * t3u[k*(p+1)*q+ab]
			}
		}
		congruenceFTo(kloc, work, D, wq, q, q1)
		for v, u := range trial {
			s.localCoef(c, u, cell)
			for i := 0; i <= p; i++ {
				acc := 0.0
				for l := 0; l <= p; l++ {
					acc += s.basis.FL[i*(p+1)+l] * c[l]
				}
				ub[v][i] = acc
			}
		}
		for a := 0; a < q1; a++ {
			ga := f.dof(cell, a)
			if ga < 0 {
				continue
			}
			for b := 0; b <= a; b++ {
				if gb := f.dof(cell, b); gb >= 0 {
					g.Add(ga, gb, h*mref[a*q1+b]+kloc[a*q1+b]/h)
				}
			}
			// rhs: −∫_0^1 ũ w̃ τ̃_a' dξ (the factors h and 1/h cancel).
			for v := range trial {
				acc := 0.0
				for i := 0; i <= p; i++ {
					for b := 0; b < q; b++ {
						acc += ub[v][i] * wpq[i*q+b] * D[b*q1+a]
					}
				}
				rhs[v][ga] -= acc
			}
		}
	}
	f.endTermsApprox(g)
	fac, ok := g.Factor()
	if !ok {
		return nil, ErrFluxFactor
	}
	out := make([][]float64, len(trial))
	for v := range out {
		out[v] = make([]float64, f.n)
		fac.SolveTo(out[v], rhs[v])
	}
	return out, nil
}
