package subspace

import (
	"errors"
	"math"
	"math/rand/v2"
	"sort"

	"gapcert/enclose/internal/converge"
	"gapcert/enclose/internal/geneig"
)

// Matrix is a symmetric matrix as the iteration uses it.
type Matrix interface {
	// At returns entry (i, j) (used only by the dense path).
	At(i, j int) float64
	// MulVecTo sets dst = S x (dst does not alias x).
	MulVecTo(dst, x []float64)
}

// Pencil is what the iteration needs of a symmetric pencil (K, M) in some
// storage. The methods are floating-point choices, not bounds.
type Pencil interface {
	// Dim returns the order n of K and M.
	Dim() int
	// Matrices returns K and M.
	Matrices() (k, m Matrix)
	// FactorShift factors K − σM in floating point, replacing any earlier
	// factorization, and reports whether it succeeded with no negative
	// pivot (so σ lies below the spectrum, up to rounding).
	FactorShift(sigma float64) bool
	// SolveTo solves (K − σM) dst[c] = b[c] for every c with the last
	// successful factorization; dst may be b.
	SolveTo(dst, b [][]float64)
	// InfNorms returns ‖K‖∞ and ‖M‖∞, the scales of the relative residual.
	InfNorms() (normK, normM float64)
	// GershgorinRows returns, for each row i, K_ii, Σ_{j≠i} |K_ij| and
	// M_ii, the data of the fallback initial shift.
	GershgorinRows() (kDiag, kOff, mDiag []float64)
}

// Kernels are the vector operations of the iteration: dot returns x·y,
// axpy sets y += a·x and scale sets x = a·x.
type Kernels struct {
	Dot   func(x, y []float64) float64
	Axpy  func(y []float64, a float64, x []float64)
	Scale func(x []float64, a float64)
}

// Options fix the floating-point route of Lowest.
type Options struct {
	// Name prefixes the misuse panics (the storage's package name).
	Name string
	// Tol is the relative residual at which a pair counts as converged;
	// Accept is the level accepted when the iteration stagnates.
	Tol, Accept float64
	// KrylovSteps is the number of blocks of the basis [Op X, …, Op^s X],
	// Op = (K − σM)⁻¹M, on which Rayleigh–Ritz runs at each step (1 is
	// plain subspace iteration).
	KrylovSteps int
	// FreshMassProducts computes the input of each solve as M·v from the
	// stored vector v; otherwise the product kept (and scaled) by the
	// M-orthonormalisation is used, saving one product per vector.
	FreshMassProducts bool
	// SymmetrizeRitz forms the projected matrices as
	// (y_i·Ky_j + y_j·Ky_i)/2 instead of y_i·Ky_j.
	SymmetrizeRitz bool
	// Vec are the vector kernels.
	Vec Kernels
	// NotConverged and NotPositiveDefinite are the errors returned when
	// the pairs do not reach Accept, and when M (or a projected mass
	// matrix) is not positive definite in floating point.
	NotConverged, NotPositiveDefinite error
}

const (
	// denseLimit is the size up to which Lowest solves the dense problem
	// directly.
	denseLimit = 200
	maxIter    = 500
	// extraVectors is the number of vectors the block carries beyond the
	// wanted count.
	extraVectors = 8
)

// Lowest returns approximations of the lowest count eigenvalues of
// Kx = λMx, ascending, and approximately M-orthonormal eigenvectors. The
// result is deterministic.
//
// Small problems (n ≤ 200, or a block of p = count + 8 vectors larger than
// n/3) are solved densely (gonum: Cholesky of M, then the symmetric
// eigensolver). Larger ones use shift-invert block subspace iteration with
// p vectors, the basis [Op X, …, Op^s X] (s = opt.KrylovSteps), full
// M-orthonormalisation by modified Gram–Schmidt (twice) and Rayleigh–Ritz
// on the basis at every step, keeping the p lowest Ritz vectors. A block
// larger than the multiplicity handles multiple and clustered eigenvalues.
// The shift σ starts at 0 when K factors with no negative pivot (K positive
// definite, the common case of shifted problems), else at a Gershgorin-type
// estimate below the spectrum; it is kept below λ_1 (the float
// factorization of K − σM has no negative pivot) and moved towards the
// lowest Ritz value as it converges. Iteration stops when every wanted pair
// has relative residual ‖Kx − λMx‖₂ ≤ opt.Tol·(‖K‖∞ + |λ|‖M‖∞)‖x‖₂; if it
// stagnates above that, pairs down to opt.Accept are accepted, otherwise
// opt.NotConverged is returned.
//
// Lowest panics if count is not in 1 … n.
func Lowest(a Pencil, count int, opt Options) (vals []float64, vecs [][]float64, err error) {
	n := a.Dim()
	if count < 1 || count > n {
		panic(opt.Name + ": eigenpair count out of range")
	}
	p := min(n, count+extraVectors)
	if n <= denseLimit || 3*p > n {
		return denseLowest(a, count, &opt)
	}
	return newIteration(a, p, &opt).run(count)
}

// denseLowest solves the full generalized problem with gonum.
func denseLowest(a Pencil, count int, opt *Options) ([]float64, [][]float64, error) {
	n := a.Dim()
	k, m := a.Matrices()
	kd, md := make([]float64, n*n), make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			kd[i*n+j], md[i*n+j] = k.At(i, j), m.At(i, j)
		}
	}
	vals, z, err := opt.dense(kd, md, n)
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

// NewErrors returns the errors of a storage's LowestEigs (prefixed by its
// package name): the pairs did not reach the promised accuracy, and M (or
// a projected mass matrix) is not positive definite in floating point.
func NewErrors(name string) (notConverged, notPositiveDefinite error) {
	return errors.New(name + ": eigenpairs did not converge"),
		errors.New(name + ": mass matrix is not positive definite")
}

// dense returns the eigenvalues (ascending) and B-orthonormal eigenvectors
// (columns, row-major) of the dense symmetric pencil (a, b), with the
// caller's errors.
func (opt *Options) dense(a, b []float64, n int) ([]float64, []float64, error) {
	vals, x, err := geneig.Solve(a, b, n)
	switch err {
	case nil:
		return vals, x, nil
	case geneig.ErrNotPositiveDefinite:
		return nil, nil, opt.NotPositiveDefinite
	}
	return nil, nil, opt.NotConverged
}

// iteration holds the state and work vectors of the block iteration. The
// Ritz block x and its products K x, M x share storage with the first p
// vectors of the products of the basis, which are dead by the time the
// Ritz vectors are formed.
type iteration struct {
	a      Pencil
	k, m   Matrix
	opt    *Options
	n, p   int         // order, block size
	q      int         // size of the basis
	x      [][]float64 // Ritz vectors
	kx, mx [][]float64 // K x, M x (= ky[:p], my[:p])
	y      [][]float64 // basis
	ky, my [][]float64 // K y, M y
	ak, am []float64   // projected q×q matrices
	order  []int
	theta  []float64
	rng    *rand.Rand
}

func newVectors(p, n int) [][]float64 {
	v := make([][]float64, p)
	for i := range v {
		v[i] = make([]float64, n)
	}
	return v
}

func newIteration(a Pencil, p int, opt *Options) *iteration {
	n := a.Dim()
	q := min(n, max(1, opt.KrylovSteps)*p)
	it := &iteration{a: a, opt: opt, n: n, p: p, q: q,
		x: newVectors(p, n), y: newVectors(q, n), ky: newVectors(q, n), my: newVectors(q, n),
		ak: make([]float64, q*q), am: make([]float64, q*q), order: make([]int, q),
		theta: make([]float64, p), rng: rand.New(rand.NewPCG(1, 2))}
	it.kx, it.mx = it.ky[:p], it.my[:p]
	it.k, it.m = a.Matrices()
	return it
}

func (it *iteration) run(count int) ([]float64, [][]float64, error) {
	a, p, q, opt := it.a, it.p, it.q, it.opt
	sigma, ok := it.initialShift()
	if !ok {
		return nil, nil, opt.NotPositiveDefinite
	}
	normK, normM := a.InfNorms()
	for c := range it.x {
		for i := range it.x[c] {
			it.x[c][i] = it.rng.Float64() - 0.5
		}
	}
	it.mOrthonormalize(it.x, it.mx, 0)
	mon := converge.Monitor{Tol: opt.Tol, Accept: opt.Accept}
iterate:
	for step := 0; step < maxIter; step++ {
		// Basis y = [Op x, Op² x, …], Op = (K − σM)⁻¹ M, each block
		// computed from the M-orthonormalized previous one.
		for from := 0; from < q; from += p {
			to := min(q, from+p)
			src, srcM := it.x[:to-from], it.mx[:to-from]
			if from > 0 {
				src, srcM = it.y[from-p:to-p], it.my[from-p:to-p]
			}
			if opt.FreshMassProducts {
				for c := range src {
					it.m.MulVecTo(it.y[from+c], src[c])
				}
				a.SolveTo(it.y[from:to], it.y[from:to])
			} else {
				a.SolveTo(it.y[from:to], srcM)
			}
			it.mOrthonormalize(it.y[:to], it.my[:to], from)
		}
		if err := it.rayleighRitz(); err != nil {
			return nil, nil, err
		}
		worst := converge.WorstResidual(it.x[:count], it.kx[:count], it.mx[:count], it.theta, normK, normM)
		switch mon.Observe(worst, step == maxIter-1) {
		case converge.Converged:
			break iterate
		case converge.Failed:
			return nil, nil, opt.NotConverged
		}
		if try, ok := converge.NextShift(it.theta[:p], sigma); ok {
			if a.FactorShift(try) {
				sigma = try
				mon.ShiftMoved()
			} else if !a.FactorShift(sigma) {
				return nil, nil, opt.NotConverged
			}
		}
	}
	vals := append([]float64(nil), it.theta[:count]...)
	vecs := make([][]float64, count)
	for c := range vecs {
		vecs[c] = append([]float64(nil), it.x[c]...)
	}
	return vals, vecs, nil
}

// initialShift returns a σ below the spectrum and leaves K − σM factored:
// 0 when K itself factors with no negative pivot, else a Gershgorin-type
// estimate, lowered until K − σM factors with no negative pivot. (A
// Gershgorin shift of a high-order finite-element K lies far below λ_1 and
// makes the iteration crawl, so it is only the fallback.)
func (it *iteration) initialShift() (float64, bool) {
	if it.a.FactorShift(0) {
		return 0, true
	}
	kDiag, kOff, mDiag := it.a.GershgorinRows()
	gk, mdiag := math.Inf(1), math.Inf(1)
	normK := 0.0
	for i := range kDiag {
		gk = math.Min(gk, kDiag[i]-kOff[i])
		normK = math.Max(normK, math.Abs(kDiag[i])+kOff[i])
		mdiag = math.Min(mdiag, mDiag[i])
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
	for try := 0; try < 100; try++ {
		if it.a.FactorShift(sigma) {
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
func (it *iteration) mOrthonormalize(v, mv [][]float64, from int) {
	dot, axpy, scale := it.opt.Vec.Dot, it.opt.Vec.Axpy, it.opt.Vec.Scale
	for c := from; c < len(v); c++ {
		for attempt := 0; attempt < 4; attempt++ {
			it.m.MulVecTo(mv[c], v[c])
			norm0 := math.Sqrt(math.Abs(dot(mv[c], v[c])))
			for pass := 0; pass < 2; pass++ {
				for d := 0; d < c; d++ {
					axpy(v[c], -dot(mv[d], v[c]), v[d])
				}
			}
			it.m.MulVecTo(mv[c], v[c])
			norm := math.Sqrt(math.Abs(dot(mv[c], v[c])))
			if norm > 1e-8*norm0 && norm > 0 && !math.IsInf(norm, 0) {
				scale(v[c], 1/norm)
				scale(mv[c], 1/norm)
				break
			}
			for i := range v[c] {
				v[c][i] = it.rng.Float64() - 0.5
			}
		}
	}
}

// rayleighRitz replaces x by the p lowest Ritz vectors of (K, M) on
// span(y), ascending Ritz values in theta, and fills kx = K x, mx = M x.
// On entry my holds M y.
func (it *iteration) rayleighRitz() error {
	p, q := it.p, it.q
	dot, axpy := it.opt.Vec.Dot, it.opt.Vec.Axpy
	for c := 0; c < q; c++ {
		it.k.MulVecTo(it.ky[c], it.y[c])
	}
	ak, am := it.ak, it.am
	for i := 0; i < q; i++ {
		for j := 0; j <= i; j++ {
			var kij, mij float64
			if it.opt.SymmetrizeRitz {
				kij = (dot(it.y[i], it.ky[j]) + dot(it.y[j], it.ky[i])) / 2
				mij = (dot(it.y[i], it.my[j]) + dot(it.y[j], it.my[i])) / 2
			} else {
				kij, mij = dot(it.y[i], it.ky[j]), dot(it.y[i], it.my[j])
			}
			ak[i*q+j], ak[j*q+i] = kij, kij
			am[i*q+j], am[j*q+i] = mij, mij
		}
	}
	vals, z, err := it.opt.dense(ak, am, q)
	if err != nil {
		return err
	}
	order := it.order
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(i, j int) bool { return vals[order[i]] < vals[order[j]] })
	for c, o := range order[:p] {
		it.theta[c] = vals[o]
		x := it.x[c]
		clear(x)
		for d := 0; d < q; d++ {
			axpy(x, z[d*q+o], it.y[d])
		}
		it.k.MulVecTo(it.kx[c], x)
		it.m.MulVecTo(it.mx[c], x)
	}
	return nil
}
