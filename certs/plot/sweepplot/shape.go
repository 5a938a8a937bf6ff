package sweepplot

import (
	"cmp"
	"errors"
	"fmt"
	"slices"
	"strings"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gapcert/certs"
	"gapcert/certs/plot"
	"gapcert/interval/decimalio"
)

// ShapePoint is one point of a log-concavity picture: the certified
// verdict on the log-concavity of the point's ground state
// (results.ground_state of its certificate).
type ShapePoint struct {
	Index int     // the point's index in the family
	X     float64 // the parameter value, rounded to nearest (drawing only)
	XText string  // the parameter value, exact
	// Verdict is certs.Proven, certs.Disproven (the certificate holds a
	// witness) or certs.Undecided.
	Verdict string
}

// Shape is the certified data of a log-concavity picture of a
// one-parameter sweep whose family asks for the ground state.
type Shape struct {
	Title  string
	X      string // the parameter
	Points []ShapePoint
	// Uncertified lists the indices of points without a certificate or
	// without a ground-state block in it (not drawn).
	Uncertified []int
	// Missing counts the points whose certificate files were not found
	// (their verdicts come from the summary).
	Missing int
}

// shapeRows are the rows of a log-concavity picture, bottom up.
var shapeRows = []string{certs.Disproven, certs.Undecided, certs.Proven}

// Shape collects the certified log-concavity verdict of the ground state
// at every point of a one-parameter sweep, with x the swept parameter.
// The verdicts are the summary's copies of each certificate's
// results.ground_state, cross-checked against the certificate files by
// Load.
//
// Errors: an unknown parameter, a sweep with more than one parameter, and
// a sweep where no point has a ground-state verdict (a family without
// "ground_state": true).
func (s *Sweep) Shape(x string) (*Shape, error) {
	if err := s.checkParam("x", x); err != nil {
		return nil, err
	}
	if n := len(s.Summary.Parameters); n != 1 {
		return nil, fmt.Errorf("the sweep has %d parameters (%s); a log-concavity picture needs a one-parameter sweep", n, strings.Join(s.Summary.Parameters, ", "))
	}
	sh := &Shape{Title: s.Name, X: x, Missing: s.Missing}
	for i, pt := range s.Summary.Points {
		if !s.certified(i) || pt.GroundState == nil {
			sh.Uncertified = append(sh.Uncertified, pt.Index)
			continue
		}
		v := pt.GroundState.LogConcavity
		if !slices.Contains(shapeRows, v) {
			return nil, fmt.Errorf("point %d: unknown log-concavity verdict %q", pt.Index, v)
		}
		xv, err := decimalio.Parse(pt.Params[x])
		if err != nil {
			return nil, fmt.Errorf("point %d: parameter %s = %q: %v", pt.Index, x, pt.Params[x], err)
		}
		sh.Points = append(sh.Points, ShapePoint{Index: pt.Index, X: xv.Mid(), XText: pt.Params[x], Verdict: v})
	}
	if len(sh.Points) == 0 {
		return nil, errors.New("no point has a ground-state verdict (hint: add \"ground_state\": true to the family file and run the sweep again)")
	}
	slices.SortStableFunc(sh.Points, func(p, q ShapePoint) int { return cmp.Compare(p.X, q.X) })
	return sh, nil
}

// Write draws the picture into path (.png or .svg).
func (sh *Shape) Write(path string) error { return sh.picture().write(path) }

// shapeGlyphs mark the verdicts in the Okabe–Ito colours of the claim
// verdicts, and with different shapes.
var shapeGlyphs = map[string]draw.GlyphStyle{
	certs.Proven:    verdictGlyphs[certs.Holds],
	certs.Undecided: verdictGlyphs[certs.Undecided],
	certs.Disproven: verdictGlyphs[certs.Fails],
}

// shapeHeight is the height of the title and axes of a log-concavity
// picture.
const shapeHeight = 6 * vg.Centimeter

func (sh *Shape) picture() picture {
	p := newPlot(plot.Drawable(sh.Title) + "\ncertified verdicts: is the ground state log-concave?")
	p.X.Label.Text = plot.MathText(sh.X)
	p.Y.Label.Text = "verdict"
	p.Add(plotter.NewGrid())
	var ticks []gplot.Tick
	for row, v := range shapeRows {
		ticks = append(ticks, gplot.Tick{Value: float64(row), Label: v})
	}
	p.Y.Tick.Marker = gplot.ConstantTicks(ticks)
	p.Y.Min, p.Y.Max = -0.5, float64(len(shapeRows))-0.5
	x0, x1 := sh.Points[0].X, sh.Points[len(sh.Points)-1].X
	if xpad := 0.04 * (x1 - x0); xpad > 0 {
		p.X.Min, p.X.Max = x0-xpad, x1+xpad
	}
	legend := newLegend()
	what := map[string]string{
		certs.Proven:    "proven: log-concave on the whole domain",
		certs.Undecided: "undecided: neither proven nor a witness certified",
		certs.Disproven: "disproven: a certified witness of non-log-concavity",
	}
	for row := len(shapeRows) - 1; row >= 0; row-- {
		v := shapeRows[row]
		var xys plotter.XYs
		for _, pt := range sh.Points {
			if pt.Verdict == v {
				xys = append(xys, plotter.XY{X: pt.X, Y: float64(row)})
			}
		}
		if len(xys) == 0 {
			continue
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			panic("sweepplot: " + err.Error())
		}
		sc.GlyphStyle = shapeGlyphs[v]
		p.Add(sc)
		legend.Add(fmt.Sprintf("%s (%d)", what[v], len(xys)), sc)
	}
	caption := []string{
		"certified: each mark is the verdict of one certificate's ground-state block",
		"(log-concavity of the positive ground state); nothing is certified between",
		"the sampled parameter values.",
	}
	var n []string
	if len(sh.Uncertified) > 0 {
		n = append(n, fmt.Sprintf("%d point(s) without a certified ground state not drawn.", len(sh.Uncertified)))
	}
	if sh.Missing > 0 {
		n = append(n, fmt.Sprintf("%d certificate file(s) not found (verdicts from the summary).", sh.Missing))
	}
	if len(n) > 0 {
		caption = append(caption, strings.Join(n, " "))
	}
	return framed([]panel{{plot: p, height: shapeHeight}}, legend, caption, pictureWidth, 0, nil)
}
