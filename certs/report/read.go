package report

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"gapcert/certs"
	"gapcert/strictjson"
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
}

// NewEntry reads the certificate in data (certs.Unmarshal, strict) and
// records its digest; path names it in messages and captions.
func NewEntry(path string, data []byte) (Entry, error) {
	c, err := certs.Unmarshal(data)
	if err != nil {
		return Entry{}, fmt.Errorf("%s: %w", path, err)
	}
	sum := sha256.Sum256(data)
	return Entry{Path: path, Data: data, FileSHA256: hex.EncodeToString(sum[:]), Cert: c}, nil
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
// listed in skipped; a file that declares itself one but does not read as
// one is an error, as is a directory without certificates and a given file
// that is not a certificate.
func Read(path string) (entries []Entry, skipped []Skipped, err error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, nil, err
	}
	if !st.IsDir() {
		data, err := readFile(path)
		if err != nil {
			return nil, nil, err
		}
		e, err := NewEntry(path, data)
		if err != nil {
			return nil, nil, err
		}
		return []Entry{e}, nil, nil
	}
	dir, err := os.ReadDir(path) // sorted by file name
	if err != nil {
		return nil, nil, err
	}
	for _, de := range dir {
		if de.IsDir() || !strings.HasSuffix(de.Name(), ".json") {
			continue
		}
		name := filepath.Join(path, de.Name())
		data, err := readFile(name)
		if err != nil {
			return nil, nil, err
		}
		if reason, ok := notCertificate(data); ok {
			skipped = append(skipped, Skipped{Path: name, Reason: reason})
			continue
		}
		e, err := NewEntry(name, data)
		if err != nil {
			return nil, nil, err
		}
		entries = append(entries, e)
	}
	if len(entries) == 0 {
		return nil, skipped, fmt.Errorf("%s: no gapcert certificates (*.json with \"format\": %q) in this directory", path, certs.Format)
	}
	return entries, skipped, nil
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
