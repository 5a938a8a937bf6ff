package main

import (
	"errors"
	"fmt"
	"os"

	"github.com/spf13/cobra"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/cover"
)

func newCheckCmd() *cobra.Command {
	var memory memoryLimitFlag
	cmd := &cobra.Command{
		Use:   "check CERT.json",
		Short: "Re-verify a certificate by recomputing it",
		Long: `check reads a certificate, verifies that its format version is known and
that the recorded problem hashes to problem_sha256, recomputes every bound
from the recorded problem and method with the same deterministic code, and
demands that the recomputation reproduce every recorded bound, stage bound
and claim verdict digit for digit.

A cell certificate of "gapcert cover" is re-verified with its corner
certificates (files beside it): each corner is recomputed as above, the
rules' order and the corners are recomputed from the family file it
holds, and the cell's enclosures and verdicts are recomputed from them.

A certificate made with a larger --memory-limit than the default 16GiB
needs the same --memory-limit here.

Exit status: 0 if the certificate verifies, 1 if it cannot be read or
--memory-limit is malformed, 2 if recomputing it would exceed the memory
budget (refused before allocating),
3 if it does not verify (each difference is listed) or is not read
strictly as a certificate: a key given twice, a key not spelled exactly as
the format defines it (case variants included) or an unknown key, at any
depth, with the JSON path of the defect.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := memory.parse(); err != nil {
				return &exitError{code: exitFailure, err: err}
			}
			data, err := os.ReadFile(args[0])
			if err != nil {
				return readFailure(err)
			}
			if cover.IsCell(data) {
				return checkCoverCell(cmd, args[0], data, memory.bytes)
			}
			if err := checkExit(args[0], certify.CheckWithin(data, memory.bytes)); err != nil {
				return err
			}
			fmt.Fprintf(cmd.OutOrStdout(), "%s: certificate verifies (recomputed bounds, hash and claims agree)\n", args[0])
			return nil
		},
	}
	memory.register(cmd, verifyMemoryUsage)
	return cmd
}

// checkExit returns the outcome of certify.Check on the certificate file
// name with the exit status of the check command: 2 for a recomputation
// beyond the memory budget, 3 for a certificate that does not verify or is
// not strictly a certificate (a *certs.FormatError), 1 otherwise.
func checkExit(name string, err error) error {
	var mm *certify.MismatchError
	var bad *certs.FormatError
	var budget *certify.BudgetError
	switch {
	case err == nil:
		return nil
	case errors.As(err, &budget):
		return &exitError{code: exitInvalid, err: fmt.Errorf("%s: %v", name, err)}
	case errors.As(err, &mm), errors.As(err, &bad):
		return &exitError{code: exitMismatch, err: fmt.Errorf("%s: %v", name, err)}
	}
	return &exitError{code: exitFailure, err: fmt.Errorf("%s: %v", name, err)}
}
