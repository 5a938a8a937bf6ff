package certify

import (
	"encoding/json"
	"fmt"
	"math"
	"runtime"
	"time"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// certificate writes the result as a certificate.
func (res *result) certificate(p *problem.Problem, opt Options) (*certs.Certificate, error) {
	c := res.newCertificate(p)
	if opt.GroundState {
		gs, err := groundState(res.groundStateInputs(p))
		if err != nil {
			return nil, err
		}
		c.Results.GroundState = gs
	}
	claims, err := evaluateClaims(p, res, c.Results.GroundState, opt)
	if err != nil {
		return nil, err
	}
	c.Claims = claims
	if c.Method, err = json.Marshal(res.method()); err != nil {
		return nil, err
	}
	c.Provenance = provenance(opt)
	return c, nil
}

// newCertificate returns the certificate of the result's problem with its
// results (the enclosures, D and D²·gap/π², the relative widths) and
// warnings; claims, method and provenance are the caller's.
func (res *result) newCertificate(p *problem.Problem) *certs.Certificate {
	d := p.Diameter()
	c := &certs.Certificate{
		Format:        certs.Format,
		Problem:       json.RawMessage(p.Canonical()),
		ProblemSHA256: p.SHA256(),
		Warnings:      res.warnings,
	}
	for k, l := range res.lambda {
		b := certs.NewBound(l, Digits)
		c.Results.Eigenvalues = append(c.Results.Eigenvalues, certs.Eigen{Index: k + 1, Lower: b.Lower, Upper: b.Upper})
	}
	c.Results.Gap = certs.NewBound(res.gap, Digits)
	c.Results.Diameter = certs.NewBound(d, Digits)
	c.Results.GapD2OverPi2 = certs.NewBound(res.gap.Mul(d.Sqr()).Div(interval.Pi().Sqr()), Digits)
	c.Results.RelativeWidths = map[string]string{"gap": fmt.Sprintf("%.3g", res.gapWidth)}
	for k, w := range res.widths {
		c.Results.RelativeWidths[fmt.Sprintf("lambda%d", k+1)] = fmt.Sprintf("%.3g", w)
	}
	return c
}

// provenance records the tool, the Go version, the platform and the time
// (opt.Now, or the clock).
func provenance(opt Options) certs.Provenance {
	now := time.Now
	if opt.Now != nil {
		now = opt.Now
	}
	return certs.Provenance{Tool: opt.Tool, GoVersion: runtime.Version(), OS: runtime.GOOS, Arch: runtime.GOARCH, Time: now().UTC().Format(time.RFC3339)}
}

// groundStateInputs is what the step hands to the ground-state block.
func (res *result) groundStateInputs(p *problem.Problem) groundStateInputs {
	return groundStateInputs{p: p, lambda1: res.lambda[0], lambda2: res.lambda[1], gamma: res.r.gamma,
		trial: res.out.trial, u: res.out.ground, energy: res.out.groundEnergy, norm2: res.out.groundNorm2}
}

// method records the recipe and each stage's bounds.
func (res *result) method() Method {
	r, out := res.r, res.out
	m := Method{
		Kind:               KindInterval,
		Degree:             r.degree,
		TaylorOrder:        r.taylor,
		Gamma:              decimalio.FormatExact(r.gamma),
		ExtraIndices:       r.extra,
		N:                  out.n,
		ProjectionConstant: decimalio.FormatUpper(out.ch.Hi, Digits),
		Theorems:           theorems1D,
		Widths:             res.widthRecords(),
		Refinement:         res.refinement,
	}
	if out.polygon != nil {
		m.Kind, m.Theorems = KindPolygon, theoremsPolygon
		m.Refinements, m.StageARefinements, m.GradedLevels = r.refine, r.stageARefine, r.graded
		m.StageASpace = out.polygon.stageASpace
		m.Triangles, m.StageATriangles = out.polygon.triangles, out.polygon.stageATriangles
		m.FluxDegree, m.WeightOrder, m.FluxUnknowns = r.fluxDegree, r.weightTaylor, out.polygon.fluxUnknowns
		m.FluxGamma = decimalio.FormatExact(r.fluxGamma)
		m.AdaptiveMarks = r.marks
	} else if ph := out.polyhedron; ph != nil {
		m.Kind, m.Theorems = KindPolyhedron, theoremsPolyhedron
		m.Refinements, m.StageARefinements, m.GradedLevels = r.refine, r.stageARefine, r.graded
		m.StageASpace = ph.stageASpace
		m.Tetrahedra, m.StageATetrahedra = ph.tetrahedra, ph.stageATetrahedra
		m.FluxDegree, m.WeightOrder, m.FluxUnknowns = r.fluxDegree, r.weightTaylor, ph.fluxUnknowns
		m.FluxGamma = decimalio.FormatExact(r.fluxGamma)
	} else {
		m.Cells, m.FluxDegree, m.WeightOrder, m.StageACells = r.cells, r.fluxDegree, r.weightTaylor, r.stageACells
	}
	if out.n > 0 {
		m.Rho = decimalio.FormatExact(out.lgRho)
	}
	for k, u := range out.ritz {
		m.Stages.RitzUpper = append(m.Stages.RitzUpper, StageBound{k + 1, decimalio.FormatUpper(u, Digits)})
	}
	for k, l := range out.stageA {
		m.Stages.ProjectionLower = append(m.Stages.ProjectionLower, StageBound{k + 1, decimalio.FormatLower(l, Digits)})
	}
	for k, l := range out.lg {
		if !math.IsInf(l, -1) {
			m.Stages.LehmannGoerisch = append(m.Stages.LehmannGoerisch, StageBound{k + 1, decimalio.FormatLower(l, Digits)})
		}
	}
	return m
}
