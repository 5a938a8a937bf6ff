package plot

import (
	"fmt"
	"image/color"

	"math"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Layout of the pictures.
const (
	pictureWidth   = 12 * vg.Centimeter
	lineHeight     = 8 * vg.Centimeter   // title and axes of the 1D picture
	minHeight      = 7 * vg.Centimeter   // bounds on the height of 2D pictures,
	maxHeight      = 13 * vg.Centimeter  // which follows the domain's aspect ratio
	colourBarWidth = 2.4 * vg.Centimeter // the strip right of a colour map
	captionHeight  = 0.6 * vg.Centimeter
	margin         = 0.25 * vg.Centimeter
)

// colourLevels is the number of palette colours of a colour map.
const colourLevels = 255

var (
	captionStyle = text.Style{
		Color:   color.Gray{Y: 0x40},
		Font:    font.From(gplot.DefaultFont, 9),
		XAlign:  draw.XLeft,
		YAlign:  draw.YBottom,
		Handler: gplot.DefaultTextHandler,
	}
	meshStyle    = draw.LineStyle{Color: color.Gray{Y: 0x99}, Width: vg.Points(0.4)}
	outlineStyle = draw.LineStyle{Color: color.Black, Width: vg.Points(1.2)}
)

// The curves of the modes of a 1D picture: Okabe–Ito colours and, so that
// grey print keeps them apart, a dash pattern each.
var (
	modeColours = []color.Color{Blue, Vermillion, BluishGreen, ReddishPurple, Orange, SkyBlue, Black}
	modeDashes  = [][]vg.Length{
		nil,
		{vg.Points(6), vg.Points(3)},
		{vg.Points(1.5), vg.Points(2)},
		{vg.Points(6), vg.Points(2), vg.Points(1.5), vg.Points(2)},
	}
)

// linePicture draws the normalised modes of a 1D problem as curves, with a
// legend of the labels (and of the boundary conditions, drawn at the ends)
// below the axes and the caption at the foot.
func linePicture(m *Modes, s lineSamples) picture {
	p := newPlot(titleOf(m) + "\napproximate eigenfunctions")
	p.X.Label.Text = "x"
	p.Y.Label.Text = "u / max |u|"
	p.Add(plotter.NewGrid())
	legend := newLegend()
	if m.Boundary != nil {
		styles, entries := sideStyles(m.Boundary)
		p.Add(&sideLines{interval: m.Interval, styles: styles})
		for _, e := range entries {
			legend.Add(e.text, e)
		}
	}
	for k, u := range s.u {
		xys := make(plotter.XYs, len(u))
		for i := range u {
			xys[i] = plotter.XY{X: s.x[i], Y: u[i]}
		}
		line, err := plotter.NewLine(xys)
		if err != nil {
			panic("plot: " + err.Error()) // the samples were checked finite
		}
		line.Color = modeColours[k%len(modeColours)]
		line.Dashes = modeDashes[k%len(modeDashes)]
		line.Width = vg.Points(1.5)
		p.Add(line)
		legend.Add(fmt.Sprintf("mode %d: %s", k+1, drawable(LambdaSubscripts(m.Labels[k]))), line)
	}
	p.X.Min, p.X.Max = m.Interval[0], m.Interval[1]
	p.Y.Min, p.Y.Max = -1.05, 1.05

	legendHeight := heightOf(legend, len(s.u)+len(m.Boundary))
	return picture{
		name:   "modes",
		width:  pictureWidth,
		height: lineHeight + legendHeight + captionHeight,
		draw: func(c draw.Canvas) {
			c = drawFrame(c)
			p.Draw(draw.Crop(c, 0, 0, legendHeight, 0))
			drawLegend(c, legend, legendHeight)
		},
	}
}

// newLegend returns an empty legend, drawn below a plot.
func newLegend() gplot.Legend {
	l := gplot.NewLegend()
	l.Left, l.Top = true, true
	l.TextStyle.Font = font.From(gplot.DefaultFont, 10)
	return l
}

// heightOf is the height a legend of n entries takes below a plot.
func heightOf(l gplot.Legend, n int) vg.Length {
	if n == 0 {
		return 0
	}
	r := l.Rectangle(draw.Canvas{})
	return r.Max.Y - r.Min.Y + 2*margin
}

// drawLegend draws l in the strip of the given height at the foot of c.
func drawLegend(c draw.Canvas, l gplot.Legend, height vg.Length) {
	if height == 0 {
		return
	}
	area := draw.Crop(c, 0, 0, 0, -(c.Max.Y - c.Min.Y - height))
	l.Draw(draw.Crop(area, margin, 0, 0, -margin))
}

// meshPicture draws the triangles of m and the polygon outline, or, when
// m.Boundary is given, each side in the style of its condition with a
// legend below.
func meshPicture(m *Modes) picture {
	count := fmt.Sprintf("%d triangles", len(m.Triangles))
	if len(m.Triangles) == 1 {
		count = "1 triangle"
	}
	p := newPlot(titleOf(m) + "\nmesh: " + count)
	p.X.Label.Text, p.Y.Label.Text = "x", "y"
	tris := make([][][2]float64, len(m.Triangles))
	for i, t := range m.Triangles {
		tris[i] = t[:]
	}
	p.Add(&closedPaths{paths: tris, style: meshStyle})
	legend := newLegend()
	var entries []sideEntry
	if m.Boundary == nil {
		p.Add(&closedPaths{paths: [][][2]float64{m.Polygon}, style: outlineStyle})
	} else {
		var styles []draw.LineStyle
		styles, entries = sideStyles(m.Boundary)
		p.Add(&sideLines{polygon: m.Polygon, styles: styles})
		for _, e := range entries {
			legend.Add(e.text, e)
		}
	}
	legendHeight := heightOf(legend, len(entries))
	return picture{
		name:   "mesh",
		width:  pictureWidth,
		height: surfaceHeight(p, m.Polygon) + legendHeight,
		draw: func(c draw.Canvas) {
			// The same drawing area as a mode picture's, centred.
			c = drawFrame(c)
			drawLegend(c, legend, legendHeight)
			c = draw.Crop(c, colourBarWidth/2, -colourBarWidth/2, legendHeight, 0)
			equalAspect(p, c, m.Polygon, m.Triangles)
			p.Draw(c)
		},
	}
}

// modePicture draws mode k of m as a colour map on the grid g, with the
// polygon outline and a colour bar on the right. The colour scale is
// ScaleFor the mode's sampled values: diverging about 0 when the mode
// changes sign (nodal lines show as light grey curves), sequential over
// its own range otherwise.
func modePicture(m *Modes, k int, g *grid) picture {
	p := newPlot(fmt.Sprintf("%s\nmode %d: %s", titleOf(m), k+1, drawable(LambdaSubscripts(m.Labels[k]))))
	p.X.Label.Text, p.Y.Label.Text = "x", "y"
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range g.z {
		if !math.IsNaN(v) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	colours, lo, hi := ScaleFor(lo, hi)
	heat := &plotter.HeatMap{GridXYZ: g, Palette: colours.Palette(colourLevels), Min: lo, Max: hi, Rasterized: true}
	p.Add(rasterOnly{heat})
	p.Add(&closedPaths{paths: [][][2]float64{m.Polygon}, style: outlineStyle})

	bar := gplot.New()
	bar.HideX()
	bar.Y.Label.Text = "u / max |u|"
	bar.Y.Tick.Marker = RoundTicks{}
	bar.Add(&plotter.ColorBar{ColorMap: colours, Vertical: true, Colors: colourLevels})
	bar.Y.Min, bar.Y.Max = lo, hi
	return picture{
		name:   fmt.Sprintf("mode%d", k+1),
		width:  pictureWidth,
		height: surfaceHeight(p, m.Polygon),
		draw: func(c draw.Canvas) {
			c = drawFrame(c)
			main := draw.Crop(c, 0, -colourBarWidth, 0, 0)
			equalAspect(p, main, m.Polygon, nil)
			p.Draw(main)
			// Align the bar's data area with the colour map's.
			data := p.DataCanvas(main)
			strip := draw.Crop(c, c.Max.X-c.Min.X-colourBarWidth+margin, -margin, 0, 0)
			strip.Min.Y, strip.Max.Y = data.Min.Y, data.Max.Y
			barData := bar.DataCanvas(strip)
			strip.Min.Y -= barData.Min.Y - data.Min.Y
			strip.Max.Y += data.Max.Y - barData.Max.Y
			bar.Draw(strip)
		},
	}
}

// newPlot returns a plot with the given (possibly multi-line) title and
// ticks at round values.
func newPlot(title string) *gplot.Plot {
	p := gplot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(gplot.DefaultFont, 11)
	p.Title.Padding = 0.2 * vg.Centimeter
	p.X.Tick.Marker, p.Y.Tick.Marker = RoundTicks{}, RoundTicks{}
	return p
}

// drawFrame paints c white, writes the caption at its foot and returns
// the area left above the caption, inside the margin.
func drawFrame(c draw.Canvas) draw.Canvas {
	c.SetColor(color.White)
	c.Fill(c.Rectangle.Path())
	c.FillText(captionStyle, vg.Point{X: c.Min.X + margin, Y: c.Min.Y + margin/2}, Caption)
	return draw.Crop(c, margin, -margin, captionHeight, -margin)
}

// surfaceHeight returns the height of a 2D picture of plot p whose data
// area just holds the polygon at its aspect ratio, within [minHeight,
// maxHeight]. The drawing area is as wide as a mode picture's.
func surfaceHeight(p *gplot.Plot, poly [][2]float64) vg.Length {
	const trial = 10 * vg.Centimeter
	area := draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: pictureWidth - 2*margin - colourBarWidth, Y: trial}}}
	x0, x1, y0, y1 := boundingBox(poly)
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x0, x1, y0, y1
	data := p.DataCanvas(area)
	dataWidth, dataHeight := data.Max.X-data.Min.X, data.Max.Y-data.Min.Y
	plotHeight := trial - dataHeight + dataWidth*vg.Length((y1-y0)/(x1-x0))
	return min(maxHeight, max(minHeight, plotHeight+captionHeight+margin))
}

// equalAspect sets the axis ranges of p to the bounding box of the given
// points, padded by 3%, and widens one of them so that a unit of x and a
// unit of y have the same length on c. The tick labels change with the
// ranges, so the adjustment is repeated a few times.
func equalAspect(p *gplot.Plot, c draw.Canvas, outline [][2]float64, tris [][3][2]float64) {
	x0, x1, y0, y1 := boundingBox(outline)
	for _, t := range tris {
		a, b, cc, d := boundingBox(t[:])
		x0, x1, y0, y1 = min(x0, a), max(x1, b), min(y0, cc), max(y1, d)
	}
	pad := 0.03 * max(x1-x0, y1-y0)
	x0, x1, y0, y1 = x0-pad, x1+pad, y0-pad, y1+pad
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x0, x1, y0, y1
	for range 3 {
		data := p.DataCanvas(c)
		w, h := float64(data.Max.X-data.Min.X), float64(data.Max.Y-data.Min.Y)
		perPoint := max((x1-x0)/w, (y1-y0)/h) // data units per point
		xm, ym := (x0+x1)/2, (y0+y1)/2
		p.X.Min, p.X.Max = xm-perPoint*w/2, xm+perPoint*w/2
		p.Y.Min, p.Y.Max = ym-perPoint*h/2, ym+perPoint*h/2
	}
}

// rasterOnly draws a heat map but hides its glyph boxes: plotter.HeatMap
// reports one empty box per cell, which only costs time (the axis ranges
// are set by equalAspect).
type rasterOnly struct{ heat *plotter.HeatMap }

// Plot implements plot.Plotter.
func (r rasterOnly) Plot(c draw.Canvas, p *gplot.Plot) { r.heat.Plot(c, p) }

// closedPaths is a plot.Plotter that strokes closed polylines, all in one
// path, with one line style.
type closedPaths struct {
	paths [][][2]float64
	style draw.LineStyle
}

// Plot implements plot.Plotter.
func (o *closedPaths) Plot(c draw.Canvas, p *gplot.Plot) {
	trX, trY := p.Transforms(&c)
	var path vg.Path
	for _, poly := range o.paths {
		for i, v := range poly {
			pt := vg.Point{X: trX(v[0]), Y: trY(v[1])}
			if i == 0 {
				path.Move(pt)
			} else {
				path.Line(pt)
			}
		}
		path.Close()
	}
	c.SetLineStyle(o.style)
	c.Stroke(path)
}

// DataRange implements plot.DataRanger.
func (o *closedPaths) DataRange() (xmin, xmax, ymin, ymax float64) {
	xmin, xmax, ymin, ymax = boundingBox(o.paths[0])
	for _, poly := range o.paths[1:] {
		a, b, c, d := boundingBox(poly)
		xmin, xmax, ymin, ymax = min(xmin, a), max(xmax, b), min(ymin, c), max(ymax, d)
	}
	return xmin, xmax, ymin, ymax
}
