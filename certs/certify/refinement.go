package certify

import (
	"fmt"
	"math"
	"math/big"

	"gapcert/certs"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// Why refinement stopped (the "stop_reason" of a certificate's
// method.refinement). The vocabulary is fixed.
const (
	// StopTarget: every relative width (the target rule, see TargetRule)
	// is at most the target.
	StopTarget = "target reached"
	// StopTime: the next step would not have finished within the time
	// limit (it is expected to take a few times the last one; on polygons
	// with singular corners, every useful step left has a predicted time,
	// from its unknowns and the measured times, that does not fit).
	StopTime = "time limit"
	// StopMemory: the next step's estimated peak memory exceeds the budget.
	StopMemory = "memory budget"
	// StopStalled: the last step widened the widths (on polygons whose
	// stage B ran, the float64 solves that choose eigenvectors and fluxes
	// degrade on strongly graded meshes, and finer meshes only make it
	// worse), or steps in a row narrowed them by less than 5% (on
	// polygons with singular corners: every kind of step left, taken from
	// the best step, did).
	StopStalled = "widths stalled"
	// StopCap: degree, cells, mesh levels and grading are at their caps
	// (or at what float64 can mesh), and no step is left.
	StopCap = "refinement cap"
	// StopNoSeparation: no step is left and stage B never started: the
	// stage-A lower bound of λ_{N+1} never exceeded the Ritz upper bound of
	// λ_N, so the lower bounds are from stage A only.
	StopNoSeparation = "no eigenvalue separation"
	// StopInterrupted: the context was cancelled (SIGINT on the command
	// line); the bounds are those of the best step finished before.
	StopInterrupted = "interrupted"
)

var stopReasons = []string{StopTarget, StopTime, StopMemory, StopStalled, StopCap, StopNoSeparation, StopInterrupted}

// TargetRule says how the target is measured: the width of each enclosure
// (λ_k and the gap) relative to max(|midpoint|, π²/D²). The floor π²/D²,
// the natural size of the eigenvalues, keeps it finite for enclosures of 0
// (Neumann λ₁) and of tiny gaps; a quantity much smaller than π²/D² is
// judged by its absolute width (see Width.Relative for its own scale).
const TargetRule = "width / max(|midpoint|, pi^2/D^2)"

// MinRelWidth is the smallest target accepted (exact text). float64 has
// 53 bits (relative spacing 2.2e-16); bounds at a few ulps of each other
// and the outward rounding of the certificate's 17 printed digits make
// 1e-15 about the narrowest relative width a certificate can state.
const MinRelWidth = "1e-15"

// Refinement is the "refinement" object of a certificate's method: the
// target of the run (exact text) and why refinement stopped.
type Refinement struct {
	Target     string `json:"target"`
	TargetRule string `json:"target_rule"`
	StopReason string `json:"stop_reason"`
}

// Width describes one enclosure's width: Absolute is an upper bound of
// hi − lo; Relative that width over the least magnitude in the enclosure
// (an upper bound of the width relative to the quantity itself; "" when
// the enclosure contains 0); TargetRule the width as the target measures
// it (TargetRule).
type Width struct {
	Quantity   string `json:"quantity"`
	Absolute   string `json:"absolute"`
	Relative   string `json:"relative"`
	TargetRule string `json:"target_rule"`
}

// TargetError reports a target relative width or time limit that Certify
// refuses before computing.
type TargetError struct {
	Option string // "relative width" or "time limit"
	Value  string
	Msg    string
	Hint   string
}

func (e *TargetError) Error() string {
	return fmt.Sprintf("%s %s: %s (hint: %s)", e.Option, e.Value, e.Msg, e.Hint)
}

// ParseTarget reads a target relative width, exact decimal or rational
// text, and returns its enclosure. Targets must lie in [MinRelWidth, 1).
func ParseTarget(text string) (interval.I, error) {
	r, err := decimalio.ParseRat(text)
	if err != nil {
		return interval.I{}, &TargetError{Option: "relative width", Value: fmt.Sprintf("%q", text), Msg: "not an exact decimal or rational", Hint: "write 1e-8 or 1/1000"}
	}
	floor, _ := decimalio.ParseRat(MinRelWidth)
	switch {
	case r.Sign() <= 0 || r.Cmp(big.NewRat(1, 1)) >= 0:
		return interval.I{}, &TargetError{Option: "relative width", Value: text, Msg: "want a number in (0, 1)", Hint: "write 1e-8"}
	case r.Cmp(floor) < 0:
		return interval.I{}, &TargetError{Option: "relative width", Value: text,
			Msg:  "is below what float64 bounds can resolve",
			Hint: "ask for " + MinRelWidth + " or more; float64 has about 16 significant digits"}
	}
	return decimalio.FromRat(r), nil
}

// relWidthUpper returns an upper bound of x.Wid()/max(|x.Mid()|, scale)
// (the target rule with the float midpoint and scale), rounded upward, so
// that "target reached" is a true statement.
func relWidthUpper(x interval.I, scale float64) float64 {
	w := interval.SubUp(x.Hi, x.Lo)
	return interval.DivUp(w, math.Max(math.Abs(x.Mid()), scale))
}

// selfRelWidth returns an upper bound of the width of x relative to the
// least |t| over t ∈ x, and false when x contains 0.
func selfRelWidth(x interval.I) (float64, bool) {
	if x.Lo <= 0 && x.Hi >= 0 {
		return 0, false
	}
	mig := math.Min(math.Abs(x.Lo), math.Abs(x.Hi))
	return interval.DivUp(interval.SubUp(x.Hi, x.Lo), mig), true
}

// reached reports whether every enclosure of res meets the target (an
// upper bound of each width is at most the lower end of the target's
// enclosure).
func (res *result) reached(target interval.I) bool {
	for _, w := range res.ruleWidths() {
		if !(w <= target.Lo) {
			return false
		}
	}
	return true
}

// ruleWidths returns the upper bounds of the target-rule widths of
// λ_1..λ_m and the gap.
func (res *result) ruleWidths() []float64 {
	var out []float64
	for _, l := range res.lambda {
		out = append(out, relWidthUpper(l, res.scale))
	}
	return append(out, relWidthUpper(res.gap, res.scale))
}

// widthRecords returns the Width of each enclosure, λ_1..λ_m and the gap.
func (res *result) widthRecords() []Width {
	names := make([]string, 0, len(res.lambda)+1)
	xs := append(append([]interval.I(nil), res.lambda...), res.gap)
	for k := range res.lambda {
		names = append(names, fmt.Sprintf("lambda%d", k+1))
	}
	names = append(names, "gap")
	out := make([]Width, len(xs))
	for i, x := range xs {
		out[i] = Width{Quantity: names[i], Absolute: decimalio.FormatUpper(interval.SubUp(x.Hi, x.Lo), 3),
			TargetRule: decimalio.FormatUpper(relWidthUpper(x, res.scale), 3)}
		if r, ok := selfRelWidth(x); ok {
			out[i].Relative = decimalio.FormatUpper(r, 3)
		}
	}
	return out
}

// RefinementOf returns the refinement record of a certificate's method
// block (read strictly), or nil if it has none (Check rejects such a
// certificate).
func RefinementOf(c *certs.Certificate) (*Refinement, error) {
	if pm, err := decodeProductMethod(c.Method); err == nil && pm.Kind == KindProduct {
		return pm.Refinement, nil
	}
	m, err := decodeMethod(c.Method)
	if err != nil {
		return nil, err
	}
	return m.Refinement, nil
}

// WidthsOf returns the width records of a certificate's method block
// (read strictly), or nil if it has none (Check rejects such a
// certificate).
func WidthsOf(c *certs.Certificate) ([]Width, error) {
	if pm, err := decodeProductMethod(c.Method); err == nil && pm.Kind == KindProduct {
		return pm.Widths, nil
	}
	m, err := decodeMethod(c.Method)
	if err != nil {
		return nil, err
	}
	return m.Widths, nil
}

// checkRefinement verifies what the recomputed step determines about a
// recorded refinement record: the target parses and is accepted, the stop
// reason is one of the vocabulary, "target reached" holds exactly when
// every recomputed width meets the target, and "no eigenvalue separation"
// only where stage B did not run. The time and memory reasons, a stall and
// an interruption are records of the run that one step cannot reproduce;
// a refinement cap is verified as far as the recorded step goes (no step
// that does not depend on the last gain is left after it).
func checkRefinement(rec *Refinement, res *result, capped func() bool) []string {
	var bad []string
	target, err := ParseTarget(rec.Target)
	if err != nil {
		return []string{fmt.Sprintf("method.refinement.target: %v", err)}
	}
	if rec.TargetRule != TargetRule {
		bad = append(bad, fmt.Sprintf("method.refinement.target_rule is %q, want %q", rec.TargetRule, TargetRule))
	}
	known := false
	for _, s := range stopReasons {
		known = known || rec.StopReason == s
	}
	if !known {
		return append(bad, fmt.Sprintf("method.refinement.stop_reason %q is not one of the stop reasons", rec.StopReason))
	}
	reached := res.reached(target)
	switch {
	case rec.StopReason == StopTarget && !reached:
		bad = append(bad, fmt.Sprintf("method.refinement.stop_reason says %q, but the recomputed widths do not meet the target %s", StopTarget, rec.Target))
	case rec.StopReason != StopTarget && reached:
		bad = append(bad, fmt.Sprintf("method.refinement.stop_reason says %q, but the recomputed widths meet the target %s", rec.StopReason, rec.Target))
	case rec.StopReason == StopNoSeparation && res.out.n > 0:
		bad = append(bad, "method.refinement.stop_reason says stage B never started, but the recorded step ran it")
	case (rec.StopReason == StopCap || rec.StopReason == StopNoSeparation) && !capped():
		bad = append(bad, fmt.Sprintf("method.refinement.stop_reason says %q, but a refinement step is left after the recorded one", rec.StopReason))
	}
	return bad
}
