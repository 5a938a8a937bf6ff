package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/outfile"
	"gapcert/certs/plot"
	"gapcert/fem/boundary"
	"gapcert/fem/problem"
	"gapcert/interval/decimalio"
)

// certifyFlags are the options shared by certify and demo.
type certifyFlags struct {
	out         string
	relWidth    string
	timeLimit   time.Duration
	quiet       bool
	progress    bool
	strict      bool
	plotDir     string
	slice       string // certify only: the plane of the pictures of a three-dimensional domain
	groundState bool
	memory      memoryLimitFlag
}

func (f *certifyFlags) register(cmd *cobra.Command, defaultOut string) {
	cmd.Flags().StringVarP(&f.out, "out", "o", defaultOut, "where to write the certificate (JSON)")
	cmd.Flags().StringVar(&f.relWidth, "rel-width", "", "target relative width of λ1, λ2 and the gap (default: the problem's target)")
	cmd.Flags().DurationVar(&f.timeLimit, "time-limit", certify.DefaultTimeLimit, "budget for refinement")
	cmd.Flags().BoolVarP(&f.quiet, "quiet", "q", false, "no progress lines on stderr")
	cmd.Flags().BoolVar(&f.progress, "progress", false, "progress lines on stderr also when it is not a terminal (--quiet wins)")
	cmd.Flags().BoolVar(&f.strict, "strict", false, "exit with status 4 when the target width is not reached (the certificate is written either way)")
	cmd.Flags().BoolVar(&f.groundState, "ground-state", false, "also certify the ground state: log-concave or not (with a witness), the L2 error of the approximate ground state, and its values at the problem's \"points\" (results.ground_state)")
	f.memory.register(cmd, memoryLimitUsage)
	cmd.Flags().StringVar(&f.plotDir, "plot", "", "also draw the mesh (a polyhedron: the solid) and the first two approximate eigenfunctions (3D: on a slice) with the certified enclosures, PNG and SVG, into this directory; the eigenfunctions are approximations, not part of the proof")
}

func newCertifyCmd() *cobra.Command {
	var f certifyFlags
	cmd := &cobra.Command{
		Use:   "certify FILE",
		Short: "Enclose the lowest eigenvalues and the gap of a problem and write a certificate",
		Long: `certify reads the problem file FILE, computes verified enclosures of
λ1 … λm (m = the problem's "eigenvalues") and of the gap λ2 − λ1, prints
them as a table and writes the certificate (to -o, --out, by default next
to FILE with the extension .cert.json; refused before computing if it is
FILE itself or cannot be written).

Upper bounds come from the Rayleigh–Ritz method, lower bounds from the
projection bound of Liu and the Lehmann–Goerisch method; every bound is
computed in outward rounded interval arithmetic. The mesh and the degree are
refined until the target relative width is reached or --time-limit is
spent, or until no step can help; the table and the certificate say why
refinement stopped (target reached, time limit, memory budget, widths
stalled, refinement cap, no eigenvalue separation, interrupted) and give
each enclosure's width: absolute, relative to its own size, and by the
target rule width / max(|midpoint|, π²/D²). The bounds are verified
either way.

With --ground-state the certificate also holds results.ground_state for
the certified step: whether the ground state is log-concave (proven,
disproven with a witness, or undecided with the reason), an upper bound of
the L2 error of the approximate ground state, and enclosures of the ground
state (u > 0, ∫u² = 1) at the problem's "points"; check recomputes it.

On an interrupt (Ctrl-C) certify prints "interrupted" and the best
verified bounds reached so far, writes them as a certificate whose stop
reason is "interrupted" (check reproduces it), and exits with status 130.
A certificate is written to a temporary file and renamed, so an earlier
file at the same path stays intact until the new one is complete.

Exit status: 0 on success, 1 on a failure or a bad option (--rel-width
below 1e-15 or not below 1, --time-limit not positive, --memory-limit
not a size from 16MiB up), 2 if the problem file is invalid (its own
target below 1e-15 included) or its first mesh would exceed the memory
budget (--memory-limit, default 16GiB), 4 with --strict when the target was not
reached, 130 when interrupted.

With --plot DIR the pictures are drawn into DIR after the certificate is
written, titled with its enclosures of λ1, λ2 and the gap. An interval or
a polygon: mesh (2D) and mode1, mode2, the approximate eigenfunctions on
the certificate's trial space (a rectangle given as a product: its own,
or the products of its factors'). A polyhedron, or a box or prism given as a
product: solid (the solid, faces coloured by their condition, a
polyhedron's mesh on its faces) and solid-mode1, solid-mode2, the
approximate eigenfunctions of λ1 and λ2 on the plane --slice AXIS=VALUE
(default z about halfway up, or x, then y, halfway across when a mode
nearly vanishes there; a plane that misses the solid or passes through a
vertex is refused before computing): on a polyhedron from the
certificate's trial space when it has at most 8000 unknowns, else from a
smaller one of the picture's own (the output says which); on a product
the products of the factors' approximate eigenfunctions. They are
approximations, not bounds, and say so.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			out := f.out
			if out == "" {
				out = strings.TrimSuffix(args[0], filepath.Ext(args[0])) + ".cert.json"
			}
			if err := checkCertifyOutputs(f, out, args[0]); err != nil {
				return err
			}
			p, err := loadProblem(args[0])
			if err != nil {
				return err
			}
			return runCertify(cmd, p, f, out)
		},
	}
	f.register(cmd, "")
	cmd.Flags().StringVar(&f.slice, "slice", "", "with --plot on a three-dimensional domain: the plane of the eigenfunctions, AXIS=VALUE (e.g. z=1/2; default z about halfway up, or x or y when a mode vanishes there)")
	return cmd
}

// runCertify certifies p, prints the table and writes the certificate.
func runCertify(cmd *cobra.Command, p *problem.Problem, f certifyFlags, out string) error {
	opt := certify.Options{TimeLimit: f.timeLimit, Tool: "gapcert " + Version, GroundState: f.groundState}
	if f.relWidth != "" {
		if _, err := certify.ParseTarget(f.relWidth); err != nil {
			return &exitError{code: exitFailure, err: fmt.Errorf("--rel-width: %v", err)}
		}
		opt.RelWidth = f.relWidth
	}
	if f.timeLimit <= 0 {
		return &exitError{code: exitFailure, err: fmt.Errorf("--time-limit %v: want a positive duration (hint: --time-limit 60s)", f.timeLimit)}
	}
	if err := f.memory.parse(); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	opt.Memory = f.memory.bytes
	if p.IsProduct() && f.groundState {
		return &exitError{code: exitInvalid, err: errors.New("--ground-state is not available on product domains yet (hint: certify without it)")}
	}
	solid, err := planSolid(p, f)
	if err != nil {
		return err
	}
	if i := certify.GroundStateClaim(p); i >= 0 && !f.groundState {
		return &exitError{code: exitInvalid, err: fmt.Errorf("claims[%d]: %q names shape_margin, which only results.ground_state provides (hint: add --ground-state)", i, p.Claims[i])}
	}
	if progressWanted(cmd, f.quiet, f.progress) {
		opt.Progress = func(format string, args ...any) { fmt.Fprintf(cmd.ErrOrStderr(), format, args...) }
	}
	ctx, stop := signal.NotifyContext(cmd.Context(), os.Interrupt)
	defer stop()
	c, err := certify.Certify(ctx, p, opt)
	var budget *certify.BudgetError
	var target *certify.TargetError
	var unsupported *certify.UnsupportedError
	switch {
	case err != nil && ctx.Err() != nil:
		fmt.Fprintln(cmd.ErrOrStderr(), "interrupted")
		return &exitError{code: exitInterrupted, err: errors.New("interrupted before the first step finished: no bounds to report, nothing written")}
	case errors.As(err, &budget), errors.As(err, &target), errors.As(err, &unsupported):
		return &exitError{code: exitInvalid, err: err}
	case err != nil:
		return &exitError{code: exitFailure, err: err}
	}
	stopped := ""
	if ref, err := certify.RefinementOf(c); err == nil && ref != nil {
		stopped = ref.StopReason
	}
	if stopped == certify.StopInterrupted {
		fmt.Fprintln(cmd.ErrOrStderr(), "interrupted; the best verified bounds reached so far:")
	}
	data, err := c.Marshal()
	if err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	if err := outfile.Write(out, data); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	printCertificate(cmd.OutOrStdout(), p, c)
	fmt.Fprintf(cmd.OutOrStdout(), "\ncertificate written to %s\n", out)
	if stopped == certify.StopInterrupted {
		return &exitError{code: exitInterrupted, err: errors.New("interrupted")}
	}
	if solid != nil {
		files, err := solid.draw(cmd.OutOrStdout(), f.plotDir, p, c)
		if err != nil {
			return &exitError{code: exitFailure, err: fmt.Errorf("the certificate is written, but the pictures could not be drawn into %s: %v", f.plotDir, err)}
		}
		fmt.Fprintf(cmd.OutOrStdout(), "pictures (approximate eigenfunctions, not part of the proof): %s\n", strings.Join(files, ", "))
	} else if f.plotDir != "" {
		files, err := drawModes(f.plotDir, p, c)
		if err != nil {
			return &exitError{code: exitFailure, err: fmt.Errorf("the certificate is written, but the pictures could not be drawn into %s: %v", f.plotDir, err)}
		}
		fmt.Fprintf(cmd.OutOrStdout(), "pictures (approximate eigenfunctions, not part of the proof): %s\n", strings.Join(files, ", "))
	}
	if f.strict && stopped != certify.StopTarget {
		return &exitError{code: exitTargetMissed, err: fmt.Errorf("target not reached (stopped: %s); --strict", stopped)}
	}
	return nil
}

// progressWanted reports whether progress lines go to stderr: never with
// --quiet, always with --progress, else when stderr is a terminal.
func progressWanted(cmd *cobra.Command, quiet, progress bool) bool {
	return !quiet && (progress || isTerminal(cmd.ErrOrStderr()))
}

// drawModes draws the first two approximate eigenfunctions of a certified
// problem, labelled with their certified enclosures.
func drawModes(dir string, p *problem.Problem, c *certs.Certificate) ([]string, error) {
	const count = 2
	var m *plot.Modes
	if p.IsProduct() { // a rectangle: its own modes, or products of its factors'
		modes, err := plot.ProductModesOf(p, c)
		if err != nil {
			return nil, err
		}
		m = &plot.Modes{Title: p.Name, Eval: func(k int, x, y float64) float64 { return modes.Eval(k, x, y, 0) }, Triangles: modes.Triangles}
	} else {
		modes, err := certify.ApproximateModes(p, c, count)
		if err != nil {
			return nil, err
		}
		m = &plot.Modes{Title: p.Name, Eval: modes.Eval, Triangles: modes.Triangles}
	}
	if p.Dim == 1 {
		m.Interval = [2]float64{p.Interval[0].Val.Mid(), p.Interval[1].Val.Mid()}
	} else {
		for _, v := range p.Vertices {
			m.Polygon = append(m.Polygon, [2]float64{v[0].Val.Mid(), v[1].Val.Mid()})
		}
	}
	for _, bc := range p.Boundary {
		side := plot.Side{Kind: bc.Kind.String()}
		if bc.Kind == boundary.Robin {
			side.Alpha = bc.Alpha.Text
			if r := bc.Alpha.Rat; r != nil && r.RatString() != side.Alpha {
				side.Alpha += " = " + r.RatString() // a parameter's value
			}
		}
		m.Boundary = append(m.Boundary, side)
	}
	for _, e := range c.Results.Eigenvalues[:count] {
		m.Labels = append(m.Labels, enclosureLabel(e.Index, e.Bound()))
	}
	return plot.Write(dir, m, plot.Formats())
}

// enclosureLabel is the label "λk ∈ [lower, upper]" of a certified
// enclosure, shortened outward (shortLower, shortUpper).
func enclosureLabel(k int, b certs.Bound) string {
	return fmt.Sprintf("λ%d ∈ [%s, %s]", k, shortLower(b.Lower), shortUpper(b.Upper))
}

// shortLower and shortUpper shorten printed bounds to 8 digits for labels,
// keeping their direction (a label must not claim more than the
// certificate).
func shortLower(s string) string {
	x, err := decimalio.ParseLower(s)
	if err != nil {
		return s
	}
	return decimalio.FormatLower(x, 8)
}

func shortUpper(s string) string {
	x, err := decimalio.ParseUpper(s)
	if err != nil {
		return s
	}
	return decimalio.FormatUpper(x, 8)
}

// printCertificate writes the human-readable table of a certificate.
func printCertificate(w io.Writer, p *problem.Problem, c *certs.Certificate) {
	name := p.Name
	if name == "" {
		name = "(unnamed)"
	}
	fmt.Fprintf(w, "problem %s  sha256 %s\n\n", name, c.ProblemSHA256)
	widths := map[string]certify.Width{}
	ws, _ := certify.WidthsOf(c)
	for _, x := range ws {
		widths[x.Quantity] = x
	}
	row := func(label string, b certs.Bound) {
		x, ok := widths[label]
		if !ok { // a certificate without width records
			fmt.Fprintf(w, "%-10s %-26s %-26s %-9s %-9s %s\n", label, b.Lower, b.Upper, "", "", c.Results.RelativeWidths[label])
			return
		}
		rel := x.Relative
		if rel == "" {
			rel = "(has 0)"
		}
		fmt.Fprintf(w, "%-10s %-26s %-26s %-9s %-9s %s\n", label, b.Lower, b.Upper, x.Absolute, rel, x.TargetRule)
	}
	fmt.Fprintf(w, "%-10s %-26s %-26s %-9s %-9s %s\n", "", "lower", "upper", "width", "relative", "target rule")
	for _, e := range c.Results.Eigenvalues {
		row(fmt.Sprintf("lambda%d", e.Index), e.Bound())
	}
	row("gap", c.Results.Gap)
	fmt.Fprintf(w, "%-10s %-26s %-26s\n", "D", c.Results.Diameter.Lower, c.Results.Diameter.Upper)
	fmt.Fprintf(w, "%-10s %-26s %-26s\n", "D²·gap/π²", c.Results.GapD2OverPi2.Lower, c.Results.GapD2OverPi2.Upper)
	if len(c.Claims) > 0 {
		fmt.Fprintln(w, "\nclaims:")
		for _, cl := range c.Claims {
			fmt.Fprintf(w, "  %-10s %s   (lhs − rhs ∈ [%s, %s])\n", cl.Verdict, cl.Text, cl.Margin.Lower, cl.Margin.Upper)
			if cl.Inequality != "" && cl.Inequality != cl.Text {
				fmt.Fprintf(w, "             %s\n", cl.Inequality)
			}
			for _, h := range cl.Hypotheses {
				fmt.Fprintf(w, "             hypothesis %s: %s (%s)\n", h.Name, h.Verdict, h.Detail)
			}
			if cl.Reason != "" {
				fmt.Fprintf(w, "             %s\n", cl.Reason)
			}
		}
	}
	if gs := c.Results.GroundState; gs != nil {
		printGroundState(w, gs)
	}
	if ref, err := certify.RefinementOf(c); err == nil && ref != nil {
		fmt.Fprintf(w, "\nwidth: upper bound of upper − lower; relative: width / least |value| in the enclosure;\ntarget rule: %s\n", ref.TargetRule)
		verdict := "not reached"
		if ref.StopReason == certify.StopTarget {
			verdict = "reached"
		}
		fmt.Fprintf(w, "target %s: %s; refinement stopped: %s\n", ref.Target, verdict, ref.StopReason)
	}
	for _, warn := range c.Warnings {
		fmt.Fprintf(w, "\nwarning: %s\n", warn)
	}
}

// printGroundState prints results.ground_state.
func printGroundState(w io.Writer, gs *certs.GroundState) {
	fmt.Fprintf(w, "\nground state (%s):\n", gs.Normalization)
	fmt.Fprintf(w, "  log-concave: %s\n  %s\n", gs.LogConcavity, gs.Reason)
	if wt := gs.Witness; wt != nil {
		var pts []string
		for _, p := range wt.Points {
			pts = append(pts, "("+strings.Join(p, ", ")+")")
		}
		fmt.Fprintf(w, "  witness (%s): %s, margin ≥ %s\n", wt.Kind, strings.Join(pts, " "), wt.Margin.Lower)
	}
	if gs.L2Error != "" {
		fmt.Fprintf(w, "  ‖ũ − P₁ũ‖/‖ũ‖ ≤ %s\n", gs.L2Error)
	}
	for _, p := range gs.Points {
		fmt.Fprintf(w, "  u(%s) ∈ [%s, %s]\n", strings.Join(p.At, ", "), p.Value.Lower, p.Value.Upper)
	}
}

// isTerminal reports whether w is a character device (progress lines are
// shown only on a terminal).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}
