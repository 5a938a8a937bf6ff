package named

import (
	"encoding/json"
	"fmt"
	"slices"
	"strings"

	"gapcert/fem/claim"
)

// Prefix marks a built-in claim in a problem's claims list.
const Prefix = "@"

// Hypothesis names (the names certs/hypothesis decides).
const (
	DirichletBoundary = "dirichlet_boundary" // u = 0 on every side
	NeumannBoundary   = "neumann_boundary"   // ∂u/∂n = 0 on every side
	RobinBoundary     = "robin_boundary"     // ∂u/∂n + αu = 0 on every side, one α
	// PositiveRobinAlpha: ∂u/∂n + αu = 0 on every side, one α > 0 (robin_boundary
	// without the Neumann case α = 0).
	PositiveRobinAlpha = "positive_robin_alpha"
	ConvexDomain       = "convex_domain"
	ConvexPotential    = "convex_potential"
	ZeroPotential      = "zero_potential" // V ≡ 0
	Triangle           = "triangle"
	Rectangle          = "rectangle"
	// RobinOrNeumannSides: ∂u/∂n + α_i·u = 0 on every side i, the α_i ≥ 0
	// possibly different (Neumann: α_i = 0); no Dirichlet side.
	RobinOrNeumannSides = "robin_or_neumann_sides"
	// ContinuousPotential: V is continuous on the closed domain.
	ContinuousPotential = "continuous_potential"
	// LogConcaveGroundState: the ground state u > 0 has log u concave on
	// the closed domain; decided from the certificate's own
	// results.ground_state, not from the problem.
	LogConcaveGroundState = "log_concave_ground_state"
	// CircumsolidProduct: the domain is a product of circumsolids (a
	// polygon: tangential, or a rectangle; a polyhedron: a circumsolid, or
	// a right prism over a tangential polygon or a rectangle); decided by
	// certs/hypothesis.
	CircumsolidProduct = "circumsolid_product"
)

// RobinIntervalGap is the reference quantity of @robin_comparison: the gap
// of −u″ on the interval (0, D), D the diameter of the domain, with the
// domain's Robin coefficient α at both ends.
const RobinIntervalGap = "robin_interval_gap"

// Claim is one built-in claim.
type Claim struct {
	Name       string // without Prefix
	Inequality string // "lhs REL rhs" over certified quantities
	Dims       []int  // the dimensions of domain it applies to (1: interval, 2: polygon, 3: polyhedron or product, 4: product)
	Hypotheses []string
	// Reference is the name of a quantity used in Inequality that is
	// certified by a separate computation ("" if none), ReferenceResult
	// the quantity of that computation's certificate it denotes (a name
	// of claim.Quantities, e.g. "gap"), and ReferenceProblem the problem
	// that computation certifies.
	Reference        string
	ReferenceResult  string
	ReferenceProblem *ReferenceProblem
	Source           string // the theorem, or the conjecture and where it is proved
}

// ReferenceProblem is the problem whose certificate gives a built-in
// claim's reference quantity, written in exact texts of quantities of the
// claim's own problem.
type ReferenceProblem struct {
	// Inputs are the quantities of the claim's problem (names of
	// claim.Quantities) whose exact texts the reference problem is
	// written with, in the order in which a caller looks for them (the
	// first one missing says why the reference cannot be stated).
	Inputs []string
	// file returns the problem file as a JSON object, from the exact
	// text of each input and the parameters of the claim's problem (name
	// → exact text), which the texts may name.
	file func(inputs, params map[string]string) map[string]any
}

// File returns the reference problem file (JSON) from the exact text of
// each of r.Inputs and the parameters of the claim's problem (name → exact
// text), which those texts may name. The same texts give the same bytes.
// A missing input is a misuse and panics.
func (r *ReferenceProblem) File(inputs, params map[string]string) []byte {
	for _, q := range r.Inputs {
		if _, ok := inputs[q]; !ok {
			panic("named: reference problem without the exact text of " + q)
		}
	}
	if params == nil {
		params = map[string]string{}
	}
	data, err := json.Marshal(r.file(inputs, params))
	if err != nil {
		panic("named: reference problem: " + err.Error())
	}
	return data
}

// Text returns the claim as written in a problem file ("@name").
func (c Claim) Text() string { return Prefix + c.Name }

// Applies reports whether the claim applies to domains of dimension dim.
func (c Claim) Applies(dim int) bool { return slices.Contains(c.Dims, dim) }

// Parse returns the claim's inequality parsed by claim.Parse. The
// catalogue's inequalities are tested to parse; a failure is a defect of
// this package and panics.
func (c Claim) Parse() *claim.Claim {
	cl, err := claim.Parse(c.Inequality)
	if err != nil {
		panic("named: " + c.Text() + ": " + err.Error())
	}
	return cl
}

// CheckScope checks that the problem described by s provides every
// quantity of the claim's inequality (its reference quantity counts as
// provided: whether the reference can be computed is decided with it) and
// that the claim applies to the domain's dimension. The error is a
// *claim.Error on the claim text ("@name").
func (c Claim) CheckScope(s claim.Scope) error {
	if s.Dim != 0 && !c.Applies(s.Dim) {
		where := map[int]string{1: "an interval", 2: "a polygon", 3: "a polyhedron or a product of three coordinates", 4: "a product of four coordinates"}
		var ok []string
		for _, d := range c.Dims {
			ok = append(ok, where[d])
		}
		return &claim.Error{Text: c.Text(), Col: 1, Msg: fmt.Sprintf("built-in claim %q does not apply to %s", c.Text(), where[s.Dim]), Hint: "it applies to " + strings.Join(ok, " or ")}
	}
	if c.Reference != "" {
		s.Extra = append(slices.Clone(s.Extra), c.Reference)
	}
	if err := c.Parse().CheckScope(s); err != nil {
		e := err.(*claim.Error)
		return &claim.Error{Text: c.Text(), Col: 1, Msg: fmt.Sprintf("built-in claim %s (%s): %s", c.Text(), c.Inequality, e.Msg), Hint: e.Hint}
	}
	return nil
}

// catalogue lists the built-in claims.
var catalogue = []Claim{
	// B. Andrews and J. Clutterbuck, Proof of the fundamental gap
	// conjecture, J. Amer. Math. Soc. 24 (2011) 899–916: for a bounded
	// convex domain of diameter D with Dirichlet conditions and a convex
	// potential V, λ2 − λ1 ≥ 3π²/D², in every dimension n (so on convex
	// polyhedra and on products of convex factors alike; convexity of the
	// domain and of V is decided per problem). In one dimension: R. Lavine, The
	// eigenvalue gap for one-dimensional convex potentials, Proc. Amer.
	// Math. Soc. 121 (1994) 815–821.
	{
		Name:       "fundamental_gap",
		Inequality: "gap >= 3*pi^2/D^2",
		Dims:       []int{1, 2, 3, 4},
		Hypotheses: []string{DirichletBoundary, ConvexDomain, ConvexPotential},
		Source:     "B. Andrews and J. Clutterbuck, Proof of the fundamental gap conjecture, J. Amer. Math. Soc. 24 (2011) 899–916; in one dimension R. Lavine, Proc. Amer. Math. Soc. 121 (1994) 815–821",
	},
	// Z. Lu and J. Rowlett, The fundamental gap of simplices, Comm. Math.
	// Phys. 319 (2013) 111–145: for a triangle of diameter D with
	// Dirichlet conditions and V = 0, D²(λ2 − λ1) ≥ 64π²/9, with equality
	// exactly for the equilateral triangle.
	{
		Name:       "triangle_gap",
		Inequality: "D^2*gap >= 64*pi^2/9",
		Dims:       []int{2},
		Hypotheses: []string{DirichletBoundary, Triangle, ZeroPotential},
		Source:     "Z. Lu and J. Rowlett, The fundamental gap of simplices, Comm. Math. Phys. 319 (2013) 111–145",
	},
	// L. E. Payne and H. F. Weinberger, An optimal Poincaré inequality for
	// convex domains, Arch. Rational Mech. Anal. 5 (1960) 286–292: for a
	// bounded convex domain of diameter D in R^n, any n, the first
	// nonzero Neumann eigenvalue of −Δ (λ2, since λ1 = 0) is at least
	// π²/D².
	{
		Name:       "payne_weinberger",
		Inequality: "lambda2 >= pi^2/D^2",
		Dims:       []int{1, 2, 3, 4},
		Hypotheses: []string{NeumannBoundary, ConvexDomain, ZeroPotential},
		Source:     "L. E. Payne and H. F. Weinberger, An optimal Poincaré inequality for convex domains, Arch. Rational Mech. Anal. 5 (1960) 286–292",
	},
	// The Robin gap conjecture: for a bounded convex domain of diameter D
	// and Robin coefficient α, the gap of −Δ is at least the gap of the
	// interval (0, D) with the same α at both ends ("the line segment
	// minimizes the Robin spectral gap under diameter normalization").
	// Open for convex polygons; proved for rectangular boxes by R. S.
	// Laugesen, The Robin Laplacian — spectral conjectures, rectangular
	// theorems, arXiv:1905.07658 (2019).
	{
		Name:             "robin_comparison",
		Inequality:       "gap >= " + RobinIntervalGap,
		Dims:             []int{2},
		Hypotheses:       []string{RobinBoundary, ZeroPotential, ConvexDomain, Rectangle},
		Reference:        RobinIntervalGap,
		ReferenceResult:  claim.Gap,
		ReferenceProblem: robinInterval,
		Source:           "the Robin gap conjecture for convex domains (open); proved for rectangles by R. S. Laugesen, The Robin Laplacian — spectral conjectures, rectangular theorems, arXiv:1905.07658",
	},
	// The Robin gap bound under log-concavity, on an interval (a, b) of
	// length L = D: with a Robin or Neumann condition at each end (the two
	// coefficients may differ) and V continuous on [a, b], if the ground
	// state u1 is log-concave, then λ2 − λ1 ≥ π²/L². Proved in the package
	// documentation ("The Robin gap under log-concavity"), self-contained;
	// the weighted one-dimensional bound it rests on is classical (L. E.
	// Payne and H. F. Weinberger, Arch. Rational Mech. Anal. 5 (1960)
	// 286–292, §2 and its Remark 1; cited from a secondary source).
	{
		Name:       "robin_log_concave_gap",
		Inequality: "gap >= pi^2/D^2",
		Dims:       []int{1},
		Hypotheses: []string{RobinOrNeumannSides, ContinuousPotential, LogConcaveGroundState},
		Source:     "proved in the documentation of package fem/claim/named (ground-state substitution v = u2/u1 and a Dirichlet problem for v′√(u1²)); the weighted one-dimensional bound is classical: L. E. Payne and H. F. Weinberger, An optimal Poincaré inequality for convex domains, Arch. Rational Mech. Anal. 5 (1960) 286–292, §2 (cited from a secondary source)",
	},
	// B. Andrews, J. Clutterbuck and D. Hauer, Non-concavity of the Robin
	// ground state, Camb. J. Math. 8 (2020) 243–310, arXiv:1711.02779
	// (abstract and main results): on a convex polyhedral domain that is
	// not in a special class (products of circumsolids; in the plane a
	// tangential polygon or a rectangle), the Robin ground state of −Δ is
	// not log-concave for all sufficiently small Robin parameters α > 0.
	// The theorem gives no explicit threshold on α, so for a given α it
	// predicts nothing checkable: the verdict rests on the certified
	// witness alone, shape_margin > 0 (a midpoint triple with
	// u(m)² < u(x)u(y) in results.ground_state, which needs certify
	// --ground-state). The hypotheses say whether the theorem's setting
	// applies: convex_domain, robin_boundary (one α on every side),
	// positive_robin_alpha (that α > 0; α = 0 is the Neumann case, whose
	// ground state is constant) and zero_potential proven, and
	// circumsolid_product DISPROVEN (the theorem predicts failure only
	// outside the products of circumsolids).
	{
		Name:       "robin_ground_state_not_log_concave",
		Inequality: claim.ShapeMargin + " > 0",
		Dims:       []int{2},
		Hypotheses: []string{ConvexDomain, RobinBoundary, PositiveRobinAlpha, ZeroPotential, CircumsolidProduct},
		Source:     "B. Andrews, J. Clutterbuck and D. Hauer, Non-concavity of the Robin ground state, Camb. J. Math. 8 (2020) 243–310, arXiv:1711.02779: on a convex polygon that is not a product of circumsolids (circumsolid_product disproven) with V = 0 and one Robin α > 0 on every side, the ground state is not log-concave for sufficiently small α, with no explicit threshold; the verdict rests on the certified witness alone (shape_margin > 0 needs certify --ground-state)",
	},
}

// robinInterval is the reference problem of @robin_comparison: −u″ = λu on
// (0, D), D the diameter of the domain, with the domain's common Robin
// coefficient α at both ends, its two lowest eigenvalues at the relative
// width 1e-10 (far below the widths of polygon enclosures, so that the
// comparison is limited by the polygon).
var robinInterval = &ReferenceProblem{
	Inputs: []string{claim.Alpha, claim.Diameter},
	file: func(in, params map[string]string) map[string]any {
		return map[string]any{
			"name":        "interval (0, D) with the Robin coefficient of the polygon",
			"domain":      map[string]any{"interval": []string{"0", in[claim.Diameter]}},
			"parameters":  params,
			"boundary":    map[string]string{"robin": in[claim.Alpha]},
			"eigenvalues": 2,
			"target":      map[string]string{"relative_width": "1e-10"},
		}
	},
}

// All returns the catalogue in a fixed order. The caller must not modify
// the entries' slices.
func All() []Claim { return slices.Clone(catalogue) }

// Names returns the texts ("@name") of every built-in claim.
func Names() []string {
	out := make([]string, len(catalogue))
	for i, c := range catalogue {
		out[i] = c.Text()
	}
	return out
}

// IsNamed reports whether a claim text names a built-in claim (starts with
// Prefix after leading spaces).
func IsNamed(text string) bool { return strings.HasPrefix(strings.TrimSpace(text), Prefix) }

// NameError reports a built-in claim name that is not in the catalogue.
type NameError struct {
	Text    string
	Nearest string // a catalogue text within a small edit distance, or ""
}

func (e *NameError) Error() string {
	return fmt.Sprintf("unknown built-in claim %q", e.Text)
}

// Hint suggests a correction.
func (e *NameError) Hint() string {
	if e.Nearest != "" {
		return fmt.Sprintf("did you mean %q?", e.Nearest)
	}
	return "built-in claims: " + strings.Join(Names(), ", ")
}

// Lookup returns the built-in claim a text names: the text after Prefix,
// with surrounding spaces removed, upper case read as lower case and '-' as
// '_'. It returns a *NameError if there is none.
func Lookup(text string) (Claim, error) {
	key := normalise(text)
	for _, c := range catalogue {
		if c.Name == key {
			return c, nil
		}
	}
	e := &NameError{Text: text}
	best := 3
	for _, c := range catalogue {
		if d := claim.EditDistance(key, c.Name); d < best {
			e.Nearest, best = c.Text(), d
		}
	}
	return Claim{}, e
}

func normalise(text string) string {
	s := strings.TrimSpace(text)
	s = strings.TrimPrefix(s, Prefix)
	s = strings.TrimSpace(s)
	return strings.ReplaceAll(strings.ToLower(s), "-", "_")
}
