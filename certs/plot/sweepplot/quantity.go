package sweepplot

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gapcert/certs"
	grammar "gapcert/fem/claim"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// Relations a band's threshold comparison may use.
var relations = []string{">=", ">", "<=", "<"}

// BandPoint is one certified point of a band: the enclosures of the
// quantity, of the reference and of the threshold over the point's
// certified enclosures, and the verdict on the comparison.
type BandPoint struct {
	Index     int     // the point's index in the family
	X         float64 // the parameter value, rounded to nearest (drawing only)
	XText     string  // the parameter value, exact
	Quantity  interval.I
	Reference interval.I // zero unless the band has a reference
	Threshold interval.I // zero unless the band has a threshold
	// Verdict is certs.Holds, Fails or Undecided: of "quantity REL
	// threshold" when the band has a threshold, else the point's verdict
	// over its own claims from the summary ("" when it has none).
	Verdict string
}

// BandSpec says what a band draws: formulas over a point's certified
// enclosures (see Sweep.Band for the names they may use).
type BandSpec struct {
	Quantity string // the main band
	// Reference, when not "", is drawn as a second certified band, e.g.
	// "robin_interval_gap".
	Reference string
	// Threshold, when not "", is drawn as a line, and each point is marked
	// by the verdict of "Quantity Rel Threshold".
	Threshold string
	Rel       string // >=, >, <= or <; "" means >=
}

// Band is the certified data of a band picture of a one-parameter sweep.
type Band struct {
	Title     string
	X         string // the parameter
	Quantity  string // the formula
	Reference string // the formula, or ""
	Threshold string // the formula, or ""
	Rel       string // the relation of the threshold comparison
	Points    []BandPoint
	// Uncertified lists the indices of points without a certificate
	// (not drawn).
	Uncertified []int
	// Missing counts the points whose certificate files were not found
	// (their enclosures come from the summary).
	Missing int
}

// Band encloses the formula spec.Quantity at every certified point of a
// one-parameter sweep, with x the swept parameter; when spec.Reference is
// not "", the formula spec.Reference, drawn as a second band; and when
// spec.Threshold is not "", the formula spec.Threshold and the verdict of
// "quantity rel threshold".
//
// The formulas may name lambda1…lambdaN, gap, D, area and perimeter
// (polygons, from the certificate files), the sweep's parameters, pi, e,
// and the reference quantities of built-in claims (package fem/claim/named):
// robin_interval_gap, the gap enclosed by the reference certificate that
// the claim @robin_comparison stores in the point's certificate file (of
// −u″ = λu on (0, D) with the polygon's Robin coefficient at both ends).
// They are enclosed in interval arithmetic over the certified enclosures
// of each point (formula.Expr.Eval), and the verdict is
// certs.EvaluateClaim's, so a "holds" or "fails" is true for every value
// in the enclosures.
//
// Errors: an unknown parameter or name, a formula that does not parse or
// cannot be enclosed at a point, a formula naming a reference quantity at
// a point without it (no such claim, a claim without a reference
// certificate, or no certificate file), a sweep with more than one
// parameter, and a sweep without certified points.
func (s *Sweep) Band(x string, spec BandSpec) (*Band, error) {
	rel := spec.Rel
	if rel == "" {
		rel = ">="
	}
	if !slices.Contains(relations, rel) {
		return nil, fmt.Errorf("unknown relation %q (hint: use one of %s)", rel, strings.Join(relations, ", "))
	}
	if err := s.checkParam("x", x); err != nil {
		return nil, err
	}
	if n := len(s.Summary.Parameters); n != 1 {
		return nil, fmt.Errorf("the sweep has %d parameters (%s); a band needs a one-parameter sweep (hint: draw a map of a claim's margin over two parameters)", n, strings.Join(s.Summary.Parameters, ", "))
	}
	q, err := s.parseFormula("quantity", spec.Quantity)
	if err != nil {
		return nil, err
	}
	var r, t *formula.Expr
	if spec.Reference != "" {
		if r, err = s.parseFormula("reference", spec.Reference); err != nil {
			return nil, err
		}
	}
	var claim *grammar.Claim
	if spec.Threshold != "" {
		if t, err = s.parseFormula("threshold", spec.Threshold); err != nil {
			return nil, err
		}
		claim, err = grammar.Parse("(" + spec.Quantity + ") " + rel + " (" + spec.Threshold + ")")
		if err != nil {
			return nil, fmt.Errorf("quantity %s threshold: %v", rel, err)
		}
	}
	b := &Band{Title: s.Name, X: x, Quantity: spec.Quantity, Reference: spec.Reference, Threshold: spec.Threshold, Rel: rel, Missing: s.Missing}
	for i, pt := range s.Summary.Points {
		if !s.certified(i) {
			b.Uncertified = append(b.Uncertified, pt.Index)
			continue
		}
		env, err := s.env(i)
		if err != nil {
			return nil, err
		}
		xv, err := decimalio.Parse(pt.Params[x])
		if err != nil {
			return nil, fmt.Errorf("point %d: parameter %s = %q: %v", pt.Index, x, pt.Params[x], err)
		}
		bp := BandPoint{Index: pt.Index, X: xv.Mid(), XText: pt.Params[x], Verdict: pt.Verdict}
		if bp.Quantity, err = s.enclose(i, env, "quantity", spec.Quantity, q); err != nil {
			return nil, err
		}
		if r != nil {
			if bp.Reference, err = s.enclose(i, env, "reference", spec.Reference, r); err != nil {
				return nil, err
			}
		}
		if t != nil {
			if bp.Threshold, err = s.enclose(i, env, "threshold", spec.Threshold, t); err != nil {
				return nil, err
			}
			bp.Verdict = certs.EvaluateClaim(claim, env).Verdict
		}
		b.Points = append(b.Points, bp)
	}
	if len(b.Points) == 0 {
		return nil, errors.New("empty sweep: no point has a certificate")
	}
	slices.SortStableFunc(b.Points, func(p, q BandPoint) int { return cmp.Compare(p.X, q.X) })
	return b, nil
}

// enclose encloses the formula e (what, with text src) over the
// enclosures env of point i; a reference quantity the point lacks, and an
// enclosure that is not finite, are errors.
func (s *Sweep) enclose(i int, env map[string]interval.I, what, src string, e *formula.Expr) (interval.I, error) {
	index := s.Summary.Points[i].Index
	for _, v := range e.Vars() {
		if _, ok := env[v]; !ok && isReference(v) {
			return interval.I{}, fmt.Errorf("point %d: %s %q names %s, which the point does not have: %s", index, what, src, v, s.missingReference(i, v))
		}
	}
	y, err := e.Eval(env)
	var ee *formula.EvalError
	var de *interval.DomainError
	switch {
	case errors.As(err, &ee) && errors.As(ee.Err, &de):
		return interval.I{}, fmt.Errorf("point %d: %s %q: %s is not defined on all of %v (hint: the formula must be defined on every point's certified enclosures)", index, what, src, ee.Sub, de.Arg)
	case errors.As(err, &ee):
		return interval.I{}, fmt.Errorf("point %d: %s %q: in %s: %v", index, what, src, ee.Sub, ee.Err)
	case err != nil:
		return interval.I{}, fmt.Errorf("point %d: %s %q: %v", index, what, src, err)
	}
	if !finite(y) {
		return interval.I{}, fmt.Errorf("point %d: %s %q is enclosed only by %v, which cannot be drawn", index, what, src, y)
	}
	return y, nil
}

// MapCell is one certified point of a map.
type MapCell struct {
	Index int
	X, Y  float64 // parameter values rounded to nearest (drawing only)
	// Margin is a certified lower bound of the claim's margin toward
	// holding: of lhs − rhs for >= and >, of rhs − lhs for <= and <.
	Margin  float64
	Verdict string // the certificate's verdict on the claim
}

// Map is the certified data of a map of a claim's margin over a
// two-parameter sweep.
type Map struct {
	Title       string
	X, Y        string // the parameters
	Claim       string // the claim's text
	Rel         string
	Cells       []MapCell
	Uncertified []int
	Missing     int
}

// Map returns, for every certified point, a certified lower bound of the
// margin of one claim toward holding (the lower end of the certificate's
// enclosure of lhs − rhs for >= and >, and minus its upper end, the lower
// end of rhs − lhs, for <= and <; each read back from the decimal string
// rounded in the safe direction), with x and y the two parameters. claim is
// a 1-based claim number or a claim's text, a built-in claim ("@name",
// whose relation is that of the inequality its certificate records)
// included; every certified point must hold that claim. Errors: an unknown parameter or claim, x = y, a sweep
// without exactly two parameters, fewer than two values of a parameter
// and no certified point.
func (s *Sweep) Map(x, y, claim string) (*Map, error) {
	if err := s.checkParam("x", x); err != nil {
		return nil, err
	}
	if err := s.checkParam("y", y); err != nil {
		return nil, err
	}
	if x == y {
		return nil, fmt.Errorf("x and y are both %q", x)
	}
	if n := len(s.Summary.Parameters); n != 2 {
		return nil, fmt.Errorf("the sweep has %d parameters (%s); a map needs a two-parameter sweep", n, strings.Join(s.Summary.Parameters, ", "))
	}
	m := &Map{Title: s.Name, X: x, Y: y, Missing: s.Missing}
	for i, pt := range s.Summary.Points {
		if !s.certified(i) {
			m.Uncertified = append(m.Uncertified, pt.Index)
			continue
		}
		k, err := claimIndex(pt.Claims, claim)
		if err != nil {
			return nil, fmt.Errorf("point %d: %v", pt.Index, err)
		}
		cr := pt.Claims[k]
		if m.Claim == "" {
			rel, err := relation(cr)
			if err != nil {
				return nil, fmt.Errorf("point %d: %v", pt.Index, err)
			}
			m.Claim, m.Rel = cr.Text, rel
		} else if cr.Text != m.Claim {
			return nil, fmt.Errorf("point %d: claim %s is %q, not %q as at the first point", pt.Index, claim, cr.Text, m.Claim)
		}
		var margin float64
		if m.Rel == ">=" || m.Rel == ">" {
			margin, err = decimalio.ParseLower(cr.Margin.Lower) // ≤ the printed lower end
		} else {
			var hi float64
			hi, err = decimalio.ParseUpper(cr.Margin.Upper) // ≥ the printed upper end
			margin = -hi
		}
		if err != nil {
			return nil, fmt.Errorf("point %d: claim margin: %v", pt.Index, err)
		}
		xv, err1 := decimalio.Parse(pt.Params[x])
		yv, err2 := decimalio.Parse(pt.Params[y])
		if err := errors.Join(err1, err2); err != nil {
			return nil, fmt.Errorf("point %d: parameters: %v", pt.Index, err)
		}
		m.Cells = append(m.Cells, MapCell{Index: pt.Index, X: xv.Mid(), Y: yv.Mid(), Margin: margin, Verdict: cr.Verdict})
	}
	if len(m.Cells) == 0 {
		return nil, errors.New("empty sweep: no point has a certificate")
	}
	xs, ys := m.axes()
	if len(xs) < 2 || len(ys) < 2 {
		err := fmt.Errorf("a map needs at least two values of each parameter (%s has %d, %s has %d)", x, len(xs), y, len(ys))
		if sh := s.Summary.Shard; sh.Count > 1 {
			err = fmt.Errorf("%v among the points of shard %s (hint: merge the shards and draw the merged directory)", err, sh)
		}
		return nil, err
	}
	return m, nil
}

// relation returns the relation of a claim result: of its recorded
// inequality for a built-in claim ("@triangle_gap" stands for "D^2*gap >=
// 64*pi^2/9"), else of its text. Only the relation is read; the margin
// is the certificate's enclosure of lhs − rhs.
func relation(cr certs.ClaimResult) (string, error) {
	text := cr.Text
	if cr.Inequality != "" {
		text = cr.Inequality
	}
	c, err := grammar.Parse(text)
	if err != nil {
		return "", err
	}
	return c.Rel, nil
}

func finite(x interval.I) bool { return !math.IsInf(x.Lo, 0) && !math.IsInf(x.Hi, 0) }

// claimIndex finds claim (a 1-based number or a claim text) in claims.
func claimIndex(claims []certs.ClaimResult, claim string) (int, error) {
	if len(claims) == 0 {
		return 0, errors.New("the point has no claims")
	}
	if n, err := strconv.Atoi(claim); err == nil {
		if n < 1 || n > len(claims) {
			return 0, fmt.Errorf("claim number %d is not in 1…%d", n, len(claims))
		}
		return n - 1, nil
	}
	var texts []string
	for k, c := range claims {
		if c.Text == claim {
			return k, nil
		}
		texts = append(texts, strconv.Quote(c.Text))
	}
	return 0, fmt.Errorf("no claim %q (hint: give a number 1…%d or one of %s)", claim, len(claims), strings.Join(texts, ", "))
}

// checkParam reports a parameter name that the sweep does not have.
func (s *Sweep) checkParam(axis, name string) error {
	if s.hasParam(name) {
		return nil
	}
	return fmt.Errorf("%s: unknown parameter %q (hint: the sweep's parameters are %s)", axis, name, strings.Join(s.Summary.Parameters, ", "))
}

// parseFormula parses a formula and checks that it only names quantities
// a point can have.
func (s *Sweep) parseFormula(what, src string) (*formula.Expr, error) {
	if strings.TrimSpace(src) == "" {
		return nil, fmt.Errorf("%s: empty formula", what)
	}
	e, err := formula.Parse(src)
	if err != nil {
		return nil, fmt.Errorf("%s %q: %v", what, src, err)
	}
	known := append(append(grammar.Quantities(), s.Summary.Parameters...), referenceNames()...)
	for _, v := range e.Vars() {
		if v == "pi" || v == "e" {
			continue
		}
		if !slices.Contains(known, v) || v == "alpha" && !s.hasParam(v) {
			return nil, fmt.Errorf("%s %q: unknown name %q (hint: use lambda1…lambdaN, gap, D, area, perimeter, volume, surface_area, pi, e, %s and the parameters %s)", what, src, v, strings.Join(referenceNames(), ", "), strings.Join(s.Summary.Parameters, ", "))
		}
	}
	return e, nil
}

// env returns the enclosures of point i that a formula may name: the
// certified eigenvalues, gap and diameter (each decimal string read back
// outward, certs.Bound.Interval), the exact parameter values, for
// polygons with a certificate file the area and perimeter of its problem,
// and the reference quantities read from its certificate file (read back
// outward too).
func (s *Sweep) env(i int) (map[string]interval.I, error) {
	pt := s.Summary.Points[i]
	env := map[string]interval.I{"pi": interval.Pi(), "e": interval.E()}
	read := func(name string, b certs.Bound) error {
		v, err := b.Interval()
		if err != nil {
			return fmt.Errorf("point %d: %s: %v", pt.Index, name, err)
		}
		env[name] = v
		return nil
	}
	for _, ev := range pt.Eigenvalues {
		if err := read("lambda"+strconv.Itoa(ev.Index), ev.Bound()); err != nil {
			return nil, err
		}
	}
	if err := errors.Join(read("gap", pt.Gap), read("D", pt.Diameter)); err != nil {
		return nil, err
	}
	for name, b := range s.References[i] {
		if err := read(name, b); err != nil {
			return nil, err
		}
	}
	for name, text := range pt.Params {
		v, err := decimalio.Parse(text)
		if err != nil {
			return nil, fmt.Errorf("point %d: parameter %s = %q: %v", pt.Index, name, text, err)
		}
		env[name] = v
	}
	if p := s.Problems[i]; p != nil && p.Dim == 2 {
		env["area"], env["perimeter"] = p.Area(), p.Perimeter()
	}
	if p := s.Problems[i]; p != nil && p.IsProduct() && p.Dim > 2 {
		env["volume"], env["surface_area"] = p.Volume(), p.SurfaceArea()
	}
	return env, nil
}
