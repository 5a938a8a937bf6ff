package certify

import (
	"context"
	"errors"
	"math/big"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/fem/claim/named"
	"gapcert/fem/problem"
)

// certifyGroundStateClaims certifies src with the ground-state block at
// the relative width 1e-8 and returns the certificate as written and as
// read back.
func certifyGroundStateClaims(t *testing.T, src string) ([]byte, *certs.Certificate) {
	t.Helper()
	p, err := problem.Parse([]byte(src))
	if err != nil {
		t.Fatalf("problem %s: %v", src, err)
	}
	c, err := Certify(context.Background(), p, Options{RelWidth: "1e-8", TimeLimit: ampleLimit, Now: fixedTime, Tool: "gapcert test", GroundState: true})
	if err != nil {
		t.Fatalf("certify %s: %v", src, err)
	}
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	back, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatalf("certificate does not read back: %v", err)
	}
	return data, back
}

func hypothesisNamed(t *testing.T, r certs.ClaimResult, name string) certs.Hypothesis {
	t.Helper()
	for _, h := range r.Hypotheses {
		if h.Name == name {
			return h
		}
	}
	t.Fatalf("%s records no hypothesis %s", r.Text, name)
	return certs.Hypothesis{}
}

// robinGapMargin returns gap − π²/L² of −u″ = λu on an interval of length
// L with the given ends, from the big.Float roots of the characteristic
// equation (constantPotentialEigenvalue).
func robinGapMargin(length string, left, right end) *big.Float {
	g := constantPotentialEigenvalue(2, length, "0", left, right)
	g.Sub(g, constantPotentialEigenvalue(1, length, "0", left, right))
	pi2 := new(big.Float).SetPrec(oraclePrec).Mul(bigPi(), bigPi())
	return g.Sub(g, pi2.Quo(pi2, new(big.Float).SetPrec(oraclePrec).Mul(bigDec(length), bigDec(length))))
}

// TestRobinLogConcaveGap: with V = 0 the Robin ground state on (0, L) is
// cos(k(x − c)) with |k(x − c)| < π/2 on [0, L], whose log is concave
// (closed form, common practice): with the ground-state block every
// hypothesis of @robin_log_concave_gap is proven and the claim holds,
// its margin gap − π²/L² containing the value from the roots of the
// characteristic equation. Two problems of our own: α = 1 at both ends of
// (0, 1) (gap 11.785…, margin 1.9157…), and a Neumann end with α = 2 at
// the other end of (0, 3/2) (coefficients that differ; gap 5.8154…,
// margin 1.4289…; both to 4 digits from the same roots computed
// independently with mpmath). The first certificate
// verifies; an edited verdict on the log-concavity hypothesis, or the
// block removed under a proven one, is refused.
func TestRobinLogConcaveGap(t *testing.T) {
	for _, tc := range []struct {
		src, length string
		left, right end
	}{
		{`{"domain":{"interval":["0","1"]},"boundary":{"robin":"1"},"claims":["@robin_log_concave_gap"]}`, "1", end{alpha: "1"}, end{alpha: "1"}},
		{`{"domain":{"interval":["0","3/2"]},"boundary":["neumann",{"robin":"2"}],"claims":["@robin_log_concave_gap"]}`, "1.5", end{alpha: "0"}, end{alpha: "2"}},
	} {
		data, c := certifyGroundStateClaims(t, tc.src)
		r := claimByText(t, c, "@robin_log_concave_gap")
		if r.Verdict != certs.Holds || r.Inequality != "gap >= pi^2/D^2" {
			t.Errorf("%s: %s (%s), margin %v", tc.src, r.Verdict, r.Inequality, r.Margin)
		}
		requireAllProven(t, r)
		if h := hypothesisNamed(t, r, named.LogConcaveGroundState); !strings.Contains(h.Detail, "log-concave") {
			t.Errorf("log-concavity detail %q", h.Detail)
		}
		requireBig(t, tc.src+": margin", marginOf(t, r), robinGapMargin(tc.length, tc.left, tc.right), 1, 1e-6)
		if tc.length != "1" {
			continue
		}
		requireVerifies(t, "Robin interval", data)
		edited, err := certs.Unmarshal(data)
		if err != nil {
			t.Fatal(err)
		}
		for j := range edited.Claims[0].Hypotheses {
			if edited.Claims[0].Hypotheses[j].Name == named.LogConcaveGroundState {
				edited.Claims[0].Hypotheses[j].Verdict, edited.Claims[0].Hypotheses[j].Detail = certs.Undecided, "edited"
			}
		}
		out, _ := edited.Marshal()
		var mm *MismatchError
		if err := Check(out); !errors.As(err, &mm) {
			t.Errorf("edited log-concavity hypothesis: want a mismatch report, got %v", err)
		}
		// Without the block the recomputed hypothesis is undecided, so a
		// recorded proven verdict no longer verifies.
		stripped, _ := certs.Unmarshal(data)
		stripped.Results.GroundState = nil
		out, _ = stripped.Marshal()
		if err := Check(out); !errors.As(err, &mm) || !strings.Contains(err.Error(), "claims") {
			t.Errorf("proven log-concavity without the block: want a mismatch of the claims, got %v", err)
		}
	}
}

// TestRobinLogConcaveGapDoubleWell: the double well V = 6(x² − 1)² on
// (−5/2, 5/2) with α = 1 at both ends: by symmetry u′(0) = 0, and
// λ1 ≤ the Dirichlet λ1 ≈ 3.741 < 6 = V(0) (adding the Robin ends lowers
// the form: min–max, common practice), so (log u)″(0) = V(0) − λ1 > 0 and
// the ground state is not log-concave. The log-concavity hypothesis is
// disproven with the block's witness point; the other two are proven.
func TestRobinLogConcaveGapDoubleWell(t *testing.T) {
	data, c := certifyGroundStateClaims(t, `{"domain":{"interval":["-5/2","5/2"]},"potential":"6*(x^2-1)^2","boundary":{"robin":"1"},"claims":["@robin_log_concave_gap"]}`)
	r := claimByText(t, c, "@robin_log_concave_gap")
	v := hypothesisVerdicts(r)
	if v[named.RobinOrNeumannSides] != certs.Proven || v[named.ContinuousPotential] != certs.Proven {
		t.Errorf("hypotheses %v", v)
	}
	h := hypothesisNamed(t, r, named.LogConcaveGroundState)
	gs := c.Results.GroundState
	if h.Verdict != certs.Disproven || gs.LogConcavity != certs.Disproven || h.Witness == nil || gs.Witness == nil {
		t.Fatalf("log-concavity %+v, block %s (%s)", h, gs.LogConcavity, gs.Reason)
	}
	if strings.Join(h.Witness.Point, ",") != gs.Witness.Points[0][0] {
		t.Errorf("witness point %v, block witness %v", h.Witness.Point, gs.Witness.Points)
	}
	requireVerifies(t, "Robin double well", data)
}

// TestRobinLogConcaveGapWithoutBlock: without the ground-state block the
// log-concavity hypothesis is undecided and says to ask for the block (the
// claim's verdict is still the certified comparison); a Dirichlet end
// disproves robin_or_neumann_sides with the side as witness. On a polygon
// the claim is refused before computing.
func TestRobinLogConcaveGapWithoutBlock(t *testing.T) {
	data, c := certifyClaims(t, `{"domain":{"interval":["0","1"]},"boundary":[{"robin":"1"},"dirichlet"],"claims":["@robin_log_concave_gap"]}`, 1e-6)
	r := claimByText(t, c, "@robin_log_concave_gap")
	h := hypothesisNamed(t, r, named.LogConcaveGroundState)
	if h.Verdict != certs.Undecided || !strings.Contains(h.Detail, "--ground-state") {
		t.Errorf("log-concavity without the block: %+v", h)
	}
	sides := hypothesisNamed(t, r, named.RobinOrNeumannSides)
	if sides.Verdict != certs.Disproven || sides.Witness == nil || sides.Witness.Side == nil || *sides.Witness.Side != 1 {
		t.Errorf("sides: %+v", sides)
	}
	if r.Verdict == certs.Undecided {
		t.Errorf("the comparison is undecided: margin %v", r.Margin)
	}
	requireVerifies(t, "Robin–Dirichlet interval", data)
	_, err := problem.Parse([]byte(`{"domain":{"polygon":[["0","0"],["1","0"],["0","1"]]},"boundary":{"robin":"1"},"claims":["@robin_log_concave_gap"]}`))
	if err == nil || !strings.Contains(err.Error(), "does not apply to a polygon") {
		t.Errorf("on a polygon: %v", err)
	}
}
