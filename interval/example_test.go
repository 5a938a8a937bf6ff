package interval_test

import (
	"fmt"

	"gapcert/interval"
)

// The float64 nearest to the exact sum of the stored values of 0.1 and 0.2
// is 0.30000000000000004, which lies above that sum; the enclosure has it as
// upper end and its predecessor (printed 0.3) as lower end.
func ExampleI_Add() {
	a, b := 0.1, 0.2
	x := interval.Point(a).Add(interval.Point(b))
	fmt.Println(x)
	fmt.Printf("%x %x\n", x.Lo, x.Hi)
	fmt.Println(x.Hi == a+b)
	// Output:
	// [0.3, 0.30000000000000004]
	// 0x1.3333333333333p-02 0x1.3333333333334p-02
	// true
}

// Division encloses 1/3 by its two float64 neighbours; a divisor that
// contains zero gives the whole line.
func ExampleI_Div() {
	third := interval.Point(1).Div(interval.Point(3))
	fmt.Println(third)
	fmt.Println(interval.New(1, 2).Div(interval.New(4, 8)))
	fmt.Println(interval.New(1, 2).Div(interval.New(-1, 1)))
	// Output:
	// [0.3333333333333333, 0.33333333333333337]
	// [0.125, 0.5]
	// [-Inf, +Inf]
}
