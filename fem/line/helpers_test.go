package line

import (
	"math"
	"math/big"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/interval"
)

// Exact rational polynomials for the independent math/big evaluations.
type ratPoly []*big.Rat // coefficient of ξ^i at [i]

func rp(vals ...int64) ratPoly {
	out := make(ratPoly, len(vals))
	for i, v := range vals {
		out[i] = big.NewRat(v, 1)
	}
	return out
}

func (a ratPoly) add(b ratPoly) ratPoly {
	n := max(len(a), len(b))
	out := make(ratPoly, n)
	for i := range out {
		out[i] = new(big.Rat)
		if i < len(a) {
			out[i].Add(out[i], a[i])
		}
		if i < len(b) {
			out[i].Add(out[i], b[i])
		}
	}
	return out
}

func (a ratPoly) scale(s *big.Rat) ratPoly {
	out := make(ratPoly, len(a))
	for i := range a {
		out[i] = new(big.Rat).Mul(a[i], s)
	}
	return out
}

func (a ratPoly) mul(b ratPoly) ratPoly {
	out := make(ratPoly, len(a)+len(b)-1)
	for i := range out {
		out[i] = new(big.Rat)
	}
	for i := range a {
		for j := range b {
			out[i+j].Add(out[i+j], new(big.Rat).Mul(a[i], b[j]))
		}
	}
	return out
}

func (a ratPoly) deriv() ratPoly {
	if len(a) == 1 {
		return rp(0)
	}
	out := make(ratPoly, len(a)-1)
	for i := range out {
		out[i] = new(big.Rat).Mul(a[i+1], big.NewRat(int64(i+1), 1))
	}
	return out
}

// integral returns ∫_0^1 a(ξ) dξ = Σ a_i/(i+1).
func (a ratPoly) integral() *big.Rat {
	s := new(big.Rat)
	for i, c := range a {
		s.Add(s, new(big.Rat).Quo(c, big.NewRat(int64(i+1), 1)))
	}
	return s
}

func (a ratPoly) eval(x *big.Rat) *big.Rat {
	s := new(big.Rat)
	for i := len(a) - 1; i >= 0; i-- {
		s.Mul(s, x)
		s.Add(s, a[i])
	}
	return s
}

// compose returns a(x0 + ξh) as a polynomial in ξ.
func (a ratPoly) compose(x0, h *big.Rat) ratPoly {
	lin := ratPoly{new(big.Rat).Set(x0), new(big.Rat).Set(h)}
	out := rp(0)
	for i := len(a) - 1; i >= 0; i-- {
		out = out.mul(lin).add(ratPoly{a[i]})
	}
	return out
}

// shiftedLegendreRat is P_n(2t − 1) = Σ_k (−1)^(n+k) C(n,k) C(n+k,k) t^k
// (Rodrigues-formula expansion, Abramowitz–Stegun ch. 22, recalled from
// memory; with x = 2t − 1), an
// expression independent of the Bernstein form used by the package.
func shiftedLegendreRat(n int) ratPoly {
	out := make(ratPoly, n+1)
	for k := 0; k <= n; k++ {
		c := new(big.Int).Mul(binom(n, k), binom(n+k, k))
		if (n+k)%2 == 1 {
			c.Neg(c)
		}
		out[k] = new(big.Rat).SetInt(c)
	}
	return out
}

// hierarchicalMonomial returns local basis function l of degree p in
// monomial form: 1 − ξ, ∫_0^ξ P̃_l, ξ.
func hierarchicalMonomial(p, l int) ratPoly {
	switch l {
	case 0:
		return rp(1, -1)
	case p:
		return rp(0, 1)
	}
	leg := shiftedLegendreRat(l)
	out := make(ratPoly, l+2)
	out[0] = new(big.Rat)
	for k, c := range leg {
		out[k+1] = new(big.Rat).Quo(c, big.NewRat(int64(k+1), 1))
	}
	return out
}

func ratOf(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }

func ratFrac(a, b int64) *big.Rat { return big.NewRat(a, b) }

// containsRat reports whether r ∈ x.
func containsRat(x interval.I, r *big.Rat) bool {
	if math.IsInf(x.Lo, 0) || math.IsInf(x.Hi, 0) {
		return (math.IsInf(x.Lo, -1) || ratOf(x.Lo).Cmp(r) <= 0) && (math.IsInf(x.Hi, 1) || r.Cmp(ratOf(x.Hi)) <= 0)
	}
	return ratOf(x.Lo).Cmp(r) <= 0 && r.Cmp(ratOf(x.Hi)) <= 0
}

// relWidth returns wid(x)/max(|x|, floor).
func relWidth(x interval.I, floor float64) float64 {
	return x.Wid() / math.Max(x.Mag(), floor)
}

func checkEncloses(t *testing.T, what string, x interval.I, r *big.Rat, maxRel, floor float64) {
	t.Helper()
	if !containsRat(x, r) {
		f, _ := r.Float64()
		t.Errorf("%s: %v does not contain the exact value %.17g", what, x, f)
	}
	if w := relWidth(x, floor); w > maxRel {
		t.Errorf("%s: %v relative width %g > %g", what, x, w, maxRel)
	}
}

// Conditions of the tests (package fem/boundary).
var (
	dirichlet = boundary.Condition{Kind: boundary.Dirichlet}
	neumann   = boundary.Condition{Kind: boundary.Neumann}
)

// robin returns the Robin condition with the coefficient enclosure a.
func robin(a interval.I) boundary.Condition {
	return boundary.Condition{Kind: boundary.Robin, Alpha: a}
}

// lgMatrices returns the three matrices of the Lehmann–Goerisch theorem:
// the Ritz matrices of the trial functions and the flux matrix.
func lgMatrices(s *Lagrange, trial [][]float64, f *Flux, flux [][]float64, v, w *Potential, gamma interval.I) (a0, a1, a2 *enclose.Sym, err error) {
	if a2, err = f.LGMatrix(s, trial, flux, v, w, gamma); err != nil {
		return nil, nil, nil, err
	}
	a0, a1, err = s.RitzMatrices(trial, v, gamma)
	return a0, a1, a2, err
}

// minimizeOne returns the least-squares flux of one trial function, nil if
// the system could not be factored.
func minimizeOne(f *Flux, s *Lagrange, u []float64, w *Potential) []float64 {
	fl, err := f.MinimizeApprox(s, [][]float64{u}, w)
	if err != nil {
		return nil
	}
	return fl[0]
}

// addExactEndTerms adds c·x_i(e)x_j(e) to dst[i][j] at each end e with a
// coefficient (alphaL, alphaR; nil: none), c = α, or 1/α when inverse, from
// the exact end values of the vectors xs of sp (math/big).
func addExactEndTerms(dst [][]*big.Rat, sp *space, xs [][]float64, alphaL, alphaR *big.Rat, inverse bool) {
	for _, e := range []struct {
		side  Side
		alpha *big.Rat
	}{{Left, alphaL}, {Right, alphaR}} {
		if e.alpha == nil {
			continue
		}
		for i := range xs {
			for j := range xs {
				t := new(big.Rat).Mul(ratOf(sp.endValue(xs[i], e.side)), ratOf(sp.endValue(xs[j], e.side)))
				if inverse {
					t.Quo(t, e.alpha)
				} else {
					t.Mul(t, e.alpha)
				}
				dst[i][j].Add(dst[i][j], t)
			}
		}
	}
}
