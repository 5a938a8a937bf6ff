package main

import (
	"bytes"
	"fmt"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"gapcert/certs/certify"
	"gapcert/certs/outfile"
	"gapcert/certs/report"
)

func newReportCmd() *cobra.Command {
	var (
		format, notation, out string
		widthDigits           int
		noCheck               bool
		memory                memoryLimitFlag
	)
	cmd := &cobra.Command{
		Use:   "report CERT.json|DIR",
		Short: "Write a LaTeX or Markdown table of certified enclosures",
		Long: `report writes a table with one row per certificate: the problem name, λ1,
λ2, the gap λ2 − λ1, D²·gap/π² and the verdict of each claim. Given a
directory it reads every *.json certificate in it, sorted by file name;
other JSON files there (problem files, sweep summaries) are left out, each
named on stderr.

Enclosures are written in the compact notation of papers, the common
leading digits with the differing trailing digits of the lower end as a
subscript and of the upper end as a superscript (9.86960440_{1}^{3} is
[9.869604401, 9.869604403]), or as [lower, upper] with --notation bracket.
The printed lower end is at most and the printed upper end at least the
certified bound (rounded outward in exact decimal arithmetic). Every
certified eigenvalue has a column; claims have a column each, headed by
their text, when every certificate has the same claims. LaTeX output is a
longtable (\usepackage{longtable}), which breaks across pages.

A sweep directory (one with the family.json of "gapcert sweep", such as a
shard directory or the output of "gapcert merge") gives one row per point,
in point order, with the point's index and parameter values as columns;
every certificate there must be of a point of the family.

The caption names the tool versions and one digest of all certificate
files: the SHA-256 of their list, the lines "SHA-256  file name" sorted
(what "sha256sum FILES | sort" prints). The list is written beside the
table (-o table.tex writes table.sha256), or after the table on stdout.

Every certificate is re-verified by recomputation first (as "gapcert
check" does) unless --no-check is given; the caption says which.

Exit status: 0 on success, 1 on bad usage or a file that cannot be read or
is not a certificate, 2 if re-verifying a certificate would exceed the
memory budget (--memory-limit, default 16GiB), 3 if a certificate does
not verify.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := memory.parse(); err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			opt := report.Options{Format: format, Notation: notation, WidthDigits: widthDigits, Tool: "gapcert " + Version, Checked: !noCheck}
			if widthDigits < 1 {
				return &exitError{code: exitFailure, err: fmt.Errorf("--width-digits %d: want at least 1", widthDigits)}
			}
			if err := opt.Validate(); err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			if out != "" {
				if err := checkOutputFile(out, args[0]); err != nil {
					return err
				}
			}
			src, err := report.Read(args[0])
			for _, s := range src.Skipped {
				fmt.Fprintf(cmd.ErrOrStderr(), "%s: left out: %s\n", s.Path, s.Reason)
			}
			if err != nil {
				return readFailure(err)
			}
			entries := src.Entries
			if out != "" {
				opt.HashListFile = hashListFile(out)
				inputs := readPaths(entries, src.Skipped)
				for _, o := range []string{out, opt.HashListFile} {
					if err := checkOutputFile(o, inputs...); err != nil {
						return err
					}
				}
			}
			opt.Family, opt.Parameters, opt.FamilyPoints = src.Family, src.Parameters, src.FamilyPoints
			if n := src.FamilyPoints; n > len(entries) {
				fmt.Fprintf(cmd.ErrOrStderr(), "%s: %d of the family's %d points have a certificate here; the table has those (merge the shards for all)\n", args[0], len(entries), n)
			}
			if !noCheck {
				for _, e := range entries {
					if err := checkEntry(e, memory.bytes); err != nil {
						return err
					}
				}
			}
			var buf bytes.Buffer
			if err := report.Write(&buf, entries, opt); err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			if out == "" {
				_, err = cmd.OutOrStdout().Write(buf.Bytes())
			} else {
				err = outfile.Write(out, buf.Bytes())
				if err == nil {
					err = outfile.Write(opt.HashListFile, report.HashList(entries))
				}
			}
			if err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			return nil
		},
	}
	cmd.Flags().StringVar(&format, "format", report.LaTeX, "output format: "+strings.Join(report.Formats(), " or "))
	cmd.Flags().StringVar(&notation, "notation", report.Compact, "enclosure notation: "+strings.Join(report.Notations(), " or "))
	cmd.Flags().IntVar(&widthDigits, "width-digits", report.DefaultWidthDigits, "significant digits of each enclosure's width kept when shortening")
	cmd.Flags().BoolVar(&noCheck, "no-check", false, "do not re-verify the certificates (the caption says so)")
	memory.register(cmd, verifyMemoryUsage)
	cmd.Flags().StringVarP(&out, "out", "o", "", "write the table to this file instead of stdout")
	return cmd
}

// hashListFile is the file beside the table out that lists the SHA-256 of
// the certificate files: out with its extension replaced by ".sha256"
// (table.tex → table.sha256), or with ".sha256" appended when it has none
// or already ends so.
func hashListFile(out string) string {
	ext := filepath.Ext(out)
	if ext == "" || ext == ".sha256" {
		return out + ".sha256"
	}
	return strings.TrimSuffix(out, ext) + ".sha256"
}

// checkEntry re-verifies one certificate of a report, with the exit codes
// of the check command.
func checkEntry(e report.Entry, memory int64) error {
	return checkExit(e.Path, certify.CheckWithin(e.Data, memory))
}

// readPaths lists every file report.Read opened: the certificates and the
// JSON files it left out.
func readPaths(entries []report.Entry, skipped []report.Skipped) []string {
	var paths []string
	for _, e := range entries {
		paths = append(paths, e.Path)
	}
	for _, s := range skipped {
		paths = append(paths, s.Path)
	}
	return paths
}
