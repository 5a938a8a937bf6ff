package formula

import "testing"

func BenchmarkEval(b *testing.B) {
	e := MustParse("exp(-(x^2+y^2)/2)*sin(3*x)+0.1*y^4")
	env := map[string]I{"x": {Lo: 0.1, Hi: 0.2}, "y": {Lo: -0.3, Hi: -0.25}}
	for b.Loop() {
		if _, err := e.Eval(env); err != nil {
			b.Fatal(err)
		}
	}
}

func benchModel1(b *testing.B, src string, q int) {
	e := MustParse(src)
	for b.Loop() {
		if _, err := e.Model1(pt(0.25), pt(0.3), q); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkModel1Mathieu8(b *testing.B)   { benchModel1(b, "2*5*cos(2*x)", 8) }
func BenchmarkModel1Mathieu16(b *testing.B)  { benchModel1(b, "2*5*cos(2*x)", 16) }
func BenchmarkModel1Gaussian16(b *testing.B) { benchModel1(b, "exp(-x^2)/(1+x^2)", 16) }

func benchModel2(b *testing.B, src string, q int) {
	e := MustParse(src)
	tri := [3][2]I{{pt(0.1), pt(0.1)}, {pt(0.15), pt(0.1)}, {pt(0.1), pt(0.15)}}
	for b.Loop() {
		if _, err := e.Model2(tri, q); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkModel2Poly4(b *testing.B)     { benchModel2(b, "x^2+3*x*y-y^4", 4) }
func BenchmarkModel2Gaussian4(b *testing.B) { benchModel2(b, "exp(-(x^2+y^2))", 4) }
func BenchmarkModel2Gaussian8(b *testing.B) { benchModel2(b, "exp(-(x^2+y^2))", 8) }
