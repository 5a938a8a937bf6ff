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

func benchName(cells, p int) string {
	return "cells=" + itoa(cells) + "/p=" + itoa(p)
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	s := ""
	for n > 0 {
		s = string(rune('0'+n%10)) + s
		n /= 10
	}
	return s
}
