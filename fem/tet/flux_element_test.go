package tet

import (
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// fluxPolyWeight is a FluxWeight given by its Bernstein coefficients and
// remainder on every cell (test data).
type fluxPolyWeight struct {
	q    int
	coef []interval.I
	rem  interval.I
}

func (w *fluxPolyWeight) Degree() int                            { return w.q }
func (w *fluxPolyWeight) MultiIndices() [][4]int                 { return rtMulti(w.q).alpha }
func (w *fluxPolyWeight) Model(t int) ([]interval.I, interval.I) { return w.coef, w.rem }

// fluxRat returns the exact value of a float.
func fluxRat(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }

// fluxOneCell returns the cell v_0 = 0, v_1 = (3/4, 1/8, 1/4),
// v_2 = (0, 1, 1/8), v_3 = (0, 1/4, 7/8): det J = (3/4)(7/8 − 1/32) > 0, and
// face 1 (v_0, v_2, v_3) lies in the plane x = 0 with the outward normal
// −e_1 and the rational area (7/8 − 1/32)/2.
func fluxOneCell() (fluxMesh, [4][3]*big.Rat) {
	v := [4][3]float64{{0, 0, 0}, {0.75, 0.125, 0.25}, {0, 1, 0.125}, {0, 0.25, 0.875}}
	var c RTCell
	var exact [4][3]*big.Rat
	for i := range v {
		for a := 0; a < 3; a++ {
			c.Vertices[i][a] = interval.Point(v[i][a])
			exact[i][a] = fluxRat(v[i][a])
		}
		c.Nodes[i] = 10 + i
	}
	m := fluxMesh{cells: []RTCell{c}, owners: []int{1, 1, 1, 1}}
	for f := 0; f < 4; f++ {
		c.Faces[f] = f
		var key [3]int
		for r, j := range rtFaceVertices[f] {
			key[r] = c.Nodes[j]
		}
		m.nodes = append(m.nodes, key)
	}
	m.cells[0] = c
	return m, exact
}

// fluxExactA2 returns the entries of A2 (package doc) for one cell by the exact
// Grundmann–Möller rules, in math/big: σ = Jσ̂/det J and div σ =
// div̂σ̂/det J from the scaled reference tables and the exact local
// coefficients, the weight the polynomial with coefficients wc plus the
// constant r, and the Robin term of face 1 (normal −e_1, α).
func fluxExactA2(f *Flux, s *fluxTestTrial, trial, flux [][]float64, v [4][3]*big.Rat, wq int, wc []*big.Rat, r, alpha *big.Rat) [][]*big.Rat {
	ref := f.ref
	nv := len(trial)
	var jm [3][3]*big.Rat // jm[a][c]: row a, column c = (v_(c+1) − v_0)_a
	for a := 0; a < 3; a++ {
		for c := 0; c < 3; c++ {
			jm[a][c] = new(big.Rat).Sub(v[c+1][a], v[0][a])
		}
	}
	det := new(big.Rat)
	for c := 0; c < 3; c++ {
		// cofactor expansion along the first row
		m1, m2 := (c+1)%3, (c+2)%3
		minor := new(big.Rat).Sub(new(big.Rat).Mul(jm[1][m1], jm[2][m2]), new(big.Rat).Mul(jm[1][m2], jm[2][m1]))
		det.Add(det, minor.Mul(minor, jm[0][c]))
	}
	ratVec := func(xs []float64) []*big.Rat {
		out := make([]*big.Rat, len(xs))
		for i, x := range xs {
			out[i] = fluxRat(x)
		}
		return out
	}
	comb := func(table []float64, x []float64, rows int) []*big.Rat {
		out := make([]*big.Rat, rows)
		for b := 0; b < rows; b++ {
			acc := new(big.Rat)
			for l, xl := range x {
				if xl != 0 && table[b*len(x)+l] != 0 {
					acc.Add(acc, new(big.Rat).Mul(fluxRat(table[b*len(x)+l]), fluxRat(xl)))
				}
			}
			out[b] = acc
		}
		return out
	}
	type fields struct {
		comp [3][]*big.Rat
		div  []*big.Rat
		u    []*big.Rat
	}
	fs := make([]fields, nv)
	nn, nk := rtDim(ref.n), rtDim(f.k)
	for i := 0; i < nv; i++ {
		x := make([]float64, ref.ndof)
		f.local(x, flux[i], 0)
		for c := 0; c < 3; c++ {
			fs[i].comp[c] = comb(ref.compT[c], x, nn)
		}
		fs[i].div = comb(ref.divT, x, nk)
		u := make([]float64, rtDim(s.p))
		s.Local(u, trial[i], 0)
		fs[i].u = ratVec(u)
	}
	out := make([][]*big.Rat, nv)
	for i := range out {
		out[i] = make([]*big.Rat, nv)
		for j := range out[i] {
			out[i][j] = new(big.Rat)
		}
	}
	sigma := func(i int, lam [4]*big.Rat) [3]*big.Rat {
		var sh, sv [3]*big.Rat
		for c := 0; c < 3; c++ {
			sh[c] = rtEvalRat(fs[i].comp[c], ref.n, lam)
		}
		for a := 0; a < 3; a++ {
			sv[a] = new(big.Rat)
			for c := 0; c < 3; c++ {
				sv[a].Add(sv[a], new(big.Rat).Mul(jm[a][c], sh[c]))
			}
			sv[a].Quo(sv[a], det)
		}
		return sv
	}
	deg := 2*max(ref.n, s.p, f.k) + wq
	pts, w := rtGrundmannMoeller(3, (deg+1)/2)
	for q, p := range pts {
		lam := rtBary4(p)
		weight := rtEvalRat(wc, wq, lam)
		weight.Add(weight, r)
		sv := make([][3]*big.Rat, nv)
		fv := make([]*big.Rat, nv)
		for i := 0; i < nv; i++ {
			sv[i] = sigma(i, lam)
			d := rtEvalRat(fs[i].div, f.k, lam)
			fv[i] = d.Quo(d, det).Add(d, rtEvalRat(fs[i].u, s.p, lam))
		}
		wt := new(big.Rat).Mul(w[q], det) // dx = det J dξ
		for i := 0; i < nv; i++ {
			for j := 0; j < nv; j++ {
				acc := new(big.Rat)
				for a := 0; a < 3; a++ {
					acc.Add(acc, new(big.Rat).Mul(sv[i][a], sv[j][a]))
				}
				acc.Add(acc, new(big.Rat).Mul(new(big.Rat).Mul(fv[i], fv[j]), weight))
				out[i][j].Add(out[i][j], acc.Mul(acc, wt))
			}
		}
	}
	// Face 1: points μ over (v_0, v_2, v_3), λ_1 = 0; dS = 2|F| dμ;
	// σ·n = −σ_x.
	area2 := new(big.Rat).Sub(new(big.Rat).Mul(v[2][1], v[3][2]), new(big.Rat).Mul(v[2][2], v[3][1]))
	fpts, fw := rtGrundmannMoeller(2, ref.n)
	for q, p := range fpts {
		lam := [4]*big.Rat{p[0], new(big.Rat), p[1], p[2]}
		wt := new(big.Rat).Mul(fw[q], area2)
		wt.Quo(wt, alpha)
		for i := 0; i < nv; i++ {
			si := sigma(i, lam)
			for j := 0; j < nv; j++ {
				sj := sigma(j, lam)
				out[i][j].Add(out[i][j], new(big.Rat).Mul(new(big.Rat).Mul(si[0], sj[0]), wt))
			}
		}
	}
	return out
}

// TestFluxLGMatrixAgainstExactQuadrature checks LGMatrix on one cell with
// a Dirichlet face, a Robin face (α = 3) and two Neumann faces, a weight of
// degree 1 and random trial functions and fluxes, against the same entries
// computed in math/big by exact Grundmann–Möller quadrature of the
// physical fields (independent of the triple tables, the Piola metric and
// the face Gram matrix): containment and a relative width below 1e-11.
// With a remainder R = [−r, r] the matrix must contain the exact matrices
// of the weights Q − r and Q + r (both admissible).
func TestFluxLGMatrixAgainstExactQuadrature(t *testing.T) {
	m, v := fluxOneCell()
	bnd := map[int]boundary.Condition{
		0: {Kind: boundary.Dirichlet},
		1: {Kind: boundary.Robin, Alpha: interval.Point(3)},
		2: {Kind: boundary.Neumann},
		3: {Kind: boundary.Neumann},
	}
	rng := rand.New(rand.NewPCG(14, 7))
	for _, pk := range [][2]int{{2, 1}, {1, 2}, {3, 2}} {
		p, k := pk[0], pk[1]
		f, err := NewFlux(m.cells, k, bnd)
		if err != nil {
			t.Fatal(err)
		}
		if want := RTDim(k) - 2*rtFaceDim(k); f.N() != want {
			t.Fatalf("k=%d: %d flux unknowns, want %d (two faces removed)", k, f.N(), want)
		}
		s := newFluxTestTrial(m, p, bnd)
		const nv = 3
		trial, flux := make([][]float64, nv), make([][]float64, nv)
		for i := 0; i < nv; i++ {
			trial[i], flux[i] = make([]float64, s.N()), make([]float64, f.N())
			for j := range trial[i] {
				trial[i][j] = rng.NormFloat64()
			}
			for j := range flux[i] {
				flux[i][j] = rng.NormFloat64()
			}
		}
		// A weight of degree 1 and a constant one (its own code path).
		for _, wc := range [][]float64{{0.5, 0.25, 0.75, 0.375}, {0.625}} {
			q := 0
			if len(wc) > 1 {
				q = 1
			}
			w := &fluxPolyWeight{q: q}
			wcRat := make([]*big.Rat, len(wc))
			for i, x := range wc {
				w.coef = append(w.coef, interval.Point(x))
				wcRat[i] = fluxRat(x)
			}
			fluxCheckWeight(t, f, s, trial, flux, v, w, wcRat, p, k)
		}
	}
}

// fluxCheckWeight compares LGMatrix with the weight w, without and with a
// remainder, against fluxExactA2 (see TestFluxLGMatrixAgainstExactQuadrature).
func fluxCheckWeight(t *testing.T, f *Flux, s *fluxTestTrial, trial, flux [][]float64, v [4][3]*big.Rat, w *fluxPolyWeight, wcRat []*big.Rat, p, k int) {
	t.Helper()
	nv := len(trial)
	{
		for _, r := range []float64{0, 0.0625} {
			w.rem = interval.I{Lo: -r, Hi: r}
			a2, err := f.LGMatrix(s, trial, flux, w)
			if err != nil {
				t.Fatal(err)
			}
			for _, shift := range []float64{-r, r} {
				want := fluxExactA2(f, s, trial, flux, v, w.q, wcRat, fluxRat(shift), big.NewRat(3, 1))
				for i := 0; i < nv; i++ {
					for j := 0; j <= i; j++ {
						got := a2.At(i, j)
						if fluxRat(got.Lo).Cmp(want[i][j]) > 0 || fluxRat(got.Hi).Cmp(want[i][j]) < 0 {
							wf, _ := want[i][j].Float64()
							t.Fatalf("p=%d k=%d q=%d r=%g: entry (%d,%d) = %v misses the exact %.17g", p, k, w.q, r, i, j, got, wf)
						}
						if r == 0 && got.Wid() > 1e-11*got.Mag() {
							t.Errorf("p=%d k=%d q=%d: entry (%d,%d) = %v wider than 1e-11 relative", p, k, w.q, i, j, got)
						}
					}
				}
			}
		}
	}
}

// TestFluxWeightRefusals checks the errors of the proving side: V = 0 with
// γ_B ≤ 0 (no positive weight), and an unbounded weight model.
func TestFluxWeightRefusals(t *testing.T) {
	for _, g := range []interval.I{{Lo: 0, Hi: 1}, {Lo: -2, Hi: -1}, interval.Entire()} {
		if _, err := NewFluxConstantWeight(g); err == nil {
			t.Errorf("NewFluxConstantWeight(%v) accepted a shift not verified > 0 and bounded", g)
		}
	}
	m, _ := fluxOneCell()
	bnd := fluxDirichletAll(m)
	f, err := NewFlux(m.cells, 1, bnd)
	if err != nil {
		t.Fatal(err)
	}
	s := newFluxTestTrial(m, 2, map[int]boundary.Condition{0: {Kind: boundary.Neumann}, 1: {Kind: boundary.Neumann}, 2: {Kind: boundary.Neumann}, 3: {Kind: boundary.Neumann}})
	trial, flux := [][]float64{make([]float64, s.N())}, [][]float64{make([]float64, f.N())}
	trial[0][0], flux[0][0] = 1, 1
	for _, w := range []*fluxPolyWeight{
		{q: 0, coef: []interval.I{{Lo: 0, Hi: 1}}, rem: interval.Entire()},
		{q: 0, coef: []interval.I{interval.Entire()}},
	} {
		if _, err := f.LGMatrix(s, trial, flux, w); err == nil {
			t.Errorf("LGMatrix accepted the unbounded weight model %v + %v", w.coef, w.rem)
		}
	}
}
