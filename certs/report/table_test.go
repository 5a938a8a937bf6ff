package report

import (
	"bytes"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
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
	} {
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
	for i, e := range entries {
		row, err := tableRow(e, latexStyle{}, Options{})
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
	entries, skipped, err := Read(dir)
	if err != nil {
		t.Fatal(err)
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
	if _, _, err := Read(dir); err == nil || !strings.Contains(err.Error(), "c.json") {
		t.Errorf("Read with a broken certificate: %v, want an error naming c.json", err)
	}
	write("c.json", `{"format": "gapcert.certificate/v9"}`)
	if _, _, err := Read(dir); err == nil || !strings.Contains(err.Error(), "not supported") {
		t.Errorf("Read with a certificate of another version: %v, want an error", err)
	}
	// A file given by name must be a certificate.
	if _, _, err := Read(filepath.Join(dir, "summary.json")); err == nil {
		t.Error("Read(summary.json) succeeded, want an error")
	}
	// A directory without certificates.
	empty := t.TempDir()
	write2 := filepath.Join(empty, "problem.json")
	if err := os.WriteFile(write2, []byte(`{}`), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, _, err := Read(empty); err == nil || !strings.Contains(err.Error(), "no gapcert certificates") {
		t.Errorf("Read(empty dir) = %v, want an error", err)
	}
}
