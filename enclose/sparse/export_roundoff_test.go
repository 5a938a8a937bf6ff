package sparse

import "testing"

// Hooks for the tests of package sparse_test that check roundoffBound on
// finite-element pencils (which package sparse cannot build itself).

// RoundoffRatio factors the interval pencil (k, m) at sigma as CountBelow
// does (the Counter's order) by the multifrontal algorithm if
// multifrontalAlg, else the up-looking one, on procs CPUs, checks the
// a-priori residual bound r against the exact residual norm (a test
// error if r is smaller) and returns r/‖R‖∞ and the factors D and L
// (values), or ok = false if the factorization failed or r = +∞.
func RoundoffRatio(t *testing.T, k, m *ISym, sigma float64, multifrontalAlg bool, procs int) (ratio float64, d, l []float64, ok bool) {
	t.Helper()
	alg := upLooking
	if multifrontalAlg {
		alg = multifrontal
	}
	ratio, f, ok := exactRatio(t, exactCase{name: "pencil", k: k, m: m, sigma: sigma}, alg, procs)
	if !ok {
		return 0, nil, nil, false
	}
	return ratio, f.D, f.Val, true
}
