package cover

import (
	"encoding/json"
	"fmt"
	"math"
	"regexp"
	"sort"
	"strings"

	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// A Rule accounts for how one part of the problem (a top-level key of the
// family's template) depends on the covered parameters, and proves an
// order of the eigenvalues in them: Order returns, for parameter j, each
// place of the part that uses it with the sign s of that use over the
// whole box (s = +1: every eigenvalue is nondecreasing in the parameter
// through that use; −1: nonincreasing; 0: the use does not change the
// operator), or an error saying why no order is proved. A family whose
// template uses a parameter in a part that no rule accounts for is
// refused before anything is certified (analyse).
//
// RobinRule (Robin coefficients) and PotentialRule (the potential) order
// eigenvalues by the min–max principle (the comparison lemma, stated and
// proved in the package documentation). GeometryRule (the vertices of a
// triangle, part "domain") bounds λ_k over a cell by multiples of the
// λ_k of the triangle at the cell's centre instead of an order; its uses
// have sign 0, and Corners and cellQuantities treat it apart.
type Rule interface {
	// Name is the rule's name as cell certificates record it.
	Name() string
	// Part is the top-level template key whose parameters it accounts for.
	Part() string
	// Order returns the uses of parameter j in the part and their signs
	// over the family's box; ref is the problem at the box's lowest corner
	// (any point of the box serves for what does not depend on j).
	Order(f *Family, ref *problem.Problem, j int) ([]Use, error)
}

// Use is one place where a parameter enters the problem, and the sign of
// its effect on the eigenvalues over the box.
type Use struct {
	// Path is the place in the template ("boundary[1].robin", "potential").
	Path string `json:"path"`
	// Rule is the name of the rule that accounts for it.
	Rule string `json:"rule"`
	// Sign is +1 (eigenvalues nondecreasing in the parameter through this
	// use), −1 (nonincreasing) or 0 (no effect; for the geometry rule: no
	// order, the cell is bounded through its reference triangle).
	Sign int `json:"sign"`
	// Derivative encloses the derivative of the coefficient in the
	// parameter over the box (over the domain's bounding box too for the
	// potential), hull of the pieces the sign was decided on.
	Derivative [2]string `json:"derivative"`
}

// Dependence is how the eigenvalues depend on one covered parameter over
// the whole box: Direction +1 (nondecreasing), −1 (nonincreasing) or 0
// (independent: the parameter enters only claims or the width target).
type Dependence struct {
	Param     string `json:"parameter"`
	Direction int    `json:"direction"`
	Uses      []Use  `json:"uses"`
}

// Rules are the rules a cover applies, by the template part each accounts
// for.
var Rules = []Rule{RobinRule{}, PotentialRule{}, GeometryRule{}}

// Template parts that use parameters without changing the operator: the
// claims (evaluated over the cell's enclosures), the width target, the
// name, the fixed parameters and the points (used by the ground-state
// block only, which a cover does not certify).
var inertParts = map[string]string{
	"claims":      "claims are evaluated over each cell's enclosures",
	"target":      "the width target does not change the operator",
	"name":        "",
	"parameters":  "",
	"points":      "points serve only the ground-state block, which a cover does not certify",
	"eigenvalues": "",
}

var identifier = regexp.MustCompile(`[A-Za-z_][A-Za-z0-9_]*`)

// analyse decides the Dependence of every parameter over the family's
// whole box, before anything is certified. It refuses (with an
// *InvalidError naming the parameter and saying why) a parameter used in
// a part that no rule accounts for, a use whose sign (or, for the
// geometry rule, whose hypotheses) a rule cannot decide, and uses of
// opposite signs.
func analyse(f *Family) ([]Dependence, error) {
	box := f.Box()
	ref, err := f.Problem(box.Lo)
	if err != nil {
		return nil, err
	}
	used := templateUses(f.template)
	ruleOf := map[string]Rule{}
	for _, r := range Rules {
		ruleOf[r.Part()] = r
	}
	var deps []Dependence
	var iss []problem.Issue
	for j, p := range f.Params {
		dep := Dependence{Param: p.Name}
		for _, part := range sortedKeys(used) {
			paths := used[part][p.Name]
			if len(paths) == 0 {
				continue
			}
			if _, ok := inertParts[part]; ok {
				continue
			}
			if _, ok := ruleOf[part]; ok {
				continue
			}
			why := fmt.Sprintf("no rule bounds the eigenvalues over a cell of %s", partWords(part))
			iss = append(iss, problem.Issue{Path: fmt.Sprintf("parameters[%d]", j),
				Msg:  fmt.Sprintf("parameter %q enters template.%s: %s (rules today: Robin coefficients, the potential and the vertices of a triangle)", p.Name, paths[0], why),
				Hint: "fix the parameter in template.parameters and cover the others, or sample it with a sweep"})
		}
		for _, r := range Rules {
			if len(used[r.Part()][p.Name]) == 0 {
				continue
			}
			uses, err := r.Order(f, ref, j)
			if err != nil {
				hint := "split the range where the dependence changes direction into separate families, or fix the parameter"
				if r.Part() == "domain" {
					hint = "the geometry rule covers nondegenerate triangles with Dirichlet and Neumann sides and a constant V; fix the parameter or sample it with a sweep"
				}
				iss = append(iss, problem.Issue{Path: fmt.Sprintf("parameters[%d]", j),
					Msg: fmt.Sprintf("parameter %q: %v", p.Name, err), Hint: hint})
				continue
			}
			dep.Uses = append(dep.Uses, uses...)
		}
		up, down := true, true
		for _, u := range dep.Uses {
			up = up && u.Sign >= 0
			down = down && u.Sign <= 0
		}
		switch {
		case up && down:
			dep.Direction = 0
		case up:
			dep.Direction = 1
		case down:
			dep.Direction = -1
		default:
			var inc, dec []string
			for _, u := range dep.Uses {
				if u.Sign > 0 {
					inc = append(inc, u.Path)
				} else if u.Sign < 0 {
					dec = append(dec, u.Path)
				}
			}
			iss = append(iss, problem.Issue{Path: fmt.Sprintf("parameters[%d]", j),
				Msg: fmt.Sprintf("parameter %q raises the operator through %s but lowers it through %s: the eigenvalues are not ordered in %s",
					p.Name, strings.Join(inc, ", "), strings.Join(dec, ", "), p.Name),
				Hint: "no rule covers opposite dependences; fix the parameter or sample it with a sweep"})
		}
		deps = append(deps, dep)
	}
	if len(iss) > 0 {
		return nil, &InvalidError{Issues: iss}
	}
	return deps, nil
}

func partWords(part string) string {
	return "parameters used in template." + part
}

func sortedKeys[V any](m map[string]V) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// templateUses returns, for each top-level key of the template, the
// identifiers that occur in its strings and numbers with the paths where
// they occur (an over-approximation of the parameters it uses: any
// identifier counts, so a use is never missed).
func templateUses(t map[string]json.RawMessage) map[string]map[string][]string {
	out := map[string]map[string][]string{}
	for key, raw := range t {
		m := map[string][]string{}
		var v any
		if err := strictjson.Decode(raw, &v); err == nil {
			walkJSON(v, key, func(path, text string) {
				for _, id := range identifier.FindAllString(text, -1) {
					m[id] = append(m[id], path)
				}
			})
		}
		out[key] = m
	}
	return out
}

func walkJSON(v any, path string, leaf func(path, text string)) {
	switch x := v.(type) {
	case map[string]any:
		for _, k := range sortedKeys(x) {
			walkJSON(x[k], path+"."+k, leaf)
		}
	case []any:
		for i, e := range x {
			walkJSON(e, fmt.Sprintf("%s[%d]", path, i), leaf)
		}
	case string:
		leaf(path, x)
	case json.Number:
		leaf(path, string(x))
	}
}

// RobinRule orders eigenvalues in a parameter that enters Robin
// coefficients α_i(p) (a side's own or a coefficient shared by sides):
// when every ∂α_i/∂p has one sign s over the box (decided by interval
// evaluation of the derivative, package interval/formula, subdividing the
// box), the quadratic form a(u,u) + Σ_i ∫_{Γ_i} α_i u² is monotone in p
// with sign s for every u, so by the comparison lemma (package
// documentation) every
// λ_k is monotone in p with sign s.
type RobinRule struct{}

// Name implements Rule.
func (RobinRule) Name() string { return "robin_coefficient" }

// Part implements Rule.
func (RobinRule) Part() string { return "boundary" }

// Order implements Rule.
func (r RobinRule) Order(f *Family, ref *problem.Problem, j int) ([]Use, error) {
	name := f.Params[j].Name
	box := paramBox(f, f.Box(), ref)
	var uses []Use
	for i, bc := range ref.Boundary {
		if bc.Kind != boundary.Robin {
			continue
		}
		e, err := formula.Parse(bc.Alpha.Text)
		if err != nil {
			return nil, fmt.Errorf("the Robin coefficient %q of side %d does not read as a formula: %v", bc.Alpha.Text, i, err)
		}
		if !mentions(e, name) {
			continue
		}
		path := fmt.Sprintf("boundary[%d].robin", templateSide(f, ref, i))
		sign, d, err := decideSign(e, box, name, "∂α/∂"+name+" of "+path)
		if err != nil {
			return nil, err
		}
		uses = append(uses, Use{Path: path, Rule: r.Name(), Sign: sign, Derivative: boundText(d)})
	}
	return uses, nil
}

// templateSide returns the template's index of side i of the
// (counterclockwise) problem.
func templateSide(f *Family, p *problem.Problem, i int) int {
	if p.Dim == 2 && p.Reversed() {
		n := len(p.Boundary)
		return ((n-1-i)%n + n) % n
	}
	return i
}

// PotentialRule orders eigenvalues in a parameter that enters the
// potential V(x; p): when ∂V/∂p has one sign s on the domain's bounding
// box × the parameter box (interval evaluation of the derivative,
// subdividing both), V(·; p) is pointwise monotone in p with sign s, so
// is ∫ V u² for every u, and by the comparison lemma (package
// documentation) so is
// every λ_k. Several parameters: each by its own sign (the product order
// of the box).
type PotentialRule struct{}

// Name implements Rule.
func (PotentialRule) Name() string { return "potential_coefficient" }

// Part implements Rule.
func (PotentialRule) Part() string { return "potential" }

// Order implements Rule.
func (r PotentialRule) Order(f *Family, ref *problem.Problem, j int) ([]Use, error) {
	name := f.Params[j].Name
	e, err := formula.Parse(ref.PotentialText())
	if err != nil {
		return nil, fmt.Errorf("the potential %q does not read as a formula: %v", ref.PotentialText(), err)
	}
	if !mentions(e, name) {
		return nil, nil
	}
	box := paramBox(f, f.Box(), ref)
	lo, hi := boundingBox(ref)
	for c, name := range []string{"x", "y", "z"}[:ref.Dim] {
		box[name] = interval.I{Lo: lo[c], Hi: hi[c]}
	}
	sign, d, err := decideSign(e, box, name, "∂V/∂"+name)
	if err != nil {
		return nil, err
	}
	return []Use{{Path: "potential", Rule: r.Name(), Sign: sign, Derivative: boundText(d)}}, nil
}

func mentions(e *formula.Expr, name string) bool {
	for _, v := range e.Vars() {
		if v == name {
			return true
		}
	}
	return false
}

// paramBox returns the enclosures of every parameter over b: the covered
// ones over their ranges, the template's fixed ones at their values.
func paramBox(f *Family, b Box, ref *problem.Problem) map[string]interval.I {
	env := map[string]interval.I{}
	for name, v := range ref.Params {
		env[name] = v.Val
	}
	for j, p := range f.Params {
		env[p.Name] = b.Enclosure(j)
	}
	return env
}

// boundingBox encloses the domain's bounding box: [a, b] for an interval,
// the hull of the vertex enclosures for a polygon or a polyhedron (the
// first Dim coordinates are set).
func boundingBox(p *problem.Problem) (lo, hi [3]float64) {
	if p.Dim == 1 {
		return [3]float64{p.Interval[0].Val.Lo}, [3]float64{p.Interval[1].Val.Hi}
	}
	lo = [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi = [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	add := func(c int, v problem.Number) {
		lo[c] = math.Min(lo[c], v.Val.Lo)
		hi[c] = math.Max(hi[c], v.Val.Hi)
	}
	for _, v := range p.Vertices {
		add(0, v[0])
		add(1, v[1])
	}
	if ph := p.Polyhedron; ph != nil {
		for _, v := range ph.Vertices {
			add(0, v[0])
			add(1, v[1])
			add(2, v[2])
		}
	}
	return lo, hi
}

func boundText(x interval.I) [2]string {
	b := newBound(x)
	return [2]string{b.Lower, b.Upper}
}

// maxSignPieces bounds the boxes decideSign evaluates.
const maxSignPieces = 4096

// decideSign decides the sign of ∂e/∂wrt over the box env: +1 when the
// derivative is ≥ 0 on every piece of a subdivision of the box, −1 when ≤
// 0 on every piece, 0 when it is 0 on every piece; each piece's
// derivative is enclosed by forward-mode interval differentiation
// (formula.Gradient), which contains the exact derivative at every point
// of the piece. Pieces where the enclosure straddles 0 (or where e is not
// known to be smooth) are bisected in their widest variable, up to
// maxSignPieces evaluations. It returns the hull of the enclosures on the
// pieces where the sign was decided (which cover the box), or an
// error saying why no sign is proved: pieces of opposite strict signs
// (the derivative takes both signs; the pieces are named) or a
// subdivision that did not decide.
func decideSign(e *formula.Expr, env map[string]interval.I, wrt, what string) (int, interval.I, error) {
	vars := e.Vars()
	pieces := []map[string]interval.I{env}
	var hull interval.I
	have := false
	pos, neg, zero := 0, 0, 0
	var posBox, negBox map[string]interval.I
	evals := 0
	var lastErr error
	for len(pieces) > 0 {
		b := pieces[0] // breadth first: the pieces shrink evenly
		pieces = pieces[1:]
		evals++
		g, err := e.Gradient(b, []string{wrt})
		if err == nil && !(isFinite(g[0])) {
			err = fmt.Errorf("unbounded enclosure")
		}
		decided := false
		if err == nil {
			d := g[0]
			switch {
			case d.Lo == 0 && d.Hi == 0:
				zero++
				decided = true
			case d.Lo >= 0:
				pos++
				decided = true
				if d.Lo > 0 && posBox == nil {
					posBox = b
				}
			case d.Hi <= 0:
				neg++
				decided = true
				if d.Hi < 0 && negBox == nil {
					negBox = b
				}
			}
			if decided {
				// The pieces decided cover the box: their hull encloses
				// the derivative on it.
				if !have {
					hull, have = d, true
				} else {
					hull = hull.Hull(d)
				}
			}
		} else {
			lastErr = err
		}
		if posBox != nil && negBox != nil {
			return 0, hull, fmt.Errorf("%s takes both signs: it is > 0 on %s and < 0 on %s", what, boxWords(posBox, vars), boxWords(negBox, vars))
		}
		if decided {
			continue
		}
		if evals >= maxSignPieces {
			why := "its enclosure contains 0"
			if lastErr != nil {
				why = lastErr.Error()
			}
			return 0, hull, fmt.Errorf("the sign of %s is not decided on the box after %d pieces (%s)", what, evals, why)
		}
		lower, upper, ok := bisectEnv(b, vars, env)
		if !ok {
			return 0, hull, fmt.Errorf("the sign of %s is not decided on the box (%v)", what, err)
		}
		pieces = append(pieces, lower, upper)
	}
	switch {
	case pos == 0 && neg == 0:
		return 0, hull, nil
	case neg == 0:
		return 1, hull, nil
	case pos == 0:
		return -1, hull, nil
	}
	return 0, hull, fmt.Errorf("%s is ≥ 0 on some pieces and ≤ 0 on others: no one sign is proved", what)
}

func isFinite(x interval.I) bool { return !math.IsInf(x.Lo, 0) && !math.IsInf(x.Hi, 0) }

// bisectEnv halves b in the variable (of vars) widest relative to its
// width in the whole box.
func bisectEnv(b map[string]interval.I, vars []string, whole map[string]interval.I) (lower, upper map[string]interval.I, ok bool) {
	best, bestRel := "", 0.0
	for _, v := range vars {
		w := b[v].Hi - b[v].Lo
		W := whole[v].Hi - whole[v].Lo
		if !(W > 0) || !(w > 0) {
			continue
		}
		mid := b[v].Lo + w/2
		if !(b[v].Lo < mid && mid < b[v].Hi) {
			continue
		}
		if rel := w / W; rel > bestRel {
			best, bestRel = v, rel
		}
	}
	if best == "" {
		return nil, nil, false
	}
	mid := b[best].Lo + (b[best].Hi-b[best].Lo)/2
	lower, upper = map[string]interval.I{}, map[string]interval.I{}
	for k, v := range b {
		lower[k], upper[k] = v, v
	}
	lower[best] = interval.I{Lo: b[best].Lo, Hi: mid}
	upper[best] = interval.I{Lo: mid, Hi: b[best].Hi}
	return lower, upper, true
}

func boxWords(b map[string]interval.I, vars []string) string {
	var parts []string
	for _, v := range vars {
		parts = append(parts, fmt.Sprintf("%s ∈ [%.6g, %.6g]", v, b[v].Lo, b[v].Hi))
	}
	return strings.Join(parts, ", ")
}
