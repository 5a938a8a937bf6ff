package strictjson

import (
	"encoding/json"
	"errors"
	"reflect"
	"strings"
	"testing"
)

type leaf struct {
	N     int    `json:"n"`
	Label string `json:"label,omitempty"`
}

type inner struct {
	Kind   string          `json:"kind"`
	Leaves []leaf          `json:"leaves"`
	Raw    json.RawMessage `json:"raw"`
	Opt    *leaf           `json:"opt,omitempty"`
}

type outer struct {
	Format  string            `json:"format"`
	Inner   inner             `json:"inner"`
	Widths  map[string]string `json:"widths"`
	Grid    [][]int           `json:"grid"`
	Any     any               `json:"any"`
	Pair    [2]string         `json:"pair"`
	Small   int8              `json:"small"`
	Exact   json.Number       `json:"exact"`
	Flag    bool              `json:"flag"`
	Skipped string            `json:"-"`
	NoTag   string
	hidden  string
}

const good = `{"format": "f/1", "inner": {"kind": "k", "leaves": [{"n": 1}, {"n": 2, "label": "b"}], "raw": {"x": [1, {"y": 2}]}, "opt": null},
 "widths": {"gap": "1e-3", "GAP": "2e-3"}, "grid": [[1, 2], []], "any": {"v": 0.1000000000000000000000000001}, "pair": ["a", "b"],
 "small": -128, "exact": 1e-400, "flag": true, "NoTag": "t"}`

func TestDecodeGood(t *testing.T) {
	var o outer
	if err := Decode([]byte(good), &o); err != nil {
		t.Fatal(err)
	}
	if o.Inner.Leaves[1].Label != "b" || string(o.Inner.Raw) != `{"x": [1, {"y": 2}]}` || o.Widths["GAP"] != "2e-3" || o.Small != -128 || !o.Flag || o.NoTag != "t" {
		t.Errorf("decoded %+v", o)
	}
	// Numbers in interface values keep their literal text.
	if o.Exact != "1e-400" {
		t.Errorf("exact = %q, want the literal 1e-400", o.Exact)
	}
	if got := o.Any.(map[string]any)["v"]; got != json.Number("0.1000000000000000000000000001") {
		t.Errorf("any.v = %#v, want the literal as a json.Number", got)
	}
}

// TestDecodeRefused: each defect is refused with the path of the
// offending key or value. Duplicates with the fake value first or last,
// case variants and unknown keys are tried at every depth, inside arrays
// of objects and inside a raw message whose layout Decode does not know.
func TestDecodeRefused(t *testing.T) {
	edit := func(old, new string) string {
		if !strings.Contains(good, old) {
			t.Fatalf("%q is not in the sample", old)
		}
		return strings.Replace(good, old, new, 1)
	}
	for _, c := range []struct {
		name, doc, path, msg string
	}{
		{"duplicate at top, fake first", edit(`{"format": "f/1",`, `{"format": "fake", "format": "f/1",`), "format", `duplicate key "format"`},
		{"duplicate at top, fake last", edit(`"format": "f/1",`, `"format": "f/1", "format": "fake",`), "format", `duplicate key "format"`},
		{"duplicate object", edit(`"small": -128,`, `"inner": {}, "small": -128,`), "inner", `duplicate key "inner"`},
		{"duplicate in array element", edit(`{"n": 2, "label": "b"}`, `{"n": 2, "label": "b", "n": 3}`), "inner.leaves[1].n", `duplicate key "n"`},
		{"duplicate in raw message", edit(`{"y": 2}`, `{"y": 2, "y": 3}`), "inner.raw.x[1].y", `duplicate key "y"`},
		{"duplicate in map", edit(`"GAP": "2e-3"`, `"GAP": "2e-3", "gap": "9"`), "widths.gap", `duplicate key "gap"`},
		{"duplicate in interface", edit(`{"v": 0.1`, `{"v": 1, "v": 0.1`), "any.v", `duplicate key "v"`},
		{"case variant at top", edit(`"flag": true`, `"Flag": true`), "Flag", `keys are case-sensitive, the key here is "flag"`},
		{"case variant beside the key", edit(`"flag": true`, `"flag": true, "FLAG": false`), "FLAG", `case-sensitive`},
		{"case variant in array element", edit(`{"n": 1}`, `{"N": 1}`), "inner.leaves[0].N", `the key here is "n"`},
		{"case variant of an untagged field", edit(`"NoTag"`, `"notag"`), "notag", `the key here is "NoTag"`},
		{"unknown key", edit(`"kind": "k",`, `"kind": "k", "extra": 1,`), "inner.extra", `unknown key "extra"; the keys here are kind, leaves, raw, opt`},
		{"key tagged -", edit(`"flag": true`, `"flag": true, "Skipped": "x"`), "Skipped", `unknown key`},
		{"unexported field", edit(`"flag": true`, `"flag": true, "hidden": "x"`), "hidden", `unknown key`},
		{"key in a pointer's object", edit(`"opt": null`, `"opt": {"n": 1, "Label": "x"}`), "inner.opt.Label", `case-sensitive`},
		{"string for int", edit(`{"n": 1}`, `{"n": "1"}`), "inner.leaves[0].n", "want an integer, not a string"},
		{"fraction for int", edit(`{"n": 1}`, `{"n": 1.5}`), "inner.leaves[0].n", "not an integer"},
		{"int out of range", edit(`-128`, `-129`), "small", "-129 is not an integer in [-128, 127]"},
		{"null for string", edit(`"kind": "k"`, `"kind": null`), "inner.kind", "want a string, not null"},
		{"null for struct", edit(`"inner": {`, `"inner": null, "x": {`), "inner", "want an object, not null"},
		{"object for list", edit(`"grid": [[1, 2], []]`, `"grid": [{}, []]`), "grid[0]", "want a list, not an object"},
		{"short array", edit(`["a", "b"]`, `["a"]`), "pair", "want a list of 2 elements, not 1"},
		{"string for json.Number", edit(`"exact": 1e-400`, `"exact": "1e-400"`), "exact", "want a number, not a string"},
		{"number for bool", edit(`"flag": true`, `"flag": 1`), "flag", "want true or false"},
	} {
		var o outer
		err := Decode([]byte(c.doc), &o)
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("%s: error %v, want an *Error", c.name, err)
			continue
		}
		if e.Path != c.path || !strings.Contains(e.Msg, c.msg) || e.Line != 0 {
			t.Errorf("%s: error %q (path %q), want path %q and %q", c.name, err, e.Path, c.path, c.msg)
		}
	}
}

func TestSyntaxErrors(t *testing.T) {
	for _, c := range []struct {
		doc, msg  string
		line, col int
	}{
		{`{"format": "f/1"} {}`, "data after the top-level value", 1, 19},
		{"{\"format\": \"f/1\"}\n\n  [", "data after the top-level value", 3, 3},
		{`{"format": `, "unexpected end of file", 1, 12},
		{"{\n \"a\": tru}", "invalid character", 2, 0},
		{strings.Repeat("[", MaxDepth+2) + strings.Repeat("]", MaxDepth+2), "nesting deeper than 32 levels", 1, MaxDepth + 2},
	} {
		_, _, err := Parse([]byte(c.doc))
		var e *Error
		if !errors.As(err, &e) || e.Line != c.line || c.col > 0 && e.Column != c.col || !strings.Contains(e.Msg, c.msg) {
			t.Errorf("%q: error %v, want %q at line %d, column %d", c.doc, err, c.msg, c.line, c.col)
		}
		if !strings.HasPrefix(err.Error(), "invalid JSON at line ") {
			t.Errorf("%q: error %q does not give the position", c.doc, err)
		}
		var o outer
		if Decode([]byte(c.doc), &o) == nil {
			t.Errorf("%q: Decode accepted it", c.doc)
		}
	}
}

// TestParseTree: keys keep file order, the first of two equal keys is
// kept and every repeat is listed, numbers keep their literal text.
func TestParseTree(t *testing.T) {
	root, dups, err := Parse([]byte(`{"b": 1e400, "a": [true, null, "s", {"k": 1, "k": 2, "K": 3}], "b": 0.1}`))
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(root.Keys, []string{"b", "a"}) || root.Get("b").Num != "1e400" || root.Get("B") != nil {
		t.Errorf("keys %v, b = %v", root.Keys, root.Get("b"))
	}
	a := root.Get("a")
	if a.Kind != Array || len(a.Elems) != 4 || !a.Elems[0].Bool || a.Elems[1].Kind != Null || a.Elems[2].Str != "s" {
		t.Errorf("a = %+v", a)
	}
	if k := a.Elems[3]; !reflect.DeepEqual(k.Keys, []string{"k", "K"}) || k.Get("k").Num != "1" {
		t.Errorf("a[3] = %+v", k)
	}
	var paths []string
	for _, d := range dups {
		paths = append(paths, d.Path)
	}
	if !reflect.DeepEqual(paths, []string{"a[3].k", "b"}) {
		t.Errorf("duplicates at %v", paths)
	}
	if root.Get("a").Get("x") != nil {
		t.Error("Get on a list found a key")
	}
}

func TestDecodePanicsOnMisuse(t *testing.T) {
	for _, v := range []any{outer{}, (*outer)(nil), nil} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("Decode(%T) did not panic", v)
				}
			}()
			_ = Decode([]byte(good), v)
		}()
	}
}

func TestPaths(t *testing.T) {
	for _, c := range []struct{ got, want string }{
		{Join("", "a"), "a"},
		{Join("a", "b"), "a.b"},
		{Index("a", 2), "a[2]"},
		{Index(Join("claims", "x"), 0), "claims.x[0]"},
		{Under("claims[0].reference.certificate", "method.n"), "claims[0].reference.certificate.method.n"},
		{Under("claims", "[1].text"), "claims[1].text"},
		{Under("method", ""), "method"},
		{Under("", "method.n"), "method.n"},
	} {
		if c.got != c.want {
			t.Errorf("%q, want %q", c.got, c.want)
		}
	}
}
