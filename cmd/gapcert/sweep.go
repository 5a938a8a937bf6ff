package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/outfile"
	"gapcert/certs/sweep"
)

type sweepFlags struct {
	out       string
	shard     string
	relWidth  string
	timeLimit time.Duration
	refine    bool
	setAside  bool
	jobs      int
	quiet     bool
	progress  bool
	strict    bool
	memory    memoryLimitFlag
}

func newSweepCmd() *cobra.Command {
	var f sweepFlags
	cmd := &cobra.Command{
		Use:   "sweep FAMILY --out DIR",
		Short: "Certify every point of a parameter family into a directory (resumable, in shards)",
		Long: `sweep reads the family file FAMILY (a problem template with named
parameters and their ranges), expands it into its grid of points and
certifies each point of the shard into DIR: one certificate per point
(pNNNN-HASH.cert.json: the point's index and the first 12 hex digits of
its problem hash), a copy of the family file (family.json), and a summary
(summary.json and summary.csv, or summary-shard-i-of-n.* with --shard).

Points are numbered from 0 with the first parameter varying slowest;
--shard i/n (0 ≤ i < n) takes the points k with k mod n = i, so the
shards 0/n … (n−1)/n are disjoint and cover the family. Run it again to
resume: a certificate already in DIR that verifies and holds the point's
problem is kept; one that does not verify is reported and never
overwritten (--set-aside-invalid renames it to NAME.rejected and
recomputes the point). --refine-undecided recomputes points whose claims
are undecided with a width target 10 times below the widest width reached,
at most 3 times, keeping a new certificate only if it verifies.
--jobs N certifies N points at a time. "gapcert merge" gathers the shards.
A family with "ground_state": true certifies every point's ground state
(as certify --ground-state); the summaries then list each point's
log-concavity verdict, witness kind and margin.

Exit status: 0 if every point has a valid certificate, 1 on a failure
(including a point that could not be certified), 2 if the family file or
--shard is invalid (nothing is written), 3 if a certificate in DIR does
not verify, 4 with --strict when a point's certificate did not reach its
target width (the points are listed).`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error { return runSweep(cmd, args[0], f) },
	}
	cmd.Flags().StringVarP(&f.out, "out", "o", "", "directory for the certificates and summaries (required)")
	cmd.Flags().StringVar(&f.shard, "shard", "", "run only shard i/n (0 ≤ i < n): the points k with k mod n = i")
	cmd.Flags().StringVar(&f.relWidth, "rel-width", "", "target relative width of every point (default: the family's, else each problem's)")
	cmd.Flags().DurationVar(&f.timeLimit, "time-limit", 0, "refinement budget per point (default: the family's, else 60s)")
	cmd.Flags().BoolVar(&f.refine, "refine-undecided", false, "recompute points with an undecided claim with tighter width targets")
	cmd.Flags().BoolVar(&f.setAside, "set-aside-invalid", false, "rename a certificate in DIR that does not verify to NAME.rejected and recompute its point")
	cmd.Flags().IntVarP(&f.jobs, "jobs", "j", 1, "points certified at a time")
	cmd.Flags().BoolVarP(&f.quiet, "quiet", "q", false, "no progress lines on stderr")
	cmd.Flags().BoolVar(&f.progress, "progress", false, "progress lines on stderr also when it is not a terminal (--quiet wins)")
	cmd.Flags().BoolVar(&f.strict, "strict", false, "exit with status 4 when a point's certificate misses its target width")
	f.memory.register(cmd, "memory budget of each point's certification (see certify --memory-limit; default 16GiB)")
	_ = cmd.MarkFlagRequired("out")
	return cmd
}

func runSweep(cmd *cobra.Command, file string, f sweepFlags) error {
	fam, err := loadFamily(file)
	if err != nil {
		return err
	}
	opt := sweep.RunOptions{
		FamilyName: filepath.Base(file), RelWidth: f.relWidth, TimeLimit: f.timeLimit,
		RefineUndecided: f.refine, SetAsideInvalid: f.setAside, Jobs: f.jobs, Tool: "gapcert " + Version,
	}
	if f.jobs < 1 {
		return &exitError{code: exitFailure, err: fmt.Errorf("--jobs %d: want at least 1", f.jobs)}
	}
	if f.timeLimit < 0 {
		return &exitError{code: exitFailure, err: fmt.Errorf("--time-limit %v: want a positive duration", f.timeLimit)}
	}
	if err := f.memory.parse(); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	opt.Memory = f.memory.bytes
	if f.relWidth != "" {
		if _, err := certify.ParseTarget(f.relWidth); err != nil {
			return &exitError{code: exitFailure, err: fmt.Errorf("--rel-width: %v", err)}
		}
	} else if fam.RelWidth != "" {
		if _, err := certify.ParseTarget(fam.RelWidth); err != nil {
			return &exitError{code: exitInvalid, err: fmt.Errorf("%s: relative width: %v", file, err)}
		}
	}
	if f.shard != "" {
		if opt.Shard, err = sweep.ParseShard(f.shard); err != nil {
			return &exitError{code: exitInvalid, err: err}
		}
	}
	if err := checkSweepOutputs(f.out, file, opt.Shard); err != nil {
		return err
	}
	if progressWanted(cmd, f.quiet, f.progress) {
		opt.Progress = func(format string, args ...any) { fmt.Fprintf(cmd.ErrOrStderr(), format, args...) }
	}
	s, err := sweep.Run(fam, f.out, opt)
	var inv *sweep.InvalidError
	switch {
	case errors.As(err, &inv):
		return &exitError{code: exitInvalid, err: err}
	case err != nil:
		return &exitError{code: exitFailure, err: err}
	}
	w := cmd.OutOrStdout()
	fmt.Fprintf(w, "family %s: %d points, shard %s: %d points\n", file, s.TotalPoints, s.Shard, len(s.Points))
	printSweepCounts(w, s)
	fmt.Fprintf(w, "summary written to %s\n", filepath.Join(f.out, sweep.SummaryFileName(s.Shard)+".json"))
	rejected, failed := 0, 0
	for _, p := range s.Points {
		switch p.Status {
		case sweep.StatusRejected:
			rejected++
		case sweep.StatusError:
			failed++
		}
		if p.Error != "" {
			fmt.Fprintf(cmd.ErrOrStderr(), "point %d: %s: %s\n", p.Index, p.Status, p.Error)
		}
	}
	switch {
	case rejected > 0:
		return &exitError{code: exitMismatch, err: fmt.Errorf("%d certificates in %s do not verify and were left in place", rejected, f.out)}
	case failed > 0:
		return &exitError{code: exitFailure, err: fmt.Errorf("%d points could not be certified", failed)}
	}
	if f.strict {
		if missed := missedTargets(f.out, s); len(missed) > 0 {
			return &exitError{code: exitTargetMissed, err: fmt.Errorf("--strict: %d points did not reach their target width: %s", len(missed), strings.Join(missed, "; "))}
		}
	}
	return nil
}

// missedTargets lists the points of s whose certificate in dir does not
// record "target reached" (as "point K: REASON").
func missedTargets(dir string, s *sweep.Summary) []string {
	var out []string
	for _, p := range s.Points {
		reason := "no certificate"
		if data, err := os.ReadFile(filepath.Join(dir, p.File)); p.File != "" && err == nil {
			if c, err := certs.Unmarshal(data); err == nil {
				if ref, err := certify.RefinementOf(c); err == nil && ref != nil {
					reason = ref.StopReason
				} else {
					reason = "no stop reason recorded"
				}
			}
		}
		if reason != certify.StopTarget {
			out = append(out, fmt.Sprintf("point %d: %s", p.Index, reason))
		}
	}
	return out
}

// loadFamily reads and validates a family file; defects are listed as
// "FILE: path: message (hint: …)" with exit status 2.
func loadFamily(file string) (*sweep.Family, error) {
	data, err := os.ReadFile(file)
	if err != nil {
		return nil, readFailure(err)
	}
	fam, err := sweep.ParseFamily(data)
	var inv *sweep.InvalidError
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

// printSweepCounts prints the number of points by status and verdict and
// lists the points where a claim fails or is undecided.
func printSweepCounts(w io.Writer, s *sweep.Summary) {
	status, verdict := map[string]int{}, map[string]int{}
	for _, p := range s.Points {
		status[p.Status]++
		if p.Verdict != "" {
			verdict[p.Verdict]++
		}
	}
	var parts []string
	for _, st := range []string{sweep.StatusComputed, sweep.StatusReused, sweep.StatusRefined, sweep.StatusVerified, sweep.StatusRejected, sweep.StatusError} {
		if status[st] > 0 {
			parts = append(parts, fmt.Sprintf("%d %s", status[st], st))
		}
	}
	fmt.Fprintf(w, "points: %s\n", strings.Join(parts, ", "))
	if len(verdict) > 0 {
		fmt.Fprintf(w, "claims: %d all hold, %d undecided, %d fail\n", verdict[certs.Holds], verdict[certs.Undecided], verdict[certs.Fails])
	}
	if s.GroundState {
		shape := map[string]int{}
		for _, p := range s.Points {
			if p.GroundState != nil {
				shape[p.GroundState.LogConcavity]++
			}
		}
		fmt.Fprintf(w, "ground state log-concave: %d proven, %d disproven (with a witness), %d undecided\n", shape[certs.Proven], shape[certs.Disproven], shape[certs.Undecided])
	}
	for _, p := range s.Points {
		for _, c := range p.Claims {
			if c.Verdict == certs.Fails || c.Verdict == certs.Undecided {
				fmt.Fprintf(w, "  point %d (%s): %s %s (lhs − rhs ∈ [%s, %s])\n", p.Index, paramList(s.Parameters, p.Params), c.Verdict, c.Text, c.Margin.Lower, c.Margin.Upper)
			}
		}
	}
}

func paramList(names []string, vals map[string]string) string {
	parts := make([]string, len(names))
	for i, n := range names {
		parts[i] = n + "=" + vals[n]
	}
	return strings.Join(parts, ", ")
}

// checkSweepOutputs refuses, before any point is computed, an output
// directory that cannot be written or created, and a family file that
// the run would replace by the shard's summary.
func checkSweepOutputs(dir, family string, shard sweep.Shard) error {
	if err := checkOutputDir(dir, family); err != nil {
		return err
	}
	if shard.Count == 0 {
		shard = sweep.Shard{Index: 0, Count: 1}
	}
	base := filepath.Join(dir, sweep.SummaryFileName(shard))
	for _, p := range []string{base + ".json", base + ".csv"} {
		if outfile.Same(p, family) {
			return &exitError{code: exitFailure, err: &outfile.Error{Path: family, Msg: "is where the sweep writes its summary", Hint: "keep the family file outside the output directory, or under another name"}}
		}
	}
	return nil
}
