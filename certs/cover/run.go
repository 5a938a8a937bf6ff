package cover

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"math/big"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"time"

	"gapcert/certs"
	"gapcert/certs/certify"
	"gapcert/certs/outfile"
	"gapcert/certs/sweep"
	"gapcert/fem/problem/strictjson"
)

// FamilyFileName is the copy of the family file kept in a cover directory.
const FamilyFileName = "family.json"

// RunOptions controls a cover run. The zero value covers the whole box.
type RunOptions struct {
	// FamilyName is the base name of the family file, for the summary.
	FamilyName string
	// Shard is the part of the first split to cover (root boxes k with k
	// mod n = i); the zero value means all.
	Shard sweep.Shard
	// Jobs is the number of corners certified at a time (0: one).
	Jobs int
	// Tool, Now and Memory are passed to certify.Options.
	Tool   string
	Now    func() time.Time
	Memory int64
	// Progress receives one line per level of the bisection; nil = quiet.
	Progress func(format string, args ...any)
}

// Statuses of a cell in a summary.
const (
	StatusComputed = "computed" // certified in this run
	StatusReused   = "reused"   // its certificate in the directory verified (CheckCell)
	StatusVerified = "verified" // found and verified by Merge
	StatusRejected = "rejected" // a certificate file exists, does not verify and was left in place
)

// Run covers the family's box (the shard's part of it) into dir: it
// bisects every box of the first split until each cell's claims hold or
// fail, or the cell has reached min_cell (its undecided claims stay
// undecided), writing one certificate per cell (CellFileName) and one per
// corner (CornerFileName), a copy of the family file, and the shard's
// summary (summary.json and summary.csv, or summary-shard-i-of-n.*).
//
// A rerun keeps every cell certificate that verifies (CheckCell) and
// descends without computing into a box that holds cells of an earlier
// run; a cell file that does not verify is never overwritten (the cell is
// reported rejected, and Run returns an error after writing the summary).
// A corner certificate already in dir is used if it verifies. Every file
// is written through a temporary file and a rename.
func Run(f *Family, dir string, opt RunOptions) (*Summary, error) {
	shard := opt.Shard
	if shard.Count == 0 {
		shard = sweep.Shard{Index: 0, Count: 1}
	}
	if shard.Index < 0 || shard.Index >= shard.Count {
		return nil, invalid("--shard", fmt.Sprintf("shard %s out of range", shard), "0 ≤ i < n")
	}
	base := summaryName(shard)
	if err := prepareDir(dir, f, base); err != nil {
		return nil, err
	}
	e := &engine{f: f, dir: dir, opt: opt, verifier: NewCornerVerifier(opt.Memory), corners: map[string]*cornerEntry{}, usedCorners: map[string]bool{}}
	if err := e.indexCells(); err != nil {
		return nil, err
	}
	var level []Box
	for k, r := range f.Roots() {
		if shard.Contains(k) {
			level = append(level, r)
		}
	}
	var rows []CellRow
	start := time.Now()
	for depth := 0; len(level) > 0; depth++ {
		var next, todo []Box
		for _, b := range level {
			if row, ok := e.existing(b); ok {
				rows = append(rows, row)
				continue
			}
			if e.hasInside(b) {
				if j := f.splitParam(b); j >= 0 {
					l, u := b.bisect(j)
					next = append(next, l, u)
					continue
				}
			}
			todo = append(todo, b)
		}
		if err := e.certifyCorners(todo); err != nil {
			return nil, err
		}
		for _, b := range todo {
			row, split, err := e.cell(b)
			if err != nil {
				return nil, err
			}
			if split {
				l, u := b.bisect(f.splitParam(b))
				next = append(next, l, u)
				continue
			}
			rows = append(rows, row)
		}
		if opt.Progress != nil {
			opt.Progress("level %d: %d boxes, %d cells final, %d corners certified so far (%.1fs)\n", depth, len(level), len(rows), e.computedCorners, time.Since(start).Seconds())
		}
		level = next
	}
	s := f.summarize(opt.FamilyName, shard, rows, len(e.usedCorners))
	if err := writeSummary(dir, base, s); err != nil {
		return s, err
	}
	rejected := 0
	for _, r := range rows {
		if r.Status == StatusRejected {
			rejected++
		}
	}
	if rejected > 0 {
		return s, &RejectedError{Count: rejected, Dir: dir}
	}
	return s, nil
}

// RejectedError reports cell certificates in the directory that do not
// verify (left in place); the summary lists them.
type RejectedError struct {
	Count int
	Dir   string
}

func (e *RejectedError) Error() string {
	return fmt.Sprintf("%d cell certificates in %s do not verify and were left in place (move them away and run again)", e.Count, e.Dir)
}

// engine is the state of one Run.
type engine struct {
	f        *Family
	dir      string
	opt      RunOptions
	verifier *CornerVerifier
	vmu      sync.Mutex
	// cells maps the key of every cell file's bounds in dir to its file.
	cells map[string]string
	// split holds the keys of the boxes of the bisection trees that
	// strictly contain a cell file's box (the path from its root down).
	split map[string]bool
	// corners holds the certified corners by problem hash.
	corners         map[string]*cornerEntry
	computedCorners int
	// usedCorners holds the corner files named by the cells of the
	// summary, computed or reused.
	usedCorners map[string]bool
}

type cornerEntry struct {
	corner corner
	sha    string
	err    error
}

// indexCells reads the bounds of every cell file in dir (without
// verifying them: that happens when a box is visited).
func (e *engine) indexCells() error {
	e.cells, e.split = map[string]string{}, map[string]bool{}
	roots := e.f.Roots()
	entries, err := os.ReadDir(e.dir)
	if err != nil {
		return err
	}
	for _, ent := range entries {
		if ent.IsDir() || !strings.HasSuffix(ent.Name(), cellSuffix) {
			continue
		}
		data, err := os.ReadFile(filepath.Join(e.dir, ent.Name()))
		if err != nil {
			continue
		}
		var head struct {
			Bounds []ParamBounds `json:"bounds"`
		}
		if strictjson.Decode(data, &head) != nil {
			// A file that is not read strictly is found again by name
			// when its box is visited, and rejected there.
			var loose struct {
				Bounds []ParamBounds `json:"bounds"`
			}
			if json.Unmarshal(data, &loose) != nil {
				continue
			}
			head.Bounds = loose.Bounds
		}
		c := &Cell{Bounds: head.Bounds}
		b, err := c.Box(e.f)
		if err != nil {
			continue
		}
		e.cells[b.key()] = ent.Name()
		e.markAncestors(b, roots)
	}
	return nil
}

// existing returns the row of b when dir holds a certificate file of b:
// reused if it verifies, rejected otherwise.
func (e *engine) existing(b Box) (CellRow, bool) {
	name := CellFileName(b)
	path := filepath.Join(e.dir, name)
	data, err := os.ReadFile(path)
	if errors.Is(err, fs.ErrNotExist) {
		return CellRow{}, false
	}
	row := CellRow{Bounds: boundsOf(e.f, b), File: name, Measure: e.f.fraction(b.Measure())}
	if err != nil {
		row.Status, row.Error, row.File = StatusRejected, err.Error(), ""
		return row, true
	}
	e.vmu.Lock()
	c, _, err := CheckCell(data, e.dir, e.verifier)
	e.vmu.Unlock()
	switch {
	case err != nil:
		row.Status, row.Error = StatusRejected, fmt.Sprintf("%s exists but does not verify (%s); not overwritten", name, oneLine(err))
	case c.FamilySHA256 != e.f.SHA256:
		row.Status, row.Error = StatusRejected, fmt.Sprintf("%s is a cell of another family; not overwritten", name)
	case !mustBox(c, e.f).Equal(b):
		row.Status, row.Error = StatusRejected, fmt.Sprintf("%s holds another cell; not overwritten", name)
	default:
		row.Status = StatusReused
		fillRow(&row, c, data)
		e.usedCorners[c.Low.File], e.usedCorners[c.High.File] = true, true
	}
	return row, true
}

func mustBox(c *Cell, f *Family) Box {
	b, _ := c.Box(f)
	return b
}

// hasInside reports whether dir holds a cell file strictly inside b (b
// was split by an earlier run), b being a box of the bisection trees.
func (e *engine) hasInside(b Box) bool { return e.split[b.key()] }

// markAncestors records the boxes of the bisection trees that strictly
// contain c: from the root that contains it (roots are f.Roots()), down
// through the half that contains it, until a box equals c, is not split,
// or has no half that contains c. Every box of the trees that strictly
// contains c is on this path, since the two halves of a box have disjoint
// interiors and c has positive width in every parameter.
func (e *engine) markAncestors(c Box, roots []Box) {
	// The root whose part of each range holds c's lower end.
	k := 0
	for j, p := range e.f.Params {
		q := new(big.Rat).Sub(c.Lo[j], p.Lo)
		q.Mul(q, big.NewRat(int64(p.Count), 1))
		q.Quo(q, new(big.Rat).Sub(p.Hi, p.Lo))
		i := new(big.Int).Quo(q.Num(), q.Denom())
		if !i.IsInt64() || i.Int64() < 0 || i.Int64() >= int64(p.Count) {
			return
		}
		k = k*p.Count + int(i.Int64())
	}
	b := roots[k]
	if !c.Inside(b) {
		return
	}
	for !b.Equal(c) {
		e.split[b.key()] = true
		j := e.f.splitParam(b)
		if j < 0 {
			return
		}
		lower, upper := b.bisect(j)
		switch {
		case c.Inside(lower):
			b = lower
		case c.Inside(upper):
			b = upper
		default:
			return
		}
	}
}

// certifyCorners certifies (or finds verified in dir) the corners of the
// boxes, each distinct corner once, opt.Jobs at a time.
func (e *engine) certifyCorners(boxes []Box) error {
	type job struct {
		hash string
		vals []*big.Rat
	}
	var jobs []job
	for _, b := range boxes {
		lv, hv := e.f.Corners(b)
		for _, v := range [][]*big.Rat{lv, hv} {
			p, err := e.f.Problem(v)
			if err != nil {
				return err
			}
			h := p.SHA256()
			if _, ok := e.corners[h]; ok {
				continue
			}
			e.corners[h] = &cornerEntry{corner: corner{problem: p}}
			jobs = append(jobs, job{hash: h, vals: v})
		}
	}
	n := max(1, min(e.opt.Jobs, len(jobs)))
	next := make(chan int)
	var wg sync.WaitGroup
	var mu sync.Mutex
	for w := 0; w < n; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				mu.Lock()
				ce := e.corners[jobs[i].hash]
				mu.Unlock()
				e.certifyCorner(ce)
			}
		}()
	}
	for i := range jobs {
		next <- i
	}
	close(next)
	wg.Wait()
	return nil
}

// certifyCorner fills ce: the corner file in dir if it verifies, else a
// fresh certificate written there. A corner file that exists and does not
// verify is left in place; the corner is then an error.
func (e *engine) certifyCorner(ce *cornerEntry) {
	h := ce.corner.problem.SHA256()
	path := filepath.Join(e.dir, CornerFileName(h))
	if _, err := os.Stat(path); err == nil {
		e.vmu.Lock()
		cert, sha, err := e.verifier.Verify(path, "", h)
		e.vmu.Unlock()
		if err != nil {
			ce.err = fmt.Errorf("%s exists but does not verify (%v); not overwritten (move it away)", CornerFileName(h), oneLine(err))
			return
		}
		ce.corner.cert, ce.sha = cert, sha
		return
	}
	cert, err := certify.Certify(context.Background(), ce.corner.problem, certify.Options{
		TimeLimit: e.f.TimeLimit, Tool: e.opt.Tool, Now: e.opt.Now, Memory: e.opt.Memory,
	})
	if err != nil {
		ce.err = fmt.Errorf("corner %s: %v", ce.corner.problem.Name, err)
		return
	}
	data, err := cert.Marshal()
	if err == nil {
		err = outfile.WriteNew(path, data)
	}
	if err != nil {
		ce.err = err
		return
	}
	ce.corner.cert, ce.sha = cert, sha256Hex(data)
	e.vmu.Lock()
	e.verifier.verified[ce.sha] = cert
	e.computedCorners++
	e.vmu.Unlock()
}

// cell evaluates the box b from its certified corners: when every claim is
// decided, or b has reached min_cell, it writes b's certificate and
// returns its row; otherwise it reports that b is to be split.
func (e *engine) cell(b Box) (CellRow, bool, error) {
	lv, hv := e.f.Corners(b)
	var cs [2]*cornerEntry
	for i, v := range [][]*big.Rat{lv, hv} {
		p, err := e.f.Problem(v)
		if err != nil {
			return CellRow{}, false, err
		}
		cs[i] = e.corners[p.SHA256()]
		if cs[i].err != nil {
			return CellRow{}, false, cs[i].err
		}
	}
	c, err := e.f.buildCell(b, cs[0].corner, cs[1].corner, cs[0].sha, cs[1].sha, provenance(e.opt))
	if err != nil {
		return CellRow{}, false, err
	}
	if !decided(c.Claims) && e.f.splitParam(b) >= 0 {
		return CellRow{}, true, nil
	}
	data, err := c.Marshal()
	if err != nil {
		return CellRow{}, false, err
	}
	name := CellFileName(b)
	if err := outfile.WriteNew(filepath.Join(e.dir, name), data); err != nil {
		return CellRow{}, false, err
	}
	row := CellRow{Bounds: c.Bounds, File: name, Status: StatusComputed, Measure: e.f.fraction(b.Measure())}
	fillRow(&row, c, data)
	e.usedCorners[c.Low.File], e.usedCorners[c.High.File] = true, true
	return row, false, nil
}

func provenance(opt RunOptions) certs.Provenance {
	now := time.Now
	if opt.Now != nil {
		now = opt.Now
	}
	return certs.Provenance{Tool: opt.Tool, GoVersion: runtime.Version(), OS: runtime.GOOS, Arch: runtime.GOARCH, Time: now().UTC().Format(time.RFC3339)}
}

func fillRow(row *CellRow, c *Cell, data []byte) {
	row.CertificateSHA256 = sha256Hex(data)
	row.Verdict = c.Verdict
	row.Verdicts = nil
	for _, cl := range c.Claims {
		row.Verdicts = append(row.Verdicts, cl.Verdict)
	}
}

// prepareDir creates dir, writes or compares its family copy, and checks
// that an existing summary of the shard belongs to the same family.
func prepareDir(dir string, f *Family, base string) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	famPath := filepath.Join(dir, FamilyFileName)
	old, err := os.ReadFile(famPath)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		if err := outfile.WriteNew(famPath, f.data); err != nil {
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

func oneLine(err error) string { return strings.ReplaceAll(err.Error(), "\n", "; ") }

// sortRows orders rows by their bounds (lexicographically by each
// parameter's lower bound, then upper bound).
func sortRows(f *Family, rows []CellRow) {
	key := func(r CellRow) Box {
		c := &Cell{Bounds: r.Bounds}
		return mustBox(c, f)
	}
	sort.SliceStable(rows, func(a, b int) bool {
		x, y := key(rows[a]), key(rows[b])
		for j := range x.Lo {
			if c := x.Lo[j].Cmp(y.Lo[j]); c != 0 {
				return c < 0
			}
			if c := x.Hi[j].Cmp(y.Hi[j]); c != 0 {
				return c < 0
			}
		}
		return false
	})
}
