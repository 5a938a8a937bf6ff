package cover

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math/big"
	"path/filepath"
	"strconv"

	"gapcert/certs"
	"gapcert/certs/outfile"
	"gapcert/certs/sweep"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
)

// SummaryFormat is the format identifier of a cover summary.
const SummaryFormat = "gapcert.cover-summary/v1"

// Summary is the record of a cover run (one shard, or the merge of all):
// the coverage of each claim and one row per cell. Fractions are of the
// measure of the whole parameter box, as exact decimal text
// (problem.RatText): the family reader admits only counts of the first
// split with no prime factor but 2 and 5, so every fraction terminates.
type Summary struct {
	Format       string          `json:"format"`
	Family       string          `json:"family"`
	FamilySHA256 string          `json:"family_sha256"`
	Shard        sweep.Shard     `json:"shard"`
	Parameters   []ParamSummary  `json:"parameters"`
	Claims       []ClaimCoverage `json:"claims"`
	// Covered is the fraction of the box covered by the cells listed
	// (1 for a whole run or a merge whose tiling was proved).
	Covered string `json:"covered"`
	// Tiling says how the cells were shown to tile the box ("" for a
	// shard or a run: merge proves it; see Merge).
	Tiling string `json:"tiling,omitempty"`
	// Corners is the number of distinct corner certificates the cells use.
	Corners int       `json:"corners"`
	Cells   []CellRow `json:"cells"`
}

// ParamSummary is a covered parameter: range, min_cell and first split.
type ParamSummary struct {
	Name    string `json:"name"`
	Lo      string `json:"lo"`
	Hi      string `json:"hi"`
	MinCell string `json:"min_cell"`
	Count   int    `json:"count"`
}

// ClaimCoverage is the coverage of one claim: the fractions of the box
// where it holds, fails, or is undecided.
type ClaimCoverage struct {
	Text     string   `json:"text"`
	Coverage Coverage `json:"coverage"`
}

// Coverage holds fractions of the box's measure as exact text.
type Coverage struct {
	Holds     string `json:"holds"`
	Fails     string `json:"fails"`
	Undecided string `json:"undecided"`
}

// CellRow is one cell of a summary.
type CellRow struct {
	Bounds []ParamBounds `json:"bounds"`
	// Measure is the cell's fraction of the box.
	Measure           string   `json:"measure"`
	File              string   `json:"file"`
	CertificateSHA256 string   `json:"certificate_sha256"`
	Verdicts          []string `json:"verdicts"`
	Verdict           string   `json:"verdict"`
	Status            string   `json:"status"`
	Error             string   `json:"error,omitempty"`
}

// fraction returns m / (measure of the box) as exact text.
func (f *Family) fraction(m *big.Rat) string {
	return problem.RatText(new(big.Rat).Quo(m, f.Box().Measure()))
}

// summarize builds the summary of the rows.
func (f *Family) summarize(name string, shard sweep.Shard, rows []CellRow, corners int) *Summary {
	sortRows(f, rows)
	s := &Summary{Format: SummaryFormat, Family: name, FamilySHA256: f.SHA256, Shard: shard, Corners: corners, Cells: rows}
	for _, p := range f.Params {
		s.Parameters = append(s.Parameters, ParamSummary{Name: p.Name, Lo: problem.RatText(p.Lo), Hi: problem.RatText(p.Hi), MinCell: problem.RatText(p.MinCell), Count: p.Count})
	}
	total := f.Box().Measure()
	covered := new(big.Rat)
	sums := make([]map[string]*big.Rat, len(f.Claims))
	for i := range sums {
		sums[i] = map[string]*big.Rat{certs.Holds: new(big.Rat), certs.Fails: new(big.Rat), certs.Undecided: new(big.Rat)}
	}
	for _, r := range rows {
		if r.Status == StatusRejected {
			continue
		}
		m := mustBox(&Cell{Bounds: r.Bounds}, f).Measure()
		covered.Add(covered, m)
		for i, v := range r.Verdicts {
			if i < len(sums) && sums[i][v] != nil {
				sums[i][v].Add(sums[i][v], m)
			}
		}
	}
	frac := func(m *big.Rat) string { return problem.RatText(new(big.Rat).Quo(m, total)) }
	for i, text := range f.Claims {
		s.Claims = append(s.Claims, ClaimCoverage{Text: text, Coverage: Coverage{
			Holds: frac(sums[i][certs.Holds]), Fails: frac(sums[i][certs.Fails]), Undecided: frac(sums[i][certs.Undecided]),
		}})
	}
	s.Covered = frac(covered)
	return s
}

// summaryName returns the base name of a shard's summary.
func summaryName(s sweep.Shard) string { return sweep.SummaryFileName(s) }

// MarshalSummary returns the summary as indented JSON.
func MarshalSummary(s *Summary) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(s); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// UnmarshalSummary reads a cover summary strictly (format SummaryFormat).
func UnmarshalSummary(data []byte) (*Summary, error) {
	var s Summary
	if err := strictjson.Decode(data, &s); err != nil {
		return nil, fmt.Errorf("not a cover summary: %v", err)
	}
	if s.Format != SummaryFormat {
		return nil, fmt.Errorf("summary format %q is not %q", s.Format, SummaryFormat)
	}
	return &s, nil
}

// SummaryCSV returns the coverage table: one row per claim with the
// columns claim_index, claim, holds, fails, undecided.
func SummaryCSV(s *Summary) ([]byte, error) {
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	_ = w.Write([]string{"claim_index", "claim", "holds", "fails", "undecided"})
	for i, c := range s.Claims {
		_ = w.Write([]string{strconv.Itoa(i), c.Text, c.Coverage.Holds, c.Coverage.Fails, c.Coverage.Undecided})
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}

// CellsCSV returns one row per cell: for each parameter its lo and hi,
// the measure, one verdict column per claim, the verdict, status, file,
// certificate_sha256 and error.
func CellsCSV(s *Summary) ([]byte, error) {
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	var header []string
	for _, p := range s.Parameters {
		header = append(header, p.Name+"_lo", p.Name+"_hi")
	}
	header = append(header, "measure")
	for _, c := range s.Claims {
		header = append(header, c.Text)
	}
	header = append(header, "verdict", "status", "file", "certificate_sha256", "error")
	_ = w.Write(header)
	for _, r := range s.Cells {
		var row []string
		for _, b := range r.Bounds {
			row = append(row, b.Lo, b.Hi)
		}
		row = append(row, r.Measure)
		for i := range s.Claims {
			v := ""
			if i < len(r.Verdicts) {
				v = r.Verdicts[i]
			}
			row = append(row, v)
		}
		row = append(row, r.Verdict, r.Status, r.File, r.CertificateSHA256, r.Error)
		_ = w.Write(row)
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}

// writeSummary writes base.json, base.csv (coverage) and base-cells.csv.
func writeSummary(dir, base string, s *Summary) error {
	js, err := MarshalSummary(s)
	if err != nil {
		return err
	}
	cs, err := SummaryCSV(s)
	if err != nil {
		return err
	}
	cells, err := CellsCSV(s)
	if err != nil {
		return err
	}
	// The JSON summary last: its presence means the others are written.
	for _, out := range []struct {
		name string
		data []byte
	}{{base + "-cells.csv", cells}, {base + ".csv", cs}, {base + ".json", js}} {
		if err := outfile.Write(filepath.Join(dir, out.name), out.data); err != nil {
			return err
		}
	}
	return nil
}
