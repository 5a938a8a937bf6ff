package certify

import (
	"bytes"
	"encoding/json"
	"fmt"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// MismatchError lists every way a certificate differs from its
// recomputation.
type MismatchError struct {
	Problems []string
}

func (e *MismatchError) Error() string {
	var b bytes.Buffer
	b.WriteString("certificate does not verify:")
	for _, p := range e.Problems {
		b.WriteString("\n  - ")
		b.WriteString(p)
	}
	return b.String()
}

// Check re-verifies a certificate: the format version is known, the
// recorded problem parses and hashes to problem_sha256, and the recorded
// method, recomputed by the same deterministic code, reproduces every
// recorded bound, stage bound and claim verdict exactly. It returns nil if
// the certificate verifies, a *MismatchError listing the differences, or
// another error if the certificate cannot be read.
func Check(data []byte) error {
	cert, err := certs.Unmarshal(data)
	if err != nil {
		return err
	}
	p, err := problem.Parse(cert.Problem)
	if err != nil {
		return fmt.Errorf("the recorded problem does not parse: %w", err)
	}
	var bad []string
	if got := p.SHA256(); got != cert.ProblemSHA256 {
		bad = append(bad, fmt.Sprintf("problem_sha256 is %s but the recorded problem hashes to %s (the problem or the hash was edited)", cert.ProblemSHA256, got))
	}
	var m Method
	dec := json.NewDecoder(bytes.NewReader(cert.Method))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&m); err != nil {
		return fmt.Errorf("the method block does not parse: %w", err)
	}
	if (m.Kind != KindInterval || p.Dim != 1) && (m.Kind != KindPolygon || p.Dim != 2) {
		return fmt.Errorf("method kind %q does not fit a %d-dimensional problem", m.Kind, p.Dim)
	}
	gamma, err := decimalio.Parse(m.Gamma)
	if err != nil || !gamma.IsPoint() {
		return fmt.Errorf("method.gamma %q is not an exact float64", m.Gamma)
	}
	r := recipe{degree: m.Degree, taylor: m.TaylorOrder, gamma: gamma.Lo,
		cells: m.Cells, fluxDegree: m.FluxDegree, weightTaylor: m.WeightOrder, stageACells: m.StageACells,
		refine: m.Refinements, stageARefine: m.StageARefinements, graded: m.GradedLevels}
	r.scale = interval.Pi().Sqr().Div(p.Diameter().Sqr()).Lo
	if p.Dim == 2 {
		fg, err := decimalio.Parse(m.FluxGamma)
		if err != nil || !fg.IsPoint() || fg.Lo < r.gamma {
			return fmt.Errorf("method.flux_gamma %q is not an exact float64 ≥ gamma", m.FluxGamma)
		}
		r.fluxGamma = fg.Lo
		r.marks = m.AdaptiveMarks
	}
	if err := r.validate(p); err != nil {
		return err
	}
	if est := memoryEstimate(p, r); est > DefaultMemory {
		return &BudgetError{What: "recomputing this certificate", Need: est, Budget: DefaultMemory}
	}
	out, err := compute(p, r)
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	fresh, err := res.certificate(p, Options{recorded: cert})
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	if !sameJSON(fresh.Results.Eigenvalues, cert.Results.Eigenvalues) {
		bad = append(bad, "results.eigenvalues differ from the recomputation")
	}
	for _, f := range []struct {
		name      string
		got, want certs.Bound
	}{
		{"results.gap", fresh.Results.Gap, cert.Results.Gap},
		{"results.diameter", fresh.Results.Diameter, cert.Results.Diameter},
		{"results.gap_d2_over_pi2", fresh.Results.GapD2OverPi2, cert.Results.GapD2OverPi2},
	} {
		if f.got != f.want {
			bad = append(bad, fmt.Sprintf("%s is [%s, %s], recomputed [%s, %s]", f.name, f.want.Lower, f.want.Upper, f.got.Lower, f.got.Upper))
		}
	}
	if !sameJSON(fresh.Results.RelativeWidths, cert.Results.RelativeWidths) {
		bad = append(bad, "results.relative_widths differ from the recomputation")
	}
	if !sameJSON(fresh.Claims, cert.Claims) {
		bad = append(bad, "claims (texts, verdicts or margins) differ from the recomputation")
	}
	recorded := m // decoded strictly above
	if recorded.Refinement != nil {
		capped := func() bool { _, why := refine(p, r, out, 1); return why != "" }
		bad = append(bad, checkRefinement(recorded.Refinement, res, capped)...)
		res.refinement = recorded.Refinement
	}
	fm := res.method()
	if recorded.Refinement == nil && recorded.Widths == nil {
		fm.Widths = nil // a certificate written before widths were recorded
	}
	if !sameJSON(fm, recorded) {
		bad = append(bad, "method (stage bounds, N, rho or constants) differs from the recomputation")
	}
	if len(bad) > 0 {
		return &MismatchError{Problems: bad}
	}
	return nil
}

// sameJSON reports whether a and b encode to the same JSON, so that an
// empty list read back from a file equals a nil one recomputed.
func sameJSON(a, b any) bool {
	ja, errA := json.Marshal(a)
	jb, errB := json.Marshal(b)
	if errA != nil || errB != nil {
		return false
	}
	if string(ja) == "null" {
		ja = []byte("[]")
	}
	if string(jb) == "null" {
		jb = []byte("[]")
	}
	return bytes.Equal(ja, jb)
}

// validate rejects recipes that the computation cannot run (a certificate
// with absurd numbers must fail cleanly, not exhaust memory).
func (r recipe) validate(p *problem.Problem) error {
	dim := p.Dim
	switch {
	case r.degree < 1 || r.degree > 16:
		return fmt.Errorf("method.degree %d out of range", r.degree)
	case r.taylor < 1 || r.taylor > 32:
		return fmt.Errorf("method.taylor_order %d out of range", r.taylor)
	case r.gamma < 0:
		return fmt.Errorf("method.gamma is negative")
	}
	if dim == 2 {
		switch {
		case r.refine < 0 || r.refine > maxPolygonRefine:
			return fmt.Errorf("method.refinements %d out of range", r.refine)
		case r.stageARefine < 0 || r.stageARefine > maxPolygonRefine:
			return fmt.Errorf("method.stage_a_refinements %d out of range", r.stageARefine)
		case r.graded < 0 || r.graded > 3*maxPolygonRefine:
			return fmt.Errorf("method.graded_levels %d out of range", r.graded)
		case len(r.marks) > maxAdaptiveRounds:
			return fmt.Errorf("method.adaptive_marks has %d rounds, more than %d", len(r.marks), maxAdaptiveRounds)
		case r.fluxDegree < 0 || r.fluxDegree > 16:
			return fmt.Errorf("method.flux_degree %d out of range", r.fluxDegree)
		case r.weightTaylor < 1 || r.weightTaylor > 32:
			return fmt.Errorf("method.weight_taylor_order %d out of range", r.weightTaylor)
		}
		return nil
	}
	switch {
	case r.cells < 1 || r.cells > 1<<16:
		return fmt.Errorf("method.cells %d out of range", r.cells)
	case r.fluxDegree < 1 || r.fluxDegree > 17:
		return fmt.Errorf("method.flux_degree %d out of range", r.fluxDegree)
	case r.weightTaylor < 1 || r.weightTaylor > 32:
		return fmt.Errorf("method.weight_taylor_order %d out of range", r.weightTaylor)
	case r.stageACells < 1 || r.stageACells > 1<<20:
		return fmt.Errorf("method.stage_a_cells %d out of range", r.stageACells)
	case !meshable1D(p, max(r.cells, r.stageACells)):
		return fmt.Errorf("method.cells %d or stage_a_cells %d: cells too short for float64 at this interval", r.cells, r.stageACells)
	}
	return nil
}
