package sparse

import (
	"math"
	"runtime"
	"slices"
	"sync"
)

// Symbolic is the symbolic analysis of PᵀSP for a pattern and an
// elimination order: the elimination tree, the column counts of L and the
// permuted upper triangle. It may be reused for every matrix on the same
// pattern (different shifts K − σM, say) and is safe for concurrent use.
type Symbolic struct {
	pat    *Pattern
	perm   []int // perm[k]: original index eliminated k-th
	parent []int // elimination tree; −1 at roots
	colPtr []int // column pointers of L (strictly lower part)
	// The upper triangle of PᵀSP by columns: column k holds the rows
	// uRow[uPtr[k]:uPtr[k+1]] ≤ k, with values S.Val[uSrc[·]].
	uPtr []int
	uRow []int32
	uSrc []int
	// The supernodal structure, computed when first needed.
	superOnce sync.Once
	super     *supernodes
}

// Analyze returns the symbolic analysis of PᵀSP, (PᵀSP)_ij = S_{perm[i],
// perm[j]}, for the pattern of s (the values of s are not used). The
// elimination tree and the column counts are computed together by the
// row-subtree traversal of Liu (1990), as in Davis (2005), in time
// O(nnz(L)). Analyze panics if perm is not a permutation of 0 … N−1.
//
// References:
//
//	J. W. H. Liu, The role of elimination trees in sparse factorization,
//	SIAM J. Matrix Anal. Appl. 11 (1990) 134–172.
//	T. A. Davis, Algorithm 849: A concise sparse Cholesky factorization
//	package, ACM Trans. Math. Software 31 (2005) 587–591.
//	T. A. Davis, Direct Methods for Sparse Linear Systems, SIAM, 2006.
func Analyze(s *Sym, perm []int) *Symbolic {
	return analyzePattern(s.Pat, perm)
}

func analyzePattern(p *Pattern, perm []int) *Symbolic {
	n := p.n
	if len(perm) != n {
		panic("sparse: permutation has the wrong length")
	}
	inv := make([]int, n)
	for i := range inv {
		inv[i] = -1
	}
	for k, v := range perm {
		if v < 0 || v >= n || inv[v] >= 0 {
			panic("sparse: not a permutation")
		}
		inv[v] = k
	}
	sym := &Symbolic{pat: p, perm: append([]int(nil), perm...), parent: make([]int, n),
		colPtr: make([]int, n+1), uPtr: make([]int, n+1)}
	// Permuted upper triangle by columns (counting sort; rows ascend
	// within a column after the second pass below).
	for j := 0; j < n; j++ {
		for q := p.colPtr[j]; q < p.colPtr[j+1]; q++ {
			a, b := inv[p.rowIdx[q]], inv[j]
			sym.uPtr[max(a, b)+1]++
		}
	}
	for k := 0; k < n; k++ {
		sym.uPtr[k+1] += sym.uPtr[k]
	}
	nnz := p.NNZ()
	rows, srcs := make([]int32, nnz), make([]int, nnz)
	next := append([]int(nil), sym.uPtr[:n]...)
	for j := 0; j < n; j++ {
		for q := p.colPtr[j]; q < p.colPtr[j+1]; q++ {
			a, b := inv[p.rowIdx[q]], inv[j]
			c := max(a, b)
			rows[next[c]] = int32(min(a, b))
			srcs[next[c]] = q
			next[c]++
		}
	}
	sym.uRow, sym.uSrc = rows, srcs
	// Elimination tree and column counts.
	flag := make([]int, n)
	count := make([]int, n)
	for k := 0; k < n; k++ {
		sym.parent[k] = -1
		flag[k] = k
		for q := sym.uPtr[k]; q < sym.uPtr[k+1]; q++ {
			for i := int(rows[q]); flag[i] != k; i = sym.parent[i] {
				if sym.parent[i] == -1 {
					sym.parent[i] = k
				}
				count[i]++
				flag[i] = k
			}
		}
	}
	for k := 0; k < n; k++ {
		sym.colPtr[k+1] = sym.colPtr[k] + count[k]
	}
	return sym
}

// N returns the order of the analyzed matrix.
func (sym *Symbolic) N() int { return sym.pat.n }

// NNZ returns the number of entries of L, the unit diagonal included.
func (sym *Symbolic) NNZ() int { return sym.colPtr[sym.pat.n] + sym.pat.n }

// ColPtr returns the column pointers of L (length N+1; the strictly lower
// part, so column k has ColPtr()[k+1] − ColPtr()[k] entries below the
// unit diagonal). The slice must not be modified.
func (sym *Symbolic) ColPtr() []int { return sym.colPtr }

// Perm returns the elimination order (must not be modified).
func (sym *Symbolic) Perm() []int { return sym.perm }

// Parent returns the elimination tree: Parent()[k] is the parent of
// column k, −1 at a root (must not be modified).
func (sym *Symbolic) Parent() []int { return sym.parent }

// LDL is a factorization PᵀSP = L D Lᵀ without pivoting, L unit lower
// triangular and D diagonal, computed in floating point (a choice, not a
// bound). Column k of L holds the rows Row[ColPtr[k]:ColPtr[k+1]] > k
// (ascending) with values Val[·]; the unit diagonal is not stored. An LDL
// is not safe for concurrent use (SolveTo uses a workspace).
type LDL struct {
	Sym *Symbolic
	D   []float64
	Row []int32
	Val []float64
	// Workspaces of SolveTo and Factorize.
	work  []float64
	iwork []int
	// algorithm selects the numeric factorization; the zero value chooses
	// by size (tests force one or the other).
	algorithm factorAlgorithm
	// rowsOf is the Symbolic whose row indices Row holds (the
	// multifrontal algorithm copies them once).
	rowsOf *Symbolic
	// fronts are the workspaces of the multifrontal algorithm's workers.
	fronts []*frontWork
}

// factorAlgorithm names a numeric factorization of LDL.Factorize.
type factorAlgorithm int

const (
	automatic    factorAlgorithm = iota // multifrontal from supernodeWork multiply-adds
	upLooking                           // row by row (Davis 2005)
	multifrontal                        // supernodes with dense fronts (factorizeSupernodal)
)

// factorWork returns the number of multiply-adds of the numeric
// factorization, Σ_k ℓ_k(ℓ_k+1)/2 over the columns of L (ℓ_k entries
// below the diagonal).
func (sym *Symbolic) factorWork() int {
	w := 0
	for k := 0; k < sym.pat.n; k++ {
		l := sym.colPtr[k+1] - sym.colPtr[k]
		w += l * (l + 1) / 2
	}
	return w
}

// Factor returns the LDLᵀ factorization of PᵀSP for the order perm, or
// ok = false if a pivot is zero or not finite. It is Analyze followed by
// Symbolic.Factor.
func Factor(s *Sym, perm []int) (*LDL, bool) {
	return Analyze(s, perm).Factor(s)
}

// Factor returns the LDLᵀ factorization of PᵀSP, s on the analyzed pattern,
// by the up-looking algorithm (row k of L by a sparse triangular solve along
// the elimination tree; Davis 2005) below supernodeWork multiply-adds and
// by the multifrontal algorithm above (factorizeSupernodal; the package
// documentation, Factorization), or ok = false if a pivot is zero or
// not finite. The result does not depend on GOMAXPROCS. No pivoting is done: the matrix may be indefinite (a shifted
// pencil) as long as no leading minor of PᵀSP vanishes. Factor panics if s
// is not on the analyzed pattern.
func (sym *Symbolic) Factor(s *Sym) (*LDL, bool) {
	f := &LDL{}
	if !f.Factorize(sym, s) {
		return nil, false
	}
	return f, true
}

// Factorize overwrites f with the factorization of s (see Symbolic.Factor),
// reusing f's storage, and reports whether every pivot is nonzero and
// finite.
func (f *LDL) Factorize(sym *Symbolic, s *Sym) bool {
	if s.Pat != sym.pat && !samePattern(s.Pat, sym.pat) {
		panic("sparse: matrix is not on the analyzed pattern")
	}
	n := sym.pat.n
	nnz := sym.colPtr[n]
	f.Sym = sym
	f.D = resize(f.D, n)
	f.Val = resize(f.Val, nnz)
	if cap(f.Row) < nnz {
		f.Row = make([]int32, nnz)
		f.rowsOf = nil
	}
	f.Row = f.Row[:nnz]
	f.work = resize(f.work, n)
	if f.algorithm == multifrontal || f.algorithm == automatic && sym.factorWork() >= supernodeWork {
		return f.factorizeSupernodal(sym, s)
	}
	f.rowsOf = nil // the loop below rewrites Row
	y := f.work
	clear(y)
	if cap(f.iwork) < 3*n {
		f.iwork = make([]int, 3*n)
	}
	f.iwork = f.iwork[:3*n]
	clear(f.iwork)
	flag, fill, stack := f.iwork[:n], f.iwork[n:2*n], f.iwork[2*n:] // fill: entries of column i written so far
	parent, lp, li, lx, d := sym.parent, sym.colPtr, f.Row, f.Val, f.D
	ok := true
	for k := 0; k < n; k++ {
		// Scatter column k of the upper triangle and find the pattern of
		// row k of L: the union of the tree paths from each row index.
		top := n
		flag[k] = k
		for q := sym.uPtr[k]; q < sym.uPtr[k+1]; q++ {
			i := int(sym.uRow[q])
			y[i] += s.Val[sym.uSrc[q]]
			length := 0
			for ; flag[i] != k; i = parent[i] {
				stack[length] = i
				length++
				flag[i] = k
			}
			for length > 0 {
				top--
				length--
				stack[top] = stack[length]
			}
		}
		dk := y[k]
		y[k] = 0
		for ; top < n; top++ {
			i := stack[top]
			yi := y[i]
			y[i] = 0
			end := lp[i] + fill[i]
			for q := lp[i]; q < end; q++ {
				y[li[q]] -= lx[q] * yi
			}
			l := yi / d[i]
			dk -= l * yi
			li[end] = int32(k)
			lx[end] = l
			fill[i]++
		}
		if dk == 0 || math.IsNaN(dk) || math.IsInf(dk, 0) {
			ok = false
			dk = math.NaN()
		}
		d[k] = dk
		if !ok {
			return false
		}
	}
	return true
}

func samePattern(a, b *Pattern) bool {
	return a.n == b.n && slices.Equal(a.colPtr, b.colPtr) && slices.Equal(a.rowIdx, b.rowIdx)
}

func resize(v []float64, n int) []float64 {
	if cap(v) < n {
		return make([]float64, n)
	}
	return v[:n]
}

// NNZ returns the number of entries of L, the unit diagonal included.
func (f *LDL) NNZ() int { return f.Sym.NNZ() }

// NegCount returns the number of negative pivots, which by Sylvester's law
// of inertia is the number of negative eigenvalues of L D Lᵀ (of the
// factored matrix only up to the rounding errors of the factorization; see
// CountBelow for a verified count).
func (f *LDL) NegCount() int {
	c := 0
	for _, v := range f.D {
		if v < 0 {
			c++
		}
	}
	return c
}

// SolveTo solves S x = b, that is P L D Lᵀ Pᵀ x = b, writing x to dst (dst
// may be b).
func (f *LDL) SolveTo(dst, b []float64) {
	n := len(f.D)
	if len(dst) != n || len(b) != n {
		panic("sparse: dimension mismatch")
	}
	perm, lp, li, lx, y := f.Sym.perm, f.Sym.colPtr, f.Row, f.Val, f.work
	for k, v := range perm {
		y[k] = b[v]
	}
	for k := 0; k < n; k++ {
		yk := y[k]
		for q := lp[k]; q < lp[k+1]; q++ {
			y[li[q]] -= lx[q] * yk
		}
	}
	for k := 0; k < n; k++ {
		y[k] /= f.D[k]
	}
	for k := n - 1; k >= 0; k-- {
		yk := y[k]
		for q := lp[k]; q < lp[k+1]; q++ {
			yk -= lx[q] * y[li[q]]
		}
		y[k] = yk
	}
	for k, v := range perm {
		dst[v] = y[k]
	}
}

// solveWidth is the largest number of right-hand sides that solveBlockTo
// carries through one sweep over L.
const solveWidth = 16

// parallelSolveWork is the number of multiply-adds (entries of L times
// right-hand sides) above which solveBlockTo splits the right-hand sides
// over the available CPUs.
const parallelSolveWork = 1 << 20

// solveBlockTo solves S x_c = b_c for every c, writing x_c to dst[c] (dst
// may be b), sweeping L once per group of up to solveWidth right-hand
// sides, the groups on up to GOMAXPROCS goroutines. Each x_c is computed
// by the operations of SolveTo, so it is the same bits. *work is a
// workspace, grown to N·len(b) if shorter.
func (f *LDL) solveBlockTo(dst, b [][]float64, work *[]float64) {
	n, r := len(f.D), len(b)
	if len(dst) != r {
		panic("sparse: dimension mismatch")
	}
	for c := range b {
		if len(dst[c]) != n || len(b[c]) != n {
			panic("sparse: dimension mismatch")
		}
	}
	if r == 0 {
		return
	}
	if cap(*work) < n*r {
		*work = make([]float64, n*r)
	}
	y := (*work)[:n*r]
	groups := (r + solveWidth - 1) / solveWidth
	workers := runtime.GOMAXPROCS(0)
	if workers > 1 && len(f.Val)*r >= parallelSolveWork {
		groups = max(groups, min(workers, r))
	}
	if groups == 1 {
		f.solveGroup(dst, b, y)
		return
	}
	var wg sync.WaitGroup
	sem := make(chan struct{}, workers)
	for g := 0; g < groups; g++ {
		c0, c1 := g*r/groups, (g+1)*r/groups
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer func() { <-sem; wg.Done() }()
			f.solveGroup(dst[c0:c1], b[c0:c1], y[n*c0:n*c1])
		}()
	}
	wg.Wait()
}

// solveGroup solves S x_c = b_c, c < w = len(b), in one sweep over L with
// y (length ≥ N·w) holding the w vectors entry by entry.
func (f *LDL) solveGroup(dst, b [][]float64, y []float64) {
	n, w := len(f.D), len(b)
	perm, lp, li, lx := f.Sym.perm, f.Sym.colPtr, f.Row, f.Val
	for c, bc := range b {
		for k, v := range perm {
			y[k*w+c] = bc[v]
		}
	}
	for k := 0; k < n; k++ {
		yk := y[k*w : k*w+w]
		for q := lp[k]; q < lp[k+1]; q++ {
			l, i := lx[q], int(li[q])*w
			yi := y[i : i+len(yk)]
			for c, v := range yk {
				yi[c] -= l * v
			}
		}
	}
	for k := 0; k < n; k++ {
		d := f.D[k]
		yk := y[k*w : k*w+w]
		for c := range yk {
			yk[c] /= d
		}
	}
	for k := n - 1; k >= 0; k-- {
		yk := y[k*w : k*w+w]
		for q := lp[k]; q < lp[k+1]; q++ {
			l, i := lx[q], int(li[q])*w
			yi := y[i : i+len(yk)]
			for c, v := range yi {
				yk[c] -= l * v
			}
		}
	}
	for c, dc := range dst {
		for k, v := range perm {
			dc[v] = y[k*w+c]
		}
	}
}
