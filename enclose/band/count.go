package band

import (
	"math"
	"runtime"
	"sync"

	"gapcert/enclose"
	"gapcert/interval"
)

// Counter evaluates CountBelow for one interval pencil at many shifts,
// reusing its workspaces. It implements enclose.Counter. A Counter is not
// safe for concurrent use; its results are those of CountBelow bit for
// bit.
type Counter struct {
	k, m *ISym
	w    int
	c    *Sym // mid(K) − σ·mid(M), a choice
	f    LDL
	mag  []float64 // |R_ij| ≤ mag, in the layout of Sym
}

// NewCounter prepares CountBelow for the pencil ([K], [M]). It panics if
// the sizes differ.
func NewCounter(k, m *ISym) *Counter {
	if k.N != m.N {
		panic("band: dimension mismatch")
	}
	w := max(k.W, m.W)
	c := NewSym(k.N, w)
	return &Counter{k: k, m: m, w: w, c: c, mag: make([]float64, len(c.Data))}
}

// CountBelow returns a verified count for the interval pencil ([K], [M]):
// for every K ∈ [K] and M ∈ [M] with λ_min(M) ≥ mMin,
//
//	#{eigenvalues of Kx = λMx below sigmaPrime} ≤ n.
//
// It is NewCounter(k, m).CountBelow(mMin, sigma); see Counter.CountBelow.
func CountBelow(k, m *ISym, mMin, sigma float64) (n int, sigmaPrime float64, ok bool) {
	return NewCounter(k, m).CountBelow(mMin, sigma)
}

// CountBelow returns a verified count for the pencil of c: for every
// member (K, M) with λ_min(M) ≥ mMin,
//
//	#{eigenvalues of Kx = λMx below sigmaPrime} ≤ n.
//
// sigma is a trial shift (a choice), mMin > 0 a caller-verified lower bound
// of λ_min(M) over all members of [M]; n is the number of negative pivots
// of the floating-point factorization L D Lᵀ of mid(K) − σ·mid(M), and
// sigmaPrime = σ − r/mMin (rounded down), where r is an upper bound, over
// all members, of the largest absolute row sum of the residual
// R = (K − σM) − LDLᵀ, enclosed entry by entry in outward rounded interval
// arithmetic (L has the bandwidth of the pencil, so R is banded too). The
// inequalities that make this a proof are stated and cited at
// enclose.CountFromResidual (here with P = I). ok = false if the
// factorization broke down (zero or non-finite pivot).
//
// The residual is computed in parallel for large matrices; the result does
// not depend on GOMAXPROCS (each entry is enclosed identically, and the
// row sums and their maximum are taken sequentially).
//
// CountBelow panics if mMin is not a positive finite number or sigma is
// not finite.
func (c *Counter) CountBelow(mMin, sigma float64) (n int, sigmaPrime float64, ok bool) {
	return enclose.CountFromResidual(mMin, sigma, c.factorResidual)
}

// parallelEntries is the number of band entries above which CountBelow
// splits the residual enclosure over the available CPUs.
const parallelEntries = 1 << 15

// factorResidual factors mid(K) − σ·mid(M) and bounds its residual (see
// CountBelow).
func (c *Counter) factorResidual(sigma float64) (neg int, r float64, ok bool) {
	k, m, w, nn := c.k, c.m, c.w, c.k.N
	for i := 0; i < nn; i++ {
		for j := max(0, i-w); j <= i; j++ {
			c.c.Data[i*(w+1)+i-j] = k.At(i, j).Mid() - sigma*m.At(i, j).Mid()
		}
	}
	if !c.f.Factorize(c.c) {
		return 0, 0, false
	}
	f, mag := &c.f, c.mag
	rows := func(from, to int) {
		ld := make([]interval.I, w)
		for i := from; i < to; i++ {
			residualRow(k, m, f, sigma, i, ld, mag[i*(w+1):(i+1)*(w+1)])
		}
	}
	if workers := runtime.GOMAXPROCS(0); workers > 1 && len(mag) > parallelEntries {
		var wg sync.WaitGroup
		chunk := (nn + workers - 1) / workers
		for from := 0; from < nn; from += chunk {
			wg.Add(1)
			go func(from, to int) {
				defer wg.Done()
				rows(from, to)
			}(from, min(nn, from+chunk))
		}
		wg.Wait()
	} else {
		rows(0, nn)
	}
	for i := 0; i < nn; i++ {
		s := 0.0
		for j := max(0, i-w); j <= i; j++ {
			s = interval.AddUp(s, mag[i*(w+1)+i-j])
		}
		for j := i + 1; j <= min(nn-1, i+w); j++ {
			s = interval.AddUp(s, mag[j*(w+1)+j-i])
		}
		r = math.Max(r, s)
	}
	return f.NegCount(), r, true
}

// residualRow sets mag[i−j] ≥ |R_ij| for j = max(0, i−w) … i and every
// member, where R_ij = (K − σM)_ij − (LDLᵀ)_ij and
// (LDLᵀ)_ij = Σ_{q=max(0,i−w)}^{j} L_iq D_q L_jq (L_jj = 1). ld is a
// workspace of length w; it receives enclosures of L_iq D_q.
func residualRow(k, m *ISym, f *LDL, sigma float64, i int, ld []interval.I, mag []float64) {
	w, d := f.W, f.Data
	lo := max(0, i-w)
	rowi := i * (w + 1)
	for q := lo; q < i; q++ {
		ld[q-lo] = interval.Point(d[rowi+i-q]).MulF(d[q*(w+1)])
	}
	for j := lo; j <= i; j++ {
		r := k.At(i, j).Sub(m.At(i, j).MulF(sigma))
		rowj := j * (w + 1)
		for q := lo; q < j; q++ {
			r = r.Sub(ld[q-lo].MulF(d[rowj+j-q]))
		}
		if i == j {
			r = r.Sub(interval.Point(d[rowi])) // q = i: D_i
		} else {
			r = r.Sub(ld[j-lo]) // q = j: L_ij D_j L_jj
		}
		mag[i-j] = r.Mag()
	}
}
