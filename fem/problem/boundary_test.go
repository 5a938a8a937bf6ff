package problem

import (
	"math/big"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// The conditions the spaces receive: the kind as written, the enclosure of
// the exact α for Robin sides, and a Robin side with α = 0 acting as the
// Neumann side does in the weak form.
func TestBoundaryConditionsForTheSpaces(t *testing.T) {
	p, err := Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},` +
		`"boundary":["dirichlet",{"robin":"1/3"},"neumann",{"robin":"0"}]}`))
	if err != nil {
		t.Fatal(err)
	}
	want := []boundary.Kind{boundary.Dirichlet, boundary.Robin, boundary.Neumann, boundary.Robin}
	for i, bc := range p.Boundary {
		c := bc.Condition()
		c.Check()
		if c.Kind != want[i] || bc.Kind != want[i] {
			t.Errorf("side %d: kind %v, condition %v, want %v", i, bc.Kind, c.Kind, want[i])
		}
	}
	third := p.Boundary[1].Condition().Alpha
	lo, hi := new(big.Rat).SetFloat64(third.Lo), new(big.Rat).SetFloat64(third.Hi)
	if exact := big.NewRat(1, 3); lo.Cmp(exact) > 0 || hi.Cmp(exact) < 0 || third.Hi-third.Lo > 1e-16 {
		t.Errorf("α = 1/3 enclosed as %v", third)
	}
	if p.Boundary[1].Alpha.Text != "1/3" {
		t.Errorf("exact text of α %q, want 1/3", p.Boundary[1].Alpha.Text)
	}
	neumann, robin0 := p.Boundary[2].Condition(), p.Boundary[3].Condition()
	if neumann.WeakAlpha() != (interval.I{}) || robin0.WeakAlpha() != (interval.I{}) || neumann.HasTerm() || robin0.HasTerm() {
		t.Errorf("Neumann %v and Robin α = 0 %v do not both act as α = [0, 0]", neumann, robin0)
	}
	if p.Boundary[0].Condition().Alpha != (interval.I{}) || p.Boundary[2].Condition().Alpha != (interval.I{}) {
		t.Error("a Dirichlet or Neumann condition carries a Robin coefficient")
	}
}
