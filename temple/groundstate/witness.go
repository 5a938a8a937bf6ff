package groundstate

import (
	"gapcert/interval"
	"gapcert/interval/formula"
)

// MidpointResult is the outcome of CertifyMidpoint for points x, y and
// their midpoint m.
type MidpointResult struct {
	// X, Y, M enclose u(x), u(y), u(m).
	X, Y, M PointEnclosure
	// Margin is a lower bound of u(x)·u(y) − u(m)² (rounded down): the
	// lower end of X.U·Y.U minus the upper end of M.U². It may be negative.
	Margin float64
	// Certified reports u(x) > 0, u(y) > 0 and Margin > 0: then
	// u(m)² < u(x)·u(y) for the exact u, a certified failure of
	// log-concavity (package doc, "A witness of failure").
	Certified bool
}

// ExactMidpoint returns (p + q)/2 and whether it is exactly a pair of
// float64 values (else the returned point is not the midpoint and must not
// be used as one).
func ExactMidpoint(p, q [2]float64) ([2]float64, bool) {
	var m [2]float64
	for i := range m {
		h := interval.Point(p[i]).Add(interval.Point(q[i])).MulF(0.5)
		if !h.IsPoint() {
			return m, false
		}
		m[i] = h.Lo
	}
	return m, true
}

// CertifyMidpoint encloses u(x), u(y) and u(m), m = (x + y)/2, with
// EnclosePoint on the discs x, y and m (each with its own radius and
// polynomial), all with the same lambda ∋ λ1 and the same errL2 ≥
// ‖u − ũ‖_{L²(Ω)}, which bounds ‖u − ũ‖_{L²(B)} on each of the three discs:
// the three values are of one and the same u = P₁ũ. It decides whether
// u(m)² < u(x)·u(y) strictly for the enclosures, with u(x), u(y) > 0.
//
// The hypotheses are those of EnclosePoint for each disc; the centre of m
// must be exactly the midpoint of the centres of x and y (ExactMidpoint),
// else CertifyMidpoint panics. Errors are those of EnclosePoint. Two more
// are the caller's and are needed for a certified triple to say that the
// ground state is not log-concave (package doc, "A witness of failure"):
// λ1 is simple and P₁ is the projection on its eigenspace, so errL2 must
// come from (E1) with an enclosure of λ2 (EigenvectorError refuses when
// λ1 is not separated from it), never from the cluster form with
// λ_{m+1}, whose P_mũ may change sign; and Ω is convex (for a non-convex
// Ω the triple shows that u extended by 0 is not log-concave).
func CertifyMidpoint(v *formula.Expr, lambda interval.I, errL2 float64, x, y, m Disc, opt DiscOptions) (MidpointResult, error) {
	mid, ok := ExactMidpoint(x.Centre, y.Centre)
	if !ok || mid != m.Centre {
		panic("groundstate: the middle disc is not centred at the exact midpoint of the other two")
	}
	var res MidpointResult
	var err error
	if res.X, err = EnclosePoint(v, lambda, errL2, x, opt); err != nil {
		return MidpointResult{}, err
	}
	if res.Y, err = EnclosePoint(v, lambda, errL2, y, opt); err != nil {
		return MidpointResult{}, err
	}
	if res.M, err = EnclosePoint(v, lambda, errL2, m, opt); err != nil {
		return MidpointResult{}, err
	}
	prod := res.X.U.Mul(res.Y.U)
	sq := res.M.U.Sqr()
	res.Margin = interval.SubDown(prod.Lo, sq.Hi)
	res.Certified = res.X.U.Positive() && res.Y.U.Positive() && res.Margin > 0
	return res, nil
}
