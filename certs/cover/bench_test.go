package cover

import (
	"os"
	"testing"
	"time"
)

// benchmarkCover covers the family once per iteration into a fresh
// directory and reports the cells, the corners and the cells per hour of
// wall time (2 jobs).
func benchmarkCover(b *testing.B, family string) {
	f, err := ParseFamily([]byte(family))
	if err != nil {
		b.Fatal(err)
	}
	var cells, corners int
	start := time.Now()
	for i := 0; i < b.N; i++ {
		s, err := Run(f, b.TempDir(), testOptions())
		if err != nil {
			b.Fatal(err)
		}
		cells, corners = len(s.Cells), s.Corners
	}
	per := time.Since(start).Hours() / float64(b.N)
	b.ReportMetric(float64(cells), "cells")
	b.ReportMetric(float64(corners), "corners")
	b.ReportMetric(float64(cells)/per, "cells/hour")
}

// BenchmarkCoverHarmonic: V = c·x² on (0, 1), c ∈ [0, 5], gap ≥ 3π²/D².
func BenchmarkCoverHarmonic(b *testing.B) { benchmarkCover(b, harmonicFamily) }

// BenchmarkCoverRobinRectangle: the 2×1 rectangle, α ∈ [0, 10],
// @robin_comparison.
func BenchmarkCoverRobinRectangle(b *testing.B) { benchmarkCover(b, robinFamily("10", 10)) }

// BenchmarkCoverTriangleGap: Dirichlet triangles with base [0, 1] and apex
// (a, b) ∈ [1/10, 2/5] × [1/4, 1/2], D²·gap ≥ 64π²/9 (the README's
// example; one certificate per cell).
func BenchmarkCoverTriangleGap(b *testing.B) {
	data, err := os.ReadFile(triangleGapExample)
	if err != nil {
		b.Fatal(err)
	}
	benchmarkCover(b, string(data))
}
