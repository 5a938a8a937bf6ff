package tet

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/internal/bernstein"
	"gapcert/fem/internal/ritz"
	"gapcert/interval"
)

// RTCell is one tetrahedron of a mesh as the flux space takes it: the
// enclosures of its exact vertices (positively oriented: det[v_1 − v_0,
// v_2 − v_0, v_3 − v_0] > 0), their global vertex numbers (distinct; they
// fix the orientation of each face, see the package doc, Conformity) and
// the global number of the face opposite each local vertex (faces are
// numbered 0, 1, … without gaps).
type RTCell struct {
	Vertices [4][3]interval.I
	Nodes    [4]int
	Faces    [4]int
}

// Flux is the Raviart–Thomas space RT_k ⊂ H(div; Ω) on a tetrahedral mesh,
// the space of fluxes of the Lehmann–Goerisch bounds (package doc,
// Raviart–Thomas fluxes on tetrahedra). Global DOFs: the face DOFs of
// every face that keeps them (numbered by face, each in the order of
// rtFaceMulti(k) over the face's sorted global vertices), then the
// coefficients of the interior functions of every cell.
type Flux struct {
	cells []RTCell
	k     int
	ref   *rtRef
	n     int
	dofs  [][]int     // per cell, global index of each local DOF (−1: removed)
	sign  [][]float64 // per cell, ±1 for each local DOF
	geom  []fluxGeom
	robin []fluxFace // boundary faces with α verified > 0
}

// fluxGeom holds enclosures of det J and of the Piola metric K = JᵀJ of a
// cell.
type fluxGeom struct {
	det interval.I
	k   [3][3]interval.I
}

// fluxFace is a boundary face with a term in the flux norm: local face i
// of cell t, with its coefficient α and its area.
type fluxFace struct {
	t, i  int
	alpha interval.I
	area  interval.I
}

// FluxOrientationError is returned by NewFlux when det J > 0 of a cell
// cannot be verified from its vertex enclosures.
type FluxOrientationError struct {
	Cell int        // index of the cell
	Det  interval.I // the enclosure of its det J
}

func (e *FluxOrientationError) Error() string {
	return fmt.Sprintf("tet: cell %d is not verified positively oriented (det J in %v)", e.Cell, e.Det)
}

// NewFlux returns RT_k on the cells with the conditions bnd of the
// boundary faces (keyed by global face number; every face of exactly one
// cell must have one, and no other). It returns a *FluxOrientationError
// when a cell is not verified positively oriented, and panics on misuse:
// k < 0, repeated nodes in a cell, a face shared by more than two cells or
// by cells that disagree on its vertices, face numbers with gaps, or
// conditions that do not match the boundary faces.
func NewFlux(cells []RTCell, k int, bnd map[int]boundary.Condition) (*Flux, error) {
	ref := rtReference(k)
	geom := make([]fluxGeom, len(cells))
	for t, c := range cells {
		g := fluxGeometry(c)
		if !(g.det.Lo > 0) || !g.det.IsBounded() {
			return nil, &FluxOrientationError{Cell: t, Det: g.det}
		}
		geom[t] = g
	}
	faceNodes, owners := fluxFaceTable(cells)
	nFaces := len(faceNodes)
	matched := 0
	for f, ow := range owners {
		c, ok := bnd[f]
		if (ow == 1) != ok {
			panic(fmt.Sprintf("tet: face %d lies in %d cells but has a boundary condition: %v", f, ow, ok))
		}
		if ok {
			c.Check()
			matched++
		}
	}
	if matched != len(bnd) {
		panic("tet: boundary conditions for faces that do not exist")
	}
	nf, ni := ref.nFace, ref.ndof-4*ref.nFace
	raw := nFaces*nf + len(cells)*ni
	renum := make([]int, raw)
	n := 0
	for r := range renum {
		renum[r] = -1
		if r < nFaces*nf {
			if c, ok := bnd[r/nf]; ok && !c.FluxFree() {
				continue
			}
		}
		renum[r] = n
		n++
	}
	fl := &Flux{cells: cells, k: k, ref: ref, n: n, dofs: make([][]int, len(cells)), sign: make([][]float64, len(cells)), geom: geom}
	fm := rtFaceMulti(k)
	for t, c := range cells {
		d, s := make([]int, ref.ndof), make([]float64, ref.ndof)
		for i := 0; i < 4; i++ {
			rank, par := fluxFaceRank(c, i)
			sg := par
			if i%2 == 1 {
				sg = -sg
			}
			f := c.Faces[i]
			for m, b := range fm.alpha {
				var bg [3]int
				for r := 0; r < 3; r++ {
					bg[rank[r]] = b[r]
				}
				l := i*nf + m
				d[l], s[l] = renum[f*nf+fm.pos[bg]], sg
			}
		}
		for j := 0; j < ni; j++ {
			d[4*nf+j], s[4*nf+j] = renum[nFaces*nf+t*ni+j], 1
		}
		fl.dofs[t], fl.sign[t] = d, s
	}
	faces := make([]int, 0, len(bnd))
	for f := range bnd {
		faces = append(faces, f)
	}
	sort.Ints(faces)
	owner := make(map[int][2]int, len(faces))
	for t, c := range cells {
		for i, f := range c.Faces {
			if owners[f] == 1 {
				owner[f] = [2]int{t, i}
			}
		}
	}
	for _, f := range faces {
		if c := bnd[f]; c.AlphaPositive() {
			o := owner[f]
			fl.robin = append(fl.robin, fluxFace{t: o[0], i: o[1], alpha: c.WeakAlpha(), area: fluxFaceArea(cells[o[0]], o[1])})
		}
	}
	return fl, nil
}

// fluxFaceTable returns, for each global face, its sorted global vertex
// numbers and the number of cells that contain it, and panics when the
// cells disagree about a face.
func fluxFaceTable(cells []RTCell) ([][3]int, []int) {
	nFaces := 0
	for _, c := range cells {
		for _, f := range c.Faces {
			if f < 0 {
				panic("tet: negative face number")
			}
			nFaces = max(nFaces, f+1)
		}
	}
	nodes := make([][3]int, nFaces)
	owners := make([]int, nFaces)
	for t, c := range cells {
		for a := 0; a < 4; a++ {
			for b := a + 1; b < 4; b++ {
				if c.Nodes[a] == c.Nodes[b] {
					panic(fmt.Sprintf("tet: cell %d repeats node %d", t, c.Nodes[a]))
				}
			}
		}
		for i, f := range c.Faces {
			var v [3]int
			for r, j := range rtFaceVertices[i] {
				v[r] = c.Nodes[j]
			}
			sort.Ints(v[:])
			if owners[f] > 0 && nodes[f] != v {
				panic(fmt.Sprintf("tet: cells disagree about the vertices of face %d", f))
			}
			nodes[f] = v
			owners[f]++
			if owners[f] > 2 {
				panic(fmt.Sprintf("tet: face %d lies in more than two cells", f))
			}
		}
	}
	for f, o := range owners {
		if o == 0 {
			panic(fmt.Sprintf("tet: face number %d is not used by any cell", f))
		}
	}
	return nodes, owners
}

// fluxFaceRank returns, for local face i of c, the position rank[r] of the
// global number of its r-th vertex (increasing local order) among the
// three sorted, and the sign of that permutation.
func fluxFaceRank(c RTCell, i int) (rank [3]int, sign float64) {
	var g [3]int
	for r, j := range rtFaceVertices[i] {
		g[r] = c.Nodes[j]
	}
	for r := 0; r < 3; r++ {
		for q := 0; q < 3; q++ {
			if g[q] < g[r] {
				rank[r]++
			}
		}
	}
	sign = 1
	for r := 0; r < 3; r++ {
		for q := r + 1; q < 3; q++ {
			if rank[r] > rank[q] {
				sign = -sign
			}
		}
	}
	return rank, sign
}

// fluxGeometry encloses det J and K = JᵀJ for J = [v_1 − v_0, v_2 − v_0,
// v_3 − v_0] (interval arithmetic from the vertex enclosures).
func fluxGeometry(c RTCell) fluxGeom {
	var j [3][3]interval.I // j[r] = column r = v_(r+1) − v_0
	for r := 0; r < 3; r++ {
		for x := 0; x < 3; x++ {
			j[r][x] = c.Vertices[r+1][x].Sub(c.Vertices[0][x])
		}
	}
	var g fluxGeom
	for r := 0; r < 3; r++ {
		for s := 0; s < 3; s++ {
			g.k[r][s] = j[r][0].Mul(j[s][0]).Add(j[r][1].Mul(j[s][1])).Add(j[r][2].Mul(j[s][2]))
		}
	}
	cr := fluxCross(j[1], j[2])
	g.det = j[0][0].Mul(cr[0]).Add(j[0][1].Mul(cr[1])).Add(j[0][2].Mul(cr[2]))
	return g
}

func fluxCross(a, b [3]interval.I) [3]interval.I {
	return [3]interval.I{
		a[1].Mul(b[2]).Sub(a[2].Mul(b[1])),
		a[2].Mul(b[0]).Sub(a[0].Mul(b[2])),
		a[0].Mul(b[1]).Sub(a[1].Mul(b[0])),
	}
}

// fluxFaceArea encloses the area of local face i of c, |ν|/2 with
// ν = (B − A) × (C − A).
func fluxFaceArea(c RTCell, i int) interval.I {
	v := rtFaceVertices[i]
	var e1, e2 [3]interval.I
	for x := 0; x < 3; x++ {
		e1[x] = c.Vertices[v[1]][x].Sub(c.Vertices[v[0]][x])
		e2[x] = c.Vertices[v[2]][x].Sub(c.Vertices[v[0]][x])
	}
	cr := fluxCross(e1, e2)
	sq := cr[0].Sqr().Add(cr[1].Sqr()).Add(cr[2].Sqr())
	r, ok := sq.Sqrt()
	if !ok {
		panic("tet: face area enclosure failed")
	}
	return r.MulF(0.5)
}

// N returns the dimension.
func (f *Flux) N() int { return f.n }

// Degree returns k.
func (f *Flux) Degree() int { return f.k }

// local sets x[l] = sign_l · vec[dof_l] (0 where removed), the
// coefficients of the local reference basis on cell t (exact: a sign
// change).
func (f *Flux) local(x []float64, vec []float64, t int) {
	for l, g := range f.dofs[t] {
		x[l] = 0
		if g >= 0 {
			x[l] = f.sign[t][l] * vec[g]
		}
	}
}

// FluxTrial is a conforming P_p trial space in Bernstein form on the same
// cells (same order, same local vertex order) as the flux space.
type FluxTrial interface {
	// N is the dimension of the space.
	N() int
	// Degree is p.
	Degree() int
	// MultiIndices lists the multi-indices α (|α| = p, α_j the power of
	// the barycentric coordinate of local vertex j) in the order of Local.
	MultiIndices() [][4]int
	// Local sets dst[m] to the coefficient of B^p_(α_m) on cell t of the
	// function with global coefficients vec, exactly (a copy or a sign
	// change of the float coefficients).
	Local(dst, vec []float64, t int)
}

// FluxWeight encloses the weight 1/(V + γ_B) on each cell: a polynomial Q
// in Bernstein form with interval coefficients and an interval R with
// 1/(V + γ_B) − Q ∈ R at every point of the cell (for every exact datum
// inside the enclosures).
type FluxWeight interface {
	// Degree is the degree q of Q.
	Degree() int
	// MultiIndices lists the multi-indices of degree q in the order of
	// Model's coefficients.
	MultiIndices() [][4]int
	// Model returns the coefficients of Q and R on cell t.
	Model(t int) (coef []interval.I, rem interval.I)
}

// FluxConstantWeight is the weight 1/(V + γ_B) for V = 0: the constant
// 1/γ_B, enclosed (zero remainder).
type FluxConstantWeight struct {
	inv interval.I
}

// NewFluxConstantWeight returns the weight 1/γ_B of V = 0, or an error when
// γ_B > 0 is not verified.
func NewFluxConstantWeight(gammaB interval.I) (*FluxConstantWeight, error) {
	if !(gammaB.Lo > 0) || !gammaB.IsBounded() {
		return nil, fmt.Errorf("tet: the weight 1/(V + γ_B) with V = 0 needs γ_B > 0, have %v", gammaB)
	}
	return &FluxConstantWeight{inv: gammaB.Recip()}, nil
}

// Degree returns 0.
func (w *FluxConstantWeight) Degree() int { return 0 }

// MultiIndices returns the one multi-index of degree 0.
func (w *FluxConstantWeight) MultiIndices() [][4]int { return [][4]int{{}} }

// Model returns the enclosure of 1/γ_B and a zero remainder.
func (w *FluxConstantWeight) Model(t int) ([]interval.I, interval.I) {
	return []interval.I{w.inv}, interval.I{}
}

// fluxPermutation returns perm with perm[m] = the position of order[m] in
// rtMulti(deg), and panics unless order lists each multi-index of degree
// deg once.
func fluxPermutation(order [][4]int, deg int) []int {
	ix := rtMulti(deg)
	if len(order) != len(ix.alpha) {
		panic("tet: multi-index list of the wrong length")
	}
	perm := make([]int, len(order))
	seen := make([]bool, len(order))
	for m, a := range order {
		p, ok := ix.pos[a]
		if !ok || seen[p] {
			panic(fmt.Sprintf("tet: multi-index %v is not of degree %d or repeated", a, deg))
		}
		seen[p] = true
		perm[m] = p
	}
	return perm
}

// fluxErrUnbounded is returned when a weight model is not bounded.
var fluxErrUnbounded = errors.New("tet: the weight model is unbounded")

// LGMatrix returns the interval matrix A2 of the Lehmann–Goerisch method
// (package doc, Raviart–Thomas fluxes on tetrahedra) for the trial
// functions ũ_i (coefficients trial[i] in s) and the fluxes σ_i
// (coefficients flux[i]):
//
//	a2_ij ⊇ (σ_i, σ_j) + ((ũ_i + div σ_i)/c, ũ_j + div σ_j) + Σ_(F ⊂ Γ_R, α>0) ∫_F (σ_i·n)(σ_j·n)/α,
//
// with 1/c ∈ Q + R the model of w, for every exact input inside the
// enclosures. w must enclose 1/(V + γ_B) of the problem (FluxWeight), and
// s must live on the cells of f. On a cell T, with ĉ_(i,r) the Bernstein
// coefficients (degree k + 1) of component r of σ̂_i, G their Gram matrix
// normalised by |T|, K ⊇ JᵀJ and D ⊇ det J = 6|T|:
//
//	(σ_i, σ_j)_T = (1/(6D)) Σ_(r,s) K_rs ĉ_(i,r)ᵀ G ĉ_(j,s)       (σ = Jσ̂/D, dx = D dξ, ∫_T̂ = G/6),
//	f_i = ũ_i + div σ_i = ũ_i + (div̂ σ̂_i)/D, in degree d = max(p, k) by exact elevation,
//	∫_T f_i f_j/c = (D/6) f_iᵀ W f_j + ∫_T (R − r_mid) f_i f_j,
//
// W the Gram matrix of Q + r_mid (normalised by |T|); the last term lies
// in ±r_rad ‖f_i‖_T ‖f_j‖_T (Cauchy–Schwarz). On a Robin face F with flux
// density g_i = σ_i·ν (ν the outward normal times 2|F|, whose Bernstein
// coefficients are faceScale times the local face DOFs), σ·n = g/(2|F|),
// so the face term is (1/(4α|F|)) g_iᵀ G_F g_j, G_F the face Gram matrix
// normalised by |F|.
func (f *Flux) LGMatrix(s FluxTrial, trial [][]float64, flux [][]float64, w FluxWeight) (*enclose.Sym, error) {
	if len(trial) != len(flux) || len(trial) == 0 {
		panic("tet: one flux per trial function is needed")
	}
	for i := range flux {
		if len(flux[i]) != f.n || len(trial[i]) != s.N() {
			panic("tet: coefficient vector length mismatch")
		}
	}
	ref := f.ref
	nv := len(trial)
	p, k, nb, q := s.Degree(), f.k, ref.n, w.Degree()
	d := max(p, k)
	np, nn, nk, nd, nq := rtDim(p), rtDim(nb), rtDim(k), rtDim(d), rtDim(q)
	tPerm, wPerm := fluxPermutation(s.MultiIndices(), p), fluxPermutation(w.MultiIndices(), q)
	gn := rtTriple(0, nb, nb).IV
	gd := rtTriple(0, d, d).IV
	tq := rtTriple(q, d, d).IV
	elevP, elevK := rtElevation(p, d).IV, rtElevation(k, d).IV
	acc := ritz.NewAccumulator(nv)
	x := make([][]float64, nv)
	uraw, uc := make([]float64, np), make([][]float64, nv)
	type vecs struct{ c, gc [3][]interval.I }
	sv := make([]vecs, nv)
	dv := make([][]interval.I, nv)
	fi, wfi := make([][]interval.I, nv), make([][]interval.I, nv)
	ffi := make([]interval.I, nv)
	for i := 0; i < nv; i++ {
		x[i], uc[i] = make([]float64, ref.ndof), make([]float64, np)
		for c := 0; c < 3; c++ {
			sv[i].c[c], sv[i].gc[c] = make([]interval.I, nn), make([]interval.I, nn)
		}
		dv[i] = make([]interval.I, nk)
		fi[i], wfi[i] = make([]interval.I, nd), make([]interval.I, nd)
	}
	tmp, gtmp := make([]interval.I, nd), make([]interval.I, nd)
	wg := make([]interval.I, nd*nd)
	wc := make([]interval.I, nq)
	for t := range f.cells {
		g := f.geom[t]
		mscale := g.det.MulF(6).Recip() // 1/(6 det J)
		invDet := g.det.Recip()
		vol := g.det.DivF(6) // |T|
		coef, rem := w.Model(t)
		if len(coef) != nq {
			panic("tet: weight model of the wrong size")
		}
		for m, pm := range wPerm {
			wc[pm] = coef[m]
		}
		if !rem.IsBounded() || !fluxBounded(wc) {
			return nil, fluxErrUnbounded
		}
		rrad := rem.Rad()
		// A constant weight w_0 + r_mid multiplies the Gram matrix (the
		// Bernstein basis of degree 0 is 1); otherwise the weighted Gram
		// matrix is formed. The norms ‖f_i‖² are needed only for a remainder.
		constant := nq == 1
		w0 := wc[0].Add(interval.Point(rem.Mid()))
		if !constant {
			bernstein.WeightedGram(wg, tq, wc, interval.Point(rem.Mid()), nd)
		}
		for i := 0; i < nv; i++ {
			f.local(x[i], flux[i], t)
			s.Local(uraw, trial[i], t)
			for m, pm := range tPerm {
				uc[i][pm] = uraw[m]
			}
			for c := 0; c < 3; c++ {
				fluxExactCombination(sv[i].c[c], ref.compT[c], x[i])
				bernstein.ApplyI(sv[i].gc[c], gn, sv[i].c[c])
			}
			fluxExactCombination(dv[i], ref.divT, x[i])
			for b := range dv[i] {
				dv[i][b] = dv[i][b].Mul(invDet)
			}
			if d == p {
				for b, u := range uc[i] {
					fi[i][b] = interval.Point(u)
				}
			} else {
				bernstein.ApplyF(fi[i], elevP, uc[i])
			}
			if d == k {
				copy(tmp, dv[i])
			} else {
				bernstein.ApplyI(tmp, elevK, dv[i])
			}
			for b := range fi[i] {
				fi[i][b] = fi[i][b].Add(tmp[b])
			}
			if constant || rrad != 0 {
				bernstein.ApplyI(gtmp, gd, fi[i])
			}
			if rrad != 0 {
				ffi[i] = bernstein.DotI(fi[i], gtmp)
			}
			if constant {
				for b := range gtmp {
					wfi[i][b] = gtmp[b].Mul(w0)
				}
			} else {
				bernstein.ApplyI(wfi[i], wg, fi[i])
			}
		}
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				m := interval.I{}
				for r := 0; r < 3; r++ {
					for c := 0; c < 3; c++ {
						m = m.Add(g.k[r][c].Mul(bernstein.DotI(sv[j].c[c], sv[i].gc[r])))
					}
				}
				e := bernstein.DotI(fi[j], wfi[i])
				if r := bernstein.RemainderBound(rrad, ffi[i].Hi, ffi[j].Hi); r != 0 {
					e = e.Add(interval.I{Lo: -r, Hi: r})
				}
				acc.Add(i, j, mscale.Mul(m).Add(vol.Mul(e)))
			}
		}
	}
	f.faceTerms(acc, flux, x)
	return acc.Sym(), nil
}

// fluxBounded reports whether every entry is bounded.
func fluxBounded(v []interval.I) bool {
	for _, x := range v {
		if !x.IsBounded() {
			return false
		}
	}
	return true
}

// faceTerms adds ⊇ ∫_F (σ_i·n)(σ_j·n)/α for every face with α > 0 to acc;
// x holds one buffer of local coefficients per flux.
func (f *Flux) faceTerms(acc *ritz.Accumulator, flux [][]float64, x [][]float64) {
	ref, nv := f.ref, len(flux)
	nf := ref.nFace
	ge := rtFaceGram(f.k).IV
	gi := make([][]interval.I, nv)
	for i := range gi {
		gi[i] = make([]interval.I, nf)
	}
	for _, rf := range f.robin {
		// g = faceScale · (local face DOFs): the stored basis is scaled.
		scale := rf.alpha.Mul(rf.area).MulF(4).Recip().MulF(ref.faceScale * ref.faceScale)
		for i := 0; i < nv; i++ {
			f.local(x[i], flux[i], rf.t)
			bernstein.ApplyF(gi[i], ge, x[i][rf.i*nf:(rf.i+1)*nf])
		}
		for i := 0; i < nv; i++ {
			for j := 0; j <= i; j++ {
				acc.Add(i, j, scale.Mul(bernstein.DotF(x[j][rf.i*nf:(rf.i+1)*nf], gi[i])))
			}
		}
	}
}

// fluxExactCombination sets dst[β] ⊇ Σ_l a[β·len(x) + l] x_l for exact
// floats a and x, enclosing each sum to within a few ulps of its value
// however much its terms cancel (the reference coefficients are integers
// with alternating signs). Each product is split error-free, a·x = p + e
// with e = fma(a, x, −p) (exact unless p is tiny or not finite;
// Ogita–Rump–Oishi, Accurate sum and dot product, SIAM J. Sci. Comput. 26
// (2005), TwoProduct), and the p are summed by TwoSum (Knuth, TAOCP vol. 2,
// §4.2.2: s + p = t + q exactly for finite floats without overflow). The
// exact sum is t plus the exact sum of all e and q, which an interval sum
// encloses. Terms whose product is tiny or not finite go into the interval
// sum directly (outward rounded), and a partial sum that overflows falls
// back to the plain interval sum; both are sound. Every product and sum is
// written float64(·) so that the compiler cannot fuse them.
func fluxExactCombination(dst []interval.I, a, x []float64) {
	nx := len(x)
	for b := range dst {
		row := a[b*nx : (b+1)*nx]
		s := 0.0
		var rest interval.I
		overflow := false
		for l, xl := range x {
			al := row[l]
			if al == 0 || xl == 0 {
				continue
			}
			p := float64(al * xl)
			if !(math.Abs(p) >= 0x1p-900) || math.IsInf(p, 0) {
				rest = rest.Add(interval.Point(al).MulF(xl))
				continue
			}
			e := math.FMA(al, xl, -p)
			t := float64(s + p)
			if math.IsInf(t, 0) {
				overflow = true
				break
			}
			bb := float64(t - s)
			q := float64(float64(s-float64(t-bb)) + float64(p-bb))
			s = t
			rest = rest.Add(interval.I{Lo: e, Hi: e}).Add(interval.I{Lo: q, Hi: q})
		}
		if overflow {
			acc := interval.I{}
			for l, xl := range x {
				if row[l] != 0 && xl != 0 {
					acc = acc.Add(interval.Point(row[l]).MulF(xl))
				}
			}
			dst[b] = acc
			continue
		}
		dst[b] = rest.AddF(s)
	}
}
