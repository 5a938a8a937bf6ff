package certify

import (
	"fmt"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/interval"
)

// separableWell is a potential of x alone, a double well with a barrier at
// x = 1/2 higher than the ground state's one-dimensional eigenvalue, so that
// the ground state dips between the wells.
const separableWell = "9000*((x-1/2)^2-1/16)^2"

// A certified witness of the polygon block checked against an independent
// certified computation. On the unit square with Dirichlet conditions and
// V = V(x), the ground state separates (common practice): u(x, y) =
// f(x)·√2·sin(πy), with f the ground state of −f″ + Vf = μf on (0, 1),
// Dirichlet, ∫f² = 1. The one-dimensional block (validated shooting, a
// different method) encloses f at the witness's x-coordinates; the
// products with √2·sin(πy) must meet the witness's three values, and, when
// narrow enough, show u(m)² < u(x)u(y) on their own (measured: the
// separation's values are 8e-9 wide and lie inside the witness's, 0.0126
// wide; the separation's margin 0.1112 lies inside the witness's
// [0.065, 0.157]). About 5 s: the default run's only certified witness.
func TestPolygonGroundStateWitnessAgainstSeparation(t *testing.T) {
	src := fmt.Sprintf(`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":%q,"boundary":"dirichlet"}`, separableWell)
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
		pts = append(pts, fmt.Sprintf("[%q]", p[0]))
	}
	src1 := fmt.Sprintf(`{"domain":{"interval":["0","1"]},"potential":%q,"boundary":"dirichlet","points":[%s]}`, separableWell, strings.Join(pts, ","))
	c := certifyGroundState(t, src1, "1e-10")
	sqrt2, _ := interval.Point(2).Sqrt()
	var sep [3]interval.I
	for i, p := range w.Points {
		f := boundInterval(t, c.Results.GroundState.Points[i].Value)
		y := boundInterval(t, certs.Bound{Lower: p[1], Upper: p[1]})
		sep[i] = f.Mul(sqrt2).Mul(interval.Sin(interval.Pi().Mul(y)))
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
}
