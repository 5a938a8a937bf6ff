package tet

import (
	"math"
	"math/big"
	"sync"
)

// This file only chooses: interpolants and point values in floating point
// (starting vectors, tests, pictures of slices), never bounds.

var (
	collocMu    sync.Mutex
	collocCache = map[int][]float64{}
)

// collocationInverse returns the nearest floats of the exact inverse of
// C[α][β] = B^p_β(α/p), the values of the Bernstein basis at the domain
// points of a tetrahedron, so that coefficients = C⁻¹ · values. The
// inverse is computed in math/big by Gauss–Jordan elimination (C is
// invertible: Lagrange interpolation at the equispaced points of a
// simplex is unisolvent).
func collocationInverse(p int) []float64 {
	collocMu.Lock()
	defer collocMu.Unlock()
	if c, ok := collocCache[p]; ok {
		return c
	}
	ix := multiIndex(4, p)
	n := len(ix.alpha)
	a := make([][]*big.Rat, n)
	for r, al := range ix.alpha {
		a[r] = make([]*big.Rat, 2*n)
		for c, be := range ix.alpha {
			v := new(big.Rat).SetInt(multinom(be))
			for i := 0; i < 4; i++ {
				x := big.NewRat(int64(al[i]), int64(p))
				for k := 0; k < be[i]; k++ {
					v.Mul(v, x)
				}
			}
			a[r][c] = v
			a[r][n+c] = new(big.Rat)
		}
		a[r][n+r].SetInt64(1)
	}
	for c := 0; c < n; c++ {
		piv := c
		for a[piv][c].Sign() == 0 {
			piv++
		}
		a[c], a[piv] = a[piv], a[c]
		inv := new(big.Rat).Inv(a[c][c])
		for k := range a[c] {
			a[c][k].Mul(a[c][k], inv)
		}
		for r := 0; r < n; r++ {
			if r == c || a[r][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(a[r][c])
			for k := range a[r] {
				a[r][k].Sub(a[r][k], new(big.Rat).Mul(f, a[c][k]))
			}
		}
	}
	out := make([]float64, n*n)
	for r := 0; r < n; r++ {
		for c := 0; c < n; c++ {
			out[r*n+c], _ = a[r][n+c].Float64()
		}
	}
	collocCache[p] = out
	return out
}

// Interpolate returns the coefficients of the function of the space that
// takes the values f(x_α) at the domain points x_α = Σ α_i v_i / p of
// every tetrahedron (vertex midpoints), the removed (Dirichlet)
// coefficients left at 0. Shared coefficients depend only on the values on
// their face, so every tetrahedron computes the same value up to
// rounding; the last one is kept.
func (s *Lagrange) Interpolate(f func(x, y, z float64) float64) []float64 {
	ix := multiIndex(4, s.p)
	n := len(ix.alpha)
	inv := collocationInverse(s.p)
	vals := make([]float64, n)
	out := make([]float64, s.n)
	for t := range s.mesh.tets {
		v := s.mesh.Vertices(t)
		for r, a := range ix.alpha {
			var x [3]float64
			for i := 0; i < 4; i++ {
				w := float64(a[i]) / float64(s.p)
				for c := 0; c < 3; c++ {
					x[c] += w * v[i][c].Mid()
				}
			}
			vals[r] = f(x[0], x[1], x[2])
		}
		for r, g := range s.dofs[t] {
			if g < 0 {
				continue
			}
			acc := 0.0
			for c := 0; c < n; c++ {
				acc += inv[r*n+c] * vals[c]
			}
			out[g] = acc
		}
	}
	return out
}

// EvalLocal returns an approximation of Σ_α c_α B^p_α(λ) on tetrahedron t
// of the function with coefficients vec at the barycentric coordinates
// lam.
func (s *Lagrange) EvalLocal(vec []float64, t int, lam [4]float64) float64 {
	ix := multiIndex(4, s.p)
	val := 0.0
	for r, a := range ix.alpha {
		g := s.dofs[t][r]
		if g < 0 || vec[g] == 0 {
			continue
		}
		b, _ := new(big.Float).SetInt(multinom(a)).Float64()
		for i := 0; i < 4; i++ {
			b *= math.Pow(lam[i], float64(a[i]))
		}
		val += vec[g] * b
	}
	return val
}

// Eval returns an approximation of the value at (x, y, z) of the function
// with coefficients vec, from the tetrahedron whose float barycentric
// coordinates of the point are least negative. It returns NaN if the mesh
// is empty.
func (s *Lagrange) Eval(vec []float64, x, y, z float64) float64 {
	best, bestT := math.Inf(-1), -1
	var bestL [4]float64
	for t := range s.mesh.tets {
		l := baryApprox(s.mesh.Vertices(t), [3]float64{x, y, z})
		if m := math.Min(math.Min(l[0], l[1]), math.Min(l[2], l[3])); m > best {
			best, bestT, bestL = m, t, l
		}
	}
	if bestT < 0 {
		return math.NaN()
	}
	return s.EvalLocal(vec, bestT, bestL)
}
