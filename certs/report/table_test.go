package report

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"math/big"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/sweep"
)

func testdataEntries(t *testing.T) []Entry {
	t.Helper()
	var entries []Entry
	for _, name := range certificateFiles {
		data, err := os.ReadFile(certPath(name))
		if err != nil {
			t.Fatal(err)
		}
		e, err := NewEntry(certPath(name), data)
		if err != nil {
			t.Fatal(err)
		}
		entries = append(entries, e)
	}
	return entries
}

// TestGolden compares the tables of the testdata certificates with
// testdata/*.golden (run with -update to rewrite them).
func TestGolden(t *testing.T) {
	entries := testdataEntries(t)
	for _, c := range []struct {
		golden string
		opt    Options
	}{
		{"table.golden.tex", Options{Format: LaTeX, Tool: "gapcert test", Checked: true}},
		{"table.golden.md", Options{Format: Markdown, Tool: "gapcert test", Checked: true}},
		{"table_bracket.golden.tex", Options{Format: LaTeX, Notation: Bracket, Tool: "gapcert test"}},
		{"table_bracket.golden.md", Options{Format: Markdown, Notation: Bracket, Tool: "gapcert test"}},
		{"table_points.golden.tex", Options{Format: LaTeX, Tool: "gapcert test", Checked: true, Family: "demo family", Parameters: []string{"q", "side"}, HashListFile: "table_points.sha256"}},
		{"table_points.golden.md", Options{Format: Markdown, Tool: "gapcert test", Checked: true, Family: "demo family", Parameters: []string{"q", "side"}, HashListFile: "table_points.sha256"}},
	} {
		entries := entries
		if c.opt.Parameters != nil {
			entries = pointEntries(entries)
		}
		var buf bytes.Buffer
		if err := Write(&buf, entries, c.opt); err != nil {
			t.Fatal(err)
		}
		path := filepath.Join("testdata", c.golden)
		if *update {
			if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		want, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(buf.Bytes(), want) {
			t.Errorf("%s differs from the output:\n%s", c.golden, buf.String())
		}
	}
}

// pointEntries returns the testdata certificates with the same claims
// (the second and third) as if they were the points 4 and 7 of a sweep
// over q and side: the values are attached for the layout only (demo
// data; the tables of real sweeps are tested in TestReadSweep).
func pointEntries(entries []Entry) []Entry {
	pts := slices.Clone(entries[1:])
	pts[0].Point, pts[0].Params = 4, map[string]string{"q": "1", "side": "1/3"}
	pts[1].Point, pts[1].Params = 7, map[string]string{"q": "0", "side": "2.5"}
	return pts
}

// piDigits is π to 50 decimals (OEIS A000796).
const piDigits = "3.14159265358979323846264338327950288419716939937510"

// TestTableContainsTruth reads the LaTeX cells back and checks them
// against known values: on (0, π) with Dirichlet ends λk = k² (so the gap
// is 3 and D²·gap/π² = 3); for V = 2cos 2x on (0, π) the Mathieu
// characteristic values b1(1) = −0.1102488170 and b2(1) = 3.9170247730
// (Abramowitz and Stegun, Handbook of Mathematical Functions, Table 20.1,
// ten digits, so checked with a tolerance of 1e-10); on the unit square
// λ1 = 2π², λ2 = 5π² (separation of variables), D²·gap/π² = 2·3. Each cell
// must also be at most 1.2 times as wide as the certified enclosure (the
// package's width guarantee for two width digits).
func TestTableContainsTruth(t *testing.T) {
	pi := rat(t, piDigits)
	pi2 := new(big.Rat).Mul(pi, pi)
	times := func(a int64, r *big.Rat) *big.Rat { return new(big.Rat).Mul(big.NewRat(a, 1), r) }
	tol := big.NewRat(1, 10_000_000_000)
	truth := map[string][4]*big.Rat{
		"dirichlet_0_pi": {big.NewRat(1, 1), big.NewRat(4, 1), big.NewRat(3, 1), big.NewRat(3, 1)},
		"mathieu_q1":     {rat(t, "-0.1102488170"), rat(t, "3.9170247730"), rat(t, "4.0272735900"), nil},
		"square":         {times(2, pi2), times(5, pi2), times(3, pi2), big.NewRat(6, 1)},
	}
	entries := testdataEntries(t)
	lay := newLayout(entries, Options{})
	if lay.eigen != 2 {
		t.Fatalf("%d eigenvalue columns, want 2", lay.eigen)
	}
	for i, e := range entries {
		row, err := tableRow(e, latexStyle{}, Options{}, lay)
		if err != nil {
			t.Fatal(err)
		}
		name := certificateFiles[i]
		c := e.Cert
		bounds := []certs.Bound{c.Results.Eigenvalues[0].Bound(), c.Results.Eigenvalues[1].Bound(), c.Results.Gap, c.Results.GapD2OverPi2}
		for k, cell := range row[1:5] {
			lo, hi := readLaTeX(t, cell)
			want := truth[name][k]
			if want != nil {
				slack := new(big.Rat)
				if name == "mathieu_q1" {
					slack = tol
				}
				if new(big.Rat).Sub(lo, slack).Cmp(want) > 0 || new(big.Rat).Add(hi, slack).Cmp(want) < 0 {
					t.Errorf("%s column %d: %s does not contain %s", name, k+1, cell, want.FloatString(12))
				}
			}
			cl, ch := rat(t, bounds[k].Lower), rat(t, bounds[k].Upper)
			if lo.Cmp(cl) > 0 || hi.Cmp(ch) < 0 {
				t.Errorf("%s column %d: %s does not contain the certified [%s, %s]", name, k+1, cell, bounds[k].Lower, bounds[k].Upper)
			}
			limit := new(big.Rat).Mul(big.NewRat(12, 10), new(big.Rat).Sub(ch, cl))
			if new(big.Rat).Sub(hi, lo).Cmp(limit) > 0 {
				t.Errorf("%s column %d: %s is more than 1.2 times as wide as [%s, %s]", name, k+1, cell, bounds[k].Lower, bounds[k].Upper)
			}
		}
	}
}

func TestWriteRejects(t *testing.T) {
	entries := testdataEntries(t)
	var buf bytes.Buffer
	for _, c := range []struct {
		opt     Options
		entries []Entry
		want    string
	}{
		{Options{Format: "html"}, entries, `unknown format "html"`},
		{Options{Format: LaTeX, Notation: "plusminus"}, entries, `unknown notation "plusminus"`},
		{Options{Format: LaTeX}, nil, "no certificates"},
	} {
		err := Write(&buf, c.entries, c.opt)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Write(%+v) = %v, want an error with %q", c.opt, err, c.want)
		}
	}
}

func TestRead(t *testing.T) {
	dir := t.TempDir()
	copyFile := func(name, to string) {
		data, err := os.ReadFile(certPath(name))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, to), data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	copyFile("square", "b.json")
	copyFile("dirichlet_0_pi", "a.json")
	write := func(name, text string) {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("summary.json", `{"format": "gapcert.sweep/v1", "points": []}`)
	write("problem.json", `{"domain": {"interval": ["0", "1"]}}`)
	write("list.json", `[1, 2]`)
	write("notes.txt", `not json`)
	src, err := Read(dir)
	if err != nil {
		t.Fatal(err)
	}
	entries, skipped := src.Entries, src.Skipped
	if src.Parameters != nil || entries[0].Point != -1 {
		t.Errorf("a directory without a family file read as a sweep: %+v", src.Parameters)
	}
	if len(entries) != 2 || filepath.Base(entries[0].Path) != "a.json" || filepath.Base(entries[1].Path) != "b.json" {
		t.Fatalf("entries %v, want a.json and b.json in this order", entries)
	}
	var got []string
	for _, s := range skipped {
		got = append(got, filepath.Base(s.Path)+": "+s.Reason)
	}
	want := []string{"list.json: not a JSON object", "problem.json: no \"format\" field", "summary.json: format \"gapcert.sweep/v1\" is not a certificate"}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("skipped:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}

	// A broken certificate in a directory is an error, not skipped.
	write("c.json", `{"format": "gapcert.certificate/v1", "problem": {}}`)
	if _, err := Read(dir); err == nil || !strings.Contains(err.Error(), "c.json") {
		t.Errorf("Read with a broken certificate: %v, want an error naming c.json", err)
	}
	write("c.json", `{"format": "gapcert.certificate/v9"}`)
	if _, err := Read(dir); err == nil || !strings.Contains(err.Error(), "not supported") {
		t.Errorf("Read with a certificate of another version: %v, want an error", err)
	}
	// A file given by name must be a certificate.
	if _, err := Read(filepath.Join(dir, "summary.json")); err == nil {
		t.Error("Read(summary.json) succeeded, want an error")
	}
	// A directory without certificates.
	empty := t.TempDir()
	write2 := filepath.Join(empty, "problem.json")
	if err := os.WriteFile(write2, []byte(`{}`), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := Read(empty); err == nil || !strings.Contains(err.Error(), "no gapcert certificates") {
		t.Errorf("Read(empty dir) = %v, want an error", err)
	}
}

// TestHashList: the list is what sha256sum prints for the files, sorted,
// and the digest is the SHA-256 of that text.
func TestHashList(t *testing.T) {
	entries := testdataEntries(t)
	list := HashList(entries)
	var want []string
	for _, name := range certificateFiles {
		data, err := os.ReadFile(certPath(name))
		if err != nil {
			t.Fatal(err)
		}
		sum := sha256.Sum256(data)
		want = append(want, hex.EncodeToString(sum[:])+"  "+name+".cert.json\n")
	}
	slices.Sort(want)
	if string(list) != strings.Join(want, "") {
		t.Errorf("list:\n%s\nwant:\n%s", list, strings.Join(want, ""))
	}
	sum := sha256.Sum256([]byte(strings.Join(want, "")))
	if got := ListDigest(list); got != hex.EncodeToString(sum[:]) {
		t.Errorf("digest %s", got)
	}
	var buf bytes.Buffer
	if err := Write(&buf, entries, Options{Format: Markdown, HashListFile: "t.sha256"}); err != nil {
		t.Fatal(err)
	}
	if out := buf.String(); !strings.Contains(out, ListDigest(list)) || !strings.Contains(out, "listed in t.sha256") || strings.Contains(out, entries[0].FileSHA256) {
		t.Errorf("a table with a list file should give the digest and the file, not the list:\n%s", out)
	}
}

// TestReadSweep: a merged sweep directory and a shard directory are read
// as sweeps: rows in point order with the parameter values, every
// certified eigenvalue in a column (three here: on (0, π) with Dirichlet
// ends and V = c constant, λk = k² + c, common practice), a column per
// claim headed by its text. A certificate of another problem in the
// directory is an error.
func TestReadSweep(t *testing.T) {
	f, err := sweep.ParseFamily([]byte(`{"name": "shifted string",
		"template": {"domain": {"interval": ["0", "pi"]}, "potential": "c", "boundary": "dirichlet",
		             "eigenvalues": 3, "claims": ["gap >= 2.9"], "target": {"relative_width": "1e-6"}},
		"parameters": [{"name": "c", "values": ["0", "1/2", "3"]}]}`))
	if err != nil {
		t.Fatal(err)
	}
	root := t.TempDir()
	shards := []string{filepath.Join(root, "shard-0"), filepath.Join(root, "shard-1")}
	for i, dir := range shards {
		if _, err := sweep.Run(f, dir, sweep.RunOptions{Shard: sweep.Shard{Index: i, Count: 2}, Now: func() time.Time { return fixedTime }}); err != nil {
			t.Fatal(err)
		}
	}
	merged := filepath.Join(root, "merged")
	if _, err := sweep.Merge(shards, merged, sweep.MergeOptions{}); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		dir    string
		points []int
	}{{merged, []int{0, 1, 2}}, {shards[0], []int{0, 2}}} {
		src, err := Read(c.dir)
		if err != nil {
			t.Fatal(err)
		}
		if len(src.Skipped) != 0 || src.Family != "shifted string" || !slices.Equal(src.Parameters, []string{"c"}) {
			t.Errorf("%s: skipped %v, family %q, parameters %v", c.dir, src.Skipped, src.Family, src.Parameters)
		}
		var got []int
		for _, e := range src.Entries {
			got = append(got, e.Point)
		}
		if !slices.Equal(got, c.points) {
			t.Fatalf("%s: points %v, want %v", c.dir, got, c.points)
		}
		var buf bytes.Buffer
		opt := Options{Format: Markdown, Family: src.Family, Parameters: src.Parameters}
		if err := Write(&buf, src.Entries, opt); err != nil {
			t.Fatal(err)
		}
		lines := strings.Split(buf.String(), "\n")
		if lines[0] != "| point | c | λ1 | λ2 | λ3 | gap λ2 − λ1 | D²·gap/π² | `gap >= 2.9` |" {
			t.Errorf("%s: header %q", c.dir, lines[0])
		}
		last := lines[1+len(c.points)]
		if !strings.HasPrefix(last, "| 2 | 3 | ") || !strings.HasSuffix(last, " | holds |") {
			t.Errorf("%s: last row %q", c.dir, last)
		}
		lay := newLayout(src.Entries, opt)
		for _, e := range src.Entries {
			row, err := tableRow(e, latexStyle{}, opt, lay)
			if err != nil {
				t.Fatal(err)
			}
			shift := rat(t, e.Params["c"])
			for k := 1; k <= 3; k++ {
				lo, hi := readLaTeX(t, row[1+k])
				want := new(big.Rat).Add(big.NewRat(int64(k*k), 1), shift)
				if lo.Cmp(want) > 0 || hi.Cmp(want) < 0 {
					t.Errorf("point %d: lambda%d cell %s does not contain %s", e.Point, k, row[1+k], want.RatString())
				}
			}
		}
	}
	// A certificate of another problem in a sweep directory.
	foreign, err := os.ReadFile(certPath("mathieu_q1"))
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(shards[1], "extra.cert.json"), foreign, 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := Read(shards[1]); err == nil || !strings.Contains(err.Error(), "not a point of the sweep family") {
		t.Errorf("Read with a foreign certificate: %v", err)
	}
}
