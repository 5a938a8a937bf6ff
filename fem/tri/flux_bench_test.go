package tri

import (
	"math"
	"syscall"
	"testing"
	"time"

	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// The flux choice (MinimizeApprox) at the recipes where the certification
// of the smooth test problems ends: P_8 trial functions, RT_7 fluxes, 128 or
// 256 triangles (refined until at least 128), three trial functions (stage B with N = 3 on the square, 2 on
// the others; three here for all). Besides ns/op it reports the process
// CPU time per operation (user + system, getrusage), which the shared
// machine does not inflate as it does wall time.
func BenchmarkMinimizeApprox(b *testing.B) {
	s3, _ := interval.Point(3).Sqrt()
	cases := []struct {
		name  string
		verts [][2]interval.I
		tris  [][3]int
		bc    []boundary.Condition
		v     string
	}{
		{"square", [][2]interval.I{pt(0, 0), pt(1, 0), pt(1, 1), pt(0, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}},
			allBC(4, dirichlet), "0"},
		{"equilateral", [][2]interval.I{pt(0, 0), pt(1, 0), {interval.Point(0.5), s3.DivF(2)}}, [][3]int{{0, 1, 2}},
			allBC(3, dirichlet), "0"},
		{"trapezoid_robin", [][2]interval.I{pt(0, 0), pt(3, 0), pt(2, 1), pt(1, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}},
			[]boundary.Condition{dirichlet, robin(interval.Point(1.5)), neumann, robin(interval.Point(0.25))}, "x*y"},
	}
	for _, tc := range cases {
		m, err := mesh.FromPolygon(tc.verts, tc.tris)
		if err != nil {
			b.Fatal(err)
		}
		for len(m.Tris) < 128 {
			m = m.Refine()
		}
		s := NewLagrange(m, 8, tc.bc)
		v := mustPotential(b, m, tc.v, 4)
		w, err := v.InverseShifted(interval.Point(1), 8)
		if err != nil {
			b.Fatal(err)
		}
		f := NewFlux(m, 7, tc.bc)
		vecs := make([][]float64, 3)
		for i := range vecs {
			vecs[i] = s.Interpolate(func(x, y float64) float64 {
				return math.Sin(float64(i+1)*x) * math.Cos(y+float64(i))
			})
		}
		if _, err := f.MinimizeApprox(s, vecs, w); err != nil { // caches the reference tables
			b.Fatal(err)
		}
		b.Run(tc.name, func(b *testing.B) {
			c0 := cpuTime()
			for b.Loop() {
				if _, err := f.MinimizeApprox(s, vecs, w); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64((cpuTime()-c0).Nanoseconds())/float64(b.N), "cpu-ns/op")
		})
	}
}

// cpuTime returns the user plus system time of the process.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		panic(err)
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// BenchmarkLehmannMatrices: the proving side of stage B at degree 10
// (RT_9 fluxes), three trial functions, on the unit square refined to 128
// triangles with V = 0: LGMatrix (A2, combined with the Ritz matrices by
// temple.LehmannGoerisch) against LehmannMatrix (B in the residual form,
// which certs/certify uses on meshes without Robin sides). Reports the
// process CPU time per operation as BenchmarkMinimizeApprox does.
func BenchmarkLehmannMatrices(b *testing.B) {
	m := unitSquare(b, 3)
	bc := allBC(4, dirichlet)
	s := NewLagrange(m, 10, bc)
	v := mustPotential(b, m, "0", 1)
	g := interval.Point(10)
	w, err := v.InverseShifted(g, 12)
	if err != nil {
		b.Fatal(err)
	}
	f := NewFlux(m, 9, bc)
	vecs := make([][]float64, 3)
	for i := range vecs {
		vecs[i] = s.Interpolate(func(x, y float64) float64 {
			return math.Sin(float64(i+1)*math.Pi*x) * math.Sin(math.Pi*y)
		})
	}
	fluxes, err := f.MinimizeApprox(s, vecs, w)
	if err != nil {
		b.Fatal(err)
	}
	for _, c := range []struct {
		name string
		run  func() error
	}{
		{"LGMatrix", func() error { _, err := f.LGMatrix(s, vecs, fluxes, v, w, g); return err }},
		{"LehmannMatrix", func() error { _, err := f.LehmannMatrix(s, vecs, fluxes, v, w, g, 100); return err }},
	} {
		b.Run(c.name, func(b *testing.B) {
			c0 := cpuTime()
			for b.Loop() {
				if err := c.run(); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64((cpuTime()-c0).Nanoseconds())/float64(b.N), "cpu-ns/op")
		})
	}
}
