package plot

import (
	"fmt"
	"image/color"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
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
	meshStyle    = draw.LineStyle{Color: color.Gray{Y: 0x80}, Width: vg.Points(0.4)}
	outlineStyle = draw.LineStyle{Color: color.Black, Width: vg.Points(1.2)}
)

// linePicture draws the normalised modes of a 1D problem as curves, with a
// legend of the labels below the axes and the caption at the foot.
func linePicture(m *Modes, s lineSamples) picture {
	p := newPlot(titleOf(m) + "\napproximate eigenfunctions")
	p.X.Label.Text = "x"
	p.Y.Label.Text = "u / max |u|"
	p.Add(plotter.NewGrid())
	legend := gplot.NewLegend()
	legend.Left, legend.Top = true, true
	legend.TextStyle.Font = font.From(gplot.DefaultFont, 10)
	for k, u := range s.u {
		xys := make(plotter.XYs, len(u))
		for i := range u {
			xys[i] = plotter.XY{X: s.x[i], Y: u[i]}
		}
		line, err := plotter.NewLine(xys)
		if err != nil {
			panic("plot: " + err.Error()) // the samples were checked finite
		}
		line.Color = plotutil.Color(k)
		line.Dashes = plotutil.Dashes(k / len(plotutil.DefaultColors))
		line.Width = vg.Points(1.3)
		p.Add(line)
		legend.Add(drawable(fmt.Sprintf("mode %d: %s", k+1, m.Labels[k])), line)
	}
	p.X.Min, p.X.Max = m.Interval[0], m.Interval[1]
	p.Y.Min, p.Y.Max = -1.05, 1.05

	r := legend.Rectangle(draw.Canvas{})
	legendHeight := r.Max.Y - r.Min.Y + 2*margin
	return picture{
		name:   "modes",
		width:  pictureWidth,
		height: lineHeight + legendHeight + captionHeight,
		draw: func(c draw.Canvas) {
			c = drawFrame(c)
			p.Draw(draw.Crop(c, 0, 0, legendHeight, 0))
			legendArea := draw.Crop(c, 0, 0, 0, -(c.Max.Y - c.Min.Y - legendHeight))
			legend.Draw(draw.Crop(legendArea, margin, 0, 0, -margin))
		},
	}
}

// meshPicture draws the triangles of m and the polygon outline.
func meshPicture(m *Modes) picture {
	count := fmt.Sprintf("%d triangles", len(m.Triangles))
	if len(m.Triangles) == 1 {
		count = "1 triangle"
	}
	p := newPlot(titleOf(m) + "\nmesh: " + count)
	tris := make([][][2]float64, len(m.Triangles))
	for i, t := range m.Triangles {
		tris[i] = t[:]
	}
	p.Add(&closedPaths{paths: tris, style: meshStyle})
	p.Add(&closedPaths{paths: [][][2]float64{m.Polygon}, style: outlineStyle})
	return picture{
		name:   "mesh",
		width:  pictureWidth,
		height: surfaceHeight(p, m.Polygon),
		draw: func(c draw.Canvas) {
			// The same drawing area as a mode picture's, centred.
			c = drawFrame(c)
			c = draw.Crop(c, colourBarWidth/2, -colourBarWidth/2, 0, 0)
			equalAspect(p, c, m.Polygon, m.Triangles)
			p.Draw(c)
		},
	}
}

// modePicture draws mode k of m as a colour map on the grid g, with the
// polygon outline and a colour bar on the right.
func modePicture(m *Modes, k int, g *grid) picture {
	p := newPlot(fmt.Sprintf("%s\nmode %d: %s", titleOf(m), k+1, drawable(m.Labels[k])))
	colours := moreland.SmoothBlueRed()
	colours.SetMin(-1)
	colours.SetMax(1)
	heat := &plotter.HeatMap{GridXYZ: g, Palette: colours.Palette(colourLevels), Min: -1, Max: 1, Rasterized: true}
	p.Add(rasterOnly{heat})
	p.Add(&closedPaths{paths: [][][2]float64{m.Polygon}, style: outlineStyle})

	bar := gplot.New()
	bar.HideX()
	bar.Y.Label.Text = "u / max |u|"
	bar.Add(&plotter.ColorBar{ColorMap: colours, Vertical: true, Colors: colourLevels})
	bar.Y.Min, bar.Y.Max = -1, 1
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

// newPlot returns a plot with the given (possibly multi-line) title.
func newPlot(title string) *gplot.Plot {
	p := gplot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(gplot.DefaultFont, 11)
	p.Title.Padding = 0.2 * vg.Centimeter
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
