package sweepplot

import (
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"slices"
	"strings"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gapcert/certs"
	"gapcert/certs/plot"
	"gapcert/interval"
)

// Layout of the pictures.
const (
	pictureWidth   = 12 * vg.Centimeter
	bandHeight     = 8 * vg.Centimeter // title and axes of a band
	mapHeight      = 9 * vg.Centimeter // title and axes of a map
	colourBarWidth = 2.6 * vg.Centimeter
	captionLine    = 0.42 * vg.Centimeter
	margin         = 0.25 * vg.Centimeter
	colourLevels   = 255
)

var (
	captionStyle = text.Style{
		Color:   color.Gray{Y: 0x40},
		Font:    font.From(gplot.DefaultFont, 8),
		XAlign:  draw.XLeft,
		YAlign:  draw.YBottom,
		Handler: gplot.DefaultTextHandler,
	}
	barColour      = plot.Blue
	shadeColour    = plot.Lighten(plot.Blue, 0.75)
	refBarColour   = plot.Orange
	refShadeColour = plot.Lighten(plot.Orange, 0.7)
	thresholdStyle = draw.LineStyle{Color: color.Black, Width: vg.Points(1), Dashes: []vg.Length{vg.Points(4), vg.Points(2)}}
	noCertColour   = color.Gray{Y: 0xd0}
	verdictOrder   = []string{certs.Holds, certs.Undecided, certs.Fails, ""}
	// The verdicts differ in shape as well as in (Okabe–Ito) colour.
	verdictGlyphs = map[string]draw.GlyphStyle{
		certs.Holds:     {Shape: draw.CircleGlyph{}, Color: plot.BluishGreen, Radius: vg.Points(3)},
		certs.Undecided: {Shape: mark{width: vg.Points(1.2)}, Color: plot.Black, Radius: vg.Points(4.5)},
		certs.Fails:     {Shape: mark{cross: true, width: vg.Points(1.5)}, Color: plot.Vermillion, Radius: vg.Points(4.5)},
		"":              {Shape: draw.SquareGlyph{}, Color: color.Gray{Y: 0x60}, Radius: vg.Points(2)},
	}
	// Map marks are black with a white halo, visible on every colour.
	mapGlyphs = map[string]draw.GlyphStyle{
		certs.Undecided: {Shape: mark{width: vg.Points(1.2), halo: true}, Color: color.Black, Radius: vg.Points(4.5)},
		certs.Fails:     {Shape: mark{cross: true, width: vg.Points(1.5), halo: true}, Color: color.Black, Radius: vg.Points(4.5)},
	}
)

// relWords are the relations as drawn, and negated are their negations.
var (
	relWords = map[string]string{">=": "≥", ">": ">", "<=": "≤", "<": "<"}
	negated  = map[string]string{">=": "<", ">": "≤", "<=": ">", "<": "≥"}
)

// picture is one image, drawn the same way in every format.
type picture struct {
	width, height vg.Length
	draw          func(c draw.Canvas)
}

// write renders pic into path, in the format named by its extension.
func (pic picture) write(path string) error {
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if !slices.Contains(plot.Formats(), ext) {
		return fmt.Errorf("%s: unknown picture format %q (hint: end the file name with .%s)", path, ext, strings.Join(plot.Formats(), " or ."))
	}
	return plot.Render(path, ext, pic.width, pic.height, pic.draw)
}

// Write draws the band into path (.png or .svg), in one panel.
func (b *Band) Write(path string) error { return b.picture(NoPanel).write(path) }

// WritePanel draws the band into path (.png or .svg) with a second panel
// under it (see Panel); NoPanel draws the band alone, as Write. A
// MarginPanel needs a band with a threshold.
func (b *Band) WritePanel(path string, extra Panel) error {
	if err := b.checkPanel(extra); err != nil {
		return err
	}
	return b.picture(extra).write(path)
}

// Write draws the map into path (.png or .svg).
func (m *Map) Write(path string) error { return m.picture().write(path) }

func (b *Band) picture(extra Panel) picture {
	q, r, t := plot.MathText(b.Quantity), plot.MathText(b.Reference), plot.MathText(b.Threshold)
	what := q
	if b.Reference != "" {
		what += " and of " + r
	}
	p := newPlot(plot.Drawable(b.Title) + "\ncertified enclosures of " + what)
	p.X.Label.Text = plot.MathText(b.X)
	p.Y.Label.Text = q
	if b.Reference != "" {
		p.Y.Label.Text = q + ", " + r
	}
	p.Add(plotter.NewGrid())
	legend := newLegend()

	lo, hi := b.yRange()
	pad := 0.06 * (hi - lo)
	if pad == 0 {
		pad = math.Max(1e-12, 0.01*math.Abs(hi))
	}
	p.Y.Min, p.Y.Max = lo-pad, hi+pad
	x0, x1 := b.Points[0].X, b.Points[len(b.Points)-1].X
	if xpad := 0.04 * (x1 - x0); xpad > 0 {
		p.X.Min, p.X.Max = x0-xpad, x1+xpad
	}

	quantity := func(pt BandPoint) interval.I { return pt.Quantity }
	reference := func(pt BandPoint) interval.I { return pt.Reference }
	// The shading joins the bars for the eye; it is drawn (and named in
	// the legend) only where it can be seen.
	visible := func(of func(BandPoint) interval.I) bool {
		return widest(b.Points, of) >= minVisible*(p.Y.Max-p.Y.Min)
	}
	var shades swatch
	if len(b.Points) > 1 {
		if b.Reference != "" && visible(reference) {
			p.Add(shading(b.Points, reference, refShadeColour))
			shades = append(shades, refShadeColour)
		}
		if visible(quantity) {
			p.Add(shading(b.Points, quantity, shadeColour))
			shades = append(swatch{shadeColour}, shades...)
		}
		if len(shades) > 0 {
			legend.Add("shading between points: for reading only, not certified", shades)
		}
	}
	if b.Reference != "" {
		refBars := &intervalBars{points: b.Points, of: reference, style: refBarStyle, capWidth: refCapWidth}
		p.Add(refBars)
		legend.Add("reference: certified enclosure of "+r+" at each point", refBars)
	}
	bars := &intervalBars{points: b.Points, of: quantity, style: barStyle, capWidth: capWidth}
	p.Add(bars)
	legend.Add("certified enclosure of "+q+" at each point", bars)

	if b.Threshold != "" {
		line := thresholdLine(b.Points)
		p.Add(line)
		legend.Add("threshold "+t, line)
	}
	b.addVerdicts(p, &legend, func(pt BandPoint) float64 { return pt.Quantity.Mid() })

	caption := []string{
		"certified: each bar encloses the quantity over the enclosures of one certificate;",
		"nothing is certified between the sampled parameter values.",
	}
	if b.Reference != "" {
		caption = append(caption[:1], "the orange reference bars likewise enclose "+r+" at each point;", caption[1])
	}
	narrow := !visible(quantity) || b.Reference != "" && !visible(reference)
	switch {
	case narrow && extra == WidthPanel:
		caption = append(caption, "The enclosures are narrower than a line at this scale; the lower panel shows their widths.")
	case narrow:
		caption = append(caption, "The enclosures are narrower than a line at this scale (a width panel shows their widths).")
	}
	if n := b.notes(); n != "" {
		caption = append(caption, n)
	}
	panels := []panel{{plot: p, height: bandHeight}}
	switch extra {
	case WidthPanel:
		panels = append(panels, b.widthPanel(p, &legend, &caption))
	case MarginPanel:
		panels = append(panels, b.marginPanel(p, &legend, &caption))
	}
	if len(panels) > 1 {
		p.X.Label.Text = ""
	}
	return framed(panels, legend, caption, pictureWidth, 0, nil)
}

// minVisible is the least height, as a fraction of a panel's y range,
// that a shading needs to be seen (about half a point on a band panel).
const minVisible = 0.003

// widest is the largest width of the enclosures of(pt).
func widest(points []BandPoint, of func(BandPoint) interval.I) float64 {
	w := 0.0
	for _, pt := range points {
		w = math.Max(w, of(pt).Wid())
	}
	return w
}

// addVerdicts marks each point at height y(pt) by its verdict, with a
// legend entry for each verdict that occurs.
func (b *Band) addVerdicts(p *gplot.Plot, legend *gplot.Legend, y func(BandPoint) float64) {
	q, t := plot.MathText(b.Quantity), plot.MathText(b.Threshold)
	rel := relWords[b.Rel]
	for _, v := range verdictOrder {
		var xys plotter.XYs
		for _, pt := range b.Points {
			if pt.Verdict == v {
				xys = append(xys, plotter.XY{X: pt.X, Y: y(pt)})
			}
		}
		if len(xys) == 0 {
			continue
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			panic("sweepplot: " + err.Error())
		}
		sc.GlyphStyle = verdictGlyphs[v]
		p.Add(sc)
		if legend == nil {
			continue
		}
		var what string
		switch {
		case b.Threshold == "" && v == "":
			what = "no claims"
		case b.Threshold == "":
			what = map[string]string{certs.Holds: "every claim holds", certs.Undecided: "a claim is undecided, none fails", certs.Fails: "a claim fails"}[v] + " (the point's certificate)"
		case v == certs.Holds:
			what = "holds: " + q + " " + rel + " " + t + " for all values in the enclosures"
		case v == certs.Undecided:
			what = "undecided: neither holds nor fails on the whole enclosures"
		case v == certs.Fails:
			what = "fails: " + q + " " + negated[b.Rel] + " " + t + " for all values in the enclosures"
		}
		legend.Add(fmt.Sprintf("%s (%d)", what, len(xys)), sc)
	}
}

// notes says which points are not drawn and where the enclosures came from.
func (b *Band) notes() string { return notes(b.Uncertified, b.Missing) }

func notes(uncertified []int, missing int) string {
	var s []string
	if n := len(uncertified); n > 0 {
		s = append(s, fmt.Sprintf("%d point(s) without a certificate not drawn.", n))
	}
	if missing > 0 {
		s = append(s, fmt.Sprintf("%d certificate file(s) not found (enclosures from the summary).", missing))
	}
	return strings.Join(s, " ")
}

// yRange is the extent of the enclosures, references and thresholds.
func (b *Band) yRange() (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, pt := range b.Points {
		lo, hi = math.Min(lo, pt.Quantity.Lo), math.Max(hi, pt.Quantity.Hi)
		if b.Reference != "" {
			lo, hi = math.Min(lo, pt.Reference.Lo), math.Max(hi, pt.Reference.Hi)
		}
		if b.Threshold != "" {
			lo, hi = math.Min(lo, pt.Threshold.Lo), math.Max(hi, pt.Threshold.Hi)
		}
	}
	return lo, hi
}

// shading is the polygon between the upper and the lower ends of the
// enclosures of(pt) of the points, for reading only.
func shading(points []BandPoint, of func(BandPoint) interval.I, colour color.Color) *plotter.Polygon {
	ring := make(plotter.XYs, 0, 2*len(points))
	for _, pt := range points {
		ring = append(ring, plotter.XY{X: pt.X, Y: of(pt).Hi})
	}
	for i := len(points) - 1; i >= 0; i-- {
		ring = append(ring, plotter.XY{X: points[i].X, Y: of(points[i]).Lo})
	}
	shade, err := plotter.NewPolygon(ring)
	if err != nil {
		panic("sweepplot: " + err.Error()) // the ends were checked finite
	}
	shade.Color, shade.LineStyle.Width = colour, 0
	return shade
}

// thresholdLine joins the thresholds of the points (a horizontal line
// when they are all the same enclosure).
func thresholdLine(points []BandPoint) *plotter.Line {
	xys := make(plotter.XYs, len(points))
	for i, pt := range points {
		xys[i] = plotter.XY{X: pt.X, Y: pt.Threshold.Mid()}
	}
	line, err := plotter.NewLine(xys)
	if err != nil {
		panic("sweepplot: " + err.Error())
	}
	line.LineStyle = thresholdStyle
	return line
}

func (m *Map) picture() picture {
	side := "lhs − rhs"
	if m.Rel == "<=" || m.Rel == "<" {
		side = "rhs − lhs"
	}
	p := newPlot(plot.Drawable(m.Title) + "\nclaim " + plot.MathText(m.Claim) + "\ncolour: certified lower bound of " + side)
	p.X.Label.Text = plot.MathText(m.X)
	p.Y.Label.Text = plot.MathText(m.Y)
	xs, ys := m.axes()
	g := &marginGrid{xs: xs, ys: ys, z: make([]float64, len(xs)*len(ys))}
	for i := range g.z {
		g.z[i] = math.NaN()
	}
	// The colour scale spans the finite lower bounds: diverging about 0
	// when they have both signs, else sequential over their range.
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, c := range m.Cells {
		if !math.IsInf(c.Margin, 0) {
			lo, hi = math.Min(lo, c.Margin), math.Max(hi, c.Margin)
		}
	}
	if lo > hi { // no finite bound
		lo, hi = -1, 1
	}
	colours, lo, hi := plot.ScaleFor(lo, hi)
	for _, c := range m.Cells {
		// An infinite bound (a claim that could not be enclosed) is drawn
		// at the end of the colour scale.
		g.z[slices.Index(ys, c.Y)*len(xs)+slices.Index(xs, c.X)] = math.Max(lo, math.Min(hi, c.Margin))
	}
	heat := plotter.NewHeatMap(g, colours.Palette(colourLevels))
	heat.Min, heat.Max, heat.NaN = lo, hi, noCertColour
	p.Add(heat)

	legend := newLegend()
	for _, v := range []string{certs.Undecided, certs.Fails} {
		var xys plotter.XYs
		for _, c := range m.Cells {
			if c.Verdict == v {
				xys = append(xys, plotter.XY{X: c.X, Y: c.Y})
			}
		}
		if len(xys) == 0 {
			continue
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			panic("sweepplot: " + err.Error())
		}
		sc.GlyphStyle = mapGlyphs[v]
		p.Add(sc)
		what := "undecided: the enclosure of " + side + " does not settle the claim"
		if v == certs.Fails {
			what = "fails: certified for the whole enclosure"
		}
		legend.Add(fmt.Sprintf("%s (%d)", what, len(xys)), sc)
	}
	if slices.ContainsFunc(g.z, math.IsNaN) {
		legend.Add("no certificate at this grid point", swatch{noCertColour})
	}

	bar := gplot.New()
	bar.HideX()
	bar.Y.Label.Text = "lower bound of " + side
	bar.Y.Tick.Marker = plot.RoundTicks{}
	bar.Add(&plotter.ColorBar{ColorMap: colours, Vertical: true, Colors: colourLevels})
	bar.Y.Min, bar.Y.Max = lo, hi

	caption := []string{
		"certified: each cell is one certificate, coloured by the lower end of its",
		"enclosure of " + side + "; unmarked cells hold; nothing is certified between grid points.",
	}
	if lo == -hi {
		caption = append(caption, "Colour scale diverging about 0 (blue below, red above), symmetric.")
	} else {
		caption = append(caption, "Colour scale sequential over the bounds drawn (every bound has one sign).")
	}
	if n := notes(m.Uncertified, m.Missing); n != "" {
		caption = append(caption, n)
	}
	return framed([]panel{{plot: p, height: mapHeight}}, legend, caption, pictureWidth, colourBarWidth, bar)
}

// axes returns the distinct parameter values of the cells, increasing.
func (m *Map) axes() (xs, ys []float64) {
	for _, c := range m.Cells {
		xs, ys = append(xs, c.X), append(ys, c.Y)
	}
	slices.Sort(xs)
	slices.Sort(ys)
	return slices.Compact(xs), slices.Compact(ys)
}

// marginGrid is the plotter.GridXYZ of a map (NaN where no certificate).
type marginGrid struct {
	xs, ys []float64
	z      []float64 // row-major, rows along ys
}

func (g *marginGrid) Dims() (c, r int)   { return len(g.xs), len(g.ys) }
func (g *marginGrid) Z(c, r int) float64 { return g.z[r*len(g.xs)+c] }
func (g *marginGrid) X(c int) float64    { return g.xs[c] }
func (g *marginGrid) Y(r int) float64    { return g.ys[r] }

// newPlot returns a plot with a (possibly multi-line) title.
func newPlot(title string) *gplot.Plot {
	p := gplot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(gplot.DefaultFont, 11)
	p.Title.Padding = 0.2 * vg.Centimeter
	p.X.Tick.Marker, p.Y.Tick.Marker = plot.RoundTicks{}, plot.RoundTicks{}
	return p
}

func newLegend() gplot.Legend {
	l := gplot.NewLegend()
	l.TextStyle.Font = font.From(gplot.DefaultFont, 9)
	l.Left, l.Top = true, true
	l.Padding = vg.Points(1.5)
	return l
}

// panel is one plot of a picture and the height it takes.
type panel struct {
	plot   *gplot.Plot
	height vg.Length
}

// framed lays out a picture: the panels one above the other, their data
// areas aligned (with a colour bar of the given width right of the first
// when bar is not nil), the legend below them and the caption lines at the
// foot, on a white background.
func framed(panels []panel, legend gplot.Legend, caption []string, width, barWidth vg.Length, bar *gplot.Plot) picture {
	r := legend.Rectangle(draw.Canvas{})
	legendHeight := r.Max.Y - r.Min.Y + 2*margin
	captionHeight := vg.Length(len(caption))*captionLine + margin
	var plotsHeight vg.Length
	for _, pn := range panels {
		plotsHeight += pn.height
	}
	return picture{
		width:  width,
		height: plotsHeight + legendHeight + captionHeight,
		draw: func(c draw.Canvas) {
			c.SetColor(color.White)
			c.Fill(c.Rectangle.Path())
			for i, line := range caption {
				y := c.Min.Y + margin/2 + vg.Length(len(caption)-1-i)*captionLine
				c.FillText(captionStyle, vg.Point{X: c.Min.X + margin, Y: y}, plot.Drawable(line))
			}
			c = draw.Crop(c, margin, -margin, captionHeight, -margin)
			area := draw.Crop(c, 0, 0, legendHeight, 0)
			// Cut the area into the panels, top down, and align the left
			// and right edges of their data areas.
			canvases := make([]draw.Canvas, len(panels))
			top := area.Max.Y
			for i, pn := range panels {
				canvases[i] = draw.Crop(area, 0, -barWidth, 0, 0)
				canvases[i].Max.Y, canvases[i].Min.Y = top, top-pn.height
				top -= pn.height
			}
			if len(panels) > 1 {
				var left, right vg.Length
				for i, pn := range panels {
					d := pn.plot.DataCanvas(canvases[i])
					left = max(left, d.Min.X-canvases[i].Min.X)
					right = max(right, canvases[i].Max.X-d.Max.X)
				}
				for i, pn := range panels {
					d := pn.plot.DataCanvas(canvases[i])
					canvases[i].Min.X += left - (d.Min.X - canvases[i].Min.X)
					canvases[i].Max.X -= right - (canvases[i].Max.X - d.Max.X)
				}
			}
			for i, pn := range panels {
				pn.plot.Draw(canvases[i])
			}
			if bar != nil {
				main := canvases[0]
				data := panels[0].plot.DataCanvas(main)
				strip := draw.Crop(area, area.Max.X-area.Min.X-barWidth+margin, -margin, 0, 0)
				strip.Min.Y, strip.Max.Y = data.Min.Y, data.Max.Y
				barData := bar.DataCanvas(strip)
				strip.Min.Y -= barData.Min.Y - data.Min.Y
				strip.Max.Y += data.Max.Y - barData.Max.Y
				bar.Draw(strip)
			}
			legendArea := draw.Crop(c, 0, 0, 0, -(c.Max.Y - c.Min.Y - legendHeight))
			legend.Draw(draw.Crop(legendArea, margin, 0, 0, -margin))
		},
	}
}

// intervalBars draws the enclosure of(pt) = [lo, hi] of each point as a
// vertical bar with caps.
type intervalBars struct {
	points   []BandPoint
	of       func(BandPoint) interval.I
	style    draw.LineStyle
	capWidth vg.Length
}

// The bars of the quantity, and the wider caps of the reference (so that
// a reference under a quantity's bar stays visible).
var (
	barStyle    = draw.LineStyle{Color: barColour, Width: vg.Points(1.2)}
	refBarStyle = draw.LineStyle{Color: refBarColour, Width: vg.Points(1.2)}
)

const (
	capWidth    = 3 * vg.Millimeter
	refCapWidth = 5 * vg.Millimeter
)

// Plot implements plot.Plotter. Caps are at most 3/4 of the distance
// between neighbouring points, so that they do not join.
func (b *intervalBars) Plot(c draw.Canvas, p *gplot.Plot) {
	trX, trY := p.Transforms(&c)
	half := b.capWidth / 2
	for i := 1; i < len(b.points); i++ {
		if d := trX(b.points[i].X) - trX(b.points[i-1].X); d > 0 {
			half = min(half, 3*d/8)
		}
	}
	for _, pt := range b.points {
		e := b.of(pt)
		x, lo, hi := trX(pt.X), trY(e.Lo), trY(e.Hi)
		c.StrokeLine2(b.style, x, lo, x, hi)
		c.StrokeLine2(b.style, x-half, lo, x+half, lo)
		c.StrokeLine2(b.style, x-half, hi, x+half, hi)
	}
}

// DataRange implements plot.DataRanger.
func (b *intervalBars) DataRange() (xmin, xmax, ymin, ymax float64) {
	xmin, xmax, ymin, ymax = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, pt := range b.points {
		e := b.of(pt)
		xmin, xmax = math.Min(xmin, pt.X), math.Max(xmax, pt.X)
		ymin, ymax = math.Min(ymin, e.Lo), math.Max(ymax, e.Hi)
	}
	return xmin, xmax, ymin, ymax
}

// Thumbnail implements plot.Thumbnailer.
func (b *intervalBars) Thumbnail(c *draw.Canvas) {
	x := (c.Min.X + c.Max.X) / 2
	c.StrokeLine2(b.style, x, c.Min.Y, x, c.Max.Y)
	c.StrokeLine2(b.style, x-b.capWidth/2, c.Min.Y, x+b.capWidth/2, c.Min.Y)
	c.StrokeLine2(b.style, x-b.capWidth/2, c.Max.Y, x+b.capWidth/2, c.Max.Y)
}

// mark is a glyph drawn with a line of its own width (gonum's ring and
// cross use a hairline): a ring, or a cross "×" when cross is set, with a
// white halo under it when halo is set, so that it stays visible on dark
// and light colours alike.
type mark struct {
	cross bool
	width vg.Length
	halo  bool
}

// DrawGlyph implements draw.GlyphDrawer.
func (m mark) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	var path vg.Path
	r := sty.Radius
	if m.cross {
		d := r * 0.7071 // the arms end on the circle of radius r
		path.Move(vg.Point{X: pt.X - d, Y: pt.Y - d})
		path.Line(vg.Point{X: pt.X + d, Y: pt.Y + d})
		path.Move(vg.Point{X: pt.X - d, Y: pt.Y + d})
		path.Line(vg.Point{X: pt.X + d, Y: pt.Y - d})
	} else {
		path.Move(vg.Point{X: pt.X + r, Y: pt.Y})
		path.Arc(pt, r, 0, 2*math.Pi)
		path.Close()
	}
	if m.halo {
		c.SetLineStyle(draw.LineStyle{Color: color.White, Width: m.width + vg.Points(2)})
		c.Stroke(path)
	}
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: m.width})
	c.Stroke(path)
}

// swatch is a legend thumbnail filled with colours, in vertical stripes
// of equal width.
type swatch []color.Color

// Thumbnail implements plot.Thumbnailer.
func (s swatch) Thumbnail(c *draw.Canvas) {
	w := (c.Max.X - c.Min.X) / vg.Length(len(s))
	for i, colour := range s {
		stripe := c.Rectangle
		stripe.Min.X = c.Min.X + vg.Length(i)*w
		stripe.Max.X = stripe.Min.X + w
		c.SetColor(colour)
		c.Fill(stripe.Path())
	}
}
