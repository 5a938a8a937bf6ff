package main

import (
	"errors"
	"fmt"
	"os"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/plot"
	"gapcert/certs/plot/sweepplot"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
)

func newPlotCmd() *cobra.Command {
	var x, y, quantity, reference, threshold, relation, claim, out, band, slice string
	var shape bool
	var memory memoryLimitFlag
	cmd := &cobra.Command{
		Use:   "plot SUMMARY.json|DIR --x PARAM (--quantity EXPR [--reference EXPR] | --y PARAM --claim N | --log-concavity) --out FILE.png|.svg\n  gapcert plot CERT.json --out FILE.png|.svg\n  gapcert plot POLYHEDRON.json --out FILE.png|.svg [--slice AXIS=VALUE]",
		Short: "Draw the certified results of a sweep against its parameters, or a certificate's ground state",
		Long: `plot draws the certified results of a sweep ("gapcert sweep"), read from
its summary (SUMMARY.json; for a directory DIR/summary.json, written by
an unsharded sweep or by merge, else the one summary-shard-i-of-n.json of
a shard directory) and cross-checked against the certificate files beside it (file SHA-256, problem hash, every
enclosure and claim result).

One-parameter sweeps, --x PARAM --quantity EXPR [--reference EXPR]
[--threshold EXPR]: the certified enclosure of the quantity at each point
against the parameter. EXPR is a formula over lambda1 … lambdaN, gap, D,
area and perimeter (polygons), the parameters, pi, e and the reference
quantities of built-in claims, enclosed in interval arithmetic over each
point's certified enclosures (e.g. "D^2*gap/pi^2"). The reference
quantity robin_interval_gap is the gap of the interval (0, D) with the
polygon's Robin coefficient at both ends, enclosed by the reference
certificate that the claim "@robin_comparison" stores in the point's
certificate file; a point without it is an error. --reference draws a
second certified band in another colour (e.g. --quantity gap --reference
robin_interval_gap). With a threshold each point is marked by the
certified verdict of "quantity --relation threshold" (holds, undecided,
fails), and the threshold is drawn as a line; without one, by the verdict
of the point's own claims.

Two-parameter sweeps, --x PARAM --y PARAM --claim N|TEXT: a map of cells,
each coloured by the certified lower bound of the margin of the claim
(lhs − rhs for >=, >; rhs − lhs for <=, <), undecided and failing cells
marked. The claim may be built in ("@triangle_gap"): the margin is the
enclosure of lhs − rhs stored in each certificate.

Enclosures narrower than a line do not show on a band; --band width adds a
panel of each enclosure's width hi − lo on a logarithmic axis, and --band
margin (with --threshold) a panel of the certified enclosure of quantity −
threshold with the line 0, on its own axis.

Log-concavity, --x PARAM --log-concavity: the certified verdict on the
log-concavity of the ground state (proven, disproven with a witness,
undecided) at each point of a one-parameter sweep whose family asks for
the ground state ("ground_state": true).

A certificate, CERT.json (written by certify --ground-state): check
re-verifies it first (exit 3 if it does not verify), then the picture
shows the domain with the log-concavity witness marked (the convex
interval on an interval; the points x, y, their midpoint m and the chord
on a polygon) and the problem's points; when those lie on one segment in
order (decided exactly), a second panel draws the certified enclosure of
u at each of them against the arc length, certified at those points only.

A cover ("gapcert cover"; its directory or summary), [--claim N]: the
cells coloured by their certified verdict on claim N (1-based, default
1) — intervals along the axis for one parameter, rectangles for two —
with each verdict's fraction of the box in the legend.

A problem file of a polyhedron, POLYHEDRON.json [--slice AXIS=VALUE]:
FILE is the solid seen from the front right and above (faces coloured by
their boundary condition, the edges behind it dashed, the boundary
triangles of the mesh, the slice's outline, axes x, y, z), and
FILE-mode1 and FILE-mode2 the approximate eigenfunctions of λ1 and λ2 on
the slice, computed in floating point from P_2 or P_3 on a refined
tetrahedral mesh of the problem: approximations, not bounds. The slice
is the plane AXIS = VALUE (AXIS x, y or z, VALUE exact, e.g. z=1/2), by
default z about halfway up (or x, then y, about halfway across when a
mode nearly vanishes on it); a plane that misses the solid's interior or
passes through a vertex is refused before anything is computed.
"certify --plot DIR" draws a certified polyhedron, box or prism with its
enclosures.

The format follows the extension of --out (.png or .svg). Only the
sampled points are certified; the pictures say so. This command draws
sweeps; "certify --plot DIR" draws the approximate eigenfunctions of one
problem.

Exit status: 0 on success, 1 on bad usage, an unreadable summary, an
unknown parameter or name or an empty sweep, 3 if the summary disagrees
with a certificate file or a certificate drawn alone does not verify.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			fail := func(err error) error { return &exitError{code: exitFailure, err: err} }
			if out == "" {
				return fail(errors.New("--out FILE.png or FILE.svg is required"))
			}
			if isCertificate(args[0]) {
				if slice != "" {
					return fail(fmt.Errorf("--slice belongs to the problem file of a polyhedron; %s is a certificate, drawn with --out alone", args[0]))
				}
				for _, name := range []string{"x", "y", "quantity", "reference", "threshold", "relation", "claim", "band", "log-concavity"} {
					if cmd.Flags().Changed(name) {
						return fail(fmt.Errorf("--%s belongs to a sweep; %s is a certificate, drawn with --out alone", name, args[0]))
					}
				}
				if err := memory.parse(); err != nil {
					return fail(err)
				}
				return plotCertificate(cmd, args[0], out, memory.bytes)
			}
			if cmd.Flags().Changed("memory-limit") {
				return fail(fmt.Errorf("--memory-limit belongs to a certificate drawn alone (it bounds its re-verification); %s is not a certificate", args[0]))
			}
			if isProblemFile(args[0]) {
				for _, name := range []string{"x", "y", "quantity", "reference", "threshold", "relation", "claim", "band", "log-concavity"} {
					if cmd.Flags().Changed(name) {
						return fail(fmt.Errorf("--%s belongs to a sweep; %s is a problem file, drawn with --out and --slice", name, args[0]))
					}
				}
				return plotPolyhedron(cmd, args[0], out, slice)
			}
			if slice != "" {
				return fail(fmt.Errorf("--slice belongs to the problem file of a polyhedron; %s is not one", args[0]))
			}
			if isCoverSummary(args[0]) {
				return plotCover(cmd, args[0], out, claim)
			}
			switch {
			case x == "":
				return fail(errors.New("--x PARAM is required"))
			case shape && (y != "" || quantity != "" || reference != "" || threshold != "" || claim != "" || band != ""):
				return fail(errors.New("--log-concavity draws the ground state's verdicts over one parameter; it takes --x alone"))
			case y == "" && quantity == "" && !shape:
				return fail(errors.New("give --quantity EXPR (a band over one parameter) or --y PARAM and --claim N (a map over two)"))
			case y != "" && (quantity != "" || reference != "" || threshold != ""):
				return fail(errors.New("--y draws a map of a claim's margin; --quantity, --reference and --threshold belong to a band over one parameter"))
			case y != "" && claim == "":
				return fail(errors.New("a map needs --claim N (1-based) or --claim TEXT"))
			case y == "" && claim != "":
				return fail(errors.New("--claim belongs to a map over two parameters (give --y)"))
			case y != "" && band != "":
				return fail(errors.New("--band adds a panel to a band over one parameter; a map has none"))
			case band == string(sweepplot.MarginPanel) && threshold == "":
				return fail(errors.New("--band margin draws quantity − threshold (hint: give --threshold EXPR, or use --band width)"))
			}
			panel, err := sweepplot.ParsePanel(band)
			if err != nil {
				return fail(fmt.Errorf("--band: %v", err))
			}
			if err := checkPictureFile(out, args[0]); err != nil {
				return err
			}
			s, err := sweepplot.Load(args[0])
			var cc *sweepplot.CrossCheckError
			switch {
			case errors.As(err, &cc):
				return &exitError{code: exitMismatch, err: err}
			case err != nil:
				return readFailure(err)
			}
			var write func(string) error
			var missing, uncertified int
			switch {
			case shape:
				sh, err := s.Shape(x)
				if err != nil {
					return fail(err)
				}
				write, missing, uncertified = sh.Write, sh.Missing, len(sh.Uncertified)
			case y == "":
				b, err := s.Band(x, sweepplot.BandSpec{Quantity: quantity, Reference: reference, Threshold: threshold, Rel: relation})
				if err != nil {
					return fail(err)
				}
				write = func(path string) error { return b.WritePanel(path, panel) }
				missing, uncertified = b.Missing, len(b.Uncertified)
			default:
				m, err := s.Map(x, y, claim)
				if err != nil {
					return fail(err)
				}
				write, missing, uncertified = m.Write, m.Missing, len(m.Uncertified)
			}
			if err := write(out); err != nil {
				return fail(err)
			}
			if sh := s.Summary.Shard; sh.Count > 1 {
				fmt.Fprintf(cmd.ErrOrStderr(), "%s: shard %s: only its %d of the family's %d points are drawn (merge the shards for all)\n", s.Path, sh, len(s.Summary.Points), s.Summary.TotalPoints)
			}
			if uncertified > 0 {
				fmt.Fprintf(cmd.ErrOrStderr(), "%s: %d point(s) without a certificate are not drawn\n", s.Path, uncertified)
			}
			if missing > 0 {
				fmt.Fprintf(cmd.ErrOrStderr(), "%s: %d certificate file(s) not found; their enclosures are the summary's\n", s.Path, missing)
			}
			fmt.Fprintf(cmd.OutOrStdout(), "picture written to %s\n", out)
			return nil
		},
	}
	f := cmd.Flags()
	f.StringVar(&x, "x", "", "the parameter on the horizontal axis")
	f.StringVar(&quantity, "quantity", "", "formula to draw against the parameter (band)")
	f.StringVar(&reference, "reference", "", "formula drawn as a second certified band, e.g. robin_interval_gap (band)")
	f.StringVar(&threshold, "threshold", "", "formula the quantity is compared with (band)")
	f.StringVar(&band, "band", "", "a second panel under a band: width (each enclosure's width, log axis) or margin (quantity − threshold)")
	f.StringVar(&relation, "relation", ">=", "comparison of quantity and threshold: >=, >, <= or <")
	f.StringVar(&y, "y", "", "the second parameter, on the vertical axis (map)")
	f.StringVar(&claim, "claim", "", "the claim of a map: its number (1-based) or its text")
	f.StringVarP(&out, "out", "o", "", "the picture file, .png or .svg")
	f.StringVar(&slice, "slice", "", "the plane of the modes of a polyhedron, AXIS=VALUE (e.g. z=1/2; default z about halfway up)")
	memory.register(cmd, "a certificate drawn alone: "+verifyMemoryUsage)
	f.BoolVar(&shape, "log-concavity", false, "draw the certified log-concavity verdict of the ground state at each point (one-parameter sweep with \"ground_state\": true)")
	return cmd
}

// maxPlotInput bounds what isCertificate reads of a file.
const maxPlotInput = 256 << 20

// isCertificate reports whether path is a file that claims the
// certificate format: a "format" key of that value, or any repeated or
// case-variant "format" key (so that the certificate reader, which is
// strict, refuses such a file instead of another reader guessing). It only
// chooses the kind of picture: the file is then read strictly.
func isCertificate(path string) bool {
	st, err := os.Stat(path)
	if err != nil || !st.Mode().IsRegular() || st.Size() > maxPlotInput {
		return false
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return false
	}
	head, dups, err := strictjson.Parse(data)
	if err != nil || head.Kind != strictjson.Object {
		return false
	}
	for _, d := range dups {
		if strings.EqualFold(d.Path, "format") {
			return true
		}
	}
	for i, k := range head.Keys {
		if strings.EqualFold(k, "format") && (k != "format" || head.Elems[i].Str == certs.Format) {
			return true
		}
	}
	return false
}

// plotCertificate re-verifies the certificate at path (certify.Check)
// and draws its ground-state block into out.
func plotCertificate(cmd *cobra.Command, path, out string, memory int64) error {
	if err := checkPictureFile(out, path); err != nil {
		return err
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return readFailure(err)
	}
	if err := checkExit(path, certify.CheckWithin(data, memory)); err != nil {
		return err
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		return &exitError{code: exitMismatch, err: fmt.Errorf("%s: %v", path, err)}
	}
	p, err := problem.Parse(c.Problem)
	if err != nil {
		return &exitError{code: exitMismatch, err: fmt.Errorf("%s: the recorded problem does not parse: %v", path, err)}
	}
	g, err := plot.NewGroundState(c, p)
	if err != nil {
		return &exitError{code: exitFailure, err: fmt.Errorf("%s: %v", path, err)}
	}
	if err := g.Write(out); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	fmt.Fprintf(cmd.OutOrStdout(), "%s: certificate verifies; picture written to %s\n", path, out)
	return nil
}

// isProblemFile reports whether path is a file whose JSON object has a
// "domain" key, as problem files have (certificates, summaries and
// families do not at the top level). It only chooses the kind of
// picture: the file is then read strictly.
func isProblemFile(path string) bool {
	st, err := os.Stat(path)
	if err != nil || !st.Mode().IsRegular() || st.Size() > maxPlotInput {
		return false
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return false
	}
	head, _, err := strictjson.Parse(data)
	return err == nil && head.Kind == strictjson.Object && slices.Contains(head.Keys, "domain")
}

// plotPolyhedron draws the polyhedron of the problem file at path and
// its first two approximate modes on a slice (the given one or a default,
// plot.DefaultSections and PickSection) into out and the files beside it (plot.SolidPaths). The slice
// and the output paths are checked before the modes are computed.
func plotPolyhedron(cmd *cobra.Command, path, out, slice string) error {
	fail := func(err error) error { return &exitError{code: exitFailure, err: err} }
	p, err := loadProblem(path)
	if err != nil {
		return err
	}
	if p.Polyhedron == nil {
		return fail(fmt.Errorf("%s: a problem file is drawn here only for a polyhedron (hint: certify --plot DIR draws an interval, a polygon, a box or a prism)", path))
	}
	var secs []*plot.Section
	if slice == "" {
		secs, err = plot.DefaultSections(p.Polyhedron)
	} else {
		var s plot.Slice
		var sec *plot.Section
		if s, err = plot.ParseSlice(slice); err == nil {
			sec, err = plot.NewSection(p.Polyhedron, s)
		}
		secs = []*plot.Section{sec}
	}
	if err != nil {
		return fail(err)
	}
	const count = 2
	paths := plot.SolidPaths(out, count)
	for _, f := range paths {
		if err := checkPictureFile(f, path); err != nil {
			return err
		}
	}
	modes, err := plot.SolidModesOf(p, count)
	if err != nil {
		return fail(fmt.Errorf("%s: %v", path, err))
	}
	s := plot.SolidOf(p)
	s.Eval, s.Triangles = modes.Eval, modes.Triangles
	for k := range count {
		s.Labels = append(s.Labels, fmt.Sprintf("eigenfunction of λ%d", k+1))
	}
	s.Section = plot.PickSection(s, secs)
	written, err := plot.WriteSolid(out, s)
	if err != nil {
		return fail(err)
	}
	fmt.Fprintf(cmd.OutOrStdout(), "%s: modes from P_%d on %d refinement(s) of the cone tetrahedra (%d unknowns), on the slice %s\npictures (approximations, not bounds) written to %s\n",
		path, modes.Degree, modes.Levels, modes.Unknowns, s.Section.Slice, strings.Join(written, ", "))
	return nil
}
