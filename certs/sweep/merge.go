package sweep

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"gapcert/certs"
	"gapcert/certs/certify"
)

// StatusVerified: the point's certificate was found by Merge and verified
// (certify.Check) there.
const StatusVerified = "verified"

// Kinds of merge issues.
const (
	IssueFamily    = "family"     // the directories hold different or no family files
	IssueForeign   = "foreign"    // a certificate file that is not of a point of the family
	IssueTampered  = "tampered"   // a certificate of a point that does not verify
	IssueMissing   = "missing"    // a point without a certificate
	IssueDuplicate = "duplicate"  // a point with more than one certificate
	IssueNoGround  = "incomplete" // a certificate without the ground-state block its family asks for
)

// MergeIssue is one defect found by Merge. Index is the point (−1 when
// the issue is not about one point), File the file concerned ("" when
// none).
type MergeIssue struct {
	Kind  string
	Index int
	File  string
	Msg   string
}

func (is MergeIssue) String() string {
	var b strings.Builder
	b.WriteString(is.Kind)
	if is.Index >= 0 {
		fmt.Fprintf(&b, " point %d", is.Index)
	}
	if is.File != "" {
		fmt.Fprintf(&b, " %s", is.File)
	}
	b.WriteString(": ")
	b.WriteString(is.Msg)
	return b.String()
}

// MergeError lists every defect of the shard outputs; nothing was written.
type MergeError struct {
	Issues []MergeIssue
}

func (e *MergeError) Error() string {
	lines := []string{fmt.Sprintf("the sweep outputs do not form the family (%d issues):", len(e.Issues))}
	for _, is := range e.Issues {
		lines = append(lines, "  - "+is.String())
	}
	return strings.Join(lines, "\n")
}

// MergeOptions are the options of Merge: Progress receives a line per
// certificate file with its verdict (nil: none), Memory is the memory budget of
// each recomputation (certify.CheckWithin; 0: certify.DefaultMemory).
type MergeOptions struct {
	Progress func(format string, args ...any)
	Memory   int64
}

// Merge gathers the certificates of the sweep directories dirs (outputs of
// Run, in any split into shards), checks that they form the whole family
// and makes outDir a sweep directory of the whole family that stands
// alone: it copies every certificate into outDir (under its own name),
// copies the family file (FamilyFileName) and writes the merged summary
// (summary.json and summary.csv, which must not exist), whose file names
// are plain names in outDir. outDir may be one of dirs (a directory that
// all shards shared merges into itself).
//
// Every directory must hold the same family file (FamilyFileName). Every
// file named *.cert.json in them must be the certificate of a point of
// the family: its name gives a point index and the point's problem hash
// prefix, it records exactly the expansion of that point (problem_sha256
// equal to the point's problem hash), it verifies (certify.Check), and it
// holds results.ground_state when the family asks for it. Every point must
// have exactly one such certificate. Otherwise Merge returns a *MergeError
// listing each foreign, tampered, incomplete, duplicate and missing file
// or point, and writes nothing. Nothing is written either
// when outDir already holds a different file under the name of a
// certificate or of the family file, or a certificate file that is not
// one of the merged ones. The certificates are written first (each
// through a temporary file and a rename), the summary last, so a summary
// in outDir means that every file it names is there. Certificates are
// checked on GOMAXPROCS goroutines.
func Merge(dirs []string, outDir string, opt MergeOptions) (*Summary, error) {
	progress := opt.Progress
	if len(dirs) == 0 {
		return nil, errors.New("no sweep directories to merge")
	}
	seen := map[string]bool{}
	for _, dir := range dirs {
		abs, err := filepath.Abs(dir)
		if err != nil {
			return nil, err
		}
		if seen[abs] {
			return nil, fmt.Errorf("%s is listed twice", dir)
		}
		seen[abs] = true
	}
	f, famName, err := commonFamily(dirs)
	if err != nil {
		return nil, err
	}
	var paths []string
	var sums []*Summary
	for _, dir := range dirs {
		sums = append(sums, earlierSummaries(dir, f.SHA256)...)
		entries, err := os.ReadDir(dir)
		if err != nil {
			return nil, err
		}
		for _, e := range entries {
			if !e.IsDir() && strings.HasSuffix(e.Name(), certSuffix) {
				paths = append(paths, filepath.Join(dir, e.Name()))
			}
		}
	}
	widths := knownWidths(sums)
	for _, s := range sums {
		if s.Family != "" {
			famName = s.Family // the name the shards were run with
			break
		}
	}
	checked := make([]checkedFile, len(paths))
	parallel(len(paths), runtime.GOMAXPROCS(0), func(i int) {
		checked[i].point, checked[i].issue = mergeFile(f, paths[i], opt.Memory)
	})
	var issues []MergeIssue
	found := map[int][]string{}
	points := map[int]*Point{}
	for i, c := range checked {
		if progress != nil {
			progress("%s: %s\n", paths[i], mergeNote(c.issue))
		}
		if c.issue != nil {
			issues = append(issues, *c.issue)
			continue
		}
		p := c.point
		found[p.Index] = append(found[p.Index], paths[i])
		if len(found[p.Index]) == 1 {
			p.RelWidth = widths[p.CertificateSHA256]
			points[p.Index] = p
		}
	}
	for _, pt := range f.Points {
		files := found[pt.Index]
		switch {
		case len(files) == 0:
			issues = append(issues, MergeIssue{Kind: IssueMissing, Index: pt.Index, Msg: fmt.Sprintf("no certificate of point %d (%s)", pt.Index, f.describe(pt))})
		case len(files) > 1:
			issues = append(issues, MergeIssue{Kind: IssueDuplicate, Index: pt.Index, File: strings.Join(files, ", "), Msg: fmt.Sprintf("%d certificates of the same point", len(files))})
		}
	}
	if len(issues) > 0 {
		sort.SliceStable(issues, func(i, j int) bool { return issues[i].Index < issues[j].Index })
		return nil, &MergeError{Issues: issues}
	}
	s := &Summary{
		Format:       SummaryFormat,
		Family:       famName,
		FamilySHA256: f.SHA256,
		Shard:        whole,
		Parameters:   f.ParamNames(),
		TotalPoints:  len(f.Points),
		GroundState:  f.GroundState,
	}
	var sources []verifiedFile
	for _, pt := range f.Points {
		p := points[pt.Index]
		sources = append(sources, verifiedFile{path: found[pt.Index][0], sha256: p.CertificateSHA256})
		p.File = filepath.Base(found[pt.Index][0])
		s.Points = append(s.Points, *p)
	}
	copies, err := planCopies(outDir, sources, f.data)
	if err != nil {
		return nil, err
	}
	base := SummaryFileName(whole)
	for _, ext := range []string{".json", ".csv"} {
		if _, err := os.Lstat(filepath.Join(outDir, base+ext)); !errors.Is(err, fs.ErrNotExist) {
			return nil, fmt.Errorf("%s exists; not overwritten (choose another output directory)", filepath.Join(outDir, base+ext))
		}
	}
	if err := os.MkdirAll(outDir, 0o755); err != nil {
		return nil, err
	}
	for _, c := range copies {
		if err := writeNew(c.to, c.data, false); err != nil {
			return nil, err
		}
	}
	if err := writeSummary(outDir, base, s); err != nil {
		return nil, err
	}
	return s, nil
}

// fileCopy is a file Merge writes into its output directory.
type fileCopy struct {
	to   string
	data []byte
}

// verifiedFile is a certificate file that Merge verified, and the SHA-256
// of the bytes it verified.
type verifiedFile struct {
	path, sha256 string
}

// planCopies returns the files that make outDir a sweep directory of the
// merged family: each certificate in sources, read again and demanded to
// be the bytes that were verified, that is not
// already in outDir under its name with the same bytes, and the family
// file. It refuses an outDir that holds, under one of these names, a file
// with other bytes, or a certificate file that is not one of sources, so
// that the merged directory holds the merged certificates and nothing
// else of their kind.
func planCopies(outDir string, sources []verifiedFile, family []byte) ([]fileCopy, error) {
	names := map[string]bool{}
	var copies []fileCopy
	add := func(name string, data []byte) error {
		to := filepath.Join(outDir, name)
		old, err := os.ReadFile(to)
		switch {
		case errors.Is(err, fs.ErrNotExist):
			copies = append(copies, fileCopy{to: to, data: data})
		case err != nil:
			return err
		case !bytes.Equal(old, data):
			return fmt.Errorf("%s exists and differs from the merged file of that name; not overwritten (choose another output directory)", to)
		}
		return nil
	}
	for _, src := range sources {
		data, err := os.ReadFile(src.path)
		if err != nil {
			return nil, err
		}
		if sha256Hex(data) != src.sha256 {
			return nil, fmt.Errorf("%s changed after it was verified; nothing merged (run the merge again)", src.path)
		}
		name := filepath.Base(src.path)
		names[name] = true
		if err := add(name, data); err != nil {
			return nil, err
		}
	}
	if err := add(FamilyFileName, family); err != nil {
		return nil, err
	}
	entries, err := os.ReadDir(outDir)
	if err != nil && !errors.Is(err, fs.ErrNotExist) {
		return nil, err
	}
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), certSuffix) && !names[e.Name()] {
			return nil, fmt.Errorf("%s holds %s, which is not one of the merged certificates; choose another output directory", outDir, e.Name())
		}
	}
	return copies, nil
}

// checkedFile is the outcome of mergeFile.
type checkedFile struct {
	point *Point
	issue *MergeIssue
}

// parallel calls do(0) … do(n−1) on at most jobs goroutines.
func parallel(n, jobs int, do func(i int)) {
	jobs = max(1, min(jobs, n))
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < jobs; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				do(i)
			}
		}()
	}
	for i := 0; i < n; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
}

func mergeNote(is *MergeIssue) string {
	if is == nil {
		return "verifies"
	}
	return is.Kind
}

// commonFamily reads the family copy of every directory, demands that they
// are identical and parses it.
func commonFamily(dirs []string) (*Family, string, error) {
	var data []byte
	var issues []MergeIssue
	for _, dir := range dirs {
		path := filepath.Join(dir, FamilyFileName)
		d, err := os.ReadFile(path)
		switch {
		case errors.Is(err, fs.ErrNotExist):
			issues = append(issues, MergeIssue{Kind: IssueFamily, Index: -1, File: path, Msg: "missing; is " + dir + " a sweep directory?"})
			continue
		case err != nil:
			return nil, "", err
		}
		if data == nil {
			data = d
		} else if string(d) != string(data) {
			issues = append(issues, MergeIssue{Kind: IssueFamily, Index: -1, File: path, Msg: "differs from " + filepath.Join(dirs[0], FamilyFileName) + ": the directories hold different families"})
		}
	}
	if len(issues) > 0 {
		return nil, "", &MergeError{Issues: issues}
	}
	f, err := ParseFamily(data)
	if err != nil {
		return nil, "", err
	}
	return f, FamilyFileName, nil // the copy's name, unless a shard summary knows the original
}

// mergeFile checks one certificate file against the family and returns its
// point, or the issue that disqualifies it.
func mergeFile(f *Family, path string, memory int64) (*Point, *MergeIssue) {
	name := filepath.Base(path)
	index, prefix, ok := parseCertFileName(name)
	if !ok {
		return nil, &MergeIssue{Kind: IssueForeign, Index: -1, File: path, Msg: "not a certificate name of a sweep (pNNNN-HASH.cert.json)"}
	}
	if index >= len(f.Points) {
		return nil, &MergeIssue{Kind: IssueForeign, Index: -1, File: path, Msg: fmt.Sprintf("point %d is beyond the family's %d points", index, len(f.Points))}
	}
	pt := f.Points[index]
	hash := pt.Problem.SHA256()
	if prefix != hash[:hashPrefixLen] {
		return nil, &MergeIssue{Kind: IssueForeign, Index: -1, File: path, Msg: fmt.Sprintf("its name's problem hash %s is not that of point %d (%s)", prefix, index, hash[:hashPrefixLen])}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, &MergeIssue{Kind: IssueTampered, Index: index, File: path, Msg: err.Error()}
	}
	cert, err := certs.Unmarshal(data)
	if err != nil {
		return nil, &MergeIssue{Kind: IssueTampered, Index: index, File: path, Msg: oneLine(err)}
	}
	if cert.ProblemSHA256 != hash {
		return nil, &MergeIssue{Kind: IssueForeign, Index: -1, File: path, Msg: fmt.Sprintf("records problem %s, not point %d of the family (%s)", cert.ProblemSHA256, index, hash)}
	}
	if err := certify.CheckWithin(data, memory); err != nil {
		return nil, &MergeIssue{Kind: IssueTampered, Index: index, File: path, Msg: oneLine(err)}
	}
	if f.GroundState && cert.Results.GroundState == nil {
		return nil, &MergeIssue{Kind: IssueNoGround, Index: index, File: path, Msg: noGroundState}
	}
	p := &Point{Index: index, Params: f.ParamText(pt), Status: StatusVerified, CertificateSHA256: sha256Hex(data)}
	fillFromCertificate(p, cert)
	return p, nil
}
