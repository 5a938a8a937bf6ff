package certify

import (
	"fmt"
	"math"
	"strings"

	"gapcert/certs/certify/proof"
	"gapcert/fem/problem"
	"gapcert/interval"
)

// result is one computation turned into certified enclosures of λ_k.
type result struct {
	r          recipe
	scale      float64     // π²/D² rounded down, the floor of the target rule
	refinement *Refinement // set by Certify on the certified step
	out        *outcome
	lambda     []interval.I // λ_1..λ_m
	gap        interval.I
	widths     []float64
	gapWidth   float64
	warnings   []string
}

func (res *result) worst() float64 {
	w := res.gapWidth
	for _, x := range res.widths {
		w = math.Max(w, x)
	}
	return w
}

// assemble combines the stages (proof.Enclose, proof.Gap): λ_k ∈
// [max(stage A, stage B) − γ, Ritz − γ], and the gap.
func assemble(p *problem.Problem, r recipe, out *outcome) (*result, error) {
	lambda, err := proof.Enclose(p.Eigenvalues, out.ritz, out.stageA, out.lg, r.gamma)
	if err != nil {
		return nil, err
	}
	scale := interval.Pi().Sqr().Div(p.Diameter().Sqr()).Lo
	res := &result{r: r, out: out, scale: scale, warnings: append([]string(nil), out.notes...), lambda: lambda}
	for _, l := range lambda {
		res.widths = append(res.widths, relWidth(l, scale))
	}
	res.gap = proof.Gap(res.lambda[0], res.lambda[1])
	res.gapWidth = relWidth(res.gap, scale)
	return res, nil
}

// relWidth is the width of x relative to max(|mid x|, scale), with
// scale = π²/D² the natural size of the eigenvalues; it stays finite for
// enclosures of 0 (Neumann λ₁) and of tiny gaps.
func relWidth(x interval.I, scale float64) float64 {
	return x.Wid() / math.Max(math.Abs(x.Mid()), scale)
}

// veryThin is the diameter²/area beyond which a polygon's lower bounds
// cannot be made useful by refinement (its width is below diameter/10⁴).
const veryThin = 1e8

// wideWarnings warns about the enclosures wider than the quantity's own
// size (target-rule relative width above 1) and says what would help.
func wideWarnings(p *problem.Problem, res *result, reason string) []string {
	var names []string
	for k, l := range res.lambda {
		if relWidthUpper(l, res.scale) > 1 {
			names = append(names, fmt.Sprintf("lambda%d", k+1))
		}
	}
	if relWidthUpper(res.gap, res.scale) > 1 {
		names = append(names, "gap")
	}
	if len(names) == 0 {
		return nil
	}
	var help string
	switch reason {
	case StopTime:
		help = "a longer time limit (--time-limit) lets refinement continue"
	case StopMemory:
		help = "a larger memory budget (--memory-limit) lets refinement continue"
	case StopInterrupted:
		help = "let the run finish"
	default:
		help = "the meshes reached their caps before the stage-A lower bounds became useful"
	}
	if p.Dim == 2 {
		d := p.Diameter()
		if thin := d.Sqr().Div(p.Area()).Lo; thin > veryThin {
			help = fmt.Sprintf("the polygon is very thin (diameter²/area ≥ %.2g): the stage-A lower bounds need triangles whose longest edges are below its width, about (diameter/width)² of them, which is beyond what a longer budget can give; a less extreme shape is within reach", thin)
		}
	}
	return []string{fmt.Sprintf("%s: the enclosure is wider than the quantity itself (relative width above 1, stopped: %s); %s", strings.Join(names, ", "), reason, help)}
}
