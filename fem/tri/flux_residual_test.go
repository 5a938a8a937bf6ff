package tri

import (
	"errors"
	"fmt"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// residualCase is a trial space with its potential, shift and flux
// degree, and ρ between the approximate Λ_3 and Λ_4.
type residualCase struct {
	name  string
	m     *mesh.Mesh
	bc    []boundary.Condition
	p, k  int
	v     string
	gamma float64
	ratio float64 // the largest ratio of the diagonal radii, residual form to combination
}

// lehmannPair returns the enclosure of B = A0 − 2ρA1 + ρ²A2 from the
// Ritz and flux matrices (LGMatrix) and the one of LehmannMatrix, for the
// three lowest approximate eigenvectors and their chosen fluxes, and ρ.
func lehmannPair(t *testing.T, c residualCase) (plain, residual *enclose.Sym, rho float64) {
	t.Helper()
	s := NewLagrange(c.m, c.p, c.bc)
	v := mustPotential(t, c.m, c.v, 6)
	g := interval.Point(c.gamma)
	tr := NewTrial(s, v)
	vecs, err := tr.ApproxEigenvectors(4, c.gamma)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, g)
	if err != nil {
		t.Fatal(err)
	}
	lam3, lam4 := a0.At(2, 2).Mid()/a1.At(2, 2).Mid(), a0.At(3, 3).Mid()/a1.At(3, 3).Mid()
	rho = (lam3 + lam4) / 2
	vecs = vecs[:3]
	w, err := v.InverseShifted(g, 8)
	if err != nil {
		t.Fatal(err)
	}
	f := NewFlux(c.m, c.k, c.bc)
	fluxes, err := f.MinimizeApprox(s, vecs, w)
	if err != nil {
		t.Fatal(err)
	}
	a2, err := f.LGMatrix(s, vecs, fluxes, v, w, g)
	if err != nil {
		t.Fatal(err)
	}
	residual, err = f.LehmannMatrix(s, vecs, fluxes, v, w, g, rho)
	if err != nil {
		t.Fatal(err)
	}
	r := interval.Point(rho)
	plain = enclose.NewSym(3)
	for i := 0; i < 3; i++ {
		for j := 0; j <= i; j++ {
			plain.Set(i, j, a0.At(i, j).Sub(a1.At(i, j).Mul(r.MulF(2))).Add(a2.At(i, j).Mul(r.Sqr())))
		}
	}
	return plain, residual, rho
}

// TestLehmannMatrixAgreesWithTheCombination: LehmannMatrix and the
// combination A0 − 2ρA1 + ρ²A2 of the enclosures of Ritz and flux matrices
// enclose the same matrix (package temple: B = ρ²(r_i, r_j)_X by (★)), so
// every pair of entries must overlap; a wrong term (a sign, a factor of
// the Piola map, the barycentric gradients) would move the residual form
// by about its own size, far beyond both widths. The residual form must
// also be no wider on the diagonal, and where rounding makes the widths
// (V = 0; measured ratios 0.13 to 0.5) at most half as wide in total;
// where the Taylor remainders of the weights make them (V = 1 + xy,
// exp(−x² − y²) on these coarse meshes) both are as wide. Cases:
// Dirichlet square with V = 0 and V = 1 + xy; mixed sides (Neumann
// bottom, σ·n = 0 there) with V = exp(−x² − y²); a graded mesh.
func TestLehmannMatrixAgreesWithTheCombination(t *testing.T) {
	mixed := allBC(4, dirichlet)
	mixed[0] = neumann
	graded := unitSquare(t, 1).RefineGraded(0, 4)
	cases := []residualCase{
		{"square, V = 0", unitSquare(t, 2), allBC(4, dirichlet), 6, 5, "0", 2, 0.5},
		{"square, V = 1 + xy", unitSquare(t, 2), allBC(4, dirichlet), 5, 4, "1 + x*y", 1, 1 + 1e-9},
		{"square, Neumann bottom, V = exp(-x^2-y^2)", unitSquare(t, 2), mixed, 5, 4, "exp(-(x^2 + y^2))", 1, 1 + 1e-9},
		{"square graded toward a corner, V = 0", graded, allBC(4, dirichlet), 6, 5, "0", 3, 0.5},
	}
	for _, c := range cases {
		plain, residual, rho := lehmannPair(t, c)
		for i := 0; i < 3; i++ {
			for j := 0; j <= i; j++ {
				a, b := plain.At(i, j), residual.At(i, j)
				if a.Lo > b.Hi || b.Lo > a.Hi {
					t.Errorf("%s, ρ = %g: B[%d][%d] combination %v and residual form %v are disjoint", c.name, rho, i, j, a, b)
				}
			}
			if w, wp := residual.At(i, i).Rad(), plain.At(i, i).Rad(); !(w <= wp*(1+1e-9)) {
				t.Errorf("%s: B[%d][%d] residual form radius %.3g, wider than the combination's %.3g", c.name, i, i, w, wp)
			}
		}
		if w, wp := residual.At(0, 0).Rad()+residual.At(1, 1).Rad()+residual.At(2, 2).Rad(),
			plain.At(0, 0).Rad()+plain.At(1, 1).Rad()+plain.At(2, 2).Rad(); !(w <= c.ratio*wp) {
			t.Errorf("%s: diagonal radii of the residual form sum to %.3g, want at most %g × the combination's %.3g", c.name, w, c.ratio, wp)
		}
		t.Logf("%s: ρ = %.6g, B diagonal radii residual %s, combination %s", c.name, rho, radii(residual), radii(plain))
	}
}

func radii(s *enclose.Sym) string {
	out := ""
	for i := 0; i < s.N(); i++ {
		out += fmt.Sprintf(" %.2e", s.At(i, i).Rad())
	}
	return out
}

// TestLehmannMatrixRefusesRobinSides: the residual form has no boundary
// terms, so a side with a Robin term is refused with
// ErrResidualBoundaryTerm (and the weight check comes first).
func TestLehmannMatrixRefusesRobinSides(t *testing.T) {
	m := unitSquare(t, 1)
	bc := allBC(4, dirichlet)
	bc[1] = robin(interval.Point(1))
	s := NewLagrange(m, 3, bc)
	v := mustPotential(t, m, "0", 1)
	g := interval.Point(1)
	w, err := v.InverseShifted(g, 4)
	if err != nil {
		t.Fatal(err)
	}
	f := NewFlux(m, 2, bc)
	u := [][]float64{make([]float64, s.N())}
	u[0][0] = 1
	sig := [][]float64{make([]float64, f.N())}
	if _, err := f.LehmannMatrix(s, u, sig, v, w, g, 30); !errors.Is(err, ErrResidualBoundaryTerm) {
		t.Errorf("Robin side: error %v, want ErrResidualBoundaryTerm", err)
	}
	if _, err := f.LehmannMatrix(s, u, sig, v, v, g, 30); !errors.Is(err, ErrWeightMismatch) {
		t.Errorf("weight not made by InverseShifted: error %v, want ErrWeightMismatch", err)
	}
}

// TestWeightedGramOfConstantModel: for a model whose Bernstein coefficients
// are all the same interval (the weight of a constant V), weightedGramOf
// uses the degree-0 table; its entries must overlap those of the full sum
// over the degree-12 table (both enclose the same integrals) and be no
// wider. A model with one coefficient changed takes the full sum,
// entry for entry identical to bernstein.WeightedGram.
func TestWeightedGramOfConstantModel(t *testing.T) {
	const q, d = 12, 6
	nd := dim(d)
	third := interval.Point(1).DivF(3)
	bern := make([]interval.I, dim(q))
	for k := range bern {
		bern[k] = third
	}
	s := interval.Point(0.25)
	short, full := make([]interval.I, nd*nd), make([]interval.I, nd*nd)
	weightedGramOf(short, q, d, bern, s)
	bernstein.WeightedGram(full, tripleTable(q, d, d).IV, bern, s, nd)
	for ab := range short {
		a, b := short[ab], full[ab]
		if a.Lo > b.Hi || b.Lo > a.Hi || a.Rad() > b.Rad() {
			t.Fatalf("entry %d: degree-0 table %v, full sum %v: want overlapping and no wider", ab, a, b)
		}
	}
	bern[5] = interval.Point(0.5)
	weightedGramOf(short, q, d, bern, s)
	bernstein.WeightedGram(full, tripleTable(q, d, d).IV, bern, s, nd)
	for ab := range short {
		if short[ab] != full[ab] {
			t.Fatalf("entry %d of a non-constant model: %v, want the full sum %v", ab, short[ab], full[ab])
		}
	}
}
