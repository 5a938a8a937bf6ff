package cover

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"math/big"
	"strings"
	"time"

	"gapcert/certs/certify"
	"gapcert/certs/sweep"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
	"gapcert/interval/decimalio"
)

// Limits of a family file.
const (
	// MaxParams bounds the number of covered parameters (a cell has 2^n
	// corners; the family's 2^n box corners are parsed when it is read).
	MaxParams = 6
	// MaxRoots bounds the number of boxes of the first split (the product
	// of the counts).
	MaxRoots = 10000
	// MaxDepth bounds the number of bisections of one parameter from a
	// box of the first split down to its smallest cells.
	MaxDepth = 40
	// maxNumberText bounds the text of one number.
	maxNumberText = 400
	// maxFamilyFile bounds the size of a family file.
	maxFamilyFile = 1 << 20
)

// Family is a validated cover family: a problem template and the box of
// parameter values it is covered over.
type Family struct {
	Name string
	// SHA256 is the hex SHA-256 of the family file's bytes.
	SHA256 string
	// Params are the swept parameters, in the file's order.
	Params []Param
	// Claims are the claims of every problem of the family (the
	// template's, then the family's), as the corner problems state them.
	Claims []string
	// RelWidth is the relative width target of every corner ("" = the
	// template's own), TimeLimit the budget of every corner (0 = the
	// certification default).
	RelWidth  string
	TimeLimit time.Duration

	data     []byte                     // the family file as read
	template map[string]json.RawMessage // the template object
	claims   []string                   // the family's own claims, appended to the template's
	// Dependences say, per parameter, how the problem depends on it (the
	// rules of rules.go), decided over the whole box.
	Dependences []Dependence
}

// Param is one swept parameter: its range [Lo, Hi], the smallest cell
// width MinCell and the number of parts Count of the first split.
type Param struct {
	Name    string
	Lo, Hi  *big.Rat
	MinCell *big.Rat
	Count   int
}

// Data returns the family file's bytes.
func (f *Family) Data() []byte { return append([]byte(nil), f.data...) }

// ParamNames returns the parameter names in the file's order.
func (f *Family) ParamNames() []string {
	names := make([]string, len(f.Params))
	for i, p := range f.Params {
		names[i] = p.Name
	}
	return names
}

// InvalidError reports an invalid family file: every defect found, each
// with its JSON path and a hint. Nothing has been computed or written
// when it is returned. It is the error of sweep family files, whose layout
// a cover family shares.
type InvalidError = sweep.InvalidError

func invalid(path, msg, hint string) *InvalidError {
	return &InvalidError{Issues: []problem.Issue{{Path: path, Msg: msg, Hint: hint}}}
}

type familyFile struct {
	Name          string            `json:"name"`
	Template      json.RawMessage   `json:"template"`
	Parameters    []json.RawMessage `json:"parameters"`
	Claims        []string          `json:"claims"`
	RelativeWidth json.RawMessage   `json:"relative_width"`
	TimeLimit     *string           `json:"time_limit"`
}

type paramFile struct {
	Name    string          `json:"name"`
	Range   *rangeFile      `json:"range"`
	MinCell json.RawMessage `json:"min_cell"`
}

type rangeFile struct {
	Lo    json.RawMessage `json:"lo"`
	Hi    json.RawMessage `json:"hi"`
	Count *int            `json:"count"`
}

const familyKeys = "a cover family is one JSON object with the keys name, template, parameters, claims, relative_width, time_limit, each once and spelled so"

// ParseFamily reads and validates a cover family file (see the package
// documentation for the format) and decides, before anything is
// certified, how every eigenvalue depends on each parameter over the
// whole box (the rules of rules.go). A parameter that no rule covers is
// refused with the reason. Errors are *InvalidError.
func ParseFamily(data []byte) (*Family, error) {
	if len(data) > maxFamilyFile {
		return nil, invalid("", fmt.Sprintf("file too large (%d bytes, at most %d)", len(data), maxFamilyFile), "a family file is a few kilobytes")
	}
	var ff familyFile
	if err := strictjson.Decode(data, &ff); err != nil {
		path, msg := strictIssue("", err)
		return nil, invalid(path, msg, familyKeys)
	}
	sum := sha256.Sum256(data)
	f := &Family{Name: ff.Name, SHA256: hex.EncodeToString(sum[:]), data: append([]byte(nil), data...), claims: ff.Claims}
	var iss []problem.Issue
	add := func(path, msg, hint string) { iss = append(iss, problem.Issue{Path: path, Msg: msg, Hint: hint}) }

	template, fixed := sweep.ReadTemplate(ff.Template, add)
	if len(ff.Parameters) == 0 {
		add("parameters", "no parameters to cover", `write "parameters": [{"name": "alpha", "range": {"lo": "0", "hi": "10"}, "min_cell": "1/64"}]`)
	}
	if len(ff.Parameters) > MaxParams {
		add("parameters", fmt.Sprintf("%d parameters; a cover takes at most %d", len(ff.Parameters), MaxParams), "fix some parameters in template.parameters")
		return nil, &InvalidError{Issues: iss}
	}
	seen := map[string]bool{}
	roots := 1
	for i, raw := range ff.Parameters {
		path := fmt.Sprintf("parameters[%d]", i)
		p, ok := readParam(raw, path, add)
		if !ok {
			continue
		}
		switch {
		case seen[p.Name]:
			add(path+".name", fmt.Sprintf("parameter %q is covered twice", p.Name), "list each parameter once")
			continue
		case fixed[p.Name]:
			add(path+".name", fmt.Sprintf("parameter %q is also fixed in template.parameters", p.Name), "remove it from one of the two")
			continue
		}
		seen[p.Name] = true
		f.Params = append(f.Params, p)
		if roots *= p.Count; roots > MaxRoots {
			add("parameters", fmt.Sprintf("the first split has more than %d boxes", MaxRoots), "use smaller counts")
			return nil, &InvalidError{Issues: iss}
		}
	}
	for i, c := range ff.Claims {
		if strings.TrimSpace(c) == "" {
			add(fmt.Sprintf("claims[%d]", i), "empty claim", `write a claim such as "gap >= 3*pi^2/D^2"`)
		}
	}
	if len(ff.RelativeWidth) > 0 {
		w, err := sweep.NumberText(ff.RelativeWidth)
		if err == nil {
			var r *big.Rat
			r, err = decimalio.ParseRat(w)
			if err == nil && (r.Sign() <= 0 || r.Cmp(big.NewRat(1, 1)) >= 0) {
				err = errors.New("must lie in (0, 1)")
			}
		}
		if err != nil {
			add("relative_width", sweep.NumberMessage(w, err), `write "relative_width": "1e-6"`)
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
	if len(iss) > 0 || template == nil {
		return nil, &InvalidError{Issues: iss}
	}
	f.template = template
	// Every corner of the box must be a valid problem: a Robin coefficient
	// or a potential that is invalid at a corner makes the family invalid.
	box := f.Box()
	for _, corner := range box.allCorners() {
		p, err := f.Problem(corner)
		if err != nil {
			return nil, err
		}
		f.Claims = p.Claims
		if i := certify.GroundStateClaim(p); i >= 0 {
			return nil, invalid("claims", fmt.Sprintf("claim %q names shape_margin, which only a certificate's ground-state block provides; a cover does not certify ground states", p.Claims[i]), "remove the claim, or sample it with a sweep")
		}
		var unsup *certify.UnsupportedError
		if err := certify.Supported(p); errors.As(err, &unsup) {
			return nil, invalid("template."+unsup.Path, unsup.Reason, unsup.Hint)
		}
	}
	deps, err := analyse(f)
	if err != nil {
		return nil, err
	}
	f.Dependences = deps
	return f, nil
}

// readParam reads one entry of "parameters": a name, a range lo < hi with
// an optional count (the first split, default 1) and min_cell, the width
// below which a cell is not split (0 < min_cell ≤ hi − lo).
func readParam(raw json.RawMessage, path string, add func(path, msg, hint string)) (Param, bool) {
	const hint = `write {"name": "alpha", "range": {"lo": "0", "hi": "10"}, "min_cell": "1/64"}`
	var pf paramFile
	if err := strictjson.Decode(raw, &pf); err != nil {
		p, msg := strictIssue(path, err)
		add(p, msg, hint)
		return Param{}, false
	}
	if pf.Name == "" {
		add(path+".name", "missing parameter name", `write "name": "alpha"`)
		return Param{}, false
	}
	p := Param{Name: pf.Name, Count: 1}
	if pf.Range == nil {
		add(path+".range", fmt.Sprintf("parameter %q has no range", pf.Name), "a cover needs a range for every parameter: "+hint)
		return Param{}, false
	}
	if len(pf.Range.Lo) == 0 || len(pf.Range.Hi) == 0 {
		add(path+".range", "a range needs lo and hi", `write {"lo": "0", "hi": "10"}`)
		return Param{}, false
	}
	lo, okLo := sweep.ReadRat(pf.Range.Lo, path+".range.lo", add)
	hi, okHi := sweep.ReadRat(pf.Range.Hi, path+".range.hi", add)
	if !okLo || !okHi {
		return Param{}, false
	}
	if lo.Cmp(hi) >= 0 {
		add(path+".range", fmt.Sprintf("empty range: lo %s is not below hi %s", problem.RatText(lo), problem.RatText(hi)), "a cover needs lo < hi (a fixed value belongs in template.parameters)")
		return Param{}, false
	}
	p.Lo, p.Hi = lo, hi
	if pf.Range.Count != nil {
		p.Count = *pf.Range.Count
		if p.Count < 1 || p.Count > MaxRoots {
			add(path+".range.count", fmt.Sprintf("count %d is not between 1 and %d", p.Count, MaxRoots), "count is the number of equal parts of the first split")
			return Param{}, false
		}
		if !onlyTwosAndFives(p.Count) {
			add(path+".range.count", fmt.Sprintf("count %d has a prime factor other than 2 and 5", p.Count), "coverage fractions are exact decimals only when every count is 2^i·5^j (1, 2, 4, 5, 8, 10, …)")
			return Param{}, false
		}
	}
	if len(pf.MinCell) == 0 {
		add(path+".min_cell", fmt.Sprintf("parameter %q has no min_cell", pf.Name), `give the width below which cells are not split, e.g. "min_cell": "1/64"`)
		return Param{}, false
	}
	mc, ok := sweep.ReadRat(pf.MinCell, path+".min_cell", add)
	if !ok {
		return Param{}, false
	}
	width := new(big.Rat).Sub(hi, lo)
	switch {
	case mc.Sign() <= 0:
		add(path+".min_cell", fmt.Sprintf("min_cell %s is not positive", problem.RatText(mc)), "give a positive width, e.g. \"1/64\"")
		return Param{}, false
	case mc.Cmp(width) > 0:
		add(path+".min_cell", fmt.Sprintf("min_cell %s is larger than the range [%s, %s] (width %s)", problem.RatText(mc), problem.RatText(lo), problem.RatText(hi), problem.RatText(width)), "give a min_cell at most hi − lo")
		return Param{}, false
	}
	// Depth: the number of halvings from the first split's width to at
	// most min_cell.
	w := new(big.Rat).Quo(width, big.NewRat(int64(p.Count), 1))
	depth := 0
	for w.Cmp(mc) > 0 {
		w.Quo(w, big.NewRat(2, 1))
		if depth++; depth > MaxDepth {
			add(path+".min_cell", fmt.Sprintf("min_cell %s needs more than %d bisections of the range", problem.RatText(mc), MaxDepth), "give a larger min_cell")
			return Param{}, false
		}
	}
	if n := gridTextBound(lo, hi, p.Count, depth); n > maxNumberText {
		add(path+".range", fmt.Sprintf("the bounds of cells down to min_cell (%d bisections of the first split's boxes) may need %d characters, more than the %d a number of a problem may have", depth, n, maxNumberText), "give lo and hi shorter exact texts, or a larger min_cell")
		return Param{}, false
	}
	p.MinCell = mc
	return p, true
}

func strictIssue(prefix string, err error) (path, msg string) {
	var se *strictjson.Error
	if errors.As(err, &se) && se.Line == 0 {
		return strictjson.Under(prefix, se.Path), se.Msg
	}
	return prefix, err.Error()
}

// Problem returns the problem of the family at the exact parameter values
// (one per parameter, in order): the template with the values added to its
// "parameters", the family's claims appended to its "claims", its name
// followed by the values, and the family's relative width as its target
// when the family sets one. Errors are *InvalidError with the template's
// paths.
func (f *Family) Problem(values []*big.Rat) (*problem.Problem, error) {
	data, err := f.pointJSON(values)
	if err != nil {
		return nil, invalid("template", err.Error(), "")
	}
	p, err := problem.Parse(data)
	if err != nil {
		var perr *problem.Error
		if !errors.As(err, &perr) {
			return nil, invalid("template", err.Error(), "")
		}
		var iss []problem.Issue
		for _, is := range perr.Issues {
			is.Path = strings.TrimSuffix("template."+is.Path, ".")
			is.Msg = fmt.Sprintf("at %s: %s", f.describe(values), is.Msg)
			iss = append(iss, is)
		}
		return nil, &InvalidError{Issues: iss}
	}
	return p, nil
}

// describe returns "a=1/2, b=0.3".
func (f *Family) describe(values []*big.Rat) string {
	parts := make([]string, len(f.Params))
	for j, p := range f.Params {
		parts[j] = p.Name + "=" + problem.RatText(values[j])
	}
	return strings.Join(parts, ", ")
}

// pointJSON returns the problem file at the given values.
func (f *Family) pointJSON(values []*big.Rat) ([]byte, error) {
	obj := make(map[string]any, len(f.template)+2)
	for k, v := range f.template {
		obj[k] = v
	}
	params := map[string]json.RawMessage{}
	if raw, ok := f.template["parameters"]; ok {
		if err := strictjson.Decode(raw, &params); err != nil {
			return nil, err
		}
	}
	for j, p := range f.Params {
		text, _ := json.Marshal(problem.RatText(values[j]))
		params[p.Name] = text
	}
	obj["parameters"] = params
	if len(f.claims) > 0 {
		var all []json.RawMessage
		if raw, ok := f.template["claims"]; ok {
			if err := strictjson.Decode(raw, &all); err != nil {
				return nil, fmt.Errorf("claims must be a list of strings")
			}
		}
		for _, c := range f.claims {
			text, _ := json.Marshal(c)
			all = append(all, text)
		}
		obj["claims"] = all
	}
	if f.RelWidth != "" {
		target := map[string]string{"relative_width": f.RelWidth}
		obj["target"] = target
	}
	name := ""
	if raw, ok := f.template["name"]; ok {
		if err := strictjson.Decode(raw, &name); err != nil {
			return nil, fmt.Errorf("name must be a string")
		}
	}
	label := "[" + f.describe(values) + "]"
	if name != "" {
		label = name + " " + label
	}
	obj["name"] = label
	return json.Marshal(obj)
}

// onlyTwosAndFives reports whether n > 0 has no prime factor but 2 and 5.
// Every cell of a cover is a box of the first split (count_j equal parts
// per parameter) bisected some number of times, so its measure is a
// fraction of the box with denominator Π count_j · 2^m; such a fraction has
// a terminating decimal expansion exactly when the denominator has no
// prime factor but 2 and 5.
func onlyTwosAndFives(n int) bool {
	for n%2 == 0 {
		n /= 2
	}
	for n%5 == 0 {
		n /= 5
	}
	return n == 1
}
