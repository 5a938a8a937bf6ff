package coverplot

import (
	"math/big"
	"testing"
	"time"

	"gapcert/certs/cover"
	"gapcert/certs/sweep"
)

// TestLoadShardDirectory draws a shard's directory, which holds
// summary-shard-0-of-2.json and no summary.json: its cells only (half of
// the box), with the fractions of the whole box.
func TestLoadShardDirectory(t *testing.T) {
	f, err := cover.ParseFamily([]byte(`{"name": "harmonic",
	  "template": {"domain": {"interval": ["0", "1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
	  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "4", "count": 2}, "min_cell": "1"}],
	  "claims": ["gap >= 3*pi^2/D^2"], "relative_width": "1e-9"}`))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	opt := cover.RunOptions{Tool: "gapcert test", Now: func() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) }, Shard: sweep.Shard{Index: 1, Count: 2}}
	if _, err := cover.Run(f, dir, opt); err != nil {
		t.Fatal(err)
	}
	c, err := Load(dir, 0)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range c.Cells {
		if r.X[0] < 2 {
			t.Errorf("cell %v of shard 1/2 lies below c = 2", r.X)
		}
	}
	sum := new(big.Rat)
	for _, x := range []string{c.Coverage.Holds, c.Coverage.Fails, c.Coverage.Undecided} {
		r, ok := new(big.Rat).SetString(x)
		if !ok {
			t.Fatalf("coverage %+v is not exact text", c.Coverage)
		}
		sum.Add(sum, r)
	}
	if len(c.Cells) == 0 || sum.Cmp(big.NewRat(1, 2)) != 0 {
		t.Errorf("%d cells, coverage %+v; want the cells of [2, 4], half of the box", len(c.Cells), c.Coverage)
	}
}
