package hypothesis

import (
	"fmt"

	"gapcert/certs"
	"gapcert/fem/boundary"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// DirichletBoundary decides whether every side has the Dirichlet
// condition; the witness of a failure is the first other side.
func DirichletBoundary(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.DirichletBoundary}
	for i, bc := range p.Boundary {
		if bc.Kind != boundary.Dirichlet {
			return disproven(h, fmt.Sprintf("%s %d has a %s condition", piece(p), i, bc.Kind), &certs.Witness{Side: intPtr(i)})
		}
	}
	return proven(h, "every "+piece(p)+" has the Dirichlet condition")
}

// NeumannBoundary decides whether every side has the Neumann condition (a
// Robin side counts when its α is exactly 0).
func NeumannBoundary(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.NeumannBoundary}
	undecided := -1
	for i, bc := range p.Boundary {
		switch bc.Kind {
		case boundary.Neumann:
			continue
		case boundary.Dirichlet:
			return disproven(h, fmt.Sprintf("%s %d has the Dirichlet condition", piece(p), i), &certs.Witness{Side: intPtr(i)})
		}
		switch zero, ok := isZero(bc.Alpha); {
		case ok && zero:
			continue
		case ok:
			return disproven(h, fmt.Sprintf("%s %d has a Robin condition with α = %s ≠ 0", piece(p), i, bc.Alpha.Text), &certs.Witness{Side: intPtr(i)})
		}
		if undecided < 0 {
			undecided = i
		}
	}
	if undecided >= 0 {
		return undecidedAt(h, fmt.Sprintf("cannot decide whether the Robin coefficient %s of %s %d is 0", p.Boundary[undecided].Alpha.Text, piece(p), undecided))
	}
	return proven(h, "every "+piece(p)+" has the Neumann condition")
}

// RobinBoundary decides whether every side has a Robin condition with one
// and the same α (a Neumann side counts as α = 0); see CommonAlpha.
func RobinBoundary(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.RobinBoundary}
	for i, bc := range p.Boundary {
		if bc.Kind == boundary.Dirichlet {
			return disproven(h, fmt.Sprintf("%s %d has the Dirichlet condition", piece(p), i), &certs.Witness{Side: intPtr(i)})
		}
	}
	a0 := p.Boundary[0].Alpha
	for i, bc := range p.Boundary[1:] {
		switch same, ok := problem.Equal(a0, bc.Alpha); {
		case ok && !same:
			return disproven(h, fmt.Sprintf("%[1]s %[2]d has α = %[3]s, %[1]s 0 has α = %[4]s", piece(p), i+1, bc.Alpha.Text, a0.Text), &certs.Witness{Side: intPtr(i + 1)})
		case !ok:
			return undecidedAt(h, fmt.Sprintf("cannot decide whether α = %[1]s of %[2]s %[3]d equals α = %[4]s of %[2]s 0", bc.Alpha.Text, piece(p), i+1, a0.Text))
		}
	}
	return proven(h, fmt.Sprintf("every %s has the Robin condition with α = %s", piece(p), a0.Text))
}

// PositiveRobinAlpha decides whether every side has a Robin condition with
// one and the same α > 0: RobinBoundary (whose witness it keeps) and α ≠ 0
// decided exactly (the reader refuses α < 0). All Neumann sides, or
// Robin sides with α = 0, disprove it with side 0 as witness.
func PositiveRobinAlpha(p *problem.Problem) certs.Hypothesis {
	h := certs.Hypothesis{Name: named.PositiveRobinAlpha}
	switch r := RobinBoundary(p); r.Verdict {
	case certs.Disproven:
		return disproven(h, r.Detail, r.Witness)
	case certs.Undecided:
		return undecidedAt(h, r.Detail)
	}
	a := p.Boundary[0].Alpha
	if p.Boundary[0].Kind == boundary.Neumann {
		return disproven(h, "every "+piece(p)+" has the Neumann condition (α = 0)", &certs.Witness{Side: intPtr(0)})
	}
	switch zero, ok := isZero(a); {
	case !ok:
		return undecidedAt(h, fmt.Sprintf("cannot decide whether the common Robin coefficient %s is 0", a.Text))
	case zero:
		return disproven(h, "every "+piece(p)+" has the Robin condition with α = 0 (Neumann)", &certs.Witness{Side: intPtr(0)})
	}
	return proven(h, fmt.Sprintf("every %s has the Robin condition with α = %s > 0", piece(p), a.Text))
}

// CommonAlpha returns the Robin coefficient shared by every side (0 for
// Neumann sides) when RobinBoundary is proven.
func CommonAlpha(p *problem.Problem) (problem.Number, bool) {
	if RobinBoundary(p).Verdict != certs.Proven {
		return problem.Number{}, false
	}
	return p.Boundary[0].Alpha, true
}

// isZero decides whether the exact number n is 0.
func isZero(n problem.Number) (zero, ok bool) {
	if n.Rat != nil {
		return n.Rat.Sign() == 0, true
	}
	switch {
	case n.Val.Lo == 0 && n.Val.Hi == 0:
		return true, true
	case n.Val.Lo > 0 || n.Val.Hi < 0:
		return false, true
	}
	return false, false
}

// piece names what carries one boundary condition: a side of an interval
// or a polygon, a face of a domain of three or four coordinates.
func piece(p *problem.Problem) string {
	if p.Dim > 2 {
		return "face"
	}
	return "side"
}

func intPtr(i int) *int { return &i }

func proven(h certs.Hypothesis, detail string) certs.Hypothesis {
	h.Verdict, h.Detail = certs.Proven, detail
	return h
}

func disproven(h certs.Hypothesis, detail string, w *certs.Witness) certs.Hypothesis {
	h.Verdict, h.Detail, h.Witness = certs.Disproven, detail, w
	return h
}

func undecidedAt(h certs.Hypothesis, detail string) certs.Hypothesis {
	h.Verdict, h.Detail = certs.Undecided, detail
	return h
}
