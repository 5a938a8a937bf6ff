package line

import (
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/interval"
	"gapcert/interval/formula"
)

func sameBits(a, b interval.I) bool {
	return math.Float64bits(a.Lo) == math.Float64bits(b.Lo) && math.Float64bits(a.Hi) == math.Float64bits(b.Hi)
}

// The Lehmann–Goerisch stage takes its matrices a0, a1 of the first N
// trial functions as the leading N×N blocks of the Ritz matrices of all
// of them: every entry must be bit for bit the one RitzMatrices computes
// for the N functions alone, and the least-squares fluxes of several
// trial functions must be those of one call per function.
func TestRitzLeadingBlockAndFluxesBitIdentical(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, tc := range []struct {
		expr        string
		p, cells, n int
		left, right boundary.Condition
	}{
		{"2*cos(2*x)", 6, 7, 3, dirichlet, dirichlet},
		{"x^2", 4, 20, 2, robin(pt(1.5)), neumann},
		{"exp(-x^2)+sin(3*x)", 8, 5, 4, neumann, dirichlet},
		{"0", 3, 11, 2, neumann, robin(interval.I{Lo: 0.5, Hi: 0.75})},
	} {
		m := Uniform(pt(-1), pt(2), tc.cells)
		v, err := FromExpr(m, formula.MustParse(tc.expr), 6)
		if err != nil {
			t.Fatal(err)
		}
		s := NewLagrange(m, tc.p, tc.left, tc.right)
		f := NewFlux(m, tc.p+1, tc.left, tc.right)
		gamma := pt(3.25)
		w, err := v.InverseShifted(gamma, 5)
		if err != nil {
			t.Fatal(err)
		}
		vecs := make([][]float64, tc.n+3)
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for l := range vecs[i] {
				vecs[i][l] = rng.NormFloat64()
			}
		}
		all0, all1, err := s.RitzMatrices(vecs, v, gamma)
		if err != nil {
			t.Fatal(err)
		}
		lead0, lead1, err := s.RitzMatrices(vecs[:tc.n], v, gamma)
		if err != nil {
			t.Fatal(err)
		}
		for _, pr := range [][2]*enclose.Sym{{all0, lead0}, {all1, lead1}} {
			for i := 0; i < tc.n; i++ {
				for j := 0; j <= i; j++ {
					if !sameBits(pr[0].At(i, j), pr[1].At(i, j)) {
						t.Errorf("%s: entry (%d, %d) %v of all vectors, %v of the first %d", tc.expr, i, j, pr[0].At(i, j), pr[1].At(i, j), tc.n)
					}
				}
			}
		}
		fluxes, err := f.MinimizeApprox(s, vecs, w)
		if err != nil {
			t.Fatal(err)
		}
		for i, u := range vecs {
			one, err := f.MinimizeApprox(s, [][]float64{u}, w)
			if err != nil {
				t.Fatal(err)
			}
			for l := range one[0] {
				if math.Float64bits(one[0][l]) != math.Float64bits(fluxes[i][l]) {
					t.Fatalf("%s: flux %d coefficient %d: %g alone, %g with the others", tc.expr, i, l, one[0][l], fluxes[i][l])
				}
			}
		}
	}
}
