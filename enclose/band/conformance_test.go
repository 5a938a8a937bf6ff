package band

import (
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/solvertest"
)

// TestConformance runs the solver conformance suite on the banded storage.
func TestConformance(t *testing.T) {
	width := func(n int, at func(q int) (i, j int), len int) int {
		w := 0
		for q := 0; q < len; q++ {
			i, j := at(q)
			w = max(w, i-j)
		}
		return w
	}
	solvertest.Run(t, solvertest.Impl{
		LowestEigs: func(n int, e []solvertest.Entry, count int) ([]float64, [][]float64, error) {
			w := width(n, func(q int) (int, int) { return e[q].I, e[q].J }, len(e))
			k, m := NewSym(n, w), NewSym(n, w)
			for _, x := range e {
				k.Add(x.I, x.J, x.K)
				m.Add(x.I, x.J, x.M)
			}
			return LowestEigs(k, m, count)
		},
		NewCounter: func(n int, e []solvertest.IEntry) enclose.Counter {
			w := width(n, func(q int) (int, int) { return e[q].I, e[q].J }, len(e))
			k, m := NewISym(n, w), NewISym(n, w)
			for _, x := range e {
				k.Add(x.I, x.J, x.K)
				m.Add(x.I, x.J, x.M)
			}
			return NewCounter(k, m)
		},
	})
}
