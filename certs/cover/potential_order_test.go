package cover

import (
	"errors"
	"math/big"
	"strings"
	"testing"

	"gapcert/certs/certify"
	"gapcert/fem/problem"
)

// TestPotentialOrderOnAPolyhedron decides the sign of ∂V/∂c over the
// bounding box of a polyhedron, the unit cube moved to x ∈ [−1, 0], by
// the potential rule itself (ParseFamily refuses polyhedra while they
// cannot be certified): there ∂(c·tanh x)/∂c = tanh x ≤ 0 and
// ∂(c·atan x)/∂c = atan x ≤ 0 (the eigenvalues decrease in c), and
// ∂(c·z)/∂c = z ≥ 0 with z ∈ [0, 1].
func TestPotentialOrderOnAPolyhedron(t *testing.T) {
	const cube = `{"polyhedron": {"vertices": [["-1","0","0"],["0","0","0"],["0","1","0"],["-1","1","0"],["-1","0","1"],["0","0","1"],["0","1","1"],["-1","1","1"]],
	  "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}`
	f := &Family{Params: []Param{{Name: "c", Lo: big.NewRat(0, 1), Hi: big.NewRat(1, 1), MinCell: big.NewRat(1, 8), Count: 1}}}
	for _, c := range []struct {
		potential string
		sign      int
	}{
		{"c*tanh(x)", -1},
		{"c*atan(x)", -1},
		{"c*z", 1},
		{"c*(x+1)*y*z", 1},
	} {
		ref, err := problem.Parse([]byte(`{"domain": ` + cube + `, "potential": "` + c.potential + `", "boundary": "dirichlet", "parameters": {"c": "0"}}`))
		if err != nil {
			t.Fatal(err)
		}
		uses, err := PotentialRule{}.Order(f, ref, 0)
		if err != nil {
			t.Errorf("V = %s: %v", c.potential, err)
			continue
		}
		if len(uses) != 1 || uses[0].Sign != c.sign {
			t.Errorf("V = %s: uses %+v, want one of sign %d", c.potential, uses, c.sign)
		}
	}
}

// TestUnsupportedDomainRefusedBeforeComputing: a family whose corner
// problems certify.Supported refuses (a polyhedron, today) is an invalid
// family, refused by ParseFamily with certify's reason, not at the first
// corner of a run.
func TestUnsupportedDomainRefusedBeforeComputing(t *testing.T) {
	const cube = `{"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
	  "faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}`
	data := []byte(`{"template": {"domain": ` + cube + `, "potential": "c", "boundary": "dirichlet"},
	  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "1"}, "min_cell": "1/8"}]}`)
	p, err := ParseFamily(data)
	if err == nil {
		box := p.Box()
		q, _ := p.Problem(box.Lo)
		if certify.Supported(q) == nil {
			t.Skip("polyhedra are certified now; nothing to refuse")
		}
		t.Fatal("a family of polyhedra was accepted, though its corners cannot be certified")
	}
	var inv *InvalidError
	if !errors.As(err, &inv) || !strings.Contains(err.Error(), "template.domain.polyhedron") {
		t.Fatalf("error %v, want an *InvalidError at template.domain.polyhedron", err)
	}
}

// TestRecordedDerivativeIsThatOfTheDecidedPieces: for V = c³·x² on
// (−1, 1), c ∈ [−1, 1], ∂V/∂c = 3c²x² ∈ [0, 3]; the first enclosure on the
// whole box straddles 0 (c² is evaluated as c·c), the pieces decide the
// sign, and the recorded derivative is the hull of those pieces, ≥ 0.
func TestRecordedDerivativeIsThatOfTheDecidedPieces(t *testing.T) {
	f := mustFamily(t, `{"template": {"domain": {"interval": ["-1","1"]}, "potential": "c^3*x^2", "boundary": "dirichlet"},
	  "parameters": [{"name": "c", "range": {"lo": "-1", "hi": "1"}, "min_cell": "1/8"}]}`)
	u := f.Dependences[0].Uses[0]
	lo, ok1 := new(big.Rat).SetString(u.Derivative[0])
	hi, ok2 := new(big.Rat).SetString(u.Derivative[1])
	if u.Sign != 1 || !ok1 || !ok2 || lo.Sign() < 0 || hi.Cmp(big.NewRat(3, 1)) < 0 {
		t.Errorf("use %+v: want sign +1 and a derivative enclosure inside [0, ∞) containing 3", u)
	}
}
