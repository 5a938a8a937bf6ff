package certify

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
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

// Check re-verifies a certificate. It first reads the whole file strictly,
// before computing anything: the certificate (certs.Unmarshal: no repeated
// or case-variant keys at any depth, known format), its problem
// (problem.Parse), its method (every key spelled as Method defines it, the
// recipe within range), and the problem and method of every embedded
// reference certificate; a defect there is a *certs.FormatError with its
// JSON path. It then checks that the recorded problem is written in its
// canonical form (compared as JSON values: white space, key order and
// string escapes may differ) and hashes to problem_sha256, recomputes the
// certificate from the recorded problem and method with the same
// deterministic code (results.ground_state too when the certificate has
// it), and demands that the recorded results, claims
// (hypotheses and references included) and method equal the recomputed
// ones field for field, and that every warning of the recomputation is
// recorded (the certificate may hold more: refinement warnings depend on
// the budget of the run, which is not recorded). Provenance is not
// compared. It returns nil if the certificate verifies, a *MismatchError
// listing every differing field by its path, a *BudgetError if the
// recomputation would exceed the memory budget, or another error if the
// certificate cannot be read or recomputed.
func Check(data []byte) error { return CheckWithin(data, 0) }

// CheckWithin is Check with a memory budget of memory bytes for the
// recomputation (DefaultMemory when 0), so that a certificate made with a
// larger Options.Memory can be re-verified on a machine that has it; a
// recipe whose estimate exceeds the budget is refused (*BudgetError)
// before anything is allocated. The budget only bounds the work: a
// certificate verifies under any budget that admits its recipe.
func CheckWithin(data []byte, memory int64) error {
	if memory == 0 {
		memory = DefaultMemory
	}
	if cert, p, ok := productCertificate(data); ok {
		return checkProduct(cert, p, memory)
	}
	cert, p, m, err := readRecorded(data)
	if err != nil {
		return err
	}
	if err := Supported(p); err != nil {
		return err
	}
	bad, err := checkRecordedProblem(cert, p)
	if err != nil {
		return err
	}
	r, err := recordedRecipe(p, m)
	if err != nil {
		return err
	}
	if est := memoryEstimate(p, r); est > memory {
		return &BudgetError{What: "recomputing this certificate", Need: est, Budget: memory}
	}
	out, err := compute(p, r)
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	res, err := assemble(p, r, out)
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	fresh, err := res.certificate(p, Options{recorded: cert, GroundState: cert.Results.GroundState != nil})
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	bad = append(bad, differences("results", cert.Results, fresh.Results)...)
	bad = append(bad, differences("claims", cert.Claims, fresh.Claims)...)
	if m.Refinement == nil {
		bad = append(bad, "method.refinement is missing (a certificate records its target and why refinement stopped)")
	} else {
		capped := func() bool { _, why := refine(p, r, out, 1); return why != "" }
		bad = append(bad, checkRefinement(m.Refinement, res, capped)...)
		res.refinement = m.Refinement // a record of the run, checked above as far as the step determines it
	}
	bad = append(bad, differences("method", m, res.method())...)
	for _, w := range fresh.Warnings {
		if !slices.Contains(cert.Warnings, w) {
			bad = append(bad, fmt.Sprintf("warnings lack %q, which the recomputation gives", w))
		}
	}
	if len(bad) > 0 {
		return &MismatchError{Problems: bad}
	}
	return nil
}

// checkRecordedProblem reads every claim's reference certificate strictly
// (a format error names the claim) and returns the mismatches of the
// recorded problem: its hash, and its form against the canonical one.
// Check and checkProduct start with it.
func checkRecordedProblem(cert *certs.Certificate, p *problem.Problem) (bad []string, err error) {
	for i, c := range cert.Claims {
		if c.Reference == nil {
			continue
		}
		if _, _, _, err := readRecorded(c.Reference.Certificate); err != nil {
			return nil, certs.AsFormatError(fmt.Sprintf("claims[%d].reference.certificate", i), err)
		}
	}
	if got := p.SHA256(); got != cert.ProblemSHA256 {
		bad = append(bad, fmt.Sprintf("problem_sha256 is %s but the recorded problem hashes to %s (the problem or the hash was edited)", cert.ProblemSHA256, got))
	}
	for _, d := range differences("problem", cert.Problem, json.RawMessage(p.Canonical())) {
		bad = append(bad, "the problem is not written in its canonical form: "+strings.Replace(d, ", recomputed ", ", canonical ", 1))
	}
	return bad, nil
}

// readRecorded reads a certificate, its problem and its method strictly.
// Errors are *certs.FormatError with the JSON path of the defect, except
// JSON syntax errors.
func readRecorded(data []byte) (*certs.Certificate, *problem.Problem, Method, error) {
	cert, err := certs.Unmarshal(data)
	if err != nil {
		return nil, nil, Method{}, err
	}
	p, err := problem.Parse(cert.Problem)
	if err != nil {
		var perr *problem.Error
		if !errors.As(err, &perr) || len(perr.Issues) == 0 {
			return nil, nil, Method{}, &certs.FormatError{Path: "problem", Msg: "the recorded problem does not parse: " + err.Error()}
		}
		is := perr.Issues[0]
		msg := "the recorded problem is invalid: " + is.Msg
		if n := len(perr.Issues); n > 1 {
			msg += fmt.Sprintf(" (and %d more defects)", n-1)
		}
		return nil, nil, Method{}, &certs.FormatError{Path: strictjson.Join("problem", is.Path), Msg: msg}
	}
	m, err := decodeMethod(cert.Method)
	if err != nil {
		return nil, nil, Method{}, err
	}
	if _, err := recordedRecipe(p, m); err != nil {
		return nil, nil, Method{}, err
	}
	return cert, p, m, nil
}

// decodeMethod reads a certificate's method block strictly: every key
// spelled as Method defines it, none repeated, at every depth.
func decodeMethod(raw json.RawMessage) (Method, error) {
	var m Method
	if err := strictjson.Decode(raw, &m); err != nil {
		return Method{}, certs.AsFormatError("method", err)
	}
	return m, nil
}

// recordedRecipe returns the recipe a certificate's method records for p,
// or a *certs.FormatError naming the field that does not fit p or is out
// of range.
func recordedRecipe(p *problem.Problem, m Method) (recipe, error) {
	if (m.Kind != KindInterval || p.Dim != 1) && (m.Kind != KindPolygon || p.Dim != 2 || p.Polyhedron != nil) &&
		(m.Kind != KindPolyhedron || p.Polyhedron == nil) {
		return recipe{}, &certs.FormatError{Path: "method.kind", Msg: fmt.Sprintf("%q does not fit a %d-dimensional problem", m.Kind, p.Dim)}
	}
	gamma, err := decimalio.Parse(m.Gamma)
	if err != nil || !gamma.IsPoint() {
		return recipe{}, &certs.FormatError{Path: "method.gamma", Msg: fmt.Sprintf("%q is not an exact float64", m.Gamma)}
	}
	r := recipe{degree: m.Degree, taylor: m.TaylorOrder, gamma: gamma.Lo,
		cells: m.Cells, fluxDegree: m.FluxDegree, weightTaylor: m.WeightOrder, stageACells: m.StageACells,
		refine: m.Refinements, stageARefine: m.StageARefinements, graded: m.GradedLevels, extra: m.ExtraIndices}
	r.scale = interval.Pi().Sqr().Div(p.Diameter().Sqr()).Lo
	if p.Dim >= 2 {
		fg, err := decimalio.Parse(m.FluxGamma)
		if err != nil || !fg.IsPoint() || fg.Lo < r.gamma {
			return recipe{}, &certs.FormatError{Path: "method.flux_gamma", Msg: fmt.Sprintf("%q is not an exact float64 ≥ gamma", m.FluxGamma)}
		}
		r.fluxGamma = fg.Lo
		r.marks = m.AdaptiveMarks
	}
	if err := r.validate(p); err != nil {
		return recipe{}, &certs.FormatError{Msg: err.Error()} // the message names the field
	}
	return r, nil
}

// differences compares a recorded part of a certificate with its
// recomputation, field for field through their JSON forms, and lists
// every differing field by its path (at most maxDifferences per part). An
// absent list or map equals an empty one.
func differences(path string, recorded, recomputed any) []string {
	var out []string
	diffJSON(path, generic(recorded), generic(recomputed), &out)
	if n := len(out); n > maxDifferences {
		out = append(out[:maxDifferences], fmt.Sprintf("%s: %d more differences", path, n-maxDifferences))
	}
	return out
}

const maxDifferences = 12

// generic returns the JSON form of v as maps, lists, strings, json.Number,
// bools and nil (embedded raw JSON, such as a reference certificate,
// included).
func generic(v any) any {
	data, err := json.Marshal(v)
	if err != nil {
		panic("certify: " + err.Error()) // certificate types always marshal
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	var g any
	if err := dec.Decode(&g); err != nil {
		panic("certify: " + err.Error())
	}
	return g
}

func diffJSON(path string, a, b any, out *[]string) {
	if isEmpty(a) && isEmpty(b) {
		return
	}
	switch av := a.(type) {
	case map[string]any:
		bv, ok := b.(map[string]any)
		if !ok {
			break
		}
		keys := make([]string, 0, len(av)+len(bv))
		for k := range av {
			keys = append(keys, k)
		}
		for k := range bv {
			if _, dup := av[k]; !dup {
				keys = append(keys, k)
			}
		}
		slices.Sort(keys)
		for _, k := range keys {
			x, inA := av[k]
			y, inB := bv[k]
			switch {
			case !inB:
				*out = append(*out, fmt.Sprintf("%s is recorded but not recomputed", strictjson.Join(path, k)))
			case !inA:
				*out = append(*out, fmt.Sprintf("%s is missing (recomputed %s)", strictjson.Join(path, k), short(y)))
			default:
				diffJSON(strictjson.Join(path, k), x, y, out)
			}
		}
		return
	case []any:
		bv, ok := b.([]any)
		if !ok {
			break
		}
		if len(av) != len(bv) {
			*out = append(*out, fmt.Sprintf("%s has %d entries, recomputed %d", path, len(av), len(bv)))
		}
		for i := range min(len(av), len(bv)) {
			diffJSON(strictjson.Index(path, i), av[i], bv[i], out)
		}
		return
	default:
		if a == b {
			return
		}
	}
	*out = append(*out, fmt.Sprintf("%s is %s, recomputed %s", path, short(a), short(b)))
}

// isEmpty reports whether a JSON value is null, an empty list or an empty
// object.
func isEmpty(v any) bool {
	switch v := v.(type) {
	case nil:
		return true
	case []any:
		return len(v) == 0
	case map[string]any:
		return len(v) == 0
	}
	return false
}

// short returns the JSON text of v, cut to 80 bytes.
func short(v any) string {
	data, _ := json.Marshal(v)
	if len(data) > 80 {
		return string(data[:77]) + "..."
	}
	return string(data)
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
	case math.IsInf(r.gamma, 0) || math.IsNaN(r.gamma):
		// A negative γ is allowed: the computation verifies V + γ ≥ 0
		// (stage A) and > 0 (stage B) cell by cell.
		return fmt.Errorf("method.gamma is not finite")
	case r.extra < 0 || r.extra > maxExtraIndices:
		return fmt.Errorf("method.extra_indices %d out of range (0 to %d)", r.extra, maxExtraIndices)
	}
	if p.Polyhedron != nil {
		switch {
		case r.refine < 0 || r.refine > maxPolyhedronRefine:
			return fmt.Errorf("method.refinements %d out of range (0 to %d on polyhedra)", r.refine, maxPolyhedronRefine)
		case r.stageARefine < 0 || r.stageARefine > maxPolyhedronRefine:
			return fmt.Errorf("method.stage_a_refinements %d out of range (0 to %d on polyhedra)", r.stageARefine, maxPolyhedronRefine)
		case r.degree > maxPolyhedronDegree:
			return fmt.Errorf("method.degree %d out of range (1 to %d on polyhedra)", r.degree, maxPolyhedronDegree)
		case polyhedronGradingError(p, r.graded) != nil:
			return polyhedronGradingError(p, r.graded)
		case len(r.marks) > 0:
			return fmt.Errorf("method.adaptive_marks are not used on polyhedra")
		case r.fluxDegree < 0 || r.fluxDegree > maxPolyhedronDegree:
			return fmt.Errorf("method.flux_degree %d out of range (0 to %d on polyhedra)", r.fluxDegree, maxPolyhedronDegree)
		case r.weightTaylor < 1 || r.weightTaylor > 32:
			return fmt.Errorf("method.weight_taylor_order %d out of range", r.weightTaylor)
		}
		return nil
	}
	if dim == 2 {
		switch {
		case r.refine < 0 || r.refine > maxPolygonRefine:
			return fmt.Errorf("method.refinements %d out of range", r.refine)
		case r.stageARefine < 0 || r.stageARefine > maxPolygonRefine:
			return fmt.Errorf("method.stage_a_refinements %d out of range", r.stageARefine)
		case r.degree > maxPolygonDegree:
			return fmt.Errorf("method.degree %d out of range (1 to %d on polygons)", r.degree, maxPolygonDegree)
		case r.graded < 0 || r.graded > maxGraded:
			return fmt.Errorf("method.graded_levels %d out of range (0 to %d)", r.graded, maxGraded)
		case len(r.marks) > maxAdaptiveRounds:
			return fmt.Errorf("method.adaptive_marks has %d rounds, more than %d", len(r.marks), maxAdaptiveRounds)
		case r.fluxDegree < 0 || r.fluxDegree > maxPolygonDegree-1:
			// The driver records fluxes one degree below the trial space.
			return fmt.Errorf("method.flux_degree %d out of range (0 to %d on polygons)", r.fluxDegree, maxPolygonDegree-1)
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
