package certify

import (
	"math"

	"gapcert/interval"
)

// end is a boundary condition of the oracle: Dirichlet, or Robin with
// parameter alpha ≥ 0 (alpha = 0 is Neumann).
type end struct {
	dirichlet bool
	alpha     interval.I
}

// constantPotentialEigenvalue returns a rigorous enclosure of the n-th
// eigenvalue (n ≥ 1) of −u″ + c u = λu on an interval of length L with the
// given end conditions, by interval bisection on the characteristic
// equation of λ = k² + c (common practice, derived by separation: the
// solutions of −u″ = k²u are combinations of cos kx and sin kx):
//
//	Robin–Robin: (k² − α₀α₁) sin kL − k(α₀ + α₁) cos kL = 0,
//	Dirichlet–Robin (either order): k cos kL + α sin kL = 0,
//	Dirichlet–Dirichlet: sin kL = 0.
//
// The n-th root lies in [(n−1)π/L, nπ/L] (Robin–Robin) or
// [(n−½)π/L, nπ/L] (Dirichlet–Robin), because the eigenvalues increase with
// α between the Neumann and the Dirichlet ones; the characteristic function
// has opposite signs at the two ends of that bracket, and the bisection
// keeps a bracket whose end signs are decided in interval arithmetic.
// Closed forms are used where the root is an end of the bracket.
func constantPotentialEigenvalue(n int, length, c interval.I, left, right end) interval.I {
	pi := interval.Pi()
	nn := float64(n)
	piOverL := pi.Div(length)
	square := func(k interval.I) interval.I { return k.Sqr().Add(c) }
	if left.dirichlet && right.dirichlet {
		return square(piOverL.MulF(nn))
	}
	if !left.dirichlet && !right.dirichlet && left.alpha == (interval.I{}) && right.alpha == (interval.I{}) {
		return square(piOverL.MulF(nn - 1))
	}
	var f func(k interval.I) interval.I
	var lo, hi interval.I
	switch {
	case left.dirichlet || right.dirichlet:
		alpha := left.alpha
		if left.dirichlet {
			alpha = right.alpha
		}
		lo, hi = piOverL.MulF(nn-0.5), piOverL.MulF(nn)
		if alpha == (interval.I{}) {
			return square(lo)
		}
		f = func(k interval.I) interval.I {
			kl := k.Mul(length)
			return k.Mul(interval.Cos(kl)).Add(alpha.Mul(interval.Sin(kl)))
		}
	default:
		a0, a1 := left.alpha, right.alpha
		lo, hi = piOverL.MulF(nn-1), piOverL.MulF(nn)
		f = func(k interval.I) interval.I {
			kl := k.Mul(length)
			return k.Sqr().Sub(a0.Mul(a1)).Mul(interval.Sin(kl)).Sub(k.Mul(a0.Add(a1)).Mul(interval.Cos(kl)))
		}
	}
	// Work with float bracket ends strictly inside [lo, hi] where the signs
	// are decided; the bracket ends themselves are enclosures.
	kLo, kHi := lo.Hi, hi.Lo
	sLo := f(interval.Point(kLo)).Sign()
	sHi := f(interval.Point(kHi)).Sign()
	if sLo == 0 || sHi == 0 || sLo == sHi {
		// Signs not decided at the float ends: fall back to the full bracket.
		return square(lo.Hull(hi))
	}
	for i := 0; i < 200; i++ {
		mid := 0.5*kLo + 0.5*kHi
		if mid <= kLo || mid >= kHi {
			break
		}
		s := f(interval.Point(mid)).Sign()
		if s == 0 {
			break
		}
		if s == sLo {
			kLo = mid
		} else {
			kHi = mid
		}
	}
	return square(interval.I{Lo: kLo, Hi: kHi})
}

// relErr is |x − y|/|y| (test diagnostics only).
func relErr(x, y float64) float64 { return math.Abs(x-y) / math.Abs(y) }
