package report

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"gapcert/certs"
	"gapcert/fem/problem/strictjson"
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
	// Family is the name of the sweep family the certificates are points
	// of (Source.Family), and FamilyPoints its number of points
	// (Source.FamilyPoints), for the caption; "" and 0 when none.
	Family       string
	FamilyPoints int
	// Parameters are parameter names (Source.Parameters). When not empty
	// the table has a column of point indices (Entry.Point) and one column
	// per parameter (the exact values of Entry.Params) in place of the
	// problem names.
	Parameters []string
	// HashListFile names the file where the caller writes HashList(entries),
	// for the caption; when "" Write puts the list after the table (in
	// LaTeX as comment lines).
	HashListFile string
}

// Validate reports an unknown format or notation, or a negative
// WidthDigits.
func (opt Options) Validate() error {
	if !slices.Contains(Formats(), opt.Format) {
		return fmt.Errorf("unknown format %q (hint: use one of %s)", opt.Format, strings.Join(Formats(), ", "))
	}
	if opt.Notation != "" && !slices.Contains(Notations(), opt.Notation) {
		return fmt.Errorf("unknown notation %q (hint: use one of %s)", opt.Notation, strings.Join(Notations(), ", "))
	}
	if opt.WidthDigits < 0 {
		return fmt.Errorf("WidthDigits %d is negative", opt.WidthDigits)
	}
	return nil
}

// Write writes a table of the certified enclosures of entries, one row per
// certificate in the given order: the problem name (or, with
// Options.Parameters, the point index and the parameter values), every
// certified eigenvalue λ1 … λN (N the most any entry has; an entry with
// fewer leaves its last cells empty), the gap λ2 − λ1, D²·(λ2 − λ1)/π² and
// the claim verdicts: one column per claim, headed by its text, when every
// entry has the same claims, else one column of "text: verdict". LaTeX is
// a longtable (it breaks across pages; the preamble needs
// \usepackage{longtable}), Markdown a table followed by the caption. The
// caption names the notation, the tools that computed the certificates,
// whether they were re-verified, and one digest of all certificate files
// (ListDigest of HashList; the list itself goes to Options.HashListFile
// or after the table). Every printed enclosure contains the certified one
// (Shorten). It returns the error of Options.Validate, an error for no
// entries, for a certificate without λ1 or λ2, and for an entry without
// a value of one of Options.Parameters.
func Write(w io.Writer, entries []Entry, opt Options) error {
	if err := opt.Validate(); err != nil {
		return err
	}
	if opt.Notation == "" {
		opt.Notation = Compact
	}
	if len(entries) == 0 {
		return errors.New("no certificates to tabulate")
	}
	var st style = markdownStyle{}
	if opt.Format == LaTeX {
		st = latexStyle{}
	}
	lay := newLayout(entries, opt)
	rows := make([][]string, len(entries))
	for i, e := range entries {
		row, err := tableRow(e, st, opt, lay)
		if err != nil {
			return fmt.Errorf("%s: %w", e.Path, err)
		}
		rows[i] = row
	}
	list := HashList(entries)
	text := st.table(lay.heads(st), lay.align(), rows, caption(entries, st, opt, ListDigest(list)))
	if opt.HashListFile == "" {
		text += st.list(list)
	}
	_, err := io.WriteString(w, text)
	return err
}

// HashList returns the list of the certificate files of entries: one line
// "SHA-256  NAME\n" per entry (the lowercase hex SHA-256 of the file's
// bytes, two spaces, the file's base name), the lines sorted bytewise. It
// is what "sha256sum FILES | sort" prints, so "sha256sum -c" re-checks it
// in the certificates' directory.
func HashList(entries []Entry) []byte {
	lines := make([]string, len(entries))
	for i, e := range entries {
		lines[i] = e.FileSHA256 + "  " + filepath.Base(e.Path) + "\n"
	}
	slices.Sort(lines)
	return []byte(strings.Join(lines, ""))
}

// ListDigest returns the lowercase hex SHA-256 of a HashList: one digest
// that names the certificate files of a table and their contents.
func ListDigest(list []byte) string {
	sum := sha256.Sum256(list)
	return hex.EncodeToString(sum[:])
}

// layout is the choice of columns of a table.
type layout struct {
	params []string // parameter columns (after a point column), or nil for a problem column
	eigen  int      // eigenvalue columns λ1 … λeigen
	claims []string // one column per claim text, or nil for one column of all claims
}

func newLayout(entries []Entry, opt Options) layout {
	lay := layout{params: opt.Parameters}
	for _, e := range entries {
		lay.eigen = max(lay.eigen, len(e.Cert.Results.Eigenvalues))
	}
	texts := claimTexts(entries[0].Cert)
	for _, e := range entries[1:] {
		if !slices.Equal(claimTexts(e.Cert), texts) {
			return lay
		}
	}
	if len(texts) > 0 {
		lay.claims = texts
	}
	return lay
}

func claimTexts(c *certs.Certificate) []string {
	texts := make([]string, len(c.Claims))
	for i, cl := range c.Claims {
		texts[i] = cl.Text
	}
	return texts
}

func (lay layout) heads(st style) []string {
	var h []string
	if lay.params != nil {
		h = append(h, st.text("point"))
		for _, p := range lay.params {
			h = append(h, st.paramHead(p))
		}
	} else {
		h = append(h, st.text("problem"))
	}
	for k := 1; k <= lay.eigen; k++ {
		h = append(h, st.lambdaHead(k))
	}
	h = append(h, st.gapHead(), st.scaledGapHead())
	if lay.claims == nil {
		return append(h, st.text("claims"))
	}
	for _, c := range lay.claims {
		h = append(h, st.code(c))
	}
	return h
}

// align returns one LaTeX column alignment per column.
func (lay layout) align() string {
	a := "l"
	if lay.params != nil {
		a = "r" + strings.Repeat("l", len(lay.params))
	}
	return a + strings.Repeat("l", lay.eigen+2+max(1, len(lay.claims)))
}

func tableRow(e Entry, st style, opt Options, lay layout) ([]string, error) {
	c := e.Cert
	find := func(k int) (certs.Bound, bool) {
		for _, ev := range c.Results.Eigenvalues {
			if ev.Index == k {
				return ev.Bound(), true
			}
		}
		return certs.Bound{}, false
	}
	for k := 1; k <= 2; k++ {
		if _, ok := find(k); !ok {
			return nil, fmt.Errorf("the certificate has no enclosure of lambda%d", k)
		}
	}
	var row []string
	if lay.params != nil {
		row = append(row, strconv.Itoa(e.Point))
		for _, p := range lay.params {
			v, ok := e.Params[p]
			if !ok {
				return nil, fmt.Errorf("no value of the parameter %s", p)
			}
			row = append(row, st.param(v))
		}
	} else {
		row = append(row, st.text(problemName(c)))
	}
	cell := func(b certs.Bound) error {
		s, err := Shorten(b.Lower, b.Upper, opt.WidthDigits)
		if err != nil {
			return err
		}
		row = append(row, st.number(s, opt.Notation == Compact))
		return nil
	}
	for k := 1; k <= lay.eigen; k++ {
		b, ok := find(k)
		if !ok {
			row = append(row, st.none())
			continue
		}
		if err := cell(b); err != nil {
			return nil, err
		}
	}
	for _, b := range []certs.Bound{c.Results.Gap, c.Results.GapD2OverPi2} {
		if err := cell(b); err != nil {
			return nil, err
		}
	}
	if lay.claims != nil {
		for _, cl := range c.Claims {
			row = append(row, st.text(cl.Verdict))
		}
		return row, nil
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

// caption is short whatever the number of rows: what the table is, how
// to read an entry, who computed and who re-verified the certificates,
// and one digest of all certificate files.
func caption(entries []Entry, st style, opt Options, digest string) string {
	var b strings.Builder
	b.WriteString(st.text("Certified enclosures"))
	if opt.Family != "" {
		b.WriteString(st.text(", one row per point of the sweep family " + opt.Family))
	}
	if opt.FamilyPoints > len(entries) {
		b.WriteString(st.text(fmt.Sprintf(" (%d of its %d points)", len(entries), opt.FamilyPoints)))
	}
	b.WriteString(". ")
	b.WriteString(st.notationNote(opt.Notation == Compact))
	b.WriteString(st.text(" The printed ends are rounded outward from the certified bounds. "))
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
	where := "listed after the table"
	if opt.HashListFile != "" {
		where = "listed in " + opt.HashListFile
	}
	b.WriteString(" " + st.text(fmt.Sprintf("SHA-256 of the sorted sha256sum list of the %d certificate files (%s): ", len(entries), where)))
	b.WriteString(st.code(digest))
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
	paramHead(name string) string // the head of a parameter column
	param(value string) string    // a parameter's exact value
	lambdaHead(k int) string
	gapHead() string
	scaledGapHead() string
	// table lays out the header cells, the rows and the caption; align
	// gives one LaTeX alignment letter per column.
	table(heads []string, align string, rows [][]string, caption string) string
	list(hashList []byte) string // a HashList printed after the table
}

// plainNumber matches the exact value texts that read the same as
// mathematics: decimals and fractions.
var plainNumber = regexp.MustCompile(`^-?[0-9]+(\.[0-9]+)?(/[0-9]+)?$`)

// plainName matches one ASCII letter.
var plainName = regexp.MustCompile(`^[A-Za-z]$`)

// latexStyle writes a LaTeX longtable (package longtable).
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
		return `An entry $x_{a}^{b}$ is the interval from the digits $x$ followed by $a$ to $x$ followed by $b$: $9.8696_{04}^{12} = [9.869604, 9.869612]$.`
	}
	return `An entry $[l, u]$ is the closed interval from $l$ to $u$.`
}

func (st latexStyle) paramHead(name string) string {
	if plainName.MatchString(name) {
		return "$" + name + "$"
	}
	return st.text(name)
}

func (st latexStyle) param(v string) string {
	if plainNumber.MatchString(v) {
		return "$" + v + "$"
	}
	return st.text(v)
}

func (latexStyle) lambdaHead(k int) string { return fmt.Sprintf(`$\lambda_{%d}$`, k) }
func (latexStyle) gapHead() string         { return `$\lambda_2-\lambda_1$` }
func (latexStyle) scaledGapHead() string   { return `$D^2(\lambda_2-\lambda_1)/\pi^2$` }

// table writes a longtable: the caption and the header on the first
// page, the header again on every following page.
func (st latexStyle) table(heads []string, align string, rows [][]string, caption string) string {
	var b strings.Builder
	head := strings.Join(heads, " & ") + " \\\\\n"
	b.WriteString("% needs \\usepackage{longtable}; a wide table fits with \\small or on a landscape page\n")
	b.WriteString("\\begin{longtable}{" + align + "}\n")
	b.WriteString("\\caption{" + caption + "}\\\\\n")
	b.WriteString("\\hline\n" + head + "\\hline\n\\endfirsthead\n")
	fmt.Fprintf(&b, "\\multicolumn{%d}{l}{(continued)}\\\\\n", len(heads))
	b.WriteString("\\hline\n" + head + "\\hline\n\\endhead\n")
	b.WriteString("\\hline\n\\endfoot\n")
	for _, r := range rows {
		b.WriteString(strings.Join(r, " & ") + " \\\\\n")
	}
	b.WriteString("\\end{longtable}\n")
	return b.String()
}

func (latexStyle) list(hashList []byte) string {
	var b strings.Builder
	b.WriteString("% SHA-256 of the certificate files (sha256sum format; the caption gives the SHA-256 of these lines):\n")
	for _, line := range strings.SplitAfter(string(hashList), "\n") {
		if line != "" {
			b.WriteString("% " + line)
		}
	}
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
		return "An entry x<sub>a</sub><sup>b</sup> is the interval from the digits x followed by a to x followed by b: 9.8696<sub>04</sub><sup>12</sup> = [9.869604, 9.869612]."
	}
	return "An entry [l, u] is the closed interval from l to u."
}

func (st markdownStyle) paramHead(name string) string { return st.text(name) }
func (st markdownStyle) param(v string) string        { return st.text(v) }
func (markdownStyle) lambdaHead(k int) string         { return fmt.Sprintf("λ%d", k) }
func (markdownStyle) gapHead() string                 { return "gap λ2 − λ1" }
func (markdownStyle) scaledGapHead() string           { return "D²·gap/π²" }

func (markdownStyle) table(heads []string, align string, rows [][]string, caption string) string {
	var b strings.Builder
	b.WriteString("| " + strings.Join(heads, " | ") + " |\n")
	b.WriteString(strings.Repeat("| --- ", len(heads)) + "|\n")
	for _, r := range rows {
		b.WriteString("| " + strings.Join(r, " | ") + " |\n")
	}
	b.WriteString("\n" + caption + "\n")
	return b.String()
}

func (markdownStyle) list(hashList []byte) string {
	return "\nSHA-256 of the certificate files (sha256sum format; the caption gives the SHA-256 of these lines):\n\n```\n" + string(hashList) + "```\n"
}
