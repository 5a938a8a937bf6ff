package tri

import (
	"math"
	"math/big"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// solveRat returns X with A X = I by Gauss–Jordan elimination in math/big.
func solveRat(a [][]*big.Rat) [][]*big.Rat {
	n := len(a)
	w := make([][]*big.Rat, n)
	for i := range w {
		w[i] = make([]*big.Rat, 2*n)
		for j := 0; j < n; j++ {
			w[i][j] = new(big.Rat).Set(a[i][j])
			w[i][n+j] = new(big.Rat)
		}
		w[i][n+i].SetInt64(1)
	}
	for c := 0; c < n; c++ {
		p := c
		for w[p][c].Sign() == 0 {
			p++
		}
		w[c], w[p] = w[p], w[c]
		inv := new(big.Rat).Inv(w[c][c])
		for k := range w[c] {
			w[c][k].Mul(w[c][k], inv)
		}
		for r := 0; r < n; r++ {
			if r != c && w[r][c].Sign() != 0 {
				f := new(big.Rat).Set(w[r][c])
				for k := range w[r] {
					w[r][k].Sub(w[r][k], new(big.Rat).Mul(f, w[c][k]))
				}
			}
		}
	}
	x := make([][]*big.Rat, n)
	for i := range x {
		x[i] = w[i][n:]
	}
	return x
}

// Projection.Matrices contain the exact matrices of a_h and b computed in
// math/big from an independent local basis: the dual basis of {1, x, y}
// (CR) or {1, x, y, x² + y²} (ECR) for the exact edge means and element
// mean, integrated by iterated integration, on a refined trapezoid with
// dyadic nodes and mixed sides; c_T is the code's (documented) choice,
// the lower end of Range_T(V) + γ (for CR its minimum over T).
func TestProjectionMatricesContainExact(t *testing.T) {
	m0, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(3, 0), pt(2, 1), pt(1, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		t.Fatal(err)
	}
	m := m0.Refine()
	bc := []boundary.Condition{robin(interval.Point(1.5)), dirichlet, robin(interval.Point(0.25)), neumann}
	alpha := []*big.Rat{big.NewRat(3, 2), nil, big.NewRat(1, 4), nil}
	v := mustPotential(t, m, "x*y + 1", 1)
	gamma := interval.Point(0.5)
	one := big.NewRat(1, 1)
	for _, enriched := range []bool{false, true} {
		s := newProjection(m, bc, enriched)
		k, mass, _, err := s.Matrices(v, gamma)
		if err != nil {
			t.Fatal(err)
		}
		n := s.N()
		ek, em := make([][]*big.Rat, n), make([][]*big.Rat, n)
		for i := range ek {
			ek[i], em[i] = make([]*big.Rat, n), make([]*big.Rat, n)
			for j := range ek[i] {
				ek[i][j], em[i][j] = new(big.Rat), new(big.Rat)
			}
		}
		cmin := math.Inf(1)
		for tr := range m.Tris {
			cmin = math.Min(cmin, v.Range(tr).Add(gamma).Lo)
		}
		monos := []rpoly{{{0, 0}: one}, {{1, 0}: one}, {{0, 1}: one}, {{2, 0}: one, {0, 2}: one}}
		nl := 3
		if enriched {
			nl = 4
		}
		for tr := range m.Tris {
			vt := m.Vertices(tr)
			var P [3][2]*big.Rat
			for i := range P {
				P[i] = [2]*big.Rat{ratOf(vt[i][0]), ratOf(vt[i][1])}
			}
			area := integrateTriangle(rpoly{{0, 0}: one}, P)
			edgeMean := func(f rpoly, i int) *big.Rat {
				a, b := P[(i+1)%3], P[(i+2)%3]
				return uint(f.onLine(a[0], new(big.Rat).Sub(b[0], a[0]), a[1], new(big.Rat).Sub(b[1], a[1])), new(big.Rat), one)
			}
			dm := make([][]*big.Rat, nl)
			for d := 0; d < nl; d++ {
				dm[d] = make([]*big.Rat, nl)
				for c := 0; c < nl; c++ {
					if d < 3 {
						dm[d][c] = edgeMean(monos[c], d)
					} else {
						dm[d][c] = new(big.Rat).Quo(integrateTriangle(monos[c], P), area)
					}
				}
			}
			inv := solveRat(dm)
			basis := make([]rpoly, nl)
			for i := range basis {
				basis[i] = rpoly{}
				for c := 0; c < nl; c++ {
					basis[i] = basis[i].add(monos[c], inv[c][i])
				}
			}
			d := s.localDofs(tr)
			cT := new(big.Rat).SetFloat64(v.Range(tr).Add(gamma).Lo)
			for i := 0; i < nl; i++ {
				for j := 0; j < nl; j++ {
					if d[i] < 0 || d[j] < 0 {
						continue
					}
					g := basis[i].deriv(0).mul(basis[j].deriv(0)).add(basis[i].deriv(1).mul(basis[j].deriv(1)), one)
					mij := integrateTriangle(basis[i].mul(basis[j]), P)
					ek[d[i]][d[j]].Add(ek[d[i]][d[j]], integrateTriangle(g, P))
					em[d[i]][d[j]].Add(em[d[i]][d[j]], mij)
					switch {
					case !enriched:
						ek[d[i]][d[j]].Add(ek[d[i]][d[j]], new(big.Rat).Mul(new(big.Rat).SetFloat64(cmin), mij))
					case i == 3 && j == 3:
						ek[d[i]][d[j]].Add(ek[d[i]][d[j]], new(big.Rat).Mul(cT, area))
					}
				}
			}
		}
		// Robin sides are horizontal here: |e| = |dx|, and α_e|e| m_e(u)m_e(v)
		// is α|e| on the edge-mean DOF.
		for _, be := range m.Bnd {
			if alpha[be.Side] == nil {
				continue
			}
			A, B := m.Nodes[be.A], m.Nodes[be.B]
			length := new(big.Rat).Abs(new(big.Rat).Sub(ratOf(B[0]), ratOf(A[0])))
			for tr, tri := range m.Tris {
				for i := 0; i < 3; i++ {
					if tri[(i+1)%3] == be.A && tri[(i+2)%3] == be.B {
						dof := s.localDofs(tr)[i]
						ek[dof][dof].Add(ek[dof][dof], new(big.Rat).Mul(alpha[be.Side], length))
					}
				}
			}
		}
		for i := 0; i < n; i++ {
			for j := 0; j <= i; j++ {
				if g := k.At(i, j); !ratIn(ek[i][j], g) || g.Wid() > 1e-13*(1+g.Mag()) {
					f, _ := ek[i][j].Float64()
					t.Errorf("enriched=%v K(%d,%d) = %v, exact %.17g", enriched, i, j, g, f)
				}
				if g := mass.At(i, j); !ratIn(em[i][j], g) || g.Wid() > 1e-14*(1+g.Mag()) {
					f, _ := em[i][j].Float64()
					t.Errorf("enriched=%v M(%d,%d) = %v, exact %.17g", enriched, i, j, g, f)
				}
			}
		}
	}
}
