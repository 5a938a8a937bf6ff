package cover

import (
	"errors"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim"
	"gapcert/interval"
)

// luRowlettFamily is the Dirichlet triangle with base [0, 1] and apex
// (a, b), a ∈ [aLo, aHi], b ∈ [bLo, bHi], with the claim D²·gap ≥ 64π²/9,
// written out and as the built-in @triangle_gap (whose hypotheses carry
// over to the cell: the geometry rule keeps triangles, boundary kinds and
// V):
// among triangles the equilateral one minimises D²·(λ₂ − λ₁), with value
// 64π²/9 (Z. Lu and J. Rowlett, The fundamental gap of simplices, Comm.
// Math. Phys. 319 (2013) 111–145). The regions used below keep the apex
// away from the equilateral apex (1/2, √3/2) and from the base (b ≥ 1/4).
func luRowlettFamily(aLo, aHi, bLo, bHi string, count int, minCell string) string {
	return `{
  "name": "triangles, base [0, 1], apex (a, b)",
  "template": {"domain": {"polygon": [["0","0"],["1","0"],["a","b"]]}, "boundary": "dirichlet"},
  "parameters": [{"name": "a", "range": {"lo": "` + aLo + `", "hi": "` + aHi + `", "count": ` + itoa(count) + `}, "min_cell": "` + minCell + `"},
                 {"name": "b", "range": {"lo": "` + bLo + `", "hi": "` + bHi + `", "count": ` + itoa(count) + `}, "min_cell": "` + minCell + `"}],
  "claims": ["D^2*gap >= 64*pi^2/9", "@triangle_gap"],
  "relative_width": "1e-3"
}`
}

// triangleGapExample is luRowlettFamily over a ∈ [1/10, 2/5], b ∈ [1/4,
// 1/2] with 16 × 16 boxes in the first split and width 1e-2.
const triangleGapExample = "../../testdata/examples/triangle_gap_cover.json"

func TestTriangleFamilyLuRowlettHolds(t *testing.T) {
	// Default: a corner of the region; GAPCERT_LONG=1: the README's
	// example, a ∈ [1/10, 2/5], b ∈ [1/4, 1/2] (256 cells).
	text := luRowlettFamily("1/8", "3/16", "1/4", "5/16", 2, "1/512")
	if os.Getenv("GAPCERT_LONG") == "1" {
		data, err := os.ReadFile(triangleGapExample)
		if err != nil {
			t.Fatal(err)
		}
		text = string(data)
	}
	f := mustFamily(t, text)
	for j, d := range f.Dependences {
		if !d.geometric() || d.Direction != 0 {
			t.Fatalf("dependence %d: %+v, want the geometry rule", j, d)
		}
	}
	dir := t.TempDir()
	s, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if c := s.Claims[0].Coverage; c.Holds != "1" || s.Covered != "1" {
		t.Fatalf("coverage %+v, covered %s", c, s.Covered)
	}
	if s.Corners > 2*len(s.Cells) {
		t.Errorf("%d reference certificates for %d cells", s.Corners, len(s.Cells))
	}
	data, err := os.ReadFile(filepath.Join(dir, s.Cells[0].File))
	if err != nil {
		t.Fatal(err)
	}
	c, _, err := CheckCell(data, dir, nil)
	if err != nil {
		t.Fatal(err)
	}
	if c.Low.File != c.High.File || c.Low.CertificateSHA256 != c.High.CertificateSHA256 {
		t.Errorf("a geometry cell has one reference; low %+v, high %+v", c.Low, c.High)
	}
	for _, cl := range c.Claims {
		if cl.Verdict != certs.Holds {
			t.Errorf("claim %s: %s (%s)", cl.Text, cl.Verdict, cl.Reason)
		}
		for _, h := range cl.Hypotheses {
			if h.Verdict != certs.Proven {
				t.Errorf("claim %s: hypothesis %s %s (%s)", cl.Text, h.Name, h.Verdict, h.Detail)
			}
		}
	}
	t.Logf("%d cells, %d reference certificates", len(s.Cells), s.Corners)
}

// TestGeometryCellEnclosesEveryPoint certifies random points inside random
// cells of the triangle family separately and demands that each point's
// enclosures lie inside the cell's (30 cells by default, 1000 with
// GAPCERT_LONG=1).
func TestGeometryCellEnclosesEveryPoint(t *testing.T) {
	cells := 30
	if os.Getenv("GAPCERT_LONG") == "1" {
		cells = 1000
	}
	f := mustFamily(t, luRowlettFamily("1/8", "3/8", "1/4", "1/2", 1, "1/512"))
	pointsInsideCells(t, f, cells, 17)
}

// closedFormCell returns the quantities of one cell of a family whose
// every triangle is congruent up to scale to one with known eigenvalues.
func closedFormCell(t *testing.T, family string, b Box) (*Family, corner, map[string]interval.I, map[string]string) {
	t.Helper()
	f := mustFamily(t, family)
	e := &engine{f: f, dir: t.TempDir(), opt: testOptions(), verifier: NewCornerVerifier(0), corners: map[string]*cornerEntry{}}
	if err := e.certifyCorners([]Box{b}); err != nil {
		t.Fatal(err)
	}
	lv, _ := f.Corners(b)
	p, err := f.Problem(lv)
	if err != nil {
		t.Fatal(err)
	}
	ce := e.corners[p.SHA256()]
	if ce.err != nil {
		t.Fatal(ce.err)
	}
	env, missing, err := f.cellQuantities(b, ce.corner, ce.corner)
	if err != nil {
		t.Fatal(err)
	}
	return f, ce.corner, env, missing
}

func ratBox(bounds ...[2]*big.Rat) Box {
	var b Box
	for _, r := range bounds {
		b.Lo, b.Hi = append(b.Lo, r[0]), append(b.Hi, r[1])
	}
	return b
}

// TestRotatedScaledTrianglesInsideCell: families whose triangles are the
// equilateral triangle of side s, or the right isosceles triangle of legs
// s, rotated by θ, over a cell of (s, θ). Closed forms (common practice;
// M. A. Pinsky, The eigenvalues of an equilateral triangle, SIAM J. Math.
// Anal. 11 (1980) 819–827, for the equilateral one; the right isosceles
// one from the square's modes sin(mπx/s)sin(nπy/s) − sin(nπx/s)sin(mπy/s),
// m > n ≥ 1): equilateral λ₁ = 16π²/(3s²), λ₂ = 112π²/(9s²); right
// isosceles λ₁ = 5π²/s², λ₂ = 10π²/s²; Neumann right isosceles (the
// square's modes cos(mπx/s)cos(nπy/s) + cos(nπx/s)cos(mπy/s), m ≥ n ≥ 0)
// λ₁ = 0, λ₂ = π²/s²; with V ≡ 3 every eigenvalue is shifted by 3. At
// points spread over the cell the
// exact values lie in the cell's enclosures, and the enclosures are
// narrow: within the relative width 4r + 3·10⁻⁴ of the truth's range
// (first order in r, the bound of ‖A − I‖_F).
func TestRotatedScaledTrianglesInsideCell(t *testing.T) {
	cases := []struct {
		name, polygon, boundary, potential string
		shift, l1, l2                      float64 // V, (λ_k − V)·s²/π²
	}{
		{"equilateral", `[["0","0"],["s*cos(t)","s*sin(t)"],["s*cos(t+pi/3)","s*sin(t+pi/3)"]]`, "dirichlet", "0", 0, 16.0 / 3, 112.0 / 9},
		{"right isosceles", `[["0","0"],["s*cos(t)","s*sin(t)"],["-s*sin(t)","s*cos(t)"]]`, "dirichlet", "0", 0, 5, 10},
		{"right isosceles V = 3", `[["0","0"],["s*cos(t)","s*sin(t)"],["-s*sin(t)","s*cos(t)"]]`, "dirichlet", "3", 3, 5, 10},
		{"right isosceles Neumann", `[["0","0"],["s*cos(t)","s*sin(t)"],["-s*sin(t)","s*cos(t)"]]`, "neumann", "0", 0, 0, 1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			family := `{"template": {"domain": {"polygon": ` + c.polygon + `}, "boundary": "` + c.boundary + `", "potential": "` + c.potential + `"},
			  "parameters": [{"name": "s", "range": {"lo": "9/10", "hi": "11/10"}, "min_cell": "1/64"},
			                 {"name": "t", "range": {"lo": "0", "hi": "1"}, "min_cell": "1/64"}],
			  "relative_width": "1e-4"}`
			b := ratBox([2]*big.Rat{big.NewRat(63, 64), big.NewRat(65, 64)}, [2]*big.Rat{big.NewRat(1, 4), big.NewRat(17, 64)})
			f, ref, env, missing := closedFormCell(t, family, b)
			if len(missing) > 1 { // alpha only
				t.Fatalf("missing quantities %v", missing)
			}
			g, err := f.geometryOver(b, ref.problem, centreOf(b))
			if err != nil {
				t.Fatal(err)
			}
			sLo, sHi := 63.0/64, 65.0/64
			shift := c.shift
			for i := 0; i <= 8; i++ {
				s := sLo + (sHi-sLo)*float64(i)/8
				for k, want := range []float64{c.l1, c.l2} {
					exact := interval.Pi().Sqr().MulF(want).Div(interval.Point(s).Sqr()).AddF(shift)
					cell := env[claim.Eigenvalue(k+1)]
					if !(cell.Lo <= exact.Lo && exact.Hi <= cell.Hi) {
						t.Errorf("s = %g: λ%d = %v not inside the cell's %v", s, k+1, exact, cell)
					}
				}
			}
			// Narrowness: the truth ranges over [λ(sHi), λ(sLo)].
			for k, want := range []float64{c.l1, c.l2} {
				cell := env[claim.Eigenvalue(k+1)]
				truthLo, truthHi := want*math.Pi*math.Pi/(sHi*sHi)+shift, want*math.Pi*math.Pi/(sLo*sLo)+shift
				slack := (4*g.R+3e-4)*truthHi + 1e-6
				if cell.Lo < truthLo-slack || cell.Hi > truthHi+slack {
					t.Errorf("λ%d: cell %v is wider than [%g, %g] ± %g (r = %g)", k+1, cell, truthLo, truthHi, slack, g.R)
				}
			}
			// The diameter: s (equilateral) or s·√2 (right isosceles).
			dFactor := 1.0
			if strings.HasPrefix(c.name, "right isosceles") {
				dFactor = math.Sqrt2
			}
			if d := env[claim.Diameter]; !(d.Lo <= sLo*dFactor*(1+1e-12) && sHi*dFactor*(1-1e-12) <= d.Hi && d.Hi-d.Lo < 3*(sHi-sLo)*dFactor) {
				t.Errorf("D over the cell %v; want about [%g, %g]", d, sLo*dFactor, sHi*dFactor)
			}
			t.Logf("r = %.3g; λ1 %v, λ2 %v", g.R, env["lambda1"], env["lambda2"])
		})
	}
}

func centreOf(b Box) []*big.Rat {
	var c []*big.Rat
	for j := range b.Lo {
		m := new(big.Rat).Add(b.Lo[j], b.Hi[j])
		c = append(c, m.Quo(m, big.NewRat(2, 1)))
	}
	return c
}

// TestGeometryRefusals: combinations the geometry rule does not bound are
// refused before anything is certified, with the reason.
func TestGeometryRefusals(t *testing.T) {
	tri := `"domain": {"polygon": [["0","0"],["1","0"],["a","1/2"]]}`
	param := `"parameters": [{"name": "a", "range": {"lo": "0", "hi": "1/2"}, "min_cell": "1/64"}]`
	cases := []struct{ name, text, want string }{
		{"Robin side", `{"template": {` + tri + `, "boundary": [{"robin": "1"}, "dirichlet", "dirichlet"]}, ` + param + `}`,
			"side 0 has a Robin condition"},
		{"potential", `{"template": {` + tri + `, "potential": "x^2", "boundary": "dirichlet"}, ` + param + `}`,
			"the potential is V = x^2"},
		{"potential with a covered parameter", `{"template": {` + tri + `, "potential": "a", "boundary": "dirichlet"}, ` + param + `}`,
			"naming no covered parameter"},
		{"quadrilateral", `{"template": {"domain": {"polygon": [["0","0"],["1","0"],["1","1"],["a","1"]]}, "boundary": "dirichlet"}, ` + param + `}`,
			"has 4 vertices"},
		{"interval", `{"template": {"domain": {"interval": ["0","1+a"]}, "boundary": "dirichlet"}, ` + param + `}`,
			"not a polygon"},
		{"degenerate triangle in the box", `{"template": {"domain": {"polygon": [["0","0"],["1","0"],["1/2","b"]]}, "boundary": "dirichlet"},
		  "parameters": [{"name": "b", "range": {"lo": "-1/4", "hi": "1/4"}, "min_cell": "1/64"}]}`, "degenerate"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseFamily([]byte(c.text))
			var inv *InvalidError
			if !errors.As(err, &inv) {
				t.Fatalf("error %v, want *InvalidError", err)
			}
			if !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), `parameter "`) {
				t.Errorf("error %q does not name the parameter and say %q", err, c.want)
			}
		})
	}
	// A Robin condition with α = 0 is the Neumann condition: accepted.
	if _, err := ParseFamily([]byte(`{"template": {` + tri + `, "boundary": [{"robin": "0"}, "dirichlet", "neumann"]}, ` + param + `}`)); err != nil {
		t.Errorf("α = 0 refused: %v", err)
	}
}

// TestGeometryWideCellUndecided: on a cell so wide that ‖A − I‖_F is not
// proved below 1 (apex height from 1/16 to 1: the cell reaches almost
// degenerate triangles), the eigenvalues have no enclosure and the claim
// is undecided with the reason, so the cover splits the cell.
func TestGeometryWideCellUndecided(t *testing.T) {
	family := luRowlettFamily("0", "1", "1/16", "1", 1, "1/4")
	b := ratBox([2]*big.Rat{big.NewRat(0, 1), big.NewRat(1, 1)}, [2]*big.Rat{big.NewRat(1, 16), big.NewRat(1, 1)})
	f, ref, env, missing := closedFormCell(t, family, b)
	if _, ok := env["lambda1"]; ok {
		t.Fatalf("λ1 enclosed on the wide cell: %v", env["lambda1"])
	}
	if why := missing["gap"]; !strings.Contains(why, "not proved nonsingular") {
		t.Fatalf("reason %q", why)
	}
	_, claims, err := f.cellClaims(b, ref, ref)
	if err != nil {
		t.Fatal(err)
	}
	if claims[0].Verdict != certs.Undecided || !strings.Contains(claims[0].Reason, "degenerate") {
		t.Errorf("claim %+v, want undecided for a possibly degenerate triangle", claims[0])
	}
}
