package certify

import (
	"fmt"
	"testing"
)

// shootDirichlet returns an approximation of the k-th Dirichlet eigenvalue
// of −u″ + Vu = λu on (0, 1) by shooting (classical fourth-order
// Runge–Kutta on each side of the kink x0 with n steps per unit length,
// and bisection on the number of zeros and the sign of u(1); common
// practice). It is an independent float reference, not a bound.
func shootDirichlet(v func(float64) float64, x0 float64, k int, lo, hi float64) float64 {
	end := func(lam float64) (float64, int) {
		u, du, zeros := 0.0, 1.0, 0
		f := func(x, u float64) float64 { return (v(x) - lam) * u }
		step := func(a, b float64) {
			n := int((b-a)*40000) + 1
			h := (b - a) / float64(n)
			for i := 0; i < n; i++ {
				x := a + float64(i)*h
				k1u, k1d := du, f(x, u)
				k2u, k2d := du+h/2*k1d, f(x+h/2, u+h/2*k1u)
				k3u, k3d := du+h/2*k2d, f(x+h/2, u+h/2*k2u)
				k4u, k4d := du+h*k3d, f(x+h, u+h*k3u)
				un := u + h/6*(k1u+2*k2u+2*k3u+k4u)
				du += h / 6 * (k1d + 2*k2d + 2*k3d + k4d)
				if un*u < 0 {
					zeros++
				}
				u = un
			}
		}
		step(0, x0)
		step(x0, 1)
		return u, zeros
	}
	for it := 0; it < 60; it++ {
		mid := (lo + hi) / 2
		u, z := end(mid)
		// below λ_k: at most k−1 interior zeros and u(1) of sign (−1)^(k−1)
		if z < k-1 || (z == k-1 && u*float64(1-2*((k-1)%2)) > 0) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

// TestKinkedPotential certifies −u″ + Vu on (0, 1), Dirichlet, for
// potentials with a kink at an exact float (a mesh node) and at 1/3 (not
// a float: the cell holding it gets a range model), and requires every
// enclosure of λ1..λ3 to contain the shooting reference up to its own
// accuracy (1e-9 relative) and to be narrow.
func TestKinkedPotential(t *testing.T) {
	abs := func(x float64) float64 {
		if x < 0 {
			return -x
		}
		return x
	}
	for _, tc := range []struct {
		expr string
		v    func(float64) float64
		x0   float64
	}{
		{"20*abs(x - 1/2)", func(x float64) float64 { return 20 * abs(x-0.5) }, 0.5},
		{"-30*abs(x - 1/3)", func(x float64) float64 { return -30 * abs(x-1.0/3) }, 1.0 / 3},
		{"max(0, 40*(x - 3/4))", func(x float64) float64 { return max(0, 40*(x-0.75)) }, 0.75},
	} {
		src := fmt.Sprintf(`{"domain":{"interval":["0","1"]},"potential":%q,"boundary":["dirichlet","dirichlet"],"eigenvalues":3}`, tc.expr)
		_, c := certifyLimited(t, src, 1e-8)
		for k := 1; k <= 3; k++ {
			got := eigenEnclosure(t, c, k)
			ref := shootDirichlet(tc.v, tc.x0, k, -100, 400)
			tol := 1e-9 * ref
			if got.Lo > ref+tol || got.Hi < ref-tol {
				t.Errorf("%s: lambda%d enclosure %v misses the shooting reference %.15g", tc.expr, k, got, ref)
			}
			if got.Wid() > 1e-5*ref {
				t.Errorf("%s: lambda%d enclosure %v too wide", tc.expr, k, got)
			}
		}
	}
}
