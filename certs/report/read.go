package report

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"gapcert/certs"
	"gapcert/certs/sweep"
	"gapcert/fem/problem/strictjson"
)

// maxFileSize bounds what Read reads from one file (a certificate is a few
// kilobytes to a few hundred).
const maxFileSize = 64 << 20

// Entry is one certificate of a table: where it came from, its bytes and
// their SHA-256, and the certificate read from them.
type Entry struct {
	Path       string // the file it was read from, as given (or a name chosen by the caller)
	Data       []byte // the file's bytes
	FileSHA256 string // lowercase hex SHA-256 of Data
	Cert       *certs.Certificate
	// Point is the index of the certificate's point in its sweep family,
	// −1 when it was not read as a point of one.
	Point int
	// Params are the exact values of the sweep family's parameters at the
	// point (nil when Point is −1).
	Params map[string]string
}

// NewEntry reads the certificate in data (certs.Unmarshal, strict) and
// records its digest; path names it in messages and captions. The entry
// is not a point of a sweep (Point −1).
func NewEntry(path string, data []byte) (Entry, error) {
	c, err := certs.Unmarshal(data)
	if err != nil {
		return Entry{}, fmt.Errorf("%s: %w", path, err)
	}
	sum := sha256.Sum256(data)
	return Entry{Path: path, Data: data, FileSHA256: hex.EncodeToString(sum[:]), Cert: c, Point: -1}, nil
}

// Source is what Read found at a path.
type Source struct {
	Entries []Entry
	// Skipped are the JSON files of a directory that were left out.
	Skipped []Skipped
	// Family and Parameters describe the sweep when the path is a sweep
	// directory: the family's name ("" when it has none) and its
	// parameter names in expansion order (nil when not a sweep directory).
	Family     string
	Parameters []string
	// FamilyPoints is the number of points of the sweep family (0 when
	// not a sweep directory); a shard's directory holds fewer entries.
	FamilyPoints int
}

// Skipped is a JSON file of a directory that Read left out, and why.
type Skipped struct {
	Path   string
	Reason string
}

// Read returns the certificates at path: the one in the file path, or, for
// a directory, those among its *.json files (not descending into
// subdirectories), sorted by file name. In a directory a JSON file that
// does not declare itself a gapcert certificate (no "format" field, another
// format such as a sweep summary, or not a JSON object) is left out and
// listed in Source.Skipped; a file that declares itself one but does not
// read as one is an error, as is a directory without certificates and a
// given file that is not a certificate.
//
// A directory that holds a sweep family file (sweep.FamilyFileName: a
// shard directory, a merged one or that of an unsharded run) is read as
// that sweep: every certificate must record the problem of a point of the
// family (its problem_sha256 is the point's problem hash), at most one per
// point; the entries carry the point's index and parameter values and are
// sorted by point; the family file and the sweep summaries are not listed
// as skipped. The Source is returned with the skipped files also when
// there is an error.
func Read(path string) (*Source, error) {
	src := &Source{}
	st, err := os.Stat(path)
	if err != nil {
		return src, err
	}
	if !st.IsDir() {
		data, err := readFile(path)
		if err != nil {
			return src, err
		}
		e, err := NewEntry(path, data)
		if err != nil {
			return src, err
		}
		src.Entries = []Entry{e}
		return src, nil
	}
	fam, err := readFamily(path)
	if err != nil {
		return src, err
	}
	dir, err := os.ReadDir(path) // sorted by file name
	if err != nil {
		return src, err
	}
	for _, de := range dir {
		if de.IsDir() || !strings.HasSuffix(de.Name(), ".json") {
			continue
		}
		name := filepath.Join(path, de.Name())
		data, err := readFile(name)
		if err != nil {
			return src, err
		}
		if reason, ok := notCertificate(data); ok {
			if fam == nil || !isSweepFile(de.Name()) {
				src.Skipped = append(src.Skipped, Skipped{Path: name, Reason: reason})
			}
			continue
		}
		e, err := NewEntry(name, data)
		if err != nil {
			return src, err
		}
		src.Entries = append(src.Entries, e)
	}
	if len(src.Entries) == 0 {
		return src, fmt.Errorf("%s: no gapcert certificates (*.json with \"format\": %q) in this directory", path, certs.Format)
	}
	if fam != nil {
		if err := asPoints(src, fam, filepath.Join(path, sweep.FamilyFileName)); err != nil {
			return src, err
		}
	}
	return src, nil
}

// readFamily returns the sweep family of the directory dir, or nil when
// dir holds no family file.
func readFamily(dir string) (*sweep.Family, error) {
	file := filepath.Join(dir, sweep.FamilyFileName)
	data, err := readFile(file)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, err
	}
	f, err := sweep.ParseFamily(data)
	if err != nil {
		return nil, fmt.Errorf("%s: the sweep directory's family file does not read: %v", file, err)
	}
	return f, nil
}

// isSweepFile reports whether name is the family file or a summary of a
// sweep directory.
func isSweepFile(name string) bool {
	return name == sweep.FamilyFileName || strings.HasPrefix(name, "summary")
}

// asPoints gives each entry of src its point of the family f (read from
// familyFile), sorts the entries by point and records the family.
func asPoints(src *Source, f *sweep.Family, familyFile string) error {
	byHash := make(map[string]*sweep.FamilyPoint, len(f.Points))
	for _, pt := range f.Points {
		byHash[pt.Problem.SHA256()] = pt
	}
	seen := map[int]string{}
	for i := range src.Entries {
		e := &src.Entries[i]
		pt, ok := byHash[e.Cert.ProblemSHA256]
		if !ok {
			return fmt.Errorf("%s: records problem %s, which is not a point of the sweep family in %s (hint: keep only the family's certificates in a sweep directory)", e.Path, e.Cert.ProblemSHA256, familyFile)
		}
		if other, dup := seen[pt.Index]; dup {
			return fmt.Errorf("%s and %s are both certificates of point %d (hint: merge the sweep directory to find out which is the point's)", other, e.Path, pt.Index)
		}
		seen[pt.Index] = e.Path
		e.Point, e.Params = pt.Index, f.ParamText(pt)
	}
	slices.SortFunc(src.Entries, func(a, b Entry) int { return a.Point - b.Point })
	src.Family, src.Parameters, src.FamilyPoints = f.Name, f.ParamNames(), len(f.Points)
	return nil
}

// notCertificate reports whether data does not claim to be a gapcert
// certificate, and why. Any "format" of the certificate family counts as a
// claim (so that a certificate of another version is an error, not left
// out silently).
func notCertificate(data []byte) (reason string, ok bool) {
	head, dups, err := strictjson.Parse(data)
	if err != nil || head.Kind != strictjson.Object {
		return "not a JSON object", true
	}
	for _, d := range dups {
		if d.Path == "format" {
			return "", false // two formats: certs.Unmarshal refuses the file
		}
	}
	for _, k := range head.Keys {
		if k != "format" && strings.EqualFold(k, "format") {
			return "", false // a case variant: certs.Unmarshal refuses the file
		}
	}
	raw := head.Get("format")
	if raw == nil {
		return "no \"format\" field", true
	}
	if raw.Kind != strictjson.String {
		return "\"format\" is not a string", true
	}
	format := raw.Str
	family, _, _ := strings.Cut(certs.Format, "/")
	if !strings.HasPrefix(format, family+"/") {
		return fmt.Sprintf("format %q is not a certificate", format), true
	}
	return "", false
}

func readFile(path string) ([]byte, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if st.Size() > maxFileSize {
		return nil, fmt.Errorf("%s: file too large (%d bytes, at most %d)", path, st.Size(), maxFileSize)
	}
	return os.ReadFile(path)
}
