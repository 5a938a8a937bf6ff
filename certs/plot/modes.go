package plot

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"gapcert/certs/outfile"
)

// Caption is printed at the foot of every picture.
const Caption = "approximation: a floating-point picture, not part of the proof"

// Default sample counts, used when Modes.Samples is zero.
const (
	DefaultSamples1D = 401 // points on the interval, ends included
	DefaultSamples2D = 200 // grid cells along the longer side of the polygon's bounding box
)

// pngDPI is the resolution of PNG output (a 12 cm wide picture is 709 pixels wide).
const pngDPI = 150

// knownFormats lists the file formats Write accepts.
var knownFormats = []string{"png", "svg"}

// Formats returns the file formats Write accepts.
func Formats() []string { return slices.Clone(knownFormats) }

// Modes is the input of a picture: the domain and approximate
// eigenfunctions (floating-point choices, not bounds).
type Modes struct {
	Title     string                            // problem name
	Interval  [2]float64                        // for 1D problems (Polygon == nil)
	Polygon   [][2]float64                      // vertices, counterclockwise, for 2D problems
	Triangles [][3][2]float64                   // the mesh (2D), may be empty
	Labels    []string                          // one label per mode, e.g. "λ1 ∈ [9.8696, 9.8697]" (certified enclosure text given by the caller)
	Eval      func(k int, x, y float64) float64 // k-th approximate eigenfunction (0-based); y is ignored in 1D

	// Boundary, when not nil, holds the boundary condition of each side:
	// [left end, right end] in 1D, and in 2D side i running from
	// Polygon[i] to Polygon[(i+1) mod n]. The conditions are drawn on the
	// mesh picture (2D) or at the ends of the curves (1D), each kind in its
	// own line style, with a legend.
	Boundary []Side

	// Samples is the number of sample points on the interval (1D, at
	// least 2) or of grid cells along the longer side of the polygon's
	// bounding box (2D, at least 2); zero means DefaultSamples1D or
	// DefaultSamples2D. Eval is called about Samples (1D) or up to
	// Samples² (2D) times per mode.
	Samples int
}

// A ModeError reports an approximate eigenfunction that cannot be drawn:
// Eval returned a value that is not finite, or the mode vanishes at every
// sample point (so it cannot be normalised).
type ModeError struct {
	Mode  int        // 0-based index, as passed to Eval
	At    [2]float64 // the sample point of the first non-finite value
	Value float64    // that value; 0 when the mode vanishes everywhere
	oneD  bool
}

func (e *ModeError) Error() string {
	if e.Value == 0 {
		return fmt.Sprintf("mode %d (Eval index %d) is zero at every sample point, so it cannot be drawn", e.Mode+1, e.Mode)
	}
	if e.oneD {
		return fmt.Sprintf("mode %d (Eval index %d) is %v at x = %g", e.Mode+1, e.Mode, e.Value, e.At[0])
	}
	return fmt.Sprintf("mode %d (Eval index %d) is %v at (x, y) = (%g, %g)", e.Mode+1, e.Mode, e.Value, e.At[0], e.At[1])
}

// Write writes the pictures of m into dir (created if missing) in each of
// formats ("png", "svg") and returns the paths of the files written, for
// each picture in turn its files in the order of formats:
//
//   - 1D (m.Polygon == nil): modes.<fmt>, the curves of the first
//     len(m.Labels) modes on m.Interval, each normalised so that its value
//     of largest magnitude is +1, with a legend of the labels;
//   - 2D: mesh.<fmt> (when m.Triangles is not empty), the triangulation and
//     the polygon outline, or each side in the style of its boundary
//     condition with a legend (when m.Boundary is given); and mode<k>.<fmt> for k = 1 … len(m.Labels) (mode1
//     is Eval index 0, the mode of λ1), a colour map of the normalised mode on
//     a grid, blank outside the polygon, with the outline and a colour bar.
//
// An unknown or repeated format is an error, and so is a mode that
// cannot be drawn (a *ModeError); on an I/O error Write returns the paths
// written before it. Write panics if m is malformed (see the package
// documentation).
func Write(dir string, m *Modes, formats []string) ([]string, error) {
	m.check()
	if err := checkFormats(formats); err != nil {
		return nil, err
	}
	pics, err := m.pictures()
	if err != nil {
		return nil, err
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	var paths []string
	for _, pic := range pics {
		for _, f := range formats {
			path := filepath.Join(dir, pic.name+"."+f)
			if err := writeFile(path, pic, f); err != nil {
				return paths, err
			}
			paths = append(paths, path)
		}
	}
	return paths, nil
}

// check panics if m cannot describe a picture.
func (m *Modes) check() {
	switch {
	case m == nil:
		panic("plot: nil Modes")
	case m.Eval == nil:
		panic("plot: nil Eval")
	case len(m.Labels) == 0:
		panic("plot: no modes (Labels is empty)")
	case m.Samples < 0 || m.Samples == 1:
		panic("plot: Samples must be 0 or at least 2")
	}
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	if m.Polygon == nil {
		a, b := m.Interval[0], m.Interval[1]
		if !finite(a) || !finite(b) || !(a < b) {
			panic("plot: Interval must be finite with Interval[0] < Interval[1]")
		}
		if len(m.Triangles) != 0 {
			panic("plot: Triangles given for a 1D problem")
		}
		m.checkBoundary(2)
		return
	}
	if len(m.Polygon) < 3 {
		panic("plot: Polygon has fewer than 3 vertices")
	}
	for _, v := range m.Polygon {
		if !finite(v[0]) || !finite(v[1]) {
			panic("plot: Polygon vertex is not finite")
		}
	}
	x0, x1, y0, y1 := boundingBox(m.Polygon)
	if !(x0 < x1) || !(y0 < y1) {
		panic("plot: Polygon has an empty interior")
	}
	for _, t := range m.Triangles {
		for _, v := range t {
			if !finite(v[0]) || !finite(v[1]) {
				panic("plot: Triangles vertex is not finite")
			}
		}
	}
	m.checkBoundary(len(m.Polygon))
}

// checkBoundary panics unless m.Boundary is nil or holds n known sides.
func (m *Modes) checkBoundary(n int) {
	if m.Boundary == nil {
		return
	}
	if len(m.Boundary) != n {
		panic(fmt.Sprintf("plot: Boundary has %d sides, want %d", len(m.Boundary), n))
	}
	for i, s := range m.Boundary {
		switch {
		case s.Kind != DirichletSide && s.Kind != NeumannSide && s.Kind != RobinSide:
			panic(fmt.Sprintf("plot: Boundary[%d]: unknown kind %q", i, s.Kind))
		case (s.Kind == RobinSide) != (s.Alpha != ""):
			panic(fmt.Sprintf("plot: Boundary[%d]: Alpha %q with kind %q (a Robin side needs it, others have none)", i, s.Alpha, s.Kind))
		}
	}
}

// checkFormats reports an unknown, repeated or missing format.
func checkFormats(given []string) error {
	hint := fmt.Sprintf("(hint: use one or more of %q)", knownFormats)
	if len(given) == 0 {
		return errors.New("no formats given " + hint)
	}
	for i, f := range given {
		if !slices.Contains(knownFormats, f) {
			return fmt.Errorf("formats[%d]: unknown format %q %s", i, f, hint)
		}
		if j := slices.Index(given, f); j < i {
			return fmt.Errorf("formats[%d]: format %q repeats formats[%d]", i, f, j)
		}
	}
	return nil
}

// picture is one image, drawn the same way in every format.
type picture struct {
	name          string // file name without extension
	width, height vg.Length
	draw          func(c draw.Canvas)
}

// pictures samples the modes and lays out every picture of m.
func (m *Modes) pictures() ([]picture, error) {
	if m.Polygon == nil {
		s, err := sampleLine(m)
		if err != nil {
			return nil, err
		}
		return []picture{linePicture(m, s)}, nil
	}
	var pics []picture
	if len(m.Triangles) > 0 {
		pics = append(pics, meshPicture(m))
	}
	for k := range m.Labels {
		g, err := sampleGrid(m, k)
		if err != nil {
			return nil, err
		}
		pics = append(pics, modePicture(m, k, g))
	}
	return pics, nil
}

// writeFile renders pic in format f into the file path, atomically
// (outfile.WriteWith: an earlier file at path stays intact if writing fails).
func writeFile(path string, pic picture, f string) (err error) {
	var cw vg.CanvasWriterTo
	switch f {
	case "png":
		cw = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(pic.width, pic.height), vgimg.UseDPI(pngDPI))}
	case "svg":
		cw = vgsvg.New(pic.width, pic.height)
	default:
		panic("plot: unknown format " + f)
	}
	pic.draw(draw.New(cw))
	return outfile.WriteWith(path, func(w io.Writer) error {
		_, err := cw.WriteTo(w)
		return err
	})
}

// titleOf is the problem name as drawn, or a neutral one when the caller
// gave none.
func titleOf(m *Modes) string {
	if t := strings.TrimSpace(m.Title); t != "" {
		return drawable(t)
	}
	return "untitled problem"
}
