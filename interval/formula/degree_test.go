package formula

import (
	"testing"

	"gapcert/interval"
)

func TestPolynomialDegree(t *testing.T) {
	for _, c := range []struct {
		src  string
		deg  int
		poly bool
	}{
		{"x^2 + y^2 + z^2", 2, true},
		{"(x + y*z)^3 / 2 - pi*z", 6, true},
		{"3", 0, true},
		{"x*y*z*x", 4, true},
		{"sin(x) + z", 0, false},
		{"x / z", 0, false},
		{"x^(1/2)", 0, false},
		{"w + x", 0, false},
	} {
		d, ok := MustParse(c.src).PolynomialDegree("x", "y", "z")
		if ok != c.poly || (ok && d != c.deg) {
			t.Errorf("%s: (%d, %v), want (%d, %v)", c.src, d, ok, c.deg, c.poly)
		}
	}
	// A Taylor model of that order has a zero remainder.
	m, err := MustParse("(x + y*z)^3 / 2 - pi*z").Model3(unitTetra(), 6)
	if err != nil || m.R.Lo != 0 || m.R.Hi != 0 {
		t.Errorf("order-6 model of a degree-6 polynomial: remainder %v, %v", m.R, err)
	}
}

// unitTetra returns the tetrahedron (0,0,0), (1,0,0), (0,1,0), (0,0,1).
func unitTetra() [4][3]interval.I {
	var v [4][3]interval.I
	for i := 1; i < 4; i++ {
		v[i][i-1] = interval.Point(1)
	}
	return v
}
