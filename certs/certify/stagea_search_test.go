package certify

import (
	"gapcert/enclose/band"
	"gapcert/fem/line"
	"gapcert/interval"
)

// verifiedDiscreteLower returns the verified lower bound of the
// index-th eigenvalue of the banded interval pencil ([K], [M]) that the
// interval stage-A search finds (verifiedLower with the interval search
// parameters), its float bisection bracketed by [lo, hi].
func verifiedDiscreteLower(k, m *band.ISym, mMin, lo, hi float64, index int) float64 {
	s := line.NewStageAPencil(k, m, mMin, interval.I{}, []float64{hi})
	return verifiedLower(s, mMin, s.Bisect(index, lo, hi), lo, index, intervalDomain{}.search())
}
