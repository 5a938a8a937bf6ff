package groundstate

import (
	"fmt"
	"math"

	"gapcert/interval"
)

// Verdict is the outcome of a log-concavity decision.
type Verdict int

const (
	// Undecided: neither a proof nor a witness was found within the caps.
	Undecided Verdict = iota
	// Proven: the ground state is log-concave on [a, b].
	Proven
	// Disproven: a witness shows that the ground state is not log-concave.
	Disproven
)

func (v Verdict) String() string {
	switch v {
	case Proven:
		return "proven"
	case Disproven:
		return "disproven"
	default:
		return "undecided"
	}
}

// Witness is a set of points where log u is strictly convex: for every x
// in X and every member of the shot's family (the ground state among them),
// g(x) = (V − λ)u² − u′² ∈ G with G.Lo > 0 and u(x) ∈ U with U.Lo > 0.
// When an end of the interval is known only as an enclosure, X holds the
// points certified for every exact end in it (never points outside the
// interval).
type Witness struct {
	X, U, DU, G interval.I
	// From is the end whose normalisation U and DU carry.
	From End
}

// LogConcavityResult is the verdict with its evidence.
type LogConcavityResult struct {
	Verdict Verdict
	// Witness is set for Disproven.
	Witness *Witness
	// Reason says why the verdict is Undecided.
	Reason string
	// WorstUpper is, for Undecided, the largest upper end of g over the
	// pieces left undecided; for Proven, the largest upper end of g over
	// the pieces where g was evaluated (≤ 0; −∞ if V ≤ λ everywhere); for
	// Disproven, the witness's. g is in the normalisation of the shot the
	// piece came from. WorstAt encloses that piece.
	WorstUpper float64
	WorstAt    interval.I
	// Pieces is the number of pieces evaluated.
	Pieces int
}

// InconsistentError reports that an enclosure of u is certified negative
// somewhere in the open interval, so lambda cannot enclose the first
// eigenvalue (whose eigenfunction has no interior zero, package doc).
type InconsistentError struct {
	At interval.I
	U  interval.I
}

func (e *InconsistentError) Error() string {
	return fmt.Sprintf("groundstate: u ∈ %v < 0 at x ∈ %v: the given λ does not enclose the first eigenvalue "+
		"(the ground state has no interior zero)", e.U, e.At)
}

// LogConcavity decides whether the ground state of p is log-concave on
// [a, b], given lambda ∋ λ1 (a certified enclosure of the first
// eigenvalue; the caller's hypothesis).
//
// It shoots from both ends to the midpoint (Enclose) and evaluates, on the
// cells of each shot and on their bisections in the step variable ξ,
//
//	g = (V − λ)·u² − u′²                         (interval arithmetic),
//
// with V − λ from the step's Taylor model and u, u′ from the step's
// fundamental matrix. As (log u)″ = g/u² where u > 0 and the sign of g does
// not depend on the normalisation (package doc):
//
//   - Proven when every piece has V − λ ≤ 0 (then g ≤ −u′² ≤ 0) or
//     g.Hi ≤ 0; the pieces of the left shot cover [a, split] and those of
//     the right shot [split, b], so g ≤ 0 on all of (a, b), where u > 0
//     (Sturm), and log u is concave on (a, b) (and u is log-concave on
//     [a, b], with log 0 = −∞ at a Dirichlet end).
//   - Disproven at the first piece with g.Lo > 0 and u.Lo > 0 whose points
//     are certain for every exact end in the end enclosure
//     (certainPoints; all of them when the ends are exact): there
//     (log u)″ > 0 for the ground state, so log u is strictly convex on an
//     interval and not concave.
//   - Undecided otherwise, after bisecting each undecided piece up to
//     MaxDepth times within MaxPieces evaluations, with the worst margin.
//
// Only λ1 ∈ lambda is needed, not a separation from λ2: every member of
// the enclosed family shares the verdict's inequality, and the ground
// state (normalised at either end) is the member λ = λ1. A lambda that
// also holds λ2 makes the family hold the second eigenfunction, whose
// interior zero keeps such a run undecided near it.
//
// It returns an *IntegrationError when a shot fails and an
// *InconsistentError when u is certified negative on a piece (lambda then
// does not enclose λ1). Misuse panics as for Shoot.
func LogConcavity(p Problem, lambda interval.I, opt Options) (*LogConcavityResult, error) {
	length := checkProblem(p)
	mustBeLambda(lambda)
	opt = opt.withDefaults(length.Mid())
	enc, err := Enclose(p, lambda, opt)
	if err != nil {
		return nil, err
	}
	res := &LogConcavityResult{WorstUpper: math.Inf(-1)}
	type piece struct {
		shot  *Shot
		cell  *Cell
		xi    interval.I
		depth int
	}
	var stack []piece
	for _, s := range []*Shot{enc.Left, enc.Right} {
		for i := len(s.Cells) - 1; i >= 0; i-- {
			stack = append(stack, piece{shot: s, cell: &s.Cells[i], xi: unit})
		}
	}
	undecided := 0
	for len(stack) > 0 {
		pc := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		res.Pieces++
		q := pc.cell.q.eval(pc.xi)
		if q.Hi <= 0 {
			continue
		}
		w, ws := pc.cell.state(pc.xi)
		if w.Hi < 0 {
			return nil, &InconsistentError{At: pc.shot.points(pc.cell, pc.xi), U: w}
		}
		g := q.Mul(w.Sqr()).Sub(ws.Sqr())
		if g.Hi <= 0 {
			if undecided == 0 && g.Hi > res.WorstUpper {
				res.WorstUpper, res.WorstAt = g.Hi, pc.shot.points(pc.cell, pc.xi)
			}
			continue
		}
		if x, certain := pc.shot.certainPoints(pc.cell, pc.xi); certain && g.Lo > 0 && w.Lo > 0 {
			res.Verdict = Disproven
			res.Witness = &Witness{X: x, U: w, DU: ws.MulF(pc.shot.sigma), G: g, From: pc.shot.End}
			res.WorstUpper, res.WorstAt = g.Hi, res.Witness.X
			return res, nil
		}
		if pc.depth < opt.MaxDepth && res.Pieces+len(stack)+2 <= opt.MaxPieces {
			mid := pc.xi.Mid()
			stack = append(stack,
				piece{pc.shot, pc.cell, interval.New(mid, pc.xi.Hi), pc.depth + 1},
				piece{pc.shot, pc.cell, interval.New(pc.xi.Lo, mid), pc.depth + 1})
			continue
		}
		undecided++
		if undecided == 1 || g.Hi > res.WorstUpper {
			res.WorstUpper, res.WorstAt = g.Hi, pc.shot.points(pc.cell, pc.xi)
		}
	}
	if undecided == 0 {
		res.Verdict = Proven
		return res, nil
	}
	res.Reason = fmt.Sprintf("%d pieces have neither g ≤ 0 nor a certified g > 0 with u > 0 "+
		"within %d bisections per cell and %d pieces in all (narrow the enclosure of λ1, or raise MaxDepth or MaxPieces)",
		undecided, opt.MaxDepth, opt.MaxPieces)
	return res, nil
}
