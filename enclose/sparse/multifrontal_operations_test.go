package sparse

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"
)

// multifrontalModel overwrites f with the factorization of s computed by
// the operations that Counter.roundoffBound documents for the multifrontal
// algorithm, in their simplest order: the supernodes in ascending order
// (children before parents), each front zeroed, the entries of PᵀSP added,
// then the children's update matrices entry by entry (children
// ascending), then its columns eliminated one by one, each entry (k, i)
// right of column j getting fr_ki − ũ_kj L_ij, sub(x, u, l) (plain: one
// rounded product, one rounded subtraction; or one fused multiply-add).
// Per entry this is the sequence of factorDense's panels (the columns of
// a front in ascending order), so with the plain sub it must give the
// bits of LDL.Factorize's multifrontal algorithm. It reports whether
// every pivot is nonzero and finite.
func multifrontalModel(f *LDL, sym *Symbolic, s *Sym, sub func(x, u, l float64) float64) bool {
	sn := sym.supernodal()
	n := sym.pat.n
	f.Sym = sym
	f.D, f.Val, f.Row = make([]float64, n), make([]float64, sym.colPtr[n]), slices.Clone(sn.rows)
	ns := len(sn.start) - 1
	update := make([][][]float64, ns) // dense lower triangles, [col][row]
	pos := make([]int, n)
	for p := 0; p < ns; p++ {
		first, below := sn.frontRows(sym, p)
		w := sn.start[p+1] - first
		rows := append([]int{first}, make([]int, 0, len(below))...)
		for _, r := range below {
			rows = append(rows, int(r))
		}
		h := len(rows)
		for i, r := range rows {
			pos[r] = i
		}
		fr := make([][]float64, h) // fr[col][row], rows ≥ col
		for j := range fr {
			fr[j] = make([]float64, h)
		}
		for j := first; j < first+w; j++ {
			for q := sn.lPtr[j]; q < sn.lPtr[j+1]; q++ {
				fr[j-first][pos[sn.lRow[q]]] += s.Val[sn.lSrc[q]]
			}
		}
		for _, c := range sn.child[sn.childPtr[p]:sn.childPtr[p+1]] {
			_, cb := sn.frontRows(sym, int(c))
			cb = cb[sn.start[c+1]-sn.start[c]-1:]
			for b := range cb {
				for a := b; a < len(cb); a++ {
					fr[pos[cb[b]]][pos[cb[a]]] += update[c][b][a]
				}
			}
			update[c] = nil
		}
		uk := make([]float64, h)
		for j := 0; j < w; j++ {
			d := fr[j][j]
			if d == 0 || math.IsNaN(d) || math.IsInf(d, 0) {
				return false
			}
			f.D[first+j] = d
			for k := j + 1; k < h; k++ {
				uk[k] = fr[j][k]
				fr[j][k] = uk[k] / d
			}
			copy(f.Val[sym.colPtr[first+j]:sym.colPtr[first+j+1]], fr[j][j+1:])
			for i := j + 1; i < h; i++ {
				lij := fr[j][i]
				for k := i; k < h; k++ {
					fr[i][k] = sub(fr[i][k], uk[k], lij)
				}
			}
		}
		if sn.parent[p] >= 0 {
			m := h - w
			update[p] = make([][]float64, m)
			for b := 0; b < m; b++ {
				update[p][b] = fr[w+b][w:]
			}
		}
	}
	return true
}

func plainSub(x, u, l float64) float64 { return x - float64(u*l) }

func fusedSub(x, u, l float64) float64 { return math.FMA(-u, l, x) }

// TestMultifrontalOperationsAsDocumented: the multifrontal factorization
// (panels, register blocks, split updates, packed update matrices) gives
// the bits of multifrontalModel with one rounded product and one rounded
// subtraction per update, that is, it does the operations that
// roundoffBound's proof lists, in the documented order per entry; and
// with every update fused into one multiply-add (as arm64 compiles
// factorDense and updateColumns: FMSUBD), r is still at least the exact
// residual norm. Cases: 3D grids under nested dissection (many children
// per front, fronts wider than a panel), a dense matrix of five panels,
// a star (one extend-add per leaf), random sparse matrices at mixed
// scales.
func TestMultifrontalOperationsAsDocumented(t *testing.T) {
	rnd := rand.New(rand.NewPCG(91, 92))
	g := perturbed(grid7(7), 0.2, rnd)
	eig := denseGeneralizedEigs(t, g, identity(g.N()))
	g27 := perturbed(grid27(5), 0.2, rnd)
	cases := []exactCase{
		{"grid7 7³ between λ_5 and λ_6", toISym(g), toISym(identity(g.N())), 0.5 * (eig[4] + eig[5]), nil},
		{"grid7 7³ next to λ_12", toISym(g), toISym(identity(g.N())), eig[11] * (1 + 1e-13), nil},
		{"grid27 5³", toISym(g27), toISym(identity(g27.N())), 3, nil},
		{"dense 150", toISym(randomScaledSym(rnd, 150, 1, -3, 3)), toISym(identity(150)), 0, naturalOrderOf(150)},
		{"star of 40 leaves", toISym(star(40, -0x1p-93, 0x1p-73*(1+0x1p-10), 1)), toISym(identity(41)), 0, naturalOrderOf(41)},
	}
	for _, sc := range [][2]int{{-20, 20}, {-1074, -1000}, {960, 1000}} {
		s := randomScaledSym(rnd, 120, 0.05, sc[0], sc[1])
		cases = append(cases, exactCase{fmt.Sprintf("random 120 scales 2^%v", sc), toISym(s), toISym(identity(120)), 0, nil})
	}
	checked, minRatio := 0, math.Inf(1)
	for _, tc := range cases {
		c := roundoffCounter(tc.k, tc.m)
		c.f.algorithm = multifrontal
		if !factorForBound(c, tc.sigma, tc.perm) {
			t.Logf("%s: factorization failed", tc.name)
			continue
		}
		var model LDL
		if !multifrontalModel(&model, c.sym, c.c, plainSub) {
			t.Errorf("%s: the model failed where Factorize did not", tc.name)
			continue
		}
		if !slices.Equal(model.D, c.f.D) || !slices.Equal(model.Val, c.f.Val) || !slices.Equal(model.Row, c.f.Row) {
			t.Errorf("%s: the multifrontal factors differ from the documented operations", tc.name)
		}
		if tc.perm != nil {
			inv := make([]int, len(tc.perm))
			for q, v := range tc.perm {
				inv[v] = q
			}
			c.kLow, c.mLow = permutedLower(c.k, inv), permutedLower(c.m, inv)
		}
		var fused LDL
		if !multifrontalModel(&fused, c.sym, c.c, fusedSub) {
			continue
		}
		c.f = fused
		r := c.roundoffBound(tc.sigma)
		norm, err := exactResidualNorm(c, tc.sigma)
		if err != nil {
			t.Errorf("%s (fused): %v", tc.name, err)
			continue
		}
		nf, _ := norm.Float64()
		if nf == 0 || math.IsInf(r, 1) {
			continue
		}
		checked++
		minRatio = math.Min(minRatio, r/nf)
		t.Logf("%s (fused): r/‖R‖∞ = %.4g", tc.name, r/nf)
		if new(big.Float).SetFloat64(r).Cmp(norm) < 0 {
			t.Errorf("%s (fused): r = %g below the exact residual norm %g", tc.name, r, nf)
		}
	}
	t.Logf("%d fused factorizations checked, smallest r/‖R‖∞ %.4g", checked, minRatio)
	if checked < len(cases)-2 {
		t.Errorf("only %d of %d cases checked", checked, len(cases))
	}
}
