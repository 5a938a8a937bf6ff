package certify

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"time"

	"gapcert/fem/mesh3"
	"gapcert/fem/problem"
	"gapcert/fem/tet"
)

// This file chooses where the trial mesh of a polyhedron is graded: the
// edges along which eigenfunctions are singular, and how many levels each
// gets. Nothing here is a bound; the graded mesh proves its own tiling
// (fem/mesh3's RefineToward).

// maxPolyhedronGraded caps the grading levels (recipe graded) of a
// polyhedron's trial mesh. Each level adds tetrahedra along the whole
// length of a singular edge (about twice the previous level's), so the
// memory estimate stops a run long before the cap.
const maxPolyhedronGraded = 16

// polyhedronGradedDegree is the degree up to which singular exponents
// count when the trial mesh is graded (singularEdges): fixed, not the
// recipe's degree, so that raising the degree keeps the trial mesh; it is
// part of what a recorded graded_levels means on a polyhedron.
const polyhedronGradedDegree = maxPolyhedronDegree

// singularEdge is an edge of the polyhedron along which eigenfunctions are
// singular, with the grading levels it gets (a choice).
type singularEdge struct {
	a, b   int     // its vertices (indices in Polyhedron.Vertices), a < b
	nu     float64 // its leading singular exponent
	levels int
}

// singularEdges lists the edges of the polyhedron of p along which
// eigenfunctions are singular for trial degree `degree`, sorted by their
// vertices, with the grading levels of each when the strongest (least ν)
// gets `graded` levels (⌈graded·ν_min/ν⌉, as singularCorners on polygons).
//
// Near an edge of interior dihedral angle θ between faces with the
// conditions c1 and c2, eigenfunctions behave like r^ν Φ(φ) in the
// coordinates (r, φ) of the plane normal to the edge, with the exponents of
// the plane sector of angle θ (Grisvard, Elliptic Problems in Nonsmooth
// Domains, Pitman 1985, ch. 8; Dauge, Elliptic Boundary Value Problems on
// Corner Domains, LNM 1341, 1988: the edge exponents are those of the
// sector problem normal to the edge; recalled from memory):
//
//	Dirichlet–Dirichlet, Neumann–Neumann  ν_k = kπ/θ
//	Dirichlet–Neumann                     ν_k = (k − ½)π/θ
//
// (a Robin face acts as a Neumann face at leading order), and the least
// non-integer exponent below `degree` is the edge's (cornerExponent's
// rule; integer exponents are polynomials). So a Dirichlet edge is
// singular for θ > π (ν = π/θ < 1) and a mixed one for θ > π/2 (ν < 1);
// θ = π/2 gives only integers. Vertex singularities (exponents from an
// eigenvalue problem on the spherical polygon of the vertex) are not
// decided: the vertices at the ends of a singular edge are graded with it,
// other vertices are not. The angle is computed in floating point from the
// vertices' midpoints: a choice of where to grade, never a bound.
func singularEdges(p *problem.Problem, degree, graded int) []singularEdge {
	ph := p.Polyhedron
	nodes := ph.Nodes()
	pt := func(k int) [3]float64 { return [3]float64{nodes[k][0].Mid(), nodes[k][1].Mid(), nodes[k][2].Mid()} }
	type side struct {
		face int
		in   [3]float64 // unit vector from the edge into the face, in its plane
	}
	normals := make([][3]float64, len(ph.Faces))
	for f, cyc := range ph.Faces {
		// Newell's normal of the outward cycle (common practice).
		var n [3]float64
		for i, v := range cyc {
			a, b := pt(v), pt(cyc[(i+1)%len(cyc)])
			n[0] += (a[1] - b[1]) * (a[2] + b[2])
			n[1] += (a[2] - b[2]) * (a[0] + b[0])
			n[2] += (a[0] - b[0]) * (a[1] + b[1])
		}
		normals[f] = unit3(n)
	}
	sides := make(map[[2]int][]side)
	var order [][2]int
	for f, cyc := range ph.Faces {
		for i, u := range cyc {
			v := cyc[(i+1)%len(cyc)]
			// Walking u → v counterclockwise seen from outside, the face
			// lies to the left: n × (v − u).
			key := [2]int{min(u, v), max(u, v)}
			if sides[key] == nil {
				order = append(order, key)
			}
			sides[key] = append(sides[key], side{f, unit3(cross3(normals[f], sub3f(pt(v), pt(u))))})
		}
	}
	var out []singularEdge
	nuMin := math.Inf(1)
	for _, key := range order {
		s := sides[key]
		if len(s) != 2 {
			continue // fem/problem accepts only closed surfaces: each edge has two faces
		}
		// The angle α ∈ [0, π] between the two in-face directions; the
		// edge is convex when the second face goes to the inner side of
		// the first face's plane, and then θ = α, else θ = 2π − α.
		w1, w2 := s[0].in, s[1].in
		alpha := math.Atan2(norm3(cross3(w1, w2)), dot3(w1, w2))
		theta := alpha
		if dot3(w2, normals[s[0].face]) > 0 {
			theta = 2*math.Pi - alpha
		}
		d1 := p.Boundary[s[0].face].Condition().Essential()
		d2 := p.Boundary[s[1].face].Condition().Essential()
		if nu, ok := sectorExponent(theta, d1 != d2, degree); ok {
			out = append(out, singularEdge{a: key[0], b: key[1], nu: nu})
			nuMin = math.Min(nuMin, nu)
		}
	}
	slices.SortFunc(out, func(x, y singularEdge) int { return cmp.Or(cmp.Compare(x.a, y.a), cmp.Compare(x.b, y.b)) })
	for k := range out {
		out[k].levels = int(math.Ceil(float64(graded)*nuMin/out[k].nu - exponentTolerance))
	}
	return out
}

// sectorExponent returns the least non-integer exponent below degree of a
// sector of angle theta whose sides have the same (mixed false) or
// different (mixed true) kinds of condition: kπ/θ, or (k − ½)π/θ when
// mixed, k = 1, 2, … (see cornerExponent), and false when every exponent
// below degree is an integer. Polygon corners and polyhedron edges share
// it.
func sectorExponent(theta float64, mixed bool, degree int) (float64, bool) {
	offset := 0.0
	if mixed {
		offset = 0.5
	}
	for k := 1; ; k++ {
		nu := (float64(k) - offset) * math.Pi / theta
		if nu >= float64(degree) {
			return 0, false
		}
		if math.Abs(nu-math.Round(nu)) > exponentTolerance*math.Max(1, nu) {
			return nu, true
		}
	}
}

// hasSingularEdges reports whether the trial mesh of the polyhedron p is
// graded at any grading depth.
func hasSingularEdges(p *problem.Problem) bool {
	return len(singularEdges(p, polyhedronGradedDegree, 0)) > 0
}

// polyhedronGradingError returns the format error of a recorded
// graded_levels on the polyhedron p: out of range, or positive on a
// polyhedron without singular edges (where grading changes nothing).
func polyhedronGradingError(p *problem.Problem, graded int) error {
	switch {
	case graded < 0 || graded > maxPolyhedronGraded:
		return fmt.Errorf("method.graded_levels %d out of range (0 to %d on polyhedra)", graded, maxPolyhedronGraded)
	case graded > 0 && !hasSingularEdges(p):
		return fmt.Errorf("method.graded_levels %d on a polyhedron without singular edges (want 0)", graded)
	}
	return nil
}

// PolyhedronTrialMesh returns the trial mesh of a polyhedron certificate
// whose method records refinements and gradedLevels, built as the
// certifier builds it (polyhedronTrialMesh), for pictures of its modes.
// Values out of the ranges Check accepts are refused.
func PolyhedronTrialMesh(p *problem.Problem, refinements, gradedLevels int) (*tet.Mesh, error) {
	if p.Polyhedron == nil {
		return nil, fmt.Errorf("not a polyhedron problem")
	}
	if refinements < 0 || refinements > maxPolyhedronRefine {
		return nil, fmt.Errorf("method.refinements %d out of range (0 to %d on polyhedra)", refinements, maxPolyhedronRefine)
	}
	if err := polyhedronGradingError(p, gradedLevels); err != nil {
		return nil, err
	}
	return polyhedronTrialMesh(p, recipe{refine: refinements, graded: gradedLevels})
}

// polyhedronTrialMesh is the trial mesh of recipe r: the cone tetrahedra
// refined uniformly r.refine times (polyhedronMesh), then graded toward
// the singular edges (singularEdges at polyhedronGradedDegree, the
// strongest with r.graded levels) by fem/mesh3's RefineToward, which
// proves the graded tiling. The levels depend only on the problem and
// r.graded, so a check replays them.
func polyhedronTrialMesh(p *problem.Problem, r recipe) (*tet.Mesh, error) {
	m, err := polyhedronMesh(p, r.refine)
	if err != nil || r.graded == 0 {
		return m, err
	}
	var targets []mesh3.Target
	for _, e := range singularEdges(p, polyhedronGradedDegree, r.graded) {
		targets = append(targets, mesh3.Target{A: e.a, B: e.b, Levels: e.levels})
	}
	if len(targets) == 0 {
		return m, nil
	}
	g, err := m.Mesh3().RefineToward(targets)
	if err != nil {
		return nil, err
	}
	return tet.NewMesh(g, len(p.Polyhedron.Faces))
}

// polyhedronTrialTetrahedra is the number of tetrahedra of the trial
// mesh of r (for the memory estimate and the plan, before anything is
// computed): polyhedronTetrahedra without grading; counted on the graded
// meshes of 1, 2, … levels while they have at most
// maxCountedTetrahedra (their construction costs far less than a step
// on them), and beyond that estimated as growing per further level by
// the last counted level's factor or three, whichever is larger, so that
// a deep recorded grading is refused by the memory estimate without being
// built. Measured, the factor of a level falls as the levels go on (the
// L-shaped prism: 3.7 down to 2.2; the thin star prism of
// TestPolyhedronGradedCountPathological refined once: 4.3 at its second
// level, 3.05 at its third, where three alone fell 1.6% short).
func polyhedronTrialTetrahedra(p *problem.Problem, r recipe) int64 {
	n := polyhedronTetrahedra(p, r.refine)
	if r.graded == 0 || !hasSingularEdges(p) {
		return n
	}
	prev := n
	for j := 1; j <= r.graded; j++ {
		factor := 3.0
		if j > 1 {
			factor = math.Max(factor, float64(n)/float64(prev))
		}
		beyond := func() int64 {
			return int64(math.Min(float64(n)*math.Pow(factor, float64(r.graded-j+1)), math.MaxInt64/4))
		}
		if n > maxCountedTetrahedra {
			return beyond()
		}
		g := r
		g.graded = j
		m, err := polyhedronTrialMesh(p, g)
		if err != nil {
			return beyond()
		}
		prev, n = n, int64(m.NumTets())
	}
	return n
}

// maxCountedTetrahedra bounds the graded meshes that
// polyhedronTrialTetrahedra builds to count them.
const maxCountedTetrahedra = 1 << 15

func sub3f(a, b [3]float64) [3]float64 { return [3]float64{a[0] - b[0], a[1] - b[1], a[2] - b[2]} }

func cross3(u, v [3]float64) [3]float64 {
	return [3]float64{u[1]*v[2] - u[2]*v[1], u[2]*v[0] - u[0]*v[2], u[0]*v[1] - u[1]*v[0]}
}

func dot3(u, v [3]float64) float64 { return u[0]*v[0] + u[1]*v[1] + u[2]*v[2] }

func norm3(u [3]float64) float64 { return math.Sqrt(dot3(u, u)) }

func unit3(u [3]float64) [3]float64 {
	n := norm3(u)
	return [3]float64{u[0] / n, u[1] / n, u[2] / n}
}

// gradeBeforeDegree reports whether the polyhedron driver's next step
// after r (with stage B running) grades the trial mesh one level more
// rather than raising the degree: when an edge has an exponent ν < 1 (a
// re-entrant Dirichlet or Neumann edge, a mixed edge beyond π/2) and the
// mesh has fewer than max(1, r.degree − 4) levels (one level at P_5,
// three at P_7: a level at P_5 costs about three times the step, and the
// next about twelve times). Measured on the L-shaped prism
// ([−1,1]²∖[0,1]² × [0,1], Dirichlet sides, Neumann top and bottom; one
// uniform level, 160 tetrahedra; stage A on three levels): the Ritz error
// of λ1 is 1.3e-2 at P_3 (671 unknowns), 5.4e-3 at P_4 (1,625) and 1.9e-3
// at P_3 graded one level (2,178 unknowns, 491 tetrahedra), 6.8e-4 graded
// two levels (7,777), and the Lehmann–Goerisch error of λ1 5.5e-3 graded
// once against 1.8e-2 at P_4; λ2, whose eigenfunction is less singular,
// gains more from the degree (5.1e-4 at P_4, 1.1e-3 graded). Each level
// has about three times the tetrahedra (eight for a uniform level). End
// to end (certify --rel-width 1e-3, 2 shared cores), on the L-shaped
// prism ((0,2)²∖[1,2]² × (0,1), Neumann bottom and side y = 0, other faces
// Dirichlet): without grading, P_8 on 160 tetrahedra ended at relative
// widths 9.5e-4 (λ1), 8.9e-4 (λ2), 2.8e-3 (gap), stopped by the memory
// budget (125 s of CPU time, 213 s wall, 1.7 GB); with it, P_5 graded
// once gave 4.2e-4, 4.2e-4, 1.3e-3 at 112 s wall, and P_7 graded once
// 1.9e-4, 1.8e-4, 5.7e-4, reaching the target (253 s of CPU time, 415 s
// wall, 3.1 GB). A choice; every recipe gives sound bounds.
func gradeBeforeDegree(p *problem.Problem, r recipe) bool {
	if r.graded >= min(max(1, r.degree-4), maxPolyhedronGraded) {
		return false
	}
	for _, e := range singularEdges(p, polyhedronGradedDegree, 0) {
		if e.nu < 1 {
			return true
		}
	}
	return false
}

// gradedStepTime predicts the time of the part of a polyhedron step
// outside stage A after the trial mesh is graded from r.graded to
// next.graded levels, from that part's last time: the sparse
// factorizations and the fluxes of a 3D mesh cost about N² (the split
// time prediction of polyhedron.stepTime), and N follows the tetrahedra.
func gradedStepTime(p *problem.Problem, r, next recipe, rest time.Duration) time.Duration {
	ratio := float64(polyhedronTrialTetrahedra(p, next)) / float64(max(polyhedronTrialTetrahedra(p, r), 1))
	return time.Duration(float64(rest) * ratio * ratio)
}
