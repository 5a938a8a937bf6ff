package main

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"sort"
	"strings"

	"github.com/spf13/cobra"

	"gapcert/certs/certify"
	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

func newValidateCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "validate FILE",
		Short: "Check a problem file and show how it is understood",
		Long: `validate reads the problem file FILE, checks it and prints the problem as
gapcert understands it: the domain with an enclosure of every vertex, the
orientation (and whether the vertices were reversed to counterclockwise),
the convexity verdict, enclosures of the diameter, area and perimeter, the
boundary condition on each side, the potential and whether it is a
polynomial, and the SHA-256 of the canonical problem text that
certificates refer to.

If the file is invalid, every defect is listed as
    FILE: json.path: what is wrong (hint: how to fix it)
and the exit status is 2.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			file := args[0]
			p, err := loadProblem(file)
			if err != nil {
				return err
			}
			describe(cmd.OutOrStdout(), file, p)
			return nil
		},
	}
}

// loadProblem reads and validates the problem file. Its errors are
// *exitError: exitInvalid with every defect as "FILE: path: message (hint:
// …)", one per line, or exitFailure if the file cannot be read.
func loadProblem(file string) (*problem.Problem, error) {
	p, err := problem.ReadFile(file)
	if err == nil {
		return p, nil
	}
	var perr *problem.Error
	if errors.As(err, &perr) {
		var b strings.Builder
		for i, is := range perr.Issues {
			if i > 0 {
				b.WriteByte('\n')
			}
			fmt.Fprintf(&b, "%s: %s", file, is)
		}
		return nil, &exitError{code: exitInvalid, err: errors.New(b.String())}
	}
	if errors.Is(err, fs.ErrNotExist) {
		return nil, &exitError{code: exitFailure, err: fmt.Errorf("%s: no such file", file)}
	}
	return nil, &exitError{code: exitFailure, err: fmt.Errorf("%s: %v", file, err)}
}

// enclosureDigits is the number of significant digits of printed ends.
const enclosureDigits = 17

// formatEnclosure prints x as "[lo, hi]" rounded outward, or as the exact
// value of a point with a short decimal expansion.
func formatEnclosure(x interval.I) string {
	if x.IsPoint() {
		if s := decimalio.FormatExact(x.Lo); len(s) <= enclosureDigits+8 {
			return s
		}
	}
	return "[" + decimalio.FormatLower(x.Lo, enclosureDigits) + ", " + decimalio.FormatUpper(x.Hi, enclosureDigits) + "]"
}

// formatNumber prints an exact number's text followed by its value: "= v"
// when the enclosure is a point, "∈ [lo, hi]" otherwise, nothing when the
// text is the value.
func formatNumber(n problem.Number) string {
	v := formatEnclosure(n.Val)
	switch {
	case v == n.Text:
		return n.Text
	case n.Val.IsPoint() && !strings.HasPrefix(v, "["):
		return n.Text + " = " + v
	}
	return n.Text + " ∈ " + v
}

func formatBC(bc problem.BC) string {
	if bc.Kind == boundary.Robin {
		return "robin, α = " + formatNumber(bc.Alpha)
	}
	return bc.Kind.String()
}

// describe prints the validated problem p read from file.
func describe(w io.Writer, file string, p *problem.Problem) {
	fmt.Fprintf(w, "%s: valid problem\n", file)
	if p.Name != "" {
		fmt.Fprintf(w, "name:        %s\n", p.Name)
	}
	if p.IsProduct() {
		describeProduct(w, p)
	} else if p.Dim == 1 {
		fmt.Fprintf(w, "domain:      interval (a, b)\n")
		fmt.Fprintf(w, "  a = %s\n", formatNumber(p.Interval[0]))
		fmt.Fprintf(w, "  b = %s\n", formatNumber(p.Interval[1]))
		fmt.Fprintf(w, "length:      %s\n", formatEnclosure(p.Diameter()))
		fmt.Fprintf(w, "boundary:    left %s, right %s\n", formatBC(p.Boundary[0]), formatBC(p.Boundary[1]))
	} else if ph := p.Polyhedron; ph != nil {
		describePolyhedron(w, ph, p.Boundary)
	} else {
		n := len(p.Vertices)
		orient := "counterclockwise as given"
		if p.Reversed() {
			orient = "counterclockwise (the file lists it clockwise; vertices and edges reversed, v0 kept first)"
		}
		fmt.Fprintf(w, "domain:      polygon with %d vertices, %s\n", n, orient)
		for i, v := range p.Vertices {
			fmt.Fprintf(w, "  v%d = (%s, %s)\n", i, formatNumber(v[0]), formatNumber(v[1]))
		}
		fmt.Fprintf(w, "convexity:   %s\n", p.Convex())
		fmt.Fprintf(w, "diameter:    %s\n", formatEnclosure(p.Diameter()))
		fmt.Fprintf(w, "area:        %s\n", formatEnclosure(p.Area()))
		fmt.Fprintf(w, "perimeter:   %s\n", formatEnclosure(p.Perimeter()))
		fmt.Fprintf(w, "boundary:\n")
		for i, bc := range p.Boundary {
			fmt.Fprintf(w, "  edge %d (v%d → v%d): %s\n", i, i, (i+1)%n, formatBC(bc))
		}
	}
	form := "general (Taylor models on each element)"
	if p.PotentialIsPolynomial() {
		form = "polynomial (exact element integrals)"
	}
	if sep, _ := p.Separable(); sep {
		form = "a sum of the factors' parts, each certified on its factor"
	}
	fmt.Fprintf(w, "potential:   %s\n", p.PotentialText())
	fmt.Fprintf(w, "  form:      %s\n", form)
	fmt.Fprintf(w, "  range:     %s\n", formatEnclosure(p.PotentialRange()))
	for _, name := range sortedKeys(p.Params) {
		fmt.Fprintf(w, "parameter:   %s = %s\n", name, formatNumber(p.Params[name]))
	}
	fmt.Fprintf(w, "eigenvalues: %d\n", p.Eigenvalues)
	fmt.Fprintf(w, "target:      relative width %s\n", p.RelWidth.Text)
	for _, c := range p.Claims {
		fmt.Fprintf(w, "claim:       %s\n", c)
	}
	for _, pt := range p.Points {
		var cs []string
		for _, c := range pt {
			cs = append(cs, formatNumber(c))
		}
		fmt.Fprintf(w, "point:       (%s)\n", strings.Join(cs, ", "))
	}
	fmt.Fprintf(w, "sha256:      %s\n", p.SHA256())
	describePlan(w, p)
}

// describePlan prints the sizes of the first computation certify would run.
func describePlan(w io.Writer, p *problem.Problem) {
	plan, err := certify.FirstPlan(p)
	if err != nil {
		fmt.Fprintf(w, "first step:  cannot be planned: %v\n", err)
		return
	}
	if plan.Kind == certify.KindProduct {
		if sep, _ := p.Separable(); !sep {
			fmt.Fprintf(w, "first step:  the potential does not separate: the rectangle is certified as a polygon\n")
			return
		}
		fmt.Fprintf(w, "first step:  each factor certified as a lone problem with its part of the potential (separation of variables)\n")
		return
	}
	if plan.Kind == certify.KindInterval {
		fmt.Fprintf(w, "first step:  %d cells of degree %d (Ritz, Lehmann–Goerisch); %d cells of mean-preserving P2 (projection bound)\n",
			plan.Cells, plan.Degree, plan.StageACells)
		return
	}
	if plan.Kind == certify.KindPolyhedron {
		fmt.Fprintf(w, "first step:  %d tetrahedra of degree %d (Ritz, Lehmann–Goerisch with Raviart–Thomas fluxes); %d tetrahedra of %s (projection bound), about %.1f MiB\n",
			plan.Tetrahedra, plan.Degree, plan.StageATetrahedra, plan.StageASpace, float64(plan.MemoryEstimate)/(1<<20))
		fmt.Fprintln(w, "             (finer meshes follow until the target width is met)")
		return
	}
	fmt.Fprintf(w, "first step:  %d triangles of degree %d (Ritz, Lehmann–Goerisch with Raviart–Thomas fluxes); %d triangles of %s (projection bound), about %.1f MiB\n",
		plan.Triangles, plan.Degree, plan.StageATriangles, plan.StageASpace, float64(plan.MemoryEstimate)/(1<<20))
	if len(plan.ReentrantCorners) > 0 {
		fmt.Fprintf(w, "             re-entrant corners at vertices %v\n", plan.ReentrantCorners)
	}
	if len(plan.SingularCorners) > 0 {
		fmt.Fprintf(w, "             singular corners at vertices %v (a singular exponent below the top trial degree is not an integer): the trial mesh is graded toward them\n", plan.SingularCorners)
	}
	fmt.Fprintln(w, "             (finer meshes follow until the target width is met)")
}

func sortedKeys(m map[string]problem.Number) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// describePolyhedron prints the vertices, outward faces, measures and
// face conditions of a polyhedron.
func describePolyhedron(w io.Writer, ph *problem.Polyhedron, bcs []problem.BC) {
	flipped := 0
	for _, f := range ph.Flipped {
		if f {
			flipped++
		}
	}
	orient := "outward as given"
	if flipped > 0 {
		orient = fmt.Sprintf("outward (%d face(s) listed inward in the file were reversed, first vertex kept)", flipped)
	}
	fmt.Fprintf(w, "domain:      polyhedron with %d vertices and %d faces, %s\n", len(ph.Vertices), len(ph.Faces), orient)
	for i, v := range ph.Vertices {
		fmt.Fprintf(w, "  v%d = (%s, %s, %s)\n", i, formatNumber(v[0]), formatNumber(v[1]), formatNumber(v[2]))
	}
	fmt.Fprintf(w, "convexity:   %s\n", ph.Convex())
	fmt.Fprintf(w, "diameter:    %s\n", formatEnclosure(ph.Diameter()))
	fmt.Fprintf(w, "volume:      %s\n", formatEnclosure(ph.Volume()))
	fmt.Fprintf(w, "surface:     %s\n", formatEnclosure(ph.SurfaceArea()))
	fmt.Fprintf(w, "boundary:\n")
	for i, f := range ph.Faces {
		fmt.Fprintf(w, "  face %d %v: %s\n", i, f, formatBC(bcs[i]))
	}
}

// describeProduct prints the domain of a product: its factors (each as a
// lone problem with its part of the potential), its size and its faces'
// conditions factor by factor.
func describeProduct(w io.Writer, p *problem.Problem) {
	fmt.Fprintf(w, "domain:      product of %d factors, coordinates %s\n", p.Factors(), strings.Join(problem.Coordinates(p.Dim), ", "))
	sep, why := p.Separable()
	for i := range p.Factors() {
		if !sep {
			fmt.Fprintf(w, "  factor %d:  %d coordinate(s)\n", i, p.FactorDim(i))
			continue
		}
		f, err := problem.Parse(p.FactorFile(i, problem.DefaultEigenvalues, problem.DefaultRelWidth))
		if err != nil {
			fmt.Fprintf(w, "  factor %d:  %v\n", i, err)
			continue
		}
		var bcs []string
		for _, bc := range f.Boundary {
			bcs = append(bcs, formatBC(bc))
		}
		if f.Dim == 1 {
			fmt.Fprintf(w, "  factor %d:  interval (%s, %s); ends %s; its part of V: %s\n", i, formatNumber(f.Interval[0]), formatNumber(f.Interval[1]), strings.Join(bcs, ", "), f.PotentialText())
		} else {
			fmt.Fprintf(w, "  factor %d:  polygon with %d vertices (%s); edges %s; its part of V: %s\n", i, len(f.Vertices), f.Convex(), strings.Join(bcs, ", "), f.PotentialText())
		}
	}
	if !sep {
		fmt.Fprintf(w, "separation:  none (%s)\n", why)
	}
	fmt.Fprintf(w, "convexity:   %s\n", p.Convex())
	fmt.Fprintf(w, "diameter:    %s\n", formatEnclosure(p.Diameter()))
	if p.Dim > 2 {
		fmt.Fprintf(w, "volume:      %s\n", formatEnclosure(p.Volume()))
		fmt.Fprintf(w, "surface:     %s\n", formatEnclosure(p.SurfaceArea()))
	} else {
		fmt.Fprintf(w, "area:        %s\n", formatEnclosure(p.Area()))
		fmt.Fprintf(w, "perimeter:   %s\n", formatEnclosure(p.Perimeter()))
	}
}
