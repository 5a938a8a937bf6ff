package groundstate_test

import (
	"fmt"

	"gapcert/interval"
	"gapcert/interval/formula"
	"gapcert/temple/groundstate"
)

// A pointwise enclosure at the centre of a disc: u = 1 + x² − y² solves
// −Δu = 0·u (V = 0, λ = 0). Here ũ = u on the disc, written in powers of
// x − x0, y − y0 at x0 = (1/4, 1/2), and the L² error bound is taken as
// 1e-6, as a global bound from EigenvectorError would be. The enclosure has
// the half-width E/√(πR²) + ‖K‖₂·|λ − V|·E = 1e-6/(√π·0.5) ≈ 1.13e-6.
func ExampleEnclosePoint() {
	// 1 + (1/4 + d_x)² − (1/2 + d_y)² = 13/16 + d_x/2 + d_x² − d_y − d_y².
	p := interval.Point
	d := groundstate.Disc{
		Centre: [2]float64{0.25, 0.5},
		Radius: 0.5,
		Coef: [][]interval.I{
			{p(13.0 / 16), p(-1), p(-1)}, // 1, d_y, d_y²
			{p(0.5)},                     // d_x
			{p(1)},                       // d_x²
		},
	}
	enc, err := groundstate.EnclosePoint(formula.MustParse("0"), p(0), 1e-6, d, groundstate.DiscOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(enc.U.Contains(13.0/16), enc.Residual)
	fmt.Printf("half-width %.4g\n", enc.U.Rad())
	// Output:
	// true [0, 0]
	// half-width 1.128e-06
}

// A certified failure of log-concavity: u = 1 + x² − y² solves −Δu = 0·u
// and log u = log(1 + x²) on the x-axis is convex for |x| < 1. At
// x = (−1/2, 0), y = (1/2, 0) and m = (0, 0): u(m)² = 1 < u(x)·u(y) =
// 25/16. ũ = u on each disc, written around its centre (c, 0):
// 1 + (c + d_x)² − d_y² = (1 + c²) + 2c·d_x + d_x² − d_y².
func ExampleCertifyMidpoint() {
	p := interval.Point
	disc := func(c float64) groundstate.Disc {
		return groundstate.Disc{
			Centre: [2]float64{c, 0},
			Radius: 0.25,
			Coef: [][]interval.I{
				{p(1 + c*c), {}, p(-1)}, // 1, d_y, d_y²
				{p(2 * c)},              // d_x
				{p(1)},                  // d_x²
			},
		}
	}
	res, err := groundstate.CertifyMidpoint(formula.MustParse("0"), p(0), 1e-6,
		disc(-0.5), disc(0.5), disc(0), groundstate.DiscOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("certified %v, margin %.4f (exact 9/16 = 0.5625)\n", res.Certified, res.Margin)
	// Output: certified true, margin 0.5625 (exact 9/16 = 0.5625)
}
