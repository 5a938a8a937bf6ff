package certs

import (
	"gapcert/fem/claim"
	"gapcert/interval"
)

// MarginDigits is the number of significant digits of a printed claim
// margin.
const MarginDigits = 17

// EvaluateClaim encloses d = lhs − rhs of the claim c (package claim, whose
// grammar every gapcert claim is read with) over the box env and records
// the verdict for every point of env (claim.Claim.Decide): Holds, Fails or
// Undecided, with the margin d printed outward (NewBound). It is total: a
// side that cannot be enclosed (a name without a value, a function outside
// its domain) gives Undecided with Margin (−Infinity, Infinity) and the
// cause in Reason. Problems are checked before they are certified
// (claim.Claim.CheckScope), so a name without a value does not reach here
// from a valid problem.
func EvaluateClaim(c *claim.Claim, env map[string]interval.I) ClaimResult {
	res := ClaimResult{Text: c.Text, Verdict: Undecided}
	d, err := c.Margin(env)
	if err != nil {
		res.Margin = NewBound(interval.Entire(), MarginDigits)
		res.Reason = err.Error()
		return res
	}
	res.Margin = NewBound(d, MarginDigits)
	switch holds, fails := c.Decide(d); {
	case holds:
		res.Verdict = Holds
	case fails:
		res.Verdict = Fails
	}
	return res
}

// Quantity returns the recorded enclosure of the claim quantity name
// (package fem/claim): lambdak for a recorded eigenvalue, gap or D; false for
// any other name (the other quantities are the problem's, not results).
func (r Results) Quantity(name string) (Bound, bool) {
	switch name {
	case claim.Gap:
		return r.Gap, true
	case claim.Diameter:
		return r.Diameter, true
	}
	for _, e := range r.Eigenvalues {
		if claim.Eigenvalue(e.Index) == name {
			return e.Bound(), true
		}
	}
	return Bound{}, false
}
