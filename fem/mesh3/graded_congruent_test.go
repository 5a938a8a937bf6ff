package mesh3

import (
	"math/big"
	"testing"
)

// movedSolid returns s rotated about the z axis by the angle with cosine
// 3/5 and sine 4/5 (exact: a Pythagorean rotation) and translated by
// (1/3, 1/7, 2), its vertices in the same order; its vertices are exact
// rationals whose enclosures are not points.
func movedSolid(t *testing.T, s solid) solid {
	t.Helper()
	rat := func(x string) *big.Rat {
		r, ok := new(big.Rat).SetString(x)
		if !ok {
			t.Fatalf("vertex coordinate %q is not a rational", x)
		}
		return r
	}
	moved := solid{name: s.name + " (rotated and translated)", faces: s.faces, volume: s.volume}
	for _, v := range s.vertices {
		x, y, z := rat(v[0]), rat(v[1]), rat(v[2])
		lin := func(a, b int64, p, q *big.Rat, shift string) string {
			r := new(big.Rat).Mul(big.NewRat(a, 5), p)
			r.Add(r, new(big.Rat).Mul(big.NewRat(b, 5), q))
			return r.Add(r, rat(shift)).RatString()
		}
		moved.vertices = append(moved.vertices, [3]string{lin(3, -4, x, y, "1/3"), lin(4, 3, x, y, "1/7"), new(big.Rat).Add(z, rat("2")).RatString()})
	}
	return moved
}

// TestRefineTowardCongruent checks that a rigidly moved polyhedron is
// graded into the same tetrahedra and boundary triangles (the L-shaped
// prism toward its re-entrant edge and the Fichera solid toward its three
// re-entrant edges, on the cone mesh and on its red refinement): its
// computed edge lengths differ from the original's by rounding errors
// only, so equal lengths must still tie in the longest-edge order.
// Without the rounding of the order's lengths, the Fichera solid refined
// once was graded into 10,171 tetrahedra and the moved one into 9,881.
func TestRefineTowardCongruent(t *testing.T) {
	for _, c := range []struct {
		s       solid
		targets []Target
	}{
		{lPrism, []Target{{3, 9, 4}}},
		{fichera, []Target{{7, 8, 3}, {7, 9, 3}, {7, 10, 3}}},
	} {
		a0, b0 := fromSolid(t, c.s), fromSolid(t, movedSolid(t, c.s))
		for uniform := range 2 {
			if uniform > 0 {
				a0, b0 = a0.Refine(), b0.Refine()
			}
			a, err := a0.RefineToward(c.targets)
			if err != nil {
				t.Fatal(err)
			}
			b, err := b0.RefineToward(c.targets)
			if err != nil {
				t.Fatal(err)
			}
			same := len(a.Tets) == len(b.Tets) && len(a.Bnd) == len(b.Bnd)
			for k := 0; same && k < len(a.Tets); k++ {
				same = a.Tets[k] == b.Tets[k]
			}
			for k := 0; same && k < len(a.Bnd); k++ {
				same = a.Bnd[k] == b.Bnd[k]
			}
			if !same {
				t.Errorf("%s, %d uniform levels: graded into %d tetrahedra and %d boundary triangles, moved into %d and %d (or other ones)",
					c.s.name, uniform, len(a.Tets), len(a.Bnd), len(b.Tets), len(b.Bnd))
			}
		}
	}
}
