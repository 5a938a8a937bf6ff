package problem

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// maxPieces bounds the subintervals potentialRange evaluates on an
// interval domain.
const maxPieces = 1 << 10

// potentialRange encloses the range of p.Potential over the closed domain:
// on an interval by evaluation over [a.Lo, b.Hi] ⊇ [a, b], bisected where
// the evaluation fails (overestimation) up to maxPieces pieces; on a
// polygon as the hull of formula.RangeTriangle over the triangles of
// p.Triangles, which cover the polygon. The hull of enclosures over sets
// covering the domain encloses the range over the domain. It returns a
// message instead if V may be undefined or unbounded on the domain.
func potentialRange(p *Problem) (rng interval.I, issue string) {
	if p.product != nil && p.Dim > 2 {
		return productPotentialRange(p)
	}
	if p.Dim == 1 {
		lo, hi := p.Interval[0].Val.Lo, p.Interval[1].Val.Hi
		budget := maxPieces
		return rangeOnInterval(p.Potential, lo, hi, &budget)
	}
	if p.Polyhedron != nil {
		return p.Polyhedron.potentialRange(p.Potential)
	}
	for k, t := range p.triangles {
		var v [3][2]interval.I
		for j := range 3 {
			q := p.Vertices[t[j]]
			v[j] = [2]interval.I{q[0].Val, q[1].Val}
		}
		r, err := p.Potential.RangeTriangle(v)
		if err != nil {
			return interval.I{}, fmt.Sprintf("the potential may be undefined on the triangle of vertices %d, %d, %d: %s", t[0], t[1], t[2], evalReason(err))
		}
		if msg := unbounded(r); msg != "" {
			return interval.I{}, msg + fmt.Sprintf(" on the triangle of vertices %d, %d, %d", t[0], t[1], t[2])
		}
		if k == 0 {
			rng = r
		} else {
			rng = rng.Hull(r)
		}
	}
	return rng, ""
}

func rangeOnInterval(e *formula.Expr, lo, hi float64, budget *int) (interval.I, string) {
	*budget--
	r, err := e.Eval(map[string]interval.I{"x": {Lo: lo, Hi: hi}})
	msg := ""
	if err != nil {
		msg = fmt.Sprintf("the potential may be undefined for x in [%g, %g]: %s", lo, hi, evalReason(err))
	} else {
		msg = unbounded(r)
		if msg != "" {
			msg += fmt.Sprintf(" for x in [%g, %g]", lo, hi)
		}
	}
	if msg == "" {
		return r, ""
	}
	var ue *formula.UnboundError
	if errors.As(err, &ue) || *budget < 2 {
		return interval.I{}, msg
	}
	m := lo/2 + hi/2 // a choice: any float strictly inside splits the cover
	if !(lo < m && m < hi) {
		return interval.I{}, msg
	}
	a, msgA := rangeOnInterval(e, lo, m, budget)
	if msgA != "" {
		return interval.I{}, msgA
	}
	b, msgB := rangeOnInterval(e, m, hi, budget)
	if msgB != "" {
		return interval.I{}, msgB
	}
	return a.Hull(b), ""
}

// unbounded names an infinite end of a range enclosure, or returns "".
func unbounded(r interval.I) string {
	switch {
	case math.IsInf(r.Hi, 1):
		return "the potential may be unbounded above"
	case math.IsInf(r.Lo, -1):
		return "the potential may be unbounded below"
	}
	return ""
}

// evalReason shortens an evaluation error for a message.
func evalReason(err error) string {
	var ee *formula.EvalError
	if errors.As(err, &ee) {
		var de *interval.DomainError
		if errors.As(ee.Err, &de) {
			return fmt.Sprintf("%s is not defined on all of %s", ee.Sub, de.Arg)
		}
		return fmt.Sprintf("in %s: %v", ee.Sub, ee.Err)
	}
	return strings.TrimPrefix(err.Error(), "formula: ")
}

// PotentialRange encloses {V(p) : p in the closed domain}; V is bounded.
func (p *Problem) PotentialRange() interval.I { return p.vRange }

// PotentialIsPolynomial reports whether V is a polynomial in x (and y),
// so that the element integrals of V are exact.
func (p *Problem) PotentialIsPolynomial() bool {
	_, ok := p.Potential.Polynomial()
	return ok
}

// PotentialText returns the canonical text of the potential as written,
// with parameter names unbound.
func (p *Problem) PotentialText() string { return p.potentialText }
