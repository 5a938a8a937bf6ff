package formula

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"testing"

	"gapcert/interval"
)

// Containment of the exact first and second derivatives in Gradient and
// Hessian for expressions with integer powers (taken by the chain rule in
// the derivative jets). Two references, both independent of the chain
// rule: the exact derivatives in rational arithmetic (math/big) for
// rational expressions, and for every expression the jets of repeated
// multiplication evaluated on the point box of each sample point (a narrow
// enclosure of the exact derivative there, as the package's value models
// use them). An enclosure over the box must contain the exact value at
// each point of the box and so meet the point enclosure.

// pnode is a random expression tree with its own exact evaluator.
type pnode struct {
	op   string // var const add sub mul div pow neg abs min max exp sin cos atan
	name string
	c    *big.Rat
	n    int // pow: exponent
	a, b *pnode
}

func (p *pnode) String() string {
	switch p.op {
	case "var":
		return p.name
	case "const":
		return "(" + p.c.RatString() + ")"
	case "add":
		return "(" + p.a.String() + "+" + p.b.String() + ")"
	case "sub":
		return "(" + p.a.String() + "-" + p.b.String() + ")"
	case "mul":
		return "(" + p.a.String() + "*" + p.b.String() + ")"
	case "div":
		return "(" + p.a.String() + "/" + p.b.String() + ")"
	case "pow":
		return fmt.Sprintf("(%s^(%d))", p.a, p.n)
	case "neg":
		return "(-" + p.a.String() + ")"
	case "min", "max":
		return p.op + "(" + p.a.String() + "," + p.b.String() + ")"
	}
	return p.op + "(" + p.a.String() + ")"
}

// rational reports whether the tree has an exact rational evaluation.
func (p *pnode) rational() bool {
	switch p.op {
	case "exp", "sin", "cos", "atan":
		return false
	}
	return (p.a == nil || p.a.rational()) && (p.b == nil || p.b.rational())
}

// dual2 is a value with its exact gradient and Hessian.
type dual2 struct {
	v *big.Rat
	g []*big.Rat
	h [][]*big.Rat
}

func newDual2(nv int, v *big.Rat) dual2 {
	d := dual2{v: v, g: make([]*big.Rat, nv), h: make([][]*big.Rat, nv)}
	for i := range d.g {
		d.g[i] = new(big.Rat)
		d.h[i] = make([]*big.Rat, nv)
		for j := range d.h[i] {
			d.h[i][j] = new(big.Rat)
		}
	}
	return d
}

func rmul(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
func radd(a, b *big.Rat) *big.Rat { return new(big.Rat).Add(a, b) }

// ratPow returns s^n for an integer n (s ≠ 0 when n < 0).
func ratPow(s *big.Rat, n int) *big.Rat {
	if n < 0 {
		return new(big.Rat).Inv(ratPow(s, -n))
	}
	r := big.NewRat(1, 1)
	for i := 0; i < n; i++ {
		r = rmul(r, s)
	}
	return r
}

// chain returns f(u) from f(u₀), f′(u₀), f″(u₀) (exact chain rule).
func chain(u dual2, f0, f1, f2 *big.Rat) dual2 {
	nv := len(u.g)
	d := newDual2(nv, f0)
	for i := 0; i < nv; i++ {
		d.g[i] = rmul(f1, u.g[i])
		for j := 0; j < nv; j++ {
			d.h[i][j] = radd(rmul(f1, u.h[i][j]), rmul(f2, rmul(u.g[i], u.g[j])))
		}
	}
	return d
}

var errUndecided = fmt.Errorf("undefined or undecided at the point")

// exact evaluates p with its exact derivatives by vars at the rational
// point env (variables of env not in vars are held fixed).
func (p *pnode) exact(env map[string]*big.Rat, vars []string) (dual2, error) {
	nv := len(vars)
	switch p.op {
	case "var":
		d := newDual2(nv, env[p.name])
		for i, v := range vars {
			if v == p.name {
				d.g[i].SetInt64(1)
			}
		}
		return d, nil
	case "const":
		return newDual2(nv, p.c), nil
	}
	u, err := p.a.exact(env, vars)
	if err != nil {
		return u, err
	}
	var w dual2
	if p.b != nil {
		if w, err = p.b.exact(env, vars); err != nil {
			return w, err
		}
	}
	switch p.op {
	case "neg":
		return chain(u, new(big.Rat).Neg(u.v), big.NewRat(-1, 1), new(big.Rat)), nil
	case "abs":
		switch u.v.Sign() {
		case 1:
			return u, nil
		case -1:
			return chain(u, new(big.Rat).Neg(u.v), big.NewRat(-1, 1), new(big.Rat)), nil
		}
		return u, errUndecided
	case "min", "max":
		c := u.v.Cmp(w.v)
		if c == 0 {
			return u, errUndecided
		}
		if (c < 0) == (p.op == "min") {
			return u, nil
		}
		return w, nil
	case "pow":
		n := p.n
		if n == 0 {
			return newDual2(nv, big.NewRat(1, 1)), nil
		}
		if n < 0 && u.v.Sign() == 0 {
			return u, errUndecided
		}
		f1, f2 := new(big.Rat), new(big.Rat)
		if n != 0 {
			f1 = rmul(big.NewRat(int64(n), 1), ratPow(u.v, n-1))
		}
		if n != 0 && n != 1 {
			f2 = rmul(big.NewRat(int64(n)*int64(n-1), 1), ratPow(u.v, n-2))
		}
		return chain(u, ratPow(u.v, n), f1, f2), nil
	case "div":
		if w.v.Sign() == 0 {
			return u, errUndecided
		}
		inv := new(big.Rat).Inv(w.v)
		r := chain(w, inv, new(big.Rat).Neg(rmul(inv, inv)), rmul(big.NewRat(2, 1), rmul(inv, rmul(inv, inv))))
		w = r
		fallthrough
	case "mul":
		d := newDual2(nv, rmul(u.v, w.v))
		for i := 0; i < nv; i++ {
			d.g[i] = radd(rmul(u.g[i], w.v), rmul(u.v, w.g[i]))
			for j := 0; j < nv; j++ {
				s := radd(rmul(u.h[i][j], w.v), rmul(u.v, w.h[i][j]))
				s = radd(s, radd(rmul(u.g[i], w.g[j]), rmul(u.g[j], w.g[i])))
				d.h[i][j] = s
			}
		}
		return d, nil
	case "add", "sub":
		d := newDual2(nv, nil)
		add := func(a, b *big.Rat) *big.Rat {
			if p.op == "add" {
				return radd(a, b)
			}
			return new(big.Rat).Sub(a, b)
		}
		d.v = add(u.v, w.v)
		for i := 0; i < nv; i++ {
			d.g[i] = add(u.g[i], w.g[i])
			for j := 0; j < nv; j++ {
				d.h[i][j] = add(u.h[i][j], w.h[i][j])
			}
		}
		return d, nil
	}
	panic("exact: " + p.op)
}

// powGen draws random trees whose integer powers come from exps.
type powGen struct {
	rng   *rand.Rand
	names []string
	exps  []int
}

func (g *powGen) tree(depth int, rational bool) *pnode {
	if depth == 0 || g.rng.IntN(5) == 0 {
		if g.rng.IntN(4) == 0 {
			cs := []*big.Rat{big.NewRat(0, 1), big.NewRat(1, 1), big.NewRat(1, 3), big.NewRat(-5, 2), big.NewRat(7, 1)}
			return &pnode{op: "const", c: cs[g.rng.IntN(len(cs))]}
		}
		return &pnode{op: "var", name: g.names[g.rng.IntN(len(g.names))]}
	}
	ops := []string{"add", "sub", "mul", "pow", "pow", "pow", "pow", "neg", "div", "abs", "min", "max"}
	if !rational {
		ops = append(ops, "exp", "sin", "cos", "atan")
	}
	p := &pnode{op: ops[g.rng.IntN(len(ops))]}
	p.a = g.tree(depth-1, rational)
	switch p.op {
	case "pow":
		p.n = g.exps[g.rng.IntN(len(g.exps))]
		if p.a.op == "pow" && abs(p.n*p.a.n) > 30 {
			p.n = 2
		}
	case "add", "sub", "mul", "div", "min", "max":
		p.b = g.tree(depth-1, rational)
	}
	return p
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// powBox draws a box of one of several kinds: around 0, one-signed,
// tiny, a point, large.
func powBox(rng *rand.Rand) I {
	scale := []float64{1e-200, 1e-8, 0.25, 1, 3, 1e5, 1e60}[rng.IntN(7)]
	switch rng.IntN(5) {
	case 0: // symmetric around 0
		return I{Lo: -scale, Hi: scale}
	case 1: // contains 0, asymmetric
		return I{Lo: -scale * rng.Float64(), Hi: scale * rng.Float64()}
	case 2: // a point
		x := scale * (2*rng.Float64() - 1)
		return I{Lo: x, Hi: x}
	case 3: // tiny box around a nonzero point
		x := scale * (1 + rng.Float64())
		if rng.IntN(2) == 0 {
			x = -x
		}
		return I{Lo: x, Hi: x + math.Abs(x)*1e-9}
	}
	a, b := scale*(2*rng.Float64()-1), scale*(2*rng.Float64()-1)
	return I{Lo: math.Min(a, b), Hi: math.Max(a, b)}
}

// samplePoints returns the ends, the midpoint and random points of x.
func samplePoints(rng *rand.Rand, x I, k int) []float64 {
	ps := []float64{x.Lo, x.Hi, x.Mid()}
	if x.Contains(0) {
		ps = append(ps, 0)
	}
	for i := 0; i < k; i++ {
		ps = append(ps, x.Lo+(x.Hi-x.Lo)*rng.Float64())
	}
	for i, p := range ps {
		ps[i] = math.Max(x.Lo, math.Min(x.Hi, p))
	}
	return ps
}

// ratWithin reports whether the rational r lies in x.
func ratWithin(r *big.Rat, x I) bool {
	if !math.IsInf(x.Lo, -1) && r.Cmp(new(big.Rat).SetFloat64(x.Lo)) < 0 {
		return false
	}
	if !math.IsInf(x.Hi, 1) && r.Cmp(new(big.Rat).SetFloat64(x.Hi)) > 0 {
		return false
	}
	return true
}

// repeatedProductJets returns the derivative jets with integer powers by
// repeated multiplication, as models of values take them.
func repeatedProductJets(e *Expr, env map[string]I, vars []string, order int) ([]I, *layout, error) {
	l := getLayout(len(vars), order)
	jv := map[string][]I{}
	for name, val := range env {
		j := make([]I, l.m)
		j[0] = val
		jv[name] = j
	}
	for i, name := range vars {
		jv[name][l.off[1]+i] = interval.Point(1)
	}
	h, err := newJetEval(l, jv).eval(e.root)
	return h, l, err
}

// hessianEntry returns the Hessian entry (i, j) of the jet h of order 2.
func hessianEntry(h []I, l *layout, i, j int) I {
	ex := make([]int, l.nv)
	ex[i]++
	ex[j]++
	c := h[l.index[key(ex)]]
	if i == j {
		c = c.MulF(2)
	}
	return c
}

// checkPowerDerivatives checks Gradient and Hessian of one tree on one box
// at sample points; it returns the number of points checked exactly and
// against point enclosures.
func checkPowerDerivatives(t *testing.T, rng *rand.Rand, p *pnode, env map[string]I, vars []string, k int) (nExact, nPoint int) {
	t.Helper()
	src := p.String()
	e, err := Parse(src)
	if err != nil {
		t.Fatalf("%s: %v", src, err)
	}
	hess, herr := e.Hessian(env, vars)
	grad, gerr := e.Gradient(env, vars)
	if herr != nil && gerr != nil {
		return 0, 0
	}
	names := make([]string, 0, len(env))
	for name := range env {
		names = append(names, name)
	}
	pts := map[string][]float64{}
	for _, name := range names {
		pts[name] = samplePoints(rng, env[name], k)
	}
	rational := p.rational()
	for s := 0; s < k+3; s++ {
		penv := map[string]I{}
		renv := map[string]*big.Rat{}
		for _, name := range names {
			ps := pts[name]
			x := ps[(s*7+len(name))%len(ps)]
			if s >= 3 {
				x = ps[rng.IntN(len(ps))]
			}
			penv[name] = interval.Point(x)
			renv[name] = new(big.Rat).SetFloat64(x)
		}
		where := fmt.Sprintf("%s on %v at %v", src, env, penv)
		if rational {
			d, err := p.exact(renv, vars)
			if err == nil {
				nExact++
				for i := range vars {
					if gerr == nil && !ratWithin(d.g[i], grad[i]) {
						t.Errorf("%s: gradient[%d] = %v misses the exact %s", where, i, grad[i], d.g[i].FloatString(20))
					}
					for j := range vars {
						if herr == nil && !ratWithin(d.h[i][j], hess[i][j]) {
							t.Errorf("%s: Hessian[%d][%d] = %v misses the exact %s", where, i, j, hess[i][j], d.h[i][j].FloatString(20))
						}
					}
				}
			}
		}
		h, l, err := repeatedProductJets(e, penv, vars, 2)
		if err != nil {
			continue
		}
		nPoint++
		for i := range vars {
			if gerr == nil {
				if ref := h[l.off[1]+i]; !meets(ref, grad[i]) {
					t.Errorf("%s: gradient[%d] = %v misses the point enclosure %v", where, i, grad[i], ref)
				}
			}
			for j := range vars {
				if herr == nil {
					if ref := hessianEntry(h, l, i, j); !meets(ref, hess[i][j]) {
						t.Errorf("%s: Hessian[%d][%d] = %v misses the point enclosure %v", where, i, j, hess[i][j], ref)
					}
				}
			}
		}
	}
	return nExact, nPoint
}

func meets(a, b I) bool { return a.Lo <= b.Hi && b.Lo <= a.Hi }

// TestDerivativesOfIntegerPowersContainExact: random trees with integer
// powers 0…7, 25 and −1…−3 of sums, products, quotients, compositions and
// decided branches of abs, min, max, in one to three differentiated
// variables (plus a variable held fixed), on boxes around 0, one-signed,
// tiny, points and large (up to overflow of the powers).
func TestDerivativesOfIntegerPowersContainExact(t *testing.T) {
	trees := 400
	if os.Getenv("GAPCERT_LONG") != "" {
		trees = 20000
	}
	rng := rand.New(rand.NewPCG(2026, 12))
	all := []string{"x", "y", "z"}
	var nTrees, nExact, nPoint int
	for trial := 0; trial < trees; trial++ {
		nv := 1 + trial%3
		vars := all[:nv]
		names := append([]string{"w"}, vars...)
		g := &powGen{rng: rng, names: names, exps: []int{0, 1, 2, 2, 3, 4, 4, 6, 7, 25, -1, -2, -3}}
		p := g.tree(4, trial%2 == 0)
		env := map[string]I{"w": powBox(rng)}
		for _, v := range vars {
			env[v] = powBox(rng)
		}
		a, b := checkPowerDerivatives(t, rng, p, env, vars, 6)
		if a+b > 0 {
			nTrees++
		}
		nExact += a
		nPoint += b
		if t.Failed() {
			return
		}
	}
	t.Logf("%d trees with derivatives, %d points checked exactly, %d against point enclosures", nTrees, nExact, nPoint)
	if nTrees < trees/4 || nExact < trees/2 {
		t.Errorf("too few checks: %d trees, %d exact points", nTrees, nExact)
	}
}

// TestDerivativesOfNamedPowersContainExact: powers of sums, products,
// compositions and nested powers, each on boxes around 0 and off 0.
func TestDerivativesOfNamedPowersContainExact(t *testing.T) {
	x, y := &pnode{op: "var", name: "x"}, &pnode{op: "var", name: "y"}
	third := &pnode{op: "const", c: big.NewRat(1, 3)}
	one := &pnode{op: "const", c: big.NewRat(1, 1)}
	pow := func(a *pnode, n int) *pnode { return &pnode{op: "pow", a: a, n: n} }
	op := func(o string, a, b *pnode) *pnode { return &pnode{op: o, a: a, b: b} }
	trees := []*pnode{
		pow(op("sub", op("mul", x, y), third), 4),             // (x*y−1/3)^4
		pow(&pnode{op: "exp", a: x}, 3),                       // exp(x)^3
		pow(op("add", &pnode{op: "sin", a: x}, y), 2),         // (sin(x)+y)^2
		pow(pow(x, 2), 2),                                     // (x^2)^2
		op("div", one, pow(op("add", pow(x, 2), one), 3)),     // 1/(x^2+1)^3
		pow(op("add", pow(x, 2), one), -3),                    // (x^2+1)^−3
		pow(&pnode{op: "abs", a: op("add", x, pow(y, 2))}, 3), // |x+y²|³
		pow(op("max", x, op("add", y, one)), 4),               // max(x, y+1)^4
		pow(op("min", op("mul", x, y), op("sub", x, one)), 7), // min(xy, x−1)^7
		pow(op("add", x, y), 25),                              // (x+y)^25
		pow(op("mul", x, y), 6),                               // (xy)^6
		op("sub", pow(x, 4), x),                               // x^4 − x
		op("add", pow(x, 4), pow(y, 6)),                       // x^4 + y^6
		pow(op("sub", pow(x, 3), y), 0),                       // (x³−y)^0
		pow(op("sub", pow(x, 3), y), 1),                       // (x³−y)^1
		pow(&pnode{op: "cos", a: op("mul", x, y)}, 4),         // cos(xy)^4
		pow(&pnode{op: "atan", a: pow(x, 2)}, 2),              // atan(x²)^2
		op("mul", pow(x, 2), pow(op("sub", y, third), -2)),    // x²/(y−1/3)²
		pow(op("div", x, op("add", pow(y, 2), one)), 4),       // (x/(y²+1))^4
		pow(pow(op("sub", x, y), 3), 2),                       // ((x−y)^3)^2
	}
	boxes := [][2]I{
		{{Lo: -1, Hi: 1}, {Lo: -1, Hi: 1}},
		{{Lo: -0.5, Hi: 0.25}, {Lo: 0.5, Hi: 2}},
		{{Lo: -1e-9, Hi: 1e-9}, {Lo: -3, Hi: -2}},
		{{Lo: 0, Hi: 0}, {Lo: 0, Hi: 0}},
		{{Lo: 1e20, Hi: 1e20 * (1 + 1e-12)}, {Lo: -1e-30, Hi: 1e-30}},
		{{Lo: -1e150, Hi: 1e150}, {Lo: 2, Hi: 3}},
	}
	rng := rand.New(rand.NewPCG(7, 2026))
	var nExact, nPoint int
	for _, p := range trees {
		for _, bx := range boxes {
			for _, vars := range [][]string{{"x", "y"}, {"x"}, {"y"}} {
				a, b := checkPowerDerivatives(t, rng, p, map[string]I{"x": bx[0], "y": bx[1]}, vars, 10)
				nExact += a
				nPoint += b
			}
		}
	}
	t.Logf("%d points checked exactly, %d against point enclosures", nExact, nPoint)
	if nExact < 500 || nPoint < 500 {
		t.Errorf("too few checks: %d exact points, %d point enclosures", nExact, nPoint)
	}
}
