package main

import (
	_ "embed"

	"github.com/spf13/cobra"

	"gapcert/fem/problem"
)

// demoProblem is the built-in problem of "gapcert demo": a symmetric double
// well, whose two lowest states are split by tunnelling, so the gap is
// small compared with 3π²/D² and the convex-potential gap bound (which does
// not apply: V is not convex) fails.
//
//go:embed demo_problem.json
var demoProblem []byte

func newDemoCmd() *cobra.Command {
	var f certifyFlags
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Certify a built-in example problem (no file needed)",
		Long: `demo certifies a built-in problem, a double-well potential on an interval,
prints the table and writes the certificate (default demo.cert.json).
Run "gapcert check demo.cert.json" afterwards to re-verify it.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			p, err := problem.Parse(demoProblem)
			if err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			return runCertify(cmd, p, f, f.out)
		},
	}
	f.register(cmd, "demo.cert.json")
	return cmd
}
