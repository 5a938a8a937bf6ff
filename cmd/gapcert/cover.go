package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"gapcert/certs"
	"gapcert/certs/cover"
	"gapcert/certs/plot/coverplot"
	"gapcert/certs/sweep"
)

type coverFlags struct {
	out      string
	shard    string
	jobs     int
	quiet    bool
	progress bool
	memory   memoryLimitFlag
}

func newCoverCmd() *cobra.Command {
	var f coverFlags
	cmd := &cobra.Command{
		Use:   "cover FAMILY --out DIR",
		Short: "Decide a family's claims over whole parameter ranges, cell by cell (resumable, in shards)",
		Long: `cover reads the family file FAMILY (a problem template with named
parameters, each with a range {"lo", "hi"} and a "min_cell"; "count"
sets the first split) and decides its claims for every parameter value of
the box: it splits the box into cells, bisecting a cell in its widest
parameter (relative to min_cell) until each cell's claims hold or fail on
the whole cell, or the cell is no wider than min_cell (its claims stay
undecided).

A cell's eigenvalue bounds come from two certified problems, its low and
high corners: Robin coefficients and the potential may depend on the
parameters when the dependence has one sign over the box (decided by
interval evaluation of the derivative before anything is certified), and
then λ_k(low) ≤ λ_k(p) ≤ λ_k(high) on the cell (min–max). The vertices
of a triangle (Dirichlet and Neumann sides, constant V) may depend on the
parameters: a cell then costs one certified problem, the triangle at its
centre, and λ_k − V over the cell lies between λ_k − V there divided by
(1 + r)² and by (1 − r)², r bounding the distance of the affine maps to
the identity (the singular values of their Jacobian). A dependence of
both signs, a moving domain that is not a triangle, a moving triangle
with a Robin side or a varying potential, or one that degenerates in the
box, is refused before computing, with the reason.

DIR receives family.json, one certificate per corner
(corner-HASH.cert.json, shared by the cells that meet there), one per
cell (cell-HASH.cell.json), and summary.json, summary.csv (coverage of
each claim: fractions of the box where it holds, fails or is undecided,
as exact decimals or fractions) and summary-cells.csv. With --shard i/n
the boxes k of the first split with k mod n = i are covered, and the
summaries are summary-shard-i-of-n.*; "gapcert merge" gathers the shards
and proves that the cells tile the box. Run it again to resume: cell
certificates that verify are kept.

Exit status: 0 on success, 1 on a failure, 2 if the family file or
--shard is invalid (nothing is written), 3 if a certificate in DIR does
not verify (left in place).`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error { return runCover(cmd, args[0], f) },
	}
	cmd.Flags().StringVarP(&f.out, "out", "o", "", "directory for the certificates and summaries (required)")
	cmd.Flags().StringVar(&f.shard, "shard", "", "cover only shard i/n (0 ≤ i < n): the boxes k of the first split with k mod n = i")
	cmd.Flags().IntVarP(&f.jobs, "jobs", "j", 1, "corners certified at a time")
	cmd.Flags().BoolVarP(&f.quiet, "quiet", "q", false, "no progress lines on stderr")
	cmd.Flags().BoolVar(&f.progress, "progress", false, "progress lines on stderr also when it is not a terminal (--quiet wins)")
	f.memory.register(cmd, "memory budget of each corner's certification (see certify --memory-limit; default 16GiB)")
	_ = cmd.MarkFlagRequired("out")
	return cmd
}

func runCover(cmd *cobra.Command, file string, f coverFlags) error {
	if f.jobs < 1 {
		return &exitError{code: exitFailure, err: fmt.Errorf("--jobs %d: want at least 1", f.jobs)}
	}
	if err := f.memory.parse(); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	opt := cover.RunOptions{FamilyName: filepath.Base(file), Jobs: f.jobs, Tool: "gapcert " + Version, Memory: f.memory.bytes}
	if f.shard != "" {
		s, err := sweep.ParseShard(f.shard)
		if err != nil {
			return &exitError{code: exitInvalid, err: err}
		}
		opt.Shard = s
	}
	fam, err := loadCoverFamily(file)
	if err != nil {
		return err
	}
	if err := checkOutputDir(f.out, file); err != nil {
		return err
	}
	if progressWanted(cmd, f.quiet, f.progress) {
		opt.Progress = func(format string, args ...any) { fmt.Fprintf(cmd.ErrOrStderr(), format, args...) }
	}
	start := time.Now()
	s, err := cover.Run(fam, f.out, opt)
	var rej *cover.RejectedError
	var inv *cover.InvalidError
	switch {
	case errors.As(err, &inv):
		return &exitError{code: exitInvalid, err: err}
	case errors.As(err, &rej):
		printCoverage(cmd.OutOrStdout(), s)
		return &exitError{code: exitMismatch, err: err}
	case err != nil:
		return &exitError{code: exitFailure, err: err}
	}
	w := cmd.OutOrStdout()
	fmt.Fprintf(w, "family %s: %d cells, %d corner certificates, %.1fs\n", file, len(s.Cells), s.Corners, time.Since(start).Seconds())
	printCoverage(w, s)
	fmt.Fprintf(w, "summary written to %s\n", filepath.Join(f.out, sweep.SummaryFileName(s.Shard)+".json"))
	return nil
}

// loadCoverFamily reads and validates a cover family file; defects are
// listed as "FILE: path: message (hint: …)" with exit status 2.
func loadCoverFamily(file string) (*cover.Family, error) {
	data, err := os.ReadFile(file)
	if err != nil {
		return nil, readFailure(err)
	}
	fam, err := cover.ParseFamily(data)
	var inv *cover.InvalidError
	if errors.As(err, &inv) {
		lines := make([]string, len(inv.Issues))
		for i, is := range inv.Issues {
			lines[i] = file + ": " + is.String()
		}
		return nil, &exitError{code: exitInvalid, err: errors.New(strings.Join(lines, "\n"))}
	}
	if err != nil {
		return nil, &exitError{code: exitFailure, err: fmt.Errorf("%s: %v", file, err)}
	}
	return fam, nil
}

// printCoverage prints each claim's coverage and the cells where a claim
// fails or is undecided (at most 20 of them).
func printCoverage(w io.Writer, s *cover.Summary) {
	if s == nil {
		return
	}
	fmt.Fprintf(w, "covered: %s of the box\n", s.Covered)
	for _, c := range s.Claims {
		fmt.Fprintf(w, "claim %s: holds on %s, fails on %s, undecided on %s of the box\n", c.Text, c.Coverage.Holds, c.Coverage.Fails, c.Coverage.Undecided)
	}
	n := 0
	for _, r := range s.Cells {
		if r.Verdict == "holds" || r.Verdict == "" {
			continue
		}
		if n++; n > 20 {
			fmt.Fprintln(w, "  …")
			break
		}
		var parts []string
		for _, b := range r.Bounds {
			parts = append(parts, fmt.Sprintf("%s ∈ [%s, %s]", b.Name, b.Lo, b.Hi))
		}
		fmt.Fprintf(w, "  cell %s: %s (%s)\n", strings.Join(parts, ", "), r.Verdict, r.Status)
	}
}

// runCoverMerge merges cover directories (cover.Merge).
func runCoverMerge(cmd *cobra.Command, dirs []string, out string, quiet bool, memory int64) error {
	var progress func(string, ...any)
	if !quiet && isTerminal(cmd.ErrOrStderr()) {
		progress = func(format string, a ...any) { fmt.Fprintf(cmd.ErrOrStderr(), format, a...) }
	}
	s, err := cover.Merge(dirs, out, cover.MergeOptions{Progress: progress, Memory: memory})
	var me *cover.MergeError
	var inv *cover.InvalidError
	switch {
	case errors.As(err, &me):
		return &exitError{code: exitMismatch, err: err}
	case errors.As(err, &inv):
		return &exitError{code: exitInvalid, err: err}
	case err != nil:
		return &exitError{code: exitFailure, err: err}
	}
	w := cmd.OutOrStdout()
	fmt.Fprintf(w, "merged %d directories: %d cells, every cell certificate verifies\n", len(dirs), len(s.Cells))
	fmt.Fprintf(w, "tiling: %s\n", s.Tiling)
	printCoverage(w, s)
	fmt.Fprintf(w, "summary written to %s\n", filepath.Join(out, "summary.json"))
	return nil
}

// checkCoverCell re-verifies a cell certificate with the corner files
// beside it (cover.CheckCell).
func checkCoverCell(cmd *cobra.Command, name string, data []byte, memory int64) error {
	c, _, err := cover.CheckCell(data, filepath.Dir(name), cover.NewCornerVerifier(memory))
	var mm *cover.MismatchError
	var bad *certs.FormatError
	switch {
	case errors.As(err, &mm), errors.As(err, &bad):
		return &exitError{code: exitMismatch, err: fmt.Errorf("%s: %v", name, err)}
	case err != nil:
		return &exitError{code: exitFailure, err: fmt.Errorf("%s: %v", name, err)}
	}
	var parts []string
	for _, b := range c.Bounds {
		parts = append(parts, fmt.Sprintf("%s ∈ [%s, %s]", b.Name, b.Lo, b.Hi))
	}
	fmt.Fprintf(cmd.OutOrStdout(), "%s: cell certificate verifies (%s: corners recomputed, order, enclosures and verdicts agree; verdict %s)\n", name, strings.Join(parts, ", "), c.Verdict)
	return nil
}

// isCoverSummary reports whether path is a cover summary or a directory
// holding one.
func isCoverSummary(path string) bool {
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		if path, err = sweep.SummaryIn(path); err != nil {
			return false
		}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return false
	}
	var head struct {
		Format string `json:"format"`
	}
	return json.Unmarshal(data, &head) == nil && head.Format == cover.SummaryFormat
}

// plotCover draws the cells of a cover coloured by their verdict on the
// claim (1-based text; "" = the first).
func plotCover(cmd *cobra.Command, path, out, claim string) error {
	n := 1
	if claim != "" {
		k, err := strconv.Atoi(claim)
		if err != nil || k < 1 {
			return &exitError{code: exitFailure, err: fmt.Errorf("--claim %q: give the claim's number (1-based) in a cover", claim)}
		}
		n = k
	}
	if err := checkPictureFile(out, path); err != nil {
		return err
	}
	c, err := coverplot.Load(path, n-1)
	if err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	format := strings.TrimPrefix(strings.ToLower(filepath.Ext(out)), ".")
	if err := coverplot.Draw(c, out, format); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	fmt.Fprintf(cmd.OutOrStdout(), "picture written to %s\n", out)
	return nil
}
