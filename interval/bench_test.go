package interval

import (
	"math"
	"math/rand/v2"
	"testing"
)

// The benchmarks pair each interval operation with the same plain float64
// operation on the midpoints, so that ns/op of the two sub-benchmarks
// (…/interval and …/float64) give the cost ratio directly.

const benchN = 1 << 10 // operands cycled through; a power of two

var (
	sinkI I
	sinkF float64
)

// benchData returns narrow intervals (a few ulps wide, as produced by a
// chain of operations) with ends in ±[0.5, 8] and their midpoints; every
// fourth one straddles no zero but has a negative sign, so Mul and Div go
// through several sign cases. If positive, all ends are positive.
func benchData(seed uint64, positive bool) ([]I, []float64) {
	r := rand.New(rand.NewPCG(seed, 1))
	xs := make([]I, benchN)
	ms := make([]float64, benchN)
	for i := range xs {
		lo := 0.5 + 7.5*r.Float64()
		if !positive && i%4 == 3 {
			lo = -lo - 8
		}
		hi := lo
		for k := r.IntN(4); k >= 0; k-- {
			hi = math.Nextafter(hi, math.Inf(1))
		}
		xs[i] = I{lo, hi}
		ms[i] = xs[i].Mid()
	}
	return xs, ms
}

func benchBinary(b *testing.B, positiveY bool, op func(x, y I) I, fop func(a, c float64) float64) {
	xs, xm := benchData(1, false)
	ys, ym := benchData(2, positiveY)
	b.Run("interval", func(b *testing.B) {
		i := 0
		for b.Loop() {
			k := i & (benchN - 1)
			sinkI = op(xs[k], ys[k])
			i++
		}
	})
	b.Run("float64", func(b *testing.B) {
		i := 0
		for b.Loop() {
			k := i & (benchN - 1)
			sinkF = fop(xm[k], ym[k])
			i++
		}
	})
}

func BenchmarkAdd(b *testing.B) {
	benchBinary(b, false, I.Add, func(a, c float64) float64 { return a + c })
}

func BenchmarkMul(b *testing.B) {
	benchBinary(b, false, I.Mul, func(a, c float64) float64 { return float64(a * c) })
}

func BenchmarkDiv(b *testing.B) {
	benchBinary(b, true, I.Div, func(a, c float64) float64 { return a / c })
}

func BenchmarkSqrt(b *testing.B) {
	xs, xm := benchData(3, true)
	b.Run("interval", func(b *testing.B) {
		i := 0
		for b.Loop() {
			sinkI, _ = xs[i&(benchN-1)].Sqrt()
			i++
		}
	})
	b.Run("float64", func(b *testing.B) {
		i := 0
		for b.Loop() {
			sinkF = math.Sqrt(xm[i&(benchN-1)])
			i++
		}
	})
}

// BenchmarkMulSubnormal measures the exact math/big path taken by products
// below 2⁻⁹⁶⁹.
func BenchmarkMulSubnormal(b *testing.B) {
	x, y := I{0x1.8p-500, 0x1.9p-500}, I{0x1.3p-500, 0x1.4p-500}
	for b.Loop() {
		sinkI = x.Mul(y)
	}
}
