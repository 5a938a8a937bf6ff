package decimalio_test

import (
	"fmt"

	"gapcert/interval/decimalio"
)

func ExampleParse() {
	for _, s := range []string{"0.5", "0.1", "1/3", "1e400"} {
		x, err := decimalio.Parse(s)
		fmt.Println(s, x, err)
	}
	_, err := decimalio.Parse("1..2")
	fmt.Println(err)
	// Output:
	// 0.5 [0.5, 0.5] <nil>
	// 0.1 [0.09999999999999999, 0.1] <nil>
	// 1/3 [0.3333333333333333, 0.33333333333333337] <nil>
	// 1e400 [1.7976931348623157e+308, +Inf] <nil>
	// decimalio: "1..2": column 3: second decimal point (hint: write one '.' at most: 1.25)
}

func ExampleParseRat() {
	r, _ := decimalio.ParseRat("-2.5e-3")
	fmt.Println(r)
	// Output: -1/400
}

func ExampleFormatInterval() {
	pi2, _ := decimalio.Parse("9.8696044010893586188") // π² to 20 digits (recalled from memory)
	lo, hi := decimalio.FormatInterval(pi2, 12)
	fmt.Println(lo, hi)
	fmt.Println(decimalio.FormatLower(-1.25e-7, 2), decimalio.FormatUpper(-1.25e-7, 2))
	// Output:
	// 9.86960440108 9.86960440109
	// -1.3e-7 -1.2e-7
}

func ExampleFormatExact() {
	fmt.Println(decimalio.FormatExact(0.1))
	fmt.Println(decimalio.FormatExact(0x1p-20))
	// Output:
	// 0.1000000000000000055511151231257827021181583404541015625
	// 9.5367431640625e-7
}
