package groundstate

import (
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// Inputs at the edge of the floating-point range. A huge bound E on a
// tiny disc makes E/√(πR²) overflow; a huge λ against a huge V makes
// sup|λ − V| overflow. Both are legal numerical inputs: the result must be
// an enclosure (possibly the whole line) or a typed error, never a panic.
func TestEnclosePointOverflowDoesNotPanic(t *testing.T) {
	run := func(name string, v string, lambda interval.I, E float64, d Disc) {
		t.Helper()
		defer func() {
			if r := recover(); r != nil {
				t.Errorf("%s: panic %v", name, r)
			}
		}()
		enc, err := EnclosePoint(formula.MustParse(v), lambda, E, d, DiscOptions{})
		if err == nil && enc.U.Positive() {
			t.Errorf("%s: positive enclosure %v from an overflowed bound", name, enc.U)
		}
	}
	one := [][]interval.I{{interval.Point(1)}}
	run("E/√(πR²) overflows", "0", interval.Point(1), 1e300, Disc{Centre: [2]float64{0, 0}, Radius: 1e-10, Coef: one})
	run("sup|λ − V| overflows", "-1.5e308 + 0*x", interval.Point(1.5e308), 1e-3, Disc{Centre: [2]float64{0, 0}, Radius: 0.5, Coef: one})
	run("kernel term overflows", "1e300*(1 + x^2)", interval.Point(0), 1e10, Disc{Centre: [2]float64{0, 0}, Radius: 1e10, Coef: one})
}

// Intervals written as struct literals bypass interval.New: an enclosure
// of λ1 or a coefficient with Lo > Hi (ends swapped by a caller) or a NaN
// end is misuse that EnclosePoint must refuse (panic), not turn into an
// "enclosure" with Lo > Hi, which Positive() and the margin of
// CertifyMidpoint would read as a certified sign.
func TestEnclosePointRejectsInvalidIntervals(t *testing.T) {
	v := formula.MustParse("x^2")
	one := [][]interval.I{{interval.Point(1)}}
	bad := interval.I{Lo: 3, Hi: 1}
	for _, tc := range []struct {
		name   string
		lambda interval.I
		coef   [][]interval.I
	}{
		{"λ with Lo > Hi", bad, one},
		{"coefficient with Lo > Hi", interval.Point(1), [][]interval.I{{bad}}},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			enc, err := EnclosePoint(v, tc.lambda, 1e-3, Disc{Radius: 0.5, Coef: tc.coef}, DiscOptions{})
			t.Logf("%s: U = %v, err %v", tc.name, enc.U, err)
		}()
	}
}
