package formula

import (
	"errors"
	"strings"
	"testing"
)

func TestParseCanonical(t *testing.T) {
	// Expected canonical texts follow the precedence rules of the grammar
	// (common practice: ^ right-associative and tighter than unary minus).
	for _, tc := range []struct{ in, want string }{
		{"x", "x"},
		{" x + 1 ", "x+1"},
		{"-x^2", "-x^2"},
		{"(-x)^2", "(-x)^2"},
		{"x^2^3", "x^2^3"},
		{"(x^2)^3", "(x^2)^3"},
		{"a-(b-c)", "a-(b-c)"},
		{"(a-b)-c", "a-b-c"},
		{"a/(b*c)", "a/(b*c)"},
		{"a*b/c", "a*b/c"},
		{"a+-b", "a+(-b)"},
		{"--x", "-(-x)"},
		{"+x", "x"},
		{"2^-1", "2^(-1)"},
		{"pow(x, 0.5)", "x^0.5"},
		{"sin( x )*cos(y)", "sin(x)*cos(y)"},
		{"min(x,max(y,1))", "min(x, max(y, 1))"},
		{"1e400*x", "1e400*x"},
		{".5+3.", ".5+3."},
		{"interval(1/3, 1/2)", "interval(1/3, 1/2)"},
		{"interval(-1, 2)*x", "interval(-1, 2)*x"},
		{"exp(-(x^2+y^2)/2)", "exp(-(x^2+y^2)/2)"},
		{"pi*e", "pi*e"},
		{"x_1+Alpha2", "x_1+Alpha2"},
	} {
		e, err := Parse(tc.in)
		if err != nil {
			t.Errorf("Parse(%q): %v", tc.in, err)
			continue
		}
		if got := e.String(); got != tc.want {
			t.Errorf("Parse(%q).String() = %q, want %q", tc.in, got, tc.want)
		}
		again, err := Parse(e.String())
		if err != nil || again.String() != e.String() {
			t.Errorf("round trip of %q: %v %v", e.String(), again, err)
		}
	}
}

func TestParseErrors(t *testing.T) {
	for _, tc := range []struct {
		in   string
		col  int
		msg  string // substring of Msg
		hint string // substring of Hint
	}{
		{"", 1, "empty", "x^2"},
		{"   ", 4, "empty", ""},
		{"sine(x)", 1, "unknown function 'sine'", "sin"},
		{"(x+1", 1, "unmatched '('", ")"},
		{"sin(x+(y*2)", 4, "unmatched '('", ")"},
		{"x+1)", 4, "unmatched ')'", ""},
		{"2x", 2, "missing operator", "2*x"},
		{"x y", 3, "missing operator", "x*y"},
		{"(x)(y)", 4, "missing operator", "*"},
		{"x+", 3, "end of formula", ""},
		{"x**2", 3, "unexpected \"*\"", ""},
		{"1.2.3", 1, "bad number", "'.'"},
		{"1e+", 1, "bad number", "exponent"},
		{"1e100001", 1, "bad number", "exponent"},
		{".", 1, "bad number", ""},
		{"sin(x, y)", 1, "sin takes 1 argument, got 2", ""},
		{"min(x)", 1, "min takes 2 arguments, got 1", ""},
		{"sqrt()", 5, "without arguments", ""},
		{"x $ y", 3, "unexpected character", ""},
		{"x − y", 3, "unexpected character", "hyphen"},
		{"exp + 1", 1, "needs arguments", "exp(...)"},
		{"interval(x, 1)", 1, "exact rational", ""},
		{"interval(2, 1)", 1, "lower end above", ""},
		{"f(x,", 5, "end of formula", ""},
		{"x,y", 2, "unexpected \",\"", ""},
	} {
		_, err := Parse(tc.in)
		var se *SyntaxError
		if !errors.As(err, &se) {
			t.Errorf("Parse(%q): got %v, want *SyntaxError", tc.in, err)
			continue
		}
		if se.Col != tc.col || !strings.Contains(se.Msg, tc.msg) || !strings.Contains(se.Hint, tc.hint) || se.Src != tc.in {
			t.Errorf("Parse(%q) = col %d %q (%q), want col %d %q (%q)", tc.in, se.Col, se.Msg, se.Hint, tc.col, tc.msg, tc.hint)
		}
		if want := "col "; !strings.HasPrefix(se.Error(), want) {
			t.Errorf("Error() = %q", se.Error())
		}
	}
}

func TestVarsBind(t *testing.T) {
	e := MustParse("alpha*x^2 + sin(beta*y) + pi + e")
	if got := strings.Join(e.Vars(), ","); got != "alpha,beta,x,y" {
		t.Fatalf("Vars = %s", got)
	}
	b := e.Bind(map[string]I{"alpha": pt(2), "beta": {Lo: 0.5, Hi: 0.75}, "unused": pt(1)})
	if got := strings.Join(b.Vars(), ","); got != "x,y" {
		t.Fatalf("bound Vars = %s", got)
	}
	if want := "2*x^2+sin(interval(0.5, 0.75)*y)+pi+e"; b.String() != want {
		t.Fatalf("bound String = %q, want %q", b.String(), want)
	}
	again := MustParse(b.String())
	if again.String() != b.String() {
		t.Fatalf("round trip %q", again.String())
	}
	// A negative bound value prints as a negated literal.
	if got := MustParse("a*x").Bind(map[string]I{"a": pt(-0.25)}).String(); got != "-0.25*x" {
		t.Fatalf("negative bind: %q", got)
	}
	var ue *UnboundError
	if _, err := e.EvalConst(); !errors.As(err, &ue) {
		t.Fatalf("EvalConst with free variables: %v", err)
	}
}

func TestBuilders(t *testing.T) {
	// 1/(V + γ) built from a parsed V.
	v := MustParse("x^2")
	f := Div(Const(pt(1)), Add(v, Const(pt(0.5))))
	if f.String() != "1/(x^2+0.5)" {
		t.Fatalf("builder String = %q", f.String())
	}
	g := Mul(Sub(Var("x"), Const(pt(1))), Var("y"))
	if g.String() != "(x-1)*y" {
		t.Fatalf("builder String = %q", g.String())
	}
	r, err := f.Eval(map[string]I{"x": {Lo: 0, Hi: 1}})
	if err != nil || !(r.Lo <= 1.0/1.5 && r.Hi >= 2) {
		t.Fatalf("Eval = %v, %v", r, err)
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"x", "-x^2+3*y", "sin(x)/(1+cos(y)^2)", "interval(1/3, 0.5)*x", "pow(x, y)", "2^-1^2",
		"min(x, max(y, 1e-300))", "((((x))))", "1e100000", "log(", "x^^2", ".5e-3", "atan(tanh(sinh(cosh(x))))"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		e, err := Parse(s)
		if err != nil {
			var se *SyntaxError
			if !errors.As(err, &se) || se.Col < 1 || se.Col > len(s)+1 {
				t.Fatalf("Parse(%q): bad error %v", s, err)
			}
			return
		}
		text := e.String()
		again, err := Parse(text)
		if err != nil {
			t.Fatalf("Parse(String()) of %q = %q: %v", s, text, err)
		}
		if again.String() != text {
			t.Fatalf("String round trip of %q: %q then %q", s, text, again.String())
		}
		// Evaluation never panics; errors are fine.
		env := map[string]I{}
		for _, v := range e.Vars() {
			env[v] = I{Lo: -0.5, Hi: 2}
		}
		_, _ = e.Eval(env)
		_, _ = e.Polynomial()
		params := map[string]I{}
		for v, val := range env {
			if v != "x" && v != "y" {
				params[v] = val
			}
		}
		b := e.Bind(params)
		_, _ = b.Model2([3][2]I{{pt(0), pt(0)}, {pt(1), pt(0)}, {pt(0), pt(1)}}, 2)
		_, _ = b.Bind(map[string]I{"y": pt(0.5)}).Model1(pt(0.25), pt(0.5), 3)
		_, _ = b.RangeTriangle([3][2]I{{pt(0), pt(0)}, {pt(1), pt(0)}, {pt(0), pt(1)}})
	})
}
