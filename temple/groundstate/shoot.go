package groundstate

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// Kind is the kind of a boundary condition at one end of an interval.
type Kind int

const (
	// Dirichlet is u = 0.
	Dirichlet Kind = iota + 1
	// Neumann is u′ = 0.
	Neumann
	// Robin is ∂u/∂n + αu = 0 with the outward normal n (−u′(a) + αu(a) = 0
	// at the left end, u′(b) + αu(b) = 0 at the right end).
	Robin
)

// Boundary is the condition at one end. Alpha (an enclosure of the exact
// coefficient α) is read only for Robin.
type Boundary struct {
	Kind  Kind
	Alpha interval.I
}

// Problem is −u″ + V u = λ u on the interval with ends A < B (each an
// enclosure of the exact end), with the conditions Left and Right. V is a
// formula in x alone (every parameter bound), continuous on [a, b]; it
// must be smooth on each step (Model1), which the integration checks.
type Problem struct {
	V           *formula.Expr
	A, B        interval.I
	Left, Right Boundary
}

// End names the end an initial value problem starts from.
type End int

const (
	// LeftEnd shoots from a to the right.
	LeftEnd End = iota
	// RightEnd shoots from b to the left.
	RightEnd
)

// Options controls the validated integration and the verdict search.
// Zero values take the defaults.
type Options struct {
	// MaxStep is the largest step (default (b − a)/64, at most b − a).
	// Steps are halved where V has no Taylor model, the a priori
	// enclosure fails or h²·max|V − λ| > 1/4, and (at most 4 times) where
	// h² times V's Taylor remainder exceeds 2⁻⁵²; they end at the kinks
	// of V that formula.Kinks lists.
	MaxStep float64
	// Degree is the degree of the Taylor models in the step variable
	// (default 14) and of V's model (min(Degree, 10)).
	Degree int
	// MaxDepth caps the bisections of one cell in LogConcavity (default 14).
	MaxDepth int
	// MaxPieces caps the number of pieces LogConcavity evaluates (default
	// 1 << 18).
	MaxPieces int
}

func (o Options) withDefaults(length float64) Options {
	if !(o.MaxStep > 0) { // also NaN
		o.MaxStep = length / 64
	}
	// A step longer than the interval is never taken; an infinite MaxStep
	// would also survive halving (∞/2 = ∞).
	o.MaxStep = math.Min(o.MaxStep, length)
	if o.Degree <= 0 {
		o.Degree = 14
	}
	if o.MaxDepth <= 0 {
		o.MaxDepth = 14
	}
	if o.MaxPieces <= 0 {
		o.MaxPieces = 1 << 18
	}
	return o
}

// Cell is one step of a shot: the points x = start + σs, s ∈ [s0, s1]
// (σ = +1 from the left end, −1 from the right end).
type Cell struct {
	// X encloses the cell's points for every exact end in the problem's
	// end enclosure.
	X interval.I
	// U and DU enclose u and u′ on the cell, for every member u_λ,
	// λ ∈ [λ], of the shot's family.
	U, DU interval.I

	s0, s1 float64
	h      interval.I    // encloses s1 − s0
	q      tmodel        // V − λ at s0 + ξ(s1 − s0)
	m      [2][2]tmodel  // fundamental matrix of the step: m[i][j] = component i of column j
	y      [2]interval.I // state (w, w_s) at s0
}

// Shot is a validated solution of an initial value problem from one end:
// enclosures of the family {u_λ : λ ∈ [λ]} with the data of the package doc
// at that end, on consecutive cells covering s ∈ [0, Reach] (s the
// distance from the end).
type Shot struct {
	End   End
	Reach float64
	Cells []Cell
	start interval.I
	sigma float64
}

// IntegrationError reports that the validated integration could not
// proceed (V not smooth on a step, or no a priori enclosure down to the
// smallest step).
type IntegrationError struct {
	End End
	At  interval.I // the step's points
	Err error      // the cause (a formula error or errStepTooSmall)
}

func (e *IntegrationError) Error() string {
	side := "left"
	if e.End == RightEnd {
		side = "right"
	}
	return fmt.Sprintf("groundstate: integration from the %s end stopped at x ∈ %v: %v", side, e.At, e.Err)
}

func (e *IntegrationError) Unwrap() error { return e.Err }

var errStepTooSmall = errors.New("no a priori enclosure down to the smallest step")

// Shoot encloses the solutions u_λ, λ ∈ lambda, of u″ = (V − λ)u with the
// initial data of p's condition at end (package doc), on s ∈ [0, reach],
// s the distance from that end.
//
// Method. In s, w(s) = u(start + σs) solves w″ = q w with q = V − λ. On a
// step s = s0 + ξh, ξ ∈ [0, 1], the pair y = (w, w_s) solves
//
//	y(ξ) = y(0) + h ∫_0^ξ A(η) y(η) dη,   A = [[0, 1], [q, 0]],      (P)
//
// and by linearity y(ξ) = M(ξ) y(0) with the fundamental matrix M of the
// step, M(0) = I. Each column of M is enclosed in three stages:
//
//  1. q ∈ Σ C_k ξ^k − λ + R from V's Taylor model (formula.Model1, Taylor's
//     theorem with the Lagrange remainder); Q encloses its range.
//  2. A priori enclosure: a box B = B_w × B_p with
//     y0 + [0, 1]·h·(B_p, Q·B_w) ⊆ B contains y(ξ) for all ξ ∈ [0, 1].
//     Proof: the Picard operator T of (P) maps the continuous functions
//     with values in B into themselves (∫_0^ξ of a function with values
//     in the convex box K lies in ξK ⊆ [0, 1]K), its iterates from y ≡ y0
//     converge uniformly to the solution (|y_{n+1} − y_n| ≤ C(Lh)^n/n! for
//     the linear system with L = max‖A‖), and B is closed (Lohner 1987;
//     Nedialkov–Jackson–Corliss 1999, the a priori enclosure step).
//  3. Picard iteration on Taylor models: start from the constant models
//     B_w, B_p and apply (P) Degree + 4 times (Gauss–Seidel order) with the
//     model operations of taylor.go. If the solution lies in the models
//     before an iteration it lies in them after it, since each operation
//     encloses its exact result pointwise; so the solution lies in the
//     final models. The remainder of the final models is the sum of
//     (i) the a priori box carried through the iterations, which is
//     multiplied by h‖A‖/n at the n-th, so it shrinks like |B|(h‖A‖)^n/n!,
//     (ii) the truncated terms c ξ^k, k > Degree, each enclosed by
//     c·[0, 1] (ξ ∈ [0, 1]), and (iii) V's Taylor remainder R, which enters
//     each product q·w by f g ∈ p q + ρ(range q + σ) + (range p)σ
//     (mulModels) and is integrated by ∫_0^ξ ρ ∈ [0, 1]·ρ (integrate).
//
// Against the wrapping effect the fundamental matrix of the shot,
// Φ_{k+1} = M_k(1) Φ_k, is propagated apart from the initial vector y0
// (an interval for Robin α), and the state at node k is Φ_k y0, so the
// width of y0 is multiplied in once per node instead of being rotated
// through every step. The product of interval matrices still widens by
// rad(Φ_{k+1}) ≤ |M_k|·rad(Φ_k) + rad(M_k)·|Φ_k| per step; where V ≥ λ on
// the step the entries of M_k are ≥ 0 and |M_k| = M_k (no wrapping), where
// V < λ |M_k| exceeds the rotation M_k, and the excess compounds only over
// the oscillatory part of the shot. (Measured: sin x on (0, π) with
// λ = 1 exactly, 8, 32, 158 steps to π/2 give widths 6e-15, 3e-14, 1.4e-13
// at x = 1.5; a QR (Lohner) step is not needed at these sizes.) Steps are
// halved when V has no Taylor model on the step (a kink inside it, or an
// interval overestimation that makes V look undefined), when stage 2
// fails, when h²·|Q| > 1/4, and up to 4 times when h²·|R| > 2⁻⁵²; a step
// ends at each kink that formula.Kinks lists, where Model1 takes one
// branch on each closed step (all choices). A kink that no step can end at
// (not a float, or not reached exactly) leaves V without a Taylor model on
// the steps containing it; once such a step is at most MaxStep·2⁻²⁸ long,
// stage 1 uses V's range over the step as a constant model instead
// (stepModels).
//
// Every operation is outward rounded; h is the interval s1 − s0 of two
// floats. Shoot returns an *IntegrationError (with V's formula error
// when that was the last cause) when a step fails below (reach)·2⁻⁴⁰. It panics on a nil V,
// A ≥ B, reach ≤ 0 or beyond (B − A).Lo, or an unknown boundary kind.
func Shoot(p Problem, end End, lambda interval.I, reach float64, opt Options) (*Shot, error) {
	length := checkProblem(p)
	mustBeLambda(lambda)
	if !(reach > 0) || reach > length.Lo {
		panic("groundstate: reach must lie in (0, b − a]")
	}
	opt = opt.withDefaults(length.Mid())
	bc, start, sigma := p.Left, p.A, 1.0
	if end == RightEnd {
		bc, start, sigma = p.Right, p.B, -1.0
	}
	y0 := initialVector(bc)
	order := min(opt.Degree, 10)
	phi := [2][2]interval.I{{interval.Point(1), {}}, {{}, interval.Point(1)}}
	shot := &Shot{End: end, Reach: reach, start: start, sigma: sigma}
	minStep := math.Ldexp(reach, -40)
	kinks := kinkDistances(p.V, start, sigma, reach)
	s, h := 0.0, opt.MaxStep
	for s < reach {
		s1 := math.Min(s+h, reach)
		for _, d := range kinks { // a step ends at a listed kink (a choice)
			if d > s && d < s1 {
				s1 = d
				break
			}
		}
		x0, x1 := start.AddF(sigma*s), start.AddF(sigma*s1)
		hI := interval.Point(s1).Sub(interval.Point(s))
		q, m, ok, err := stepModels(p.V, x0, x1, hI, lambda, opt.Degree, order, math.Ldexp(opt.MaxStep, -4))
		if err != nil || !ok {
			// A smaller step shrinks the a priori box and the interval
			// overestimation that can make V look undefined on a step.
			h = (s1 - s) / 2
			if h < minStep {
				if err == nil {
					err = errStepTooSmall
				}
				return nil, &IntegrationError{End: end, At: x0.Hull(x1), Err: err}
			}
			continue
		}
		c := Cell{X: x0.Hull(x1), s0: s, s1: s1, h: hI, q: q, m: m, y: matVec(phi, y0)}
		w, ws := c.state(unit)
		c.U, c.DU = w, ws.MulF(sigma)
		shot.Cells = append(shot.Cells, c)
		one := interval.Point(1)
		mEnd := [2][2]interval.I{
			{m[0][0].eval(one), m[0][1].eval(one)},
			{m[1][0].eval(one), m[1][1].eval(one)},
		}
		phi = matMul(mEnd, phi)
		s = s1
		h = math.Min(2*h, opt.MaxStep)
	}
	return shot, nil
}

// kinkDistances returns, in increasing order, the distances d ∈ (0, reach)
// from the start end at which V has a kink listed by formula.Kinks, for
// which start + σd is exactly that kink (start a point and the float
// arithmetic exact); Shoot ends a step there so that Model1 sees one branch
// on each closed step. Other kinks are left to Model1, which refuses a step
// containing them.
func kinkDistances(v *formula.Expr, start interval.I, sigma, reach float64) []float64 {
	if !start.IsPoint() {
		return nil
	}
	var out []float64
	for _, k := range v.Kinks() {
		d := sigma * (k - start.Lo)
		if !(d > 0 && d < reach) {
			continue
		}
		if x := start.AddF(sigma * d); x.IsPoint() && x.Lo == k {
			out = append(out, d)
		}
	}
	sort.Float64s(out)
	return out
}

// mustBeInterval panics unless x is an interval: no NaN end and Lo ≤ Hi
// (an interval.I written as a struct literal need not be one).
func mustBeInterval(name string, x interval.I) {
	if !(x.Lo <= x.Hi) {
		panic(fmt.Sprintf("groundstate: %s = %v is not an interval", name, x))
	}
}

// mustBeLambda panics unless lambda is a bounded interval.
func mustBeLambda(lambda interval.I) {
	mustBeInterval("λ", lambda)
	if !lambda.IsBounded() {
		panic("groundstate: the enclosure of λ must be bounded")
	}
}

// checkProblem panics on misuse and returns an enclosure of b − a.
func checkProblem(p Problem) interval.I {
	if p.V == nil {
		panic("groundstate: nil potential")
	}
	mustBeInterval("a", p.A)
	mustBeInterval("b", p.B)
	length := p.B.Sub(p.A)
	if !length.Positive() || !length.IsBounded() {
		panic("groundstate: the interval's ends must be bounded with a < b")
	}
	for _, bc := range []Boundary{p.Left, p.Right} {
		switch bc.Kind {
		case Dirichlet, Neumann:
		case Robin:
			mustBeInterval("α", bc.Alpha)
			if !bc.Alpha.IsBounded() {
				panic("groundstate: unbounded Robin coefficient")
			}
		default:
			panic("groundstate: unknown boundary kind")
		}
	}
	return length
}

// initialVector returns (w(0), w_s(0)) for the condition bc at the start
// end, in the distance s from that end (w_s = σu′). Dirichlet (0, 1),
// Neumann (1, 0), Robin (1, α): at the left end u′(a) = αu(a); at the
// right end u′(b) = −αu(b), so w_s(0) = −u′(b) = α as well.
func initialVector(bc Boundary) [2]interval.I {
	switch bc.Kind {
	case Dirichlet:
		return [2]interval.I{interval.Point(0), interval.Point(1)}
	case Neumann:
		return [2]interval.I{interval.Point(1), interval.Point(0)}
	default:
		return [2]interval.I{interval.Point(1), bc.Alpha}
	}
}

// rangeBits: a step at most remainderFloor·2⁻²⁴ long on which V has no
// Taylor model takes V's range as its model (a choice: there V's range
// widens the step's matrix by about h²·wid(range), far below rounding).
const rangeBits = 24

// stepModels returns the model of q = V − λ and the Taylor models of the
// fundamental matrix on one step (stages 1–3 of Shoot); ok is false when
// the step should be halved. Where V has no Taylor model on a step of at
// most remainderFloor·2⁻²⁴ (rangeBits), q is the constant model of V's
// range over the step minus λ.
func stepModels(v *formula.Expr, x0, x1, h, lambda interval.I, deg, order int, remainderFloor float64) (q tmodel, m [2][2]tmodel, ok bool, err error) {
	vm, err := v.Model1(x0, x1, order)
	switch {
	case err == nil:
		q = tmodel{c: append([]interval.I(nil), vm.C...), r: vm.R}
		q.c[0] = q.c[0].Sub(lambda)
	case h.Hi <= math.Ldexp(remainderFloor, -rangeBits):
		// No Taylor model (a kink of V inside the step that no step can
		// end at, such as |x − 1/3|): on a step this short, the constant
		// model with V's range over the step (V(x) ∈ V(hull) for every x
		// of the step, inclusion isotonicity of interval evaluation).
		vr, rerr := v.Eval(map[string]interval.I{"x": x0.Hull(x1)})
		if rerr != nil || !vr.IsBounded() {
			return q, m, false, err
		}
		q = constModel(vr.Sub(lambda))
	default:
		return q, m, false, err
	}
	qRange := q.eval(unit)
	h2 := float64(h.Hi * h.Hi)
	if !qRange.IsBounded() || float64(h2*qRange.Mag()) > 0.25 {
		return q, m, false, nil
	}
	// V's Taylor remainder enters the step's matrix as about h²·|R| (a
	// choice: keep it at rounding level, halving the step up to 4 times
	// for it; R shrinks like h^(order+1)).
	if float64(h2*q.r.Mag()) > 0x1p-52 && h.Hi > remainderFloor {
		return q, m, false, nil
	}
	hUnit := h.Mul(unit)
	for j := 0; j < 2; j++ {
		w0, p0 := interval.Point(0), interval.Point(0)
		if j == 0 {
			w0 = interval.Point(1)
		} else {
			p0 = interval.Point(1)
		}
		bw, bp, found := aPriori(w0, p0, qRange, hUnit)
		if !found {
			return q, m, false, nil
		}
		wm, pm := constModel(bw), constModel(bp)
		for it := 0; it < deg+4; it++ {
			wm = addModels(constModel(w0), pm.integrate(deg).scale(h))
			pm = addModels(constModel(p0), mulModels(q, wm, deg).integrate(deg).scale(h))
		}
		m[0][j], m[1][j] = wm, pm
	}
	return q, m, true, nil
}

// aPriori searches a box B = bw × bp with (w0, p0) + hUnit·(bp, qRange·bw)
// ⊆ B (stage 2 of Shoot). The search inflates the iterates (a choice); the
// returned box is verified by the inclusion test itself.
func aPriori(w0, p0, qRange, hUnit interval.I) (bw, bp interval.I, ok bool) {
	bw, bp = w0, p0
	for it := 0; it < 12; it++ {
		nw := w0.Add(hUnit.Mul(bp))
		np := p0.Add(hUnit.Mul(qRange).Mul(bw))
		if nw.Subset(bw) && np.Subset(bp) {
			return bw, bp, true
		}
		bw, bp = chooseWider(bw.Hull(nw)), chooseWider(bp.Hull(np))
	}
	return bw, bp, false
}

// chooseWider widens x by a tenth of its width and a little more (a
// choice: the box it builds is verified by aPriori's inclusion test).
func chooseWider(x interval.I) interval.I {
	d := float64(0.1*(x.Hi-x.Lo)) + float64(1e-15*x.Mag()) + 1e-300
	return interval.New(x.Lo-d, x.Hi+d)
}

// state returns enclosures of (w, w_s) for ξ ∈ xi ⊆ [0, 1]: M(ξ)·y(s0).
func (c *Cell) state(xi interval.I) (w, ws interval.I) {
	w = c.m[0][0].eval(xi).Mul(c.y[0]).Add(c.m[0][1].eval(xi).Mul(c.y[1]))
	ws = c.m[1][0].eval(xi).Mul(c.y[0]).Add(c.m[1][1].eval(xi).Mul(c.y[1]))
	return w, ws
}

// certainPoints returns the points x that are, for every exact end in the
// shot's end enclosure, of the form start + σ(s0 + ξh) with ξ ∈ xi: the
// intersection over the exact ends (outer ends rounded inward), and false
// if it is empty.
func (s *Shot) certainPoints(c *Cell, xi interval.I) (interval.I, bool) {
	sLo := interval.Point(c.s0).Add(c.h.MulF(xi.Lo)) // ∋ the exact nearest distance
	sHi := interval.Point(c.s0).Add(c.h.MulF(xi.Hi)) // ∋ the exact farthest distance
	var lo, hi float64
	if s.sigma > 0 {
		lo = interval.AddUp(s.start.Hi, sLo.Hi)
		hi = interval.AddDown(s.start.Lo, sHi.Lo)
	} else {
		lo = interval.SubUp(s.start.Hi, sHi.Lo)
		hi = interval.SubDown(s.start.Lo, sLo.Hi)
	}
	if !(lo <= hi) {
		return interval.I{}, false
	}
	return interval.New(lo, hi), true
}

// points returns an enclosure of the points x = start + σ(s0 + ξh), ξ ∈ xi.
func (s *Shot) points(c *Cell, xi interval.I) interval.I {
	return s.start.Add(interval.Point(c.s0).Add(c.h.Mul(xi)).MulF(s.sigma))
}

// At returns enclosures of u(x) and u′(x) for every member of the shot's
// family, and false if x may lie outside the shot's range. x is the exact
// float64 x.
func (s *Shot) At(x float64) (u, du interval.I, ok bool) {
	dist := interval.Point(x).Sub(s.start).MulF(s.sigma)
	if dist.Lo < 0 || dist.Hi > s.Reach {
		return u, du, false
	}
	first := true
	for i := range s.Cells {
		c := &s.Cells[i]
		if dist.Hi < c.s0 || dist.Lo > c.s1 {
			continue
		}
		xi, nonEmpty := dist.Sub(interval.Point(c.s0)).Div(c.h).Intersection(unit)
		if !nonEmpty {
			continue
		}
		w, ws := c.state(xi)
		if first {
			u, du, first = w, ws.MulF(s.sigma), false
		} else {
			u, du = u.Hull(w), du.Hull(ws.MulF(s.sigma))
		}
	}
	return u, du, !first
}

func matVec(a [2][2]interval.I, v [2]interval.I) [2]interval.I {
	return [2]interval.I{
		a[0][0].Mul(v[0]).Add(a[0][1].Mul(v[1])),
		a[1][0].Mul(v[0]).Add(a[1][1].Mul(v[1])),
	}
}

func matMul(a, b [2][2]interval.I) [2][2]interval.I {
	var c [2][2]interval.I
	for i := 0; i < 2; i++ {
		for j := 0; j < 2; j++ {
			c[i][j] = a[i][0].Mul(b[0][j]).Add(a[i][1].Mul(b[1][j]))
		}
	}
	return c
}

// Enclosure is a pair of shots meeting at Split: Left covers [a, Split]
// with the left normalisation, Right covers [Split, b] with the right one.
type Enclosure struct {
	Split       float64
	Left, Right *Shot
}

// Enclose shoots from both ends of p to the float nearest the midpoint
// (a choice) with lambda ∋ λ1; see Shoot.
func Enclose(p Problem, lambda interval.I, opt Options) (*Enclosure, error) {
	checkProblem(p)
	mustBeLambda(lambda)
	split := p.A.Add(p.B).Mid() / 2
	left, err := Shoot(p, LeftEnd, lambda, interval.Point(split).Sub(p.A).Hi, opt)
	if err != nil {
		return nil, err
	}
	right, err := Shoot(p, RightEnd, lambda, p.B.Sub(interval.Point(split)).Hi, opt)
	if err != nil {
		return nil, err
	}
	return &Enclosure{Split: split, Left: left, Right: right}, nil
}

// At returns enclosures of u(x), u′(x) from the shot on x's side of Split
// (the left shot's normalisation for x ≤ Split, the right one's above).
func (e *Enclosure) At(x float64) (u, du interval.I, ok bool) {
	if x <= e.Split {
		return e.Left.At(x)
	}
	return e.Right.At(x)
}
