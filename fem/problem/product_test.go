package problem

import (
	"math"
	"strings"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

func mustParse(t *testing.T, text string) *Problem {
	t.Helper()
	p, err := Parse([]byte(text))
	if err != nil {
		t.Fatalf("%s:\n%v", text, err)
	}
	return p
}

// TestProductGeometry: the dimension, faces, diameter, volume, surface
// area and convexity of products against their closed forms (common
// practice: D² = Σ D_i², |Ω| = Π |Ω_i|, |∂(A×B)| = |∂A||B| + |A||∂B|).
func TestProductGeometry(t *testing.T) {
	sqrt3 := math.Sqrt(3)
	for _, tc := range []struct {
		name, domain, bc          string
		dim, faces                int
		diameter, volume, surface float64
		convex                    string
	}{
		{"unit cube", `[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]`, `"dirichlet"`, 3, 6, sqrt3, 1, 6, "convex"},
		{"box 1×2×3", `[{"interval":["0","1"]},{"interval":["-1","1"]},{"interval":["1/2","7/2"]}]`, `["dirichlet","neumann",[{"robin":"2"},"dirichlet"]]`, 3, 6, math.Sqrt(14), 6, 22, "convex"},
		// Equilateral triangle of side 1 (area √3/4, perimeter 3) × [0, 2].
		{"prism", `[{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},{"interval":["0","2"]}]`, `["dirichlet","neumann"]`, 3, 5, math.Sqrt(5), sqrt3 / 2, 2*sqrt3/4 + 6, "convex"},
		// L-shape (area 3, perimeter 8, diameter 2√2) × [0, 1].
		{"L prism", `[{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},{"interval":["0","1"]}]`, `["dirichlet","dirichlet"]`, 3, 8, 3, 3, 2*3 + 8, "not convex"},
		{"4D box", `[{"interval":["0","1"]},{"interval":["0","2"]},{"interval":["0","1"]},{"interval":["0","3"]}]`, `"neumann"`, 4, 8, math.Sqrt(15), 6, 2 * (6 + 3 + 6 + 2), "convex"},
	} {
		p := mustParse(t, `{"domain":{"product":`+tc.domain+`},"boundary":`+tc.bc+`}`)
		if p.Dim != tc.dim || len(p.Boundary) != tc.faces || !p.IsProduct() {
			t.Errorf("%s: dim %d with %d faces, want %d and %d", tc.name, p.Dim, len(p.Boundary), tc.dim, tc.faces)
		}
		check := func(what string, x interval.I, want float64) {
			if !(x.Lo <= want*(1+1e-15) && want*(1-1e-15) <= x.Hi) || x.Wid() > 1e-14*want {
				t.Errorf("%s: %s %v, want %v", tc.name, what, x, want)
			}
		}
		check("diameter", p.Diameter(), tc.diameter)
		check("volume", p.Volume(), tc.volume)
		check("surface area", p.SurfaceArea(), tc.surface)
		if c := p.Convex(); c != tc.convex {
			t.Errorf("%s: %s, want %s", tc.name, c, tc.convex)
		}
		q, err := Parse(p.Canonical())
		if err != nil || string(q.Canonical()) != string(p.Canonical()) {
			t.Errorf("%s: the canonical form does not read back to itself: %v\n%s", tc.name, err, p.Canonical())
		}
	}
}

// TestProductRectangle: a product of two intervals is also the rectangle
// it is, with its edges' conditions in the polygon's order (bottom, right,
// top, left), and its canonical form keeps the product.
func TestProductRectangle(t *testing.T) {
	p := mustParse(t, `{"domain":{"product":[{"interval":["0","2"]},{"interval":["0","1"]}]},"boundary":[["dirichlet","neumann"],[{"robin":"1"},"dirichlet"]],"potential":"x*y"}`)
	if p.Dim != 2 || len(p.Vertices) != 4 || p.Convex() != "convex" {
		t.Fatalf("dim %d, %d vertices, %s", p.Dim, len(p.Vertices), p.Convex())
	}
	want := []boundary.Kind{boundary.Robin, boundary.Neumann, boundary.Dirichlet, boundary.Dirichlet}
	for i, bc := range p.Boundary {
		if bc.Kind != want[i] {
			t.Errorf("edge %d: %s, want %s", i, bc.Kind, want[i])
		}
	}
	if a := p.Area(); !a.Contains(2) || a.Wid() != 0 {
		t.Errorf("area %v, want 2", a)
	}
	if ok, why := p.Separable(); ok || !strings.Contains(why, "x*y") {
		t.Errorf("x*y separable: %v %s", ok, why)
	}
	r := mustParse(t, string(p.RectangleFile()))
	if r.IsProduct() || r.Dim != 2 || len(r.Boundary) != 4 || r.Boundary[0].Kind != boundary.Robin || r.PotentialText() != "x*y" {
		t.Errorf("rectangle file %s", p.RectangleFile())
	}
	if !strings.Contains(string(p.Canonical()), `"product"`) {
		t.Errorf("canonical form %s", p.Canonical())
	}
}

// TestProductSeparation: the parts of a separable potential in each
// factor's own coordinates (constants to the first factor), with the
// parameters, and the factors' problem files.
func TestProductSeparation(t *testing.T) {
	p := mustParse(t, `{"domain":{"product":[{"interval":["0","1"]},{"polygon":[["0","0"],["1","0"],["0","1"]]},{"interval":["0","1"]}]},
		"parameters":{"a":"3"},"boundary":"dirichlet","potential":"a + y^2 - sin(z) + x*a + w^2","eigenvalues":3}`)
	if p.Dim != 4 {
		t.Fatalf("dim %d", p.Dim)
	}
	if ok, why := p.Separable(); !ok {
		t.Fatal(why)
	}
	want := []string{"a+x*a", "x^2-sin(y)", "x^2"}
	for i, w := range want {
		sub := mustParse(t, string(p.FactorFile(i, 4, "1e-8")))
		if sub.PotentialText() != w || sub.Eigenvalues != 4 || sub.RelWidth.Text != "1e-8" || sub.IsProduct() {
			t.Errorf("factor %d: potential %q, %d eigenvalues, target %s; want %q", i, sub.PotentialText(), sub.Eigenvalues, sub.RelWidth.Text, w)
		}
	}
	// The range of V on the product contains its values at corners.
	r := p.PotentialRange()
	for _, v := range []float64{3 + 0 + 0 - 0 + 0, 3 + 1 - math.Sin(0) + 3 + 1} {
		if !r.Contains(v) {
			t.Errorf("range %v misses %v", r, v)
		}
	}
}
