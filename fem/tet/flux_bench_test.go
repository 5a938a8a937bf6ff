package tet

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// benchFluxSetup returns the flux space RT_k on the Kuhn mesh of n³
// subcubes (Dirichlet), the trial space P_(k+1) and nv random trial
// vectors with their chosen fluxes (V = 0, γ_B = 10).
func fluxBenchSetup(b testing.TB, n, k, nv int) (*FluxSpace, [][]float64, [][]float64) {
	m := fluxKuhnMesh(n, nil, nil)
	f, err := NewFlux(m.cells, k, m.boundaryAll(boundary.Condition{Kind: boundary.Dirichlet}))
	if err != nil {
		b.Fatal(err)
	}
	s := newFluxTestTrial(m, k+1, fluxDirichletAll(m))
	fs, err := NewFluxSpaceFree(s, f, interval.Point(10))
	if err != nil {
		b.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(14, uint64(k)))
	trial := make([][]float64, nv)
	for i := range trial {
		trial[i] = make([]float64, s.N())
		for j := range trial[i] {
			trial[i][j] = rng.NormFloat64()
		}
	}
	flux, err := fs.Choose(trial)
	if err != nil {
		b.Fatal(err)
	}
	return fs, trial, flux
}

// BenchmarkFluxLGMatrix measures the interval Lehmann–Goerisch matrix of
// four trial functions on the Kuhn mesh of 4³ subcubes (384 cells) per
// flux degree k (trial degree k + 1).
func BenchmarkFluxLGMatrix(b *testing.B) {
	for k := 0; k <= 4; k++ {
		b.Run(fmt.Sprintf("k=%d", k), func(b *testing.B) {
			fs, trial, flux := fluxBenchSetup(b, 4, k, 4)
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				if _, err := fs.LGMatrix(trial, flux); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(fs.N()), "flux-unknowns")
		})
	}
}

// BenchmarkFluxChoose measures the float flux choice (sparse normal
// equations) for four trial functions on the same meshes.
func BenchmarkFluxChoose(b *testing.B) {
	for k := 0; k <= 3; k++ {
		b.Run(fmt.Sprintf("k=%d", k), func(b *testing.B) {
			fs, trial, _ := fluxBenchSetup(b, 4, k, 4)
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				if _, err := fs.Choose(trial); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(fs.N()), "flux-unknowns")
		})
	}
}
