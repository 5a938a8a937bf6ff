package certify

import (
	"fmt"
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

// TestProductTightBoxes: random boxes (fixed seed) with random lengths and
// random Dirichlet, Neumann and Robin ends, six eigenvalues at target
// 1e-13, against the lowest sums of the intervals' closed forms and
// characteristic-equation roots (constantPotentialEigenvalue, about 55
// digits): λ1 … λ6 and the gap contained, widths at most 1e-11 (the
// factors' enclosures add up, so the product's widths stay above the
// target), and every certificate verifies.
func TestProductTightBoxes(t *testing.T) {
	rng := rand.New(rand.NewSource(1411))
	lengths := []string{"1/2", "3/4", "1", "5/4", "2"}
	ends := []end{dirichletEnd, neumannEnd, robinEnd("1/4"), robinEnd("1"), robinEnd("3")}
	for i := range 12 {
		F := 3 + rng.Intn(2)
		var factors, bcs []string
		var lists [][]*big.Float
		for range F {
			l := lengths[rng.Intn(len(lengths))]
			a, b := ends[rng.Intn(len(ends))], ends[rng.Intn(len(ends))]
			factors = append(factors, `{"interval":["0","`+l+`"]}`)
			bcs = append(bcs, "["+endJSON(a)+","+endJSON(b)+"]")
			lists = append(lists, intervalList(l, a, b, 6))
		}
		src := `{"domain":{"product":[` + strings.Join(factors, ",") + `]},"boundary":[` + strings.Join(bcs, ",") + `],"eigenvalues":6}`
		p, c, data := certifyProductText(t, src, "1e-13")
		requireEnclosures(t, fmt.Sprintf("box %d %s", i, src), p, c, lowestSums(lists, 6), 1e-11)
		if err := Check(data); err != nil {
			t.Errorf("box %d: %v", i, err)
		}
	}
}

// TestProductNeumannPrismGap: the prism over the Neumann equilateral
// triangle of unit side (eigenvalues 0, 16π²/9 (double), B. J. McCartin,
// Eigenstructure of the equilateral triangle, Part II: the Neumann
// problem, Math. Probl. Eng. 8 (2002) 517–539; recalled from memory) times
// (0, 1) with Dirichlet–Neumann ends (π²/4, 9π²/4): λ1 = π²/4, λ2 = λ3 =
// 73π²/36, λ4 = 9π²/4, and the gap 16π²/9 is the triangle's, the factor
// whose λ1 is 0. Contained at width 1e-10.
func TestProductNeumannPrismGap(t *testing.T) {
	src := `{"domain":{"product":[{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},{"interval":["0","1"]}]},"boundary":["neumann",["dirichlet","neumann"]],"eigenvalues":4}`
	p, c, data := certifyProductText(t, src, "1e-10")
	double := piSquaredTimes("73/36")
	requireEnclosures(t, "Neumann prism", p, c, []*big.Float{piSquaredTimes("1/4"), double, double, piSquaredTimes("9/4")}, 1e-10)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}

// TestProductRobinSquarePrism: the unit square with Robin α = 1 on every
// side (a polygon factor: its eigenvalues are the sums of two copies of
// the Robin–Robin interval's, by separation) times (0, 1) with Robin α = 1
// at z = 0 and Dirichlet at z = 1: the lowest sums of the three intervals'
// characteristic-equation roots (constantPotentialEigenvalue), λ2 = λ3
// double, contained at width 1e-10.
func TestProductRobinSquarePrism(t *testing.T) {
	src := `{"domain":{"product":[{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},{"interval":["0","1"]}]},"boundary":[{"robin":"1"},[{"robin":"1"},"dirichlet"]],"eigenvalues":4}`
	p, c, data := certifyProductText(t, src, "1e-10")
	rr := intervalList("1", robinEnd("1"), robinEnd("1"), 4)
	lists := [][]*big.Float{rr, rr, intervalList("1", robinEnd("1"), dirichletEnd, 4)}
	requireEnclosures(t, "Robin square prism", p, c, lowestSums(lists, 4), 1e-10)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}

// TestProductRectanglePolygonFactors: random rectangles given as polygons
// (a polygon factor, counterclockwise from (0, 0): sides bottom, right,
// top, left) with random Dirichlet, Neumann and Robin sides, times a
// random interval (fixed seed): λ1, λ2, λ3 and the gap against the lowest
// sums of the three intervals' closed forms and characteristic roots (the
// rectangle separates: its x-list has the left and right ends, its y-list
// the bottom and top; common practice), contained at width 1e-9.
func TestProductRectanglePolygonFactors(t *testing.T) {
	rng := rand.New(rand.NewSource(1412))
	lengths := []string{"1/2", "1", "3/2"}
	ends := []end{dirichletEnd, neumannEnd, robinEnd("1/2"), robinEnd("2")}
	pick := func() end { return ends[rng.Intn(len(ends))] }
	for i := range 6 {
		a, b, l := lengths[rng.Intn(3)], lengths[rng.Intn(3)], lengths[rng.Intn(3)]
		bottom, right, top, left := pick(), pick(), pick(), pick()
		z0, z1 := pick(), pick()
		rect := `{"polygon":[["0","0"],["` + a + `","0"],["` + a + `","` + b + `"],["0","` + b + `"]]}`
		src := `{"domain":{"product":[` + rect + `,{"interval":["0","` + l + `"]}]},"boundary":[[` +
			strings.Join([]string{endJSON(bottom), endJSON(right), endJSON(top), endJSON(left)}, ",") + `],[` + endJSON(z0) + `,` + endJSON(z1) + `]],"eigenvalues":3}`
		lists := [][]*big.Float{intervalList(a, left, right, 3), intervalList(b, bottom, top, 3), intervalList(l, z0, z1, 3)}
		p, c, data := certifyProductText(t, src, "1e-9")
		requireEnclosures(t, fmt.Sprintf("case %d %s", i, src), p, c, lowestSums(lists, 3), 1e-9)
		if i%3 == 0 {
			if err := Check(data); err != nil {
				t.Errorf("case %d: %v", i, err)
			}
		}
	}
}

// TestProductTwentyEigenvalues: the unit 4-cube with Dirichlet faces and
// the largest eigenvalue count, 20: π² times 4, 7 (×4), 10 (×6), 12 (×4),
// 13 (×4), 15 (the sums of four squares j², common practice), contained at
// width 1e-10, and the certificate verifies.
func TestProductTwentyEigenvalues(t *testing.T) {
	src := `{"domain":{"product":[{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]},{"interval":["0","1"]}]},"boundary":"dirichlet","eigenvalues":20}`
	p, c, data := certifyProductText(t, src, "1e-11")
	var want []*big.Float
	for _, r := range []struct {
		value string
		times int
	}{{"4", 1}, {"7", 4}, {"10", 6}, {"12", 4}, {"13", 4}, {"15", 1}} {
		for range r.times {
			want = append(want, piSquaredTimes(r.value))
		}
	}
	requireEnclosures(t, "4-cube, 20 eigenvalues", p, c, want, 1e-10)
	if err := Check(data); err != nil {
		t.Fatal(err)
	}
}

// TestProductNextLowerBelowTruth: the recorded lower bound of each
// factor's first omitted eigenvalue (method.factors[i].next_lower, read
// from the factor's stage bounds) lies below the true λ_{m_i+1} of the
// factor (closed forms and characteristic roots, constantPotentialEigenvalue),
// and so does method.omitted_lower below the least omitted sum, on random
// boxes (fixed seed) and a rectangle polygon factor with mixed sides.
func TestProductNextLowerBelowTruth(t *testing.T) {
	rng := rand.New(rand.NewSource(1413))
	lengths := []string{"1/2", "1", "3/2", "2"}
	ends := []end{dirichletEnd, neumannEnd, robinEnd("1/2"), robinEnd("3")}
	pick := func() end { return ends[rng.Intn(len(ends))] }
	for i := range 8 {
		var factors, bcs []string
		var truth []func(n int) []*big.Float
		F := 3
		if i == 7 {
			// A rectangle polygon factor: its eigenvalues are the lowest
			// sums of its two sides' lists.
			bottom, right, top, left := pick(), pick(), pick(), pick()
			factors = append(factors, `{"polygon":[["0","0"],["2","0"],["2","1"],["0","1"]]}`)
			bcs = append(bcs, "["+strings.Join([]string{endJSON(bottom), endJSON(right), endJSON(top), endJSON(left)}, ",")+"]")
			truth = append(truth, func(n int) []*big.Float {
				return lowestSums([][]*big.Float{intervalList("2", left, right, n), intervalList("1", bottom, top, n)}, n)
			})
			F = 2
		}
		for len(factors) < F {
			l, a, b := lengths[rng.Intn(len(lengths))], pick(), pick()
			factors = append(factors, `{"interval":["0","`+l+`"]}`)
			bcs = append(bcs, "["+endJSON(a)+","+endJSON(b)+"]")
			truth = append(truth, func(n int) []*big.Float { return intervalList(l, a, b, n) })
		}
		src := `{"domain":{"product":[` + strings.Join(factors, ",") + `]},"boundary":[` + strings.Join(bcs, ",") + `],"eigenvalues":` + fmt.Sprint(3+rng.Intn(5)) + `}`
		_, c, _ := certifyProductText(t, src, "1e-8")
		m, err := decodeProductMethod(c.Method)
		if err != nil {
			t.Fatal(err)
		}
		var firsts, omittedSums []*big.Float
		for k, f := range m.Factors {
			list := truth[k](f.Eigenvalues + 1)
			firsts = append(firsts, list[0])
			omittedSums = append(omittedSums, list[f.Eigenvalues])
			if next := bigDec(f.NextLower); next.Cmp(list[f.Eigenvalues]) > 0 {
				t.Errorf("case %d %s: factor %d: next_lower %s above the true lambda%d %.20g", i, src, k, f.NextLower, f.Eigenvalues+1, list[f.Eigenvalues])
			}
		}
		// The least sum with an omitted index: λ_{m_k+1} of factor k plus
		// the other factors' λ1, minimised over k.
		var least *big.Float
		for k := range m.Factors {
			s := new(big.Float).SetPrec(oraclePrec).Set(omittedSums[k])
			for l := range m.Factors {
				if l != k {
					s.Add(s, firsts[l])
				}
			}
			if least == nil || s.Cmp(least) < 0 {
				least = s
			}
		}
		if om := bigDec(m.OmittedLower); om.Cmp(least) > 0 {
			t.Errorf("case %d %s: omitted_lower %s above the least omitted sum %.20g", i, src, m.OmittedLower, least)
		}
	}
}
