package plot

import (
	"bytes"
	"encoding/base64"
	"encoding/xml"
	"fmt"
	"image"
	"image/png"
	"os"
	"strconv"
	"strings"
	"testing"
)

// svgElement is one element of a parsed SVG file.
type svgElement struct {
	name  string
	attrs map[string]string
	text  string // character data, for <text>
}

// parseSVG parses an SVG file with encoding/xml and returns its elements
// in document order.
func parseSVG(t *testing.T, path string) []svgElement {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(data))
	var elems []svgElement
	var open []int // indices into elems of the open elements
	for {
		tok, err := dec.Token()
		if err != nil {
			if err.Error() == "EOF" {
				break
			}
			t.Fatalf("%s: not well-formed XML: %v", path, err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			e := svgElement{name: tok.Name.Local, attrs: map[string]string{}}
			for _, a := range tok.Attr {
				e.attrs[a.Name.Local] = a.Value
			}
			elems = append(elems, e)
			open = append(open, len(elems)-1)
		case xml.EndElement:
			open = open[:len(open)-1]
		case xml.CharData:
			if len(open) > 0 {
				elems[open[len(open)-1]].text += string(tok)
			}
		}
	}
	if len(elems) == 0 || elems[0].name != "svg" {
		t.Fatalf("%s: root element is not <svg>", path)
	}
	return elems
}

// texts returns the text of every <text> element.
func texts(elems []svgElement) []string {
	var out []string
	for _, e := range elems {
		if e.name == "text" {
			out = append(out, e.text)
		}
	}
	return out
}

// subpath is one subpath of an SVG path: its points and whether it is closed.
type subpath struct {
	pts    [][2]float64
	closed bool
}

// parsePath reads path data made of M, L and Z commands (the only ones
// the pictures use for lines and outlines); ok is false for other data.
func parsePath(d string) (subs []subpath, ok bool) {
	i := 0
	for i < len(d) {
		cmd := d[i]
		i++
		switch cmd {
		case 'Z':
			if len(subs) == 0 {
				return nil, false
			}
			subs[len(subs)-1].closed = true
			continue
		case 'M', 'L':
		default:
			return nil, false
		}
		j := i
		for j < len(d) && strings.IndexByte("MLZ", d[j]) < 0 {
			j++
		}
		xy := strings.Split(d[i:j], ",")
		if len(xy) != 2 {
			return nil, false
		}
		x, err1 := strconv.ParseFloat(xy[0], 64)
		y, err2 := strconv.ParseFloat(xy[1], 64)
		if err1 != nil || err2 != nil {
			return nil, false
		}
		if cmd == 'M' {
			subs = append(subs, subpath{})
		} else if len(subs) == 0 {
			return nil, false
		}
		s := &subs[len(subs)-1]
		s.pts = append(s.pts, [2]float64{x, y})
		i = j
	}
	return subs, true
}

// findOutline returns the scale and offset of the affine map
// (x, y) ↦ (ox + s·x, oy + s·y) that takes poly onto the points of a
// closed one-subpath <path> of the SVG, within the SVG's five significant
// digits; ok is false when no path matches. One scale for both axes means
// the picture keeps the domain's aspect ratio.
func findOutline(elems []svgElement, poly [][2]float64) (s, ox, oy float64, ok bool) {
	for _, e := range elems {
		if e.name != "path" {
			continue
		}
		subs, parsed := parsePath(e.attrs["d"])
		if !parsed || len(subs) != 1 || !subs[0].closed || len(subs[0].pts) != len(poly) {
			continue
		}
		pts := subs[0].pts
		// Fit the scale from the first two vertices, then check all.
		dx, dy := poly[1][0]-poly[0][0], poly[1][1]-poly[0][1]
		var scale float64
		if abs(dx) >= abs(dy) {
			scale = (pts[1][0] - pts[0][0]) / dx
		} else {
			scale = (pts[1][1] - pts[0][1]) / dy
		}
		if !(scale > 0) {
			continue
		}
		ox, oy = pts[0][0]-scale*poly[0][0], pts[0][1]-scale*poly[0][1]
		match := true
		for i, v := range poly {
			if abs(pts[i][0]-(ox+scale*v[0])) > 0.02 || abs(pts[i][1]-(oy+scale*v[1])) > 0.02 {
				match = false
				break
			}
		}
		if match {
			return scale, ox, oy, true
		}
	}
	return 0, 0, 0, false
}

// embeddedImages decodes the raster images of an SVG (data URLs of PNG
// data, the colour map and the colour bar).
func embeddedImages(t *testing.T, elems []svgElement) []image.Image {
	t.Helper()
	var imgs []image.Image
	for _, e := range elems {
		if e.name != "image" {
			continue
		}
		href := e.attrs["href"]
		_, b64, found := strings.Cut(href, ";base64,")
		if !found {
			t.Fatalf("image without base64 data: %.60q", href)
		}
		data, err := base64.StdEncoding.DecodeString(b64)
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(bytes.NewReader(data))
		if err != nil {
			t.Fatalf("embedded image is not PNG: %v", err)
		}
		imgs = append(imgs, img)
	}
	return imgs
}

// svgSummary is the structure of an SVG picture that the golden files
// record: sizes, element counts, texts, and the shape of every path (its
// subpaths' point counts), but no coordinates or raster bytes.
type svgSummary struct {
	Width, Height string
	Elements      map[string]int
	Texts         []string
	Paths         []string
	Images        []string // width×height of each embedded raster
}

func summarise(t *testing.T, path string) svgSummary {
	elems := parseSVG(t, path)
	s := svgSummary{Width: elems[0].attrs["width"], Height: elems[0].attrs["height"], Elements: map[string]int{}}
	for _, e := range elems {
		s.Elements[e.name]++
		if e.name == "path" {
			subs, ok := parsePath(e.attrs["d"])
			if !ok {
				s.Paths = append(s.Paths, "other")
				continue
			}
			var shape []string
			for _, sp := range subs {
				z := ""
				if sp.closed {
					z = "Z"
				}
				shape = append(shape, fmt.Sprintf("%d%s", len(sp.pts), z))
			}
			s.Paths = append(s.Paths, strings.Join(shape, " "))
		}
	}
	s.Texts = texts(elems)
	for _, img := range embeddedImages(t, elems) {
		b := img.Bounds()
		s.Images = append(s.Images, fmt.Sprintf("%d×%d", b.Dx(), b.Dy()))
	}
	return s
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
