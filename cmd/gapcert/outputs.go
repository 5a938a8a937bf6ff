package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"gapcert/certs/outfile"
	"gapcert/certs/plot"
)

// Output paths are checked before anything is computed: an output that
// cannot be written, or that is one of the command's inputs, is refused
// with exit status exitFailure and nothing is written.

// checkOutputFile refuses an output file that cannot be written or is one
// of inputs (outfile.CheckFile).
func checkOutputFile(path string, inputs ...string) error {
	if err := outfile.CheckFile(path, inputs...); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	return nil
}

// checkOutputDir refuses an output directory that cannot be written or
// created, or that is one of inputs (outfile.CheckDir).
func checkOutputDir(dir string, inputs ...string) error {
	if err := outfile.CheckDir(dir, inputs...); err != nil {
		return &exitError{code: exitFailure, err: err}
	}
	return nil
}

// checkCertifyOutputs checks the certificate path and the picture
// directory of certify and demo against the input problem file (none for
// demo).
func checkCertifyOutputs(f certifyFlags, out string, inputs ...string) error {
	if err := checkOutputFile(out, inputs...); err != nil {
		return err
	}
	if f.plotDir != "" {
		return checkOutputDir(f.plotDir, inputs...)
	}
	return nil
}

// checkPictureFile checks the picture path of plot: its extension names
// a picture format, and it can be written and is not the input.
func checkPictureFile(path string, inputs ...string) error {
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if !slices.Contains(plot.Formats(), ext) {
		return &exitError{code: exitFailure, err: &outfile.Error{Path: path, Msg: fmt.Sprintf("unknown picture format %q", ext), Hint: "end the file name with ." + strings.Join(plot.Formats(), " or .")}}
	}
	return checkOutputFile(path, inputs...)
}

// checkNewFiles refuses files that exist (outputs that are never
// overwritten), before anything is computed.
func checkNewFiles(paths ...string) error {
	for _, p := range paths {
		if _, err := os.Lstat(p); !errors.Is(err, fs.ErrNotExist) {
			return &exitError{code: exitFailure, err: &outfile.Error{Path: p, Msg: "exists; not overwritten", Hint: "choose another output directory"}}
		}
	}
	return nil
}

// readFailure is the exit error of an input file or directory that
// cannot be read: the path, the system's reason without the name of the
// system call, and a hint. Other errors are returned as they are.
func readFailure(err error) error {
	var pe *fs.PathError
	if !errors.As(err, &pe) || pe.Error() != err.Error() {
		return &exitError{code: exitFailure, err: err}
	}
	hint := ""
	switch {
	case errors.Is(err, fs.ErrNotExist):
		hint = " (hint: check the path)"
	case errors.Is(err, fs.ErrPermission):
		hint = " (hint: check the file's permissions)"
	}
	return &exitError{code: exitFailure, err: fmt.Errorf("%s: %v%s", pe.Path, pe.Err, hint)}
}
