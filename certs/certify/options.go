package certify

import (
	"context"
	"fmt"
	"time"

	"gapcert/certs"
)

// Digits is the number of significant digits of every bound in a
// certificate (lower ends rounded down, upper ends up).
const Digits = 17

// Options controls the refinement loop. The zero value asks for the
// problem's own target with the default budget.
type Options struct {
	// RelWidth is the target relative width (see TargetRule) as exact
	// decimal or rational text, such as "1e-8" or "1/1000"; "" means the
	// problem's target. It must lie in [MinRelWidth, 1).
	RelWidth  string
	TimeLimit time.Duration // budget for refinement; 0 = DefaultTimeLimit; negative is refused
	Tool      string        // tool name and version for the provenance block
	Now       func() time.Time
	Progress  func(format string, args ...any) // nil = quiet
	Memory    int64                            // memory budget in bytes; 0 = DefaultMemory
	// GroundState adds results.ground_state to the certificate: the
	// verdict on log-concavity of the ground state, the L2 error bound of
	// the approximate ground state and its values at the problem's
	// points, for the certified step (groundstate.go). It needs λ2, which
	// every problem has (the reader refuses fewer than two eigenvalues).
	GroundState bool

	recorded *certs.Certificate // set by Check: reference certificates of claims are taken from it, not computed
	ctx      context.Context    // set by Certify: reference certifications of claims run under it
}

// context returns the context of the run (Background outside Certify).
func (opt Options) context() context.Context {
	if opt.ctx == nil {
		return context.Background()
	}
	return opt.ctx
}

// BudgetError reports a computation refused before allocation because its
// estimated memory exceeds the budget.
type BudgetError struct {
	What         string
	Need, Budget int64 // bytes
}

func (e *BudgetError) Error() string {
	return fmt.Sprintf("%s would need about %s, more than the memory budget of %s (hint: ask for a coarser target, a smaller problem or a larger budget)",
		e.What, byteSize(e.Need), byteSize(e.Budget))
}

// byteSize prints a size in GiB from 1 GiB up, else in MiB, to one decimal.
func byteSize(b int64) string {
	if b >= 1<<30 {
		return fmt.Sprintf("%.1f GiB", float64(b)/(1<<30))
	}
	return fmt.Sprintf("%.1f MiB", float64(b)/(1<<20))
}

// DefaultMemory is the memory budget when Options.Memory is 0.
const DefaultMemory = 16 << 30
