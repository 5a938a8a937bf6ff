package report

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strconv"
	"strings"

	"gapcert/certs"
	"gapcert/strictjson"
)

// Output formats of Write.
const (
	LaTeX    = "latex"
	Markdown = "markdown"
)

// Notations of the enclosures.
const (
	Compact = "compact" // common digits with the differing digits as subscript (lower) and superscript (upper)
	Bracket = "bracket" // [lower, upper]
)

// Formats returns the output formats Write accepts.
func Formats() []string { return []string{LaTeX, Markdown} }

// Notations returns the notations Write accepts.
func Notations() []string { return []string{Compact, Bracket} }

// Options controls Write. Tool names the program writing the table
// (e.g. "gapcert 0.1.0"); Checked says that every certificate was
// re-verified by recomputation before the table was written, which the
// caption states either way.
type Options struct {
	Format      string // LaTeX or Markdown
	Notation    string // Compact (the default when empty) or Bracket
	WidthDigits int    // see Shorten; 0 means DefaultWidthDigits
	Tool        string
	Checked     bool
}

// Validate reports an unknown format or notation, or a negative
// WidthDigits.
func (opt Options) Validate() error {
	if !slices.Contains(Formats(), opt.Format) {
		return fmt.Errorf("report: unknown format %q (hint: use one of %s)", opt.Format, strings.Join(Formats(), ", "))
	}
	if opt.Notation != "" && !slices.Contains(Notations(), opt.Notation) {
		return fmt.Errorf("report: unknown notation %q (hint: use one of %s)", opt.Notation, strings.Join(Notations(), ", "))
	}
	if opt.WidthDigits < 0 {
		return fmt.Errorf("report: WidthDigits %d is negative", opt.WidthDigits)
	}
	return nil
}

// Write writes a table of the certified enclosures of entries, one row per
// certificate in the given order: the problem name, λ1, λ2, the gap
// λ2 − λ1, D²·(λ2 − λ1)/π² and the verdict of each claim, followed by a
// caption naming the notation, the tools that computed the certificates,
// whether they were re-verified, and the SHA-256 of each certificate file.
// Every printed enclosure contains the certified one (Shorten). It returns
// the error of Options.Validate, an error for no entries, and for a
// certificate without λ1 or λ2.
func Write(w io.Writer, entries []Entry, opt Options) error {
	if err := opt.Validate(); err != nil {
		return err
	}
	if opt.Notation == "" {
		opt.Notation = Compact
	}
	if len(entries) == 0 {
		return errors.New("report: no certificates")
	}
	var st style = markdownStyle{}
	if opt.Format == LaTeX {
		st = latexStyle{}
	}
	rows := make([][]string, len(entries))
	for i, e := range entries {
		row, err := tableRow(e, st, opt)
		if err != nil {
			return fmt.Errorf("%s: %w", e.Path, err)
		}
		rows[i] = row
	}
	_, err := io.WriteString(w, st.table(rows, caption(entries, st, opt)))
	return err
}

func tableRow(e Entry, st style, opt Options) ([]string, error) {
	c := e.Cert
	find := func(k int) (certs.Bound, error) {
		for _, ev := range c.Results.Eigenvalues {
			if ev.Index == k {
				return ev.Bound(), nil
			}
		}
		return certs.Bound{}, fmt.Errorf("the certificate has no enclosure of lambda%d", k)
	}
	l1, err := find(1)
	if err != nil {
		return nil, err
	}
	l2, err := find(2)
	if err != nil {
		return nil, err
	}
	row := []string{st.text(problemName(c))}
	for _, b := range []certs.Bound{l1, l2, c.Results.Gap, c.Results.GapD2OverPi2} {
		s, err := Shorten(b.Lower, b.Upper, opt.WidthDigits)
		if err != nil {
			return nil, err
		}
		row = append(row, st.number(s, opt.Notation == Compact))
	}
	var claims []string
	for _, cl := range c.Claims {
		claims = append(claims, st.code(cl.Text)+": "+cl.Verdict)
	}
	if len(claims) == 0 {
		row = append(row, st.none())
	} else {
		row = append(row, strings.Join(claims, st.claimSeparator()))
	}
	return row, nil
}

// problemName is the name recorded in the certificate's problem, or
// "(unnamed)".
func problemName(c *certs.Certificate) string {
	p, _, _ := strictjson.Parse(c.Problem) // certs.Unmarshal checked that it is an object
	name := p.Get("name")                  // exactly "name", as problem.Parse reads it
	if name == nil || name.Kind != strictjson.String || strings.TrimSpace(name.Str) == "" {
		return "(unnamed)"
	}
	return name.Str
}

func caption(entries []Entry, st style, opt Options) string {
	var b strings.Builder
	b.WriteString("Certified enclosures of the two lowest eigenvalues and the gap. ")
	b.WriteString(st.notationNote(opt.Notation == Compact))
	b.WriteString(" The printed lower end is at most, and the printed upper end at least, the certified bound (rounded outward in exact decimal arithmetic). ")
	var tools []string
	for _, e := range entries {
		t := e.Cert.Provenance.Tool
		if t == "" {
			t = "an unnamed tool"
		}
		if !slices.Contains(tools, t) {
			tools = append(tools, t)
		}
	}
	b.WriteString(st.text("Computed by " + strings.Join(tools, ", ") + "; "))
	tool := opt.Tool
	if tool == "" {
		tool = "an unnamed tool"
	}
	if opt.Checked {
		b.WriteString(st.text("every certificate re-verified by recomputation with " + tool + "."))
	} else {
		b.WriteString(st.text("not re-verified (table written by " + tool + " without recomputing the certificates)."))
	}
	b.WriteString(" " + st.text("SHA-256 of the certificate files, by row: "))
	for i, e := range entries {
		if i > 0 {
			b.WriteString("; ")
		}
		b.WriteString(st.text(strconv.Itoa(i+1) + ". " + filepath.Base(e.Path) + " "))
		b.WriteString(st.code(e.FileSHA256))
	}
	b.WriteString(".")
	return b.String()
}

// style is the markup of one output format.
type style interface {
	text(s string) string                // escaped plain text
	code(s string) string                // verbatim text (claims, digests)
	number(s Shown, compact bool) string // an enclosure
	none() string                        // an empty cell
	claimSeparator() string
	notationNote(compact bool) string
	table(rows [][]string, caption string) string
}

// latexStyle writes a LaTeX table environment (no packages needed).
type latexStyle struct{}

var latexEscapes = strings.NewReplacer(
	`\`, `\textbackslash{}`, `{`, `\{`, `}`, `\}`, `$`, `\$`, `&`, `\&`, `#`, `\#`,
	`^`, `\^{}`, `_`, `\_`, `%`, `\%`, `~`, `\textasciitilde{}`, `<`, `\textless{}`, `>`, `\textgreater{}`,
)

func (latexStyle) text(s string) string { return latexEscapes.Replace(s) }
func (latexStyle) code(s string) string { return `\texttt{` + latexEscapes.Replace(s) + `}` }
func (latexStyle) none() string         { return "--" }
func (latexStyle) claimSeparator() string {
	return "; "
}

func (latexStyle) number(s Shown, compact bool) string {
	scale := ""
	if s.Exp != 0 {
		scale = fmt.Sprintf(`\times 10^{%d}`, s.Exp)
	}
	switch {
	case s.Point:
		return "$" + s.Lo + scale + "$"
	case compact && s.Common > 0:
		return fmt.Sprintf("$%s_{%s}^{%s}%s$", s.Lo[:s.Common], s.Lo[s.Common:], s.Hi[s.Common:], scale)
	}
	open, lo, hi, closing := "[", s.Lo, s.Hi, "]"
	if lo == "-Infinity" {
		open, lo = "(", `-\infty`
	}
	if hi == "Infinity" {
		hi, closing = `\infty`, ")"
	}
	return fmt.Sprintf("$%s%s, %s%s%s$", open, lo, hi, closing, scale)
}

func (latexStyle) notationNote(compact bool) string {
	if compact {
		return `An entry $x_{a}^{b}$ is the interval from the number with the digits $x$ followed by $a$ to the number with the digits $x$ followed by $b$ (e.g.\ $9.8696_{04}^{12}$ is $[9.869604, 9.869612]$).`
	}
	return `An entry $[l, u]$ is the closed interval from $l$ to $u$.`
}

func (st latexStyle) table(rows [][]string, caption string) string {
	var b strings.Builder
	b.WriteString("\\begin{table}\n\\centering\n\\begin{tabular}{llllll}\n\\hline\n")
	b.WriteString(`problem & $\lambda_1$ & $\lambda_2$ & $\lambda_2-\lambda_1$ & $D^2(\lambda_2-\lambda_1)/\pi^2$ & claims \\` + "\n\\hline\n")
	for _, r := range rows {
		b.WriteString(strings.Join(r, " & ") + " \\\\\n")
	}
	b.WriteString("\\hline\n\\end{tabular}\n\\caption{" + caption + "}\n\\end{table}\n")
	return b.String()
}

// markdownStyle writes a GitHub-flavoured Markdown table (sub- and
// superscripts as the HTML elements sub and sup) and the caption as the
// paragraph after it.
type markdownStyle struct{}

var markdownEscapes = strings.NewReplacer(
	`\`, `\\`, `|`, `\|`, `*`, `\*`, `_`, `\_`, "`", "\\`", `<`, `&lt;`, `>`, `&gt;`,
)

func (markdownStyle) text(s string) string { return markdownEscapes.Replace(s) }

// code writes s as a code span; "|" stays escaped inside a table cell.
func (markdownStyle) code(s string) string {
	fence := "`"
	for strings.Contains(s, fence) {
		fence += "`"
	}
	return fence + strings.ReplaceAll(s, "|", `\|`) + fence
}

func (markdownStyle) none() string           { return "—" }
func (markdownStyle) claimSeparator() string { return "<br>" }

func (markdownStyle) number(s Shown, compact bool) string {
	scale := ""
	if s.Exp != 0 {
		scale = fmt.Sprintf(" × 10<sup>%d</sup>", s.Exp)
	}
	switch {
	case s.Point:
		return s.Lo + scale
	case compact && s.Common > 0:
		return fmt.Sprintf("%s<sub>%s</sub><sup>%s</sup>%s", s.Lo[:s.Common], s.Lo[s.Common:], s.Hi[s.Common:], scale)
	}
	open, lo, hi, closing := "[", s.Lo, s.Hi, "]"
	if lo == "-Infinity" {
		open, lo = "(", "-∞"
	}
	if hi == "Infinity" {
		hi, closing = "∞", ")"
	}
	return fmt.Sprintf("%s%s, %s%s%s", open, lo, hi, closing, scale)
}

func (markdownStyle) notationNote(compact bool) string {
	if compact {
		return "An entry x<sub>a</sub><sup>b</sup> is the interval from the number with the digits x followed by a to the number with the digits x followed by b (e.g. 9.8696<sub>04</sub><sup>12</sup> is [9.869604, 9.869612])."
	}
	return "An entry [l, u] is the closed interval from l to u."
}

func (markdownStyle) table(rows [][]string, caption string) string {
	var b strings.Builder
	b.WriteString("| problem | λ1 | λ2 | gap λ2 − λ1 | D²·gap/π² | claims |\n")
	b.WriteString("| --- | --- | --- | --- | --- | --- |\n")
	for _, r := range rows {
		b.WriteString("| " + strings.Join(r, " | ") + " |\n")
	}
	b.WriteString("\n" + caption + "\n")
	return b.String()
}
