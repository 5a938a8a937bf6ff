package boundary

import (
	"strconv"

	"gapcert/interval"
)

// Kind is the kind of condition on one side.
type Kind int

const (
	Dirichlet Kind = iota // u = 0
	Neumann               // ∂u/∂n = 0
	Robin                 // ∂u/∂n + αu = 0, α ≥ 0
)

// String returns the kind's name as problem files write it.
func (k Kind) String() string {
	switch k {
	case Dirichlet:
		return "dirichlet"
	case Neumann:
		return "neumann"
	case Robin:
		return "robin"
	}
	return "Kind(" + strconv.Itoa(int(k)) + ")"
}

// Condition is the condition on one side. Alpha encloses the exact Robin
// coefficient α ≥ 0 for Kind Robin and is the zero interval otherwise.
type Condition struct {
	Kind  Kind
	Alpha interval.I
}

// Check panics unless c is a valid condition: a known kind, a Robin
// coefficient that is a bounded enclosure with lower end ≥ 0, and
// Alpha = [0, 0] for the other kinds. The element packages call it on
// every condition they are given.
func (c Condition) Check() {
	switch c.Kind {
	case Dirichlet, Neumann:
		if c.Alpha != (interval.I{}) {
			panic("boundary: " + c.Kind.String() + " condition with a Robin coefficient")
		}
	case Robin:
		if !(c.Alpha.Lo >= 0 && c.Alpha.IsBounded()) {
			panic("boundary: Robin coefficient must be a bounded enclosure of α ≥ 0")
		}
	default:
		panic("boundary: unknown kind " + c.Kind.String())
	}
}

// Essential reports whether the condition is imposed on the space (u = 0
// on the side, Dirichlet) rather than through the forms.
func (c Condition) Essential() bool { return c.Kind == Dirichlet }

// WeakAlpha returns the enclosure of the coefficient α of the side's term
// α ∫_side u v in the form a (package doc, The weak form): Alpha for a
// Robin side and exactly [0, 0] for a Neumann side. It panics for a
// Dirichlet side, which has no such term.
func (c Condition) WeakAlpha() interval.I {
	switch c.Kind {
	case Robin:
		return c.Alpha
	case Neumann:
		return interval.I{}
	}
	panic("boundary: a " + c.Kind.String() + " side has no term in the form")
}

// HasTerm reports whether the side may add a nonzero term to the form: a
// natural side whose α is not exactly 0.
func (c Condition) HasTerm() bool { return !c.Essential() && c.WeakAlpha().Hi != 0 }

// AlphaPositive reports whether the side is natural with α verified > 0.
func (c Condition) AlphaPositive() bool { return !c.Essential() && c.WeakAlpha().Lo > 0 }

// FluxFree reports whether the normal component of a Lehmann–Goerisch
// flux may be nonzero on the side (package doc, The weak form): on
// Dirichlet sides and on sides with α verified > 0.
func (c Condition) FluxFree() bool { return c.Essential() || c.AlphaPositive() }
