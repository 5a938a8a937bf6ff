package solvertest

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/internal/geneig"
	"gapcert/interval"
)

// Impl is a solver implementation under test: its storage built from
// entries, and the two operations of the storage.
type Impl struct {
	// LowestEigs builds the float pencil of order n from its entries and
	// returns the storage's approximate lowest count eigenpairs.
	LowestEigs func(n int, e []Entry, count int) (vals []float64, vecs [][]float64, err error)
	// NewCounter builds the interval pencil of order n from its entries
	// and returns the storage's verified counter.
	NewCounter func(n int, e []IEntry) enclose.Counter
}

// Run runs the conformance suite against impl.
func Run(t *testing.T, impl Impl) {
	t.Run("LowestEigsClosedForms", func(t *testing.T) { lowestEigsClosedForms(t, impl) })
	t.Run("LowestEigsIndefiniteMass", func(t *testing.T) { lowestEigsIndefiniteMass(t, impl) })
	t.Run("LowestEigsDeterministic", func(t *testing.T) { lowestEigsDeterministic(t, impl) })
	t.Run("CountContainsClosedForm", func(t *testing.T) { countContainsClosedForm(t, impl) })
	t.Run("CountContainsRandomMembers", func(t *testing.T) { countContainsRandomMembers(t, impl) })
	t.Run("CountDeterministic", func(t *testing.T) { countDeterministic(t, impl) })
	t.Run("CounterMisusePanics", func(t *testing.T) { counterMisusePanics(t, impl) })
}

// eigsCases are the float pencils with closed-form spectra: small ones take
// the dense path, larger ones the iteration; the shifted P1 pencil has an
// indefinite K.
func eigsCases() []struct {
	p     pencil
	count int
} {
	return []struct {
		p     pencil
		count int
	}{
		{tridiagIdentity(60), 5},
		{tridiagIdentity(1000), 6},
		{p1Line(128, 0), 4},
		{p1Line(1024, 0), 4},
		{p1Line(1024, 30), 3},
		{doubled(tridiagIdentity(400)), 4},
	}
}

func lowestEigsClosedForms(t *testing.T, impl Impl) {
	for _, tc := range eigsCases() {
		p := tc.p
		vals, vecs, err := impl.LowestEigs(p.n, p.entries, tc.count)
		if err != nil {
			t.Errorf("%s, n = %d: %v", p.name, p.n, err)
			continue
		}
		if len(vals) != tc.count || len(vecs) != tc.count {
			t.Fatalf("%s, n = %d: %d values, %d vectors, want %d", p.name, p.n, len(vals), len(vecs), tc.count)
		}
		normK, normM := infNorms(p)
		// Eigenvalues far below ‖K‖∞/λ_min(M) are limited by the float
		// evaluation of Kx; λ_min(M) ≥ ‖M‖∞/3 for these pencils.
		scale := 3 * normK / normM
		for i, v := range vals {
			if d := math.Abs(v - p.want[i]); !(d <= 1e-11*math.Abs(p.want[i])+1e-14*scale) {
				t.Errorf("%s, n = %d: λ_%d = %.17g, closed form %.17g", p.name, p.n, i+1, v, p.want[i])
			}
		}
		checkPairs(t, p, vals, vecs, normK, normM)
	}
}

// checkPairs tests relative residuals and M-orthonormality of the pairs.
func checkPairs(t *testing.T, p pencil, vals []float64, vecs [][]float64, normK, normM float64) {
	t.Helper()
	kx, mx := make([]float64, p.n), make([]float64, p.n)
	for i, x := range vecs {
		mulTo(kx, mx, p, x)
		res, xx := 0.0, 0.0
		for j := range kx {
			d := kx[j] - vals[i]*mx[j]
			res += d * d
			xx += x[j] * x[j]
		}
		if rel := math.Sqrt(res) / ((normK + math.Abs(vals[i])*normM) * math.Sqrt(xx)); !(rel <= 1e-11) {
			t.Errorf("%s, n = %d: pair %d has relative residual %g", p.name, p.n, i+1, rel)
		}
		for j := 0; j <= i; j++ {
			mulTo(kx, mx, p, vecs[j])
			g := 0.0
			for q := range x {
				g += x[q] * mx[q]
			}
			if i == j {
				g--
			}
			if !(math.Abs(g) <= 1e-10) {
				t.Errorf("%s, n = %d: (x_%d, M x_%d) off by %g", p.name, p.n, i+1, j+1, g)
			}
		}
	}
}

// mulTo sets kx = K x and mx = M x.
func mulTo(kx, mx []float64, p pencil, x []float64) {
	clear(kx)
	clear(mx)
	for _, e := range p.entries {
		kx[e.I] += e.K * x[e.J]
		mx[e.I] += e.M * x[e.J]
		if e.I != e.J {
			kx[e.J] += e.K * x[e.I]
			mx[e.J] += e.M * x[e.I]
		}
	}
}

func infNorms(p pencil) (normK, normM float64) {
	rk, rm := make([]float64, p.n), make([]float64, p.n)
	for _, e := range p.entries {
		rk[e.I] += math.Abs(e.K)
		rm[e.I] += math.Abs(e.M)
		if e.I != e.J {
			rk[e.J] += math.Abs(e.K)
			rm[e.J] += math.Abs(e.M)
		}
	}
	return slices.Max(rk), slices.Max(rm)
}

func lowestEigsIndefiniteMass(t *testing.T, impl Impl) {
	for _, n := range []int{50, 300} {
		p := tridiagIdentity(n)
		for q := range p.entries {
			p.entries[q].M = -p.entries[q].M
		}
		if _, _, err := impl.LowestEigs(n, p.entries, 2); err == nil {
			t.Errorf("n = %d: M = −I accepted", n)
		}
	}
}

// lowestEigsDeterministic checks identical bits for repeated calls and for
// GOMAXPROCS 1 and 2.
func lowestEigsDeterministic(t *testing.T, impl Impl) {
	p := p1Line(2048, 0)
	prev := runtime.GOMAXPROCS(1)
	defer runtime.GOMAXPROCS(prev)
	v1, x1, err1 := impl.LowestEigs(p.n, p.entries, 3)
	runtime.GOMAXPROCS(2)
	v2, x2, err2 := impl.LowestEigs(p.n, p.entries, 3)
	v3, x3, err3 := impl.LowestEigs(p.n, p.entries, 3)
	if err1 != nil || err2 != nil || err3 != nil {
		t.Fatalf("errors %v, %v, %v", err1, err2, err3)
	}
	if !sameBits(v1, v2) || !sameBits(v2, v3) {
		t.Errorf("eigenvalues differ: %v, %v, %v", v1, v2, v3)
	}
	for c := range x1 {
		if !sameBits(x1[c], x2[c]) || !sameBits(x2[c], x3[c]) {
			t.Errorf("eigenvector %d differs between runs", c+1)
		}
	}
}

// Digest returns the SHA-256 (hex) of the IEEE 754 bits of vals and then
// of every entry of vecs, in order: a fingerprint of a solver's exact
// output, for tests that pin it bit for bit.
func Digest(vals []float64, vecs [][]float64) string {
	h := sha256.New()
	var b [8]byte
	put := func(v float64) {
		binary.LittleEndian.PutUint64(b[:], math.Float64bits(v))
		h.Write(b[:])
	}
	for _, v := range vals {
		put(v)
	}
	for _, x := range vecs {
		for _, v := range x {
			put(v)
		}
	}
	return hex.EncodeToString(h.Sum(nil))
}

// CheckDigest reports an error unless err is nil and the Digest of vals
// and vecs is want.
func CheckDigest(t *testing.T, name, want string, vals []float64, vecs [][]float64, err error) {
	t.Helper()
	if err != nil {
		t.Errorf("%s: %v", name, err)
	} else if got := Digest(vals, vecs); got != want {
		t.Errorf("%s: digest %s, recorded %s", name, got, want)
	}
}

func sameBits(a, b []float64) bool {
	return slices.EqualFunc(a, b, func(x, y float64) bool { return math.Float64bits(x) == math.Float64bits(y) })
}

// trialShifts returns shifts in the middle of the gaps below the first
// count+1 eigenvalues of want (ascending), starting below λ_1.
func trialShifts(want []float64, count int) []float64 {
	s := []float64{want[0] / 2}
	for k := 1; k <= count; k++ {
		s = append(s, (want[k-1]+want[k])/2)
	}
	return s
}

// countContainsClosedForm checks the promise of a verified count against
// the exact P1 pencil, a member of the interval pencil that is not its
// midpoint: #{λ_k < σ'} ≤ n. It also checks narrowness: n is the number
// of eigenvalues below σ, and σ − σ' is at most a small multiple of
// (interval width + rounding)·(‖K‖∞ + |σ|‖M‖∞)/mMin.
func countContainsClosedForm(t *testing.T, impl Impl) {
	for _, tc := range []struct {
		nElem int
		rel   float64
	}{{64, 0}, {512, 0}, {512, 1e-9}, {4096, 1e-12}} {
		n, e, mMin := p1LineInterval(tc.nElem, tc.rel)
		h := 1 / float64(tc.nElem)
		want := make([]float64, 8)
		for k := range want {
			want[k] = p1Eigenvalue(k+1, h)
		}
		c := impl.NewCounter(n, e)
		for _, sigma := range trialShifts(want, 6) {
			got, sp, ok := c.CountBelow(mMin, sigma)
			if !ok {
				t.Errorf("N = %d, rel = %g, σ = %g: factorization failed", tc.nElem, tc.rel, sigma)
				continue
			}
			if below := numBelow(want, sp); below > got {
				t.Errorf("N = %d, rel = %g, σ = %g: count %d, σ' = %.17g, but %d eigenvalues below σ'", tc.nElem, tc.rel, sigma, got, sp, below)
			}
			truth := numBelow(want, sigma)
			tol := lossBound(tc.rel, sigma, h, mMin)
			if got != truth || !(sp <= sigma) || !(sigma-sp <= tol) {
				t.Errorf("N = %d, rel = %g, σ = %g: count %d (true %d), σ − σ' = %g (allowed %g)", tc.nElem, tc.rel, sigma, got, truth, sigma-sp, tol)
			}
		}
	}
}

// countContainsRandomMembers checks #{λ < σ'} ≤ n for random members of a
// thick interval pencil (entries at random points of their intervals,
// symmetric), whose spectra are computed densely; the trial shifts lie in
// the middle of gaps of the closed-form spectrum, far from the members'
// eigenvalues at this width.
func countContainsRandomMembers(t *testing.T, impl Impl) {
	const nElem, rel = 32, 1e-4
	n, e, mMin := p1LineInterval(nElem, rel)
	h := 1 / float64(nElem)
	want := make([]float64, n)
	for k := range want {
		want[k] = p1Eigenvalue(k+1, h)
	}
	c := impl.NewCounter(n, e)
	kd, md := make([]float64, n*n), make([]float64, n*n)
	for _, x := range e {
		kd[x.I*n+x.J], kd[x.J*n+x.I] = x.K.Mid(), x.K.Mid()
		md[x.I*n+x.J], md[x.J*n+x.I] = x.M.Mid(), x.M.Mid()
	}
	midVals, _, err := geneig.Solve(kd, md, n)
	if err != nil {
		t.Fatal(err)
	}
	r := rand.New(rand.NewPCG(11, 12))
	pick := func(x interval.I) float64 { return x.Lo + r.Float64()*(x.Hi-x.Lo) }
	for member := 0; member < 5; member++ {
		kd, md := make([]float64, n*n), make([]float64, n*n)
		for _, x := range e {
			kv, mv := pick(x.K), pick(x.M)
			if member == 0 { // the lower ends of K, the upper ends of M
				kv, mv = x.K.Lo, x.M.Hi
			}
			kd[x.I*n+x.J], kd[x.J*n+x.I] = kv, kv
			md[x.I*n+x.J], md[x.J*n+x.I] = mv, mv
		}
		vals, _, err := geneig.Solve(kd, md, n)
		if err != nil {
			t.Fatal(err)
		}
		// Shifts between a member's eigenvalue and the midpoint's: the float
		// factorization (of the midpoint) miscounts the member there, so
		// only the residual correction can keep the promise.
		for k := 0; k < 6; k++ {
			sigma := (vals[k] + midVals[k]) / 2
			if got, sp, ok := c.CountBelow(mMin, sigma); !ok || numBelow(vals, sp) > got {
				t.Errorf("member %d, σ = %.17g between its and the midpoint's eigenvalue: count %d, σ' = %.17g, ok %v, but %d eigenvalues below σ'", member, sigma, got, sp, ok, numBelow(vals, sp))
			}
		}
		for _, sigma := range trialShifts(want, 8) {
			got, sp, ok := c.CountBelow(mMin, sigma)
			if !ok {
				t.Fatalf("σ = %g: factorization failed", sigma)
			}
			if below := numBelow(vals, sp); below > got {
				t.Errorf("member %d, σ = %g: count %d, σ' = %.17g, but %d eigenvalues below σ'", member, sigma, got, sp, below)
			}
			if tol := lossBound(rel, sigma, h, mMin); !(sigma-sp <= tol) {
				t.Errorf("member %d, σ = %g: σ − σ' = %g (allowed %g)", member, sigma, sigma-sp, tol)
			}
		}
	}
}

// countDeterministic checks identical counts and shifts for GOMAXPROCS 1
// and 2 on a pencil large enough for a parallel residual enclosure, and
// for a Counter reused at other shifts in between.
func countDeterministic(t *testing.T, impl Impl) {
	n, e, mMin := p1LineInterval(1<<16, 1e-12)
	sigmas := []float64{5, 50, 500}
	prev := runtime.GOMAXPROCS(1)
	defer runtime.GOMAXPROCS(prev)
	c := impl.NewCounter(n, e)
	var one []float64
	for _, s := range sigmas {
		got, sp, ok := c.CountBelow(mMin, s)
		one = append(one, float64(got), sp, b2f(ok))
	}
	runtime.GOMAXPROCS(2)
	var two []float64
	fresh := impl.NewCounter(n, e)
	for i := len(sigmas) - 1; i >= 0; i-- {
		got, sp, ok := fresh.CountBelow(mMin, sigmas[i])
		two = append([]float64{float64(got), sp, b2f(ok)}, two...)
	}
	if !sameBits(one, two) {
		t.Errorf("GOMAXPROCS 1: %v; GOMAXPROCS 2, other order: %v", one, two)
	}
}

// numBelow returns #{v ∈ vals : v < s}.
func numBelow(vals []float64, s float64) int {
	n := 0
	for _, v := range vals {
		if v < s {
			n++
		}
	}
	return n
}

// lossBound is the allowed σ − σ' for the interval P1 pencil of
// p1LineInterval: the residual's row sums are at most the interval widths
// (4·rel relative, three entries a row) plus the rounding of the
// factorization, times ‖K‖∞ + |σ|‖M‖∞ (‖K‖∞ = 4/h, ‖M‖∞ = h), divided by
// mMin; the factors 2 and 1e-13 are slack.
func lossBound(rel, sigma, h, mMin float64) float64 {
	return (8*rel + 1e-13) * (4/h + math.Abs(sigma)*h) / mMin
}

func b2f(ok bool) float64 {
	if ok {
		return 1
	}
	return 0
}

func counterMisusePanics(t *testing.T, impl Impl) {
	n, e, _ := p1LineInterval(8, 0)
	c := impl.NewCounter(n, e)
	for _, tc := range []struct {
		name        string
		mMin, sigma float64
	}{
		{"mMin = 0", 0, 1}, {"mMin < 0", -1, 1}, {"mMin = +∞", math.Inf(1), 1}, {"mMin NaN", math.NaN(), 1},
		{"σ NaN", 1, math.NaN()}, {"σ = −∞", 1, math.Inf(-1)},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			c.CountBelow(tc.mMin, tc.sigma)
		}()
	}
}
