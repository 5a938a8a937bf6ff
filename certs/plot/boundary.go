package plot

import (
	"image/color"
	"slices"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Kinds of boundary condition, as Side.Kind spells them (the words of
// problem files).
const (
	DirichletSide = "dirichlet" // u = 0
	NeumannSide   = "neumann"   // ∂u/∂n = 0
	RobinSide     = "robin"     // ∂u/∂n + αu = 0
)

// Side is the boundary condition on one side of the domain, for drawing.
type Side struct {
	Kind  string // DirichletSide, NeumannSide or RobinSide
	Alpha string // the Robin coefficient as written (Kind RobinSide only)
}

// sideWidth is the width of a boundary side's line.
const sideWidth = 2.6

// robinColours colour the Robin sides, one colour for each coefficient in
// order of first appearance (cycling after five).
var robinColours = []color.Color{Vermillion, BluishGreen, ReddishPurple, Orange, SkyBlue}

// sideStyles returns the line style of each side and the legend entries:
// one per kind (Dirichlet solid black, Neumann dashed blue) and one per
// Robin coefficient (dash-dotted, coloured), in the order of the sides.
func sideStyles(sides []Side) (styles []draw.LineStyle, entries []sideEntry) {
	var alphas []string
	for _, s := range sides {
		style := draw.LineStyle{Width: vg.Points(sideWidth)}
		var text string
		switch s.Kind {
		case DirichletSide:
			style.Color = Black
			text = "Dirichlet: u = 0"
		case NeumannSide:
			style.Color = Blue
			style.Dashes = []vg.Length{vg.Points(7), vg.Points(3.5)}
			text = "Neumann: ∂u/∂n = 0"
		case RobinSide:
			i := slices.Index(alphas, s.Alpha)
			if i < 0 {
				i = len(alphas)
				alphas = append(alphas, s.Alpha)
			}
			style.Color = robinColours[i%len(robinColours)]
			style.Dashes = []vg.Length{vg.Points(7), vg.Points(2.5), vg.Points(1.5), vg.Points(2.5)}
			text = "Robin: ∂u/∂n + αu = 0, α = " + drawable(s.Alpha)
		}
		styles = append(styles, style)
		if !slices.ContainsFunc(entries, func(e sideEntry) bool { return e.text == text }) {
			entries = append(entries, sideEntry{text: text, style: style})
		}
	}
	return styles, entries
}

// sideEntry is a legend entry of a boundary condition.
type sideEntry struct {
	text  string
	style draw.LineStyle
}

// Thumbnail implements plot.Thumbnailer: a horizontal stroke.
func (e sideEntry) Thumbnail(c *draw.Canvas) {
	y := (c.Min.Y + c.Max.Y) / 2
	c.StrokeLine2(e.style, c.Min.X, y, c.Max.X, y)
}

// sideLines is a plot.Plotter that strokes each side of a polygon (side i
// from vertex i to vertex i+1 mod n), or each end of an interval (as a
// vertical line over the y range), in its own style.
type sideLines struct {
	polygon  [][2]float64 // nil for an interval
	interval [2]float64
	styles   []draw.LineStyle
}

// Plot implements plot.Plotter.
func (s *sideLines) Plot(c draw.Canvas, p *gplot.Plot) {
	trX, trY := p.Transforms(&c)
	if s.polygon == nil {
		for i, x := range s.interval {
			c.StrokeLine2(s.styles[i], trX(x), c.Min.Y, trX(x), c.Max.Y)
		}
		return
	}
	n := len(s.polygon)
	for i, v := range s.polygon {
		w := s.polygon[(i+1)%n]
		c.StrokeLine2(s.styles[i], trX(v[0]), trY(v[1]), trX(w[0]), trY(w[1]))
	}
}
