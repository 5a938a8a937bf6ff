package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"gapcert/certs"
	"gapcert/certs/plot"
	"gapcert/fem/problem"
)

// solidPlan is what certify --plot draws of a three-dimensional domain,
// settled before computing: the polyhedron (the problem's own, or the box
// or prism a product is) and the section of the modes, --slice or one of
// the default candidates (plot.DefaultSections; plot.PickSection chooses
// among them once the modes are known).
type solidPlan struct {
	poly     *problem.Problem
	sections []*plot.Section
}

// planSolid returns the plan of the pictures of a three-dimensional
// domain, nil for an interval or a polygon (drawModes) or without --plot,
// or the refusal of --slice or of the domain, before anything is computed.
func planSolid(p *problem.Problem, f certifyFlags) (*solidPlan, error) {
	fail := func(err error) error { return &exitError{code: exitFailure, err: err} }
	switch {
	case f.slice != "" && f.plotDir == "":
		return nil, fail(errors.New("--slice chooses the plane of the pictures of --plot (hint: add --plot DIR, or leave out --slice)"))
	case f.plotDir == "":
		return nil, nil
	case p.Dim < 3 && f.slice != "":
		return nil, fail(fmt.Errorf("--slice belongs to three-dimensional domains; this one has %d coordinates and is drawn whole (hint: leave out --slice)", p.Dim))
	case p.Dim < 3:
		return nil, nil
	}
	sp := &solidPlan{poly: p}
	if p.IsProduct() {
		ph, err := plot.ProductPolyhedron(p)
		if err != nil {
			return nil, &exitError{code: exitInvalid, err: fmt.Errorf("--plot: %v (hint: certify without --plot)", err)}
		}
		sp.poly = ph
	}
	var err error
	if f.slice == "" {
		sp.sections, err = plot.DefaultSections(sp.poly.Polyhedron)
	} else {
		var s plot.Slice
		var sec *plot.Section
		if s, err = plot.ParseSlice(f.slice); err == nil {
			sec, err = plot.NewSection(sp.poly.Polyhedron, s)
		}
		sp.sections = []*plot.Section{sec}
	}
	if err != nil {
		return nil, fail(fmt.Errorf("--slice: %v", err))
	}
	return sp, nil
}

// draw draws the solid of p with the first two approximate modes on the
// plan's section into dir, titled with c's enclosures of λ1, λ2 and the
// gap, and says on w where the modes come from.
func (sp *solidPlan) draw(w io.Writer, dir string, p *problem.Problem, c *certs.Certificate) ([]string, error) {
	const count = 2
	s := plot.SolidOf(sp.poly)
	e := c.Results.Eigenvalues
	s.Certified = []string{
		"certified " + enclosureLabel(e[0].Index, e[0].Bound()),
		"certified " + enclosureLabel(e[1].Index, e[1].Bound()),
		fmt.Sprintf("certified gap λ2 − λ1 ∈ [%s, %s]", shortLower(c.Results.Gap.Lower), shortUpper(c.Results.Gap.Upper)),
	}
	if p.IsProduct() {
		modes, err := plot.ProductModesOf(p, c)
		if err != nil {
			return nil, err
		}
		s.Eval = modes.Eval
		// Each label names the factor modes multiplied: (1, 2, 1) is the
		// first mode of factors 1 and 3 times the second of factor 2.
		for k := range count {
			idx := make([]string, p.Factors())
			for i := range idx {
				idx[i] = "1"
				if k == 1 && i == modes.Second {
					idx[i] = "2"
				}
			}
			s.Labels = append(s.Labels, fmt.Sprintf("eigenfunction of λ%d, factor modes (%s)", k+1, strings.Join(idx, ", ")))
		}
		s.Section = plot.PickSection(s, sp.sections)
		fmt.Fprintf(w, "modes: products of the factors' approximate eigenfunctions on their certified trial spaces (factor modes (1, …) of λ1, of λ2 with factor %d's second), on the slice %s\n", modes.Second+1, s.Section.Slice)
	} else {
		modes, own, err := plot.SolidModesFor(p, c, count)
		if err != nil {
			return nil, err
		}
		s.Eval, s.Triangles = modes.Eval, modes.Triangles
		for k := range count {
			s.Labels = append(s.Labels, fmt.Sprintf("eigenfunction of λ%d", k+1))
		}
		from := "the certificate's trial space"
		if own != nil {
			from = fmt.Sprintf("the picture's own trial space (%v)", own)
		}
		s.Section = plot.PickSection(s, sp.sections)
		graded := ""
		if modes.Graded > 0 {
			graded = fmt.Sprintf(" graded %d level(s) toward the singular edges", modes.Graded)
		}
		fmt.Fprintf(w, "modes from %s: P_%d on %d refinement(s) of the cone tetrahedra%s (%d unknowns), on the slice %s\n",
			from, modes.Degree, modes.Levels, graded, modes.Unknowns, s.Section.Slice)
	}
	return plot.WriteSolidDir(dir, s, plot.Formats())
}
