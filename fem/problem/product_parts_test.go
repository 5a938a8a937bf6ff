package problem

import (
	"fmt"
	"math/rand"
	"strings"
	"testing"

	"gapcert/interval"
)

// TestProductPartsSumToPotential: for potentials written with nested
// differences, negations, powers of negated terms, parameters, constants
// and functions, the factors' parts V_i (each read back from its factor's
// problem file, in the factor's own coordinates) add up to V at random
// points of the product: the enclosures of V(x) and Σ_i V_i(x_i) overlap
// and both are narrow (fixed seed). A wrong sign, a dropped term, a term
// given to the wrong factor or a wrong renaming moves the sum by far more
// than the widths.
func TestProductPartsSumToPotential(t *testing.T) {
	const box3 = `[{"interval":["1","2"]},{"interval":["1/2","3/2"]},{"interval":["1","3"]}]`
	const triangleZ = `[{"polygon":[["1","1"],["2","1"],["3/2","2"]]},{"interval":["1","2"]}]`
	const zTriangle = `[{"interval":["1","2"]},{"polygon":[["1","1"],["2","1"],["3/2","2"]]}]`
	const box4 = `[{"interval":["1","2"]},{"interval":["1","2"]},{"interval":["1","2"]},{"interval":["1","2"]}]`
	for _, tc := range []struct{ domain, potential string }{
		{box3, "-(-x)^2 + y - (-y)^3 + z"},
		{box3, "x - (y - z)"},
		{box3, "-(x - y) - -z"},
		{box3, "-x^2"},
		{box3, "-2^x + y"},
		{box3, "2 - x*3 - (4 - y^2) + exp(z) - 1"},
		{box3, "a*x^2 - a*(y) + z/a"},
		{box3, "sin(x)*cos(x) - y*y*y + 1/(z + 2)"},
		{box3, "x^-2 - y^(1/2) - -(z - 1)^3"},
		{box3, "-(-(-(x + y) - z))"},
		{triangleZ, "x*y - y^2 + z"},
		{triangleZ, "-(x - y)^2 - z^2"},
		{zTriangle, "x^2 + y*z - z"},
		{zTriangle, "-(y - 2*z) + x/3"},
		{box4, "x + 2*y - 3*z + w^2 - 5"},
		{box4, "-(w - x) - (z - y)"},
	} {
		src := fmt.Sprintf(`{"domain":{"product":%s},"boundary":"dirichlet","potential":%q,"parameters":{"a":"3/2"}}`, tc.domain, tc.potential)
		p := mustParse(t, src)
		if ok, why := p.Separable(); !ok {
			t.Errorf("%s: not separable: %s", tc.potential, why)
			continue
		}
		var parts []*Problem
		for i := range p.Factors() {
			parts = append(parts, mustParse(t, string(p.FactorFile(i, DefaultEigenvalues, DefaultRelWidth))))
		}
		rng := rand.New(rand.NewSource(7))
		for range 50 {
			// A random point of the product: each factor's coordinates
			// inside its interval or polygon (a convex combination of the
			// polygon's vertices).
			env := map[string]interval.I{}
			sum := interval.Point(0)
			c := 0
			for i, f := range parts {
				local := map[string]interval.I{}
				if f.Dim == 1 {
					lo, hi := f.Interval[0].Val.Lo, f.Interval[1].Val.Hi
					local["x"] = interval.Point(lo + (hi-lo)*rng.Float64())
				} else {
					w := []float64{rng.Float64(), rng.Float64(), rng.Float64()}
					s := w[0] + w[1] + w[2]
					var x, y float64
					for k, v := range f.Vertices[:3] {
						x += w[k] / s * v[0].Val.Lo
						y += w[k] / s * v[1].Val.Lo
					}
					local["x"], local["y"] = interval.Point(x), interval.Point(y)
				}
				for k, name := range Coordinates(f.Dim) {
					env[Coordinates(p.Dim)[c+k]] = local[name]
				}
				c += f.Dim
				v, err := f.Potential.Eval(local)
				if err != nil {
					t.Fatalf("%s: factor %d at %v: %v", tc.potential, i, local, err)
				}
				sum = sum.Add(v)
			}
			want, err := p.Potential.Eval(env)
			if err != nil {
				t.Fatalf("%s at %v: %v", tc.potential, env, err)
			}
			if _, ok := want.Intersection(sum); !ok || sum.Wid() > 1e-9 || want.Wid() > 1e-9 {
				t.Fatalf("%s at %v: V = %v, the parts add up to %v", tc.potential, env, want, sum)
			}
		}
	}
}

// TestProductPotentialMixedTerms: potentials whose terms mix the
// coordinates of two factors are refused on products of three or four
// coordinates, naming the term, even when they look separable or are
// equal to a separable function (the decision is on the formula as
// written); terms that mix only one factor's coordinates separate.
func TestProductPotentialMixedTerms(t *testing.T) {
	const box = `[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]`
	const zPolygon = `[{"interval":["0","1"]},{"polygon":[["0","0"],["1","0"],["0","1"]]}]`
	for _, tc := range []struct {
		domain, potential, term string
	}{
		{box, "x*y - x*y + y*z", "x*y"},
		{box, "exp(x + y)", "exp(x+y)"},
		{box, "(x + y)^2", "(x+y)^2"},
		{box, "a*(x + z)", "a*(x+z)"},
		{box, "x + 0*(y*z)", "0*(y*z)"},
		{zPolygon, "x*y + z", "x*y"},
	} {
		src := fmt.Sprintf(`{"domain":{"product":%s},"boundary":"dirichlet","potential":%q,"parameters":{"a":"2"}}`, tc.domain, tc.potential)
		_, err := Parse([]byte(src))
		if err == nil || !strings.Contains(err.Error(), "the term "+tc.term+" mixes") {
			t.Errorf("%s: %v, want a refusal naming the term %s", tc.potential, err, tc.term)
		}
	}
	for _, potential := range []string{"(y + z)^2 + x", "exp(y*z) - x^3", "a*(y - z) + a"} {
		p := mustParse(t, fmt.Sprintf(`{"domain":{"product":%s},"boundary":"dirichlet","potential":%q,"parameters":{"a":"2"}}`, zPolygon, potential))
		if ok, why := p.Separable(); !ok {
			t.Errorf("%s on interval × polygon: not separable: %s", potential, why)
		}
	}
}
