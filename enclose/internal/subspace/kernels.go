package subspace

import "gonum.org/v1/gonum/floats"

// LoopKernels are straight loops: the dot product sums in index order.
var LoopKernels = Kernels{
	Dot: func(x, y []float64) float64 {
		s := 0.0
		for i, v := range x {
			s += v * y[i]
		}
		return s
	},
	Axpy: func(y []float64, a float64, x []float64) {
		for i, v := range x {
			y[i] += a * v
		}
	},
	Scale: func(x []float64, a float64) {
		for i := range x {
			x[i] *= a
		}
	},
}

// GonumKernels use gonum's assembly kernels where available (their dot
// product sums in another order than LoopKernels).
var GonumKernels = Kernels{
	Dot:   floats.Dot,
	Axpy:  func(y []float64, a float64, x []float64) { floats.AddScaled(y, a, x) },
	Scale: func(x []float64, a float64) { floats.Scale(a, x) },
}
