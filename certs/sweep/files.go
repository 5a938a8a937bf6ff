package sweep

import (
	"bytes"
	"crypto/sha256"
	"encoding/csv"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strconv"

	"gapcert/certs"
	"gapcert/certs/outfile"
	"gapcert/fem/problem/strictjson"
)

// Names of the files a sweep writes into its directory.
const (
	// FamilyFileName is the copy of the family file kept beside the
	// certificates, so that a directory says which family it holds.
	FamilyFileName = "family.json"
	// certSuffix ends every certificate file name.
	certSuffix = ".cert.json"
	// hashPrefixLen is the number of hex digits of the problem hash in a
	// certificate file name.
	hashPrefixLen = 12
)

// CertFileName returns the certificate file name of point index with the
// given problem hash: "p" and the index with at least four digits, "-",
// the first 12 hex digits of the hash, ".cert.json"
// ("p0007-3fa1c2d4e5f6.cert.json").
func CertFileName(index int, problemSHA256 string) string {
	return fmt.Sprintf("p%04d-%s%s", index, problemSHA256[:hashPrefixLen], certSuffix)
}

var certNamePattern = regexp.MustCompile(`^p([0-9]{4,6})-([0-9a-f]{12})\.cert\.json$`)

// parseCertFileName returns the index and hash prefix of a certificate
// file name written by CertFileName.
func parseCertFileName(name string) (index int, hashPrefix string, ok bool) {
	m := certNamePattern.FindStringSubmatch(name)
	if m == nil {
		return 0, "", false
	}
	index, err := strconv.Atoi(m[1])
	if err != nil || fmt.Sprintf("%04d", index) != m[1] {
		return 0, "", false // a padded index must be written the canonical way
	}
	return index, m[2], true
}

// SummaryFileName returns the base name (without extension) of the
// summary of a shard: "summary" for the whole family, else
// "summary-shard-i-of-n".
func SummaryFileName(s Shard) string {
	if s == whole {
		return "summary"
	}
	return fmt.Sprintf("summary-shard-%d-of-%d", s.Index, s.Count)
}

func sha256Hex(data []byte) string {
	sum := sha256.Sum256(data)
	return hex.EncodeToString(sum[:])
}

// writeNew writes data to path atomically (outfile.Write: a temporary
// file in the same directory, fsync, rename), so that an interrupted run
// never leaves a partial file under path. It refuses to replace an
// existing path unless replace is set.
func writeNew(path string, data []byte, replace bool) error {
	if replace {
		return outfile.Write(path, data)
	}
	return outfile.WriteNew(path, data)
}

// MarshalSummary returns the summary as indented JSON with a trailing
// newline.
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

// UnmarshalSummary reads a summary strictly (package strictjson: no key
// given twice, every key spelled as Summary defines it, at every depth;
// format SummaryFormat).
func UnmarshalSummary(data []byte) (*Summary, error) {
	var s Summary
	if err := strictjson.Decode(data, &s); err != nil {
		return nil, fmt.Errorf("not a sweep summary: %v", err)
	}
	if s.Format != SummaryFormat {
		return nil, fmt.Errorf("summary format %q is not %q", s.Format, SummaryFormat)
	}
	return &s, nil
}

// SummaryCSV returns the points of s as CSV: one header row, then one row
// per point with the columns index, one per parameter (exact text),
// status, verdict, lambda<k>_lower/upper for each eigenvalue of the first
// point, gap_lower/upper, gap_d2_over_pi2_lower/upper, one verdict column
// per claim named by the claim's text ("gap >= 3*pi^2/D^2",
// "@triangle_gap"; every point of a family has the same claims), when the
// summary's family asks for the ground state (Summary.GroundState) the
// columns log_concavity (proven, disproven, undecided), witness (its
// kind), shape_margin_lower/upper (ShapeMargin) and l2_error_upper, then
// file, certificate_sha256, error. Bounds are the certificate's decimal
// strings.
func SummaryCSV(s *Summary) ([]byte, error) {
	eigen := 0
	var claimTexts []string
	for _, p := range s.Points {
		eigen = max(eigen, len(p.Eigenvalues))
		for c := len(claimTexts); c < len(p.Claims); c++ {
			claimTexts = append(claimTexts, p.Claims[c].Text)
		}
	}
	claims := len(claimTexts)
	header := []string{"index"}
	header = append(header, s.Parameters...)
	header = append(header, "status", "verdict")
	for k := 1; k <= eigen; k++ {
		header = append(header, fmt.Sprintf("lambda%d_lower", k), fmt.Sprintf("lambda%d_upper", k))
	}
	header = append(header, "gap_lower", "gap_upper", "gap_d2_over_pi2_lower", "gap_d2_over_pi2_upper")
	header = append(header, claimTexts...)
	if s.GroundState {
		header = append(header, "log_concavity", "witness", "shape_margin_lower", "shape_margin_upper", "l2_error_upper")
	}
	header = append(header, "file", "certificate_sha256", "error")
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	if err := w.Write(header); err != nil {
		return nil, err
	}
	for _, p := range s.Points {
		row := []string{strconv.Itoa(p.Index)}
		for _, name := range s.Parameters {
			row = append(row, p.Params[name])
		}
		row = append(row, p.Status, p.Verdict)
		for k := 0; k < eigen; k++ {
			if k < len(p.Eigenvalues) {
				row = append(row, p.Eigenvalues[k].Lower, p.Eigenvalues[k].Upper)
			} else {
				row = append(row, "", "")
			}
		}
		row = append(row, p.Gap.Lower, p.Gap.Upper, p.GapD2OverPi2.Lower, p.GapD2OverPi2.Upper)
		for c := 0; c < claims; c++ {
			if c < len(p.Claims) {
				row = append(row, p.Claims[c].Verdict)
			} else {
				row = append(row, "")
			}
		}
		if s.GroundState {
			row = append(row, groundStateColumns(p.GroundState)...)
		}
		row = append(row, p.File, p.CertificateSHA256, p.Error)
		if err := w.Write(row); err != nil {
			return nil, err
		}
	}
	w.Flush()
	return buf.Bytes(), w.Error()
}

// groundStateColumns returns the ground-state columns of SummaryCSV for
// one point (empty strings where the point has nothing to say).
func groundStateColumns(gs *certs.GroundState) []string {
	if gs == nil {
		return []string{"", "", "", "", ""}
	}
	kind := ""
	if gs.Witness != nil {
		kind = gs.Witness.Kind
	}
	lo, hi := "", ""
	if m := ShapeMargin(gs); m != nil {
		lo, hi = m.Lower, m.Upper
	}
	return []string{gs.LogConcavity, kind, lo, hi, gs.L2Error}
}

// writeSummary writes s as base.json and base.csv in dir, replacing
// earlier summaries of the same name (they are checked by the caller to be
// summaries of the same family).
func writeSummary(dir, base string, s *Summary) error {
	js, err := MarshalSummary(s)
	if err != nil {
		return err
	}
	cs, err := SummaryCSV(s)
	if err != nil {
		return err
	}
	if err := writeNew(filepath.Join(dir, base+".json"), js, true); err != nil {
		return err
	}
	return writeNew(filepath.Join(dir, base+".csv"), cs, true)
}

// fillFromCertificate copies the certified results of c into p.
func fillFromCertificate(p *Point, c *certs.Certificate) {
	p.ProblemSHA256 = c.ProblemSHA256
	p.Eigenvalues = c.Results.Eigenvalues
	p.Gap = c.Results.Gap
	p.Diameter = c.Results.Diameter
	p.GapD2OverPi2 = c.Results.GapD2OverPi2
	p.Claims = c.Claims
	p.GroundState = c.Results.GroundState
	p.Verdict = worstVerdict(c.Claims)
}

// worstVerdict returns fails if a claim fails, else undecided if one is
// undecided, else holds ("" for no claims).
func worstVerdict(claims []certs.ClaimResult) string {
	v := ""
	for _, c := range claims {
		switch {
		case c.Verdict == certs.Fails:
			return certs.Fails
		case c.Verdict == certs.Undecided:
			v = certs.Undecided
		case v == "":
			v = certs.Holds
		}
	}
	return v
}

// earlierSummaries reads the summaries in dir that belong to the family
// with hash familySHA256. Unreadable summaries are skipped: what is taken
// from them (width targets, the family's file name) is informative only.
func earlierSummaries(dir, familySHA256 string) []*Summary {
	var out []*Summary
	files, _ := filepath.Glob(filepath.Join(dir, "summary*.json"))
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			continue
		}
		if s, err := UnmarshalSummary(data); err == nil && s.FamilySHA256 == familySHA256 {
			out = append(out, s)
		}
	}
	return out
}

// knownWidths returns the relative width target recorded in the summaries
// for each certificate (by the certificate's SHA-256).
func knownWidths(sums []*Summary) map[string]string {
	widths := map[string]string{}
	for _, s := range sums {
		for _, p := range s.Points {
			if p.CertificateSHA256 != "" && p.RelWidth != "" {
				widths[p.CertificateSHA256] = p.RelWidth
			}
		}
	}
	return widths
}

// SummaryIn returns the path of the summary of the sweep directory dir:
// dir/summary.json (an unsharded run, or a merge) if it exists, else the
// one shard summary (summary-shard-i-of-n.json) in dir. A directory
// without a summary, or with several shard summaries and no summary.json
// (shards that shared one directory), is an error saying what to do.
func SummaryIn(dir string) (string, error) {
	path := filepath.Join(dir, SummaryFileName(whole)+".json")
	if _, err := os.Stat(path); !errors.Is(err, fs.ErrNotExist) {
		return path, err
	}
	shards, err := filepath.Glob(filepath.Join(dir, "summary-shard-*-of-*.json"))
	if err != nil {
		return "", err
	}
	switch len(shards) {
	case 0:
		if _, err := os.Stat(filepath.Join(dir, FamilyFileName)); err != nil {
			return "", fmt.Errorf("%s: not a sweep directory (no %s, no summary.json or summary-shard-i-of-n.json); give a directory written by sweep or merge, or a summary file", dir, FamilyFileName)
		}
		return "", fmt.Errorf("%s: no sweep summary (summary.json or summary-shard-i-of-n.json); the sweep has not finished a run here (run it again to resume)", dir)
	case 1:
		return shards[0], nil
	}
	return "", fmt.Errorf("%s holds %d shard summaries (%s …); give one of them, or merge the directory (merge %s --out %s) and use summary.json", dir, len(shards), filepath.Base(shards[0]), dir, dir)
}
