package certify

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify/proof"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// This file certifies product domains, Ω = Ω_1 × … × Ω_F of intervals and
// polygons (package fem/problem), by separation of variables: each factor
// is certified as a lone problem with its part of the potential, and the
// product's eigenvalues are enclosed from the factors' enclosures by the
// order-statistics rule of proof.ProductSums (stated and proved there).
// The product's certificate embeds every factor's full certificate in its
// method, and Check re-verifies each of them by recomputation before it
// recomputes the combination. A product of two intervals whose potential
// does not separate is the rectangle it is, certified as that polygon
// (the method's combination "rectangle"); on three or four coordinates
// such a potential is refused by the problem reader.

// KindProduct is the method kind of a product's certificate.
const KindProduct = "product"

// Combinations of a product's method.
const (
	CombineSums      = "sums"      // the eigenvalues are order statistics of sums of the factors' (proof.ProductSums)
	CombineRectangle = "rectangle" // a product of two intervals certified as the polygon it is
)

// ProductMethod is the "method" object of a product's certificate.
type ProductMethod struct {
	Kind        string          `json:"kind"`        // KindProduct
	Combination string          `json:"combination"` // CombineSums or CombineRectangle
	Factors     []ProductFactor `json:"factors"`     // one per factor (sums), or the rectangle's single entry
	// OmittedLower is a lower bound of every sum of factor eigenvalues
	// not among the certified ones (T of proof.ProductSums, rounded
	// down); "" for a rectangle.
	OmittedLower string      `json:"omitted_lower,omitempty"`
	Theorems     []string    `json:"theorems"`
	Widths       []Width     `json:"widths"`
	Refinement   *Refinement `json:"refinement"`
}

// ProductFactor is one factor of a product's method: the problem it
// certifies is the factor's problem file (problem.Problem.FactorFile, or
// RectangleFile) with Eigenvalues and Target, and Certificate is that
// problem's full certificate.
type ProductFactor struct {
	Eigenvalues int    `json:"eigenvalues"`
	Target      string `json:"target"`
	// NextLower is a lower bound of λ_{m+1} of the factor (m =
	// Eigenvalues), read from its certificate (nextLower); "" for a
	// rectangle.
	NextLower   string          `json:"next_lower,omitempty"`
	Certificate json.RawMessage `json:"certificate"`
}

// theoremsProduct are the results a product's combination relies on
// (each factor's certificate lists its own).
var theoremsProduct = []string{
	"separation of variables: the eigenvalues of a product with a separable potential are the sums of the factors' eigenvalues, with multiplicity (M. Reed, B. Simon, Methods of Modern Mathematical Physics I, Theorem VIII.33; R. Courant, D. Hilbert, Methods of Mathematical Physics I, Ch. V)",
	"order statistics of certified sums, with a lower bound of every omitted sum (proved in the doc of gapcert/certs/certify/proof, ProductSums)",
	"the gap of a product is the least of its factors' gaps (proved in the doc of gapcert/certs/certify/proof, ProductGap)",
}

// productResult is the outcome of a product's combination.
type productResult struct {
	res    *result // lambda, gap, scale, widths (out is nil)
	method ProductMethod
}

// Factor targets: a 1D factor gets intervalWeight times the relative
// target of a polygon factor (its enclosures are cheap to narrow) and
// that share of the time; the coarse first pass that chooses the factors'
// eigenvalue counts runs at coarseTarget with coarseTimeShare of the time
// limit at most, and raises the counts in at most maxFactorRounds rounds.
const (
	intervalWeight  = 0.05
	coarseTarget    = "1e-4"
	coarseTimeShare = 0.25
	maxFactorRounds = 24
)

// certifyProduct is Certify for a product domain.
func certifyProduct(ctx context.Context, p *problem.Problem, opt Options, target interval.I, targetText string, limit time.Duration) (*certs.Certificate, error) {
	if opt.GroundState {
		return nil, fmt.Errorf("the ground state (--ground-state) is not available on product domains yet (hint: certify without it)")
	}
	opt.ctx = ctx
	start := time.Now()
	// One time stamp for the product's certificate and its factors'.
	stamp := start
	if opt.Now != nil {
		stamp = opt.Now()
	}
	opt.Now = func() time.Time { return stamp }
	if sep, _ := p.Separable(); !sep {
		return certifyRectangle(ctx, p, opt, targetText, limit)
	}
	F := p.Factors()
	m := initialCounts(F, p.Eigenvalues)
	progress := func(format string, args ...any) {
		if opt.Progress != nil {
			opt.Progress(format, args...)
		}
	}
	// Coarse pass: the eigenvalue counts m_i that decide the m lowest
	// sums, and the factors' sizes for the targets.
	coarse := make([]*certs.Certificate, F)
	coarseLimit := time.Duration(float64(limit) * coarseTimeShare)
	var cres *productResult
	for round := 0; ; round++ {
		for i := range F {
			if coarse[i] != nil {
				if n, _ := factorEigenvalues(coarse[i]); n == m[i] {
					continue
				}
			}
			progress("factor %d: coarse pass with %d eigenvalues, target %s\n", i, m[i], coarseTarget)
			c, err := certifyFactor(ctx, p, i, m[i], coarseTarget, coarseLimit/time.Duration(F), opt, nil)
			if err != nil {
				return nil, err
			}
			coarse[i] = c
		}
		r, short, err := combineFactors(p, m, coarse, nil)
		if err != nil {
			return nil, err
		}
		if len(short) == 0 {
			cres = r
			break
		}
		if round >= maxFactorRounds || !raiseCounts(m, short) {
			return nil, fmt.Errorf("the product's lambda%d is not decided: the eigenvalues of factor %d beyond the %d certified ones may lie below it, and at most %d eigenvalues of a factor are certified", p.Eigenvalues, short[0], m[short[0]], maxFactorEigenvalues)
		}
	}
	targets := factorTargets(p, target.Lo, cres, coarse)
	var final *productResult
	reason := StopTarget
	for round := 0; ; round++ {
		certsF := make([]*certs.Certificate, F)
		order := factorOrder(p)
		var weightLeft float64
		for _, i := range order {
			weightLeft += factorWeight(p, i)
		}
		for _, i := range order {
			left := limit - time.Since(start)
			share := time.Duration(float64(left) * factorWeight(p, i) / weightLeft)
			weightLeft -= factorWeight(p, i)
			if share < time.Second {
				share = time.Second
			}
			progress("factor %d: %d eigenvalues, target %s, time limit %.1fs\n", i, m[i], targets[i], share.Seconds())
			c, err := certifyFactor(ctx, p, i, m[i], targets[i], share, opt, progress)
			if err != nil && ctx.Err() != nil {
				return interruptedProduct(p, m, certsF, targets, coarse, target, targetText, opt, err)
			}
			if err != nil {
				return nil, err
			}
			certsF[i] = c
		}
		r, short, err := combineFactors(p, m, certsF, targets)
		if err != nil {
			return nil, err
		}
		if len(short) > 0 {
			// Narrower factor bounds moved the m-th sum past what the
			// coarse counts decide (a tie): certify more eigenvalues.
			if round >= 2 || !raiseCounts(m, short) {
				return nil, fmt.Errorf("the product's lambda%d is not decided: the eigenvalues of factor %d beyond the %d certified ones may lie below it", p.Eigenvalues, short[0], m[short[0]])
			}
			continue
		}
		final = r
		if !final.res.reached(target) {
			reason = factorStop(certsF)
		}
		break
	}
	progress("[%6.1fs] product: widths lambda1 %.2g, lambda2 %.2g, gap %.2g; target %s\n", time.Since(start).Seconds(),
		final.res.widths[0], final.res.widths[1], final.res.gapWidth, targetText)
	final.res.warnings = append(final.res.warnings, wideWarnings(p, final.res, reason)...)
	if reason != StopTarget {
		final.res.warnings = append(final.res.warnings, fmt.Sprintf("target relative width %s not reached (stopped: %s, in a factor); the widths reached are in results.relative_widths and method.widths", targetText, reason))
	}
	final.method.Refinement = &Refinement{Target: targetText, TargetRule: TargetRule, StopReason: reason}
	return final.certificate(p, opt)
}

// interruptedProduct is the certificate of a product whose final pass
// was interrupted (ctx ended): each factor's final certificate where it
// was finished, else its coarse one (target coarseTarget), combined as
// usual, with the stop reason StopInterrupted (StopTarget if they meet
// the target all the same); err (the interruption) when they do not
// combine (the coarse counts were raised since).
func interruptedProduct(p *problem.Problem, m []int, final []*certs.Certificate, targets []string, coarse []*certs.Certificate, target interval.I, targetText string, opt Options, err error) (*certs.Certificate, error) {
	cs := make([]*certs.Certificate, len(final))
	ts := make([]string, len(final))
	for i := range final {
		cs[i], ts[i] = final[i], targets[i]
		if cs[i] == nil {
			cs[i], ts[i] = coarse[i], coarseTarget
		}
	}
	r, short, cerr := combineFactors(p, m, cs, ts)
	if cerr != nil || len(short) > 0 {
		return nil, err
	}
	reason := StopInterrupted
	if r.res.reached(target) {
		reason = StopTarget // the coarse enclosures meet a coarse target
	} else {
		r.res.warnings = append(r.res.warnings, fmt.Sprintf("target relative width %s not reached (stopped: %s); the factors not finished are those of the coarse pass, at relative width %s", targetText, StopInterrupted, coarseTarget))
	}
	r.method.Refinement = &Refinement{Target: targetText, TargetRule: TargetRule, StopReason: reason}
	return r.certificate(p, opt)
}

// maxFactorEigenvalues is the largest eigenvalue count of a problem file.
const maxFactorEigenvalues = 20

// initialCounts are the first eigenvalue counts of the factors (a
// choice): two each (the least a problem file asks for), raised one at a
// time, the smallest first, until there are at least m sums; the coarse
// pass raises the counts of the factors whose omitted sums are not
// decided (proof.ProductSums).
func initialCounts(F, m int) []int {
	counts := make([]int, F)
	total := 1
	for i := range counts {
		counts[i] = 2
		total *= 2
	}
	for total < m {
		i := 0
		for j := range counts {
			if counts[j] < counts[i] {
				i = j
			}
		}
		total = total / counts[i] * (counts[i] + 1)
		counts[i]++
	}
	return counts
}

// raiseCounts adds one certified eigenvalue to each factor in short;
// false when one of them is at maxFactorEigenvalues.
func raiseCounts(m []int, short []int) bool {
	for _, i := range short {
		if m[i] >= maxFactorEigenvalues {
			return false
		}
		m[i]++
	}
	return true
}

// factorWeight is the share of the width budget and of the time of factor
// i (a choice): intervalWeight for an interval, 1 for a polygon.
func factorWeight(p *problem.Problem, i int) float64 {
	if p.FactorDim(i) == 1 {
		return intervalWeight
	}
	return 1
}

// factorOrder lists the factors intervals first (they are fast, and the
// polygons then share the time left).
func factorOrder(p *problem.Problem) []int {
	var out []int
	for _, dim := range []int{1, 2} {
		for i := range p.Factors() {
			if p.FactorDim(i) == dim {
				out = append(out, i)
			}
		}
	}
	return out
}

// factorTargets chooses each factor's target relative width (a choice;
// the product's widths are measured after the fact). Factor i gets
// t_i = t·ω_i (ω_i its weight, factorWeight): its certified λ_j then have
// widths ≤ t_i·max(|λ_j|, π²/D_i²) by its own target rule, and a sum
// λ_{j_1} + … + λ_{j_F}, whose width is the sum of those, meets the
// product's rule, width ≤ target·max(|sum|, π²/D²), when
// t ≤ target·max(|sum|, π²/D²) / Σ_i ω_i·max(|λ_{j_i}|, π²/D_i²). t is the
// least of these over the tuples that may be among the m lowest (those
// whose lower end, in the coarse pass, is at most the coarse upper end of
// λ_m). The product's gap is the least of the factors' gaps
// (proof.ProductGap), so each factor's gap needs only the product gap's
// absolute target, which caps t_i at target·max(|gap|, π²/D²) over the
// factor's own gap size. The result lies within [MinRelWidth, 1e-4].
func factorTargets(p *problem.Problem, target float64, coarse *productResult, certsF []*certs.Certificate) []string {
	res := coarse.res
	F := len(certsF)
	lists := make([][]interval.I, F)
	scales := make([]float64, F)
	for i, c := range certsF {
		_, lists[i] = factorEigenvalues(c)
		scales[i] = factorScale(c)
	}
	size := func(x interval.I, floor float64) float64 {
		return math.Max(math.Max(math.Abs(x.Lo), math.Abs(x.Hi)), floor)
	}
	upper := res.lambda[len(res.lambda)-1].Hi
	t := math.Inf(1)
	idx := make([]int, F)
	for {
		var lo, denom float64
		sum := interval.Point(0)
		for i, j := range idx {
			x := lists[i][j]
			lo += x.Lo
			sum = sum.Add(x)
			denom += factorWeight(p, i) * size(x, scales[i])
		}
		if lo <= upper {
			t = math.Min(t, target*size(sum, res.scale)/denom)
		}
		k := 0
		for ; k < F; k++ {
			idx[k]++
			if idx[k] < len(lists[k]) {
				break
			}
			idx[k] = 0
		}
		if k == F {
			break
		}
	}
	gapBudget := target * size(res.gap, res.scale)
	const floor = 1e-15 // MinRelWidth
	out := make([]string, F)
	for i, c := range certsF {
		ti := t * factorWeight(p, i)
		if g, err := c.Results.Gap.Interval(); err == nil {
			ti = math.Min(ti, gapBudget/size(g, scales[i]))
		}
		ti = math.Min(math.Max(ti, floor), 1e-4)
		out[i] = strconv.FormatFloat(ti, 'e', 1, 64)
		if _, err := ParseTarget(out[i]); err != nil {
			out[i] = MinRelWidth
		}
	}
	return out
}

// factorScale is π²/D² of a factor's certificate (its recorded diameter).
func factorScale(c *certs.Certificate) float64 {
	d, err := c.Results.Diameter.Interval()
	if err != nil {
		return 1
	}
	return interval.Pi().Sqr().Div(d.Sqr()).Lo
}

// factorStop is the stop reason of a product whose widths miss the
// target: the first factor's that stopped short of its own target, or
// StopStalled when every factor met its target (the coarse sizes chose
// targets that were not narrow enough).
func factorStop(cs []*certs.Certificate) string {
	for _, c := range cs {
		if ref, err := RefinementOf(c); err == nil && ref != nil && ref.StopReason != StopTarget {
			return ref.StopReason
		}
	}
	return StopStalled
}

// certifyFactor certifies factor i of p with m eigenvalues at the target.
func certifyFactor(ctx context.Context, p *problem.Problem, i, m int, target string, limit time.Duration, opt Options, progress func(string, ...any)) (*certs.Certificate, error) {
	sub, err := problem.Parse(p.FactorFile(i, m, target))
	if err != nil {
		return nil, fmt.Errorf("factor %d: %w", i, err)
	}
	fo := Options{TimeLimit: limit, Tool: opt.Tool, Now: opt.Now, Memory: opt.Memory}
	if progress != nil {
		fo.Progress = func(format string, args ...any) { progress("factor %d: "+format, append([]any{i}, args...)...) }
	}
	c, err := Certify(ctx, sub, fo)
	if err != nil {
		return nil, fmt.Errorf("factor %d: %w", i, err)
	}
	return c, nil
}

// factorEigenvalues is the number of eigenvalues a factor's certificate
// encloses, and their enclosures read back outward.
func factorEigenvalues(c *certs.Certificate) (int, []interval.I) {
	var out []interval.I
	for _, e := range c.Results.Eigenvalues {
		x, err := e.Bound().Interval()
		if err != nil {
			return 0, nil
		}
		out = append(out, x)
	}
	return len(out), out
}

// nextLower returns a lower bound of λ_{m+1} of the problem of a factor's
// certificate with m eigenvalues: the largest of the lower end of λ_m
// (λ_{m+1} ≥ λ_m), the stage-A bound of Λ_{m+1} and, when stage B bounded
// it, the Lehmann–Goerisch bound of Λ_{m+1}, each minus γ (the method's
// stages bound Λ_k = λ_k + γ; package proof, Enclose), rounded down.
// Check verifies the factor's certificate, these recorded stages included.
func nextLower(c *certs.Certificate) (float64, error) {
	m, lambda := factorEigenvalues(c)
	if m == 0 {
		return 0, fmt.Errorf("the certificate encloses no eigenvalue")
	}
	meth, err := decodeMethod(c.Method)
	if err != nil {
		return 0, err
	}
	gamma, err := decimalio.Parse(meth.Gamma)
	if err != nil || !gamma.IsPoint() {
		return 0, fmt.Errorf("method.gamma %q is not an exact float64", meth.Gamma)
	}
	best := lambda[m-1].Lo
	for _, list := range [][]StageBound{meth.Stages.ProjectionLower, meth.Stages.LehmannGoerisch} {
		for _, s := range list {
			if s.Index != m+1 {
				continue
			}
			b, err := decimalio.ParseLower(s.Bound)
			if err != nil {
				return 0, fmt.Errorf("stage bound %q: %w", s.Bound, err)
			}
			best = math.Max(best, interval.SubDown(b, gamma.Lo))
		}
	}
	return best, nil
}

// combineFactors encloses the product's eigenvalues from its factors'
// certificates (proof.ProductSums). targets are the factors' targets as
// recorded (nil in the coarse pass). short lists the factors that need
// more eigenvalues.
func combineFactors(p *problem.Problem, m []int, cs []*certs.Certificate, targets []string) (*productResult, []int, error) {
	var factors [][]interval.I
	var next []float64
	var gaps []interval.I
	pm := ProductMethod{Kind: KindProduct, Combination: CombineSums, Theorems: theoremsProduct}
	for i, c := range cs {
		n, lambda := factorEigenvalues(c)
		if n != m[i] {
			return nil, nil, fmt.Errorf("factor %d: the certificate encloses %d eigenvalues, not %d", i, n, m[i])
		}
		nl, err := nextLower(c)
		if err != nil {
			return nil, nil, fmt.Errorf("factor %d: %w", i, err)
		}
		g, err := c.Results.Gap.Interval()
		if err != nil {
			return nil, nil, fmt.Errorf("factor %d: results.gap: %w", i, err)
		}
		factors = append(factors, lambda)
		next = append(next, nl)
		gaps = append(gaps, g)
		data, err := c.Marshal()
		if err != nil {
			return nil, nil, err
		}
		f := ProductFactor{Eigenvalues: n, NextLower: decimalio.FormatLower(nl, Digits), Certificate: data}
		if targets != nil {
			f.Target = targets[i]
		}
		pm.Factors = append(pm.Factors, f)
	}
	lambda, omitted, short, err := proof.ProductSums(factors, next, p.Eigenvalues)
	if err != nil || len(short) > 0 {
		return nil, short, err
	}
	pm.OmittedLower = decimalio.FormatLower(omitted, Digits)
	res := productEnclosures(p, lambda)
	// The gap is the least of the factors' gaps (proof.ProductGap); the
	// difference of the enclosures of λ_2 and λ_1 encloses it too, and the
	// intersection of two enclosures of one number encloses it.
	g, ok := res.gap.Intersection(proof.ProductGap(gaps))
	if !ok {
		return nil, nil, fmt.Errorf("internal inconsistency (please report it): the product's gap enclosures %v and %v are disjoint", res.gap, proof.ProductGap(gaps))
	}
	res.gap, res.gapWidth = g, relWidth(g, res.scale)
	for i, c := range cs {
		for _, w := range c.Warnings {
			res.warnings = append(res.warnings, fmt.Sprintf("factor %d: %s", i, w))
		}
	}
	pm.Widths = res.widthRecords()
	return &productResult{res: res, method: pm}, nil, nil
}

// productEnclosures is the result of a product from its eigenvalue
// enclosures: the gap [ℓ₂ − u₁, u₂ − ℓ₁] and the widths by the target
// rule with the product's own π²/D².
func productEnclosures(p *problem.Problem, lambda []interval.I) *result {
	scale := interval.Pi().Sqr().Div(p.Diameter().Sqr()).Lo
	res := &result{scale: scale, lambda: lambda}
	for _, l := range lambda {
		res.widths = append(res.widths, relWidth(l, scale))
	}
	res.gap = proof.Gap(lambda[0], lambda[1])
	res.gapWidth = relWidth(res.gap, scale)
	return res
}

// certifyRectangle certifies a product of two intervals whose potential
// does not separate as the polygon it is (problem.Problem.RectangleFile).
func certifyRectangle(ctx context.Context, p *problem.Problem, opt Options, targetText string, limit time.Duration) (*certs.Certificate, error) {
	sub, err := problem.Parse(p.RectangleFile())
	if err != nil {
		return nil, fmt.Errorf("the rectangle of the product: %w", err)
	}
	c, err := Certify(ctx, sub, Options{RelWidth: targetText, TimeLimit: limit, Tool: opt.Tool, Now: opt.Now, Memory: opt.Memory, Progress: opt.Progress})
	if err != nil {
		return nil, err
	}
	pr, err := rectangleResult(p, c, targetText)
	if err != nil {
		return nil, err
	}
	ref, err := RefinementOf(c)
	if err != nil || ref == nil {
		return nil, fmt.Errorf("the rectangle's certificate has no refinement record")
	}
	pr.method.Refinement = &Refinement{Target: targetText, TargetRule: TargetRule, StopReason: ref.StopReason}
	return pr.certificate(p, opt)
}

// rectangleResult is the product's result from the certificate c of its
// rectangle: the same enclosures (the rectangle is the product).
func rectangleResult(p *problem.Problem, c *certs.Certificate, targetText string) (*productResult, error) {
	_, lambda := factorEigenvalues(c)
	if len(lambda) != p.Eigenvalues {
		return nil, fmt.Errorf("the rectangle's certificate encloses %d eigenvalues, not %d", len(lambda), p.Eigenvalues)
	}
	data, err := c.Marshal()
	if err != nil {
		return nil, err
	}
	res := productEnclosures(p, lambda)
	res.warnings = append(res.warnings, c.Warnings...)
	pm := ProductMethod{Kind: KindProduct, Combination: CombineRectangle, Theorems: []string{"a product of two intervals is a rectangle, certified as that polygon (its certificate is the single factor)"},
		Factors: []ProductFactor{{Eigenvalues: p.Eigenvalues, Target: targetText, Certificate: data}}, Widths: res.widthRecords()}
	return &productResult{res: res, method: pm}, nil
}

// certificate writes a product's certificate.
func (pr *productResult) certificate(p *problem.Problem, opt Options) (*certs.Certificate, error) {
	c := pr.res.newCertificate(p)
	claims, err := evaluateClaims(p, pr.res, nil, opt)
	if err != nil {
		return nil, err
	}
	c.Claims = claims
	if c.Method, err = json.Marshal(pr.method); err != nil {
		return nil, err
	}
	c.Provenance = provenance(opt)
	return c, nil
}
