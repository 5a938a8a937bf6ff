package line

import (
	"math"

	"gapcert/enclose/band"
)

// inverseIterate returns an approximate lowest eigenvector of Kx = λMx by
// inverse iteration (test helper; floating point).
func inverseIterate(k, m *band.Sym, n int) []float64 {
	f, ok := k.Factor()
	if !ok {
		panic("factor")
	}
	x := make([]float64, n)
	for i := range x {
		x[i] = 1
	}
	y := make([]float64, n)
	for it := 0; it < 60; it++ {
		m.MulVecTo(y, x)
		f.SolveTo(x, y)
		s := 0.0
		for _, v := range x {
			s += v * v
		}
		s = math.Sqrt(s)
		for i := range x {
			x[i] /= s
		}
	}
	return x
}
