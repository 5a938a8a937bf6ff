package certify

import (
	"fmt"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/interval"
)

// separableWell is a potential of one variable s, a double well with a
// barrier at s = c + 1/2 higher than the ground state's one-dimensional
// eigenvalue, so that the ground state dips between the wells.
func separableWell(s, c string) string {
	return fmt.Sprintf("9000*((%s-%s-1/2)^2-1/16)^2", s, c)
}

// A certified witness of the polygon block checked against an independent
// certified computation. On a unit square [c, c+1]×[0, 1] with Dirichlet
// conditions and V = V(x), the ground state separates (common practice):
// u(x, y) = f(x)·√2·sin(πy), with f the ground state of −f″ + Vf = μf on
// (c, c + 1), Dirichlet, ∫f² = 1. The one-dimensional block (validated
// shooting, a different method) encloses f at the witness's x-coordinates;
// the products with √2·sin(πy) must meet the witness's three values, and,
// when narrow enough, show u(m)² < u(x)u(y) on their own. Two cases: c = 0,
// and the square turned by π/2 (V = V(y)) and shifted by c = 1/3, so that
// the mesh's vertex enclosures are not points (measured at c = 0: the
// separation's values are 8e-9 wide and lie inside the witness's, 0.0126
// wide; the separation's margin 0.1112 lies inside the witness's [0.065,
// 0.157]). About 5 s each; the default run's only certified witnesses.
func TestPolygonGroundStateWitnessAgainstSeparation(t *testing.T) {
	for _, tc := range []struct {
		name    string
		shift   string
		shiftF  float64
		turned  bool
		polygon string
	}{
		{"unit square", "0", 0, false, `[["0","0"],["1","0"],["1","1"],["0","1"]]`},
		{"turned square shifted by 1/3", "1/3", 1.0 / 3, true, `[["0","1/3"],["1","1/3"],["1","4/3"],["0","4/3"]]`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			along, across := 0, 1 // the coordinate V depends on, and the other
			s := "x"
			if tc.turned {
				along, across, s = 1, 0, "y"
			}
			src := fmt.Sprintf(`{"domain":{"polygon":%s},"potential":%q,"boundary":"dirichlet"}`, tc.polygon, separableWell(s, tc.shift))
			in := polygonGroundStateInputs(t, src, 5, 1)
			gs, err := polygonGroundState(in, nil)
			if err != nil {
				t.Fatal(err)
			}
			if gs.LogConcavity != certs.Disproven {
				t.Fatalf("verdict %s (%s), want disproven", gs.LogConcavity, gs.Reason)
			}
			checkWitness(t, gs)
			w := gs.Witness
			var pts []string
			for _, p := range w.Points {
				pts = append(pts, fmt.Sprintf("[%q]", p[along]))
			}
			src1 := fmt.Sprintf(`{"domain":{"interval":[%q,"%s+1"]},"potential":%q,"boundary":"dirichlet","points":[%s]}`,
				tc.shift, tc.shift, separableWell("x", tc.shift), strings.Join(pts, ","))
			c := certifyGroundState(t, src1, "1e-10")
			sqrt2, _ := interval.Point(2).Sqrt()
			var sep [3]interval.I
			for i, p := range w.Points {
				f := boundInterval(t, c.Results.GroundState.Points[i].Value)
				q := boundInterval(t, certs.Bound{Lower: p[across], Upper: p[across]})
				sep[i] = f.Mul(sqrt2).Mul(interval.Sin(interval.Pi().Mul(q)))
				v := boundInterval(t, w.Values[i])
				if _, ok := v.Intersection(sep[i]); !ok {
					t.Errorf("witness point %v: the polygon block gives %v, the separation %v (disjoint)", p, v, sep[i])
				}
				t.Logf("witness point %v: polygon %v (width %.3g), separation %v (width %.3g)", p, v, v.Wid(), sep[i], sep[i].Wid())
			}
			margin := sep[0].Mul(sep[1]).Sub(sep[2].Sqr())
			t.Logf("the separation's margin u(x)u(y) - u(m)^2 in %v; the witness's %+v", margin, w.Margin)
			if margin.Hi <= 0 {
				t.Errorf("the separation shows u(m)^2 >= u(x)u(y): the witness is false")
			}
		})
	}
}
