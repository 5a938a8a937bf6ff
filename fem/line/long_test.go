package line

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// TestLongRitzSweep runs RitzMatrices against the exact math/big evaluation
// on many random meshes, degrees, end conditions and vectors
// (GAPCERT_LONG=1 only).
func TestLongRitzSweep(t *testing.T) {
	if os.Getenv("GAPCERT_LONG") != "1" {
		t.Skip("set GAPCERT_LONG=1")
	}
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := 0; trial < 300; trial++ {
		n := 1 + rng.IntN(5)
		nodes := []interval.I{pt(rng.Float64() - 1)}
		for k := 0; k < n; k++ {
			nodes = append(nodes, pt(nodes[k].Lo+0.05+rng.Float64()))
		}
		m, err := NewMesh(nodes)
		if err != nil {
			t.Fatal(err)
		}
		p := 1 + rng.IntN(12)
		vc := []*big.Rat{big.NewRat(int64(rng.IntN(9)-4), 3), big.NewRat(int64(rng.IntN(9)-4), 7), big.NewRat(int64(rng.IntN(5)), 5)}
		viv := []interval.I{decimalio.FromRat(vc[0]), decimalio.FromRat(vc[1]), decimalio.FromRat(vc[2])}
		alpha := big.NewRat(int64(rng.IntN(7)), 3)
		ends := []boundary.Condition{dirichlet, robin(decimalio.FromRat(alpha))}
		left, right := ends[rng.IntN(2)], ends[rng.IntN(2)]
		s := NewLagrange(m, p, left, right)
		if s.N() == 0 {
			continue
		}
		vecs := make([][]float64, 1+rng.IntN(3))
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for l := range vecs[i] {
				vecs[i][l] = rng.NormFloat64()
			}
		}
		gamma := big.NewRat(int64(rng.IntN(5)), 2)
		a0, a1, err := s.RitzMatrices(vecs, PolynomialPotential(m, viv), decimalio.FromRat(gamma))
		if err != nil {
			t.Fatal(err)
		}
		var aL, aR *big.Rat
		if !left.Essential() {
			aL = alpha
		}
		if !right.Essential() {
			aR = alpha
		}
		ea, eb := exactRitz(s, vecs, vc, gamma, aL, aR)
		for i := range vecs {
			for j := range vecs {
				name := fmt.Sprintf("trial %d p=%d (%d,%d)", trial, p, i, j)
				// Width relative to the diagonal scale √(a_ii a_jj) (Cauchy–Schwarz).
				fa := math.Sqrt(a0.At(i, i).Mag() * a0.At(j, j).Mag())
				fb := math.Sqrt(a1.At(i, i).Mag() * a1.At(j, j).Mag())
				checkEncloses(t, name+" a0", a0.At(i, j), ea[i][j], 1e-12, fa)
				checkEncloses(t, name+" a1", a1.At(i, j), eb[i][j], 1e-12, fb)
			}
		}
	}
}
