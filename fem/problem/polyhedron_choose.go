package problem

import (
	"math"
	"math/big"

	"gapcert/interval/algebraic"
	"gapcert/interval/decimalio"
)

// chooseKernelPoints proposes points strictly inside every face's plane
// (the interior of the kernel of a star-shaped polyhedron), chosen in
// floating point at round-to-nearest: a choice only, which findApex
// decides exactly. For margins m = D/8, D/64, D/512, D/4096 (D the width
// of the vertices' bounding box) it runs the relaxation method of Agmon
// and of Motzkin and Schoenberg from the vertex centroid: cyclic
// projections onto the half-spaces n_f·c ≤ n_f·v_f − m|n_f| (n_f the
// outward normal of face f, v_f one of its vertices), which converge to a
// point of their intersection whenever it is not empty. Each margin's
// end point is one proposal.
//
// References:
//
//	S. Agmon, The relaxation method for linear inequalities, Canad. J.
//	Math. 6 (1954) 382–392.
//	T. S. Motzkin, I. J. Schoenberg, The relaxation method for linear
//	inequalities, Canad. J. Math. 6 (1954) 393–404.
func chooseKernelPoints(pts []vec3, faces [][]int, normals []vec3) [][3]float64 {
	type plane struct {
		n [3]float64 // unit outward normal
		d float64    // n·v for a vertex v of the face
	}
	var planes []plane
	lo, hi := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}, [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	var g [3]float64
	for _, p := range pts {
		for k := range 3 {
			x := p[k].enclose().Mid()
			lo[k], hi[k] = math.Min(lo[k], x), math.Max(hi[k], x)
			g[k] += x / float64(len(pts))
		}
	}
	width := math.Max(hi[0]-lo[0], math.Max(hi[1]-lo[1], hi[2]-lo[2]))
	for i, f := range faces {
		var n [3]float64
		for k := range 3 {
			n[k] = normals[i][k].enclose().Mid()
		}
		l := math.Sqrt(n[0]*n[0] + n[1]*n[1] + n[2]*n[2])
		if !(l > 0) || math.IsInf(l, 0) {
			return nil
		}
		var pl plane
		for k := range 3 {
			pl.n[k] = n[k] / l
			pl.d += pl.n[k] * pts[f[0]][k].enclose().Mid()
		}
		planes = append(planes, pl)
	}
	var out [][3]float64
	for _, m := range []float64{width / 8, width / 64, width / 512, width / 4096} {
		c := g
		for sweep := 0; sweep < 400; sweep++ {
			moved := false
			for _, pl := range planes {
				s := pl.n[0]*c[0] + pl.n[1]*c[1] + pl.n[2]*c[2] - (pl.d - m)
				if s > 0 {
					for k := range 3 {
						c[k] -= s * pl.n[k]
					}
					moved = true
				}
			}
			if !moved {
				break
			}
		}
		if !math.IsNaN(c[0]+c[1]+c[2]) && !math.IsInf(c[0]+c[1]+c[2], 0) {
			out = append(out, c)
		}
	}
	return out
}

// ratPoint returns the exact point with the float coordinates q (each a
// rational), held as the numbers of the polyhedron are (like template).
func ratPoint(template xnum, q [3]float64) vec3 {
	var c vec3
	for k := range 3 {
		r := new(big.Rat).SetFloat64(q[k])
		switch template.kind {
		case surd:
			c[k] = xnum{kind: surd, s: algebraic.NewSurd(r)}
		case cyclotomic:
			one, _ := template.c.SqrtRat(big.NewRat(1, 1))
			c[k] = xnum{kind: cyclotomic, c: one.Scale(r)}
		default:
			c[k] = xnum{v: decimalio.FromRat(r)}
		}
	}
	return c
}
