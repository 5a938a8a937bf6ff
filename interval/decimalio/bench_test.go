package decimalio

import (
	"fmt"
	"math"
	"testing"
)

func BenchmarkParse(b *testing.B) {
	for _, s := range []string{"0.1", "-2.5e-3", "1/3", "9.8696044010893586188344909998761511353"} {
		b.Run(s, func(b *testing.B) {
			for b.Loop() {
				if _, err := Parse(s); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkFormatLower(b *testing.B) {
	for _, x := range []float64{math.Pi * math.Pi, 1e-300} {
		for _, d := range []int{6, 17} {
			b.Run(fmt.Sprintf("%g/%d", x, d), func(b *testing.B) {
				for b.Loop() {
					FormatLower(x, d)
				}
			})
		}
	}
}

func BenchmarkFormatExact(b *testing.B) {
	for b.Loop() {
		FormatExact(0.1)
	}
}
