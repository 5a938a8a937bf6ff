package main

import (
	"crypto/sha256"
	"encoding/csv"
	"encoding/hex"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// readmeSection returns the text of README.md from the heading "## name"
// to the next heading of that level.
func readmeSection(t *testing.T, readme, name string) string {
	t.Helper()
	start := strings.Index(readme, "\n## "+name+"\n")
	if start < 0 {
		t.Fatalf("README.md has no section %q", name)
	}
	rest := readme[start+1:]
	if end := strings.Index(rest[3:], "\n## "); end >= 0 {
		rest = rest[:end+4]
	}
	return rest
}

// readmeCommands returns the gapcert commands of a README section: its
// indented lines "    $ gapcert …", split into arguments at spaces
// (the README's commands quote nothing).
func readmeCommands(section string) [][]string {
	var cmds [][]string
	for _, line := range strings.Split(section, "\n") {
		if rest, ok := strings.CutPrefix(line, "    $ gapcert "); ok {
			cmds = append(cmds, strings.Fields(rest))
		}
	}
	return cmds
}

// readmeFamily returns the family file of the section: its indented block
// that starts with "    {".
func readmeFamily(t *testing.T, section string) string {
	t.Helper()
	start := strings.Index(section, "\n    {")
	if start < 0 {
		t.Fatal("the section shows no family file")
	}
	block := section[start+1:]
	block = block[:strings.Index(block, "\n\n")]
	var lines []string
	for _, l := range strings.Split(block, "\n") {
		lines = append(lines, strings.TrimPrefix(l, "    "))
	}
	return strings.Join(lines, "\n") + "\n"
}

// TestReadmeSweepWorkflow runs the commands of the README's sections
// "Parameter sweeps" and "Tables and pictures" as written, in a fresh
// directory with the README's family file saved as triangles.json: two
// shards, their merge, then plot and report on the merged directory and
// on a shard directory, among them the README's two-parameter map of the
// built-in claim @triangle_gap. Every command must exit 0; the merged
// directory must stand alone; the table must have a row per point with
// the parameters in their own columns, and its list of certificate
// hashes must match the files.
func TestReadmeSweepWorkflow(t *testing.T) {
	data, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	readme := string(data)
	sweeps := readmeSection(t, readme, "Parameter sweeps")
	pictures := readmeSection(t, readme, "Tables and pictures")
	family := readmeFamily(t, sweeps)
	cmds := append(readmeCommands(sweeps), readmeCommands(pictures)...)
	var kinds []string
	for _, c := range cmds {
		kinds = append(kinds, c[0])
	}
	if got := strings.Join(kinds, " "); got != "sweep sweep merge plot report plot report" {
		t.Fatalf("the README's commands are %q, want two shards, a merge, then plot and report twice", got)
	}

	t.Chdir(t.TempDir())
	if err := os.WriteFile("triangles.json", []byte(family), 0o644); err != nil {
		t.Fatal(err)
	}
	outputs, errOutputs := make([]string, len(cmds)), make([]string, len(cmds))
	for i, args := range cmds {
		t0 := time.Now()
		code, stdout, stderr := execute(args...)
		t.Logf("gapcert %s: %.2fs", strings.Join(args, " "), time.Since(t0).Seconds())
		if code != exitOK {
			t.Fatalf("gapcert %s: exit %d\nstdout:\n%s\nstderr:\n%s", strings.Join(args, " "), code, stdout, stderr)
		}
		outputs[i], errOutputs[i] = stdout, stderr
	}

	// The merged directory stands alone: the family file, a certificate
	// per point and the summary, whose file names are plain names in it.
	merged := filepath.Join("run", "merged")
	files, err := filepath.Glob(filepath.Join(merged, "p*.cert.json"))
	if err != nil || len(files) != 9 {
		t.Fatalf("merged directory holds %d certificates (%v), want 9", len(files), err)
	}
	if _, err := os.Stat(filepath.Join(merged, "family.json")); err != nil {
		t.Error(err)
	}
	csvData, err := os.ReadFile(filepath.Join(merged, "summary.csv"))
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(strings.NewReader(string(csvData))).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(rows[0], ","), ",@triangle_gap,file,") || len(rows) != 10 {
		t.Errorf("summary.csv: header %v, %d rows", rows[0], len(rows))
	}

	for _, pic := range []string{"map.svg", "shard-0.svg"} {
		if st, err := os.Stat(pic); err != nil || st.Size() == 0 {
			t.Errorf("%s not written (%v)", pic, err)
		}
	}

	// The merged table (table.md) and the shard table (stdout).
	table, err := os.ReadFile("table.md")
	if err != nil {
		t.Fatal(err)
	}
	shardTable := outputs[len(outputs)-1]
	for _, c := range []struct {
		name, text, header string
		points             []string
	}{
		{"table.md", string(table), "| point | a | b | λ1 | λ2 | gap λ2 − λ1 | D²·gap/π² | `@triangle_gap` |\n",
			[]string{"| 0 | 0.25 | 0.5 |", "| 4 | 0.5 | 1 |", "| 8 | 0.75 | 1.5 |"}},
		{"shard-0 table", shardTable, "\\begin{longtable}{rlllllll}\n",
			[]string{"\n0 & $0.25$ & $0.5$ & ", "\n2 & $0.25$ & $1.5$ & ", "\n8 & $0.75$ & $1.5$ & "}},
	} {
		if !strings.Contains(c.text, c.header) {
			t.Errorf("%s lacks %q:\n%s", c.name, c.header, c.text)
		}
		for _, p := range c.points {
			if !strings.Contains(c.text, p) {
				t.Errorf("%s lacks the row %q:\n%s", c.name, p, c.text)
			}
		}
		if !strings.Contains(c.text, "every certificate re-verified") || !strings.Contains(c.text, "one row per point of the sweep family triangles with base [0, 1] and apex (a, b)") {
			t.Errorf("%s: caption:\n%s", c.name, c.text)
		}
	}
	if !strings.Contains(shardTable, "(5 of its 9 points)") || !strings.Contains(errOutputs[len(cmds)-1], "5 of the family's 9 points have a certificate here") {
		t.Errorf("the shard table does not say that it holds 5 of the 9 points (stderr %q)", errOutputs[len(cmds)-1])
	}
	if !strings.Contains(errOutputs[len(cmds)-2], "shard 0/2: only its 5 of the family's 9 points are drawn") {
		t.Errorf("plot of a shard: stderr %q", errOutputs[len(cmds)-2])
	}
	if strings.Count(shardTable, " & holds \\\\\n") != 5 || !strings.Contains(shardTable, "listed after the table") || !strings.Contains(shardTable, "\n% ") || !strings.Contains(shardTable, "  p0008-") {
		t.Errorf("shard-0 table: want 5 points and the hash list after the table:\n%s", shardTable)
	}

	// table.sha256 lists the merged certificates with their SHA-256, and
	// the caption gives the SHA-256 of that list.
	list, err := os.ReadFile("table.sha256")
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSuffix(string(list), "\n"), "\n")
	if len(lines) != 9 {
		t.Fatalf("table.sha256 has %d lines, want 9", len(lines))
	}
	for _, l := range lines {
		sum, name, ok := strings.Cut(l, "  ")
		data, err := os.ReadFile(filepath.Join(merged, name))
		if !ok || err != nil {
			t.Fatalf("table.sha256 line %q (%v)", l, err)
		}
		if got := sha256.Sum256(data); hex.EncodeToString(got[:]) != sum {
			t.Errorf("table.sha256: %s does not match %s", sum, name)
		}
	}
	digest := sha256.Sum256(list)
	if !strings.Contains(string(table), "listed in table.sha256): `"+hex.EncodeToString(digest[:])+"`") {
		t.Errorf("the caption lacks the list's digest %x:\n%s", digest, table)
	}
}
