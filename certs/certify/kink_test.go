package certify

import (
	"fmt"
	"math"
	"math/big"
	"testing"

	"gapcert/interval"
)

// bigF is x as a seriesPrec-bit big.Float.
func bigF(x float64) *big.Float { return new(big.Float).SetPrec(seriesPrec).SetFloat64(x) }

// requireContains fails unless the certificate's λ_index contains truth and
// is at most maxWidth wide relative to max(|truth|, scale).
func requireContains(t *testing.T, what string, got interval.I, truth *big.Float, scale, maxWidth float64) {
	t.Helper()
	if !bigInside(truth, got) {
		t.Errorf("%s: enclosure %v misses the reference %s", what, got, truth.Text('g', 20))
		return
	}
	if w := relWidth(got, scale); w > maxWidth {
		t.Errorf("%s: enclosure %v has relative width %.3g > %.3g", what, got, w, maxWidth)
	}
}

// absReference returns the first three Dirichlet eigenvalues of −u″ + |x|u
// on (−1, 1): by symmetry the even modes solve −u″ + xu = λu on (0, 1)
// with u′(0) = 0, u(1) = 0 and the odd ones with u(0) = 0, u(1) = 0
// (common practice), by series shooting (series_test.go). Brackets: V ∈
// [0, 1] puts λ_k in [k²π²/4, k²π²/4 + 1] (monotonicity in V), one
// eigenvalue each.
func absReference(t *testing.T) [3]*big.Float {
	one := bigF(1)
	q := math.Pi * math.Pi / 4
	return [3]*big.Float{
		linearRoot(t, q-1e-9, q+1, one, 1, 0, false),
		linearRoot(t, 4*q-1e-9, 4*q+1, one, 0, 1, false),
		linearRoot(t, 9*q-1e-9, 9*q+1, one, 1, 0, false),
	}
}

// TestKinkAbs: V = |x| on (−1, 1), Dirichlet. The kink at 0 is a node of
// the uniform meshes, where the Taylor models take the branch of each
// closed cell. Reference: Airy-type series shooting (absReference).
func TestKinkAbs(t *testing.T) {
	ref := absReference(t)
	_, c := certifyText(t, `{"domain":{"interval":["-1","1"]},"potential":"abs(x)","boundary":"dirichlet","eigenvalues":3}`, 1e-9)
	scale := math.Pi * math.Pi / 4
	for k := 1; k <= 3; k++ {
		requireContains(t, fmt.Sprintf("lambda%d", k), eigenEnclosure(t, c, k), ref[k-1], scale, 1e-9)
	}
	gap, _ := c.Results.Gap.Interval()
	requireContains(t, "gap", gap, new(big.Float).Sub(ref[1], ref[0]), scale, 1e-9)
	if len(c.Warnings) > 0 {
		t.Errorf("warnings: %v", c.Warnings)
	}
}

// TestKinkMin: V = min(x, 1 − x) on (0, 1), Dirichlet, symmetric about
// 1/2 where V = x on (0, 1/2): the even modes solve −u″ + xu = λu on
// (0, 1/2) with u(0) = 0, u′(1/2) = 0, the odd ones u(1/2) = 0 (common
// practice). V ∈ [0, 1/2] brackets λ_k in [k²π², k²π² + 1/2].
func TestKinkMin(t *testing.T) {
	half := bigF(0.5)
	q := math.Pi * math.Pi
	ref := [2]*big.Float{
		linearRoot(t, q-1e-9, q+0.5, half, 0, 1, true),
		linearRoot(t, 4*q-1e-9, 4*q+0.5, half, 0, 1, false),
	}
	_, c := certifyText(t, `{"domain":{"interval":["0","1"]},"potential":"min(x, 1-x)","boundary":"dirichlet","eigenvalues":2}`, 1e-9)
	for k := 1; k <= 2; k++ {
		requireContains(t, fmt.Sprintf("lambda%d", k), eigenEnclosure(t, c, k), ref[k-1], q, 1e-9)
	}
}

// kinkReference returns the Dirichlet eigenvalue in [lo, hi] (one sign
// change) of −u″ + |x − k|u = λu on (k − l1, k + l2). With t the distance
// to the kink both pieces solve −w″ + tw = λw; with φ₁, φ₂ the series
// solutions with (w, w′)(0) = (1, 0) and (0, 1) (series_test.go),
// u = Aφ₁(k − x) − Bφ₂(k − x) left and Aφ₁(x − k) + Bφ₂(x − k) right
// (u(k) = A, u′(k) = B), and the Dirichlet ends give
// det = φ₁(l1)φ₂(l2) + φ₂(l1)φ₁(l2) = 0 (common practice).
func kinkReference(t *testing.T, l1, l2 *big.Float, lo, hi float64) *big.Float {
	det := func(mu *big.Float) int {
		a1, _, t1 := seriesShoot(mu, l1, 1, 0)
		a2, _, t2 := seriesShoot(mu, l1, 0, 1)
		b1, _, t3 := seriesShoot(mu, l2, 1, 0)
		b2, _, t4 := seriesShoot(mu, l2, 0, 1)
		if math.Max(math.Max(t1, t2), math.Max(t3, t4)) > 1e-60 {
			t.Fatal("series tail too large")
		}
		d := new(big.Float).SetPrec(seriesPrec).Mul(a1, b2)
		return d.Add(d, new(big.Float).SetPrec(seriesPrec).Mul(a2, b1)).Sign()
	}
	a, b := bigF(lo), bigF(hi)
	sa := det(a)
	if sa == 0 || sa == det(b) {
		t.Fatalf("no sign change on [%g, %g]", lo, hi)
	}
	for i := 0; i < 200; i++ {
		m := new(big.Float).SetPrec(seriesPrec).Add(a, b)
		m.Quo(m, bigF(2))
		if det(m) == sa {
			a = m
		} else {
			b = m
		}
	}
	return a
}

// TestKinkInsideCell: V = |x − 1/3| on (0, 1), Dirichlet. 1/3 is not a
// float, so no node can carry the kink and its cell gets the range model.
// 1/3 and 2/3 enter the reference as 320-bit floats (relative error
// 1e-96, far below the test's widths). V ∈ [0, 2/3] brackets λ_k in
// [k²π², k²π² + 2/3].
func TestKinkInsideCell(t *testing.T) {
	third := new(big.Float).SetPrec(seriesPrec).Quo(bigF(1), bigF(3))
	twoThirds := new(big.Float).SetPrec(seriesPrec).Quo(bigF(2), bigF(3))
	q := math.Pi * math.Pi
	ref := [2]*big.Float{kinkReference(t, third, twoThirds, q-1e-9, q+2.0/3), kinkReference(t, third, twoThirds, 4*q-1e-9, 4*q+2.0/3)}
	_, c := certifyText(t, `{"domain":{"interval":["0","1"]},"potential":"abs(x - 1/3)","boundary":"dirichlet","eigenvalues":2}`, 1e-6)
	for k := 1; k <= 2; k++ {
		requireContains(t, fmt.Sprintf("lambda%d", k), eigenEnclosure(t, c, k), ref[k-1], q, 1e-6)
	}
	t.Logf("reference λ1 = %s, λ2 = %s; widths %v; warnings %v", ref[0].Text('g', 17), ref[1].Text('g', 17), c.Results.RelativeWidths, c.Warnings)
}

// TestKinkAtFloatPoint: V = |x − 1| on (0, 3), Dirichlet. The kink 1 is
// a float but not a node of the uniform meshes of (0, 3), so the meshes
// get a node there (formula.Expr.Kinks) and the enclosures are as narrow
// as for a smooth V. V ∈ [0, 2] brackets λ_k in [k²π²/9, k²π²/9 + 2].
func TestKinkAtFloatPoint(t *testing.T) {
	q := math.Pi * math.Pi / 9
	ref := [2]*big.Float{kinkReference(t, bigF(1), bigF(2), q-1e-9, q+2), kinkReference(t, bigF(1), bigF(2), 4*q-1e-9, 4*q+2)}
	_, c := certifyText(t, `{"domain":{"interval":["0","3"]},"potential":"abs(x - 1)","boundary":"dirichlet","eigenvalues":2}`, 1e-9)
	for k := 1; k <= 2; k++ {
		requireContains(t, fmt.Sprintf("lambda%d", k), eigenEnclosure(t, c, k), ref[k-1], q, 1e-9)
	}
	if len(c.Warnings) > 0 {
		t.Errorf("warnings: %v", c.Warnings)
	}
}

// TestKinkSquareSeparable: V = |x| + |y| on (−1, 1)², Dirichlet, separates
// (common practice): λ_1 = 2μ_1 and λ_2 = λ_3 = μ_1 + μ_2 with μ_k the
// eigenvalues of |x| on (−1, 1) (absReference). The kinks lie on mesh
// edges after the first refinement, where the triangle models take the
// branch of each closed quadrant.
func TestKinkSquareSeparable(t *testing.T) {
	mu := absReference(t)
	_, c := certifyText(t, `{"domain":{"polygon":[["-1","-1"],["1","-1"],["1","1"],["-1","1"]]},"potential":"abs(x) + abs(y)","boundary":"dirichlet","eigenvalues":2}`, 1e-3)
	scale := math.Pi * math.Pi / 8 // π²/D², D = 2√2
	l1 := new(big.Float).SetPrec(seriesPrec).Add(mu[0], mu[0])
	l2 := new(big.Float).SetPrec(seriesPrec).Add(mu[0], mu[1])
	requireContains(t, "lambda1", eigenEnclosure(t, c, 1), l1, scale, 1e-3)
	requireContains(t, "lambda2", eigenEnclosure(t, c, 2), l2, scale, 1e-3)
	t.Logf("widths %v; warnings %v", c.Results.RelativeWidths, c.Warnings)
}

// TestKinkDiagonal: V = |x − y| on the unit square, Dirichlet. The kink
// y = x crosses the triangles of the meshes (their diagonals run along
// y = 1 − x), so those triangles get range models. No closed form:
// containment is checked against 0 ≤ V ≤ 1, which puts λ_1 in
// [2π², 2π² + 1] and λ_2 in [5π², 5π² + 1] (monotonicity in V, common
// practice), and the enclosures must be narrow (the widths shrink like h²,
// measured: 0.021, 0.0069, 0.002, 0.0005 for λ_1 at 8 to 512 trial
// triangles).
func TestKinkDiagonal(t *testing.T) {
	_, c := certifyText(t, `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"potential":"abs(x - y)","boundary":"dirichlet","eigenvalues":2}`, 3e-3)
	pi2 := interval.Pi().Sqr()
	for k, m := range []float64{2, 5} {
		box := pi2.MulF(m).Hull(pi2.MulF(m).AddF(1))
		got := eigenEnclosure(t, c, k+1)
		// Both contain λ_k, so they must meet.
		if !(got.Lo <= box.Hi && got.Hi >= box.Lo) {
			t.Errorf("lambda%d: enclosure %v misses [%v, %v]", k+1, got, box.Lo, box.Hi)
		}
		if w := relWidth(got, pi2.Lo/2); w > 3e-3 {
			t.Errorf("lambda%d: enclosure %v has relative width %.3g > 3e-3", k+1, got, w)
		}
	}
	t.Logf("λ1 %v λ2 %v; widths %v; warnings %v", eigenEnclosure(t, c, 1), eigenEnclosure(t, c, 2), c.Results.RelativeWidths, c.Warnings)
}
