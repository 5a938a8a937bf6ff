package hypothesis

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/claim/named"
)

// LogConcaveGroundState decides whether the ground state u is log-concave
// on the closed domain, from the certificate's own ground-state block gs
// (results.ground_state, computed by package certs/certify from validated
// enclosures of u; nil when the certificate has none). It takes the
// block's verdict over: proven and disproven are certified there (see the
// block's reason), and undecided stays undecided with the block's reason.
// Without the block the verdict is undecided and the detail says how to
// ask for it.
//
// The witness of a failure is a point where log u is verified not to be
// concave: the left end of the witness interval on an interval (where
// (log u)″ > 0 on the whole interval), the midpoint m of the witness
// triple on a polygon (where log u(m) < (log u(x) + log u(y))/2); the
// whole witness is in results.ground_state.witness. A disproven block
// without a witness is a defect of its producer and panics.
func LogConcaveGroundState(gs *certs.GroundState) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.LogConcaveGroundState}
	if gs == nil {
		return undecidedAt(h, "the certificate has no results.ground_state: certify with --ground-state (Options.GroundState) to decide whether the ground state is log-concave")
	}
	switch gs.LogConcavity {
	case certs.Proven:
		return proven(h, "results.ground_state.log_concavity is proven: "+gs.Reason)
	case certs.Disproven:
		if gs.Witness == nil || len(gs.Witness.Points) == 0 {
			panic("hypothesis: a disproven log-concavity without a witness")
		}
		at := gs.Witness.Points[0]
		if gs.Witness.Kind == certs.WitnessMidpoint {
			at = gs.Witness.Points[len(gs.Witness.Points)-1]
		}
		return disproven(h, fmt.Sprintf("results.ground_state.log_concavity is disproven, witness of kind %s: %s", gs.Witness.Kind, gs.Reason), &certs.Witness{Point: append([]string(nil), at...)})
	}
	return undecidedAt(h, "results.ground_state.log_concavity is undecided: "+gs.Reason)
}
