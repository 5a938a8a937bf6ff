package tri

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// Exact rational bivariate polynomials Σ c[(a, b)] x^a y^b, integrated
// over triangles by iterated integration (vertical slices), independent
// of the barycentric calculus under test.
type rpoly map[[2]int]*big.Rat

func rconst(r *big.Rat) rpoly { return rpoly{{0, 0}: new(big.Rat).Set(r)} }

func (p rpoly) add(q rpoly, s *big.Rat) rpoly { // p + s·q
	out := rpoly{}
	for k, v := range p {
		out[k] = new(big.Rat).Set(v)
	}
	for k, v := range q {
		if out[k] == nil {
			out[k] = new(big.Rat)
		}
		out[k].Add(out[k], new(big.Rat).Mul(s, v))
	}
	return out
}

func (p rpoly) mul(q rpoly) rpoly {
	out := rpoly{}
	for a, x := range p {
		for b, y := range q {
			k := [2]int{a[0] + b[0], a[1] + b[1]}
			if out[k] == nil {
				out[k] = new(big.Rat)
			}
			out[k].Add(out[k], new(big.Rat).Mul(x, y))
		}
	}
	return out
}

func (p rpoly) deriv(v int) rpoly {
	out := rpoly{}
	for k, c := range p {
		if k[v] == 0 {
			continue
		}
		e := k
		e[v]--
		out[e] = new(big.Rat).Mul(c, big.NewRat(int64(k[v]), 1))
	}
	return out
}

// onLine returns the univariate polynomial t ↦ p(x0 + mx·t, y0 + my·t).
func (p rpoly) onLine(x0, mx, y0, my *big.Rat) []*big.Rat {
	lx := []*big.Rat{x0, mx}
	ly := []*big.Rat{y0, my}
	out := []*big.Rat{new(big.Rat)}
	for k, c := range p {
		term := []*big.Rat{new(big.Rat).Set(c)}
		for i := 0; i < k[0]; i++ {
			term = umul(term, lx)
		}
		for i := 0; i < k[1]; i++ {
			term = umul(term, ly)
		}
		out = uadd(out, term)
	}
	return out
}

func umul(a, b []*big.Rat) []*big.Rat {
	out := make([]*big.Rat, len(a)+len(b)-1)
	for i := range out {
		out[i] = new(big.Rat)
	}
	for i := range a {
		for j := range b {
			out[i+j].Add(out[i+j], new(big.Rat).Mul(a[i], b[j]))
		}
	}
	return out
}

func uadd(a, b []*big.Rat) []*big.Rat {
	if len(a) < len(b) {
		a, b = b, a
	}
	out := make([]*big.Rat, len(a))
	for i := range a {
		out[i] = new(big.Rat).Set(a[i])
		if i < len(b) {
			out[i].Add(out[i], b[i])
		}
	}
	return out
}

// uint returns ∫_l^r Σ c_k t^k dt.
func uint(c []*big.Rat, l, r *big.Rat) *big.Rat {
	s := new(big.Rat)
	pl, pr := new(big.Rat).Set(l), new(big.Rat).Set(r)
	for k, ck := range c {
		d := new(big.Rat).Sub(pr, pl)
		s.Add(s, d.Mul(d, ck).Quo(d, big.NewRat(int64(k+1), 1)))
		pl.Mul(pl, l)
		pr.Mul(pr, r)
	}
	return s
}

// integrateTriangle returns ∫_T p for the triangle with rational vertices,
// slicing at the vertex abscissae: on a slice [x_l, x_r] the region is
// between two lines y = m x + q, and ∫ p dy is the antiderivative in y
// evaluated on them.
func integrateTriangle(p rpoly, v [3][2]*big.Rat) *big.Rat {
	for i := 0; i < 3; i++ { // sort by x
		for j := i + 1; j < 3; j++ {
			if v[j][0].Cmp(v[i][0]) < 0 {
				v[i], v[j] = v[j], v[i]
			}
		}
	}
	anti := rpoly{}
	for k, c := range p {
		anti[[2]int{k[0], k[1] + 1}] = new(big.Rat).Quo(c, big.NewRat(int64(k[1]+1), 1))
	}
	line := func(a, b [2]*big.Rat) (m, q *big.Rat) {
		m = new(big.Rat).Quo(new(big.Rat).Sub(b[1], a[1]), new(big.Rat).Sub(b[0], a[0]))
		q = new(big.Rat).Sub(a[1], new(big.Rat).Mul(m, a[0]))
		return m, q
	}
	zero, one := new(big.Rat), big.NewRat(1, 1)
	total := new(big.Rat)
	slab := func(xl, xr *big.Rat, l1, l2 [2][2]*big.Rat) {
		if xl.Cmp(xr) == 0 {
			return
		}
		m1, q1 := line(l1[0], l1[1])
		m2, q2 := line(l2[0], l2[1])
		// G(x) = F(x, m2 x + q2) − F(x, m1 x + q1), with x as the line parameter.
		g := uadd(anti.onLine(zero, one, q2, m2), negate(anti.onLine(zero, one, q1, m1)))
		val := uint(g, xl, xr)
		mid := new(big.Rat).Quo(new(big.Rat).Add(xl, xr), big.NewRat(2, 1))
		y1 := new(big.Rat).Add(new(big.Rat).Mul(m1, mid), q1)
		y2 := new(big.Rat).Add(new(big.Rat).Mul(m2, mid), q2)
		if y2.Cmp(y1) < 0 {
			val.Neg(val)
		}
		total.Add(total, val)
	}
	a, b, c := v[0], v[1], v[2]
	slab(a[0], b[0], [2][2]*big.Rat{a, c}, [2][2]*big.Rat{a, b})
	slab(b[0], c[0], [2][2]*big.Rat{a, c}, [2][2]*big.Rat{b, c})
	return total
}

func negate(a []*big.Rat) []*big.Rat {
	out := make([]*big.Rat, len(a))
	for i := range a {
		out[i] = new(big.Rat).Neg(a[i])
	}
	return out
}

func ratOf(x interval.I) *big.Rat {
	if !x.IsPoint() {
		panic("test: node not exact")
	}
	return new(big.Rat).SetFloat64(x.Lo)
}

func ratIn(r *big.Rat, x interval.I) bool {
	return new(big.Rat).SetFloat64(x.Lo).Cmp(r) <= 0 && r.Cmp(new(big.Rat).SetFloat64(x.Hi)) <= 0
}

// RitzMatrices contain the exact forms, computed independently in math/big
// from the monomial expansion of every function on every triangle and
// iterated integration, for a mesh with exact dyadic nodes, integer
// coefficient vectors, an exact polynomial potential, a shift and mixed
// Dirichlet/Robin/Neumann sides; and they are narrow.
func TestRitzMatricesContainExactForms(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	bc := []boundary.Condition{dirichlet, robin(interval.Point(1.5)), neumann, robin(interval.Point(0.25))}
	alpha := []*big.Rat{nil, big.NewRat(3, 2), nil, big.NewRat(1, 4)}
	checkRitzExact(t, unitSquare(t, 1), bc, alpha, []int{1, 2, 3, 4}, rng)
}

// checkRitzExact compares RitzMatrices of three random integer vectors
// (V = xy + 2 − x²/4, γ = 1/2) with the exact forms; the mesh nodes must be
// exact floats and the Robin sides (alpha[side] ≠ nil) axis-parallel.
func checkRitzExact(t *testing.T, m *mesh.Mesh, bc []boundary.Condition, alpha []*big.Rat, degrees []int, rng *rand.Rand) {
	t.Helper()
	vPoly := rpoly{{1, 1}: big.NewRat(1, 1), {0, 0}: big.NewRat(2, 1), {2, 0}: big.NewRat(-1, 4)} // xy + 2 − x²/4
	gamma := big.NewRat(1, 2)
	for _, p := range degrees {
		s := NewLagrange(m, p, bc)
		v := mustPotential(t, m, "x*y + 2 - x^2/4", 1)
		vecs := make([][]float64, 3)
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for j := range vecs[i] {
				vecs[i][j] = float64(rng.IntN(7) - 3)
			}
		}
		a0, a1, err := s.RitzMatrices(vecs, v, interval.Point(0.5))
		if err != nil {
			t.Fatal(err)
		}
		ix := multiIndex(p)
		// u_i on each triangle as exact polynomials in x, y.
		local := func(tr int, x []float64) rpoly {
			vt := m.Vertices(tr)
			var P [3][2]*big.Rat
			for i := range P {
				P[i] = [2]*big.Rat{ratOf(vt[i][0]), ratOf(vt[i][1])}
			}
			d1x, d1y := new(big.Rat).Sub(P[1][0], P[0][0]), new(big.Rat).Sub(P[1][1], P[0][1])
			d2x, d2y := new(big.Rat).Sub(P[2][0], P[0][0]), new(big.Rat).Sub(P[2][1], P[0][1])
			det := new(big.Rat).Sub(new(big.Rat).Mul(d1x, d2y), new(big.Rat).Mul(d2x, d1y))
			// λ1 = ((x − x0) d2y − (y − y0) d2x)/det, λ2 = (d1x (y − y0) − d1y (x − x0))/det
			rel := func(cx, cy *big.Rat) rpoly { // (cx (x − x0) + cy (y − y0))/det
				ax, ay := new(big.Rat).Quo(cx, det), new(big.Rat).Quo(cy, det)
				c0 := new(big.Rat).Neg(new(big.Rat).Add(new(big.Rat).Mul(ax, P[0][0]), new(big.Rat).Mul(ay, P[0][1])))
				return rpoly{{1, 0}: ax, {0, 1}: ay, {0, 0}: c0}
			}
			l1 := rel(d2y, new(big.Rat).Neg(d2x))
			l2 := rel(new(big.Rat).Neg(d1y), d1x)
			l0 := rconst(big.NewRat(1, 1)).add(l1, big.NewRat(-1, 1)).add(l2, big.NewRat(-1, 1))
			lam := [3]rpoly{l0, l1, l2}
			u := rpoly{}
			for r, al := range ix.alpha {
				g := s.LocalDofs(tr)[r]
				if g < 0 || x[g] == 0 {
					continue
				}
				term := rconst(new(big.Rat).SetInt(multinom(al)))
				for i := 0; i < 3; i++ {
					for k := 0; k < al[i]; k++ {
						term = term.mul(lam[i])
					}
				}
				u = u.add(term, new(big.Rat).SetFloat64(x[g]))
			}
			return u
		}
		for i := range vecs {
			for j := 0; j <= i; j++ {
				ea, eb := new(big.Rat), new(big.Rat)
				for tr := range m.Tris {
					ui, uj := local(tr, vecs[i]), local(tr, vecs[j])
					vt := m.Vertices(tr)
					var P [3][2]*big.Rat
					for k := range P {
						P[k] = [2]*big.Rat{ratOf(vt[k][0]), ratOf(vt[k][1])}
					}
					uu := ui.mul(uj)
					eb.Add(eb, integrateTriangle(uu, P))
					grad := ui.deriv(0).mul(uj.deriv(0)).add(ui.deriv(1).mul(uj.deriv(1)), big.NewRat(1, 1))
					pot := vPoly.add(rconst(gamma), big.NewRat(1, 1)).mul(uu)
					ea.Add(ea, integrateTriangle(grad.add(pot, big.NewRat(1, 1)), P))
				}
				for _, be := range m.Bnd {
					if alpha[be.Side] == nil {
						continue
					}
					// the triangle holding the edge, and ∫_e u_i u_j = |e| ∫_0^1 (u_i u_j)(A + t(B − A)) dt
					for tr, tri := range m.Tris {
						for k := 0; k < 3; k++ {
							if tri[(k+1)%3] != be.A || tri[(k+2)%3] != be.B {
								continue
							}
							A, B := m.Nodes[be.A], m.Nodes[be.B]
							ax, ay := ratOf(A[0]), ratOf(A[1])
							dx, dy := new(big.Rat).Sub(ratOf(B[0]), ax), new(big.Rat).Sub(ratOf(B[1]), ay)
							length := new(big.Rat).Add(new(big.Rat).Abs(dx), new(big.Rat).Abs(dy)) // axis-parallel edge
							prod := local(tr, vecs[i]).mul(local(tr, vecs[j]))
							val := uint(prod.onLine(ax, dx, ay, dy), new(big.Rat), big.NewRat(1, 1))
							ea.Add(ea, val.Mul(val, length).Mul(val, alpha[be.Side]))
						}
					}
				}
				// width relative to √(a_ii a_jj), the scale of the entry's terms
				scale0 := 1 + math.Sqrt(a0.At(i, i).Mag()*a0.At(j, j).Mag())
				scale1 := 1 + math.Sqrt(a1.At(i, i).Mag()*a1.At(j, j).Mag())
				if g := a0.At(i, j); !ratIn(ea, g) || g.Wid() > 1e-13*scale0 {
					f, _ := ea.Float64()
					t.Errorf("p=%d a0(%d,%d) = %v, exact %.17g", p, i, j, g, f)
				}
				if g := a1.At(i, j); !ratIn(eb, g) || g.Wid() > 1e-13*scale1 {
					f, _ := eb.Float64()
					t.Errorf("p=%d a1(%d,%d) = %v, exact %.17g", p, i, j, g, f)
				}
			}
		}
	}
}
