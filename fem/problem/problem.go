package problem

import (
	"fmt"
	"math/big"
	"os"
	"sort"
	"strconv"
	"strings"

	"gapcert/fem/boundary"
	"gapcert/fem/claim"
	"gapcert/fem/claim/named"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// BC is the boundary condition on one side as the file states it: the
// kind and, for Robin, the exact coefficient (its canonical text is part of
// the problem's canonical form). Alpha is 0 unless Kind is Robin; a Robin
// condition with α = 0 stays Robin in the text but is the Neumann condition
// (package fem/boundary). Condition gives the form the computation uses.
type BC struct {
	Kind  boundary.Kind
	Alpha Number
}

// Condition returns the condition for the element spaces: the kind, and
// for Robin the enclosure of the exact α.
func (bc BC) Condition() boundary.Condition {
	c := boundary.Condition{Kind: bc.Kind}
	if bc.Kind == boundary.Robin {
		c.Alpha = bc.Alpha.Val
	}
	return c
}

// Problem is a validated eigenvalue problem −Δu + V u = λu read from a
// problem file. All numbers are exact (see Number); the polygon is simple
// and counterclockwise; the polyhedron is described under Polyhedron.
type Problem struct {
	Name string
	// Dim is the number of coordinates: 1 (interval), 2 (polygon, or a
	// product of two intervals), 3 (a polyhedron or a product) or 4 (a
	// product, see Factors).
	Dim int

	// Interval is (a, b) with a < b (Dim 1).
	Interval [2]Number
	// Vertices are the polygon's corners in counterclockwise order
	// (Dim 2). If the file lists them clockwise they are reversed as
	// v0, v(n−1), …, v1, keeping v0 first; see Reversed.
	Vertices [][2]Number
	// Polyhedron is the polyhedron (Dim 3, domain key "polyhedron"),
	// else nil.
	Polyhedron *Polyhedron

	// Potential is V with the parameters bound: its only free variables
	// are the coordinates, Coordinates(Dim): x (Dim 1), x and y (Dim 2),
	// x, y, z (Dim 3: a polyhedron or a product), x, y, z, w (Dim 4). It
	// is "0" by default.
	Potential *formula.Expr
	// Params are the named parameters of the file.
	Params map[string]Number

	// Boundary holds one condition per side: Dim 1 [left, right]; Dim 2
	// edge i runs from Vertices[i] to Vertices[(i+1) mod n]; a polyhedron
	// has one per face, in the order of Polyhedron.Faces; a product of 3 or
	// 4 coordinates lists its faces factor by factor (Factors).
	Boundary []BC

	Eigenvalues int    // how many eigenvalues to enclose, 2 … 20
	RelWidth    Number // target relative width, in (0, 1)
	Claims      []string

	// Points are the points of the closed domain at which a certificate
	// that asks for the ground state encloses it (key "points"; one exact
	// number per coordinate, in the file's order). Empty by default.
	Points [][]Number

	potentialText string // canonical text of the potential as written (parameters unbound)
	reversed      bool
	convex        string
	triangles     [][3]int
	vRange        interval.I
	product       *product // nil unless the domain is a product (product.go)
}

// Default values of optional keys.
const (
	DefaultPotential   = "0"
	DefaultEigenvalues = 2
	DefaultRelWidth    = "1e-6"
)

// maxFileSize bounds what ReadFile reads.
const maxFileSize = 1 << 20

// ReadFile reads and validates the problem file at path.
func ReadFile(path string) (*Problem, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	st, err := f.Stat()
	if err != nil {
		return nil, err
	}
	if st.Size() > maxFileSize {
		return nil, &Error{Issues: []Issue{{Msg: fmt.Sprintf("file too large (%d bytes, at most %d)", st.Size(), maxFileSize), Hint: "a problem file is a few hundred bytes"}}}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(data)
}

// Parse reads and validates a problem file. On failure the error is an
// *Error listing every defect found, each with its JSON path and a hint;
// no partial problem is returned.
func Parse(data []byte) (*Problem, error) {
	var iss issues
	root, err := readTree(data, &iss)
	if err != nil {
		return nil, &Error{Issues: []Issue{{Msg: err.Error(), Hint: "the file must be one JSON object"}}}
	}
	if root.kind != kindObject {
		return nil, &Error{Issues: []Issue{{Msg: "the file must hold a JSON object, not " + root.kind.String(), Hint: `start with {"domain": …}`}}}
	}
	r := reader{iss: &iss, badParams: map[string]bool{}}
	p := r.problem(root)
	if iss.count() > 0 {
		return nil, &Error{Issues: iss.list}
	}
	return p, nil
}

// reader holds the state of one Parse.
type reader struct {
	iss *issues
	// badParams are parameters whose value is invalid (and reported);
	// uses of them are not reported again.
	badParams map[string]bool
}

var topKeys = []string{"name", "domain", "potential", "parameters", "boundary", "eigenvalues", "target", "claims", "points"}

func (r *reader) problem(root *node) *Problem {
	r.checkKeys(root, "", topKeys)
	p := &Problem{Eigenvalues: DefaultEigenvalues}

	if n := root.get("name"); n != nil {
		if n.kind != kindString {
			r.iss.add("name", "name must be a string, not "+n.kind.String(), `write "name": "unit square"`)
		} else {
			p.Name = n.str
		}
	}

	p.Params = r.parameters(root.get("parameters"))
	paramsOK := len(r.badParams) == 0

	geomOK := r.domain(root.get("domain"), p)
	var bcOK bool
	if p.product != nil {
		bcOK = r.productBoundary(root.get("boundary"), p, geomOK)
		geomOK = geomOK && r.productGeometry(p, bcOK)
	} else {
		bcOK = r.boundary(root.get("boundary"), p, geomOK)
		if geomOK && p.Dim == 2 {
			geomOK = r.polygon(p, bcOK)
		}
	}
	if geomOK && p.Polyhedron != nil {
		geomOK = r.checkPolyhedron(p)
	}
	r.potential(root.get("potential"), p, geomOK && paramsOK)
	eigOK := r.eigenvalues(root.get("eigenvalues"), p)
	r.target(root.get("target"), p)
	if p.product != nil && p.Potential != nil && geomOK && bcOK && paramsOK {
		r.productPotential(p)
	}
	r.claims(root.get("claims"), p, geomOK && bcOK && eigOK)
	r.points(root.get("points"), p, geomOK)
	return p
}

// checkKeys reports every key of obj outside allowed.
func (r *reader) checkKeys(obj *node, path string, allowed []string) {
	for _, k := range obj.keys {
		found := false
		for _, a := range allowed {
			if k == a {
				found = true
				break
			}
		}
		if found {
			continue
		}
		hint := "allowed keys here: " + strings.Join(allowed, ", ")
		if s := nearest(k, allowed); s != "" {
			hint = fmt.Sprintf("did you mean %q?", s)
		}
		r.iss.addf(join(path, k), hint, "unknown key %q", k)
	}
}

// nearest returns the allowed key within edit distance 2 of k, if any.
func nearest(k string, allowed []string) string {
	best, bestD := "", 3
	for _, a := range allowed {
		if d := claim.EditDistance(strings.ToLower(k), a); d < bestD {
			best, bestD = a, d
		}
	}
	return best
}

// number reads one exact number at path; ok is false after reporting.
func (r *reader) number(n *node, path string, params map[string]Number) (Number, bool) {
	var text string
	switch n.kind {
	case kindNumber:
		text = string(n.num)
	case kindString:
		text = n.str
	default:
		r.iss.add(path, "want a number, not "+n.kind.String(), numberHint)
		return Number{}, false
	}
	v, err := parseNumber(text, params)
	if err != nil {
		ne, ok := err.(*numberError)
		if !ok {
			ne = &numberError{msg: err.Error(), hint: numberHint}
		}
		if !r.onlyBadParams(ne.unknown) {
			r.iss.add(path, ne.msg, ne.hint)
		}
		return Number{}, false
	}
	return v, true
}

var reservedNames = map[string]bool{"x": true, "y": true, "z": true, "w": true, "pi": true, "e": true}

// onlyBadParams reports whether names is not empty and holds only
// parameters whose own value was already reported as invalid.
func (r *reader) onlyBadParams(names []string) bool {
	for _, n := range names {
		if !r.badParams[n] {
			return false
		}
	}
	return len(names) > 0
}

// parameters reads the "parameters" object. Invalid entries are reported
// and recorded in r.badParams; the valid ones are returned.
func (r *reader) parameters(n *node) map[string]Number {
	params := map[string]Number{}
	if n == nil {
		return params
	}
	if n.kind != kindObject {
		r.iss.add("parameters", "parameters must be an object, not "+n.kind.String(), `write "parameters": {"a": "1/2"}`)
		r.badParams[""] = true
		return params
	}
	for i, name := range n.keys {
		path := "parameters." + name
		r.badParams[name] = true
		if !isIdentifier(name) {
			r.iss.addf(path, "a name is a letter followed by letters, digits or '_'", "bad parameter name %q", name)
			continue
		}
		if reservedNames[name] || !isVariableName(name) {
			r.iss.addf(path, "x, y, z and w are the coordinates; pi, e and function names are reserved", "parameter name %q is reserved", name)
			continue
		}
		if claim.IsQuantity(name) && name != claim.Alpha {
			r.iss.addf(path, "claims use this name for a certified quantity; choose another name", "parameter name %q is reserved", name)
			continue
		}
		v, good := r.number(n.vals[i], path, nil)
		if !good {
			continue
		}
		delete(r.badParams, name)
		params[name] = v
	}
	return params
}

func isIdentifier(s string) bool {
	if s == "" || len(s) > 64 {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		letter := 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z'
		if !letter && (i == 0 || !('0' <= c && c <= '9' || c == '_')) {
			return false
		}
	}
	return true
}

const domainHint = `write "domain": {"interval": ["a", "b"]}, {"polygon": [["x0", "y0"], ["x1", "y1"], …]} or {"polyhedron": {"vertices": […], "faces": […]}}`

// domain reads "domain" into p.Dim and p.Interval or p.Vertices (as
// written). ok reports that the coordinates are all valid numbers.
func (r *reader) domain(n *node, p *Problem) bool {
	if n == nil {
		r.iss.add("domain", "missing domain", domainHint)
		return false
	}
	if n.kind != kindObject {
		r.iss.add("domain", "domain must be an object, not "+n.kind.String(), domainHint)
		return false
	}
	r.checkKeys(n, "domain", []string{"interval", "polygon", "polyhedron", "product"})
	iv, pg := n.get("interval"), n.get("polygon")
	if ph := n.get("polyhedron"); ph != nil {
		if iv != nil || pg != nil || n.get("product") != nil {
			r.iss.add("domain", "domain has a polyhedron and another kind of domain", "give exactly one of them")
			return false
		}
		return r.polyhedron(ph, p)
	}
	if pr := n.get("product"); pr != nil {
		if iv != nil || pg != nil {
			r.iss.add("domain", "domain has a product and another domain", "give exactly one of them")
			return false
		}
		return r.product(pr, p)
	}
	switch {
	case iv != nil && pg != nil:
		r.iss.add("domain", "domain has both an interval and a polygon", "give exactly one of them")
		return false
	case iv == nil && pg == nil:
		if len(n.keys) == 0 {
			r.iss.add("domain", "domain is empty", domainHint)
		}
		return false
	case iv != nil:
		return r.interval(iv, p, "domain.interval")
	default:
		return r.vertices(pg, p, "domain.polygon")
	}
}

// interval reads the interval at path (a JSON path of the file) into p.
func (r *reader) interval(n *node, p *Problem, path string) bool {
	if n.kind != kindArray || len(n.vals) != 2 {
		r.iss.add(path, "an interval is a list of two numbers", `write "interval": ["0", "1"]`)
		return false
	}
	p.Dim = 1
	a, okA := r.number(n.vals[0], path+"[0]", p.Params)
	b, okB := r.number(n.vals[1], path+"[1]", p.Params)
	if !okA || !okB {
		return false
	}
	p.Interval = [2]Number{a, b}
	c, ok := cmpKnown(a, b)
	switch {
	case !ok:
		r.iss.add(path, "cannot decide whether the left end is below the right end", "give exact ends")
		return false
	case c == 0:
		r.iss.add(path, "zero-length interval", "the ends must differ")
		return false
	case c > 0:
		r.iss.add(path, "reversed interval: the left end is above the right end", "list the ends in increasing order")
		return false
	}
	return true
}

// vertices reads the polygon at path (a JSON path of the file) into p.
func (r *reader) vertices(n *node, p *Problem, path string) bool {
	if n.kind != kindArray {
		r.iss.add(path, "a polygon is a list of vertices, not "+n.kind.String(), `write "polygon": [["0", "0"], ["1", "0"], ["0", "1"]]`)
		return false
	}
	p.Dim = 2
	if len(n.vals) < 3 {
		r.iss.addf(path, "a polygon needs at least three vertices", "polygon has %d vertices", len(n.vals))
		return false
	}
	if len(n.vals) > maxVertices {
		r.iss.addf(path, "split the domain or simplify it", "polygon has %d vertices, at most %d are supported", len(n.vals), maxVertices)
		return false
	}
	ok := true
	for i, v := range n.vals {
		vp := fmt.Sprintf("%s[%d]", path, i)
		if v.kind != kindArray || len(v.vals) != 2 {
			r.iss.add(vp, "a vertex is a list of two numbers [x, y]", `write ["0.5", "sqrt(3)/2"]`)
			ok = false
			continue
		}
		x, okX := r.number(v.vals[0], vp+"[0]", p.Params)
		y, okY := r.number(v.vals[1], vp+"[1]", p.Params)
		if !okX || !okY {
			ok = false
			continue
		}
		p.Vertices = append(p.Vertices, [2]Number{x, y})
	}
	return ok
}

const bcHint = `use "dirichlet", "neumann" or {"robin": "α"} with α ≥ 0`

// boundary reads "boundary" into p.Boundary (in the file's side order).
// sidesKnown reports that the domain, and so the number of sides, is known.
func (r *reader) boundary(n *node, p *Problem, sidesKnown bool) bool {
	if n == nil {
		r.iss.add("boundary", "missing boundary conditions", `write "boundary": "dirichlet", or a list with one entry per side`)
		return false
	}
	return r.boundaryAt(n, p, sidesKnown, "boundary")
}

// boundaryAt reads the boundary conditions of the interval or polygon p
// from n, at path (a JSON path of the file).
func (r *reader) boundaryAt(n *node, p *Problem, sidesKnown bool, path string) bool {
	sides := 2
	if p.Dim == 2 {
		sides = len(p.Vertices)
	}
	if p.Polyhedron != nil {
		sides = len(p.Polyhedron.Faces)
	}
	if n.kind == kindArray {
		ok := true
		var list []BC
		for i, e := range n.vals {
			bc, good := r.bc(e, fmt.Sprintf("%s[%d]", path, i), p.Params)
			ok = ok && good
			list = append(list, bc)
		}
		if sidesKnown && len(n.vals) != sides {
			what, side := "edges", "side"
			if p.Dim == 1 {
				what = "ends [left, right]"
			}
			if p.Polyhedron != nil {
				what, side = "faces, in the order of domain.polyhedron.faces", "face"
			}
			r.iss.addf(path, fmt.Sprintf("give one entry per %s: %d %s", side, sides, what), "boundary list has %d entries for %d %ss", len(n.vals), sides, side)
			return false
		}
		if ok && sidesKnown {
			p.Boundary = list
		}
		return ok && sidesKnown
	}
	bc, ok := r.bc(n, path, p.Params)
	if !ok || !sidesKnown {
		return false
	}
	p.Boundary = make([]BC, sides)
	for i := range p.Boundary {
		p.Boundary[i] = bc
	}
	return true
}

func (r *reader) bc(n *node, path string, params map[string]Number) (BC, bool) {
	switch n.kind {
	case kindString:
		switch n.str {
		case "dirichlet":
			return BC{Kind: boundary.Dirichlet, Alpha: zeroNumber()}, true
		case "neumann":
			return BC{Kind: boundary.Neumann, Alpha: zeroNumber()}, true
		case "robin":
			r.iss.add(path, "a Robin condition needs its coefficient", `write {"robin": "1.5"}`)
			return BC{}, false
		}
		hint := bcHint
		if s := nearest(n.str, []string{"dirichlet", "neumann", "robin"}); s != "" {
			hint = fmt.Sprintf("did you mean %q?", s)
		}
		r.iss.addf(path, hint, "unknown boundary kind %q", n.str)
		return BC{}, false
	case kindObject:
		r.checkKeys(n, path, []string{"robin"})
		a := n.get("robin")
		if a == nil {
			if len(n.keys) == 0 {
				r.iss.add(path, "empty boundary condition", bcHint)
			}
			return BC{}, false
		}
		apath := path + ".robin"
		alpha, ok := r.number(a, apath, params)
		if !ok {
			return BC{}, false
		}
		c, ok := cmpKnown(alpha, zeroNumber())
		switch {
		case !ok:
			r.iss.add(apath, "cannot decide the sign of the Robin coefficient", "give it exactly")
			return BC{}, false
		case c < 0:
			r.iss.add(apath, "negative Robin coefficient", "α must be ≥ 0 (α = 0 is the Neumann condition)")
			return BC{}, false
		}
		return BC{Kind: boundary.Robin, Alpha: alpha}, true
	}
	r.iss.add(path, "a boundary condition must be a string or an object, not "+n.kind.String(), bcHint)
	return BC{}, false
}

func zeroNumber() Number { return ratNumber(new(big.Rat)) }

// potential reads "potential", binds the parameters and checks that V is
// defined and bounded on the domain (when domainOK).
func (r *reader) potential(n *node, p *Problem, domainOK bool) {
	src := DefaultPotential
	if n != nil {
		if n.kind != kindString {
			r.iss.add("potential", "the potential must be a formula in a string, not "+n.kind.String(), `write "potential": "x^2 + y^2"`)
			return
		}
		src = n.str
	}
	if len(src) > maxFormulaLen {
		r.iss.addf("potential", "simplify it or use parameters", "potential too long (%d bytes, at most %d)", len(src), maxFormulaLen)
		return
	}
	if err := checkExponents(src); err != nil {
		ne := err.(*numberError)
		r.iss.add("potential", ne.msg, ne.hint)
		return
	}
	e, err := formula.Parse(src)
	if err != nil {
		if se, ok := err.(*formula.SyntaxError); ok {
			r.iss.addf("potential", firstNonEmpty(se.Hint, "see the formula syntax in the documentation"), "cannot parse the potential: column %d: %s", se.Col, se.Msg)
		} else {
			r.iss.addf("potential", "", "cannot parse the potential: %v", err)
		}
		return
	}
	p.potentialText = e.String()
	if usesIntervalLiteral(p.potentialText) {
		r.iss.add("potential", "the potential may not use interval(…)", "give the potential as a formula of exact numbers")
		return
	}
	vals := map[string]interval.I{}
	var unknown []string
	for _, name := range e.Vars() {
		if v, ok := p.Params[name]; ok {
			vals[name] = v.Val
			continue
		}
		if isCoordinate(name, p.Dim) {
			continue
		}
		unknown = append(unknown, name)
	}
	if r.onlyBadParams(unknown) {
		return
	}
	if len(unknown) > 0 {
		hint := `the potential may use x, y and names declared under "parameters"`
		if p.Dim > 2 {
			hint = fmt.Sprintf(`the potential may use the coordinates %s and names declared under "parameters"`, strings.Join(Coordinates(p.Dim), ", "))
		}
		if p.Dim == 1 {
			hint = `on an interval the potential may use x and names declared under "parameters"`
		}
		if p.Dim == 3 {
			hint = `the potential may use x, y, z and names declared under "parameters"`
		}
		r.iss.addf("potential", hint, "unknown name %s in the potential", strings.Join(quoteAll(unknown), ", "))
		return
	}
	p.Potential = e.Bind(vals)
	if !domainOK {
		return
	}
	rng, issue := potentialRange(p)
	if issue != "" {
		r.iss.add("potential", issue, "the potential must be defined and finite on the closed domain")
		return
	}
	p.vRange = rng
}

// eigenvalues reads "eigenvalues"; ok is false after reporting a defect.
func (r *reader) eigenvalues(n *node, p *Problem) (ok bool) {
	if n == nil {
		return true
	}
	const hint = "an integer from 2 to 20"
	if n.kind != kindNumber {
		r.iss.add("eigenvalues", "want an integer, not "+n.kind.String(), hint)
		return false
	}
	k, err := strconv.Atoi(string(n.num))
	if err != nil {
		r.iss.addf("eigenvalues", hint, "%s is not an integer", n.num)
		return false
	}
	if k < 2 || k > maxEigenvalues {
		r.iss.addf("eigenvalues", hint, "eigenvalues = %d is out of range", k)
		return false
	}
	p.Eigenvalues = k
	return true
}

func (r *reader) target(n *node, p *Problem) {
	rw, _ := parseNumber(DefaultRelWidth, nil)
	p.RelWidth = rw
	if n == nil {
		return
	}
	if n.kind != kindObject {
		r.iss.add("target", "target must be an object, not "+n.kind.String(), `write "target": {"relative_width": "1e-8"}`)
		return
	}
	r.checkKeys(n, "target", []string{"relative_width"})
	w := n.get("relative_width")
	if w == nil {
		return
	}
	const path = "target.relative_width"
	v, ok := r.number(w, path, p.Params)
	if !ok {
		return
	}
	lo, ok1 := cmpKnown(v, zeroNumber())
	hi, ok2 := cmpKnown(v, ratNumber(big.NewRat(1, 1)))
	switch {
	case !ok1 || !ok2:
		r.iss.add(path, "cannot decide whether the relative width lies in (0, 1)", "give it exactly")
	case lo <= 0 || hi >= 0:
		r.iss.addf(path, `a relative width such as "1e-6" lies strictly between 0 and 1`, "relative width %s is not in (0, 1)", v.Text)
	default:
		p.RelWidth = v
	}
}

// claims reads "claims": each is parsed by claim.Parse, or looked up in
// the catalogue of built-in claims (package fem/claim/named), and must name
// only quantities the problem provides (claim.Scope, from ClaimScope).
// When the domain, boundary or number of eigenvalues is invalid (and
// reported), only names that no problem provides are reported.
func (r *reader) claims(n *node, p *Problem, scopeKnown bool) {
	if n == nil {
		return
	}
	if n.kind != kindArray {
		r.iss.add("claims", "claims must be a list of strings, not "+n.kind.String(), `write "claims": ["gap >= 3*pi^2/D^2"]`)
		return
	}
	scope := claim.Scope{Dim: 2, Vertices: 3, Eigenvalues: claim.MaxEigenvalue}
	if scopeKnown {
		scope = p.ClaimScope()
	}
	for name := range r.badParams {
		scope.Params = append(scope.Params, name) // reported already
	}
	for name := range p.Params {
		scope.Params = append(scope.Params, name)
	}
	for i, c := range n.vals {
		path := fmt.Sprintf("claims[%d]", i)
		if c.kind != kindString {
			r.iss.add(path, "a claim must be a string, not "+c.kind.String(), `write "gap >= 3*pi^2/D^2"`)
			continue
		}
		if named.IsNamed(c.str) {
			if text, ok := r.namedClaim(c.str, path, p.Dim, scope); ok {
				p.Claims = append(p.Claims, text)
			}
			continue
		}
		cl, err := claim.Parse(c.str)
		if err == nil {
			err = cl.CheckScope(scope)
		}
		if err != nil {
			ce := err.(*claim.Error)
			r.iss.addf(path, ce.Hint, "claim %q, column %d: %s", ce.Text, ce.Col, ce.Msg)
			continue
		}
		p.Claims = append(p.Claims, c.str)
	}
}

// namedClaim checks a built-in claim "@name" (package fem/claim/named) and
// returns its canonical text. dim is the domain's dimension (0 if the
// domain is invalid, and then not checked).
func (r *reader) namedClaim(text, path string, dim int, scope claim.Scope) (string, bool) {
	c, err := named.Lookup(text)
	if err != nil {
		ne := err.(*named.NameError)
		r.iss.add(path, ne.Error(), ne.Hint())
		return "", false
	}
	if dim == 0 {
		return c.Text(), true
	}
	scope.Dim = dim
	if err := c.CheckScope(scope); err != nil {
		ce := err.(*claim.Error)
		r.iss.add(path, ce.Msg, ce.Hint)
		return "", false
	}
	return c.Text(), true
}

// ClaimScope returns what the problem provides to its claims (package
// claim): its dimension and the vertices of its polygon or polyhedron,
// the number of eigenvalues, its parameters, and whether alpha has a value
// (RobinAlpha).
func (p *Problem) ClaimScope() claim.Scope {
	s := claim.Scope{Dim: p.Dim, Vertices: len(p.Vertices), Eigenvalues: p.Eigenvalues, Params: p.sortedParamNames()}
	if p.Polyhedron != nil {
		s.Vertices = len(p.Polyhedron.Vertices)
	}
	_, s.NoAlpha = p.RobinAlpha()
	return s
}

// RobinAlpha returns the Robin coefficient shared by every side with a
// Robin condition (sides of other kinds do not count), the value of the
// quantity alpha of claims. When there is none, why says so: no Robin
// side, two Robin sides whose coefficients are decided to differ, or two
// whose equality cannot be decided (Equal); on a domain of three or four
// coordinates the reason says "face".
func (p *Problem) RobinAlpha() (alpha Number, why string) {
	piece := "side"
	if p.Dim > 2 {
		piece = "face"
	}
	first := -1
	for i, bc := range p.Boundary {
		if bc.Kind != boundary.Robin {
			continue
		}
		if first < 0 {
			first = i
			continue
		}
		a := p.Boundary[first].Alpha
		switch same, decided := Equal(a, bc.Alpha); {
		case !decided:
			return Number{}, fmt.Sprintf("cannot decide whether the Robin coefficients %s (%s %d) and %s (%s %d) are equal", a.Text, piece, first, bc.Alpha.Text, piece, i)
		case !same:
			return Number{}, fmt.Sprintf("the Robin %ss have different coefficients, %s (%s %d) and %s (%s %d)", piece, a.Text, piece, first, bc.Alpha.Text, piece, i)
		}
	}
	if first < 0 {
		return Number{}, "no " + piece + " has a Robin condition"
	}
	return p.Boundary[first].Alpha, ""
}

// Equal decides whether two exact numbers are equal: by their rationals,
// by identical canonical texts (which denote one number), or by enclosures
// that are equal points or disjoint. decided is false when none of these
// settles it.
func Equal(a, b Number) (equal, decided bool) {
	switch {
	case a.Rat != nil && b.Rat != nil:
		return a.Rat.Cmp(b.Rat) == 0, true
	case a.Text == b.Text:
		return true, true
	case a.Val.IsPoint() && a.Val == b.Val:
		return true, true
	case a.Val.Hi < b.Val.Lo || b.Val.Hi < a.Val.Lo:
		return false, true
	}
	return false, false
}

// sortedParamNames returns the parameter names in increasing order.
func (p *Problem) sortedParamNames() []string {
	names := make([]string, 0, len(p.Params))
	for k := range p.Params {
		names = append(names, k)
	}
	sort.Strings(names)
	return names
}

// isVariableName reports whether the formula reader takes name as a
// variable (not a constant or a function).
func isVariableName(name string) bool {
	e, err := formula.Parse(name)
	if err != nil {
		return false
	}
	v := e.Vars()
	return len(v) == 1 && v[0] == name
}
