package plot

import (
	"fmt"
	"image/color"
	"math"
	"math/big"
	"path/filepath"
	"slices"
	"strings"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// GroundState is the picture of a certificate's ground-state block
// (results.ground_state): the domain with the log-concavity witness marked
// and the problem's points, and, when those points lie on one segment in
// order, the certified enclosures of u at them against the arc length.
//
// Coordinates are nearest floats (drawing only). Values holds the
// certificate's enclosures read back outward (certs.Bound.Interval), so
// each contains the value of u at its point; nothing is computed here.
type GroundState struct {
	Title string
	Dim   int
	// Interval holds the ends of the interval (Dim 1), Polygon the
	// vertices (Dim 2).
	Interval [2]float64
	Polygon  [][2]float64
	// Verdict is certs.Proven, certs.Disproven or certs.Undecided, Reason
	// the certificate's words for it.
	Verdict, Reason string
	// WitnessKind is the witness's kind ("" without one), Witness its
	// points: the ends of the convex interval (y = 0), or x, y and m.
	WitnessKind string
	Witness     [][2]float64
	// Margin is the witness's margin, or the best candidate's when the
	// verdict is undecided (nil when the certificate has none).
	Margin *interval.I
	// Points are the problem's points (y = 0 on an interval), Values the
	// enclosures of u there (empty when the certificate gives none). On
	// an interval the values are drawn against x in any order of the
	// points; on a polygon only along a segment (Arc).
	Points [][2]float64
	Values []interval.I
	// Arc is the arc length of each point from the first along the
	// segment that holds them all in order, nil when they do not lie on
	// one segment in order (decided exactly on the problem's rational
	// coordinates) or are fewer than two.
	Arc []float64
}

// NewGroundState reads the picture of c's ground-state block; p is the
// certificate's problem (problem.Parse of c.Problem). It returns an error
// when c has no ground-state block or the block does not match p's points.
func NewGroundState(c *certs.Certificate, p *problem.Problem) (*GroundState, error) {
	gs := c.Results.GroundState
	if gs == nil {
		return nil, fmt.Errorf("the certificate has no results.ground_state (hint: certify the problem with --ground-state)")
	}
	g := &GroundState{Title: p.Name, Dim: p.Dim, Verdict: gs.LogConcavity, Reason: gs.Reason}
	switch p.Dim {
	case 1:
		g.Interval = [2]float64{p.Interval[0].Val.Mid(), p.Interval[1].Val.Mid()}
	case 2:
		for _, v := range p.Vertices {
			g.Polygon = append(g.Polygon, [2]float64{v[0].Val.Mid(), v[1].Val.Mid()})
		}
	default:
		panic(fmt.Sprintf("plot: ground state of a problem of dimension %d", p.Dim))
	}
	if w := gs.Witness; w != nil {
		g.WitnessKind = w.Kind
		for _, pt := range w.Points {
			xy, err := floatPoint(pt)
			if err != nil {
				return nil, fmt.Errorf("witness point %v: %v", pt, err)
			}
			g.Witness = append(g.Witness, xy)
		}
		m, err := w.Margin.Interval()
		if err != nil {
			return nil, fmt.Errorf("witness margin: %v", err)
		}
		g.Margin = &m
	} else if gs.Margin != nil {
		m, err := gs.Margin.Interval()
		if err != nil {
			return nil, fmt.Errorf("margin: %v", err)
		}
		g.Margin = &m
	}
	for _, pt := range p.Points {
		xy := [2]float64{pt[0].Val.Mid(), 0}
		if len(pt) > 1 {
			xy[1] = pt[1].Val.Mid()
		}
		g.Points = append(g.Points, xy)
	}
	if len(gs.Points) > 0 {
		if len(gs.Points) != len(p.Points) {
			return nil, fmt.Errorf("the ground-state block has %d values for the problem's %d points", len(gs.Points), len(p.Points))
		}
		for i, v := range gs.Points {
			u, err := v.Value.Interval()
			if err != nil {
				return nil, fmt.Errorf("value at point %d: %v", i, err)
			}
			g.Values = append(g.Values, u)
		}
	}
	g.Arc = segmentArc(p.Points)
	return g, nil
}

// floatPoint reads the decimal coordinates of a witness point, nearest.
func floatPoint(texts []string) ([2]float64, error) {
	var xy [2]float64
	if len(texts) < 1 || len(texts) > 2 {
		return xy, fmt.Errorf("want 1 or 2 coordinates")
	}
	for i, s := range texts {
		v, err := decimalio.Parse(s)
		if err != nil {
			return xy, err
		}
		xy[i] = v.Mid()
	}
	return xy, nil
}

// segmentArc returns the arc lengths |p_k − p_0| (nearest floats) when the
// points p_0 … p_(n−1), n ≥ 2, lie on one segment in order, decided
// exactly on their rational coordinates: with d = p_(n−1) − p_0 ≠ 0, every
// p_k − p_0 is parallel to d (zero cross product) and the projections
// (p_k − p_0)·d increase strictly. It returns nil otherwise, and when a
// coordinate is not rational (its exact value is then not at hand).
func segmentArc(pts [][]problem.Number) []float64 {
	if len(pts) < 2 {
		return nil
	}
	rat := func(pt []problem.Number, i int) *big.Rat {
		if i >= len(pt) {
			return new(big.Rat)
		}
		return pt[i].Rat
	}
	for _, pt := range pts {
		for i := range pt {
			if pt[i].Rat == nil {
				return nil
			}
		}
	}
	sub := func(a, b []problem.Number) [2]*big.Rat {
		return [2]*big.Rat{new(big.Rat).Sub(rat(a, 0), rat(b, 0)), new(big.Rat).Sub(rat(a, 1), rat(b, 1))}
	}
	d := sub(pts[len(pts)-1], pts[0])
	if d[0].Sign() == 0 && d[1].Sign() == 0 {
		return nil
	}
	var prev *big.Rat
	arc := make([]float64, len(pts))
	for k, pt := range pts {
		e := sub(pt, pts[0])
		cross := new(big.Rat).Sub(new(big.Rat).Mul(e[0], d[1]), new(big.Rat).Mul(e[1], d[0]))
		if cross.Sign() != 0 {
			return nil
		}
		t := new(big.Rat).Add(new(big.Rat).Mul(e[0], d[0]), new(big.Rat).Mul(e[1], d[1]))
		if prev != nil && t.Cmp(prev) <= 0 {
			return nil
		}
		prev = t
		ex, _ := e[0].Float64()
		ey, _ := e[1].Float64()
		arc[k] = math.Hypot(ex, ey)
	}
	return arc
}

// Write draws the picture into path, in the format named by its
// extension (.png or .svg).
func (g *GroundState) Write(path string) error {
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if !slices.Contains(knownFormats, ext) {
		return fmt.Errorf("%s: unknown picture format %q (hint: end the file name with .%s)", path, ext, strings.Join(knownFormats, " or ."))
	}
	return writeFile(path, g.picture(), ext)
}

// The heights of the panels of a ground-state picture.
const (
	intervalPanelHeight = 4.5 * vg.Centimeter
	polygonPanelHeight  = 9 * vg.Centimeter
	valuePanelHeight    = 6.5 * vg.Centimeter
	gsCaptionLine       = 0.42 * vg.Centimeter
)

// Styles of the ground-state picture: the witness in vermillion, the
// problem's points and the values in blue (Okabe–Ito), told apart by
// glyphs as well.
var (
	witnessStyle  = draw.LineStyle{Color: Vermillion, Width: vg.Points(3)}
	chordStyle    = draw.LineStyle{Color: Vermillion, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(4), vg.Points(2)}}
	segmentStyle  = draw.LineStyle{Color: SkyBlue, Width: vg.Points(1)}
	pointGlyph    = draw.GlyphStyle{Shape: draw.BoxGlyph{}, Color: Blue, Radius: vg.Points(2.5)}
	endGlyph      = draw.GlyphStyle{Shape: draw.CrossGlyph{}, Color: Vermillion, Radius: vg.Points(4)}
	midGlyph      = draw.GlyphStyle{Shape: draw.RingGlyph{}, Color: Black, Radius: vg.Points(4)}
	valueBarStyle = draw.LineStyle{Color: Blue, Width: vg.Points(1.2)}
	valueGlyph    = draw.GlyphStyle{Shape: draw.CircleGlyph{}, Color: Blue, Radius: vg.Points(2.5)}
)

// verdictWords is the title line of each verdict.
var verdictWords = map[string]string{
	certs.Proven:    "log-concave: proven (certified)",
	certs.Disproven: "log-concave: disproven (certified witness)",
	certs.Undecided: "log-concave: undecided",
}

func (g *GroundState) picture() picture {
	title := drawable(g.Title)
	if title != "" {
		title += "\n"
	}
	words, ok := verdictWords[g.Verdict]
	if !ok {
		words = "log-concave: " + drawable(g.Verdict)
	}
	domain := newPlot(title + "ground state u (positive, unit L2 norm)\n" + words)
	legend := newLegend()
	legend.Padding = vg.Points(1.5)
	var height vg.Length
	if g.Dim == 1 {
		height = intervalPanelHeight
		domain.X.Label.Text = "x"
		domain.HideY()
		domain.Add(&polyline{pts: [][2]float64{{g.Interval[0], 0}, {g.Interval[1], 0}}, style: outlineStyle})
		domain.X.Min, domain.X.Max = g.xRange()
		domain.Y.Min, domain.Y.Max = -1, 1
	} else {
		height = polygonPanelHeight
		domain.X.Label.Text, domain.Y.Label.Text = "x", "y"
		domain.Add(&closedPaths{paths: [][][2]float64{g.Polygon}, style: outlineStyle})
	}
	if g.Arc != nil {
		seg := &polyline{pts: [][2]float64{g.Points[0], g.Points[len(g.Points)-1]}, style: segmentStyle}
		if g.Dim == 2 {
			domain.Add(seg)
			legend.Add("segment through the marked points", seg)
		}
	}
	if len(g.Points) > 0 {
		domain.Add(scatter(g.Points, pointGlyph))
		legend.Add(fmt.Sprintf("the problem's points (%d)", len(g.Points)), scatter(g.Points[:1], pointGlyph))
	}
	switch g.WitnessKind {
	case certs.WitnessConvexInterval:
		w := &polyline{pts: g.Witness, style: witnessStyle}
		domain.Add(w)
		domain.Add(scatter(g.Witness, endGlyph))
		legend.Add(fmt.Sprintf("witness: (log u)'' > 0 on [%.6g, %.6g], certified", g.Witness[0][0], g.Witness[1][0]), w)
	case certs.WitnessMidpoint:
		chord := &polyline{pts: g.Witness[:2], style: chordStyle}
		domain.Add(chord)
		domain.Add(scatter(g.Witness[:2], endGlyph))
		domain.Add(scatter(g.Witness[2:], midGlyph))
		legend.Add("witness x, y: u(m)² < u(x)·u(y), certified", scatter(g.Witness[:1], endGlyph))
		legend.Add("witness m = (x + y)/2", scatter(g.Witness[2:], midGlyph))
	}
	panels := []gsPanel{{plot: domain, height: height}}
	if g.Dim == 2 {
		panels[0].outline = slices.Concat(g.Polygon, g.Points, g.Witness)
	}

	caption := []string{
		"certified: the verdict, the witness and the values of u are those of the certificate's",
		"ground-state block (re-checked by check); coordinates are drawn at their nearest floats.",
	}
	switch {
	case g.WitnessKind == certs.WitnessConvexInterval && g.Margin != nil:
		caption = append(caption, fmt.Sprintf("Witness margin: g = (V - lambda1)u² - u'² > 0 there, at least %.3g.", g.Margin.Lo))
	case g.WitnessKind == certs.WitnessMidpoint && g.Margin != nil:
		caption = append(caption, fmt.Sprintf("Witness margin: u(x)·u(y) - u(m)² lies in [%.3g, %.3g].", g.Margin.Lo, g.Margin.Hi))
	case g.WitnessKind == "" && g.Margin != nil:
		caption = append(caption, fmt.Sprintf("No witness certified; the best candidate's margin lies in [%.3g, %.3g].", g.Margin.Lo, g.Margin.Hi))
	}
	if g.Verdict == certs.Undecided && g.Reason != "" {
		caption = append(caption, wrapWords("Undecided: "+g.Reason, captionWidth, maxReasonLines)...)
	}
	switch {
	case (g.Arc != nil || g.Dim == 1) && len(g.Values) > 0:
		panels = append(panels, gsPanel{plot: g.valuePanel(&legend), height: valuePanelHeight})
		caption = append(caption, "The values are certified at the marked points only: nothing is drawn between them.")
	case len(g.Points) > 1 && len(g.Values) > 0:
		caption = append(caption, "The problem's points do not lie on one segment in order: no values drawn along a segment.")
	case len(g.Points) > 0 && len(g.Values) == 0:
		caption = append(caption, "The certificate gives no values of u at the points (see its reason).")
	}
	return stacked(panels, legend, caption)
}

// The certificate's reason for an undecided verdict is written under the
// picture in at most maxReasonLines lines of at most captionWidth runes.
const (
	captionWidth   = 86
	maxReasonLines = 4
)

// wrapWords breaks s into lines of at most width runes at spaces (a longer
// word gets a line of its own), at most maxLines of them, the last ending
// in "…" when text was left out.
func wrapWords(s string, width, maxLines int) []string {
	var lines []string
	line := ""
	for _, w := range strings.Fields(s) {
		switch {
		case line == "":
			line = w
		case len([]rune(line))+1+len([]rune(w)) <= width:
			line += " " + w
		default:
			lines = append(lines, line)
			line = w
		}
	}
	if line != "" {
		lines = append(lines, line)
	}
	if len(lines) > maxLines {
		lines = lines[:maxLines]
		lines[maxLines-1] += " …"
	}
	return lines
}

// xRange is the x range of the panels of an interval: the interval,
// padded by 3% on each side.
func (g *GroundState) xRange() (lo, hi float64) {
	pad := 0.03 * (g.Interval[1] - g.Interval[0])
	return g.Interval[0] - pad, g.Interval[1] + pad
}

// valuePanel draws the enclosure of u at each point against its arc
// length along the segment (x itself on an interval).
func (g *GroundState) valuePanel(legend *gplot.Legend) *gplot.Plot {
	p := newPlot("")
	p.Y.Label.Text = "u"
	p.Add(plotter.NewGrid())
	s := g.Arc
	if g.Dim == 1 {
		p.X.Label.Text = "x"
		p.X.Min, p.X.Max = g.xRange()
		s = make([]float64, len(g.Points))
		for k, pt := range g.Points {
			s[k] = pt[0]
		}
	} else {
		p.X.Label.Text = "arc length from the first point"
	}
	bars := &valueBars{s: s, u: g.Values}
	p.Add(bars)
	mids := make([][2]float64, len(s))
	widest := 0.0
	for k := range s {
		mids[k] = [2]float64{s[k], g.Values[k].Mid()}
		widest = math.Max(widest, g.Values[k].Wid())
	}
	p.Add(scatter(mids, valueGlyph))
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, u := range g.Values {
		lo, hi = math.Min(lo, u.Lo), math.Max(hi, u.Hi)
	}
	pad := 0.08 * (hi - lo)
	if pad == 0 {
		pad = 0.05 * math.Abs(hi)
	}
	p.Y.Min, p.Y.Max = lo-pad, hi+pad
	legend.Add(fmt.Sprintf("certified enclosure of u at the marked points only (widths up to %.2g)", widest), bars)
	return p
}

// gsPanel is one plot of a ground-state picture; a panel with an outline
// keeps the aspect ratio of the domain and shows all the outline's points.
type gsPanel struct {
	plot    *gplot.Plot
	height  vg.Length
	outline [][2]float64
}

// stacked lays out the panels one above the other, the legend below them
// and the caption lines at the foot, on a white background.
func stacked(panels []gsPanel, legend gplot.Legend, caption []string) picture {
	r := legend.Rectangle(draw.Canvas{})
	legendHeight := r.Max.Y - r.Min.Y + 2*margin
	captionHeight := vg.Length(len(caption))*gsCaptionLine + margin
	var total vg.Length
	for _, pn := range panels {
		total += pn.height
	}
	return picture{
		name:   "ground_state",
		width:  pictureWidth,
		height: total + legendHeight + captionHeight,
		draw: func(c draw.Canvas) {
			c.SetColor(color.White)
			c.Fill(c.Rectangle.Path())
			for i, line := range caption {
				y := c.Min.Y + margin/2 + vg.Length(len(caption)-1-i)*gsCaptionLine
				c.FillText(captionStyle, vg.Point{X: c.Min.X + margin, Y: y}, drawable(line))
			}
			c = draw.Crop(c, margin, -margin, captionHeight, -margin)
			top := c.Max.Y
			canvases := make([]draw.Canvas, len(panels))
			for i, pn := range panels {
				canvases[i] = c
				canvases[i].Max.Y, canvases[i].Min.Y = top, top-pn.height
				top -= pn.height
			}
			// Panels that share the x axis (those without an outline)
			// get aligned data areas.
			var left, right vg.Length
			for i, pn := range panels {
				if pn.outline == nil {
					d := pn.plot.DataCanvas(canvases[i])
					left = max(left, d.Min.X-canvases[i].Min.X)
					right = max(right, canvases[i].Max.X-d.Max.X)
				}
			}
			for i, pn := range panels {
				if pn.outline != nil {
					equalAspect(pn.plot, canvases[i], pn.outline, nil)
				} else {
					d := pn.plot.DataCanvas(canvases[i])
					canvases[i].Min.X += left - (d.Min.X - canvases[i].Min.X)
					canvases[i].Max.X -= right - (canvases[i].Max.X - d.Max.X)
				}
				pn.plot.Draw(canvases[i])
			}
			area := c
			area.Max.Y = area.Min.Y + legendHeight
			legend.Draw(draw.Crop(area, margin, 0, 0, -margin))
		},
	}
}

// scatter returns the points as a scatter plot with one glyph style.
func scatter(pts [][2]float64, style draw.GlyphStyle) *plotter.Scatter {
	xys := make(plotter.XYs, len(pts))
	for i, p := range pts {
		xys[i] = plotter.XY{X: p[0], Y: p[1]}
	}
	sc, err := plotter.NewScatter(xys)
	if err != nil {
		panic("plot: " + err.Error())
	}
	sc.GlyphStyle = style
	return sc
}

// polyline strokes an open polyline.
type polyline struct {
	pts   [][2]float64
	style draw.LineStyle
}

// Plot implements plot.Plotter.
func (l *polyline) Plot(c draw.Canvas, p *gplot.Plot) {
	trX, trY := p.Transforms(&c)
	var path vg.Path
	for i, v := range l.pts {
		pt := vg.Point{X: trX(v[0]), Y: trY(v[1])}
		if i == 0 {
			path.Move(pt)
		} else {
			path.Line(pt)
		}
	}
	c.SetLineStyle(l.style)
	c.Stroke(path)
}

// DataRange implements plot.DataRanger.
func (l *polyline) DataRange() (xmin, xmax, ymin, ymax float64) { return boundingBox(l.pts) }

// Thumbnail implements plot.Thumbnailer.
func (l *polyline) Thumbnail(c *draw.Canvas) {
	y := (c.Min.Y + c.Max.Y) / 2
	c.StrokeLine2(l.style, c.Min.X, y, c.Max.X, y)
}

// valueBars draws each enclosure u[k] as a vertical bar with caps at s[k].
type valueBars struct {
	s []float64
	u []interval.I
}

const valueCapWidth = 3 * vg.Millimeter

// Plot implements plot.Plotter.
func (b *valueBars) Plot(c draw.Canvas, p *gplot.Plot) {
	trX, trY := p.Transforms(&c)
	half := vg.Length(valueCapWidth / 2)
	for k, s := range b.s {
		x, lo, hi := trX(s), trY(b.u[k].Lo), trY(b.u[k].Hi)
		c.StrokeLine2(valueBarStyle, x, lo, x, hi)
		c.StrokeLine2(valueBarStyle, x-half, lo, x+half, lo)
		c.StrokeLine2(valueBarStyle, x-half, hi, x+half, hi)
	}
}

// DataRange implements plot.DataRanger.
func (b *valueBars) DataRange() (xmin, xmax, ymin, ymax float64) {
	xmin, xmax, ymin, ymax = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for k, s := range b.s {
		xmin, xmax = math.Min(xmin, s), math.Max(xmax, s)
		ymin, ymax = math.Min(ymin, b.u[k].Lo), math.Max(ymax, b.u[k].Hi)
	}
	return xmin, xmax, ymin, ymax
}

// Thumbnail implements plot.Thumbnailer.
func (b *valueBars) Thumbnail(c *draw.Canvas) {
	x := (c.Min.X + c.Max.X) / 2
	c.StrokeLine2(valueBarStyle, x, c.Min.Y, x, c.Max.Y)
	c.StrokeLine2(valueBarStyle, x-valueCapWidth/2, c.Min.Y, x+valueCapWidth/2, c.Min.Y)
	c.StrokeLine2(valueBarStyle, x-valueCapWidth/2, c.Max.Y, x+valueCapWidth/2, c.Max.Y)
}
