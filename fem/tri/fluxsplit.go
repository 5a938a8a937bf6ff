package tri

import (
	"fmt"
	"math/big"
	"sync"

	"gonum.org/v1/gonum/mat"
)

// rtSplit is a basis of the reference space RT_k (coefficients in the
// scaled basis of rtRef) adapted to the divergence: the columns of
// B = [Y Z] (ndof × ndof, invertible) satisfy
//
//	div̂ (Z e_j) = 0 exactly,  div̂ (Y e_β) ≈ B^k_β (the Bernstein basis of P_k).
//
// Coordinates w = (y, z) of x = B w then carry the divergence in y alone,
// so on a triangle the term ‖div σ/√c‖², which is about 1/h² times the
// mass term (div σ = div̂ σ̂/det J), acts on the y-block only and is zero
// on the z-block by construction, not by cancellation in floating point.
// div̂ maps RT_k onto P_k (Brezzi–Fortin 1991, §III.3), so dim y = dim P_k
// and dim z = dim RT_k − dim P_k.
//
// Z comes from the reduced row echelon form of the integer matrix divT of
// rtRef in exact rational arithmetic: each free column gives one kernel
// vector, scaled to integers; the integers are below 2^53, so the float
// columns are the exact kernel vectors and div̂ of any float combination
// of them is exactly 0. Y, a right inverse of divT supported on the pivot
// columns, is rounded to the nearest floats (its columns need not be
// exact: an error there is relative to div σ itself, not to σ). The
// pivots are sought among the interior columns first, so the kernel
// vectors of the edge columns are liftings of the edge fluxes with
// divergence zero. mass[q] = Bᵀ M_q B in float64, with M_0 = M_00,
// M_1 = M_01 + M_10, M_2 = M_11 and M_rs the reference mass blocks of the
// components r, s (a choice: used only to choose σ).
type rtSplit struct {
	nk   int          // dim P_k = number of y coordinates
	b    []float64    // ndof × ndof, row-major: b[l·ndof + c]
	mass [3][]float64 // Bᵀ M_q B
}

var (
	splitMu    sync.Mutex
	splitCache = map[int]*rtSplit{}
)

// rtDivSplit returns the divergence-adapted basis of RT_k (cached).
func rtDivSplit(k int) *rtSplit {
	splitMu.Lock()
	defer splitMu.Unlock()
	if s, ok := splitCache[k]; ok {
		return s
	}
	ref := rtReference(k)
	nd, nk, ne := ref.ndof, dim(k), 3*(k+1)
	// Columns in the order of the pivot search: interior, then edges.
	order := make([]int, 0, nd)
	for l := ne; l < nd; l++ {
		order = append(order, l)
	}
	for l := 0; l < ne; l++ {
		order = append(order, l)
	}
	// [divT | I] reduced to [R | E] with R = E divT in row echelon form.
	rows := make([][]*big.Rat, nk)
	for b := range rows {
		rows[b] = make([]*big.Rat, nd+nk)
		for l := 0; l < nd; l++ {
			rows[b][l] = new(big.Rat).SetFloat64(ref.divT[b*nd+l])
		}
		for c := 0; c < nk; c++ {
			rows[b][nd+c] = new(big.Rat)
		}
		rows[b][nd+b].SetInt64(1)
	}
	pivotCol := make([]int, 0, nk)
	isPivot := make([]bool, nd)
	r := 0
	for _, col := range order {
		if r == nk {
			break
		}
		piv := -1
		for i := r; i < nk; i++ {
			if rows[i][col].Sign() != 0 {
				piv = i
				break
			}
		}
		if piv < 0 {
			continue
		}
		rows[r], rows[piv] = rows[piv], rows[r]
		inv := new(big.Rat).Inv(rows[r][col])
		for j := range rows[r] {
			rows[r][j].Mul(rows[r][j], inv)
		}
		for i := 0; i < nk; i++ {
			if i == r || rows[i][col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(rows[i][col])
			for j := range rows[i] {
				if rows[r][j].Sign() != 0 {
					rows[i][j].Sub(rows[i][j], new(big.Rat).Mul(f, rows[r][j]))
				}
			}
		}
		pivotCol = append(pivotCol, col)
		isPivot[col] = true
		r++
	}
	if r != nk {
		panic(fmt.Sprintf("tri: the reference divergence of RT_%d is not onto P_%d", k, k))
	}
	s := &rtSplit{nk: nk, b: make([]float64, nd*nd)}
	// Y: divT x = e_β has the solution x_(pivot i) = E[i][β], zero elsewhere.
	for i, col := range pivotCol {
		for beta := 0; beta < nk; beta++ {
			v, _ := rows[i][nd+beta].Float64()
			s.b[col*nd+beta] = v
		}
	}
	// Z: for a free column f, x_f = 1, x_(pivot i) = −R[i][f], scaled to integers.
	c := nk
	for _, f := range order {
		if isPivot[f] {
			continue
		}
		den := big.NewInt(1)
		for i := range pivotCol {
			den = lcm(den, rows[i][f].Denom())
		}
		put := func(l int, v *big.Rat) {
			x := new(big.Rat).Mul(v, new(big.Rat).SetInt(den))
			fl, exact := x.Float64()
			if !x.IsInt() || !exact {
				panic(fmt.Sprintf("tri: a divergence-free field of RT_%d has a coefficient %v that is not an exact float", k, x))
			}
			s.b[l*nd+c] = fl
		}
		put(f, big.NewRat(1, 1))
		for i, col := range pivotCol {
			if rows[i][f].Sign() != 0 {
				put(col, new(big.Rat).Neg(rows[i][f]))
			}
		}
		c++
	}
	gn := tripleTable(0, ref.n, ref.n).FL
	nn := dim(ref.n)
	bm := mat.NewDense(nd, nd, s.b)
	for q, rc := range [3][2][2]int{{{0, 0}, {0, 0}}, {{0, 1}, {1, 0}}, {{1, 1}, {1, 1}}} {
		m := make([]float64, nd*nd)
		for _, p := range rc {
			blk := congruence(ref.compT[p[0]], ref.compT[p[1]], gn, nd, nn)
			for i := range m {
				m[i] += blk[i]
			}
		}
		if rc[0] == rc[1] {
			for i := range m {
				m[i] /= 2 // the diagonal blocks were added twice
			}
		}
		var t, out mat.Dense
		t.Mul(mat.NewDense(nd, nd, m), bm)
		out.Mul(bm.T(), &t)
		s.mass[q] = out.RawMatrix().Data
	}
	splitCache[k] = s
	return s
}
