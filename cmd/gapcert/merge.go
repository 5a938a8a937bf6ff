package main

import (
	"errors"
	"fmt"
	"path/filepath"

	"github.com/spf13/cobra"

	"gapcert/certs/cover"
	"gapcert/certs/sweep"
)

func newMergeCmd() *cobra.Command {
	var out string
	var quiet bool
	var memory memoryLimitFlag
	cmd := &cobra.Command{
		Use:   "merge DIR... --out DIR",
		Short: "Gather the shard directories of a sweep, verify them and write the merged summary",
		Long: `merge reads the sweep directories DIR... (the outputs of "gapcert sweep",
in any split into shards), checks that they hold the same family file,
that every certificate in them is the certificate of a point of that
family (its name, its recorded problem and its hash agree with the
expansion of the point) and verifies (it is recomputed as by "gapcert
check"), and that every point has exactly one certificate. It then makes
the --out directory a sweep directory that stands alone: it copies every
certificate and family.json into it and writes summary.json and
summary.csv there (never overwriting them; a directory holding other
certificates, or other files under those names, is refused), so that
"gapcert plot" and "gapcert report" work on it. It lists the points where
a claim fails or is undecided. Shards that shared one directory merge
into it (merge DIR --out DIR).

Cover directories ("gapcert cover") merge the same way: every cell
certificate is verified (with its corner certificates), and merge proves
that the cells tile the parameter box with no gap and no overlap (they
are the leaves of the bisection trees of the first split, compared
exactly); the summary records the coverage of each claim.

Foreign, tampered, duplicate and missing files or points are listed one per
line; nothing is written then.

Exit status: 0 if the directories form the family and every certificate
verifies, 1 on a failure, 2 if the family file is invalid, 3 if a
certificate does not verify or the directories do not form the family.`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := memory.parse(); err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			if err := checkMergeOutputs(out, args); err != nil {
				return err
			}
			if cover.IsCoverDir(args[0]) {
				return runCoverMerge(cmd, args, out, quiet, memory.bytes)
			}
			var progress func(string, ...any)
			if !quiet && isTerminal(cmd.ErrOrStderr()) {
				progress = func(format string, a ...any) { fmt.Fprintf(cmd.ErrOrStderr(), format, a...) }
			}
			s, err := sweep.Merge(args, out, sweep.MergeOptions{Progress: progress, Memory: memory.bytes})
			var me *sweep.MergeError
			var inv *sweep.InvalidError
			switch {
			case errors.As(err, &me):
				return &exitError{code: exitMismatch, err: err}
			case errors.As(err, &inv):
				return &exitError{code: exitInvalid, err: err}
			case err != nil:
				return &exitError{code: exitFailure, err: err}
			}
			w := cmd.OutOrStdout()
			fmt.Fprintf(w, "merged %d directories: %d points, every certificate verifies\n", len(args), s.TotalPoints)
			printSweepCounts(w, s)
			fmt.Fprintf(w, "summary written to %s\n", filepath.Join(out, sweep.SummaryFileName(s.Shard)+".json"))
			return nil
		},
	}
	cmd.Flags().StringVarP(&out, "out", "o", "", "directory for the merged summary (required; must not hold a summary)")
	cmd.Flags().BoolVarP(&quiet, "quiet", "q", false, "no progress lines on stderr")
	memory.register(cmd, verifyMemoryUsage)
	_ = cmd.MarkFlagRequired("out")
	return cmd
}

// checkMergeOutputs refuses, before any certificate is verified, an
// output directory that is one of the inputs, cannot be written, or
// already holds a merged summary.
func checkMergeOutputs(out string, dirs []string) error {
	if err := checkOutputDir(out, dirs...); err != nil {
		return err
	}
	base := filepath.Join(out, sweep.SummaryFileName(sweep.Shard{Index: 0, Count: 1}))
	return checkNewFiles(base+".json", base+".csv")
}
