package sparse

import (
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/solvertest"
)

// TestConformance runs the solver conformance suite on the general sparse
// storage.
func TestConformance(t *testing.T) {
	solvertest.Run(t, solvertest.Impl{
		LowestEigs: func(n int, e []solvertest.Entry, count int) ([]float64, [][]float64, error) {
			k, m := NewBuilder(n), NewBuilder(n)
			for _, x := range e {
				k.Add(x.I, x.J, x.K)
				m.Add(x.I, x.J, x.M)
			}
			return LowestEigs(k.Build(), m.Build(), count)
		},
		NewCounter: func(n int, e []solvertest.IEntry) enclose.Counter {
			k, m := NewIBuilder(n), NewIBuilder(n)
			for _, x := range e {
				k.Add(x.I, x.J, x.K)
				m.Add(x.I, x.J, x.M)
			}
			return NewCounter(k.Build(), m.Build())
		},
	})
}
