package tri

import (
	"math/big"
	"testing"

	"gapcert/fem/mesh"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// TestProjectionConstantRoundsUp: on triangles whose vertices are
// decimals that are not floats, the upper end of ProjectionConstant must
// be at least 0.1893 times the exact longest edge (computed here in
// math/big from the exact rationals: h² exactly, then 0.1893² h² compared
// with the square of the returned bound), for both spaces, and within a
// few ulps of it.
func TestProjectionConstantRoundsUp(t *testing.T) {
	for _, tc := range [][3][2]string{
		{{"0", "0"}, {"0.1", "0"}, {"0", "0.3"}},
		{{"0.7", "0.1"}, {"1.3", "0.2"}, {"0.9", "2.9"}},
		{{"-1e-3", "1e-3"}, {"3e-3", "-1e-3"}, {"1e-3", "7e-3"}},
		{{"0", "0"}, {"1", "0"}, {"0.5", "0.0001"}}, // obtuse and thin
	} {
		var verts [][2]interval.I
		var exact [3][2]*big.Rat
		for i, v := range tc {
			var p [2]interval.I
			for c := 0; c < 2; c++ {
				x, err := decimalio.Parse(v[c])
				if err != nil {
					t.Fatal(err)
				}
				p[c] = x
				r, ok := new(big.Rat).SetString(v[c])
				if !ok {
					t.Fatal(v[c])
				}
				exact[i][c] = r
			}
			verts = append(verts, p)
		}
		m, err := mesh.FromPolygon(verts, [][3]int{{0, 1, 2}})
		if err != nil {
			t.Fatal(err)
		}
		h2 := new(big.Rat)
		for i := 0; i < 3; i++ {
			a, b := exact[i], exact[(i+1)%3]
			dx := new(big.Rat).Sub(a[0], b[0])
			dy := new(big.Rat).Sub(a[1], b[1])
			l2 := new(big.Rat).Add(new(big.Rat).Mul(dx, dx), new(big.Rat).Mul(dy, dy))
			if l2.Cmp(h2) > 0 {
				h2 = l2
			}
		}
		c2 := new(big.Rat).Mul(big.NewRat(1893*1893, 10000*10000), h2) // (0.1893 h)², exact
		bc := allBC(3, neumann)
		for _, s := range []*Projection{NewCR(m, bc), NewECR(m, bc)} {
			got := s.ProjectionConstant().Hi
			g := new(big.Rat).SetFloat64(got)
			g.Mul(g, g)
			if g.Cmp(c2) < 0 {
				t.Errorf("%v (enriched %v): C = %v below 0.1893 h_T exactly", tc, s.Enriched(), got)
			}
			ref, _ := new(big.Float).SetPrec(200).Sqrt(new(big.Float).SetPrec(200).SetRat(c2)).Float64()
			if got > ref*(1+1e-14) {
				t.Errorf("%v (enriched %v): C = %v, more than a few ulps above 0.1893 h_T = %v", tc, s.Enriched(), got, ref)
			}
		}
	}
}
