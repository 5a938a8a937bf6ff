package formula

import (
	"gapcert/interval"
)

// Model3 is a trivariate Taylor model of f over a tetrahedron: for every
// exact vertex v_k ∈ V[k] and ξ, η, ζ ≥ 0 with ξ + η + ζ ≤ 1, with
// p = v0 + ξ(v1 − v0) + η(v2 − v0) + ζ(v3 − v0),
//
//	f(p) ∈ Σ_{i+j+k ≤ order} C[i][j][k] ξ^i η^j ζ^k + R.
//
// C[i] has order + 1 − i entries and C[i][j] order + 1 − i − j.
type Model3 struct {
	C [][][]interval.I
	R interval.I
}

// Model3 returns a Taylor model of order q ≥ 1 of e (variables x, y, z;
// every other free variable must have been bound) on the tetrahedron with
// vertex enclosures v.
//
// With g(ξ, η, ζ) = f(v0 + ξ(v1 − v0) + η(v2 − v0) + ζ(v3 − v0)) and the
// centre c = (1/4, 1/4, 1/4), Taylor's theorem along the segment from c to
// z = (ξ, η, ζ) (inside the tetrahedron, which is convex) with the
// Lagrange remainder gives
//
//	g(z) = Σ_{|α| ≤ q} g_α(c) (z − c)^α + Σ_{|α| = q+1} g_α(p*) (z − c)^α
//
// with g_α = ∂^α g/α! and p* on the segment, valid when f is C^{q+1} on
// the tetrahedron (K. Makino and M. Berz, Taylor models and other
// validated functional inclusion methods, Int. J. Pure Appl. Math. 4
// (2003) 379–456). The g_α(c) come from a trivariate jet at the enclosed
// centre, whose linear terms v_k − v_0 contain those of every exact choice
// of vertices. The g_α(p*) for |α| = q+1 are enclosed by one jet whose
// constant terms are the bounding box of the tetrahedron (which contains
// every p*), with the closed branch rule of abs, min and max on that box
// (see Model1). An abs, min or max whose argument (difference) is affine
// in x, y, z takes, in every jet, the branch decided on the tetrahedron
// itself (kinkBranches3): a kink along a face of T that is not
// axis-parallel (|x − y| on a tetrahedron with a face on y = x). Each
// (z − c)^α is bounded by the interval powers of
// [−1/4, 3/4]. The polynomial in z − c is rewritten in powers of ξ, η, ζ
// by the binomial theorem in interval arithmetic. A polynomial f of
// degree ≤ q gives R = 0. Unlike Model2 there is no subdivision: a domain
// error on the bounding box (or a kink that the box does not decide, a
// *SmoothnessError) is returned.
func (e *Expr) Model3(v [4][3]interval.I, order int) (Model3, error) {
	if order < 1 {
		panic("formula: Model3 order must be ≥ 1")
	}
	const xc = 0.25
	var d [3][3]interval.I // d[k] = v[k+1] − v[0]
	for k := range d {
		for c := 0; c < 3; c++ {
			d[k][c] = v[k+1][c].Sub(v[0][c])
		}
	}
	var pc [3]interval.I
	for c := range pc {
		pc[c] = v[0][c].Add(d[0][c].MulF(xc)).Add(d[1][c].MulF(xc)).Add(d[2][c].MulF(xc))
	}
	lc := getLayout(3, order)
	forced := kinkBranches3(e, v)
	center, err := jet3(e, lc, pc, d, false, forced)
	if err != nil {
		return Model3{}, err
	}
	lr := getLayout(3, order+1)
	var box [3]interval.I
	for c := range box {
		box[c] = v[0][c].Hull(v[1][c]).Hull(v[2][c]).Hull(v[3][c])
	}
	top, err := jet3(e, lr, box, d, true, forced)
	if err != nil {
		return Model3{}, err
	}
	s := interval.I{Lo: -xc, Hi: 1 - xc}
	var r interval.I
	for i := lr.off[order+1]; i < lr.m; i++ {
		ex := lr.exps[i]
		r = r.Add(top[i].Mul(s.PowInt(ex[0]).Mul(s.PowInt(ex[1])).Mul(s.PowInt(ex[2]))))
	}
	m := Model3{C: make([][][]interval.I, order+1), R: r}
	for i := range m.C {
		m.C[i] = make([][]interval.I, order+1-i)
		for j := range m.C[i] {
			m.C[i][j] = make([]interval.I, order+1-i-j)
		}
	}
	nc := interval.Point(-xc)
	for idx, ex := range lc.exps {
		c := center[idx]
		if c.Lo == 0 && c.Hi == 0 {
			continue
		}
		i, j, k := ex[0], ex[1], ex[2]
		// (ξ − c)^i (η − c)^j (ζ − c)^k = Σ C(i,a) C(j,b) C(k,g) ξ^a η^b ζ^g (−c)^{i−a+j−b+k−g}
		for a := 0; a <= i; a++ {
			ca := c.Mul(binomial(i, a)).Mul(nc.PowInt(i - a))
			for b := 0; b <= j; b++ {
				cb := ca.Mul(binomial(j, b)).Mul(nc.PowInt(j - b))
				for g := 0; g <= k; g++ {
					m.C[a][b][g] = m.C[a][b][g].Add(cb.Mul(binomial(k, g)).Mul(nc.PowInt(k - g)))
				}
			}
		}
	}
	return m, nil
}

// jet3 evaluates e in jets of layout l with x, y, z = p + Σ_k d[k] t_k.
func jet3(e *Expr, l *layout, p [3]interval.I, d [3][3]interval.I, closed bool, forced map[*node]int) ([]interval.I, error) {
	vars := map[string][]interval.I{}
	for c, name := range [3]string{"x", "y", "z"} {
		h := make([]interval.I, l.m)
		h[0] = p[c]
		for k := 0; k < 3; k++ {
			e1 := []int{0, 0, 0}
			e1[k] = 1
			h[l.index[key(e1)]] = d[k][c]
		}
		vars[name] = h
	}
	c := newJetEval(l, vars)
	c.closed, c.forced = closed, forced
	return c.eval(e.root)
}

// kinkBranches3 decides, for each abs, min and max node of e whose
// argument (or both arguments) is affine in x, y, z (PolynomialDegree ≤ 1),
// the sign of the argument (difference) on the tetrahedron v: an affine
// function's range over a tetrahedron is the hull of its values at the
// vertices, enclosed by interval evaluation at the vertex enclosures. 1
// where it is ≥ 0 on T, −1 where ≤ 0; undecided nodes are left out.
func kinkBranches3(e *Expr, v [4][3]interval.I) map[*node]int {
	var out map[*node]int
	affine := func(n *node) bool {
		d, ok := degreeOf(n, []string{"x", "y", "z"})
		return ok && d <= 1
	}
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
		if !affine(n.a) || (n.fn != fAbs && !affine(n.b)) {
			return
		}
		var r interval.I
		for i, p := range v {
			env := map[string]interval.I{"x": p[0], "y": p[1], "z": p[2]}
			a, err := eval(n.a, env)
			if err != nil {
				return
			}
			if n.fn != fAbs {
				b, err := eval(n.b, env)
				if err != nil {
					return
				}
				a = a.Sub(b)
			}
			if i == 0 {
				r = a
			} else {
				r = r.Hull(a)
			}
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

// RangeTetrahedron returns an enclosure of e over the tetrahedron with
// vertex enclosures v (variables x, y, z), by interval evaluation over its
// bounding box, which contains the tetrahedron of every exact choice of
// vertices. Domain errors on the box are returned.
func (e *Expr) RangeTetrahedron(v [4][3]interval.I) (interval.I, error) {
	env := map[string]interval.I{}
	for c, name := range [3]string{"x", "y", "z"} {
		env[name] = v[0][c].Hull(v[1][c]).Hull(v[2][c]).Hull(v[3][c])
	}
	return e.Eval(env)
}
