package algebraic

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// randomConst returns a random constant formula over the forms the exact
// readers know (integers, decimals, sqrt, cos and sin of rational
// multiples of π, +, −, ·, division by an integer, squares, negation).
func randomConst(rng *rand.Rand, depth int) string {
	if depth == 0 || rng.IntN(3) == 0 {
		switch rng.IntN(6) {
		case 0:
			return fmt.Sprint(1 + rng.IntN(9))
		case 1:
			return fmt.Sprintf("%d.%d", rng.IntN(5), rng.IntN(100))
		case 2:
			return fmt.Sprintf("sqrt(%d)", rng.IntN(13))
		case 3:
			return fmt.Sprintf("cos(%d*pi/12)", rng.IntN(49)-24)
		case 4:
			return fmt.Sprintf("sin(%d*pi/%d)", rng.IntN(21)-10, 1+rng.IntN(9))
		default:
			return fmt.Sprintf("cos(2*pi/%d)", 1+rng.IntN(9))
		}
	}
	a, b := randomConst(rng, depth-1), randomConst(rng, depth-1)
	switch rng.IntN(6) {
	case 0:
		return a + "+" + b
	case 1:
		return a + "-(" + b + ")"
	case 2:
		return "(" + a + ")*(" + b + ")"
	case 3:
		return "(" + a + ")/" + fmt.Sprint(1+rng.IntN(7))
	case 4:
		return "-(" + a + ")^2"
	default:
		return "(" + a + ")^-1*3"
	}
}

// TestReadConstAgainstFormula reads random constant formulas, through
// their canonical text as package formula prints it, in both exact
// algebras, and checks each exact value against formula's own interval
// evaluation (an independent reading of the same text): the midpoints
// agree to 1e-9 relative, far tighter than the guard in readConst (which
// only asks the enclosures to meet). Fixed seed.
func TestReadConstAgainstFormula(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	readSurd, readRoot := 0, 0
	for range 1500 {
		src := randomConst(rng, 3)
		e, err := formula.Parse(src)
		if err != nil {
			t.Fatalf("%s: %v", src, err)
		}
		val, err := e.EvalConst()
		if err != nil || !val.IsBounded() || val.Wid() > 1e-6*(1+val.Mag()) {
			continue // e.g. 0^-1; the exact readers refuse such inputs too
		}
		text := e.String()
		check := func(name string, enc interval.I) {
			if math.Abs(enc.Mid()-val.Mid()) > 1e-9*(1+math.Abs(val.Mid())) {
				t.Errorf("%s in %s: %v, formula gives %v", text, name, enc, val)
			}
		}
		if s, ok := readConst[Surd](surdAlgebra{}, text, val); ok {
			readSurd++
			check("surds", s.Enclose())
		}
		if r, ok := readConst[RootSum](rootAlgebra{}, text, val); ok {
			readRoot++
			check("root sums", rootAlgebra{}.enclose(r))
		}
		// Without the guard: a misreading must not hide behind it.
		if s, ok := readConst[Surd](surdAlgebra{}, text, interval.Entire()); ok {
			check("surds, unguarded", s.Enclose())
		}
		if r, ok := readConst[RootSum](rootAlgebra{}, text, interval.Entire()); ok {
			check("root sums, unguarded", rootAlgebra{}.enclose(r))
		}
	}
	if readSurd < 200 || readRoot < 400 {
		t.Errorf("read %d as surds and %d as root sums, want at least 200 and 400", readSurd, readRoot)
	}
	t.Logf("read %d as surds, %d as root sums", readSurd, readRoot)
}
