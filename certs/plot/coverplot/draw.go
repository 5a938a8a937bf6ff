package coverplot

import (
	"crypto/sha256"
	"errors"
	"fmt"
	"image/color"
	"math/big"
	"os"
	"path/filepath"
	"reflect"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gapcert/certs"
	"gapcert/certs/cover"
	"gapcert/certs/plot"
	"gapcert/certs/sweep"
)

// Rect is one cell as drawn: its bounds (floats nearest to the exact
// ones; Y unused for one parameter) and its verdict.
type Rect struct {
	X, Y    [2]float64
	Verdict string
}

// Cover is a picture's data: the box, the cells and the claim.
type Cover struct {
	Title    string
	Params   []string
	Box      [2][2]float64
	Claim    string
	Coverage cover.Coverage
	Cells    []Rect
}

// Load reads the summary at path (a cover summary, or a cover directory
// holding summary.json or one shard summary: sweep.SummaryIn),
// cross-checks every row against its cell certificate beside it (SHA-256
// of the file and the verdicts it records) and returns the cells with
// their verdicts on claim index claim.
func Load(path string, claim int) (*Cover, error) {
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		// summary.json, else the directory's one shard summary.
		if path, err = sweep.SummaryIn(path); err != nil {
			return nil, err
		}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	s, err := cover.UnmarshalSummary(data)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", path, err)
	}
	if claim < 0 || claim >= len(s.Claims) {
		return nil, fmt.Errorf("%s: claim %d: the cover has %d claims (0 … %d)", path, claim, len(s.Claims), len(s.Claims)-1)
	}
	if len(s.Parameters) > 2 {
		return nil, fmt.Errorf("%s: %d parameters; a picture draws one or two", path, len(s.Parameters))
	}
	c := &Cover{Title: s.Family, Claim: s.Claims[claim].Text, Coverage: s.Claims[claim].Coverage}
	for j, p := range s.Parameters {
		c.Params = append(c.Params, p.Name)
		c.Box[j] = [2]float64{ratFloat(p.Lo), ratFloat(p.Hi)}
	}
	dir := filepath.Dir(path)
	// The fractions of the box where the claim holds, fails or is
	// undecided, summed exactly over the rows drawn: the legend states
	// the summary's, which must be these.
	box := big.NewRat(1, 1)
	for _, p := range s.Parameters {
		lo, ok1 := new(big.Rat).SetString(p.Lo)
		hi, ok2 := new(big.Rat).SetString(p.Hi)
		if !ok1 || !ok2 || lo.Cmp(hi) >= 0 {
			return nil, fmt.Errorf("%s: the range of %s is not [lo, hi] with exact lo < hi", path, p.Name)
		}
		box.Mul(box, hi.Sub(hi, lo))
	}
	sums := map[string]*big.Rat{certs.Holds: new(big.Rat), certs.Fails: new(big.Rat), certs.Undecided: new(big.Rat)}
	seen := map[string]bool{}
	for _, r := range s.Cells {
		if r.File == "" || r.Status == cover.StatusRejected {
			continue
		}
		if seen[r.File] {
			return nil, fmt.Errorf("%s: the summary lists %s twice", path, r.File)
		}
		seen[r.File] = true
		cd, err := os.ReadFile(filepath.Join(dir, r.File))
		if err != nil {
			return nil, fmt.Errorf("%s: %v", path, err)
		}
		cell, err := cover.UnmarshalCell(cd)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", r.File, err)
		}
		var verdicts []string
		for _, cl := range cell.Claims {
			verdicts = append(verdicts, cl.Verdict)
		}
		if fmt.Sprintf("%x", sha256Sum(cd)) != r.CertificateSHA256 || !reflect.DeepEqual(verdicts, r.Verdicts) || !reflect.DeepEqual(cell.Bounds, r.Bounds) {
			return nil, fmt.Errorf("%s: the row of %s disagrees with the certificate file", path, r.File)
		}
		if claim >= len(r.Verdicts) {
			return nil, fmt.Errorf("%s: the row of %s has no verdict on claim %d", path, r.File, claim)
		}
		m := big.NewRat(1, 1)
		for _, b := range r.Bounds {
			lo, ok1 := new(big.Rat).SetString(b.Lo)
			hi, ok2 := new(big.Rat).SetString(b.Hi)
			if !ok1 || !ok2 {
				return nil, fmt.Errorf("%s: the bounds of %s are not exact numbers", path, r.File)
			}
			m.Mul(m, hi.Sub(hi, lo))
		}
		if sum, ok := sums[r.Verdicts[claim]]; ok {
			sum.Add(sum, m.Quo(m, box))
		}
		rect := Rect{Verdict: r.Verdicts[claim]}
		rect.X = [2]float64{ratFloat(r.Bounds[0].Lo), ratFloat(r.Bounds[0].Hi)}
		if len(r.Bounds) == 2 {
			rect.Y = [2]float64{ratFloat(r.Bounds[1].Lo), ratFloat(r.Bounds[1].Hi)}
		}
		c.Cells = append(c.Cells, rect)
	}
	if len(c.Cells) == 0 {
		return nil, errors.New(path + ": no cells to draw")
	}
	for verdict, text := range map[string]string{certs.Holds: c.Coverage.Holds, certs.Fails: c.Coverage.Fails, certs.Undecided: c.Coverage.Undecided} {
		if x, ok := new(big.Rat).SetString(text); !ok || x.Cmp(sums[verdict]) != 0 {
			return nil, fmt.Errorf("%s: the summary gives the claim %s on %s of the box, but its cells on %s", path, verdict, text, sums[verdict].RatString())
		}
	}
	return c, nil
}

func ratFloat(s string) float64 {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		return 0
	}
	f, _ := r.Float64()
	return f
}

// colours of the verdicts.
var verdictColour = map[string]color.Color{
	certs.Holds:     plot.BluishGreen,
	certs.Fails:     plot.Vermillion,
	certs.Undecided: plot.Orange,
}

// cells is the plotter of the cells.
type cells struct{ c *Cover }

func (p cells) Plot(cv draw.Canvas, plt *gplot.Plot) {
	trX, trY := plt.Transforms(&cv)
	edge := draw.LineStyle{Color: color.White, Width: vg.Points(0.3)}
	// Holds first, then undecided, then fails, so that the cells where
	// the claim is not proved are on top.
	for _, v := range []string{certs.Holds, certs.Undecided, certs.Fails, ""} {
		for _, r := range p.c.Cells {
			if _, known := verdictColour[r.Verdict]; (v == "" && known) || (v != "" && r.Verdict != v) {
				continue
			}
			y := [2]float64{0, 1}
			if len(p.c.Params) == 2 {
				y = r.Y
			}
			x0, x1, y0, y1 := trX(r.X[0]), trX(r.X[1]), trY(y[0]), trY(y[1])
			// A cell narrower than minSize is drawn minSize wide so
			// that it shows.
			if x1-x0 < minSize {
				x1 = x0 + minSize
			}
			if y1-y0 < minSize {
				y1 = y0 + minSize
			}
			pts := []vg.Point{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
			col, ok := verdictColour[r.Verdict]
			if !ok {
				col = color.Gray{Y: 0x80}
			}
			cv.FillPolygon(col, pts)
			if x1-x0 > 4*minSize && (len(p.c.Params) == 1 || y1-y0 > 4*minSize) {
				cv.StrokeLines(edge, append(pts, pts[0]))
			}
		}
	}
}

// minSize is the smallest size a cell is drawn with.
const minSize = vg.Length(1.5)

func (p cells) DataRange() (xmin, xmax, ymin, ymax float64) {
	if len(p.c.Params) == 2 {
		return p.c.Box[0][0], p.c.Box[0][1], p.c.Box[1][0], p.c.Box[1][1]
	}
	return p.c.Box[0][0], p.c.Box[0][1], 0, 1
}

// swatch is a legend thumbnail: a filled square.
type swatch struct{ col color.Color }

func (s swatch) Thumbnail(c *draw.Canvas) {
	c.FillPolygon(s.col, []vg.Point{c.Min, {X: c.Max.X, Y: c.Min.Y}, c.Max, {X: c.Min.X, Y: c.Max.Y}})
}

// Draw writes the picture to path in format ("png" or "svg").
func Draw(c *Cover, path, format string) error {
	plt := gplot.New()
	title := c.Title
	if title == "" {
		title = "cover"
	}
	plt.Title.Text = plot.Drawable(fmt.Sprintf("%s: %s, verdict on every value of each cell", title, c.Claim))
	plt.Title.TextStyle.Font = font.From(gplot.DefaultFont, 11)
	plt.X.Label.Text = plot.Drawable(c.Params[0])
	if len(c.Params) == 2 {
		plt.Y.Label.Text = plot.Drawable(c.Params[1])
	} else {
		plt.HideY()
	}
	plt.Add(cells{c})
	legend := gplot.NewLegend()
	legend.Top, legend.Left = true, true
	legend.TextStyle.Font = font.From(gplot.DefaultFont, 10)
	legend.Add(plot.Drawable("holds on "+c.Coverage.Holds+" of the box"), swatch{verdictColour[certs.Holds]})
	legend.Add(plot.Drawable("fails on "+c.Coverage.Fails), swatch{verdictColour[certs.Fails]})
	legend.Add(plot.Drawable("undecided on "+c.Coverage.Undecided+"  (cells narrower than 1.5 pt are drawn 1.5 pt wide; white: not in this summary)"), swatch{verdictColour[certs.Undecided]})
	const legendHeight = 1.6 * vg.Centimeter
	width, height := 16*vg.Centimeter, 12*vg.Centimeter
	if len(c.Params) == 1 {
		height = 7 * vg.Centimeter
	}
	height += legendHeight
	return plot.Render(path, format, width, height, func(cv draw.Canvas) {
		h := cv.Max.Y - cv.Min.Y
		legend.Draw(draw.Crop(cv, 0, 0, h-legendHeight, 0))
		plt.Draw(draw.Crop(cv, 0, 0, 0, -legendHeight))
	})
}

func sha256Sum(data []byte) [32]byte { return sha256.Sum256(data) }
