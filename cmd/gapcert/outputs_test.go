package main

import (
	"crypto/sha256"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
)

// snapshot describes every file under root (mode, size, modification
// time and content digest) and every directory (mode), to show that a
// refused command touched nothing.
func snapshot(t *testing.T, root string) map[string]string {
	t.Helper()
	snap := map[string]string{}
	err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		info, err := d.Info()
		if err != nil {
			return err
		}
		if d.IsDir() {
			// A directory's time changes with the probe file of a check
			// (created and removed); its entries are compared one by one.
			snap[path] = info.Mode().String()
			return nil
		}
		desc := fmt.Sprintf("%v %d %v", info.Mode(), info.Size(), info.ModTime().UnixNano())
		if info.Mode().IsRegular() {
			data, err := os.ReadFile(path)
			if err != nil {
				return err
			}
			desc += fmt.Sprintf(" %x", sha256.Sum256(data))
		}
		snap[path] = desc
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return snap
}

// copyTree copies the files of the directory src (one level) into dst.
func copyTree(t *testing.T, src, dst string) {
	t.Helper()
	if err := os.MkdirAll(dst, 0o755); err != nil {
		t.Fatal(err)
	}
	es, err := os.ReadDir(src)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range es {
		if e.IsDir() {
			continue
		}
		copyFile(t, filepath.Join(src, e.Name()), filepath.Join(dst, e.Name()))
	}
}

func copyFile(t *testing.T, src, dst string) {
	t.Helper()
	data, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(dst, data, 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestOutputRefusals: every command refuses an output that is one of its
// inputs or cannot be written, before computing anything: exit status 1,
// a message naming the path with a hint, and no file touched. Places that
// cannot be written are below a regular file ("afile/out.json"), which
// fails for every user, root included.
func TestOutputRefusals(t *testing.T) {
	root := t.TempDir()
	in := func(parts ...string) string { return filepath.Join(append([]string{root}, parts...)...) }
	copyFile(t, filepath.Join(testdata, "lshape.json"), in("p.json"))
	copyFile(t, filepath.Join(examples, "convex_potential_family.json"), in("family.json"))
	if err := os.WriteFile(in("afile"), []byte("a regular file\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Mkdir(in("adir"), 0o755); err != nil {
		t.Fatal(err)
	}
	hardLink := in("link.json")
	if err := os.Link(in("p.json"), hardLink); err != nil {
		hardLink = ""
	}
	copyTree(t, "../../certs/report/testdata/certs", in("certs"))
	copyTree(t, filepath.Join(testSweeps, "convex"), in("convex"))
	copyTree(t, filepath.Join(testSweeps, "convex"), in("merged")) // holds a summary.json already
	if err := os.Mkdir(in("sweep"), 0o755); err != nil {
		t.Fatal(err)
	}
	copyFile(t, filepath.Join(examples, "convex_potential_family.json"), in("sweep", "summary.json"))

	for _, c := range []struct {
		name string
		args []string
		path string // the path the message must name
		want string
	}{
		{"certify -o input", []string{"certify", in("p.json"), "-o", in("p.json")}, in("p.json"), "is an input as well"},
		{"certify --out input", []string{"certify", in("p.json"), "--out", in("adir", "..", "p.json")}, in("adir", "..", "p.json"), "is an input as well"},
		{"certify -o hard link of input", []string{"certify", in("p.json"), "-o", hardLink}, hardLink, "is the same file as the input"},
		{"certify -o below a file", []string{"certify", in("p.json"), "-o", in("afile", "out.json")}, in("afile", "out.json"), "is not a directory"},
		{"certify -o missing dir", []string{"certify", in("p.json"), "-o", in("nodir", "out.json")}, in("nodir", "out.json"), "does not exist"},
		{"certify -o directory", []string{"certify", in("p.json"), "-o", in("adir")}, in("adir"), "is a directory"},
		{"certify -o device", []string{"certify", in("p.json"), "-o", os.DevNull}, os.DevNull, "is not a regular file"},
		{"certify --plot below a file", []string{"certify", in("p.json"), "-o", in("c.json"), "--plot", in("afile", "pics")}, in("afile", "pics"), "is not a directory"},
		{"certify --plot input", []string{"certify", in("p.json"), "-o", in("c.json"), "--plot", in("p.json")}, in("p.json"), "is an input as well"},
		{"demo -o below a file", []string{"demo", "-o", in("afile", "demo.cert.json")}, in("afile", "demo.cert.json"), "is not a directory"},
		{"report DIR -o DIR/cert", []string{"report", in("certs"), "-o", in("certs", "square.cert.json")}, in("certs", "square.cert.json"), "is an input as well"},
		{"report FILE -o FILE", []string{"report", in("certs", "square.cert.json"), "--out", in("certs", "square.cert.json")}, in("certs", "square.cert.json"), "is an input as well"},
		{"report -o below a file", []string{"report", in("certs"), "-o", in("afile", "t.tex")}, in("afile", "t.tex"), "is not a directory"},
		{"merge --out input", []string{"merge", in("convex"), "--out", in("convex")}, in("convex"), "is an input as well"},
		{"merge -o below a file", []string{"merge", in("convex"), "-o", in("afile", "m")}, in("afile", "m"), "cannot be created: " + in("afile") + " is not a directory"},
		{"merge -o with a summary", []string{"merge", in("convex"), "-o", in("merged")}, in("merged", "summary.json"), "exists; not overwritten"},
		{"sweep --out below a file", []string{"sweep", in("family.json"), "--out", in("afile", "s")}, in("afile", "s"), "is not a directory"},
		{"sweep -o input", []string{"sweep", in("family.json"), "-o", in("family.json")}, in("family.json"), "is an input as well"},
		{"sweep family is the summary", []string{"sweep", in("sweep", "summary.json"), "-o", in("sweep")}, in("sweep", "summary.json"), "is where the sweep writes its summary"},
		{"plot -o below a file", []string{"plot", in("convex"), "--x", "c", "--quantity", "gap", "-o", in("afile", "p.png")}, in("afile", "p.png"), "is not a directory"},
		{"plot -o summary", []string{"plot", in("convex", "summary.json"), "--x", "c", "--quantity", "gap", "--out", in("convex", "summary.json")}, in("convex", "summary.json"), "unknown picture format"},
	} {
		if c.path == "" {
			continue // no hard links here
		}
		before := snapshot(t, root)
		code, stdout, stderr := execute(c.args...)
		if code != exitFailure || stdout != "" || !strings.HasPrefix(stderr, c.path+": ") || !strings.Contains(stderr, c.want) || !strings.Contains(stderr, "(hint: ") {
			t.Errorf("%s: exit %d, stdout %q, stderr %q; want exit %d and %q: … %q … (hint: …)", c.name, code, stdout, stderr, exitFailure, c.path, c.want)
		}
		after := snapshot(t, root)
		for p, d := range before {
			if after[p] != d {
				t.Errorf("%s: %s changed: %s → %s", c.name, p, d, after[p])
			}
		}
		for p := range after {
			if _, ok := before[p]; !ok {
				t.Errorf("%s: %s was created", c.name, p)
			}
		}
	}
}

// TestUnwritableOutputRefusedFirst: an output that cannot be written is
// refused before the computation starts, not after it. The L-shape at a
// relative width of 1e-10 would refine for the whole minute of its time
// limit; the refusal takes a stat and a probe file.
func TestUnwritableOutputRefusedFirst(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "afile")
	if err := os.WriteFile(file, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(file, "lshape.cert.json")
	start := time.Now()
	code, _, stderr := execute("certify", filepath.Join(testdata, "lshape.json"), "--rel-width", "1e-10", "--time-limit", "60s", "-o", out)
	elapsed := time.Since(start)
	if code != exitFailure || !strings.HasPrefix(stderr, out+": ") {
		t.Errorf("exit %d, stderr %q; want exit 1 naming %s", code, stderr, out)
	}
	if elapsed > time.Second {
		t.Errorf("refused after %v; the refusal must come before the computation", elapsed)
	}
}

// packagePrefix matches a message part that starts with the name of an
// internal package or of a system call ("certs: …", "stat x: …").
var packagePrefix = regexp.MustCompile(`(^|: |\n)(certs|certify|report|plot|sweepplot|sweep|formula|decimalio|problem|named|hypothesis|line|tri|mesh|band|sparse|enclose|temple|open|stat|read) [^ ]*:|(^|: |\n)(certs|certify|report|plot|sweepplot|sweep|formula|decimalio|problem|named|hypothesis|line|tri|mesh|band|sparse|enclose|temple): `)

// TestMessagesSayWhatIsWrong: messages that reach the terminal name the
// file and the defect, not the package or system call that found it.
func TestMessagesSayWhatIsWrong(t *testing.T) {
	dir := t.TempDir()
	notJSON := filepath.Join(dir, "notes.json")
	otherFormat := filepath.Join(dir, "old.cert.json")
	if err := os.WriteFile(notJSON, []byte("nope\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(otherFormat, []byte(`{"format": "gapcert.certificate/v0"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	missing := filepath.Join(dir, "missing.json")
	convex := filepath.Join(testSweeps, "convex")
	for _, c := range []struct {
		args []string
		want string
		code int
	}{
		{[]string{"check", notJSON}, notJSON + ": not a JSON certificate", exitFailure},
		// A certificate of another format version does not verify here.
		{[]string{"check", otherFormat}, otherFormat + `: format: certificate format "gapcert.certificate/v0" is not supported`, exitMismatch},
		{[]string{"check", missing}, missing + ": no such file or directory (hint: check the path)", exitFailure},
		{[]string{"report", notJSON}, notJSON + ": not a JSON certificate", exitFailure},
		{[]string{"report", missing}, missing + ": no such file or directory (hint: check the path)", exitFailure},
		{[]string{"report", "--format", "html", notJSON}, `unknown format "html" (hint: use one of`, exitFailure},
		{[]string{"sweep", missing, "-o", filepath.Join(dir, "s")}, missing + ": no such file or directory (hint: check the path)", exitFailure},
		{[]string{"plot", missing, "--x", "c", "--quantity", "gap", "-o", filepath.Join(dir, "p.png")}, missing + ": no such file or directory (hint: check the path)", exitFailure},
		{[]string{"plot", convex, "--x", "c", "--quantity", "lambda1/0", "-o", filepath.Join(dir, "p.png")}, `point 0: quantity "lambda1/0": lambda1/0 is not defined on all of [0, 0] (hint: `, exitFailure},
	} {
		code, _, stderr := execute(c.args...)
		if code != c.code || !strings.Contains(stderr, c.want) || packagePrefix.MatchString(stderr) {
			t.Errorf("%q: exit %d, stderr %q; want exit %d and %q, no package or system call names", c.args, code, stderr, c.code, c.want)
		}
	}
}

// TestOneOutputFlag: every command that writes files names its output
// with -o, --out, and no command has another spelling of it.
func TestOneOutputFlag(t *testing.T) {
	root := newRootCmd(io.Discard, io.Discard)
	writers := map[string]bool{"certify": true, "demo": true, "report": true, "plot": true, "sweep": true, "merge": true, "cover": true}
	for _, c := range root.Commands() {
		f := c.Flags().Lookup("out")
		if writers[c.Name()] != (f != nil) {
			t.Errorf("%s: has --out = %v, want %v", c.Name(), f != nil, writers[c.Name()])
		}
		if f != nil && f.Shorthand != "o" {
			t.Errorf("%s: --out has shorthand %q, want o", c.Name(), f.Shorthand)
		}
		for _, other := range []string{"output", "output-dir", "outdir", "dest"} {
			if c.Flags().Lookup(other) != nil {
				t.Errorf("%s: has --%s besides --out", c.Name(), other)
			}
		}
		delete(writers, c.Name())
	}
	if len(writers) > 0 {
		t.Errorf("commands not found: %v", writers)
	}
}
