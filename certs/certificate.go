package certs

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"

	"gapcert/fem/problem/strictjson"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// Format is the format identifier written to, and required in, the "format"
// field of every certificate this package reads or writes.
const Format = "gapcert.certificate/v1"

// Bound is a closed interval printed as two decimal strings: Lower is ≤ the
// enclosed quantity and Upper is ≥ it. The strings are "Infinity" and
// "-Infinity" for unbounded ends.
type Bound struct {
	Lower string `json:"lower"`
	Upper string `json:"upper"`
}

// NewBound returns x printed with digits significant digits, the lower end
// rounded toward −∞ and the upper end toward +∞, so that the exact values of
// the printed strings enclose x. It panics if digits < 1.
func NewBound(x interval.I, digits int) Bound {
	if digits < 1 {
		panic("certs: digits must be at least 1")
	}
	return Bound{Lower: decimalio.FormatLower(x.Lo, digits), Upper: decimalio.FormatUpper(x.Hi, digits)}
}

// Interval returns a float64 interval that contains the exact interval
// [Lower, Upper] as printed (each end is read exactly and rounded outward).
// It returns an error if a string is not a decimal, a fraction or ±Infinity,
// or if the ends do not form a nonempty interval.
func (b Bound) Interval() (interval.I, error) {
	lo, err := decimalio.ParseLower(b.Lower)
	if err != nil {
		return interval.I{}, fmt.Errorf("lower end %q: %w", b.Lower, err)
	}
	hi, err := decimalio.ParseUpper(b.Upper)
	if err != nil {
		return interval.I{}, fmt.Errorf("upper end %q: %w", b.Upper, err)
	}
	if math.IsInf(lo, 1) || math.IsInf(hi, -1) || lo > hi {
		return interval.I{}, fmt.Errorf("[%s, %s] is not an interval", b.Lower, b.Upper)
	}
	return interval.I{Lo: lo, Hi: hi}, nil
}

// Eigen is the enclosure of the eigenvalue λ_Index (1-based).
type Eigen struct {
	Index int    `json:"index"`
	Lower string `json:"lower"`
	Upper string `json:"upper"`
}

// Bound returns the enclosure of e as a Bound.
func (e Eigen) Bound() Bound { return Bound{Lower: e.Lower, Upper: e.Upper} }

// Results are the certified quantities.
type Results struct {
	Eigenvalues    []Eigen           `json:"eigenvalues"`
	Gap            Bound             `json:"gap"`
	Diameter       Bound             `json:"diameter"`
	GapD2OverPi2   Bound             `json:"gap_d2_over_pi2"`
	RelativeWidths map[string]string `json:"relative_widths"`
	GroundState    *GroundState      `json:"ground_state,omitempty"`
}

// GroundState is what a certificate proves about the ground state u of the
// problem (results.ground_state, present when it was asked for). Values of
// u enclose the multiple named by Normalization.
type GroundState struct {
	// Normalization names the multiple of the ground state that Points
	// and the witness's values enclose (NormalizationL2).
	Normalization string `json:"normalization"`
	// L2Error is an upper bound of ‖ũ − P₁ũ‖/‖ũ‖ for the approximate
	// ground state ũ of the certified step (its first Ritz vector), ""
	// when λ1 is not shown to be separated from λ2.
	L2Error string `json:"l2_error_upper,omitempty"`
	// LogConcavity is Proven, Disproven (with Witness) or Undecided.
	LogConcavity string `json:"log_concavity"`
	// Reason says what the verdict rests on, or why it is undecided.
	Reason  string        `json:"reason"`
	Witness *ShapeWitness `json:"witness,omitempty"`
	// Margin encloses the best candidate's margin when the verdict is
	// undecided (a positive lower end would have been a witness).
	Margin *Bound       `json:"margin,omitempty"`
	Points []PointValue `json:"points,omitempty"`
}

// NormalizationL2 is the ground state u > 0 with ∫u² = 1.
const NormalizationL2 = "positive, unit L2 norm"

// ShapeWitness is a certified failure of log-concavity of the ground state.
//
// Kind WitnessConvexInterval (intervals): Points holds the ends [lo, hi] of
// an interval on which (log u)″ > 0; Values[0] encloses
// g = (V − λ1)u² − u′² there, and Margin encloses g's lower end.
//
// Kind WitnessMidpoint (polygons): Points holds x, y and m = (x + y)/2;
// Values u(x), u(y), u(m); Margin encloses u(x)u(y) − u(m)², whose lower
// end is positive, so log u(m) < (log u(x) + log u(y))/2.
type ShapeWitness struct {
	Kind   string     `json:"kind"`
	Points [][]string `json:"points"`
	Values []Bound    `json:"values"`
	Margin Bound      `json:"margin"`
}

// Kinds of a ShapeWitness.
const (
	WitnessConvexInterval = "convex_interval"
	WitnessMidpoint       = "midpoint_triple"
)

// PointValue is an enclosure of u at a point given in the problem (its
// exact coordinates as written there).
type PointValue struct {
	At    []string `json:"at"`
	Value Bound    `json:"value"`
}

// Verdicts of a claim.
const (
	Holds     = "holds"
	Fails     = "fails"
	Undecided = "undecided"
)

// ClaimResult is the verdict on one claim. Margin encloses lhs − rhs over
// the certified enclosures; Reason says why a claim could not be evaluated
// (empty when it was).
//
// A built-in claim (Text "@name", see package fem/claim/named) also records the
// Inequality its name stands for, the verdict on each hypothesis of the
// theorem it comes from, and the Reference quantity it compares with, if
// any. Verdict is the certified comparison of the enclosures either way;
// the hypotheses say whether the theorem applies, not whether the
// inequality is true.
type ClaimResult struct {
	Text       string       `json:"text"`
	Inequality string       `json:"inequality,omitempty"`
	Verdict    string       `json:"verdict"`
	Margin     Bound        `json:"margin"`
	Reason     string       `json:"reason,omitempty"`
	Hypotheses []Hypothesis `json:"hypotheses,omitempty"`
	Reference  *Reference   `json:"reference,omitempty"`
}

// Verdicts of a hypothesis and of a ground state's log-concavity (besides
// Undecided).
const (
	Proven    = "proven"
	Disproven = "disproven"
)

// Hypothesis is the verdict on one hypothesis of a theorem for the
// recorded problem: Proven, Disproven (then Witness is set) or Undecided.
// Detail says in words what was shown, or where the decision stopped.
type Hypothesis struct {
	Name    string   `json:"name"`
	Verdict string   `json:"verdict"`
	Detail  string   `json:"detail"`
	Witness *Witness `json:"witness,omitempty"`
}

// Witness is the evidence that a hypothesis fails: a side of the domain
// (0-based, as in the recorded problem's boundary list), a vertex (0-based
// index into the recorded polygon), and/or a point of the closed domain
// given by its exact coordinates (one for an interval, two for a polygon,
// three for a polyhedron or a product of three coordinates, four for a
// product of four).
type Witness struct {
	Side   *int     `json:"side,omitempty"`
	Vertex *int     `json:"vertex,omitempty"`
	Point  []string `json:"point,omitempty"`
}

// Reference is a certified quantity a built-in claim compares with, named
// Name in the claim's inequality and certified by its own Certificate
// (a complete certificate of another problem, which the re-check verifies
// in turn).
type Reference struct {
	Name        string          `json:"name"`
	Certificate json.RawMessage `json:"certificate"`
}

// Provenance records what produced a certificate. It is informative only;
// nothing in it affects the bounds.
type Provenance struct {
	Tool      string `json:"tool"`
	GoVersion string `json:"go_version"`
	OS        string `json:"os"`
	Arch      string `json:"arch"`
	Time      string `json:"time"`
}

// Certificate is the whole document. Problem is the canonical JSON of the
// problem (a JSON object) and ProblemSHA256 the hex SHA-256 of it; Method is
// written by the certification driver and is opaque here (it may be null).
type Certificate struct {
	Format        string          `json:"format"`
	Problem       json.RawMessage `json:"problem"`
	ProblemSHA256 string          `json:"problem_sha256"`
	Results       Results         `json:"results"`
	Claims        []ClaimResult   `json:"claims"`
	Method        json.RawMessage `json:"method"`
	Warnings      []string        `json:"warnings"`
	Provenance    Provenance      `json:"provenance"`
}

// FormatError reports a certificate that does not have the layout of
// Format. Path is the JSON path of the offending value ("results.gap").
type FormatError struct {
	Path string
	Msg  string
}

func (e *FormatError) Error() string {
	if e.Path == "" {
		return e.Msg
	}
	return e.Path + ": " + e.Msg
}

// Marshal returns the certificate as indented JSON (two spaces, field order
// as declared, map keys sorted, no HTML escaping, trailing newline). Absent
// lists and maps are written as [] and {}, a nil Method as null. It returns
// an error if c.Format is not Format or c.Problem is not a JSON object.
func (c *Certificate) Marshal() ([]byte, error) {
	if c.Format != Format {
		return nil, &FormatError{Path: "format", Msg: fmt.Sprintf("is %q, want %q", c.Format, Format)}
	}
	if !isObject(c.Problem) {
		return nil, &FormatError{Path: "problem", Msg: "must be a JSON object"}
	}
	out := *c
	if out.Results.Eigenvalues == nil {
		out.Results.Eigenvalues = []Eigen{}
	}
	if out.Results.RelativeWidths == nil {
		out.Results.RelativeWidths = map[string]string{}
	}
	if out.Claims == nil {
		out.Claims = []ClaimResult{}
	}
	if out.Warnings == nil {
		out.Warnings = []string{}
	}
	if len(out.Method) == 0 {
		out.Method = json.RawMessage("null")
	}
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(&out); err != nil {
		return nil, fmt.Errorf("encoding the certificate: %w", err)
	}
	return buf.Bytes(), nil // Encode ends with a newline
}

// Unmarshal reads a certificate strictly (package strictjson): no key may
// be given twice in any object, every key must be spelled exactly as this
// format defines it (a case variant is an unknown key), at every depth;
// the "format" field must be present and equal to Format (checked before
// the layout, so that a certificate of another version is reported as
// such); every section of the top level and of "results" must be present;
// nothing may follow the document; "problem" must be an object,
// "problem_sha256" 64 lowercase hex digits, eigenvalue indices increasing
// from ≥ 1, verdicts one of Holds, Fails, Undecided, and every bound
// readable by Bound.Interval. Reference certificates of claims are read
// the same way. The keys of "problem" and "method" are for their own
// readers (problem.Parse, the certification driver) to check; whether the
// digest matches the problem is for the re-check to decide.
// Errors are *FormatError with the JSON path of the defect, except JSON
// syntax errors, which are wrapped.
func Unmarshal(data []byte) (*Certificate, error) {
	root, dups, err := strictjson.Parse(data)
	if err != nil {
		return nil, fmt.Errorf("not a JSON certificate: %w (hint: give a .cert.json file written by gapcert)", err)
	}
	if len(dups) > 0 {
		return nil, AsFormatError("", dups[0])
	}
	if root.Kind != strictjson.Object {
		return nil, &FormatError{Msg: "a certificate is a JSON object, not " + root.Kind.String()}
	}
	format := root.Get("format")
	if format == nil {
		return nil, &FormatError{Msg: fmt.Sprintf("no \"format\" field; a gapcert certificate starts with \"format\": %q", Format)}
	}
	if format.Kind != strictjson.String || format.Str != Format {
		got := format.Str
		if format.Kind != strictjson.String {
			got = format.Kind.String()
		}
		return nil, &FormatError{Path: "format", Msg: fmt.Sprintf("certificate format %q is not supported; this version reads %q", got, Format)}
	}
	var c Certificate
	if err := strictjson.Decode(data, &c); err != nil {
		return nil, AsFormatError("", err)
	}
	if err := requireKeys(root, "", "format", "problem", "problem_sha256", "results", "claims", "method", "warnings", "provenance"); err != nil {
		return nil, err
	}
	if err := requireKeys(root.Get("results"), "results", "eigenvalues", "gap", "diameter", "gap_d2_over_pi2", "relative_widths"); err != nil {
		return nil, err
	}
	if err := c.validate(); err != nil {
		return nil, err
	}
	return &c, nil
}

// AsFormatError returns err, an error of a value read at the JSON path
// prefix, as a *FormatError: a FormatError or a strictjson.Error (other
// than a syntax error) keeps its path, under prefix; any other error gets
// the path prefix and its own message.
func AsFormatError(prefix string, err error) *FormatError {
	var se *strictjson.Error
	var fe *FormatError
	switch {
	case errors.As(err, &fe):
		return &FormatError{Path: strictjson.Under(prefix, fe.Path), Msg: fe.Msg}
	case errors.As(err, &se) && se.Line == 0:
		return &FormatError{Path: strictjson.Under(prefix, se.Path), Msg: se.Msg}
	}
	return &FormatError{Path: prefix, Msg: err.Error()}
}

// requireKeys checks that obj is an object with every key (read strictly
// already, so its keys are exact).
func requireKeys(obj *strictjson.Value, path string, keys ...string) error {
	if obj == nil || obj.Kind != strictjson.Object {
		return &FormatError{Path: path, Msg: "must be a JSON object"}
	}
	for _, k := range keys {
		if obj.Get(k) == nil {
			return &FormatError{Path: strictjson.Join(path, k), Msg: "missing"}
		}
	}
	return nil
}

func isObject(raw json.RawMessage) bool {
	v, _, err := strictjson.Parse(raw)
	return err == nil && v.Kind == strictjson.Object
}

// validate checks the values that the JSON layout alone does not.
func (c *Certificate) validate() error {
	if !isObject(c.Problem) {
		return &FormatError{Path: "problem", Msg: "must be a JSON object"}
	}
	if !isSHA256Hex(c.ProblemSHA256) {
		return &FormatError{Path: "problem_sha256", Msg: fmt.Sprintf("%q is not 64 lowercase hexadecimal digits", c.ProblemSHA256)}
	}
	bound := func(path string, b Bound) error {
		if _, err := b.Interval(); err != nil {
			return &FormatError{Path: path, Msg: err.Error()}
		}
		return nil
	}
	for i, e := range c.Results.Eigenvalues {
		path := fmt.Sprintf("results.eigenvalues[%d]", i)
		if e.Index < 1 || (i > 0 && e.Index <= c.Results.Eigenvalues[i-1].Index) {
			return &FormatError{Path: path + ".index", Msg: fmt.Sprintf("index %d is not a positive number above the previous index", e.Index)}
		}
		if err := bound(path, e.Bound()); err != nil {
			return err
		}
	}
	for _, nb := range []struct {
		path string
		b    Bound
	}{
		{"results.gap", c.Results.Gap},
		{"results.diameter", c.Results.Diameter},
		{"results.gap_d2_over_pi2", c.Results.GapD2OverPi2},
	} {
		if err := bound(nb.path, nb.b); err != nil {
			return err
		}
	}
	for i, r := range c.Claims {
		path := fmt.Sprintf("claims[%d]", i)
		if r.Text == "" {
			return &FormatError{Path: path + ".text", Msg: "empty claim"}
		}
		switch r.Verdict {
		case Holds, Fails, Undecided:
		default:
			return &FormatError{Path: path + ".verdict", Msg: fmt.Sprintf("%q is not one of %q, %q, %q", r.Verdict, Holds, Fails, Undecided)}
		}
		if err := bound(path+".margin", r.Margin); err != nil {
			return err
		}
		for j, h := range r.Hypotheses {
			if err := h.validate(fmt.Sprintf("%s.hypotheses[%d]", path, j)); err != nil {
				return err
			}
		}
		if r.Reference != nil {
			if err := r.Reference.validate(path + ".reference"); err != nil {
				return err
			}
		}
	}
	return nil
}

// validate checks a hypothesis verdict: a name, a known verdict, a detail,
// and a witness exactly when the verdict is Disproven.
func (h Hypothesis) validate(path string) error {
	switch {
	case h.Name == "":
		return &FormatError{Path: path + ".name", Msg: "empty hypothesis name"}
	case h.Detail == "":
		return &FormatError{Path: path + ".detail", Msg: "empty detail"}
	}
	switch h.Verdict {
	case Proven, Undecided:
		if h.Witness != nil {
			return &FormatError{Path: path + ".witness", Msg: fmt.Sprintf("a witness belongs to a %q hypothesis only", Disproven)}
		}
		return nil
	case Disproven:
	default:
		return &FormatError{Path: path + ".verdict", Msg: fmt.Sprintf("%q is not one of %q, %q, %q", h.Verdict, Proven, Disproven, Undecided)}
	}
	w := h.Witness
	if w == nil || w.Side == nil && w.Vertex == nil && len(w.Point) == 0 {
		return &FormatError{Path: path + ".witness", Msg: "a disproven hypothesis needs a witness (side, vertex or point)"}
	}
	if w.Side != nil && *w.Side < 0 || w.Vertex != nil && *w.Vertex < 0 {
		return &FormatError{Path: path + ".witness", Msg: "negative side or vertex index"}
	}
	if n := len(w.Point); n > 4 {
		return &FormatError{Path: path + ".witness.point", Msg: fmt.Sprintf("a point has one to four coordinates, not %d", n)}
	}
	for k, c := range w.Point {
		if c == "" {
			return &FormatError{Path: fmt.Sprintf("%s.witness.point[%d]", path, k), Msg: "empty coordinate"}
		}
	}
	return nil
}

// validate reads the referenced certificate strictly (Unmarshal) and
// demands that it has no references of its own, so that nesting stops at
// one level.
func (r *Reference) validate(path string) error {
	if r.Name == "" {
		return &FormatError{Path: path + ".name", Msg: "empty reference name"}
	}
	inner, err := Unmarshal(r.Certificate)
	if err != nil {
		return AsFormatError(path+".certificate", err)
	}
	for _, c := range inner.Claims {
		if c.Reference != nil {
			return &FormatError{Path: path + ".certificate", Msg: "a referenced certificate may not have references of its own"}
		}
	}
	return nil
}

// isSHA256Hex reports whether s is a SHA-256 digest in lowercase hex.
func isSHA256Hex(s string) bool {
	if len(s) != 64 {
		return false
	}
	for i := 0; i < len(s); i++ {
		if !('0' <= s[i] && s[i] <= '9' || 'a' <= s[i] && s[i] <= 'f') {
			return false
		}
	}
	return true
}
