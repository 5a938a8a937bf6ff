package plot

import (
	"fmt"
	"image/color"
	"math"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strings"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// SliceNote is the line under the title of every picture of a mode on a
// slice.
const SliceNote = "approximation, not a bound"

// Solid is the input of the pictures of a polyhedron: its faces, the
// boundary triangles of a mesh, a slice plane and approximate
// eigenfunctions (floating-point choices, not bounds).
type Solid struct {
	Title    string
	Vertices [][3]float64
	Faces    [][]int // vertex indices, counterclockwise seen from outside
	Boundary []Side  // one per face, or nil

	// Triangles, when not empty, are the boundary triangles of a mesh,
	// drawn thin on the faces seen from the front.
	Triangles []FaceTriangle

	// Section is the cross-section drawn on the solid and under the
	// modes; Labels name the modes (one picture each) and Eval gives
	// mode k (0-based) at a point. With no labels only the solid is
	// drawn, and Eval may be nil.
	Section *Section
	Labels  []string
	Eval    func(k int, x, y, z float64) float64

	// Samples is the number of grid cells along the longer side of the
	// section's bounding box (0: DefaultSamples2D).
	Samples int

	// Certified, when not empty, are lines of certified results given by
	// the caller (e.g. "λ1 ∈ [29.608789, 29.608837]"), printed under the
	// title of every picture; the package never computes them.
	Certified []string
}

// SolidPaths returns the files WriteSolid writes for path: path itself
// (the solid), then STEM-mode<k>.EXT for each of modes slice pictures.
func SolidPaths(path string, modes int) []string {
	ext := filepath.Ext(path)
	stem := strings.TrimSuffix(path, ext)
	paths := []string{path}
	for k := range modes {
		paths = append(paths, fmt.Sprintf("%s-mode%d%s", stem, k+1, ext))
	}
	return paths
}

// WriteSolid draws s into the files SolidPaths(path, len(s.Labels)), in
// the format of path's extension (.png or .svg):
//
//   - the solid in an orthographic view from the front right and above:
//     the faces seen from the front filled (shaded by the angle of light,
//     coloured by their boundary condition when s.Boundary is given, with
//     a legend), the edges of the faces seen from behind dashed and light,
//     the mesh's boundary triangles thin, the section's outline, and the
//     coordinate axes x, y, z as labelled arrows;
//   - for each label k, mode k on the section: a colour map of the mode
//     normalised on its samples so that its value of largest magnitude is
//     +1, blank outside the section, with the outline, plane axes and a
//     colour bar, titled with SliceNote.
//
// It returns the paths written. An unknown format and a mode that cannot
// be drawn (*ModeError) are errors; malformed input panics.
func WriteSolid(path string, s *Solid) ([]string, error) {
	f := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if err := checkFormats([]string{f}); err != nil {
		s.check()
		return nil, fmt.Errorf("%s: %v", path, err)
	}
	pics, err := solidPictures(s)
	if err != nil {
		return nil, err
	}
	var written []string
	for i, p := range SolidPaths(path, len(s.Labels)) {
		if err := writeFile(p, pics[i], f); err != nil {
			return written, err
		}
		written = append(written, p)
	}
	return written, nil
}

// WriteSolidDir draws s as WriteSolid does into the directory dir
// (created if missing), in each of formats ("png", "svg"): for each
// picture in turn, solid.<fmt>, then solid-mode<k>.<fmt> for each label.
// It returns the paths written.
func WriteSolidDir(dir string, s *Solid, formats []string) ([]string, error) {
	if err := checkFormats(formats); err != nil {
		s.check()
		return nil, err
	}
	pics, err := solidPictures(s)
	if err != nil {
		return nil, err
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	var written []string
	for i := range pics {
		for _, f := range formats {
			p := SolidPaths(filepath.Join(dir, "solid."+f), len(s.Labels))[i]
			if err := writeFile(p, pics[i], f); err != nil {
				return written, err
			}
			written = append(written, p)
		}
	}
	return written, nil
}

// solidPictures returns the pictures of s: the solid, then each mode on
// the section.
func solidPictures(s *Solid) ([]picture, error) {
	s.check()
	pics := []picture{solidPicture(s)}
	for k := range s.Labels {
		g, err := sampleSection(s, k)
		if err != nil {
			return nil, err
		}
		pics = append(pics, slicePicture(s, k, g))
	}
	return pics, nil
}

// FaceTriangle is a boundary triangle of a mesh of a solid, on face Face.
type FaceTriangle struct {
	Face    int
	Corners [3][3]float64
}

// check panics if s cannot describe a picture.
func (s *Solid) check() {
	switch {
	case s == nil:
		panic("plot: nil Solid")
	case len(s.Vertices) < 4 || len(s.Faces) < 4:
		panic("plot: a Solid needs at least 4 vertices and 4 faces")
	case len(s.Labels) > 0 && (s.Eval == nil || s.Section == nil):
		panic("plot: modes of a Solid need Eval and Section")
	case s.Samples < 0 || s.Samples == 1:
		panic("plot: Samples must be 0 or at least 2")
	}
	for _, v := range s.Vertices {
		for _, c := range v {
			if math.IsNaN(c) || math.IsInf(c, 0) {
				panic("plot: Solid vertex is not finite")
			}
		}
	}
	for _, f := range s.Faces {
		if len(f) < 3 {
			panic("plot: Solid face with fewer than 3 vertices")
		}
		for _, k := range f {
			if k < 0 || k >= len(s.Vertices) {
				panic("plot: Solid face vertex out of range")
			}
		}
	}
	for _, t := range s.Triangles {
		if t.Face < 0 || t.Face >= len(s.Faces) {
			panic("plot: Solid triangle on a face out of range")
		}
	}
	if s.Boundary != nil {
		(&Modes{Boundary: s.Boundary}).checkBoundary(len(s.Faces))
	}
}

// view is the orthographic projection of the solid pictures: the viewer
// looks from the direction eye (azimuth 30° right of the −y axis, 25°
// above the xy plane); screen coordinates are the components along right
// and up, and depth along eye grows toward the viewer.
var view = func() (v struct{ eye, right, up [3]float64 }) {
	az, el := 30*math.Pi/180, 25*math.Pi/180
	v.eye = [3]float64{math.Cos(el) * math.Sin(az), -math.Cos(el) * math.Cos(az), math.Sin(el)}
	v.right = [3]float64{math.Cos(az), math.Sin(az), 0}
	v.up = [3]float64{-math.Sin(az) * math.Sin(el), math.Cos(az) * math.Sin(el), math.Cos(el)}
	return v
}()

// light is the direction of the light of the shading (from the viewer's
// upper left).
var light = normalised([3]float64{-0.3, -0.6, 1})

func dot3(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

func normalised(a [3]float64) [3]float64 {
	n := math.Sqrt(dot3(a, a))
	return [3]float64{a[0] / n, a[1] / n, a[2] / n}
}

// project returns the screen point of p.
func project(p [3]float64) [2]float64 { return [2]float64{dot3(p, view.right), dot3(p, view.up)} }

// faceNormal returns the unit area vector of the polygon pts (Newell's
// formula, common practice), outward for a face listed counterclockwise
// from outside.
func faceNormal(pts [][3]float64) [3]float64 {
	var n [3]float64
	for i, p := range pts {
		q := pts[(i+1)%len(pts)]
		n[0] += (p[1] - q[1]) * (p[2] + q[2])
		n[1] += (p[2] - q[2]) * (p[0] + q[0])
		n[2] += (p[0] - q[0]) * (p[1] + q[1])
	}
	return normalised(n)
}

// Styles of the solid picture.
var (
	hiddenStyle   = draw.LineStyle{Color: color.Gray{Y: 0xaa}, Width: vg.Points(0.6), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
	edgeStyle     = draw.LineStyle{Color: color.Black, Width: vg.Points(1)}
	sectionStyle  = draw.LineStyle{Color: Vermillion, Width: vg.Points(1.8)}
	sectionHidden = draw.LineStyle{Color: Lighten(Vermillion, 0.5), Width: vg.Points(1), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
	axisStyle     = draw.LineStyle{Color: color.Gray{Y: 0x30}, Width: vg.Points(0.8)}
)

// plainFace is the fill of a face before shading when no boundary
// conditions are given.
var plainFace color.Color = color.Gray{Y: 0xd8}

// faceColour is the fill of a face of the given boundary condition's
// style (sideStyles) before shading: grey for Dirichlet, else its colour
// lightened.
func faceColour(style draw.LineStyle) color.Color {
	if style.Color == Black {
		return color.Gray{Y: 0xc8}
	}
	return Lighten(style.Color, 0.55)
}

// shade darkens c by the angle between the face normal n and the light:
// full colour facing the light, 60% facing away.
func shade(c color.Color, n [3]float64) color.Color {
	f := 0.6 + 0.4*math.Max(0, dot3(n, light))
	r, g, b, _ := c.RGBA()
	s := func(v uint32) uint8 { return uint8(f*float64(v>>8) + 0.5) }
	return color.RGBA{R: s(r), G: s(g), B: s(b), A: 0xff}
}

// solidPicture draws the solid (see WriteSolid).
func solidPicture(s *Solid) picture {
	title := solidTitle(s) + "\nboundary"
	if len(s.Triangles) > 0 {
		title += fmt.Sprintf(" and mesh: %d boundary triangles", len(s.Triangles))
	}
	p := newPlot(title)
	p.HideAxes()
	sp := &solidPlotter{s: s}
	p.Add(sp)
	legend := newLegend()
	n := 0
	if s.Boundary != nil {
		styles, entries := sideStyles(s.Boundary)
		sp.fills = make([]color.Color, len(s.Faces))
		for i := range s.Faces {
			sp.fills[i] = faceColour(styles[i])
		}
		for _, e := range entries {
			legend.Add(e.text, fillEntry{faceColour(e.style)})
			n++
		}
	}
	if s.Section != nil {
		legend.Add("slice "+drawable(s.Section.Slice.String())+(" (dashed: behind)"), sideEntry{style: sectionStyle})
		n++
	}
	legend.Add("edges behind the solid", sideEntry{style: hiddenStyle})
	n++
	legendHeight := heightOf(legend, n)
	outline := sp.screenPoints()
	return picture{
		name:   "solid",
		width:  pictureWidth,
		height: surfaceHeight(p, outline) + legendHeight,
		draw: func(c draw.Canvas) {
			c = drawFrame(c)
			drawLegend(c, legend, legendHeight)
			c = draw.Crop(c, colourBarWidth/2, -colourBarWidth/2, legendHeight, 0)
			equalAspect(p, c, outline, nil)
			p.Draw(c)
		},
	}
}

// solidTitle returns the first lines of the title of every picture of
// s: the problem's name and the certified lines.
func solidTitle(s *Solid) string {
	title := titleOf(&Modes{Title: s.Title})
	for _, line := range s.Certified {
		title += "\n" + drawable(LambdaSubscripts(line))
	}
	return title
}

// fillEntry is a legend entry of a face colour: a filled square.
type fillEntry struct{ fill color.Color }

// Thumbnail implements plot.Thumbnailer.
func (e fillEntry) Thumbnail(c *draw.Canvas) {
	c.SetColor(e.fill)
	c.Fill(c.Rectangle.Path())
	c.SetLineStyle(edgeStyle)
	c.Stroke(c.Rectangle.Path())
}

// solidPlotter draws the faces of a solid in the screen coordinates of
// view, with a painter's order (farthest face first), which is exact for
// convex solids and a fair picture of others.
type solidPlotter struct {
	s     *Solid
	fills []color.Color // per face, nil: all grey
}

// screenPoints returns the projections of the vertices and of the tips of
// the axis arrows (the extent of the picture).
func (sp *solidPlotter) screenPoints() [][2]float64 {
	var out [][2]float64
	for _, v := range sp.s.Vertices {
		out = append(out, project(v))
	}
	o, tips := sp.axes()
	out = append(out, project(o))
	for _, t := range tips {
		out = append(out, project(t))
	}
	return out
}

// axes returns the origin of the axis arrows (the lowest corner of the
// bounding box, moved out by a tenth of its longest side) and their tips
// (a quarter of the longest side long).
func (sp *solidPlotter) axes() (o [3]float64, tips [3][3]float64) {
	lo := sp.s.Vertices[0]
	hi := lo
	for _, v := range sp.s.Vertices {
		for c := range 3 {
			lo[c], hi[c] = math.Min(lo[c], v[c]), math.Max(hi[c], v[c])
		}
	}
	size := max(hi[0]-lo[0], hi[1]-lo[1], hi[2]-lo[2])
	o = [3]float64{lo[0] - 0.1*size, lo[1] - 0.1*size, lo[2]}
	for c := range 3 {
		tips[c] = o
		tips[c][c] += 0.25 * size
	}
	return o, tips
}

// Plot implements plot.Plotter.
func (sp *solidPlotter) Plot(c draw.Canvas, p *gplot.Plot) {
	s := sp.s
	trX, trY := p.Transforms(&c)
	pt := func(q [3]float64) vg.Point {
		xy := project(q)
		return vg.Point{X: trX(xy[0]), Y: trY(xy[1])}
	}
	type face struct {
		index  int
		depth  float64
		normal [3]float64
		pts    [][3]float64
	}
	var front, back []face
	for i, f := range s.Faces {
		fc := face{index: i}
		for _, k := range f {
			fc.pts = append(fc.pts, s.Vertices[k])
			fc.depth += dot3(s.Vertices[k], view.eye) / float64(len(f))
		}
		fc.normal = faceNormal(fc.pts)
		if dot3(fc.normal, view.eye) > 0 {
			front = append(front, fc)
		} else {
			back = append(back, fc)
		}
	}
	sort.SliceStable(front, func(i, j int) bool { return front[i].depth < front[j].depth })
	polygon := func(pts [][3]float64) vg.Path {
		var path vg.Path
		for i, q := range pts {
			if i == 0 {
				path.Move(pt(q))
			} else {
				path.Line(pt(q))
			}
		}
		path.Close()
		return path
	}
	// The section's sides on face i.
	sectionOn := func(i int, style draw.LineStyle) {
		if s.Section == nil {
			return
		}
		for l, loop := range s.Section.midLoops() {
			for j, f := range s.Section.Faces[l] {
				if f == i {
					a, b := loop[j], loop[(j+1)%len(loop)]
					from, to := pt(s.Section.point(a[0], a[1])), pt(s.Section.point(b[0], b[1]))
					c.StrokeLine2(style, from.X, from.Y, to.X, to.Y)
				}
			}
		}
	}
	tris := make([][][3][3]float64, len(s.Faces))
	for _, t := range s.Triangles {
		tris[t.Face] = append(tris[t.Face], t.Corners)
	}
	for _, f := range front {
		fill := plainFace
		if sp.fills != nil {
			fill = sp.fills[f.index]
		}
		c.SetColor(shade(fill, f.normal))
		path := polygon(f.pts)
		c.Fill(path)
		for _, t := range tris[f.index] {
			c.SetLineStyle(meshStyle)
			c.Stroke(polygon(t[:]))
		}
		c.SetLineStyle(edgeStyle)
		c.Stroke(path)
		sectionOn(f.index, sectionStyle)
	}
	// Edges and section sides behind the solid, dashed over it; an edge
	// of a front face (the outline) stays solid.
	frontEdges := map[[2]int]bool{}
	for _, f := range front {
		for j, a := range s.Faces[f.index] {
			b := s.Faces[f.index][(j+1)%len(s.Faces[f.index])]
			frontEdges[[2]int{min(a, b), max(a, b)}] = true
		}
	}
	for _, f := range back {
		for j, a := range s.Faces[f.index] {
			b := s.Faces[f.index][(j+1)%len(s.Faces[f.index])]
			if !frontEdges[[2]int{min(a, b), max(a, b)}] {
				from, to := pt(s.Vertices[a]), pt(s.Vertices[b])
				c.StrokeLine2(hiddenStyle, from.X, from.Y, to.X, to.Y)
			}
		}
		sectionOn(f.index, sectionHidden)
	}
	o, tips := sp.axes()
	for i, t := range tips {
		from, to := pt(o), pt(t)
		c.StrokeLine2(axisStyle, from.X, from.Y, to.X, to.Y)
		// Arrow head: two short strokes back from the tip; the label a
		// little beyond it.
		dx, dy := float64(to.X-from.X), float64(to.Y-from.Y)
		l := math.Hypot(dx, dy)
		if l == 0 {
			continue // an axis along the line of sight (not in this view)
		}
		ux, uy := dx/l, dy/l
		h := float64(vg.Points(5))
		for _, sgn := range []float64{1, -1} {
			bx := float64(to.X) - h*ux - sgn*0.45*h*uy
			by := float64(to.Y) - h*uy + sgn*0.45*h*ux
			c.StrokeLine2(axisStyle, to.X, to.Y, vg.Length(bx), vg.Length(by))
		}
		style := captionStyle
		style.Color = color.Black
		style.XAlign, style.YAlign = draw.XCenter, draw.YCenter
		gap := 1.4 * h
		c.FillText(style, vg.Point{X: to.X + vg.Length(gap*ux), Y: to.Y + vg.Length(gap*uy)}, axisNames[i])
	}
}

// DataRange implements plot.DataRanger.
func (sp *solidPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	return boundingBox(sp.screenPoints())
}

// sampleSection evaluates mode k of s on its section (sectionValues) and
// normalises it.
func sampleSection(s *Solid, k int) (*grid, error) {
	g, err := sectionValues(s, k)
	if err != nil {
		return nil, err
	}
	if !normalise(g.z) {
		return nil, &ModeError{Mode: k}
	}
	return g, nil
}

// sectionValues evaluates mode k of s at the centres of a grid of cells
// over the section's bounding box, inside its loops (even–odd rule over
// all loops); the values outside are NaN. A value inside that is not
// finite is a *ModeError.
func sectionValues(s *Solid, k int) (*grid, error) {
	n := s.Samples
	if n == 0 {
		n = DefaultSamples2D
	}
	loops := s.Section.midLoops()
	x0, x1, y0, y1 := boundingBox(slices.Concat(loops...))
	w, h := x1-x0, y1-y0
	cell := math.Max(w, h) / float64(n)
	g := &grid{x0: x0, y0: y0}
	g.nx = max(1, int(math.Round(w/cell)))
	g.ny = max(1, int(math.Round(h/cell)))
	g.dx, g.dy = w/float64(g.nx), h/float64(g.ny)
	g.z = make([]float64, g.nx*g.ny)
	for r := range g.ny {
		v := g.Y(r)
		for c := range g.nx {
			u := g.X(c)
			val := math.NaN()
			in := false
			for _, loop := range loops {
				in = in != inside(loop, u, v)
			}
			if in {
				q := s.Section.point(u, v)
				val = s.Eval(k, q[0], q[1], q[2])
				if math.IsNaN(val) || math.IsInf(val, 0) {
					return nil, &ModeError{Mode: k, At: [2]float64{u, v}, Value: val}
				}
			}
			g.z[r*g.nx+c] = val
		}
	}
	return g, nil
}

// slicePicture draws mode k of s on its section as a colour map of the
// grid g, like modePicture on a polygon.
func slicePicture(s *Solid, k int, g *grid) picture {
	sec := s.Section
	p := newPlot(fmt.Sprintf("%s\nmode %d on the slice %s:\n%s\n%s", solidTitle(s), k+1,
		drawable(sec.Slice.String()), drawable(LambdaSubscripts(s.Labels[k])), SliceNote))
	u, v := planeAxes[sec.Slice.Axis][0], planeAxes[sec.Slice.Axis][1]
	p.X.Label.Text, p.Y.Label.Text = axisNames[u], axisNames[v]
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, z := range g.z {
		if !math.IsNaN(z) {
			lo, hi = math.Min(lo, z), math.Max(hi, z)
		}
	}
	colours, lo, hi := ScaleFor(lo, hi)
	heat := &plotter.HeatMap{GridXYZ: g, Palette: colours.Palette(colourLevels), Min: lo, Max: hi, Rasterized: true}
	p.Add(rasterOnly{heat})
	loops := sec.midLoops()
	p.Add(&closedPaths{paths: loops, style: outlineStyle})
	outline := slices.Concat(loops...)

	bar := gplot.New()
	bar.HideX()
	bar.Y.Label.Text = "u / max |u|"
	bar.Y.Tick.Marker = RoundTicks{}
	bar.Add(&plotter.ColorBar{ColorMap: colours, Vertical: true, Colors: colourLevels})
	bar.Y.Min, bar.Y.Max = lo, hi
	return picture{
		name:   fmt.Sprintf("slice-mode%d", k+1),
		width:  pictureWidth,
		height: surfaceHeight(p, outline),
		draw: func(c draw.Canvas) {
			c = drawFrame(c)
			main := draw.Crop(c, 0, -colourBarWidth, 0, 0)
			equalAspect(p, main, outline, nil)
			p.Draw(main)
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
