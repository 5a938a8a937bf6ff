package main

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
)

// slowProblem takes several refinement steps at 1e-14 (about a second
// each at most on one core).
const slowProblem = `{"name":"slow","domain":{"interval":["0","1"]},"potential":"exp(sin(7*x))","boundary":"dirichlet","eigenvalues":2,"target":{"relative_width":"1e-14"}}`

func writeProblem(t *testing.T, dir, src string) string {
	t.Helper()
	file := filepath.Join(dir, "problem.json")
	if err := os.WriteFile(file, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return file
}

// TestCertifyRefusals: bad targets and time limits are refused before
// anything is computed or written, with exit 1 for options and 2 for the
// problem file's own target.
func TestCertifyRefusals(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(testdata, "interval_harmonic.json")
	out := filepath.Join(dir, "out.cert.json")
	tiny := writeProblem(t, dir, `{"domain":{"interval":["0","1"]},"boundary":"dirichlet","eigenvalues":2,"target":{"relative_width":"1e-300"}}`)
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"certify", good, "-o", out, "--rel-width", "1e-300"}, exitFailure, "below what float64 bounds can resolve (hint: ask for 1e-15"},
		{[]string{"certify", good, "-o", out, "--time-limit", "-5s"}, exitFailure, "--time-limit -5s: want a positive duration"},
		{[]string{"certify", good, "-o", out, "--time-limit", "0s"}, exitFailure, "want a positive duration"},
		{[]string{"certify", tiny, "-o", out}, exitInvalid, "relative width 1e-300: is below what float64"},
		{[]string{"sweep", filepath.Join("..", "..", "testdata", "examples", "convex_potential_family.json"), "--out", filepath.Join(dir, "sw"), "--rel-width", "1e-20"}, exitFailure, "below what float64"},
	} {
		start := time.Now()
		code, _, errs := execute(c.args...)
		if code != c.code || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, c.code, c.want)
		}
		if d := time.Since(start); d > 2*time.Second {
			t.Errorf("%v: refused after %v", c.args, d)
		}
	}
	for _, f := range []string{out, filepath.Join(dir, "sw")} {
		if _, err := os.Stat(f); err == nil {
			t.Errorf("%s was written", f)
		}
	}
}

// TestCertifyStrictAndProgress: a target out of reach in the budget exits
// 4 with --strict, prints and records the stop reason, and --progress
// writes progress lines (elapsed time, widths, target) to a non-terminal
// stderr unless --quiet.
func TestCertifyStrictAndProgress(t *testing.T) {
	dir := t.TempDir()
	file := writeProblem(t, dir, slowProblem)
	out := filepath.Join(dir, "slow.cert.json")
	code, stdout, errs := execute("certify", file, "-o", out, "--time-limit", "1ms", "--strict", "--progress")
	if code != exitTargetMissed {
		t.Fatalf("exit %d, want %d; stderr %q", code, exitTargetMissed, errs)
	}
	for _, want := range []string{"refinement stopped: time limit", "target 1e-14: not reached", "target rule: width / max(|midpoint|, pi^2/D^2)", "relative"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, stdout)
		}
	}
	if !strings.Contains(errs, "step 1") || !strings.Contains(errs, "target 1e-14") || !strings.Contains(errs, "s] step") {
		t.Errorf("progress lines %q", errs)
	}
	if code, _, errs := execute("check", out); code != exitOK {
		t.Errorf("check: exit %d, %s", code, errs)
	}
	if _, _, errs := execute("certify", file, "-o", out, "--time-limit", "1ms", "--progress", "--quiet"); strings.Contains(errs, "step 1") {
		t.Errorf("--quiet --progress printed %q", errs)
	}
	if code, _, _ := execute("certify", filepath.Join(testdata, "interval_harmonic.json"), "-o", out, "--strict"); code != exitOK {
		t.Errorf("--strict with the target reached: exit %d", code)
	}
}

// cancelOnStep is a stderr that cancels a context when a progress line of
// the given step arrives, as an interrupt would.
type cancelOnStep struct {
	mu     sync.Mutex
	buf    bytes.Buffer
	step   string
	cancel context.CancelFunc
}

func (w *cancelOnStep) Write(p []byte) (int, error) {
	w.mu.Lock()
	defer w.mu.Unlock()
	if strings.Contains(string(p), w.step) {
		w.cancel()
	}
	return w.buf.Write(p)
}

// TestCertifyInterruptContext: the command under a context cancelled after
// the first step prints "interrupted" and the bounds, writes a certificate
// marked interrupted that check verifies, and exits 130; under a context
// cancelled before, it writes nothing.
func TestCertifyInterruptContext(t *testing.T) {
	dir := t.TempDir()
	file := writeProblem(t, dir, slowProblem)
	out := filepath.Join(dir, "slow.cert.json")
	ctx, cancel := context.WithCancel(context.Background())
	stderr := &cancelOnStep{step: "step 1 ", cancel: cancel}
	var stdout bytes.Buffer
	code := runContext(ctx, []string{"certify", file, "-o", out, "--progress"}, &stdout, stderr)
	if code != exitInterrupted || !strings.Contains(stderr.buf.String(), "interrupted") {
		t.Fatalf("exit %d, stderr %q", code, stderr.buf.String())
	}
	if !strings.Contains(stdout.String(), "lambda1") || !strings.Contains(stdout.String(), "refinement stopped: interrupted") {
		t.Errorf("stdout lacks the bounds or the reason:\n%s", stdout.String())
	}
	requireInterruptedCertificate(t, out)

	ctx, cancel = context.WithCancel(context.Background())
	cancel()
	out2 := filepath.Join(dir, "never.cert.json")
	var errb bytes.Buffer
	if code := runContext(ctx, []string{"certify", file, "-o", out2}, &stdout, &errb); code != exitInterrupted || !strings.Contains(errb.String(), "nothing written") {
		t.Errorf("cancelled before: exit %d, stderr %q", code, errb.String())
	}
	if _, err := os.Stat(out2); err == nil {
		t.Error("a certificate was written without bounds")
	}
}

func requireInterruptedCertificate(t *testing.T, file string) {
	t.Helper()
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	if ref, _ := certify.RefinementOf(c); ref == nil || ref.StopReason != certify.StopInterrupted {
		t.Errorf("stop record %+v", ref)
	}
	if code, _, errs := execute("check", file); code != exitOK {
		t.Errorf("check of the interrupted certificate: exit %d, %s", code, errs)
	}
}

// TestInterruptHelperProcess runs gapcert in a child process for
// TestCertifySIGINT (it does nothing in a normal test run).
func TestInterruptHelperProcess(t *testing.T) {
	args := os.Getenv("GAPCERT_HELPER_ARGS")
	if args == "" {
		return
	}
	os.Exit(run(strings.Split(args, "\x1f"), os.Stdout, os.Stderr))
}

// TestCertifySIGINT sends SIGINT to a certify process after its first
// step: it exits 130 with "interrupted", and the certificate file that was
// at the output path stays intact until the new, verifying one replaces it.
func TestCertifySIGINT(t *testing.T) {
	dir := t.TempDir()
	file := writeProblem(t, dir, slowProblem)
	out := filepath.Join(dir, "slow.cert.json")
	old := []byte("an earlier certificate\n")
	if err := os.WriteFile(out, old, 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(os.Args[0], "-test.run=^TestInterruptHelperProcess$")
	cmd.Env = append(os.Environ(), "GAPCERT_HELPER_ARGS="+strings.Join([]string{"certify", file, "-o", out, "--progress"}, "\x1f"))
	var stdout bytes.Buffer
	cmd.Stdout = &stdout
	stderr, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	var errText strings.Builder
	buf := make([]byte, 4096)
	for !strings.Contains(errText.String(), "step 1 ") {
		n, err := stderr.Read(buf)
		errText.Write(buf[:n])
		if err != nil {
			t.Fatalf("no progress line: %q (%v)", errText.String(), err)
		}
	}
	if got, _ := os.ReadFile(out); !bytes.Equal(got, old) {
		t.Errorf("the earlier certificate changed during the run: %q", got)
	}
	if err := cmd.Process.Signal(syscall.SIGINT); err != nil {
		t.Fatal(err)
	}
	for {
		n, err := stderr.Read(buf)
		errText.Write(buf[:n])
		if err != nil {
			break
		}
	}
	err = cmd.Wait()
	if code := cmd.ProcessState.ExitCode(); code != exitInterrupted {
		t.Fatalf("exit %d (%v), stderr %q", code, err, errText.String())
	}
	if !strings.Contains(errText.String(), "interrupted") || !strings.Contains(stdout.String(), "lambda1") {
		t.Errorf("stderr %q, stdout %q", errText.String(), stdout.String())
	}
	requireInterruptedCertificate(t, out)
}

// TestSweepStrictAndProgress: sweep --strict exits 4 when a point misses
// its target and lists the points with their stop reasons; --progress
// writes per-point lines to a non-terminal stderr; without --strict the
// same sweep exits 0.
func TestSweepStrictAndProgress(t *testing.T) {
	dir := t.TempDir()
	fam := filepath.Join(dir, "family.json")
	src := `{"template":{"domain":{"interval":["0","1"]},"potential":"c*exp(sin(7*x))","boundary":"dirichlet"},
		"parameters":[{"name":"c","values":["1","2"]}],"relative_width":"1e-15","time_limit":"1ms"}`
	if err := os.WriteFile(fam, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, errs := execute("sweep", fam, "--out", filepath.Join(dir, "strict"), "--strict", "--progress")
	if code != exitTargetMissed || !strings.Contains(errs, "point 0: time limit") || !strings.Contains(errs, "point 1: time limit") {
		t.Errorf("--strict: exit %d, stderr %q", code, errs)
	}
	if strings.Count(errs, ": computed; widest relative width ") != 2 || strings.Count(errs, "target 1e-15 (") != 2 || strings.Count(errs, "s elapsed)") != 2 {
		t.Errorf("want two progress lines with the width reached, the target and the elapsed time: %q", errs)
	}
	if code, _, errs := execute("sweep", fam, "--out", filepath.Join(dir, "plain"), "--quiet"); code != exitOK || errs != "" {
		t.Errorf("without --strict: exit %d, stderr %q", code, errs)
	}
}
