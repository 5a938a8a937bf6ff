package ritz

import (
	"testing"

	"gapcert/interval"
)

func TestAccumulatorSumsOutwardAndMirrors(t *testing.T) {
	a := NewAccumulator(3)
	tenth := interval.I{Lo: interval.DivDown(1, 10), Hi: interval.DivUp(1, 10)}
	for k := 0; k < 10; k++ {
		a.Add(2, 0, tenth)
	}
	a.Add(1, 1, interval.Point(2))
	a.Add(1, 1, interval.Point(-0.5))
	s := a.Sym()
	if x := s.At(2, 0); !x.Contains(1) || x.Hi-x.Lo > 1e-14 {
		t.Errorf("ten tenths = %v, want a narrow enclosure of 1", x)
	}
	if s.At(0, 2) != s.At(2, 0) {
		t.Errorf("upper entry %v differs from lower %v", s.At(0, 2), s.At(2, 0))
	}
	if x := s.At(1, 1); x != interval.Point(1.5) {
		t.Errorf("exact sum = %v, want [1.5, 1.5]", x)
	}
	if x := s.At(0, 0); x != (interval.I{}) {
		t.Errorf("untouched entry = %v, want [0, 0]", x)
	}
}

func TestAccumulatorRefusesUpperEntries(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("Add(0, 1) did not panic")
		}
	}()
	NewAccumulator(2).Add(0, 1, interval.Point(1))
}
