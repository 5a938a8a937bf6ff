package geneig

import (
	"math"
	"testing"
)

// TestSolveDiagonal: for A = diag(2, 6, 12) and B = diag(1, 2, 3) the
// eigenvalues are 2, 3, 4 with eigenvectors e_i/√b_i (common practice).
func TestSolveDiagonal(t *testing.T) {
	a := []float64{2, 0, 0, 0, 6, 0, 0, 0, 12}
	b := []float64{1, 0, 0, 0, 2, 0, 0, 0, 3}
	vals, vecs, err := Solve(a, b, 3)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []float64{2, 3, 4} {
		if math.Abs(vals[i]-want) > 1e-14*want {
			t.Errorf("λ%d = %v, want %v", i+1, vals[i], want)
		}
		// B-normalised: b_i x_i² = 1.
		if x := vecs[i*3+i]; math.Abs(b[i*3+i]*x*x-1) > 1e-14 {
			t.Errorf("eigenvector %d not B-normalised: %v", i, x)
		}
	}
	if _, _, err := Solve(a, []float64{1, 0, 0, 0, -1, 0, 0, 0, 1}, 3); err != ErrNotPositiveDefinite {
		t.Errorf("indefinite B: err = %v", err)
	}
	if _, _, err := Solve([]float64{math.NaN()}, []float64{1}, 1); err != ErrFailed {
		t.Errorf("NaN input: err = %v", err)
	}
}
