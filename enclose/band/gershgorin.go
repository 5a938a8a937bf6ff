package band

import (
	"math"

	"gapcert/interval"
)

// GershgorinLower returns a float64 ≤ λ_min(M) for every member M of m:
// min_i (inf M_ii − Σ_{j≠i} |M_ij|), every operation rounded down. By
// Gershgorin's circle theorem every eigenvalue of M lies in some interval
// [M_ii − Σ_{j≠i}|M_ij|, M_ii + Σ_{j≠i}|M_ij|]. The result may be ≤ 0, in
// which case it proves nothing about definiteness; it is a suitable mMin for
// CountBelow only when it is > 0 (for example for the P1 mass matrix
// (h/6)·tridiag(1, 4, 1), where it gives h/3, which is also the infimum of
// its spectrum over all sizes). Returns +Inf for the empty matrix.
//
// References:
//
//	S. Gershgorin, Über die Abgrenzung der Eigenwerte einer Matrix,
//	Izv. Akad. Nauk SSSR, Ser. Fiz.-Mat. 6 (1931) 749–754.
func GershgorinLower(m *ISym) float64 {
	lower := math.Inf(1)
	for i := 0; i < m.N; i++ {
		off := 0.0
		for j := max(0, i-m.W); j <= min(m.N-1, i+m.W); j++ {
			if j != i {
				off = interval.AddUp(off, m.At(i, j).Mag())
			}
		}
		lower = math.Min(lower, interval.SubDown(m.At(i, i).Lo, off))
	}
	return lower
}
