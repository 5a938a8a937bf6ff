package certify

import (
	"math/big"
	"sync"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// oraclePrec is the working precision of the reference eigenvalues (about
// 60 decimal digits).
const oraclePrec = 200

// end is a boundary condition of the oracle: Dirichlet, or Robin with
// parameter alpha ≥ 0 (alpha = 0 is Neumann), given as exact decimal text.
type end struct {
	dirichlet bool
	alpha     string
}

func bigDec(s string) *big.Float {
	r, err := decimalio.ParseRat(s)
	if err != nil {
		panic(err)
	}
	return new(big.Float).SetPrec(oraclePrec).SetRat(r)
}

// bigPi is π to 200 bits by Machin's formula π = 16 atan(1/5) − 4 atan(1/239)
// (common practice), computed once.
var bigPi = sync.OnceValue(func() *big.Float {
	atanInv := func(n int64) *big.Float {
		x := new(big.Float).SetPrec(oraclePrec).SetInt64(n)
		x2 := new(big.Float).SetPrec(oraclePrec).Mul(x, x)
		term := new(big.Float).SetPrec(oraclePrec).Quo(big.NewFloat(1).SetPrec(oraclePrec), x)
		sum := new(big.Float).SetPrec(oraclePrec)
		for k := int64(0); k < 400; k++ {
			t := new(big.Float).SetPrec(oraclePrec).Quo(term, new(big.Float).SetInt64(2*k+1))
			if k%2 == 0 {
				sum.Add(sum, t)
			} else {
				sum.Sub(sum, t)
			}
			term.Quo(term, x2)
		}
		return sum
	}
	p := new(big.Float).SetPrec(oraclePrec).Mul(big.NewFloat(16), atanInv(5))
	return p.Sub(p, new(big.Float).SetPrec(oraclePrec).Mul(big.NewFloat(4), atanInv(239)))
})

// bigSinCos returns sin x and cos x by their Taylor series after reduction
// to |x| ≤ π, summed until the terms fall below 2⁻²³⁰.
func bigSinCos(x *big.Float) (s, c *big.Float) {
	twoPi := new(big.Float).SetPrec(oraclePrec).Mul(big.NewFloat(2), bigPi())
	q := new(big.Float).SetPrec(oraclePrec).Quo(x, twoPi)
	q.Add(q, big.NewFloat(0.5))
	n, _ := q.Int(nil) // nearest multiple of 2π (x > 0 here)
	x = new(big.Float).SetPrec(oraclePrec).Sub(x, new(big.Float).SetPrec(oraclePrec).Mul(new(big.Float).SetInt(n), twoPi))
	s, c = new(big.Float).SetPrec(oraclePrec), new(big.Float).SetPrec(oraclePrec)
	term := new(big.Float).SetPrec(oraclePrec).SetInt64(1)
	eps := new(big.Float).SetMantExp(big.NewFloat(1), -230)
	for k := int64(0); k < 400 && new(big.Float).Abs(term).Cmp(eps) > 0; k++ {
		switch k % 4 {
		case 0:
			c.Add(c, term)
		case 1:
			s.Add(s, term)
		case 2:
			c.Sub(c, term)
		case 3:
			s.Sub(s, term)
		}
		term.Mul(term, x)
		term.Quo(term, new(big.Float).SetInt64(k+1))
	}
	return s, c
}

// constantPotentialEigenvalue returns the n-th eigenvalue (n ≥ 1) of
// −u″ + c u = λu on an interval of length L with the given end conditions,
// to about 55 digits, as λ = k² + c with k the n-th positive root of the
// characteristic equation (common practice, by separation: the solutions
// of −u″ = k²u are combinations of cos kx and sin kx, and the boundary
// conditions give)
//
//	Robin–Robin: (k² − α₀α₁) sin kL − k(α₀ + α₁) cos kL = 0,
//	Dirichlet–Robin (either order): k cos kL + α sin kL = 0,
//	Dirichlet–Dirichlet: sin kL = 0.
//
// The n-th root lies in ((n−1)π/L, nπ/L] (Robin–Robin) or
// [(n−½)π/L, nπ/L] (Dirichlet–Robin), because the eigenvalues increase with
// α from the Neumann to the Dirichlet ones; bisection in big.Float on that
// bracket finds it (closed forms where it is an end of the bracket).
func constantPotentialEigenvalue(n int, length, c string, left, right end) *big.Float {
	L, cc := bigDec(length), bigDec(c)
	piOverL := new(big.Float).SetPrec(oraclePrec).Quo(bigPi(), L)
	at := func(t float64) *big.Float {
		return new(big.Float).SetPrec(oraclePrec).Mul(piOverL, big.NewFloat(t))
	}
	square := func(k *big.Float) *big.Float {
		r := new(big.Float).SetPrec(oraclePrec).Mul(k, k)
		return r.Add(r, cc)
	}
	nn := float64(n)
	isNeumann := func(e end) bool { return !e.dirichlet && (e.alpha == "" || bigDec(e.alpha).Sign() == 0) }
	var f func(k *big.Float) *big.Float
	var lo, hi *big.Float
	switch {
	case left.dirichlet && right.dirichlet:
		return square(at(nn))
	case isNeumann(left) && isNeumann(right):
		return square(at(nn - 1))
	case left.dirichlet || right.dirichlet:
		other := left
		if left.dirichlet {
			other = right
		}
		if isNeumann(other) {
			return square(at(nn - 0.5))
		}
		alpha := bigDec(other.alpha)
		lo, hi = at(nn-0.5), at(nn)
		f = func(k *big.Float) *big.Float {
			s, co := bigSinCos(new(big.Float).SetPrec(oraclePrec).Mul(k, L))
			r := new(big.Float).SetPrec(oraclePrec).Mul(k, co)
			return r.Add(r, new(big.Float).SetPrec(oraclePrec).Mul(alpha, s))
		}
	default:
		a0, a1 := bigDec("0"), bigDec("0")
		if left.alpha != "" {
			a0 = bigDec(left.alpha)
		}
		if right.alpha != "" {
			a1 = bigDec(right.alpha)
		}
		lo, hi = at(nn-1), at(nn)
		if n == 1 {
			lo = at(1e-30) // k = 0 is a spurious root
		}
		f = func(k *big.Float) *big.Float {
			s, co := bigSinCos(new(big.Float).SetPrec(oraclePrec).Mul(k, L))
			k2 := new(big.Float).SetPrec(oraclePrec).Mul(k, k)
			k2.Sub(k2, new(big.Float).SetPrec(oraclePrec).Mul(a0, a1))
			r := k2.Mul(k2, s)
			sum := new(big.Float).SetPrec(oraclePrec).Add(a0, a1)
			sum.Mul(sum, k)
			return r.Sub(r, sum.Mul(sum, co))
		}
	}
	sLo := f(lo).Sign()
	half := big.NewFloat(0.5)
	for i := 0; i < 190; i++ {
		mid := new(big.Float).SetPrec(oraclePrec).Add(lo, hi)
		mid.Mul(mid, half)
		if f(mid).Sign() == sLo {
			lo = mid
		} else {
			hi = mid
		}
	}
	return square(lo)
}

// bigInside reports whether x ∈ [lo, hi] for a big.Float x.
func bigInside(x *big.Float, got interval.I) bool {
	lo, hi := new(big.Float).SetFloat64(got.Lo), new(big.Float).SetFloat64(got.Hi)
	return lo.Cmp(x) <= 0 && x.Cmp(hi) <= 0
}

// bigPoint is x rounded to float64 (diagnostics and width references).
func bigPoint(x *big.Float) float64 {
	f, _ := x.Float64()
	return f
}
