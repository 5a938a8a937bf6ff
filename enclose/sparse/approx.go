package sparse

import (
	"errors"
	"gapcert/enclose/internal/converge"
	"gapcert/enclose/internal/geneig"
	"math"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/floats"
)

// This file only chooses: approximate eigenpairs in floating point. Nothing
// here is a bound.

// ErrNotConverged is returned by LowestEigs when the eigenpairs do not reach
// the accuracy it promises.
var ErrNotConverged = errors.New("sparse: eigenpairs did not converge")

// ErrNotPositiveDefinite is returned by LowestEigs when M (or a projected
// mass matrix) is not positive definite in floating point.
var ErrNotPositiveDefinite = errors.New("sparse: mass matrix is not positive definite")

const (
	// denseLimit is the size up to which LowestEigs solves the dense
	// problem directly.
	denseLimit = 200
	// residualTol is the relative residual ‖Kx − λMx‖₂/((‖K‖∞ + |λ|‖M‖∞)‖x‖₂)
	// at which an eigenpair counts as converged; acceptTol is the level
	// accepted when the iteration stagnates.
	residualTol = 1e-13
	acceptTol   = 1e-11
	maxIter     = 500
	// krylovSteps is the number of blocks of the Krylov basis built from
	// the Ritz block at each iteration.
	krylovSteps = 3
)

// LowestEigs returns approximations of the lowest count eigenvalues of
// Kx = λMx (K symmetric, possibly indefinite; M symmetric positive
// definite), ascending, and approximately M-orthonormal eigenvectors
// vecs[i] of length N. The result is deterministic.
//
// Small problems (N ≤ 200) are solved densely (gonum: Cholesky of M, then
// the symmetric eigensolver). Larger ones use shift-invert block subspace
// iteration with a block of p = count + 8 vectors, accelerated by a block
// Krylov basis [Op X, Op² X, Op³ X], Op = (K − σM)⁻¹M, at every step:
// full M-orthonormalisation by modified Gram–Schmidt (twice) and
// Rayleigh–Ritz on the 3p-dimensional basis, keeping the p lowest Ritz
// vectors. A block larger than the multiplicity handles multiple and
// clustered eigenvalues. K − σM is ordered (Order) and analyzed once, on the
// union of the patterns of K and M, and refactored for each shift. The
// shift σ starts at 0 when K factors with no negative pivot (K positive
// definite, the common case of shifted problems), else at a
// Gershgorin-type estimate below the spectrum; it is kept below λ_1 (the
// float factorization of K − σM has no negative pivot) and moved towards
// the lowest Ritz value as it converges. Iteration stops when every wanted
// pair has relative residual ‖Kx − λMx‖₂ ≤ 1e-13·(‖K‖∞ + |λ|‖M‖∞)‖x‖₂;
// if it stagnates above that, pairs down to 1e-11 are accepted, otherwise
// ErrNotConverged is returned.
//
// LowestEigs panics if the sizes differ or count is not in 1 … N.
//
// References:
//
//	B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM, 1998 (subspace
//	iteration, Krylov subspaces, Rayleigh–Ritz, the generalized problem).
//	R. G. Grimes, J. G. Lewis, H. D. Simon, A shifted block Lanczos
//	algorithm for solving sparse symmetric generalized eigenproblems,
//	SIAM J. Matrix Anal. Appl. 15 (1994) 228–272.
func LowestEigs(k, m *Sym, count int) (vals []float64, vecs [][]float64, err error) {
	if k.N() != m.N() {
		panic("sparse: dimension mismatch")
	}
	n := k.N()
	if count < 1 || count > n {
		panic("sparse: eigenpair count out of range")
	}
	p := min(n, count+8)
	if n <= denseLimit || 3*p > n {
		return denseLowest(k, m, count)
	}
	return subspaceLowest(k, m, count, p)
}

// denseLowest solves the full generalized problem with gonum.
func denseLowest(k, m *Sym, count int) ([]float64, [][]float64, error) {
	n := k.N()
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

// subspace holds the work vectors of the shift-invert block subspace
// iteration.
type subspace struct {
	k, m         *Sym
	n, p, q      int         // sizes of the Ritz block and of the Krylov basis
	x, kx, mx    [][]float64 // Ritz vectors, K x, M x
	y, ky, my    [][]float64 // Krylov basis, K y, M y
	block        []float64   // workspace of the block solves
	f            LDL
	sym          *Symbolic
	shifted      *Sym
	fromK, fromM []int
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
	clear(s.shifted.Val)
	for q, v := range s.k.Val {
		s.shifted.Val[at(s.fromK, q)] += v
	}
	for q, v := range s.m.Val {
		s.shifted.Val[at(s.fromM, q)] -= sigma * v
	}
	return s.f.Factorize(s.sym, s.shifted) && s.f.NegCount() == 0
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
	off := absOffRowSums(s.k)
	for i := 0; i < n; i++ {
		kii := s.k.Val[s.k.Pat.colPtr[i]]
		gk = math.Min(gk, kii-off[i])
		normK = math.Max(normK, math.Abs(kii)+off[i])
		mdiag = math.Min(mdiag, s.m.Val[s.m.Pat.colPtr[i]])
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

// mOrthonormalize M-orthonormalizes the vectors v[from:] in place against
// v[:from] (already M-orthonormal) and each other (modified Gram–Schmidt,
// two passes) and sets mv[c] = M v[c]; a vector that collapses is replaced
// by a fresh pseudo-random one.
func (s *subspace) mOrthonormalize(v, mv [][]float64, from int) {
	for c := from; c < len(v); c++ {
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
	n := k.N()
	q := min(n, krylovSteps*p)
	u, fromK, fromM := union(k.Pat, m.Pat)
	s := &subspace{k: k, m: m, n: n, p: p, q: q,
		x: newVectors(p, n), kx: newVectors(p, n), mx: newVectors(p, n),
		y: newVectors(q, n), ky: newVectors(q, n), my: newVectors(q, n), block: make([]float64, 4*n),
		sym: analyzePattern(u, orderPattern(u)), shifted: &Sym{Pat: u, Val: make([]float64, u.NNZ())},
		fromK: fromK, fromM: fromM, rng: rand.New(rand.NewPCG(1, 2))}
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
	s.mOrthonormalize(s.x, s.mx, 0)
	theta := make([]float64, p)
	mon := converge.Monitor{Tol: residualTol, Accept: acceptTol}
iterate:
	for it := 0; it < maxIter; it++ {
		// Block Krylov basis y = [Op x, Op² x, …], Op = (K − σM)⁻¹ M,
		// each block computed from the M-orthonormalized previous one.
		for from := 0; from < q; from += p {
			to := min(q, from+p)
			src := s.mx[:to-from]
			if from > 0 {
				src = s.my[from-p : to-p]
			}
			s.f.solveBlockTo(s.y[from:to], src, s.block)
			s.mOrthonormalize(s.y[:to], s.my[:to], from)
		}
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

// rayleighRitz replaces s.x by the p lowest Ritz vectors of (K, M) on
// span(s.y), ascending Ritz values in theta, and fills s.kx = K x,
// s.mx = M x. On entry s.my holds M y.
func (s *subspace) rayleighRitz(theta []float64) error {
	p, q := s.p, s.q
	for c := 0; c < q; c++ {
		s.k.MulVecTo(s.ky[c], s.y[c])
	}
	a, b := make([]float64, q*q), make([]float64, q*q)
	for i := 0; i < q; i++ {
		for j := 0; j <= i; j++ {
			ka, mb := dot(s.y[i], s.ky[j]), dot(s.y[i], s.my[j])
			a[i*q+j], a[j*q+i] = ka, ka
			b[i*q+j], b[j*q+i] = mb, mb
		}
	}
	vals, z, err := denseGeneralized(a, b, q)
	if err != nil {
		return err
	}
	order := make([]int, q)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(i, j int) bool { return vals[order[i]] < vals[order[j]] })
	for c, o := range order[:p] {
		theta[c] = vals[o]
		x := s.x[c]
		clear(x)
		for d := 0; d < q; d++ {
			axpy(x, z[d*q+o], s.y[d])
		}
		s.k.MulVecTo(s.kx[c], x)
		s.m.MulVecTo(s.mx[c], x)
	}
	return nil
}

func infNorm(s *Sym) float64 {
	off := absOffRowSums(s)
	r := 0.0
	for i, o := range off {
		r = math.Max(r, o+math.Abs(s.Val[s.Pat.colPtr[i]]))
	}
	return r
}

// absOffRowSums returns Σ_{j≠i} |S_ij| for each row i.
func absOffRowSums(s *Sym) []float64 {
	off := make([]float64, s.N())
	for j := 0; j < s.N(); j++ {
		for q := s.Pat.colPtr[j] + 1; q < s.Pat.colPtr[j+1]; q++ {
			a := math.Abs(s.Val[q])
			off[s.Pat.rowIdx[q]] += a
			off[j] += a
		}
	}
	return off
}

// dot, axpy and scale use gonum's assembly kernels where available.
func dot(x, y []float64) float64 { return floats.Dot(x, y) }

func axpy(y []float64, a float64, x []float64) { floats.AddScaled(y, a, x) }

func scale(x []float64, a float64) { floats.Scale(a, x) }
