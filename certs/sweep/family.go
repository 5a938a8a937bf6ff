package sweep

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"math/big"
	"strings"
	"time"

	"gapcert/certs/certify"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
	"gapcert/interval/decimalio"
)

// Limits of a family file.
const (
	// MaxPoints bounds the number of points of a family.
	MaxPoints = 100000
	// maxNumberText bounds the text of one parameter value.
	maxNumberText = 400
	// maxRatBits bounds the numerator and denominator of a value (about
	// 600 decimal digits; problem files allow exponents up to ±400).
	maxRatBits = 2000
	// maxFamilyFile bounds the size of a family file.
	maxFamilyFile = 1 << 20
)

// Family is a validated family file: a problem template and the parameter
// grid it is expanded over.
type Family struct {
	Name string
	// SHA256 is the hex SHA-256 of the family file's bytes.
	SHA256 string
	// Params are the swept parameters in expansion order.
	Params []Param
	// RelWidth is the relative width target of every point ("" = each
	// problem's own target), TimeLimit the refinement budget of every
	// point (0 = the certification default).
	RelWidth  string
	TimeLimit time.Duration
	// GroundState asks every point's certificate for its ground-state
	// block (certify.Options.GroundState, results.ground_state).
	GroundState bool
	// Points are all points of the family in expansion order.
	Points []*FamilyPoint

	data []byte // the family file as read
}

// Param is one swept parameter and its exact values.
type Param struct {
	Name   string
	Values []*big.Rat
}

// FamilyPoint is one expanded point: the parameter values and the parsed
// problem they give.
type FamilyPoint struct {
	Index int
	// Values are the exact values, one per parameter of the family.
	Values []*big.Rat
	// Problem is the template with the values substituted, parsed by
	// problem.Parse.
	Problem *problem.Problem
}

// ParamText returns the point's parameter values as exact text (see
// problem.RatText), keyed by name.
func (f *Family) ParamText(pt *FamilyPoint) map[string]string {
	m := make(map[string]string, len(f.Params))
	for i, p := range f.Params {
		m[p.Name] = problem.RatText(pt.Values[i])
	}
	return m
}

// ParamNames returns the parameter names in expansion order.
func (f *Family) ParamNames() []string {
	names := make([]string, len(f.Params))
	for i, p := range f.Params {
		names[i] = p.Name
	}
	return names
}

// InvalidError reports an invalid family file (or another invalid input of
// a sweep, such as a shard text): every defect found, each with its JSON
// path and a hint. Nothing has been computed or written when it is
// returned.
type InvalidError struct {
	Issues []problem.Issue
}

func (e *InvalidError) Error() string {
	lines := make([]string, len(e.Issues))
	for i, is := range e.Issues {
		lines[i] = is.String()
	}
	return strings.Join(lines, "\n")
}

func invalid(path, msg, hint string) *InvalidError {
	return &InvalidError{Issues: []problem.Issue{{Path: path, Msg: msg, Hint: hint}}}
}

// familyFile is the layout of a family file.
type familyFile struct {
	Name          string            `json:"name"`
	Template      json.RawMessage   `json:"template"`
	Parameters    []json.RawMessage `json:"parameters"`
	Claims        []string          `json:"claims"`
	RelativeWidth json.RawMessage   `json:"relative_width"`
	TimeLimit     *string           `json:"time_limit"`
	GroundState   *bool             `json:"ground_state"`
}

type paramFile struct {
	Name   string            `json:"name"`
	Range  *rangeFile        `json:"range"`
	Values []json.RawMessage `json:"values"`
}

type rangeFile struct {
	Lo    json.RawMessage `json:"lo"`
	Hi    json.RawMessage `json:"hi"`
	Count *int            `json:"count"`
}

// ParseFamily reads and validates a family file and expands it (see the
// package documentation for the format and the expansion order). Every
// point's problem is parsed strictly; the first defect of each kind is
// reported. Errors are *InvalidError.
func ParseFamily(data []byte) (*Family, error) {
	if len(data) > maxFamilyFile {
		return nil, invalid("", fmt.Sprintf("file too large (%d bytes, at most %d)", len(data), maxFamilyFile), "a family file is a few kilobytes")
	}
	var ff familyFile
	if err := strictjson.Decode(data, &ff); err != nil {
		path, msg := strictIssue("", err)
		return nil, invalid(path, msg, "a family file is one JSON object with the keys name, template, parameters, claims, relative_width, time_limit, ground_state, each once and spelled so")
	}
	sum := sha256.Sum256(data)
	f := &Family{Name: ff.Name, SHA256: hex.EncodeToString(sum[:]), data: append([]byte(nil), data...)}
	var iss []problem.Issue
	add := func(path, msg, hint string) { iss = append(iss, problem.Issue{Path: path, Msg: msg, Hint: hint}) }

	template, fixed := ReadTemplate(ff.Template, add)
	if len(ff.Parameters) == 0 {
		add("parameters", "no parameters to sweep", `write "parameters": [{"name": "a", "range": {"lo": "0", "hi": "1", "count": 5}}]`)
	}
	seen := map[string]bool{}
	total := 1
	for i, raw := range ff.Parameters {
		p, ok := readParam(raw, fmt.Sprintf("parameters[%d]", i), add)
		if !ok {
			continue
		}
		path := fmt.Sprintf("parameters[%d].name", i)
		switch {
		case seen[p.Name]:
			add(path, fmt.Sprintf("parameter %q is swept twice", p.Name), "list each parameter once")
			continue
		case fixed[p.Name]:
			add(path, fmt.Sprintf("parameter %q is also fixed in template.parameters", p.Name), "remove it from one of the two")
			continue
		}
		seen[p.Name] = true
		f.Params = append(f.Params, p)
		if total *= len(p.Values); total > MaxPoints {
			add("parameters", fmt.Sprintf("the grid has more than %d points", MaxPoints), "use fewer values or split the family")
			return nil, &InvalidError{Issues: iss}
		}
	}
	for i, c := range ff.Claims {
		if strings.TrimSpace(c) == "" {
			add(fmt.Sprintf("claims[%d]", i), "empty claim", `write a claim such as "gap >= 3*pi^2/D^2"`)
		}
	}
	if len(ff.RelativeWidth) > 0 {
		w, err := NumberText(ff.RelativeWidth)
		if err == nil {
			var r *big.Rat
			r, err = decimalio.ParseRat(w)
			if err == nil && (r.Sign() <= 0 || r.Cmp(big.NewRat(1, 1)) >= 0) {
				err = errors.New("must lie in (0, 1)")
			}
		}
		if err != nil {
			add("relative_width", NumberMessage(w, err), `write "relative_width": "0.05"`)
		} else {
			f.RelWidth = w
		}
	}
	if ff.TimeLimit != nil {
		d, err := time.ParseDuration(*ff.TimeLimit)
		if err != nil || d <= 0 {
			add("time_limit", fmt.Sprintf("%q is not a positive duration", *ff.TimeLimit), `write "time_limit": "30s"`)
		} else {
			f.TimeLimit = d
		}
	}
	if ff.GroundState != nil {
		f.GroundState = *ff.GroundState
	}
	if len(iss) > 0 || template == nil {
		return nil, &InvalidError{Issues: iss}
	}
	if iss = f.expand(template, ff.Claims); len(iss) > 0 {
		return nil, &InvalidError{Issues: iss}
	}
	return f, nil
}

// ReadTemplate checks that a family's template is a JSON object and
// returns its keys with the names of its fixed parameters; defects go to
// add. Family readers (this package, certs/cover) share it.
func ReadTemplate(raw json.RawMessage, add func(path, msg, hint string)) (map[string]json.RawMessage, map[string]bool) {
	if len(raw) == 0 {
		add("template", "missing template", `write "template": {"domain": …, "boundary": …} with the family's parameters used by name`)
		return nil, nil
	}
	var t map[string]json.RawMessage
	if err := strictjson.Decode(raw, &t); err != nil || t == nil {
		add("template", "the template must be a problem object", `write "template": {"domain": …, "boundary": …}`)
		return nil, nil
	}
	fixed := map[string]bool{}
	if pr, ok := t["parameters"]; ok {
		var m map[string]json.RawMessage
		if err := strictjson.Decode(pr, &m); err != nil || m == nil {
			add("template.parameters", "parameters must be an object", `write "parameters": {"k": "2"}`)
			return nil, nil
		}
		for k := range m {
			fixed[k] = true
		}
	}
	return t, fixed
}

// readParam reads one entry of "parameters": a name and either a range
// (lo, hi, count: count evenly spaced exact values lo + k(hi − lo)/(count − 1),
// or lo alone when count = 1 and lo = hi) or an explicit list of distinct
// exact values.
func readParam(raw json.RawMessage, path string, add func(path, msg, hint string)) (Param, bool) {
	var pf paramFile
	if err := strictjson.Decode(raw, &pf); err != nil {
		p, msg := strictIssue(path, err)
		add(p, msg, `write {"name": "a", "range": {"lo": "0", "hi": "1", "count": 5}} or {"name": "a", "values": ["0", "1/2"]}`)
		return Param{}, false
	}
	if pf.Name == "" {
		add(path+".name", "missing parameter name", `write "name": "a"`)
		return Param{}, false
	}
	p := Param{Name: pf.Name}
	switch {
	case pf.Range != nil && pf.Values != nil:
		add(path, "both a range and a list of values", "give exactly one of them")
		return Param{}, false
	case pf.Range != nil:
		vals, ok := readRange(pf.Range, path+".range", add)
		if !ok {
			return Param{}, false
		}
		p.Values = vals
	case pf.Values != nil:
		if len(pf.Values) == 0 {
			add(path+".values", "empty list of values", "give at least one value")
			return Param{}, false
		}
		seen := map[string]bool{}
		for i, v := range pf.Values {
			vp := fmt.Sprintf("%s.values[%d]", path, i)
			r, ok := ReadRat(v, vp, add)
			if !ok {
				return Param{}, false
			}
			if key := r.RatString(); seen[key] {
				add(vp, fmt.Sprintf("value %s is listed twice", problem.RatText(r)), "list each value once")
				return Param{}, false
			} else {
				seen[key] = true
			}
			p.Values = append(p.Values, r)
		}
	default:
		add(path, "neither a range nor a list of values", `add "range": {"lo": "0", "hi": "1", "count": 5} or "values": ["0", "1/2"]`)
		return Param{}, false
	}
	return p, true
}

func readRange(r *rangeFile, path string, add func(path, msg, hint string)) ([]*big.Rat, bool) {
	if len(r.Lo) == 0 || len(r.Hi) == 0 || r.Count == nil {
		add(path, "a range needs lo, hi and count", `write {"lo": "0", "hi": "1", "count": 5}`)
		return nil, false
	}
	lo, okLo := ReadRat(r.Lo, path+".lo", add)
	hi, okHi := ReadRat(r.Hi, path+".hi", add)
	if !okLo || !okHi {
		return nil, false
	}
	n := *r.Count
	c := lo.Cmp(hi)
	switch {
	case n < 1:
		add(path+".count", fmt.Sprintf("empty range: count is %d", n), "count is the number of values, at least 1")
		return nil, false
	case n > MaxPoints:
		add(path+".count", fmt.Sprintf("count %d exceeds %d", n, MaxPoints), "use fewer values")
		return nil, false
	case c > 0:
		add(path, fmt.Sprintf("empty range: lo %s is above hi %s", problem.RatText(lo), problem.RatText(hi)), "give lo ≤ hi")
		return nil, false
	case n == 1 && c != 0:
		add(path+".count", "count 1 needs lo = hi", "give count ≥ 2 to span [lo, hi], or lo = hi for a single value")
		return nil, false
	case n > 1 && c == 0:
		add(path+".count", fmt.Sprintf("count %d values of the one-point range [%s, %s]", n, problem.RatText(lo), problem.RatText(hi)), "give lo < hi, or count 1")
		return nil, false
	}
	if n == 1 {
		return []*big.Rat{lo}, true
	}
	step := new(big.Rat).Sub(hi, lo)
	step.Quo(step, big.NewRat(int64(n-1), 1))
	vals := make([]*big.Rat, n)
	for k := range vals {
		v := new(big.Rat).Mul(step, big.NewRat(int64(k), 1))
		vals[k] = v.Add(v, lo)
	}
	vals[n-1] = new(big.Rat).Set(hi)
	return vals, true
}

// ReadRat reads an exact rational written as a JSON number or string (at
// most 400 characters, numerator and denominator of at most 2000 bits);
// otherwise it reports the reason at path through add and returns false.
// Family readers (this package, certs/cover) share it.
func ReadRat(raw json.RawMessage, path string, add func(path, msg, hint string)) (*big.Rat, bool) {
	s, err := NumberText(raw)
	if err == nil {
		var r *big.Rat
		if r, err = decimalio.ParseRat(s); err == nil {
			if r.Num().BitLen() <= maxRatBits && r.Denom().BitLen() <= maxRatBits {
				return r, true
			}
			err = fmt.Errorf("%s is too large or too finely divided", s)
		}
	}
	add(path, NumberMessage(s, err), "write an exact decimal such as \"0.25\" or a fraction such as \"1/3\"")
	return nil, false
}

// NumberMessage says why the text s of a number was not read, with the
// column of a syntax error.
func NumberMessage(s string, err error) string {
	var se *decimalio.SyntaxError
	if errors.As(err, &se) {
		msg := fmt.Sprintf("%q is not a number: column %d: %s", s, se.Col, se.Msg)
		if se.Hint != "" {
			msg += " (" + se.Hint + ")"
		}
		return msg
	}
	return err.Error()
}

// NumberText returns the text of a JSON number or string, at most 400
// characters long.
func NumberText(raw json.RawMessage) (string, error) {
	raw = bytes.TrimSpace(raw)
	var s string
	switch {
	case len(raw) > 0 && raw[0] == '"':
		if err := strictjson.Decode(raw, &s); err != nil {
			return "", err
		}
	case len(raw) > 0 && (raw[0] == '-' || '0' <= raw[0] && raw[0] <= '9'):
		s = string(raw)
	default:
		return "", fmt.Errorf("want a number, not %s", raw)
	}
	if len(s) > maxNumberText {
		return "", fmt.Errorf("number too long (%d bytes, at most %d)", len(s), maxNumberText)
	}
	return s, nil
}

// expand builds and parses every point: the Cartesian product of the
// parameter values with the first parameter varying slowest (point index
// k = Σ_j i_j·Π_{l>j} n_l for value indices i_j). Point k is the template
// with the values added to its "parameters", the family's claims appended
// to its "claims", and its name followed by the values
// ("name [a=1/2, b=0.3]"). It returns the distinct defects found, each
// with the first point that showed it.
func (f *Family) expand(template map[string]json.RawMessage, claims []string) []problem.Issue {
	total := 1
	for _, p := range f.Params {
		total *= len(p.Values)
	}
	var iss []problem.Issue
	seen := map[string]bool{}
	var templateList []json.RawMessage
	_ = strictjson.Decode(template["claims"], &templateList) // a bad list is reported by problem.Parse
	templateClaims := len(templateList)
	idx := make([]int, len(f.Params))
	for k := 0; k < total; k++ {
		rem := k
		for j := len(f.Params) - 1; j >= 0; j-- {
			n := len(f.Params[j].Values)
			idx[j] = rem % n
			rem /= n
		}
		pt := &FamilyPoint{Index: k}
		for j, p := range f.Params {
			pt.Values = append(pt.Values, p.Values[idx[j]])
		}
		data, err := f.pointJSON(template, claims, pt)
		if err != nil {
			return []problem.Issue{{Path: "template", Msg: err.Error()}}
		}
		prob, err := problem.Parse(data)
		if err != nil {
			var perr *problem.Error
			if !errors.As(err, &perr) {
				return []problem.Issue{{Path: "template", Msg: err.Error()}}
			}
			for _, is := range perr.Issues {
				key := is.Path + "\x00" + is.Msg
				if seen[key] {
					continue
				}
				seen[key] = true
				is.Path = familyPath(is.Path, templateClaims)
				is.Msg = fmt.Sprintf("point %d (%s): %s", k, f.describe(pt), is.Msg)
				iss = append(iss, is)
			}
			if len(iss) >= 20 {
				return iss
			}
			continue
		}
		if err := certify.Supported(prob); err != nil {
			ue := err.(*certify.UnsupportedError)
			if !seen[ue.Reason] {
				seen[ue.Reason] = true
				iss = append(iss, problem.Issue{Path: familyPath(ue.Path, templateClaims), Msg: fmt.Sprintf("point %d (%s): %s", k, f.describe(pt), ue.Reason), Hint: ue.Hint})
			}
			continue
		}
		pt.Problem = prob
		f.Points = append(f.Points, pt)
	}
	// Every point has the same claims; one naming shape_margin needs the
	// ground-state block (certify.GroundStateClaim).
	if len(f.Points) > 0 && !f.GroundState {
		if i := certify.GroundStateClaim(f.Points[0].Problem); i >= 0 {
			iss = append(iss, problem.Issue{Path: familyPath(fmt.Sprintf("claims[%d]", i), templateClaims),
				Msg:  fmt.Sprintf("claim %q names shape_margin, which only results.ground_state provides", f.Points[0].Problem.Claims[i]),
				Hint: `set "ground_state": true`})
		}
	}
	return iss
}

// familyPath returns the path in the family file of a point's problem
// path: "claims[k]" with k ≥ templateClaims is the family's claim
// k − templateClaims (appended to the template's), any other path lies
// under "template".
func familyPath(path string, templateClaims int) string {
	var k int
	if n, err := fmt.Sscanf(path, "claims[%d]", &k); err == nil && n == 1 && path == fmt.Sprintf("claims[%d]", k) && k >= templateClaims {
		return fmt.Sprintf("claims[%d]", k-templateClaims)
	}
	return strings.TrimSuffix("template."+path, ".")
}

// describe returns "a=1/2, b=0.3" for a point.
func (f *Family) describe(pt *FamilyPoint) string {
	parts := make([]string, len(f.Params))
	for j, p := range f.Params {
		parts[j] = p.Name + "=" + problem.RatText(pt.Values[j])
	}
	return strings.Join(parts, ", ")
}

// pointJSON returns the problem file of one point.
func (f *Family) pointJSON(template map[string]json.RawMessage, claims []string, pt *FamilyPoint) ([]byte, error) {
	obj := make(map[string]any, len(template)+2)
	for k, v := range template {
		obj[k] = v
	}
	params := map[string]json.RawMessage{}
	if raw, ok := template["parameters"]; ok {
		if err := strictjson.Decode(raw, &params); err != nil {
			return nil, err
		}
	}
	for j, p := range f.Params {
		text, _ := json.Marshal(problem.RatText(pt.Values[j]))
		params[p.Name] = text
	}
	obj["parameters"] = params
	if len(claims) > 0 {
		var all []json.RawMessage
		if raw, ok := template["claims"]; ok {
			if err := strictjson.Decode(raw, &all); err != nil {
				return nil, fmt.Errorf("claims must be a list of strings")
			}
		}
		for _, c := range claims {
			text, _ := json.Marshal(c)
			all = append(all, text)
		}
		obj["claims"] = all
	}
	name := ""
	if raw, ok := template["name"]; ok {
		if err := strictjson.Decode(raw, &name); err != nil {
			return nil, fmt.Errorf("name must be a string")
		}
	}
	label := "[" + f.describe(pt) + "]"
	if name != "" {
		label = name + " " + label
	}
	obj["name"] = label
	return json.Marshal(obj)
}

// strictIssue returns the path (under prefix) and message of an error of
// strictjson.Decode.
func strictIssue(prefix string, err error) (path, msg string) {
	var se *strictjson.Error
	if errors.As(err, &se) && se.Line == 0 {
		return strictjson.Under(prefix, se.Path), se.Msg
	}
	return prefix, err.Error()
}
