package boundary

import (
	"math"
	"testing"

	"gapcert/interval"
)

func TestNeumannActsAsAlphaZero(t *testing.T) {
	neumann := Condition{Kind: Neumann}
	robin0 := Condition{Kind: Robin, Alpha: interval.I{}}
	for _, c := range []Condition{neumann, robin0} {
		c.Check()
		if c.Essential() || c.WeakAlpha() != (interval.I{}) || c.HasTerm() || c.AlphaPositive() || c.FluxFree() {
			t.Errorf("%v does not act as a natural side with α = 0", c)
		}
	}
}

func TestConditionPredicates(t *testing.T) {
	for _, c := range []struct {
		c                                   Condition
		essential, term, positive, fluxFree bool
	}{
		{Condition{Kind: Dirichlet}, true, false, false, true},
		{Condition{Kind: Neumann}, false, false, false, false},
		{Condition{Kind: Robin, Alpha: interval.Point(2)}, false, true, true, true},
		{Condition{Kind: Robin, Alpha: interval.I{Lo: 0, Hi: 1e-300}}, false, true, false, false}, // α not verified > 0
	} {
		c.c.Check()
		if c.c.Essential() != c.essential || c.c.HasTerm() != c.term || c.c.AlphaPositive() != c.positive || c.c.FluxFree() != c.fluxFree {
			t.Errorf("%+v: essential %v term %v positive %v flux free %v", c.c, c.c.Essential(), c.c.HasTerm(), c.c.AlphaPositive(), c.c.FluxFree())
		}
	}
}

func TestConditionMisusePanics(t *testing.T) {
	for name, f := range map[string]func(){
		"negative α":       func() { Condition{Kind: Robin, Alpha: interval.I{Lo: -1, Hi: 1}}.Check() },
		"unbounded α":      func() { Condition{Kind: Robin, Alpha: interval.I{Lo: 1, Hi: math.Inf(1)}}.Check() },
		"Neumann with α":   func() { Condition{Kind: Neumann, Alpha: interval.Point(1)}.Check() },
		"unknown kind":     func() { Condition{Kind: Kind(7)}.Check() },
		"Dirichlet weak α": func() { Condition{Kind: Dirichlet}.WeakAlpha() },
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", name)
				}
			}()
			f()
		}()
	}
}

func TestKindNames(t *testing.T) {
	for k, want := range map[Kind]string{Dirichlet: "dirichlet", Neumann: "neumann", Robin: "robin", Kind(9): "Kind(9)"} {
		if k.String() != want {
			t.Errorf("%d: %q, want %q", int(k), k.String(), want)
		}
	}
}
