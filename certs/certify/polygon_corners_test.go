package certify

import (
	"errors"
	"math"
	"testing"

	"gapcert/certs"
	"gapcert/fem/problem"
)

// TestCornerExponents checks the corner classification against exponents
// computed by hand. Derivation: the interior angle ω at a vertex follows
// from the exact vertex coordinates by elementary trigonometry (written
// per case below), and the leading exponent from separation of variables
// in the sector of angle ω (Grisvard, Elliptic Problems in Nonsmooth
// Domains, 1985, ch. 4–5; the table in the doc of cornerExponent):
// π/ω for equal conditions on both sides, π/(2ω) for a Dirichlet side
// meeting a Neumann or Robin side; a corner is singular iff an exponent
// below the degree is not an integer.
func TestCornerExponents(t *testing.T) {
	atan2 := math.Atan(2) // the angle whose tangent is 2
	atan73 := math.Atan(7.0 / 3)
	cases := []struct {
		name string
		src  string
		want map[int]float64 // vertex → leading singular exponent at degree 10
	}{
		// Re-entrant corner of the L-shape, ω = 3π/2, at vertex 3 (1, 1).
		{"L-shape Dirichlet", `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"boundary":"dirichlet","eigenvalues":2}`,
			map[int]float64{3: 2.0 / 3}},
		{"L-shape Neumann", `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"potential":"1","boundary":"neumann","eigenvalues":2}`,
			map[int]float64{3: 2.0 / 3}},
		// Regular pentagon: ω = 3π/5 at every vertex, exponent 5/3.
		{"regular pentagon", `{"domain":{"polygon":[["0","0"],["1","0"],["1 + cos(2*pi/5)","sin(2*pi/5)"],["1/2","sin(2*pi/5) + sin(pi/5)"],["-cos(2*pi/5)","sin(2*pi/5)"]]},"boundary":"dirichlet","eigenvalues":2}`,
			map[int]float64{0: 5.0 / 3, 1: 5.0 / 3, 2: 5.0 / 3, 3: 5.0 / 3, 4: 5.0 / 3}},
		// Trapezoid (0,0), (3/2,0), (1,1), (0,1), sides Robin, Dirichlet,
		// Neumann, Dirichlet. Vertex 1: edges to (0,0) and (1,1) are
		// (−3/2, 0) and (−1/2, 1), cos ω = 1/√5, ω = arctan 2, Robin–
		// Dirichlet: π/(2 arctan 2) ≈ 1.4196. Vertex 2: edges (1/2, −1) and
		// (−1, 0), cos ω = −1/√5, ω = π − arctan 2 ≈ 116.57°, Dirichlet–
		// Neumann: π/(2(π − arctan 2)) ≈ 0.7723. Vertices 0 and 3 are right
		// angles with exponents 1, 3, 5, … (Robin–Dirichlet) and 2, 4, …
		// (Dirichlet–Dirichlet): regular.
		{"trapezoid with a 117° Dirichlet–Neumann corner", `{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`,
			map[int]float64{1: math.Pi / (2 * atan2), 2: math.Pi / (2 * (math.Pi - atan2))}},
		// Triangle (0,0), (1,0), (3/10,7/10): ω0 = arctan(7/3), ω1 = π/4
		// (exponents 4, 8: regular), ω2 = π − ω0 − π/4.
		{"generic triangle", `{"domain":{"polygon":[["0","0"],["1","0"],["3/10","7/10"]]},"boundary":"dirichlet","eigenvalues":2}`,
			map[int]float64{0: math.Pi / atan73, 2: math.Pi / (3*math.Pi/4 - atan73)}},
		// Robin trapezoid (0,0), (3,0), (2,1), (1,1), sides Dirichlet,
		// Robin, Neumann, Robin: 45° Dirichlet–Robin corners (exponents
		// 2, 6, …: regular) and 135° Robin–Neumann corners, π/(3π/4) = 4/3.
		{"Robin trapezoid", `{"domain":{"polygon":[["0","0"],["3","0"],["2","1"],["1","1"]]},"potential":"x*y","boundary":["dirichlet",{"robin":"3/2"},"neumann",{"robin":"1/4"}]}`,
			map[int]float64{2: 4.0 / 3, 3: 4.0 / 3}},
		// Integer exponents only: 2, 4, … at the square's right angles; 3,
		// 6, 9 at the equilateral triangle's 60°; 4, 8 at 45° (Dirichlet)
		// and 2, 4, … at 90° of the right isosceles triangle.
		{"unit square", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet"}`, nil},
		{"equilateral triangle", `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":"dirichlet"}`, nil},
		{"right isosceles triangle", `{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":"dirichlet"}`, nil},
		// Mixed conditions at the square's right angles: (k − ½)·2 = 1, 3,
		// 5, …: regular.
		{"square, Dirichlet and Neumann sides", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"1","boundary":["dirichlet","neumann","dirichlet","neumann"]}`, nil},
	}
	for _, c := range cases {
		p, err := problem.Parse([]byte(c.src))
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		got := singularCorners(p, gradedDegree, 0)
		if len(got) != len(c.want) {
			t.Errorf("%s: singular corners %+v, want vertices with exponents %v", c.name, got, c.want)
			continue
		}
		for _, k := range got {
			want, ok := c.want[k.vertex]
			if !ok || math.Abs(k.nu-want) > 1e-12*want {
				t.Errorf("%s: vertex %d exponent %.15g, want %.15g (listed: %v)", c.name, k.vertex, k.nu, want, ok)
			}
		}
		if hasSingularCorners(p) != (len(c.want) > 0) {
			t.Errorf("%s: hasSingularCorners %v", c.name, hasSingularCorners(p))
		}
	}
}

// TestCornerExponentBelowDegree: an exponent counts only below the
// degree. The generic triangle's exponents π/ω ≈ 2.69 and 2.64 make its
// corners singular at degree 3, not at degree 2, where its only exponents
// below the degree are none.
func TestCornerExponentBelowDegree(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["3/10","7/10"]]},"boundary":"dirichlet","eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	if got := singularCorners(p, 2, 0); len(got) != 0 {
		t.Errorf("degree 2: %+v, want none", got)
	}
	if got := singularCorners(p, 3, 0); len(got) != 2 {
		t.Errorf("degree 3: %+v, want vertices 0 and 2", got)
	}
}

// TestCornerLevels: the strongest corner gets the recipe's graded levels
// and a weaker one ⌈graded·ν_min/ν⌉ (for the 117° trapezoid: ν = 0.7723
// and 1.4196, ratio 0.5440, so 20 levels give 20 and ⌈10.88⌉ = 11).
func TestCornerLevels(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["3/2","0"],["1","1"],["0","1"]]},"potential":"x*y","boundary":[{"robin":"1"},"dirichlet","neumann","dirichlet"],"eigenvalues":2}`))
	if err != nil {
		t.Fatal(err)
	}
	levels := map[int]int{}
	for _, c := range singularCorners(p, gradedDegree, 20) {
		levels[c.vertex] = c.levels
	}
	if levels[2] != 20 || levels[1] != 11 || len(levels) != 2 {
		t.Errorf("levels %v, want vertex 2: 20, vertex 1: 11", levels)
	}
	// Stage A grades only the corner with ν < 1, by ⌈s(1/ν − 1)⌉ + 1
	// levels: at s = 3, ⌈3·0.2949⌉ + 1 = 2, whatever the trial grading.
	r := recipe{stageARefine: 3, graded: 20}
	cs := stageACorners(p, r)
	if len(cs) != 1 || cs[0].vertex != 2 || cs[0].levels != 2 {
		t.Errorf("stage-A corners %+v, want vertex 2 with 2 levels", cs)
	}
	r.graded = 0
	if again := stageACorners(p, r); len(again) != 1 || again[0] != cs[0] {
		t.Errorf("stage-A corners depend on the trial grading: %+v and %+v", cs, again)
	}
}

// lshapeSource is the L-shape of three unit squares with Dirichlet
// conditions; λ1 = 9.63972384402194105271 (R. S. Jones, Adv. Comput. Math.
// 2017, and T. Betcke, L. N. Trefethen, SIAM Review 47 (2005), 14 digits).
const lshapeSource = `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"potential":"0","boundary":"dirichlet","eigenvalues":2}`

const lshapeLambda1 = 9.63972384402194105271

// TestDeepGradedRecipeVerifies: a recipe graded to the driver's cap
// (maxGraded, 24 levels toward the re-entrant corner) computes and
// verifies, because stage A is graded by its own rule (stageACorners: 2
// levels at 3 uniform levels) — with 24 levels on the stage-A mesh too,
// its verified bounds were lost (measured, maxStageAGraded). The stage-A
// lower bound of λ1 holds the published value and is within 5% of it
// (measured 4.9%), stage B runs (the hybridised flux choice of package
// fem/tri stays accurate on the tiny corner elements), the enclosure of
// λ1 holds the published value and is narrow (relative width 6.9e-5 at
// degree 4 on one uniform level), and Check replays the recorded recipe and
// refuses graded_levels and degrees past the caps.
func TestDeepGradedRecipeVerifies(t *testing.T) {
	p := parseProblem(t, lshapeSource)
	r := firstRecipe(t, p)
	r.graded = maxGraded
	out, err := compute(p, r)
	if err != nil {
		t.Fatal(err)
	}
	lo := out.stageA[0] - r.gamma
	if !(lo <= lshapeLambda1) || (lshapeLambda1-lo)/lshapeLambda1 > 0.05 {
		t.Errorf("stage-A lower bound of lambda1 %.10g, want ≤ %.10g within 5%%", lo, lshapeLambda1)
	}
	if out.lg == nil {
		t.Errorf("stage B gave no bound: %v", out.notes)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		t.Fatal(err)
	}
	if !res.lambda[0].Contains(lshapeLambda1) {
		t.Errorf("lambda1 enclosure %v misses %.15g", res.lambda[0], lshapeLambda1)
	}
	if res.widths[0] > 2e-4 {
		t.Errorf("lambda1 relative width %.3g, want ≤ 2e-4 (measured 6.9e-5)", res.widths[0])
	}
	recordStep(t, res, "1e-2")
	c, err := res.certificate(p, Options{Now: fixedTime})
	if err != nil {
		t.Fatal(err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if m := methodOf(t, c); m.GradedLevels != maxGraded {
		t.Fatalf("recorded graded_levels %d, want %d", m.GradedLevels, maxGraded)
	}
	if err := Check(data); err != nil {
		t.Fatalf("the deep-graded certificate does not verify: %v", err)
	}
	for _, edit := range []func(m *Method){
		func(m *Method) { m.GradedLevels = maxGraded + 1 },
		func(m *Method) { m.Degree, m.FluxDegree = maxPolygonDegree+1, maxPolygonDegree },
	} {
		var fe *certs.FormatError
		if err := Check(editMethod(t, data, edit)); !errors.As(err, &fe) {
			t.Errorf("recipe past the driver's caps: %v, want a format error", err)
		}
	}
}
