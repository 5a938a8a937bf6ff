package cover

import (
	"fmt"
	"math/big"

	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
	"gapcert/interval"
	"gapcert/interval/decimalio"
	"gapcert/interval/formula"
)

// GeometryRule bounds the eigenvalues of a triangle whose vertices are
// formulas in the covered parameters, over a whole cell, by those of one
// reference triangle: the triangle at the cell's centre (exact rational
// parameter values).
//
// # The affine comparison
//
// Let Ω be the reference triangle with vertices Q₀, Q₁, Q₂ and, for a
// parameter value p of the cell, Φ(x) = A x + b the affine map with
// Φ(Q_i) = P_i(p), the triangle's vertices at p (A = E F⁻¹ with E = [P₁ −
// P₀, P₂ − P₀] and F = [Q₁ − Q₀, Q₂ − Q₀] by columns; F is invertible
// since Ω is a triangle). Let σ_min ≤ σ_max be the singular values of A,
// with σ_min > 0. Then for the Dirichlet, Neumann or mixed
// Dirichlet–Neumann Laplacian (V = 0; a constant V below), with side i
// of Φ(Ω) carrying the condition of side i of Ω, every eigenvalue
// satisfies
//
//	λ_k(Ω)/σ_max² ≤ λ_k(Φ(Ω)) ≤ λ_k(Ω)/σ_min².
//
// Proof. Φ is a bijection of the closed triangles mapping side i of Ω
// onto side i of Φ(Ω) (an affine map sends the segment Q_iQ_{i+1} onto
// P_iP_{i+1}). For u ∈ H¹(Φ(Ω)) put v = u∘Φ. By the chain rule ∇v(x) =
// Aᵀ ∇u(Φ(x)), so ∇u(Φ(x)) = A⁻ᵀ ∇v(x), and the change of variables y =
// Φ(x), dy = |det A| dx, gives
//
//	∫_{Φ(Ω)} |∇u|² dy = ∫_Ω |A⁻ᵀ ∇v|² |det A| dx,   ∫_{Φ(Ω)} u² dy = ∫_Ω v² |det A| dx.
//
// The map u ↦ u∘Φ is a linear bijection of H¹(Φ(Ω)) onto H¹(Ω) (its
// inverse is v ↦ v∘Φ⁻¹; both are bounded by the formulas above), and
// the trace of u vanishes on side i of Φ(Ω) if and only if the trace of v
// vanishes on side i of Ω, so it maps the form domain of Φ(Ω) (traces
// zero on the Dirichlet sides) onto that of Ω, and k-dimensional
// subspaces onto k-dimensional subspaces. The singular values of A⁻ᵀ are
// 1/σ_max ≤ 1/σ_min, so |ξ|/σ_max ≤ |A⁻ᵀξ| ≤ |ξ|/σ_min for every ξ, and
// (|det A| being a constant factor of both integrals) the Rayleigh
// quotients satisfy
//
//	R_Ω(v)/σ_max² ≤ R_{Φ(Ω)}(u) ≤ R_Ω(v)/σ_min²,   R(w) = ∫|∇w|² / ∫w².
//
// By the min–max principle λ_k = min over k-dimensional subspaces S of
// the form domain of max over S∖{0} of R (R. Courant and D. Hilbert,
// Methods of Mathematical Physics I, 1953, Ch. VI §1; the change of
// variables in it as in A. Henrot, Extremum Problems for Eigenvalues of
// Elliptic Operators, Birkhäuser 2006, §1.3 and §2.1, recalled from
// memory). Taking the max over S of the pointwise inequalities, then the
// min over the corresponding subspaces, gives the statement. ∎
//
// A constant potential V ≡ c shifts every eigenvalue by c on every
// domain (the form gains c∫u²), so λ_k(Φ(Ω)) − c lies between (λ_k(Ω) −
// c)/σ_max² and (λ_k(Ω) − c)/σ_min², where λ_k(Ω) − c ≥ 0 is the
// Laplacian's. A potential that varies in x or y becomes ∫_Ω (V∘Φ) v²
// |det A|, which is not V's on Ω; with a Robin side the term α∫_{Γ_i} u²
// ds becomes α (|P_{i+1} − P_i| / |Q_{i+1} − Q_i|) ∫_{Γ_i} v² ds, scaled
// by the side's length ratio instead of |det A|. Neither fits the
// two-sided ratio above, so the rule refuses both (a Robin side with α =
// 0 is the Neumann condition and is accepted), and a potential that
// names a covered parameter.
//
// # Enclosing the singular values over a cell
//
// At the cell's centre A = I. For every A of the cell write A = I + Δ
// with Δ = (E − F) F⁻¹. Then σ_max(A) = ‖A‖₂ ≤ 1 + ‖Δ‖₂ and σ_min(A) =
// min_{|x|=1} |Ax| ≥ min_{|x|=1} (|x| − |Δx|) ≥ 1 − ‖Δ‖₂ (triangle
// inequality; this is Weyl's inequality for singular values in the case
// needed here), and ‖Δ‖₂ ≤ ‖Δ‖_F (Cauchy–Schwarz on each row). The
// entries of E over the cell are enclosed by interval evaluation of the
// vertex formulas on the cell's parameter box, those of F and F⁻¹ =
// adj(F)/det F at the centre, so Δ lies entrywise in an interval matrix
// [Δ] and
//
//	‖Δ‖_F ≤ r = sqrt(Σ_ij mag([Δ]_ij)²)   (rounded up).
//
// When r < 1, σ_min ≥ 1 − r > 0 on the whole cell (so no triangle of the
// cell is degenerate: det A ≠ 0, and det A > 0 by continuity from det I =
// 1), and for every p of the cell and every k
//
//	λ_k(p) ∈ λ_k(Ω)·[1/(1 + r)², 1/(1 − r)²] ⊆ [ℓ_k/(1 + r)², u_k/(1 − r)²],
//
// with [ℓ_k, u_k] the reference certificate's enclosure (λ_k(Ω) ≥ 0 since
// the form is nonnegative); with V ≡ c, λ_k(p) ∈ ([ℓ_k, u_k] − c)·[1/(1 +
// r)², 1/(1 − r)²] + c in interval arithmetic. As the cell shrinks r → 0, so the cell's
// enclosures tend to the reference's. When r ≥ 1 the cell may contain a
// degenerate triangle and its eigenvalues are not bounded: the claims
// that name them are undecided with that reason and the cell is split.
// The gap over the cell is bounded by λ₂'s lower end minus λ₁'s upper
// end, and the other way round.
//
// The diameter, area, perimeter and inradius over the cell are enclosed
// by interval evaluation on the cell's vertex enclosures: the side
// lengths sqrt(Δx² + Δy²), D their maximum (a triangle's diameter is its
// longest side, common practice), the area |det E|/2, the perimeter the
// sum of the sides, the inradius 2·area/perimeter (common practice).
//
// Order refuses, before anything is computed: a domain that is not a
// triangle (the piecewise affine maps of a triangulation are not
// implemented), a Robin side with α ≠ 0, a potential that is not a
// constant free of covered parameters, and a box in which the
// triangle degenerates somewhere (its doubled signed area is not proved
// of one strict sign on a subdivision of the box).
type GeometryRule struct{}

// Name implements Rule.
func (GeometryRule) Name() string { return geometryRuleName }

const geometryRuleName = "affine_geometry"

// Part implements Rule.
func (GeometryRule) Part() string { return "domain" }

// Order implements Rule. Its uses have sign 0: the geometry rule bounds
// λ_k over a cell by the reference triangle at the cell's centre, not by
// an order, and the cover takes the centre for every geometry parameter
// (Corners).
func (r GeometryRule) Order(f *Family, ref *problem.Problem, j int) ([]Use, error) {
	name := f.Params[j].Name
	tri, err := triangleFormulas(f)
	if err != nil {
		return nil, err
	}
	for i, bc := range ref.Boundary {
		if bc.Kind == boundary.Robin && !(bc.Alpha.Rat != nil && bc.Alpha.Rat.Sign() == 0) {
			return nil, fmt.Errorf("side %d has a Robin condition (α = %s): under the affine map of the geometry rule the term α∫u² on a side scales with that side's length ratio, not with |det A| as the other terms, so λ_k is not bounded by the reference's through the singular values of A; geometry is covered with Dirichlet and Neumann sides only", templateSide(f, ref, i), bc.Alpha.Text)
		}
	}
	if _, err := constantPotential(f, ref); err != nil {
		return nil, err
	}
	box := paramBox(f, f.Box(), ref)
	if err := tri.decideNondegenerate(box); err != nil {
		return nil, err
	}
	var uses []Use
	for i := range tri.v {
		for c := 0; c < 2; c++ {
			e := tri.v[i][c]
			if !mentions(e, name) {
				continue
			}
			g, err := e.Gradient(box, []string{name})
			if err != nil || !isFinite(g[0]) {
				return nil, fmt.Errorf("the derivative of the vertex coordinate %s = %s in %s is not enclosed by interval differentiation on the box (recorded with each use); write the vertex with functions smooth on the box", vertexPath(i, c), e, name)
			}
			uses = append(uses, Use{Path: vertexPath(i, c), Rule: r.Name(), Sign: 0, Derivative: boundText(g[0])})
		}
	}
	return uses, nil
}

// constantPotential returns the enclosure of V when V is a constant that
// names no covered parameter, else an error saying why the geometry rule
// does not apply.
func constantPotential(f *Family, ref *problem.Problem) (interval.I, error) {
	text := ref.PotentialText()
	e, err := formula.Parse(text)
	if err != nil {
		return interval.I{}, fmt.Errorf("the potential %q does not read as a formula: %v", text, err)
	}
	for _, v := range e.Vars() {
		covered := false
		for _, p := range f.Params {
			covered = covered || p.Name == v
		}
		if covered || v == "x" || v == "y" {
			return interval.I{}, fmt.Errorf("the potential is V = %s: under the affine map of the geometry rule V becomes V∘Φ, which is not V, so λ_k is not bounded by the reference's through the singular values of A; geometry is covered with a constant V only (naming no covered parameter)", text)
		}
	}
	c, err := ref.Potential.EvalConst()
	if err != nil || !isFinite(c) {
		return interval.I{}, fmt.Errorf("the constant potential V = %s has no bounded enclosure", text)
	}
	return c, nil
}

func vertexPath(i, c int) string { return fmt.Sprintf("domain.polygon[%d][%d]", i, c) }

// geometric reports whether the dependence is through the geometry rule.
func (d Dependence) geometric() bool {
	for _, u := range d.Uses {
		if u.Rule == geometryRuleName {
			return true
		}
	}
	return false
}

// geometric reports whether some parameter moves the domain.
func (f *Family) geometric() bool {
	for _, d := range f.Dependences {
		if d.geometric() {
			return true
		}
	}
	return false
}

// triangle holds the vertex formulas of the template's triangle, in the
// template's order, and its doubled signed area as one formula.
type triangle struct {
	v     [3][2]*formula.Expr
	area2 *formula.Expr
}

// triangleFormulas reads the template's domain as a triangle whose
// coordinates are formulas in the parameters.
func triangleFormulas(f *Family) (*triangle, error) {
	var dom struct {
		Interval []any   `json:"interval"`
		Polygon  [][]any `json:"polygon"`
	}
	raw, ok := f.template["domain"]
	if !ok || strictjson.Decode(raw, &dom) != nil {
		return nil, fmt.Errorf("the geometry rule covers a triangle {\"polygon\": [[x0, y0], [x1, y1], [x2, y2]]}; template.domain is not one")
	}
	if dom.Polygon == nil {
		return nil, fmt.Errorf("the geometry rule covers triangles; template.domain is not a polygon")
	}
	if len(dom.Polygon) != 3 {
		return nil, fmt.Errorf("the geometry rule maps a triangle by one affine map; template.domain has %d vertices (the piecewise affine maps of a triangulated polygon are not implemented)", len(dom.Polygon))
	}
	t := &triangle{}
	var texts [3][2]string
	for i, v := range dom.Polygon {
		if len(v) != 2 {
			return nil, fmt.Errorf("vertex %d of template.domain.polygon is not [x, y]", i)
		}
		for c := 0; c < 2; c++ {
			s := fmt.Sprint(v[c])
			e, err := formula.Parse(s)
			if err != nil {
				return nil, fmt.Errorf("the vertex coordinate %s = %q does not read as a formula: %v", vertexPath(i, c), s, err)
			}
			t.v[i][c], texts[i][c] = e, "("+s+")"
		}
	}
	x, y := func(i int) string { return texts[i][0] }, func(i int) string { return texts[i][1] }
	src := fmt.Sprintf("(%s-%s)*(%s-%s)-(%s-%s)*(%s-%s)", x(1), x(0), y(2), y(0), x(2), x(0), y(1), y(0))
	e, err := formula.Parse(src)
	if err != nil {
		return nil, fmt.Errorf("the triangle's area does not read as a formula: %v", err)
	}
	t.area2 = e
	return t, nil
}

// maxAreaPieces bounds the boxes decideNondegenerate evaluates.
const maxAreaPieces = 4096

// decideNondegenerate proves that the doubled signed area of the triangle
// has one strict sign on the parameter box env (interval evaluation on a
// subdivision of the box, bisecting pieces whose enclosure contains 0), so
// that no triangle of the box is degenerate; otherwise it says where it
// failed.
func (t *triangle) decideNondegenerate(env map[string]interval.I) error {
	vars := t.area2.Vars()
	pieces := []map[string]interval.I{env}
	sign := 0
	var signBox map[string]interval.I
	for evals := 0; len(pieces) > 0; evals++ {
		b := pieces[0]
		pieces = pieces[1:]
		a, err := t.area2.Eval(b)
		s := 0
		if err == nil {
			s = a.Sign()
		}
		if s != 0 {
			if sign != 0 && s != sign {
				pos, neg := signBox, b
				if sign < 0 {
					pos, neg = b, signBox
				}
				return fmt.Errorf("the triangle changes orientation in the box (its signed area is > 0 on %s and < 0 on %s), so some triangle of the box is degenerate; cover the two sides separately", boxWords(pos, vars), boxWords(neg, vars))
			}
			if sign == 0 {
				sign, signBox = s, b
			}
			continue
		}
		if err == nil && a.Lo == 0 && a.Hi == 0 {
			return fmt.Errorf("the triangle is degenerate (zero area) on %s", boxWords(b, vars))
		}
		if evals >= maxAreaPieces {
			return fmt.Errorf("the triangle's area is not proved nonzero on the box after %d pieces (enclosure %v on %s): the box may contain a degenerate triangle; shrink the range away from it", evals, a, boxWords(b, vars))
		}
		lower, upper, ok := bisectEnv(b, vars, env)
		if !ok {
			return fmt.Errorf("the triangle's area is not proved nonzero on %s (enclosure %v): the box may contain a degenerate triangle", boxWords(b, vars), a)
		}
		pieces = append(pieces, lower, upper)
	}
	return nil
}

// at encloses the vertices over the parameter enclosures env.
func (t *triangle) at(env map[string]interval.I) ([3][2]interval.I, error) {
	var out [3][2]interval.I
	for i := range t.v {
		for c := 0; c < 2; c++ {
			x, err := t.v[i][c].Eval(env)
			if err != nil {
				return out, fmt.Errorf("vertex coordinate %s: %v", vertexPath(i, c), err)
			}
			if !isFinite(x) {
				return out, fmt.Errorf("vertex coordinate %s: unbounded enclosure", vertexPath(i, c))
			}
			out[i][c] = x
		}
	}
	return out, nil
}

// cellGeometry is what the geometry rule proves on one cell.
type cellGeometry struct {
	// R bounds ‖A − I‖_F over the cell (rounded up).
	R float64
	// Scale encloses 1/σ² for every singular value σ of every A of the
	// cell, [1/(1+R)², 1/(1−R)²]; valid only when R < 1.
	Scale interval.I
	// Vertices enclose the triangle's vertices over the cell.
	Vertices [3][2]interval.I
}

// edgeMatrix returns [P₁ − P₀, P₂ − P₀] by columns: m[row][col].
func edgeMatrix(v [3][2]interval.I) [2][2]interval.I {
	var m [2][2]interval.I
	for c := 0; c < 2; c++ {
		m[c][0] = v[1][c].Sub(v[0][c])
		m[c][1] = v[2][c].Sub(v[0][c])
	}
	return m
}

// geometryOver encloses the affine maps from the reference triangle (at
// the parameter values centre) to every triangle of the cell b (see
// GeometryRule: Δ = (E − F)F⁻¹, r = sqrt(Σ mag(Δ_ij)²) rounded up).
func (f *Family) geometryOver(b Box, ref *problem.Problem, centre []*big.Rat) (cellGeometry, error) {
	tri, err := triangleFormulas(f)
	if err != nil {
		return cellGeometry{}, err
	}
	cellEnv := paramBox(f, b, ref)
	refEnv := map[string]interval.I{}
	for k, v := range cellEnv {
		refEnv[k] = v
	}
	for j, p := range f.Params {
		refEnv[p.Name] = decimalio.FromRat(centre[j])
	}
	pv, err := tri.at(cellEnv)
	if err != nil {
		return cellGeometry{}, err
	}
	qv, err := tri.at(refEnv)
	if err != nil {
		return cellGeometry{}, err
	}
	E, F := edgeMatrix(pv), edgeMatrix(qv)
	detF := F[0][0].Mul(F[1][1]).Sub(F[0][1].Mul(F[1][0]))
	if detF.ContainsZero() {
		return cellGeometry{}, fmt.Errorf("the reference triangle's area is not proved nonzero (det F ∈ %v)", detF)
	}
	// F⁻¹ = adj(F)/det F.
	Finv := [2][2]interval.I{
		{F[1][1].Div(detF), F[0][1].Neg().Div(detF)},
		{F[1][0].Neg().Div(detF), F[0][0].Div(detF)},
	}
	var sum float64
	for i := 0; i < 2; i++ {
		for j := 0; j < 2; j++ {
			// Δ_ij = Σ_l (E − F)_il (F⁻¹)_lj.
			d := E[i][0].Sub(F[i][0]).Mul(Finv[0][j]).Add(E[i][1].Sub(F[i][1]).Mul(Finv[1][j]))
			m := d.Mag()
			sum = interval.AddUp(sum, interval.MulUp(m, m))
		}
	}
	g := cellGeometry{R: interval.SqrtUp(sum), Vertices: pv}
	if g.R < 1 {
		one, r := interval.Point(1), interval.Point(g.R)
		lo := one.Div(one.Add(r).Sqr())
		hi := one.Div(one.Sub(r).Sqr())
		g.Scale = interval.I{Lo: lo.Lo, Hi: hi.Hi}
	}
	return g, nil
}

// triangleQuantities encloses D, area, perimeter and inradius over the
// vertex enclosures v (see GeometryRule).
func triangleQuantities(v [3][2]interval.I) (d, area, perimeter, inradius interval.I, err error) {
	var sides [3]interval.I
	for i := 0; i < 3; i++ {
		a, b := v[i], v[(i+1)%3]
		s2 := b[0].Sub(a[0]).Sqr().Add(b[1].Sub(a[1]).Sqr())
		s, ok := s2.Sqrt()
		if !ok {
			return d, area, perimeter, inradius, fmt.Errorf("side %d: no square root of %v", i, s2)
		}
		sides[i] = s
	}
	d = sides[0].Max(sides[1]).Max(sides[2])
	perimeter = sides[0].Add(sides[1]).Add(sides[2])
	E := edgeMatrix(v)
	det := E[0][0].Mul(E[1][1]).Sub(E[0][1].Mul(E[1][0])).Abs()
	area = det.MulF(0.5)
	inradius = det.Div(perimeter)
	return d, area, perimeter, inradius, nil
}
