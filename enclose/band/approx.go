package band

import (
	"errors"
	"gapcert/enclose/internal/converge"
	"gapcert/enclose/internal/geneig"
	"math"
	"math/rand/v2"
	"sort"
)

// This file only chooses: approximate eigenpairs in floating point. Nothing
// here is a bound.

// ErrNotConverged is returned by LowestEigs when the eigenpairs do not reach
// the accuracy it promises.
var ErrNotConverged = errors.New("band: eigenpairs did not converge")

// ErrNotPositiveDefinite is returned by LowestEigs when M (or a projected
// mass matrix) is not positive definite in floating point.
var ErrNotPositiveDefinite = errors.New("band: mass matrix is not positive definite")

const (
	// denseLimit is the size up to which LowestEigs solves the dense
	// problem directly.
	denseLimit = 200
	// residualTol is the relative residual ‖Kx − λMx‖₂/((‖K‖∞ + |λ|‖M‖∞)‖x‖₂)
	// at which an eigenpair counts as converged; acceptTol is the level
	// accepted when the iteration stagnates.
	residualTol = 1e-14
	acceptTol   = 1e-11
	maxIter     = 500
)

// LowestEigs returns approximations of the lowest count eigenvalues of
// Kx = λMx (K symmetric, possibly indefinite; M symmetric positive
// definite), ascending, and approximately M-orthonormal eigenvectors
// vecs[i] of length N. The result is deterministic.
//
// Small problems (N ≤ 200) are solved densely (gonum: Cholesky of M, then
// the symmetric eigensolver). Larger ones use shift-invert subspace
// iteration with p = count + 8 vectors, full M-orthonormalisation by
// modified Gram–Schmidt (twice) and Rayleigh–Ritz on the p-dimensional
// subspace at every step, which handles multiple and clustered eigenvalues.
// The shift σ is kept below λ_1 (the float factorization of K − σM has no
// negative pivot) and moved towards the lowest Ritz value as it
// converges. Iteration stops when every wanted pair has relative residual
// ‖Kx − λMx‖₂ ≤ 1e-14·(‖K‖∞ + |λ|‖M‖∞)‖x‖₂; if it stagnates above that,
// pairs down to 1e-11 are accepted, otherwise ErrNotConverged is returned.
//
// LowestEigs panics if the sizes differ or count is not in 1 … N.
func LowestEigs(k, m *Sym, count int) (vals []float64, vecs [][]float64, err error) {
	if k.N != m.N {
		panic("band: dimension mismatch")
	}
	n := k.N
	if count < 1 || count > n {
		panic("band: eigenpair count out of range")
	}
	p := min(n, count+8)
	if n <= denseLimit || 3*p > n {
		return denseLowest(k, m, count)
	}
	return subspaceLowest(k, m, count, p)
}

// denseLowest solves the full generalized problem with gonum.
func denseLowest(k, m *Sym, count int) ([]float64, [][]float64, error) {
	n := k.N
	kd, md := make([]float64, n*n), make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			kd[i*n+j], md[i*n+j] = k.At(i, j), m.At(i, j)
		}
	}
	vals, z, err := denseGeneralized(kd, md, n)
	if err != nil {
		return nil, nil, err
	}
	vecs := make([][]float64, count)
	for c := range vecs {
		vecs[c] = make([]float64, n)
		for i := 0; i < n; i++ {
			vecs[c][i] = z[i*n+c]
		}
	}
	return vals[:count], vecs, nil
}

// denseGeneralized returns the eigenvalues (ascending) and B-orthonormal
// eigenvectors (columns, row-major) of the dense symmetric pencil (a, b),
// with this package's errors.
func denseGeneralized(a, b []float64, n int) ([]float64, []float64, error) {
	vals, x, err := geneig.Solve(a, b, n)
	switch err {
	case nil:
		return vals, x, nil
	case geneig.ErrNotPositiveDefinite:
		return nil, nil, ErrNotPositiveDefinite
	}
	return nil, nil, ErrNotConverged
}

// subspace holds the work vectors of the shift-invert subspace iteration.
type subspace struct {
	k, m         *Sym
	n, p         int
	x, y, kx, mx [][]float64
	f            LDL
	shifted      *Sym
	rng          *rand.Rand
}

func newVectors(p, n int) [][]float64 {
	v := make([][]float64, p)
	for i := range v {
		v[i] = make([]float64, n)
	}
	return v
}

// factorShift factors K − σM and reports whether it succeeded with no
// negative pivot (so σ lies below the spectrum, up to rounding).
func (s *subspace) factorShift(sigma float64) bool {
	w := s.shifted.W
	for i := 0; i < s.n; i++ {
		for j := max(0, i-w); j <= i; j++ {
			s.shifted.Data[i*(w+1)+i-j] = s.k.At(i, j) - sigma*s.m.At(i, j)
		}
	}
	return s.f.Factorize(s.shifted) && s.f.NegCount() == 0
}

// chooseInitialShift returns a σ below the spectrum: 0 when K itself
// factors with no negative pivot (K positive definite, the common case of
// shifted problems), else a Gershgorin-type estimate, lowered until
// K − σM factors with no negative pivot. (A Gershgorin shift of a
// high-order finite-element K lies far below λ_1 and makes the iteration
// crawl, so it is only the fallback.)
func (s *subspace) chooseInitialShift() (float64, bool) {
	if s.factorShift(0) {
		return 0, true
	}
	n := s.n
	gk, mdiag := math.Inf(1), math.Inf(1)
	normK := 0.0
	for i := 0; i < n; i++ {
		off := 0.0
		for j := max(0, i-s.k.W); j <= min(n-1, i+s.k.W); j++ {
			if j != i {
				off += math.Abs(s.k.At(i, j))
			}
		}
		gk = math.Min(gk, s.k.At(i, i)-off)
		normK = math.Max(normK, math.Abs(s.k.At(i, i))+off)
		mdiag = math.Min(mdiag, s.m.At(i, i))
	}
	if !(mdiag > 0) {
		return 0, false
	}
	sigma := math.Min(gk, 0) / mdiag
	step := math.Max(math.Abs(sigma), normK/mdiag) * 1e-6
	if step == 0 {
		step = 1
	}
	sigma -= step
	for it := 0; it < 100; it++ {
		if s.factorShift(sigma) {
			return sigma, true
		}
		sigma -= step
		step *= 2
	}
	return 0, false
}

// mOrthonormalize M-orthonormalizes the vectors v in place (modified
// Gram–Schmidt, two passes) and sets mv[c] = M v[c]; a vector that
// collapses is replaced by a fresh pseudo-random one.
func (s *subspace) mOrthonormalize(v, mv [][]float64) {
	for c := range v {
		for attempt := 0; attempt < 4; attempt++ {
			s.m.MulVecTo(mv[c], v[c])
			norm0 := math.Sqrt(math.Abs(dot(mv[c], v[c])))
			for pass := 0; pass < 2; pass++ {
				for d := 0; d < c; d++ {
					axpy(v[c], -dot(mv[d], v[c]), v[d])
				}
			}
			s.m.MulVecTo(mv[c], v[c])
			norm := math.Sqrt(math.Abs(dot(mv[c], v[c])))
			if norm > 1e-8*norm0 && norm > 0 && !math.IsInf(norm, 0) {
				scale(v[c], 1/norm)
				scale(mv[c], 1/norm)
				break
			}
			for i := range v[c] {
				v[c][i] = s.rng.Float64() - 0.5
			}
		}
	}
}

func subspaceLowest(k, m *Sym, count, p int) ([]float64, [][]float64, error) {
	n := k.N
	s := &subspace{k: k, m: m, n: n, p: p,
		x: newVectors(p, n), y: newVectors(p, n), kx: newVectors(p, n), mx: newVectors(p, n),
		shifted: NewSym(n, max(k.W, m.W)), rng: rand.New(rand.NewPCG(1, 2))}
	sigma, ok := s.chooseInitialShift()
	if !ok {
		return nil, nil, ErrNotPositiveDefinite
	}
	normK, normM := infNorm(k), infNorm(m)
	for c := range s.x {
		for i := range s.x[c] {
			s.x[c][i] = s.rng.Float64() - 0.5
		}
	}
	tmp := make([]float64, n)
	s.mOrthonormalize(s.x, s.mx)
	theta := make([]float64, p)
	mon := converge.Monitor{Tol: residualTol, Accept: acceptTol}
iterate:
	for it := 0; it < maxIter; it++ {
		// y = (K − σM)⁻¹ M x.
		for c := 0; c < p; c++ {
			m.MulVecTo(tmp, s.x[c])
			s.f.SolveTo(s.y[c], tmp)
		}
		s.mOrthonormalize(s.y, s.mx)
		if err := s.rayleighRitz(theta); err != nil {
			return nil, nil, err
		}
		worst := converge.WorstResidual(s.x[:count], s.kx[:count], s.mx[:count], theta, normK, normM)
		switch mon.Observe(worst, it == maxIter-1) {
		case converge.Converged:
			break iterate
		case converge.Failed:
			return nil, nil, ErrNotConverged
		}
		if try, ok := converge.NextShift(theta[:p], sigma); ok {
			if s.factorShift(try) {
				sigma = try
				mon.ShiftMoved()
			} else if !s.factorShift(sigma) {
				return nil, nil, ErrNotConverged
			}
		}
	}
	vals := append([]float64(nil), theta[:count]...)
	vecs := make([][]float64, count)
	for c := range vecs {
		vecs[c] = append([]float64(nil), s.x[c]...)
	}
	return vals, vecs, nil
}

// rayleighRitz replaces s.x by the Ritz vectors of (K, M) on span(s.y),
// ascending Ritz values in theta, and fills s.kx = K x, s.mx = M x. On
// entry s.mx holds M y.
func (s *subspace) rayleighRitz(theta []float64) error {
	p, n := s.p, s.n
	for c := 0; c < p; c++ {
		s.k.MulVecTo(s.kx[c], s.y[c])
	}
	a, b := make([]float64, p*p), make([]float64, p*p)
	for i := 0; i < p; i++ {
		for j := 0; j <= i; j++ {
			ka := (dot(s.y[i], s.kx[j]) + dot(s.y[j], s.kx[i])) / 2
			mb := (dot(s.y[i], s.mx[j]) + dot(s.y[j], s.mx[i])) / 2
			a[i*p+j], a[j*p+i] = ka, ka
			b[i*p+j], b[j*p+i] = mb, mb
		}
	}
	vals, z, err := denseGeneralized(a, b, p)
	if err != nil {
		return err
	}
	order := make([]int, p)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(i, j int) bool { return vals[order[i]] < vals[order[j]] })
	for c, o := range order {
		theta[c] = vals[o]
		x := s.x[c]
		for i := 0; i < n; i++ {
			x[i] = 0
		}
		for d := 0; d < p; d++ {
			axpy(x, z[d*p+o], s.y[d])
		}
	}
	for c := 0; c < p; c++ {
		s.k.MulVecTo(s.kx[c], s.x[c])
		s.m.MulVecTo(s.mx[c], s.x[c])
	}
	return nil
}

func infNorm(s *Sym) float64 {
	r := 0.0
	for i := 0; i < s.N; i++ {
		t := 0.0
		for j := max(0, i-s.W); j <= min(s.N-1, i+s.W); j++ {
			t += math.Abs(s.At(i, j))
		}
		r = math.Max(r, t)
	}
	return r
}

func dot(x, y []float64) float64 {
	s := 0.0
	for i, v := range x {
		s += v * y[i]
	}
	return s
}

func axpy(y []float64, a float64, x []float64) {
	for i, v := range x {
		y[i] += a * v
	}
}

func scale(x []float64, a float64) {
	for i := range x {
		x[i] *= a
	}
}
