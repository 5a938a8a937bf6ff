package outfile

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"syscall"
)

// Error is an output path that cannot be used, with a hint for the user.
type Error struct {
	Path string // the output path as given
	Msg  string // what is wrong with it
	Hint string // what to do instead; may be empty
}

func (e *Error) Error() string {
	s := e.Path + ": " + e.Msg
	if e.Hint != "" {
		s += " (hint: " + e.Hint + ")"
	}
	return s
}

// newFilePerm is the permission of a file that did not exist before.
const newFilePerm = 0o644

// Write replaces the file path with data atomically (see the package
// documentation).
func Write(path string, data []byte) error {
	return WriteWith(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// WriteNew writes data to path atomically like Write, but fails with an
// *Error if path exists.
func WriteNew(path string, data []byte) error {
	if _, err := os.Lstat(path); err == nil {
		return &Error{Path: path, Msg: "exists; not overwritten", Hint: "move it away or choose another path"}
	} else if !errors.Is(err, fs.ErrNotExist) {
		return ioError(path, err)
	}
	return Write(path, data)
}

// WriteWith replaces the file path atomically with what write writes (see
// the package documentation). An error of write is returned as it is; the
// earlier file at path is then intact.
func WriteWith(path string, write func(w io.Writer) error) (err error) {
	target, perm := path, fs.FileMode(newFilePerm)
	if st, err := os.Lstat(path); err == nil {
		if st.Mode()&fs.ModeSymlink != 0 {
			if target, err = filepath.EvalSymlinks(path); err != nil {
				return ioError(path, err)
			}
			if st, err = os.Stat(target); err != nil {
				return ioError(path, err)
			}
		}
		if !st.Mode().IsRegular() {
			return &Error{Path: path, Msg: "exists and is not a regular file; not replaced", Hint: "name a regular file"}
		}
		perm = st.Mode().Perm()
	}
	dir := filepath.Dir(target)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(target)+".*.tmp")
	if err != nil {
		return ioError(path, err)
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	bw := bufio.NewWriter(tmp)
	if err = write(bw); err != nil {
		return err
	}
	if err = bw.Flush(); err != nil {
		return ioError(path, err)
	}
	if err = tmp.Chmod(perm); err != nil {
		return ioError(path, err)
	}
	if err = tmp.Sync(); err != nil {
		return ioError(path, err)
	}
	if err = tmp.Close(); err != nil {
		return ioError(path, err)
	}
	if err = os.Rename(tmp.Name(), target); err != nil {
		return ioError(path, err)
	}
	syncDir(dir)
	return nil
}

// syncDir flushes the directory entry of a rename to disk. It is best
// effort: some file systems do not support fsync on a directory, and the
// file itself is complete on disk either way.
func syncDir(dir string) {
	d, err := os.Open(dir)
	if err != nil {
		return
	}
	_ = d.Sync()
	d.Close()
}

// ioError reports a failed write of path without the temporary file's
// name that the underlying error may carry.
func ioError(path string, err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		err = le.Err
	}
	return &Error{Path: path, Msg: "cannot be written: " + err.Error(), Hint: hintFor(err)}
}

// hintFor suggests a remedy for a system error.
func hintFor(err error) string {
	switch {
	case errors.Is(err, fs.ErrPermission):
		return "choose a directory you can write to"
	case errors.Is(err, fs.ErrNotExist):
		return "create the directory first"
	}
	return "choose another path"
}

// CheckFile reports whether a file can be written at path, without
// creating or changing anything there: path must not be a directory or
// another non-regular file, must not be one of inputs (the same file, or
// the same cleaned absolute path), and its directory must exist and
// accept a new file. The result is nil or an *Error.
func CheckFile(path string, inputs ...string) error {
	if path == "" {
		return &Error{Path: `""`, Msg: "empty output path", Hint: "name a file"}
	}
	if err := notAnInput(path, inputs, "choose another output path"); err != nil {
		return err
	}
	dir := filepath.Dir(path)
	if st, err := os.Stat(path); err == nil {
		switch {
		case st.IsDir():
			return &Error{Path: path, Msg: "is a directory", Hint: "name a file inside it"}
		case !st.Mode().IsRegular():
			return &Error{Path: path, Msg: "is not a regular file", Hint: "name a regular file"}
		}
		if target, err := filepath.EvalSymlinks(path); err == nil {
			dir = filepath.Dir(target) // where Write puts its temporary file
		}
	} else if !missing(err) {
		return statError(path, err)
	}
	st, err := os.Stat(dir)
	switch {
	case missing(err) && errors.Is(err, syscall.ENOTDIR):
		return &Error{Path: path, Msg: "a part of its directory is a file, not a directory", Hint: "choose a path inside a directory"}
	case missing(err):
		return &Error{Path: path, Msg: fmt.Sprintf("its directory %s does not exist", dir), Hint: "create the directory first"}
	case err != nil:
		return statError(path, err)
	case !st.IsDir():
		return &Error{Path: path, Msg: fmt.Sprintf("%s is not a directory", dir), Hint: "choose a path inside a directory"}
	}
	return probe(path, dir)
}

// CheckDir reports whether files can be written in the directory dir,
// without creating or changing anything there: dir must not be one of
// inputs, and it must be a directory that accepts a new file, or not
// exist yet and have a nearest existing ancestor that is a directory and
// accepts a new entry (the caller creates dir later). The result is nil or
// an *Error.
func CheckDir(dir string, inputs ...string) error {
	if dir == "" {
		return &Error{Path: `""`, Msg: "empty output directory", Hint: "name a directory"}
	}
	if err := notAnInput(dir, inputs, "choose another output directory"); err != nil {
		return err
	}
	at := dir
	for {
		st, err := os.Stat(at)
		switch {
		case err == nil && st.IsDir():
			return probe(dir, at)
		case err == nil && at == dir:
			return &Error{Path: dir, Msg: "exists and is not a directory", Hint: "name a directory"}
		case err == nil:
			return &Error{Path: dir, Msg: fmt.Sprintf("cannot be created: %s is not a directory", at), Hint: "choose a path inside a directory"}
		case !missing(err):
			return statError(dir, err)
		}
		parent := filepath.Dir(at)
		if parent == at {
			return &Error{Path: dir, Msg: "no part of the path exists", Hint: "check the path"}
		}
		at = parent
	}
}

// missing reports whether err says that a path does not exist, either
// because its last element is absent or because an element before it is
// not a directory (the caller then walks up and names that element).
func missing(err error) bool {
	return errors.Is(err, fs.ErrNotExist) || errors.Is(err, syscall.ENOTDIR)
}

// probe creates and removes a temporary file in dir, for the output path.
func probe(path, dir string) error {
	f, err := os.CreateTemp(dir, ".gapcert-probe-*")
	if err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return &Error{Path: path, Msg: fmt.Sprintf("cannot write in %s: %v", dir, err), Hint: hintFor(err)}
	}
	name := f.Name()
	f.Close()
	if err := os.Remove(name); err != nil {
		return &Error{Path: path, Msg: fmt.Sprintf("cannot remove a test file in %s: %v", dir, err), Hint: "remove " + name + " by hand"}
	}
	return nil
}

func statError(path string, err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	return &Error{Path: path, Msg: err.Error(), Hint: "check the path"}
}

// notAnInput returns an *Error if path is one of inputs.
func notAnInput(path string, inputs []string, hint string) error {
	for _, in := range inputs {
		if Same(path, in) {
			what := "is an input as well; gapcert never overwrites its inputs"
			if absPath(in) != absPath(path) {
				what = "is the same file as the input " + in + "; gapcert never overwrites its inputs"
			}
			return &Error{Path: path, Msg: what, Hint: hint}
		}
	}
	return nil
}

// Same reports whether the paths a and b name the same file: the same
// cleaned absolute path, or two existing paths that os.SameFile finds
// equal (hard links, symbolic links, different spellings).
func Same(a, b string) bool {
	if absPath(a) == absPath(b) {
		return true
	}
	sa, errA := os.Stat(a)
	sb, errB := os.Stat(b)
	return errA == nil && errB == nil && os.SameFile(sa, sb)
}

// absPath is the cleaned absolute form of path (path itself if the
// working directory is unknown).
func absPath(path string) string {
	if abs, err := filepath.Abs(path); err == nil {
		return abs
	}
	return filepath.Clean(path)
}
