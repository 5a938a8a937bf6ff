package sparse

import (
	"math"
	"runtime"
	"sync"
)

// The supernodal (multifrontal) numeric factorization. It computes the
// same L (pattern of Symbolic, unit diagonal implicit) and D as the
// up-looking algorithm, by a different order of the same kind of
// operations; the rounding-error analysis that covers both is at
// Counter.roundoffBound.

// supernodeWork is the number of multiply-adds of the factorization
// (Σ_k ℓ_k(ℓ_k+1)/2) from which Factorize uses the multifrontal algorithm.
// Near it both take the same CPU time (measured: 5-point grid with 6,400
// unknowns and 7-point grid with 1,728, nested dissection, 2.2·10⁶ and
// 3.2·10⁶ multiply-adds: within 10% either way); below it the up-looking
// loop is faster (2 to 4 times at 2.5·10⁵), above it the multifrontal one
// (3.1 and 5.5 times less CPU time on the cube's stage-A pencils with 1.3·10⁸
// and 8.7·10⁹ multiply-adds; BenchmarkCubeFactor).
const supernodeWork = 1 << 21

// panelWidth is the number of columns of a front factored together before
// their update of the rest of the front.
const panelWidth = 32

// parallelFrontWork is the number of multiply-adds of one panel's update
// of a front above which the update is split over the available CPUs.
const parallelFrontWork = 1 << 18

// supernodes is the supernodal structure of a Symbolic: the columns of L
// grouped into supernodes (consecutive columns j, j+1 with parent(j) =
// j+1 and a pattern of column j equal to {j+1} ∪ pattern of column j+1),
// their tree, the row indices of L and the lower triangle of PᵀSP by
// columns.
type supernodes struct {
	start    []int // supernode s holds the columns start[s] … start[s+1]−1
	maxFront int   // the largest order of a front
	parent   []int // supernode tree; −1 at roots
	childPtr []int // the children of s are child[childPtr[s]:childPtr[s+1]], ascending
	child    []int32
	rows     []int32 // row indices of L, laid out as LDL.Row
	// The lower triangle of PᵀSP by columns: column j holds the rows
	// lRow[lPtr[j]:lPtr[j+1]] ≥ j with values S.Val[lSrc[·]].
	lPtr []int
	lRow []int32
	lSrc []int
}

// supernodal returns the supernodal structure of sym, computed at the
// first call.
func (sym *Symbolic) supernodal() *supernodes {
	sym.superOnce.Do(func() { sym.super = newSupernodes(sym) })
	return sym.super
}

func newSupernodes(sym *Symbolic) *supernodes {
	n := sym.pat.n
	cp, parent := sym.colPtr, sym.parent
	sn := &supernodes{rows: make([]int32, cp[n]), lPtr: make([]int, n+1)}
	// Row indices of L by the row-subtree traversal (as Factorize finds
	// the pattern of row k): rows ascend within each column.
	flag, fill := make([]int, n), make([]int, n)
	for k := 0; k < n; k++ {
		flag[k] = k
		for q := sym.uPtr[k]; q < sym.uPtr[k+1]; q++ {
			for i := int(sym.uRow[q]); flag[i] != k; i = parent[i] {
				sn.rows[cp[i]+fill[i]] = int32(k)
				fill[i]++
				flag[i] = k
			}
		}
	}
	// Supernodes.
	snOf := make([]int, n)
	for j := 0; j < n; j++ {
		if j == 0 || parent[j-1] != j || cp[j]-cp[j-1] != cp[j+1]-cp[j]+1 {
			sn.start = append(sn.start, j)
		}
		snOf[j] = len(sn.start) - 1
	}
	ns := len(sn.start)
	sn.start = append(sn.start, n)
	for _, f := range sn.start[:ns] {
		sn.maxFront = max(sn.maxFront, 1+cp[f+1]-cp[f])
	}
	sn.parent = make([]int, ns)
	sn.childPtr = make([]int, ns+1)
	for s := 0; s < ns; s++ {
		sn.parent[s] = -1
		if p := parent[sn.start[s+1]-1]; p >= 0 {
			sn.parent[s] = snOf[p]
			sn.childPtr[snOf[p]+1]++
		}
	}
	for s := 0; s < ns; s++ {
		sn.childPtr[s+1] += sn.childPtr[s]
	}
	sn.child = make([]int32, sn.childPtr[ns])
	next := append([]int(nil), sn.childPtr[:ns]...)
	for s := 0; s < ns; s++ {
		if p := sn.parent[s]; p >= 0 {
			sn.child[next[p]] = int32(s)
			next[p]++
		}
	}
	// Lower triangle of PᵀSP by columns, the transpose of the upper one.
	for k := 0; k < n; k++ {
		for q := sym.uPtr[k]; q < sym.uPtr[k+1]; q++ {
			sn.lPtr[sym.uRow[q]+1]++
		}
	}
	for j := 0; j < n; j++ {
		sn.lPtr[j+1] += sn.lPtr[j]
	}
	sn.lRow, sn.lSrc = make([]int32, sn.lPtr[n]), make([]int, sn.lPtr[n])
	at := append([]int(nil), sn.lPtr[:n]...)
	for k := 0; k < n; k++ {
		for q := sym.uPtr[k]; q < sym.uPtr[k+1]; q++ {
			j := sym.uRow[q]
			sn.lRow[at[j]], sn.lSrc[at[j]] = int32(k), sym.uSrc[q]
			at[j]++
		}
	}
	return sn
}

// frontRows returns the rows of the front of supernode s: its first
// column f and the pattern of column f of L (its own columns f+1 … come
// first, then the rows below the supernode).
func (sn *supernodes) frontRows(sym *Symbolic, s int) (f int, below []int32) {
	f = sn.start[s]
	return f, sn.rows[sym.colPtr[f]:sym.colPtr[f+1]]
}

// frontWork is the workspace of one worker of factorizeSupernodal, kept
// by the LDL for the next factorization.
type frontWork struct {
	pos    []int32   // pos[r]: index of row r in the current front
	front  []float64 // the front, column-major; zero between fronts
	uPanel []float64 // ũ of the current panel, row-major (h × panelWidth)
	lPanel []float64 // L of the current panel, row-major
	// idle returns the number of CPUs that no worker uses at the moment
	// (a choice of how to split an update; it does not change the result).
	idle func() int
}

// multifrontalRun is the shared state of one factorizeSupernodal.
type multifrontalRun struct {
	mu      sync.Mutex
	cond    *sync.Cond
	ready   []int       // supernodes whose children are done, a stack
	pending []int       // children not yet done
	updates [][]float64 // update matrix of each finished supernode until its parent takes it
	free    [][]float64 // buffers of update matrices taken, for reuse
	active  int         // workers factoring a front
	failed  bool
}

// buffer returns a slice of length n from the free buffers, or a new one
// (its contents are overwritten by the caller). r.mu must be held.
func (r *multifrontalRun) buffer(n int) []float64 {
	best := -1
	for i, b := range r.free {
		if cap(b) >= n && (best < 0 || cap(b) < cap(r.free[best])) {
			best = i
		}
	}
	if best < 0 {
		return make([]float64, n)
	}
	b := r.free[best]
	r.free[best] = r.free[len(r.free)-1]
	r.free = r.free[:len(r.free)-1]
	return b[:n]
}

// keepBuffers is the number of free buffers a factorization keeps for
// reuse; the others are left to the garbage collector.
const keepBuffers = 16

// keep adds the buffers to the free ones, keeping the keepBuffers
// largest. r.mu must be held.
func (r *multifrontalRun) keep(buffers [][]float64) {
	for _, b := range buffers {
		if len(r.free) < keepBuffers {
			r.free = append(r.free, b)
			continue
		}
		least := 0
		for i, c := range r.free {
			if cap(c) < cap(r.free[least]) {
				least = i
			}
		}
		if cap(b) > cap(r.free[least]) {
			r.free[least] = b
		}
	}
}

// factorizeSupernodal overwrites f with the factorization of s by the
// multifrontal algorithm over the supernodes of sym (see
// Counter.roundoffBound for the operations it does), processing
// independent subtrees concurrently on up to GOMAXPROCS goroutines and
// splitting the updates of large fronts over the idle CPUs. The
// operations on each entry, and their order, do not depend on the
// scheduling, so the result is the same bit for bit. It reports whether
// every pivot is nonzero and finite.
func (f *LDL) factorizeSupernodal(sym *Symbolic, s *Sym) bool {
	sn := sym.supernodal()
	n := sym.pat.n
	if f.rowsOf != sym {
		copy(f.Row, sn.rows)
		f.rowsOf = sym
	}
	ns := len(sn.start) - 1
	r := &multifrontalRun{pending: make([]int, ns), updates: make([][]float64, ns)}
	r.cond = sync.NewCond(&r.mu)
	for p := ns - 1; p >= 0; p-- {
		r.pending[p] = sn.childPtr[p+1] - sn.childPtr[p]
		if r.pending[p] == 0 {
			r.ready = append(r.ready, p)
		}
	}
	workers := max(1, runtime.GOMAXPROCS(0))
	idle := func() int {
		r.mu.Lock()
		defer r.mu.Unlock()
		return workers - r.active
	}
	for len(f.fronts) < workers {
		f.fronts = append(f.fronts, &frontWork{})
	}
	var wg sync.WaitGroup
	for t := range workers {
		ws := f.fronts[t]
		if len(ws.pos) != n {
			ws.pos = make([]int32, n)
		}
		ws.idle = idle
		wg.Add(1)
		go func() {
			defer wg.Done()
			var children [][]float64
			for {
				r.mu.Lock()
				for len(r.ready) == 0 && r.active > 0 && !r.failed {
					r.cond.Wait()
				}
				if r.failed || len(r.ready) == 0 {
					r.mu.Unlock()
					r.cond.Broadcast()
					return
				}
				p := r.ready[len(r.ready)-1]
				r.ready = r.ready[:len(r.ready)-1]
				r.active++
				children = children[:0]
				for _, c := range sn.child[sn.childPtr[p]:sn.childPtr[p+1]] {
					children = append(children, r.updates[c])
					r.updates[c] = nil
				}
				var u []float64
				if m := sym.colPtr[sn.start[p+1]] - sym.colPtr[sn.start[p+1]-1]; m > 0 && sn.parent[p] >= 0 {
					u = r.buffer(m * (m + 1) / 2)
				}
				r.mu.Unlock()
				ok := f.factorFront(sym, sn, s, p, children, u, ws)
				r.mu.Lock()
				r.active--
				r.keep(children)
				if !ok {
					r.failed = true
				} else {
					r.updates[p] = u
					if q := sn.parent[p]; q >= 0 {
						r.pending[q]--
						if r.pending[q] == 0 {
							r.ready = append(r.ready, q)
						}
					}
				}
				r.mu.Unlock()
				r.cond.Broadcast()
			}
		}()
	}
	wg.Wait()
	if r.failed {
		// A front left unfinished is not zero: drop the workspaces.
		f.fronts = nil
	}
	return !r.failed
}

// factorFront assembles and partially factors the front of supernode p:
// the entries of PᵀSP in its columns, then the update matrices of its
// children (ascending), each added entry by entry; then its columns are
// eliminated (factorDense) and L and D written to f. The update matrix
// (the rows below the supernode, lower triangle packed by columns) is
// written to u, of length m(m+1)/2 for m such rows (nil at a root). It reports whether
// every pivot was nonzero and finite.
func (f *LDL) factorFront(sym *Symbolic, sn *supernodes, s *Sym, p int, children [][]float64, u []float64, ws *frontWork) bool {
	first, below := sn.frontRows(sym, p)
	w := sn.start[p+1] - first
	h := 1 + len(below)
	pos := ws.pos
	pos[first] = 0
	for i, r := range below {
		pos[r] = int32(i + 1)
	}
	if cap(ws.front) < h*h {
		ws.front = make([]float64, sn.maxFront*sn.maxFront) // zero
	}
	fr := ws.front[:h*h] // zero: every front clears what it wrote
	for j := first; j < first+w; j++ {
		col := fr[(j-first)*h:]
		for q := sn.lPtr[j]; q < sn.lPtr[j+1]; q++ {
			col[pos[sn.lRow[q]]] += s.Val[sn.lSrc[q]]
		}
	}
	for ci, c := range sn.child[sn.childPtr[p]:sn.childPtr[p+1]] {
		_, cb := sn.frontRows(sym, int(c))
		cb = cb[sn.start[c+1]-sn.start[c]-1:] // the rows below child c
		m, uc := len(cb), children[ci]
		for b, off := 0, 0; b < m; b++ {
			col := fr[int(pos[cb[b]])*h:]
			ub := uc[off : off+m-b]
			for a, v := range ub {
				col[pos[cb[b+a]]] += v
			}
			off += m - b
		}
	}
	if !factorDense(fr, h, w, ws) {
		return false
	}
	// Copy out L, D and the update matrix, clearing the lower triangle of
	// the front (nothing else was written) for the next one.
	for j := 0; j < w; j++ {
		f.D[first+j] = fr[j*h+j]
		copy(f.Val[sym.colPtr[first+j]:sym.colPtr[first+j+1]], fr[j*h+j+1:j*h+h])
		clear(fr[j*h+j : j*h+h])
	}
	m := h - w
	for b, off := 0, 0; b < m; b++ {
		col := fr[(w+b)*h+w+b : (w+b)*h+h]
		if u != nil {
			copy(u[off:off+m-b], col)
		}
		clear(col)
		off += m - b
	}
	return true
}

// factorDense eliminates the first w columns of the h×h front fr
// (column-major, lower triangle), leaving L_kj in fr[j·h+k] (k > j), d_j
// in fr[j·h+j], and the Schur complement in the trailing lower triangle.
// It works by panels of panelWidth columns: for each column j of a panel,
// in order,
//
//	fr_kj ← fl(fr_kj − fl(ũ_ki L_ji)) for the earlier columns i of the panel,
//	        ascending, for every row k ≥ j,
//	d_j = fr_jj, ũ_kj = fr_kj, L_kj = fl(ũ_kj / d_j) (k > j),
//
// then, for every entry (k, i), k ≥ i, right of the panel,
// fr_ki ← fl(fr_ki − fl(ũ_kj L_ij)) for the columns j of the panel,
// ascending. It reports whether every pivot is nonzero and finite.
func factorDense(fr []float64, h, w int, ws *frontWork) bool {
	if cap(ws.uPanel) < h*panelWidth {
		ws.uPanel = make([]float64, h*panelWidth)
		ws.lPanel = make([]float64, h*panelWidth)
	}
	up, lp := ws.uPanel[:h*panelWidth], ws.lPanel[:h*panelWidth]
	for p0 := 0; p0 < w; p0 += panelWidth {
		p1 := min(w, p0+panelWidth)
		for j := p0; j < p1; j++ {
			col := fr[j*h : j*h+h]
			for i := p0; i < j; i++ {
				lji := lp[j*panelWidth+i-p0]
				for k := j; k < h; k++ {
					col[k] -= up[k*panelWidth+i-p0] * lji
				}
			}
			d := col[j]
			if d == 0 || math.IsNaN(d) || math.IsInf(d, 0) {
				return false
			}
			for k := j + 1; k < h; k++ {
				u := col[k]
				l := u / d
				up[k*panelWidth+j-p0], lp[k*panelWidth+j-p0] = u, l
				col[k] = l
			}
		}
		updateTrailing(fr, h, p0, p1, up, lp, ws.idle)
	}
	return true
}

// updateTrailing sets fr_ki ← fl(fr_ki − fl(ũ_kj L_ij)), j = p0 … p1−1 in
// order, for every k ≥ i ≥ p1, the columns split over goroutines when the
// work is large and CPUs are idle (each entry is updated by one
// goroutine, by the same operations).
func updateTrailing(fr []float64, h, p0, p1 int, up, lp []float64, idle func() int) {
	m := h - p1
	work := m * (m + 1) / 2 * (p1 - p0)
	workers := 1
	if work >= parallelFrontWork {
		workers += idle()
	}
	if workers < 2 {
		updateColumns(fr, h, p0, p1, p1, h, up, lp)
		return
	}
	// Split the columns so that each part has about the same number of
	// entries of the lower triangle.
	var wg sync.WaitGroup
	from := p1
	for t := 0; t < workers; t++ {
		to := h
		if t < workers-1 {
			// entries right of column c: (h−c)(h−c+1)/2; aim at (workers−t−1)/workers of m(m+1)/2 left.
			left := float64(m) * math.Sqrt(float64(workers-t-1)/float64(workers))
			to = max(from, min(h, h-int(left)))
		}
		wg.Add(1)
		go func(from, to int) {
			defer wg.Done()
			updateColumns(fr, h, p0, p1, from, to, up, lp)
		}(from, to)
		from = to
	}
	wg.Wait()
}

// updateColumns does the update of updateTrailing for the columns
// from … to−1, two columns and four rows at a time.
func updateColumns(fr []float64, h, p0, p1, from, to int, up, lp []float64) {
	nb := p1 - p0
	const pw = panelWidth
	i := from
	for ; i+1 < to; i += 2 {
		li0, li1 := lp[i*pw:i*pw+nb], lp[(i+1)*pw:(i+1)*pw+nb]
		c0, c1 := fr[i*h:i*h+h], fr[(i+1)*h:(i+1)*h+h]
		// Row i, column i alone (above the diagonal in column i+1).
		{
			acc, uk := c0[i], up[i*pw:i*pw+nb]
			for j, u := range uk {
				acc -= u * li0[j]
			}
			c0[i] = acc
		}
		k := i + 1
		for ; k+3 < h; k += 4 {
			u0 := up[k*pw : k*pw+nb]
			u1, u2, u3 := up[(k+1)*pw:(k+1)*pw+len(u0)], up[(k+2)*pw:(k+2)*pw+len(u0)], up[(k+3)*pw:(k+3)*pw+len(u0)]
			l0s, l1s := li0[:len(u0)], li1[:len(u0)]
			a00, a10, a20, a30 := c0[k], c0[k+1], c0[k+2], c0[k+3]
			a01, a11, a21, a31 := c1[k], c1[k+1], c1[k+2], c1[k+3]
			for j, x0 := range u0 {
				l0, l1 := l0s[j], l1s[j]
				x1, x2, x3 := u1[j], u2[j], u3[j]
				a00 -= x0 * l0
				a10 -= x1 * l0
				a20 -= x2 * l0
				a30 -= x3 * l0
				a01 -= x0 * l1
				a11 -= x1 * l1
				a21 -= x2 * l1
				a31 -= x3 * l1
			}
			c0[k], c0[k+1], c0[k+2], c0[k+3] = a00, a10, a20, a30
			c1[k], c1[k+1], c1[k+2], c1[k+3] = a01, a11, a21, a31
		}
		for ; k < h; k++ {
			uk := up[k*pw : k*pw+nb]
			a0, a1 := c0[k], c1[k]
			for j, u := range uk {
				a0 -= u * li0[j]
				a1 -= u * li1[j]
			}
			c0[k], c1[k] = a0, a1
		}
	}
	for ; i < to; i++ {
		li, c := lp[i*pw:i*pw+nb], fr[i*h:i*h+h]
		for k := i; k < h; k++ {
			acc, uk := c[k], up[k*pw:k*pw+nb]
			for j, u := range uk {
				acc -= u * li[j]
			}
			c[k] = acc
		}
	}
}
