package certify

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"
	"time"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// reflectionTarget is the relative width the reflection sweep asks of λ1,
// λ2 and the gap; reflectionMaxWidth is the relative width every
// enclosure must reach (eigenvalues relative to max(|λ|, λ2), the gap
// relative to itself), a little above the target because the target rule
// measures the width against the enclosure's midpoint.
const (
	reflectionTarget   = 1e-6
	reflectionMaxWidth = 1.1e-6
)

// reflectionCase is one polygon of the reflection sweep: its problem text
// and the exact λ1, λ2 (truth intervals enclosing them).
type reflectionCase struct {
	kind   string
	src    string
	lambda [2]interval.I
}

// sizeText returns a random length in [1e-2, 1e2] (log-uniform) as exact
// decimal text with three significant digits.
func sizeText(rng *rand.Rand) string {
	x := math.Pow(10, 4*rng.Float64()-2)
	digits := 2 - int(math.Floor(math.Log10(x)))
	if digits < 0 {
		digits = 0
	}
	return fmt.Sprintf("%.*f", digits, x)
}

// exactInterval encloses the decimal text s (a test input, so malformed
// text is a bug of the test).
func exactInterval(s string) interval.I {
	x, err := decimalio.Parse(s)
	if err != nil {
		panic(err)
	}
	return x
}

// bigInterval encloses a big.Float reference by its two float64
// neighbours (exact when it is a float64).
func bigInterval(x *big.Float) interval.I {
	f, acc := x.Float64()
	switch acc {
	case big.Below:
		return interval.I{Lo: f, Hi: math.Nextafter(f, math.Inf(1))}
	case big.Above:
		return interval.I{Lo: math.Nextafter(f, math.Inf(-1)), Hi: f}
	}
	return interval.Point(f)
}

// newReflectionCase draws case i of the sweep (i mod 3 picks the shape,
// i/3 the triangle's conditions in turn, a rectangle's are random):
// a rectangle, a right isosceles triangle or an equilateral triangle,
// translated to a random point of [−10, 10]², scaled to a random size in
// [1e-2, 1e2] and rotated by a random rational multiple pπ/q of π, its
// vertices written as exact formula text ("x0 + a*cos(p*pi/q)"). Rotation
// and translation do not change the eigenvalues; scaling by s divides them
// by s² (common practice).
//
// Rectangle (0, a) × (0, b), each side Dirichlet or Neumann: separation of
// variables gives λ = μ_i + ν_j with the 1D eigenvalues in each direction,
// (kπ/L)² for Dirichlet–Dirichlet (k ≥ 1), ((k − ½)π/L)² for
// Dirichlet–Neumann (k ≥ 1), (kπ/L)² for Neumann–Neumann (k ≥ 0)
// (common practice); rectangleEigenvalues computes them in big.Float.
//
// Right isosceles triangle with legs a along the axes and the hypotenuse
// on the diagonal of the square (0, a)²: reflection across the diagonal
// extends an eigenfunction to the square with the legs' condition on all
// four sides, odd across the diagonal for a Dirichlet hypotenuse and even
// for a Neumann one; conversely the odd (even) combinations
// f(x, y) ∓ f(y, x) of the square's product eigenfunctions restrict to
// eigenfunctions of the triangle, and they span its eigenspaces (common
// practice; the same folding argument as M. A. Pinsky, The eigenvalues of
// an equilateral triangle, SIAM J. Math. Anal. 11 (1980) 819–827, §1). So
// λ = (π/a)²(m² + n²) with
//
//	legs Dirichlet, hypotenuse Dirichlet: m > n ≥ 1 → 5, 10
//	legs Dirichlet, hypotenuse Neumann:   m ≥ n ≥ 1 → 2, 5
//	legs Neumann,   hypotenuse Dirichlet: m > n ≥ 0 → 1, 4
//	legs Neumann,   hypotenuse Neumann:   m ≥ n ≥ 0 → 0, 1
//
// times (π/a)².
//
// Equilateral triangle of side ℓ: λ = (16π²/(9ℓ²))(m² + mn + n²) with
// m, n ≥ 1 for Dirichlet and m, n ≥ 0 for Neumann (Lamé 1833; proved
// complete in Pinsky 1980, cited above), so 3, 7 (Dirichlet) and 0, 1
// (Neumann) times 16π²/(9ℓ²). With the inradius r = ℓ/(2√3) the unit is
// 4π²/(27r²) (ℓ² = 12r²). Derivation of the unit: the reflections in the
// sides generate a group whose translations form the triangular lattice
// of spacing d = 2·(altitude) = √3ℓ; an eigenfunction extends to the plane
// as a combination of plane waves e^{ik·x} with k in the reciprocal
// lattice, triangular of spacing 2π/(d·sin 60°) = 4π/(3ℓ), whose vectors
// mb₁ + nb₂ (b₁, b₂ at 60°) have |k|² = (4π/(3ℓ))²(m² + mn + n²); the
// Dirichlet (odd) combinations vanish unless m, n ≥ 1. Check: ℓ = 1 gives
// the Dirichlet λ1 = 16π²/3 ≈ 52.638, as in Pinsky.
func newReflectionCase(rng *rand.Rand, i int) reflectionCase {
	variant := i / 3 // cycles the triangles' conditions: every 12 cases hold each kind
	dec := func(lo, hi float64) string { return fmt.Sprintf("%.2f", lo+(hi-lo)*rng.Float64()) }
	x0, y0 := dec(-10, 10), dec(-10, 10)
	q := 2 + rng.Intn(11)
	p := rng.Intn(2 * q)
	// vertex returns P0 + len·(cos φ, sin φ) with φ = pπ/q + extra as text.
	vertex := func(length, extra string) string {
		angle := fmt.Sprintf("%d*pi/%d%s", p, q, extra)
		return fmt.Sprintf(`["%s + %s*cos(%s)","%s + %s*sin(%s)"]`, x0, length, angle, y0, length, angle)
	}
	origin := fmt.Sprintf("[%q,%q]", x0, y0)
	pi2 := interval.Pi().Sqr()
	switch i % 3 {
	case 0:
		// b = a·r with r in [1/2, 2], exact (a has at most 4 decimals).
		a := sizeText(rng)
		b := new(big.Rat).Mul(mustRat(a), mustRat(dec(0.5, 2))).FloatString(8)
		var sides [4]end
		var text [4]string
		for s := range sides {
			if rng.Intn(2) == 0 {
				sides[s], text[s] = end{dirichlet: true}, `"dirichlet"`
			} else {
				text[s] = `"neumann"`
			}
		}
		// P0, P1 = P0 + a·e, P2 = P1 + b·e⊥, P3 = P0 + b·e⊥ with e at angle
		// pπ/q; side k runs from vertex k to vertex k + 1 (bottom, right,
		// top, left of the unrotated rectangle).
		angle := fmt.Sprintf("%d*pi/%d", p, q)
		p1 := vertex(a, "")
		p2 := fmt.Sprintf(`["%s + %s*cos(%s) - %s*sin(%s)","%s + %s*sin(%s) + %s*cos(%s)"]`,
			x0, a, angle, b, angle, y0, a, angle, b, angle)
		p3 := vertex(b, "+pi/2")
		src := fmt.Sprintf(`{"domain":{"polygon":[%s,%s,%s,%s]},"boundary":[%s,%s,%s,%s],"eigenvalues":2}`,
			origin, p1, p2, p3, text[0], text[1], text[2], text[3])
		truth := rectangleEigenvalues(a, b, sides, 2)
		return reflectionCase{kind: "rectangle", src: src, lambda: [2]interval.I{bigInterval(truth[0]), bigInterval(truth[1])}}
	case 1:
		a := sizeText(rng)
		legs, hyp := variant%2 == 0, variant/2%2 == 0 // Dirichlet?
		name := map[bool]string{true: `"dirichlet"`, false: `"neumann"`}
		var m [2]float64
		switch {
		case legs && hyp:
			m = [2]float64{5, 10}
		case legs:
			m = [2]float64{2, 5}
		case hyp:
			m = [2]float64{1, 4}
		default:
			m = [2]float64{0, 1}
		}
		src := fmt.Sprintf(`{"domain":{"polygon":[%s,%s,%s]},"boundary":[%s,%s,%s],"eigenvalues":2}`,
			origin, vertex(a, ""), vertex(a, "+pi/2"), name[legs], name[hyp], name[legs])
		unit := pi2.Div(exactInterval(a).Sqr())
		return reflectionCase{kind: "right isosceles " + name[legs] + "/" + name[hyp], src: src,
			lambda: [2]interval.I{unit.MulF(m[0]), unit.MulF(m[1])}}
	}
	l := sizeText(rng)
	bc, m := `"dirichlet"`, [2]float64{3, 7}
	if variant%2 == 1 {
		bc, m = `"neumann"`, [2]float64{0, 1}
	}
	src := fmt.Sprintf(`{"domain":{"polygon":[%s,%s,%s]},"boundary":%s,"eigenvalues":2}`,
		origin, vertex(l, ""), vertex(l, "+pi/3"), bc)
	unit := pi2.MulF(16).Div(exactInterval(l).Sqr().MulF(9))
	return reflectionCase{kind: "equilateral " + bc, src: src, lambda: [2]interval.I{unit.MulF(m[0]), unit.MulF(m[1])}}
}

func mustRat(s string) *big.Rat {
	r, err := decimalio.ParseRat(s)
	if err != nil {
		panic(err)
	}
	return r
}

// TestReflectionSweep certifies λ1, λ2 and the gap of random rectangles,
// right isosceles and equilateral triangles (newReflectionCase) in random
// positions, sizes and rotations at relative width 1e-6 and requires of
// every enclosure that it contains the exact value and reaches relative
// width reflectionMaxWidth. 12 polygons by default, 120 with
// GAPCERT_LONG=1.
func TestReflectionSweep(t *testing.T) {
	count := 12
	if longPolygons() {
		count = 120
	}
	rng := rand.New(rand.NewSource(1313))
	start := time.Now()
	misses, worst := 0, 0.0
	for i := 0; i < count; i++ {
		tc := newReflectionCase(rng, i)
		_, c := certifyText(t, tc.src, reflectionTarget)
		scale := tc.lambda[1].Lo
		for k := 1; k <= 2; k++ {
			got, truth := eigenEnclosure(t, c, k), tc.lambda[k-1]
			if !truth.Subset(got) {
				misses++
				t.Errorf("%s %s: lambda%d enclosure %v misses the exact value %v", tc.kind, tc.src, k, got, truth)
				continue
			}
			w := relWidth(got, scale)
			worst = math.Max(worst, w)
			if w > reflectionMaxWidth {
				t.Errorf("%s %s: lambda%d enclosure %v has relative width %.3g > %.3g", tc.kind, tc.src, k, got, w, reflectionMaxWidth)
			}
		}
		gap, err := c.Results.Gap.Interval()
		if err != nil {
			t.Fatal(err)
		}
		truth := tc.lambda[1].Sub(tc.lambda[0])
		if !truth.Subset(gap) {
			misses++
			t.Errorf("%s %s: gap enclosure %v misses the exact value %v", tc.kind, tc.src, gap, truth)
			continue
		}
		w := relWidth(gap, truth.Lo)
		worst = math.Max(worst, w)
		if w > reflectionMaxWidth {
			t.Errorf("%s %s: gap enclosure %v has relative width %.3g > %.3g", tc.kind, tc.src, gap, w, reflectionMaxWidth)
		}
	}
	t.Logf("%d reflection-built polygons in %v: %d misses, widest relative width %.3g", count, time.Since(start).Round(time.Millisecond), misses, worst)
}
