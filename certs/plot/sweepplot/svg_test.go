package sweepplot

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"
	"testing"
)

// svgSummary is the structure of an SVG picture that the golden files
// record: size, element counts, the texts, and the shape of each path
// (the number of commands of each kind), but no coordinates.
type svgSummary struct {
	Width, Height string
	Elements      map[string]int
	Texts         []string
	Paths         map[string]int // path shape → count
}

// summarise parses an SVG file with encoding/xml.
func summarise(t *testing.T, path string) svgSummary {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(data))
	s := svgSummary{Elements: map[string]int{}, Paths: map[string]int{}}
	var open []string
	first := true
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("%s: not well-formed XML: %v", path, err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			name := tok.Name.Local
			attrs := map[string]string{}
			for _, a := range tok.Attr {
				attrs[a.Name.Local] = a.Value
			}
			if first {
				if name != "svg" {
					t.Fatalf("%s: root element is <%s>, not <svg>", path, name)
				}
				s.Width, s.Height = attrs["width"], attrs["height"]
				first = false
			}
			s.Elements[name]++
			if name == "path" {
				s.Paths[pathShape(attrs["d"])]++
			}
			if name == "text" {
				s.Texts = append(s.Texts, "")
			}
			open = append(open, name)
		case xml.EndElement:
			open = open[:len(open)-1]
		case xml.CharData:
			if len(open) > 0 && open[len(open)-1] == "text" {
				s.Texts[len(s.Texts)-1] += string(tok)
			}
		}
	}
	return s
}

// pathShape counts the commands of path data: "M1 L4 Z1".
func pathShape(d string) string {
	counts := map[byte]int{}
	var order []byte
	for i := 0; i < len(d); i++ {
		c := d[i]
		if strings.IndexByte("MLZCQA", c) < 0 {
			continue
		}
		if counts[c] == 0 {
			order = append(order, c)
		}
		counts[c]++
	}
	var parts []string
	for _, c := range order {
		parts = append(parts, fmt.Sprintf("%c%d", c, counts[c]))
	}
	return strings.Join(parts, " ")
}
