package sweepplot

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"slices"

	"gapcert/certs"
	"gapcert/certs/sweep"
	"gapcert/fem/problem"
)

// maxSummarySize bounds what Load reads.
const maxSummarySize = 256 << 20

// Sweep is a sweep summary and, for each point, the problem recorded in its
// certificate file when that file was found beside the summary.
type Sweep struct {
	Path    string // the summary file
	Name    string // the family's name from the family file beside the summary, else the summary's family file name
	Summary *sweep.Summary
	// Problems holds, by position in Summary.Points, the problem of the
	// point's certificate file, or nil when no file was found.
	Problems []*problem.Problem
	// References holds, by position in Summary.Points, the certified
	// reference quantities of the point's built-in claims (name →
	// enclosure, see referenceQuantities), read from the reference
	// certificates stored in its certificate file; nil when no file was
	// found.
	References []map[string]certs.Bound
	// Missing counts the points whose certificate file was not found.
	Missing int
}

// Load reads the sweep summary at path (a summary JSON file, or a sweep
// directory: its summary.json, else its one shard summary, see
// sweep.SummaryIn) and cross-checks every point against its
// certificate file when the file is in the summary's directory: the file's
// SHA-256 must be the point's certificate_sha256, and its problem hash,
// eigenvalue, gap, diameter and D²·gap/π² enclosures, claim results and
// ground-state block must be those of the point, string for string (a claim's reference
// certificate only when the summary carries one). The reference quantities
// of built-in claims (Sweep.References) are read from the certificate
// file, never from the summary. A point whose file is absent is counted in
// Sweep.Missing (its enclosures are taken from the summary alone, and it
// has no reference quantities); a disagreement is a *CrossCheckError.
func Load(path string) (*Sweep, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if st.IsDir() {
		if path, err = sweep.SummaryIn(path); err != nil {
			return nil, err
		}
	}
	data, err := readLimited(path, maxSummarySize)
	if err != nil {
		return nil, err
	}
	s, err := sweep.UnmarshalSummary(data)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	out := &Sweep{Path: path, Name: s.Family, Summary: s, Problems: make([]*problem.Problem, len(s.Points)), References: make([]map[string]certs.Bound, len(s.Points))}
	dir := filepath.Dir(path)
	if fam, err := readLimited(filepath.Join(dir, sweep.FamilyFileName), maxSummarySize); err == nil {
		f, err := sweep.ParseFamily(fam) // strictly, as every file
		if err != nil {
			return nil, fmt.Errorf("%s: %w", filepath.Join(dir, sweep.FamilyFileName), err)
		}
		if f.Name != "" {
			out.Name = f.Name
		}
	}
	for i, pt := range s.Points {
		if pt.File == "" {
			continue
		}
		if filepath.Base(pt.File) != pt.File {
			return nil, fmt.Errorf("%s: point %d: certificate file %q is not a plain file name (hint: merge writes the certificates beside its summary; merge the shards again into a new directory)", path, pt.Index, pt.File)
		}
		certPath := filepath.Join(dir, pt.File)
		raw, err := readLimited(certPath, maxSummarySize)
		if errors.Is(err, fs.ErrNotExist) {
			out.Missing++
			continue
		}
		if err != nil {
			return nil, err
		}
		p, refs, err := crossCheck(pt, raw)
		if err != nil {
			return nil, &CrossCheckError{Summary: path, Point: pt.Index, Certificate: certPath, Err: err}
		}
		out.Problems[i], out.References[i] = p, refs
	}
	return out, nil
}

// CrossCheckError reports a summary point that disagrees with its
// certificate file.
type CrossCheckError struct {
	Summary     string
	Point       int // the point's index
	Certificate string
	Err         error
}

func (e *CrossCheckError) Error() string {
	return fmt.Sprintf("%s: point %d and its certificate %s disagree: %v", e.Summary, e.Point, e.Certificate, e.Err)
}

func (e *CrossCheckError) Unwrap() error { return e.Err }

// crossCheck compares a summary point with its certificate file and
// returns the certificate's problem and the reference quantities of its
// claims.
func crossCheck(pt sweep.Point, raw []byte) (*problem.Problem, map[string]certs.Bound, error) {
	sum := sha256.Sum256(raw)
	if got := hex.EncodeToString(sum[:]); got != pt.CertificateSHA256 {
		return nil, nil, fmt.Errorf("the file's SHA-256 is %s, the summary records %s", got, pt.CertificateSHA256)
	}
	c, err := certs.Unmarshal(raw)
	if err != nil {
		return nil, nil, err
	}
	if c.ProblemSHA256 != pt.ProblemSHA256 {
		return nil, nil, fmt.Errorf("problem_sha256 %s, the summary records %s", c.ProblemSHA256, pt.ProblemSHA256)
	}
	same := func(what string, a, b any) error {
		ja, _ := json.Marshal(a)
		jb, _ := json.Marshal(b)
		if !bytes.Equal(ja, jb) {
			return fmt.Errorf("%s differ (certificate %s, summary %s)", what, ja, jb)
		}
		return nil
	}
	r := c.Results
	for _, chk := range []error{
		same("eigenvalues", r.Eigenvalues, pt.Eigenvalues),
		same("gap", r.Gap, pt.Gap),
		same("diameter", r.Diameter, pt.Diameter),
		same("gap_d2_over_pi2", r.GapD2OverPi2, pt.GapD2OverPi2),
		same("claims", asSummarised(c.Claims, pt.Claims), nonNil(pt.Claims)),
		same("ground_state", r.GroundState, pt.GroundState),
	} {
		if chk != nil {
			return nil, nil, chk
		}
	}
	p, err := problem.Parse(c.Problem)
	if err != nil {
		return nil, nil, fmt.Errorf("the recorded problem does not parse: %w", err)
	}
	refs, err := referenceBounds(c.Claims)
	if err != nil {
		return nil, nil, err
	}
	return p, refs, nil
}

func nonNil(c []certs.ClaimResult) []certs.ClaimResult {
	if c == nil {
		return []certs.ClaimResult{}
	}
	return c
}

// asSummarised returns the certificate's claim results as the summary is
// allowed to record them: a claim's reference certificate is compared only
// when the summary's claim at the same position carries one (reference
// quantities are read from the certificate file, not from the summary).
func asSummarised(cert, summary []certs.ClaimResult) []certs.ClaimResult {
	out := slices.Clone(nonNil(cert))
	for k := range out {
		if k < len(summary) && summary[k].Reference == nil {
			out[k].Reference = nil
		}
	}
	return out
}

func readLimited(path string, limit int64) ([]byte, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if st.Size() > limit {
		return nil, fmt.Errorf("%s: file too large (%d bytes, at most %d)", path, st.Size(), limit)
	}
	return os.ReadFile(path)
}

// certified reports whether point i has enclosures (a certificate).
func (s *Sweep) certified(i int) bool {
	pt := s.Summary.Points[i]
	return pt.Status != sweep.StatusError && pt.Status != sweep.StatusRejected && len(pt.Eigenvalues) > 0
}

// hasParam reports whether name is a parameter of the sweep.
func (s *Sweep) hasParam(name string) bool { return slices.Contains(s.Summary.Parameters, name) }
