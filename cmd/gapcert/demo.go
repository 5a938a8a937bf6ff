package main

import (
	_ "embed"

	"github.com/spf13/cobra"

	"gapcert/fem/problem"
)

// demoProblem is the built-in problem of "gapcert demo": a symmetric double
// well V = 6(x² − 1)² on (−5/2, 5/2), whose two lowest states are split by
// tunnelling. Its gap is certified below 3π²/D², so the claim of the
// convex-potential gap bound comes out "fails": the theorem needs a convex
// V, and this V is not convex.
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
			if err := checkCertifyOutputs(f, f.out); err != nil {
				return err
			}
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
