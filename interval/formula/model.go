package formula

import (
	"errors"
	"math"
	"math/big"

	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// Model1 is a univariate Taylor model of f over the segment from A to B:
// for every exact a ∈ A, b ∈ B and ξ ∈ [0, 1],
//
//	f(a + ξ(b − a)) ∈ Σ_k C[k] ξ^k + R.
type Model1 struct {
	C []interval.I
	R interval.I
}

// Model2 is a bivariate Taylor model of f over a triangle: for every exact
// vertex v_k ∈ V[k] and ξ, η ≥ 0 with ξ + η ≤ 1, with
// p = v0 + ξ(v1 − v0) + η(v2 − v0),
//
//	f(p) ∈ Σ_{i+j ≤ order} C[i][j] ξ^i η^j + R.
//
// C[i] has order + 1 − i entries.
type Model2 struct {
	C [][]interval.I
	R interval.I
}

// binomTable holds C(n, k) for n < 64 (exact float64 up to n = 56, tight
// enclosures above).
var binomTable = func() [][]interval.I {
	t := make([][]interval.I, 64)
	for n := range t {
		t[n] = make([]interval.I, n+1)
		for k := range t[n] {
			t[n][k] = decimalio.FromRat(new(big.Rat).SetInt(new(big.Int).Binomial(int64(n), int64(k))))
		}
	}
	return t
}()

// binomial returns an enclosure of the binomial coefficient C(n, k).
func binomial(n, k int) interval.I {
	if n < len(binomTable) {
		return binomTable[n][k]
	}
	return decimalio.FromRat(new(big.Rat).SetInt(new(big.Int).Binomial(int64(n), int64(k))))
}

// Model1 returns a Taylor model of order q ≥ 1 of e (variable x; every
// other free variable must have been bound) on the segment [A, B].
//
// With g(ξ) = f(a + ξ(b − a)), Taylor's theorem with the Lagrange
// remainder about ξc = 1/2 gives, for ξ ∈ [0, 1] and some ξ* between ξc
// and ξ,
//
//	g(ξ) = Σ_{k ≤ q} g_k(ξc) (ξ − ξc)^k + g_{q+1}(ξ*) (ξ − ξc)^{q+1},
//
// g_k = g^{(k)}/k!, valid when f is C^{q+1} on the segment. abs, min and
// max count as smooth on a box where their argument (difference) is ≥ 0
// or ≤ 0, touching 0 included (|x| on [−1, 0]): there f equals the smooth
// branch at every point, and the model is one of that branch; the centre
// jet still needs a strict sign, so both jets take the same branch. The g_k(ξc) are
// enclosed by an interval jet of x = (A + B)/2 + (B − A)t, which contains
// the jet of a + (ξc + t)(b − a) for every a ∈ A, b ∈ B; g_{q+1}(ξ*) by the
// jet of x = hull(A, B) + (B − A)t, whose constant term contains every
// point a + ξ*(b − a) of every such segment. The jet of the whole box
// succeeding proves f analytic there (see the jet recurrences). Then R =
// g_{q+1}-enclosure · [range of (ξ − 1/2)^{q+1} on [0, 1]], and the
// polynomial in ξ − 1/2 is rewritten in powers of ξ by the binomial
// theorem in interval arithmetic. If f is a polynomial of degree ≤ q the
// degree-(q+1) jet is exactly [0, 0] and so is R.
//
// References:
//
//	K. Makino and M. Berz, Taylor models and other validated functional
//	inclusion methods, Int. J. Pure Appl. Math. 4 (2003) 379–456.
func (e *Expr) Model1(a, b interval.I, order int) (Model1, error) {
	if order < 1 {
		panic("formula: Model1 order must be ≥ 1")
	}
	h := b.Sub(a)
	center, err := jet1(e, getLayout(1, order), a.Add(b).MulF(0.5), h, false)
	if err != nil {
		return Model1{}, err
	}
	whole, err := jet1(e, getLayout(1, order+1), a.Hull(b), h, true)
	if err != nil {
		return Model1{}, err
	}
	r := whole[order+1].Mul(interval.I{Lo: -0.5, Hi: 0.5}.PowInt(order + 1))
	m := Model1{C: make([]interval.I, order+1), R: r}
	for i := 0; i <= order; i++ {
		for k := i; k <= order; k++ {
			t := center[k].Mul(binomial(k, i)).MulF(math.Ldexp(1, -(k - i)))
			if (k-i)%2 == 1 {
				t = t.Neg()
			}
			m.C[i] = m.C[i].Add(t)
		}
	}
	return m, nil
}

func jet1(e *Expr, l *layout, x0, h interval.I, closed bool) ([]interval.I, error) {
	x := make([]interval.I, l.m)
	x[0], x[1] = x0, h
	c := newJetEval(l, map[string][]interval.I{"x": x})
	c.closed = closed
	return c.eval(e.root)
}

// Model2 returns a Taylor model of order q ≥ 1 of e (variables x, y; every
// other free variable must have been bound) on the triangle with vertex
// enclosures v.
//
// With g(ξ, η) = f(v0 + ξ(v1 − v0) + η(v2 − v0)) and the centre
// c = (ξc, ξc), ξc the float nearest 1/3, Taylor's theorem along the segment
// from c to z = (ξ, η) (inside the triangle, which is convex) with the
// Lagrange remainder gives
//
//	g(z) = Σ_{|α| ≤ q} g_α(c) (z − c)^α + Σ_{|α| = q+1} g_α(p*) (z − c)^α
//
// with g_α = ∂^α g/α! and p* on the segment, valid when f is C^{q+1} on
// the triangle. The g_α(c) come from a bivariate jet at the enclosed
// centre, whose linear terms v1 − v0, v2 − v0 contain those of every exact
// choice of vertices. The g_α(p*) for |α| = q+1 are enclosed by jets whose
// constant terms are the bounding box of the triangle, or, if that fails
// with a domain error, the hull over its midpoint subdivision (depth ≤ 8;
// ≤ maxKinkDepth for a kink of abs, min or max)
// as in RangeTriangle; the exact triangle lies in the union of the boxes.
// (z − c)^α is bounded by the interval powers of [−ξc, 1 − ξc]. The
// polynomial in z − c is rewritten in powers of ξ, η by the binomial
// theorem in interval arithmetic. A polynomial f of degree ≤ q gives R = 0.
// abs, min and max whose argument (difference) has one sign on T itself,
// zero included, by the affine forms of RangeTriangle, take that branch in
// every jet (kinkBranches: a kink along any edge of T, such as |x − y| on
// a triangle with an edge on y = x); the others are treated as in Model1
// on the first bounding box (a kink along an axis-parallel edge) and need
// a strict sign on sub-boxes.
func (e *Expr) Model2(v [3][2]interval.I, order int) (Model2, error) {
	if order < 1 {
		panic("formula: Model2 order must be ≥ 1")
	}
	const xc = 1.0 / 3
	d1 := [2]interval.I{v[1][0].Sub(v[0][0]), v[1][1].Sub(v[0][1])}
	d2 := [2]interval.I{v[2][0].Sub(v[0][0]), v[2][1].Sub(v[0][1])}
	var pc [2]interval.I
	for i := range pc {
		pc[i] = v[0][i].Add(d1[i].MulF(xc)).Add(d2[i].MulF(xc))
	}
	lc := getLayout(2, order)
	forced := kinkBranches(e, v)
	center, err := jet2(e, lc, pc, d1, d2, false, forced)
	if err != nil {
		return Model2{}, err
	}
	lr := getLayout(2, order+1)
	top, err := remainderJets(e, lr, v, d1, d2, maxDepth, forced)
	if err != nil {
		return Model2{}, err
	}
	s := interval.I{Lo: -xc, Hi: interval.SubUp(1, xc)}
	var r interval.I
	for i := lr.off[order+1]; i < lr.m; i++ {
		ex := lr.exps[i]
		r = r.Add(top[i-lr.off[order+1]].Mul(s.PowInt(ex[0]).Mul(s.PowInt(ex[1]))))
	}
	m := Model2{C: make([][]interval.I, order+1), R: r}
	for i := range m.C {
		m.C[i] = make([]interval.I, order+1-i)
	}
	nc := interval.Point(-xc)
	for idx, ex := range lc.exps {
		c := center[idx]
		if c.Lo == 0 && c.Hi == 0 {
			continue
		}
		i, j := ex[0], ex[1]
		// (ξ − ξc)^i (η − ξc)^j = Σ_a Σ_b C(i,a) C(j,b) ξ^a η^b (−ξc)^{i−a+j−b}
		for a := 0; a <= i; a++ {
			ca := c.Mul(binomial(i, a)).Mul(nc.PowInt(i - a))
			for b := 0; b <= j; b++ {
				m.C[a][b] = m.C[a][b].Add(ca.Mul(binomial(j, b)).Mul(nc.PowInt(j - b)))
			}
		}
	}
	return m, nil
}

func jet2(e *Expr, l *layout, p [2]interval.I, d1, d2 [2]interval.I, closed bool, forced map[*node]int) ([]interval.I, error) {
	x, y := make([]interval.I, l.m), make([]interval.I, l.m)
	x[0], x[1], x[2] = p[0], d1[0], d2[0]
	y[0], y[1], y[2] = p[1], d1[1], d2[1]
	c := newJetEval(l, map[string][]interval.I{"x": x, "y": y})
	c.closed, c.forced = closed, forced
	return c.eval(e.root)
}

// kinkBranches decides, for each abs, min and max node of e, the sign of
// its argument (or argument difference) on the triangle v itself, from
// the affine forms of RangeTriangle (valid for every exact choice of the
// vertices): 1 where it is ≥ 0 on T, −1 where ≤ 0. A kink along an edge
// of T that is not axis-parallel (|x − y| on a triangle with an edge on
// y = x) is decided here although the bounding box straddles it. Nodes
// whose sign is not decided, or whose forms fail, are left out.
func kinkBranches(e *Expr, v [3][2]interval.I) map[*node]int {
	var out map[*node]int
	var walk func(n *node)
	walk = func(n *node) {
		if n == nil || n.isC {
			return
		}
		walk(n.a)
		walk(n.b)
		if n.kind != kCall || (n.fn != fAbs && n.fn != fMin && n.fn != fMax) {
			return
		}
		c := &affEval{
			x: aff{c0: v[0][0], c1: v[1][0].Sub(v[0][0]), c2: v[2][0].Sub(v[0][0])},
			y: aff{c0: v[0][1], c1: v[1][1].Sub(v[0][1]), c2: v[2][1].Sub(v[0][1])},
		}
		a, boxA, err := c.eval(n.a)
		if err != nil {
			return
		}
		d, box := a, boxA
		if n.fn != fAbs {
			b, boxB, err := c.eval(n.b)
			if err != nil {
				return
			}
			d = aff{a.c0.Sub(b.c0), a.c1.Sub(b.c1), a.c2.Sub(b.c2), a.r.Sub(b.r)}
			box = boxA.Sub(boxB)
		}
		r, ok := box.Intersection(d.rng())
		if !ok {
			return
		}
		s := 0
		switch {
		case r.Lo >= 0:
			s = 1
		case r.Hi <= 0:
			s = -1
		default:
			return
		}
		if out == nil {
			out = map[*node]int{}
		}
		out[n] = s
	}
	walk(e.root)
	return out
}

// remainderJets returns enclosures of the top-degree jet coefficients over
// the triangle v (bounding box, else hull over midpoint subdivisions).
// Only the first box (depth maxDepth) uses the closed branch rule of abs,
// min and max: one box that decides a branch fixes it for all of T, while
// sub-boxes deciding closed branches separately could take different
// branches on the two sides of a kink inside T.
func remainderJets(e *Expr, l *layout, v [3][2]interval.I, d1, d2 [2]interval.I, depth int, forced map[*node]int) ([]interval.I, error) {
	box := bbox(v)
	h, err := jet2(e, l, [2]interval.I{box["x"], box["y"]}, d1, d2, depth == maxDepth, forced)
	if err == nil {
		return append([]interval.I(nil), h[l.off[l.q]:]...), nil
	}
	if depth == 0 || !isDomain(err) || (isKink(err) && depth <= maxDepth-maxKinkDepth) {
		return nil, err
	}
	var out []interval.I
	for _, t := range splitTriangle(v) {
		s, err := remainderJets(e, l, t, d1, d2, depth-1, forced)
		if err != nil {
			return nil, err
		}
		if out == nil {
			out = s
			continue
		}
		for i := range out {
			out[i] = out[i].Hull(s[i])
		}
	}
	return out, nil
}

// maxKinkDepth is the number of subdivisions remainderJets tries for a
// kink of abs, min or max (a box straddling the kink while T may not):
// a triangle with an edge on a kink that is not axis-parallel never
// succeeds, and deeper levels would only multiply the cost (2^depth boxes
// along the edge) before the caller falls back to another model.
const maxKinkDepth = 3

// isKink reports whether err is a *SmoothnessError of abs, min or max.
func isKink(err error) bool {
	var s *SmoothnessError
	return errors.As(err, &s) && (s.Func == "abs" || s.Func == "min" || s.Func == "max")
}

// Gradient returns enclosures of ∂f/∂v for v in vars over the box env
// (every free variable needs a value; those not in vars are held fixed),
// by forward-mode automatic differentiation in interval arithmetic (jets of
// order 1). Each entry contains the exact partial derivative at every
// point of the box. abs, min and max need a decided branch on the box and
// sqrt a box > 0, else a *SmoothnessError (wrapped in *EvalError) results.
func (e *Expr) Gradient(env map[string]interval.I, vars []string) ([]interval.I, error) {
	h, l, err := e.derivJets(env, vars, 1)
	if err != nil {
		return nil, err
	}
	g := make([]interval.I, len(vars))
	for i := range vars {
		g[i] = h[l.off[1]+i]
	}
	return g, nil
}

// Hessian returns enclosures of ∂²f/∂v_i∂v_j over the box env (see
// Gradient), from jets of order 2: the Hessian entry is α! times the jet
// coefficient of the monomial t_i t_j.
func (e *Expr) Hessian(env map[string]interval.I, vars []string) ([][]interval.I, error) {
	h, l, err := e.derivJets(env, vars, 2)
	if err != nil {
		return nil, err
	}
	n := len(vars)
	out := make([][]interval.I, n)
	ex := make([]int, n)
	for i := range out {
		out[i] = make([]interval.I, n)
		for j := range out[i] {
			for k := range ex {
				ex[k] = 0
			}
			ex[i]++
			ex[j]++
			c := h[l.index[key(ex)]]
			if i == j {
				c = c.MulF(2)
			}
			out[i][j] = c
		}
	}
	return out, nil
}

func (e *Expr) derivJets(env map[string]interval.I, vars []string, order int) ([]interval.I, *layout, error) {
	if len(vars) == 0 {
		panic("formula: no variables to differentiate by")
	}
	l := getLayout(len(vars), order)
	jv := map[string][]interval.I{}
	for name, val := range env {
		j := make([]interval.I, l.m)
		j[0] = val
		jv[name] = j
	}
	for i, name := range vars {
		j, ok := jv[name]
		if !ok {
			return nil, nil, &UnboundError{Name: name}
		}
		if j[l.off[1]+i] != (interval.I{}) {
			panic("formula: variable " + name + " listed twice")
		}
		j[l.off[1]+i] = interval.Point(1)
	}
	c := newJetEval(l, jv)
	c.derivatives = true
	h, err := c.eval(e.root)
	return h, l, err
}
