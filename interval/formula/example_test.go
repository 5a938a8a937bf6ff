package formula_test

import (
	"fmt"

	"gapcert/interval"
	"gapcert/interval/formula"
)

func ExampleParse() {
	e, err := formula.Parse("alpha * x^2 - cos(pi*x)")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(e, e.Vars())
	_, err = formula.Parse("2x + 1")
	fmt.Println(err)
	// Output:
	// alpha*x^2-cos(pi*x) [alpha x]
	// col 2: missing operator before "x" (write 2*x for a product)
}

func ExampleExpr_Eval() {
	e := formula.MustParse("x^2 - 2*x")
	r, _ := e.Eval(map[string]interval.I{"x": interval.New(0, 0.5)})
	fmt.Println(r) // contains the exact range [-0.75, 0] (interval arithmetic overestimates)
	_, err := formula.MustParse("1 + log(x)").Eval(map[string]interval.I{"x": interval.New(-1, 1)})
	fmt.Println(err)
	// Output:
	// [-1, 0.25]
	// formula: in log(x): log: not defined on all of the argument [-1, 1]
}

func ExampleExpr_Model1() {
	// x^2 on [1, 2]: x = 1 + ξ, so x² = 1 + 2ξ + ξ² exactly (R = 0).
	m, _ := formula.MustParse("x^2").Model1(interval.Point(1), interval.Point(2), 3)
	fmt.Println(m.C, m.R)
	// Output:
	// [[1, 1] [2, 2] [1, 1] [0, 0]] [0, 0]
}
