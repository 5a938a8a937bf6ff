package main

import (
	"context"
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"
)

// Version is the tool's version.
const Version = "0.1.0-dev"

// Exit codes of the gapcert command.
const (
	exitOK       = 0 // success
	exitFailure  = 1 // bad usage, unreadable file or any other failure
	exitInvalid  = 2 // the problem file is invalid
	exitMismatch = 3 // a certificate does not verify
	// exitTargetMissed: with --strict, a target width was not reached.
	exitTargetMissed = 4
	// exitInterrupted: interrupted (SIGINT), as shells report 128 + 2.
	exitInterrupted = 130
)

// exitError is an error that ends the process with a given code. Its
// message (if err is not nil) has been formatted for the user.
type exitError struct {
	code int
	err  error
}

func (e *exitError) Error() string {
	if e.err == nil {
		return fmt.Sprintf("exit status %d", e.code)
	}
	return e.err.Error()
}

func (e *exitError) Unwrap() error { return e.err }

// newRootCmd returns the gapcert command with all subcommands, writing to
// stdout and stderr.
func newRootCmd(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:   "gapcert",
		Short: "Rigorous enclosures of Schrödinger eigenvalues and spectral gaps",
		Long: `gapcert encloses the lowest eigenvalues λ1 ≤ λ2 ≤ … of −Δu + V u = λu on an
interval or a polygon, with Dirichlet, Neumann or Robin conditions on each
side, and the gap λ2 − λ1. Every bound it reports comes from outward
rounded interval arithmetic and a theorem whose hypotheses it checks; the
results are written as a JSON certificate that can be checked again.

A problem is described by a JSON problem file; "gapcert validate FILE"
reads one and shows how it was understood.

Output paths are given with -o, --out in every command. They are checked
before anything is computed: an output that is one of the inputs or
cannot be written is refused (exit status 1) and no file is touched.
Files are written atomically (temporary file, flush, rename): a failed
write leaves the earlier file intact.

Exit status: 0 on success, 1 on bad usage, an unreadable file, an output
that cannot be written or is an input, or another failure, 2 if a problem
file is invalid, 3 if a certificate does not verify, 4 with --strict when
a target width was not reached, 130 when interrupted.`,
		SilenceErrors: true,
		SilenceUsage:  true,
	}
	root.CompletionOptions.DisableDefaultCmd = true
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.AddCommand(newValidateCmd(), newCertifyCmd(), newCheckCmd(), newDemoCmd(), newVersionCmd(), newSweepCmd(), newMergeCmd(), newReportCmd(), newPlotCmd(), newCoverCmd())
	return root
}

// run executes the gapcert command line args and returns the exit code.
func run(args []string, stdout, stderr io.Writer) int {
	return runContext(context.Background(), args, stdout, stderr)
}

// runContext is run under ctx: cancelling it acts as an interrupt.
func runContext(ctx context.Context, args []string, stdout, stderr io.Writer) int {
	root := newRootCmd(stdout, stderr)
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if err == nil {
		return exitOK
	}
	var ee *exitError
	if errors.As(err, &ee) {
		if ee.err != nil {
			fmt.Fprintln(stderr, ee.err)
		}
		return ee.code
	}
	fmt.Fprintf(stderr, "gapcert: %v\nRun 'gapcert help' for usage.\n", err)
	return exitFailure
}
