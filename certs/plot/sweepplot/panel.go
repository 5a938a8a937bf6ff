package sweepplot

import (
	"fmt"
	"math"
	"slices"
	"strings"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gapcert/certs/plot"
	"gapcert/interval"
)

// Panel names a second panel drawn under a band, for enclosures too
// narrow to be seen against the range of the quantity (a gap certified to
// 10⁻⁹ on an axis from 3 to 4).
type Panel string

const (
	// NoPanel draws the band alone.
	NoPanel Panel = ""
	// WidthPanel draws the width hi − lo of each certified enclosure (of
	// the quantity, and of the reference when there is one) on a
	// logarithmic axis: how tightly each point is known.
	WidthPanel Panel = "width"
	// MarginPanel draws, for a band with a threshold, the certified
	// enclosure of the margin toward holding, quantity − threshold for ≥
	// and > (threshold − quantity for ≤ and <), with the line 0: points
	// above it hold, below it fail, and its own axis shows how far each
	// point is from the threshold.
	MarginPanel Panel = "margin"
)

// panelNames are the panels ParsePanel accepts.
var panelNames = []Panel{WidthPanel, MarginPanel}

// ParsePanel returns the panel named s ("width" or "margin"; "" is
// NoPanel), or an error with a hint.
func ParsePanel(s string) (Panel, error) {
	if s == "" || slices.Contains(panelNames, Panel(s)) {
		return Panel(s), nil
	}
	return "", fmt.Errorf("unknown band panel %q (hint: use width, the enclosures' widths on a log axis, or margin, quantity − threshold with its own axis)", s)
}

// checkPanel reports a panel the band cannot have.
func (b *Band) checkPanel(extra Panel) error {
	if _, err := ParsePanel(string(extra)); err != nil {
		return err
	}
	if extra == MarginPanel && b.Threshold == "" {
		return fmt.Errorf("the margin panel draws quantity − threshold (hint: give a threshold, or use the width panel)")
	}
	return nil
}

// panelHeight is the height of the second panel.
const panelHeight = 6 * vg.Centimeter

// widthPanel is the panel of the enclosures' widths: one marker per point
// and enclosure, an upper bound of hi − lo (rounded up), on a log axis. A
// width 0 (a quantity known exactly) is drawn at the foot of the axis.
func (b *Band) widthPanel(main *gplot.Plot, legend *gplot.Legend, caption *[]string) panel {
	p := lowerPanel(main, b.X)
	p.Y.Label.Text = "width"
	p.Y.Scale = gplot.LogScale{}
	p.Y.Tick.Marker = plot.LogTicks{}

	type series struct {
		of    func(BandPoint) interval.I
		glyph draw.GlyphStyle
		what  string
	}
	all := []series{{func(pt BandPoint) interval.I { return pt.Quantity }, draw.GlyphStyle{Shape: draw.CircleGlyph{}, Color: barColour, Radius: vg.Points(3)}, plot.MathText(b.Quantity)}}
	if b.Reference != "" {
		all = append(all, series{func(pt BandPoint) interval.I { return pt.Reference }, draw.GlyphStyle{Shape: draw.BoxGlyph{}, Color: refBarColour, Radius: vg.Points(3)}, plot.MathText(b.Reference)})
	}
	lo, hi := math.Inf(1), 0.0
	for _, s := range all {
		for _, pt := range b.Points {
			if w := s.of(pt).Wid(); w > 0 {
				lo, hi = math.Min(lo, w), math.Max(hi, w)
			}
		}
	}
	if hi == 0 { // every enclosure is a point
		lo, hi = 1e-16, 1
	}
	// Whole decades around the widths, at least two.
	p.Y.Min = math.Pow(10, math.Floor(math.Log10(lo)))
	p.Y.Max = math.Pow(10, math.Max(math.Ceil(math.Log10(hi)), math.Log10(p.Y.Min)+2))
	exact := 0
	for _, s := range all {
		var xys plotter.XYs
		for _, pt := range b.Points {
			w := s.of(pt).Wid()
			if w == 0 {
				exact++
				continue
			}
			xys = append(xys, plotter.XY{X: pt.X, Y: w})
		}
		if len(xys) == 0 {
			continue
		}
		if len(xys) > 1 {
			line, err := plotter.NewLine(xys)
			if err != nil {
				panic("sweepplot: " + err.Error())
			}
			line.LineStyle = draw.LineStyle{Color: s.glyph.Color, Width: vg.Points(0.6)}
			p.Add(line)
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			panic("sweepplot: " + err.Error())
		}
		sc.GlyphStyle = s.glyph
		p.Add(sc)
		legend.Add("lower panel: width of the certified enclosure of "+s.what+" (log axis)", sc)
	}
	if exact > 0 {
		var xys plotter.XYs
		for _, s := range all {
			for _, pt := range b.Points {
				if s.of(pt).Wid() == 0 {
					xys = append(xys, plotter.XY{X: pt.X, Y: p.Y.Min})
				}
			}
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			panic("sweepplot: " + err.Error())
		}
		sc.GlyphStyle = draw.GlyphStyle{Shape: draw.TriangleGlyph{}, Color: plot.Black, Radius: vg.Points(3)}
		p.Add(sc)
		legend.Add(fmt.Sprintf("lower panel: width 0, a value known exactly, drawn at the foot (%d)", exact), sc)
	}
	*caption = append(*caption, "Lower panel: the width hi − lo of each enclosure, rounded up; the joining line is for reading only.")
	return panel{plot: p, height: panelHeight}
}

// marginPanel is the panel of the margin toward holding: the enclosure
// Q − T (or T − Q) of the two certified enclosures by outward-rounded
// interval subtraction, which contains the margin at every value in them,
// with the line 0 and each point marked by its verdict.
func (b *Band) marginPanel(main *gplot.Plot, legend *gplot.Legend, caption *[]string) panel {
	q, t := plot.MathText(b.Quantity), plot.MathText(b.Threshold)
	margin := func(pt BandPoint) interval.I { return pt.Quantity.Sub(pt.Threshold) }
	side := q + " − (" + t + ")"
	if b.Rel == "<=" || b.Rel == "<" {
		margin = func(pt BandPoint) interval.I { return pt.Threshold.Sub(pt.Quantity) }
		side = t + " − (" + q + ")"
	}
	if !strings.ContainsAny(t, "+−") {
		side = strings.NewReplacer("("+t+")", t).Replace(side)
	}
	if !strings.ContainsAny(q, "+−") {
		side = strings.NewReplacer("("+q+")", q).Replace(side)
	}
	p := lowerPanel(main, b.X)
	p.Y.Label.Text = "margin"
	lo, hi := 0.0, 0.0
	for _, pt := range b.Points {
		e := margin(pt)
		lo, hi = math.Min(lo, e.Lo), math.Max(hi, e.Hi)
	}
	pad := 0.08 * (hi - lo)
	if pad == 0 {
		pad = 1
	}
	p.Y.Min, p.Y.Max = lo-pad, hi+pad
	p.Add(zeroLine{})
	bars := &intervalBars{points: b.Points, of: margin, style: barStyle, capWidth: capWidth}
	p.Add(bars)
	b.addVerdicts(p, nil, func(pt BandPoint) float64 { return margin(pt).Mid() })
	legend.Add("lower panel: certified enclosure of the margin "+side, bars)
	*caption = append(*caption, "Lower panel: the margin, enclosed by interval subtraction of the two enclosures;", "a bar wholly above the dashed 0 holds.")
	return panel{plot: p, height: panelHeight}
}

// lowerPanel returns an untitled plot for a panel under main, with the
// same parameter axis.
func lowerPanel(main *gplot.Plot, x string) *gplot.Plot {
	p := newPlot("")
	p.Title.Padding = 0
	p.X.Label.Text = plot.MathText(x)
	p.Add(plotter.NewGrid())
	p.X.Min, p.X.Max = main.X.Min, main.X.Max
	return p
}

// zeroLine is a plot.Plotter that draws the line y = 0 across the data
// area, dashed.
type zeroLine struct{}

// Plot implements plot.Plotter.
func (zeroLine) Plot(c draw.Canvas, p *gplot.Plot) {
	_, trY := p.Transforms(&c)
	c.StrokeLine2(thresholdStyle, c.Min.X, trY(0), c.Max.X, trY(0))
}
