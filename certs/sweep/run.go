package sweep

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"sync"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/interval/decimalio"
)

// RunOptions controls a sweep run. The zero value runs the whole family
// with the family's width and time limit.
type RunOptions struct {
	// FamilyName is the base name of the family file, for the summary.
	FamilyName string
	// Shard is the part of the family to run; the zero value means all
	// points.
	Shard Shard
	// RelWidth overrides the family's relative width target (exact text,
	// in (0, 1)); "" keeps it.
	RelWidth string
	// TimeLimit overrides the family's per-point refinement budget; 0
	// keeps it.
	TimeLimit time.Duration
	// RefineUndecided recomputes points with an undecided claim with a
	// tighter width target, up to MaxRefineRounds times.
	RefineUndecided bool
	// SetAsideInvalid renames an existing certificate file of a point that
	// does not verify to NAME.rejected (never replacing a file of that
	// name) and computes the point again; without it such a point is
	// reported with StatusRejected and its file is left alone.
	SetAsideInvalid bool
	// Tool, Now and Memory are passed to certify.Options.
	Tool   string
	Now    func() time.Time
	Memory int64
	// Jobs is the number of points certified at a time (0 or 1: one).
	// Certificates do not depend on it, except through the time limit.
	Jobs int
	// Progress receives one line per point, naming it by its index (from
	// 0, as in file names and summaries), with its status and verdict (and
	// the log-concavity verdict of its ground state, when certified), the
	// widest relative width its certificate reached, the width target, the
	// point's time and the time since the run started; nil = quiet.
	Progress func(format string, args ...any)
}

// StatusRejected: a certificate file of the point exists but does not
// verify or does not belong to the point; it was left in place (see
// RunOptions.SetAsideInvalid) and the point has no valid certificate.
const StatusRejected = "rejected"

// Refinement of undecided points: each round asks for a relative width
// RefineFactor times below the widest relative width the current
// certificate reached.
const (
	MaxRefineRounds = 3
	RefineFactor    = 10
)

// noGroundState says why a certificate without results.ground_state is not
// one of a family that asks for it.
const noGroundState = "has no results.ground_state, which the family asks for (\"ground_state\": true)"

// rejectedSuffix is appended to the name of a set-aside certificate.
const rejectedSuffix = ".rejected"

// Run certifies the points of f that belong to opt.Shard into dir and
// writes the shard's summary there (SummaryFileName, .json and .csv).
//
// dir is created if needed and keeps a copy of the family file
// (FamilyFileName); a dir whose copy differs is refused before anything
// is computed. A point whose certificate file exists, verifies
// (certify.Check) and holds the point's problem (same problem hash) is kept
// (StatusReused); a file that exists but does not verify is never
// overwritten (StatusRejected, or set aside with SetAsideInvalid).
// Certificates are written through a temporary file and a rename, one at
// a time, so an interrupted run leaves only complete certificates; a
// rerun computes the missing ones. With RefineUndecided a point with an
// undecided claim is recomputed with tighter width targets and its
// certificate replaced only by one that verifies.
//
// A point that fails is recorded in the summary with its error, and the
// run goes on. The returned error is for inputs and for the directory
// (*InvalidError for invalid options).
func Run(f *Family, dir string, opt RunOptions) (*Summary, error) {
	shard := opt.Shard
	if shard.Count == 0 {
		shard = whole
	}
	if shard.Index < 0 || shard.Index >= shard.Count {
		return nil, invalid("--shard", fmt.Sprintf("shard %s out of range", shard), "0 ≤ i < n")
	}
	widthText := f.RelWidth
	if opt.RelWidth != "" {
		widthText = opt.RelWidth
	}
	var width float64
	if widthText != "" {
		w, err := decimalio.Parse(widthText)
		if err != nil || !(w.Lo > 0 && w.Hi < 1) {
			return nil, invalid("--rel-width", fmt.Sprintf("%q is not a number in (0, 1)", widthText), "write 0.05")
		}
		width = w.Hi
	}
	limit := f.TimeLimit
	if opt.TimeLimit != 0 {
		limit = opt.TimeLimit
	}
	base := SummaryFileName(shard)
	if err := prepareDir(dir, f, base); err != nil {
		return nil, err
	}
	r := &runner{f: f, dir: dir, opt: opt, width: width, widthText: widthText, limit: limit, widths: knownWidths(earlierSummaries(dir, f.SHA256))}
	s := &Summary{
		Format:       SummaryFormat,
		Family:       opt.FamilyName,
		FamilySHA256: f.SHA256,
		Shard:        shard,
		Parameters:   f.ParamNames(),
		TotalPoints:  len(f.Points),
		GroundState:  f.GroundState,
	}
	var mine []*FamilyPoint
	for _, pt := range f.Points {
		if shard.Contains(pt.Index) {
			mine = append(mine, pt)
		}
	}
	s.Points = make([]Point, len(mine))
	var mu sync.Mutex // serializes progress lines
	start := time.Now()
	parallel(len(mine), opt.Jobs, func(i int) {
		pt := mine[i]
		t0 := time.Now()
		p := r.point(pt)
		s.Points[i] = p
		if opt.Progress == nil {
			return
		}
		msg := p.Status
		if p.Verdict != "" {
			msg += ", " + p.Verdict
		}
		if p.GroundState != nil {
			msg += ", log-concave " + p.GroundState.LogConcavity
		}
		if p.Error != "" {
			msg += ": " + p.Error
		}
		if w, ok := r.reached.Load(pt.Index); ok {
			target := p.RelWidth
			if target == "" {
				target = "the problem's"
			}
			msg += fmt.Sprintf("; widest relative width %.2g, target %s", w, target)
		}
		mu.Lock()
		defer mu.Unlock()
		opt.Progress("point %d of 0…%d (%s): %s (%.2fs; %.1fs elapsed)\n", pt.Index, len(f.Points)-1, f.describe(pt), msg, time.Since(t0).Seconds(), time.Since(start).Seconds())
	})
	if err := writeSummary(dir, base, s); err != nil {
		return s, err
	}
	return s, nil
}

// prepareDir creates dir, writes or compares its family copy, and checks
// that an existing summary of the shard belongs to the same family (so
// that replacing it loses nothing of another family).
func prepareDir(dir string, f *Family, base string) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	famPath := filepath.Join(dir, FamilyFileName)
	old, err := os.ReadFile(famPath)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		if err := writeNew(famPath, f.data, false); err != nil {
			return err
		}
	case err != nil:
		return err
	case !bytes.Equal(old, f.data):
		return fmt.Errorf("%s holds another family (its %s differs from this family file); use another directory", dir, FamilyFileName)
	}
	sumPath := filepath.Join(dir, base+".json")
	data, err := os.ReadFile(sumPath)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return err
	}
	s, err := UnmarshalSummary(data)
	if err != nil {
		return fmt.Errorf("%s: %v; not overwritten (move it away)", sumPath, err)
	}
	if s.FamilySHA256 != f.SHA256 {
		return fmt.Errorf("%s is the summary of another family; not overwritten (move it away)", sumPath)
	}
	return nil
}

// runner holds the state of one Run.
type runner struct {
	f         *Family
	dir       string
	opt       RunOptions
	width     float64 // 0 = each problem's target
	widthText string
	limit     time.Duration
	widths    map[string]string // known width targets by certificate SHA-256
	reached   sync.Map          // point index → widest relative width of its certificate (progress lines)
}

// point brings one point to a verified certificate (or an error).
func (r *runner) point(pt *FamilyPoint) Point {
	hash := pt.Problem.SHA256()
	name := CertFileName(pt.Index, hash)
	path := filepath.Join(r.dir, name)
	p := Point{Index: pt.Index, Params: r.f.ParamText(pt), File: name, ProblemSHA256: hash}

	data, err := os.ReadFile(path)
	switch {
	case err == nil:
		cert, why := verifyFor(data, hash, r.f.GroundState, r.opt.Memory)
		if why == "" {
			p.Status = StatusReused
			p.RelWidth = r.widths[sha256Hex(data)]
			r.fill(&p, data, cert)
			break
		}
		if !r.opt.SetAsideInvalid {
			p.Status, p.Error, p.File = StatusRejected, fmt.Sprintf("%s exists but %s; not overwritten (move it away, or pass the set-aside option)", name, why), ""
			return p
		}
		aside := path + rejectedSuffix
		if _, err := os.Lstat(aside); err == nil {
			p.Status, p.Error, p.File = StatusRejected, fmt.Sprintf("%s exists but %s, and %s already exists; nothing moved", name, why, filepath.Base(aside)), ""
			return p
		}
		if err := os.Rename(path, aside); err != nil {
			p.Status, p.Error, p.File = StatusError, err.Error(), ""
			return p
		}
		if !r.compute(&p, pt, path) {
			return p
		}
	case errors.Is(err, fs.ErrNotExist):
		if !r.compute(&p, pt, path) {
			return p
		}
	default:
		p.Status, p.Error, p.File = StatusError, err.Error(), ""
		return p
	}
	if r.opt.RefineUndecided {
		r.refine(&p, pt, path)
	}
	return p
}

// verifyFor checks a certificate file of the point with problem hash
// hash: it must verify (certify.Check), record that problem and, when
// groundState is set, hold results.ground_state. It returns the
// certificate, or why it is not acceptable. memory is the budget of the
// recomputation (certify.CheckWithin).
func verifyFor(data []byte, hash string, groundState bool, memory int64) (*certs.Certificate, string) {
	if err := certify.CheckWithin(data, memory); err != nil {
		return nil, "does not verify (" + oneLine(err) + ")"
	}
	cert, err := certs.Unmarshal(data)
	if err != nil {
		return nil, "does not verify (" + oneLine(err) + ")"
	}
	if cert.ProblemSHA256 != hash {
		return nil, "holds another problem (problem_sha256 " + cert.ProblemSHA256 + ")"
	}
	if groundState && cert.Results.GroundState == nil {
		return nil, noGroundState
	}
	return cert, ""
}

// compute certifies the point and writes its certificate to path (which
// does not exist). It reports success; on failure p holds the error.
func (r *runner) compute(p *Point, pt *FamilyPoint, path string) bool {
	data, cert, err := r.certify(pt, r.width)
	if err == nil {
		err = writeNew(path, data, false)
	}
	if err != nil {
		p.Status, p.Error, p.File = StatusError, oneLine(err), ""
		return false
	}
	p.Status = StatusComputed
	p.RelWidth = r.widthText
	if p.RelWidth == "" {
		p.RelWidth = pt.Problem.RelWidth.Text
	}
	r.fill(p, data, cert)
	return true
}

// certify runs the certification of one point with the width target w
// (0 = the problem's own).
func (r *runner) certify(pt *FamilyPoint, w float64) ([]byte, *certs.Certificate, error) {
	text := ""
	switch {
	case w == r.width:
		text = r.widthText
	case w != 0:
		text = strconv.FormatFloat(w, 'g', -1, 64)
	}
	cert, err := certify.Certify(context.Background(), pt.Problem, certify.Options{
		RelWidth: text, TimeLimit: r.limit, Tool: r.opt.Tool, Now: r.opt.Now, Memory: r.opt.Memory,
		GroundState: r.f.GroundState,
	})
	if err != nil {
		return nil, nil, err
	}
	data, err := cert.Marshal()
	if err != nil {
		return nil, nil, err
	}
	return data, cert, nil
}

func (r *runner) fill(p *Point, data []byte, cert *certs.Certificate) {
	p.CertificateSHA256 = sha256Hex(data)
	fillFromCertificate(p, cert)
	r.reached.Store(p.Index, reachedWidth(cert))
}

// refine recomputes a point while a claim is undecided, each round with a
// width target RefineFactor below the widest relative width reached,
// replacing the certificate only by one that verifies (certify.Check).
func (r *runner) refine(p *Point, pt *FamilyPoint, path string) {
	for round := 0; round < MaxRefineRounds && hasUndecided(p.Claims); round++ {
		data, err := os.ReadFile(path)
		if err != nil {
			return
		}
		cert, err := certs.Unmarshal(data)
		if err != nil {
			return
		}
		target := reachedWidth(cert) / RefineFactor
		if !(target > 0) || math.IsInf(target, 0) {
			return
		}
		fresh, freshCert, err := r.certify(pt, target)
		if err != nil || certify.CheckWithin(fresh, r.opt.Memory) != nil || freshCert.ProblemSHA256 != p.ProblemSHA256 {
			return
		}
		if err := writeNew(path, fresh, true); err != nil {
			return
		}
		p.Status = StatusRefined
		p.RelWidth = strconv.FormatFloat(target, 'g', 3, 64)
		r.fill(p, fresh, freshCert)
	}
}

func hasUndecided(claims []certs.ClaimResult) bool {
	for _, c := range claims {
		if c.Verdict == certs.Undecided {
			return true
		}
	}
	return false
}

// reachedWidth is the widest relative width recorded in the certificate
// (a choice for the next target; not part of any bound).
func reachedWidth(c *certs.Certificate) float64 {
	w := 0.0
	for _, s := range c.Results.RelativeWidths {
		if x, err := strconv.ParseFloat(s, 64); err == nil {
			w = math.Max(w, x)
		}
	}
	return w
}

// oneLine flattens a multi-line error message.
func oneLine(err error) string {
	return string(bytes.ReplaceAll([]byte(err.Error()), []byte("\n"), []byte("; ")))
}
