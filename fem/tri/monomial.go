package tri

import (
	"math"
	"math/big"

	"gapcert/interval"
)

// Monomials returns interval coefficients c[a][b] (a + b ≤ p) of the
// function with coefficients vec on triangle t, written as a polynomial in
// d = (x − x0[0], y − x0[1]) about the centre x0:
//
//	u(x0 + d) = Σ_a Σ_b c[a][b]·d_x^a·d_y^b   on triangle t,
//
// such that, for every choice of exact vertices inside the mesh's vertex
// enclosures, the exact coefficients of that polynomial lie in the
// enclosures c[a][b]. ok is false (and c nil) when the signed area of the
// triangle is not certified nonzero.
//
// Derivation. With the vertices v_0, v_1, v_2, cross(p, q) = p_x q_y −
// p_y q_x and D = cross(v_1 − v_0, v_2 − v_0) ≠ 0, the barycentric
// coordinates are, for (i, j, k) a cyclic permutation of (0, 1, 2) and
// e_i = v_k − v_j,
//
//	λ_i(x) = cross(e_i, x − v_j)/D
//	       = cross(e_i, x0 − v_j)/D + d_x·(−e_{i,y}/D) + d_y·(e_{i,x}/D),
//
// (λ_i(v_i) = 1: cross(v_k − v_j, v_i − v_j) = D for each cyclic (i, j, k);
// λ_i vanishes on the side through v_j and v_k), and on t
//
//	u = Σ_α u_α·(|α|!/(α_0! α_1! α_2!))·λ_0^α_0 λ_1^α_1 λ_2^α_2
//
// (the Bernstein basis of Lagrange, removed coefficients 0). Every
// coefficient is the exact result of these additions and multiplications
// of the vertex coordinates, x0 and vec; each operation is enclosed in
// outward rounded interval arithmetic, so the enclosure holds for every
// exact vertex in the enclosures.
//
// It panics if len(vec) ≠ N(), t is not a triangle of the mesh, or x0 is
// not finite.
func (s *Lagrange) Monomials(vec []float64, t int, x0 [2]float64) (c [][]interval.I, ok bool) {
	if len(vec) != s.n {
		panic("tri: the coefficient vector does not match the space")
	}
	if t < 0 || t >= len(s.mesh.Tris) {
		panic("tri: no such triangle")
	}
	centre := [2]interval.I{interval.Point(x0[0]), interval.Point(x0[1])}
	if !centre[0].IsBounded() || !centre[1].IsBounded() {
		panic("tri: the centre must be finite")
	}
	v := s.mesh.Vertices(t)
	cross := func(p, q [2]interval.I) interval.I { return p[0].Mul(q[1]).Sub(p[1].Mul(q[0])) }
	sub := func(p, q [2]interval.I) [2]interval.I { return [2]interval.I{p[0].Sub(q[0]), p[1].Sub(q[1])} }
	det := cross(sub(v[1], v[0]), sub(v[2], v[0]))
	if !det.Positive() && !det.Negative() {
		return nil, false
	}
	p := s.p
	// pow[i][k] = λ_i^k as a polynomial in d.
	var pow [3][][][]interval.I
	for i := range 3 {
		j, k := (i+1)%3, (i+2)%3
		e := sub(v[k], v[j])
		lam := [][]interval.I{
			{cross(e, sub(centre, v[j])).Div(det), e[0].Div(det)},
			{e[1].Neg().Div(det)},
		}
		pow[i] = make([][][]interval.I, p+1)
		pow[i][0] = [][]interval.I{{interval.Point(1)}}
		for n := 1; n <= p; n++ {
			pow[i][n] = mulMonomials(pow[i][n-1], lam)
		}
	}
	c = make([][]interval.I, p+1)
	for a := range c {
		c[a] = make([]interval.I, p+1-a)
	}
	ix := multiIndex(p)
	for l, al := range ix.alpha {
		g := s.dofs[t][l]
		if g < 0 || vec[g] == 0 {
			continue
		}
		w := interval.Point(vec[g]).Mul(bigInterval(multinom(al)))
		term := mulMonomials(mulMonomials(pow[0][al[0]], pow[1][al[1]]), pow[2][al[2]])
		for a, row := range term {
			for b, x := range row {
				c[a][b] = c[a][b].Add(w.Mul(x))
			}
		}
	}
	return c, true
}

// mulMonomials returns an enclosure of the product of two polynomials given
// by interval coefficients f[a][b] of d_x^a d_y^b (triangular arrays:
// len(f[a]) = len(f) − a).
func mulMonomials(f, g [][]interval.I) [][]interval.I {
	n := len(f) + len(g) - 1
	out := make([][]interval.I, n)
	for a := range out {
		out[a] = make([]interval.I, n-a)
	}
	for a, fr := range f {
		for b, fx := range fr {
			for c, gr := range g {
				for d, gx := range gr {
					out[a+c][b+d] = out[a+c][b+d].Add(fx.Mul(gx))
				}
			}
		}
	}
	return out
}

// bigInterval encloses the integer n (exactly when it has at most 53
// significant bits, else by the two neighbouring floats).
func bigInterval(n *big.Int) interval.I {
	f := new(big.Float).SetInt(n)
	x, acc := f.Float64()
	switch acc {
	case big.Below:
		return interval.New(x, math.Nextafter(x, math.Inf(1)))
	case big.Above:
		return interval.New(math.Nextafter(x, math.Inf(-1)), x)
	}
	return interval.Point(x)
}
