package outfile

import (
	"bytes"
	"errors"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// entries returns the names in dir, for checking that no temporary file
// is left behind.
func entries(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, e := range es {
		names = append(names, e.Name())
	}
	return names
}

func TestWriteReplaces(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "c.json")
	for _, data := range []string{"first\n", "second, longer\n", "3\n"} {
		if err := Write(path, []byte(data)); err != nil {
			t.Fatal(err)
		}
		got, err := os.ReadFile(path)
		if err != nil || string(got) != data {
			t.Fatalf("read %q, %v; want %q", got, err, data)
		}
	}
	if names := entries(t, dir); len(names) != 1 {
		t.Errorf("directory holds %v, want only c.json", names)
	}
	st, err := os.Stat(path)
	if err != nil || st.Mode().Perm() != newFilePerm {
		t.Errorf("mode %v, %v; want %v", st.Mode().Perm(), err, fs.FileMode(newFilePerm))
	}
}

// failingWriter writes a part of the data, then fails: a disk that fills
// up or a renderer that breaks in the middle of a file.
func failingWriter(w io.Writer) error {
	if _, err := w.Write(bytes.Repeat([]byte("partial "), 10000)); err != nil {
		return err
	}
	return errors.New("simulated failure in the middle of the file")
}

func TestWriteWithFailureKeepsEarlierFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "c.json")
	earlier := []byte("the earlier, complete certificate\n")
	if err := os.WriteFile(path, earlier, 0o600); err != nil {
		t.Fatal(err)
	}
	err := WriteWith(path, failingWriter)
	if err == nil || !strings.Contains(err.Error(), "simulated failure") {
		t.Fatalf("err = %v, want the writer's error", err)
	}
	got, err := os.ReadFile(path)
	if err != nil || !bytes.Equal(got, earlier) {
		t.Fatalf("after a failed write the file holds %.40q (%v), want the earlier content", got, err)
	}
	if names := entries(t, dir); len(names) != 1 || names[0] != "c.json" {
		t.Errorf("directory holds %v, want only c.json (temporary file removed)", names)
	}
	// A write that succeeds keeps the earlier file's permission bits.
	if err := Write(path, []byte("new\n")); err != nil {
		t.Fatal(err)
	}
	if st, _ := os.Stat(path); st.Mode().Perm() != 0o600 {
		t.Errorf("mode %v after replacing a 0600 file, want 0600", st.Mode().Perm())
	}
}

func TestWriteWithFailureCreatesNothing(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "new.png")
	if err := WriteWith(path, failingWriter); err == nil {
		t.Fatal("no error")
	}
	if names := entries(t, dir); len(names) != 0 {
		t.Errorf("directory holds %v after a failed write of a new file, want nothing", names)
	}
}

func TestWriteThroughSymlink(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "real.json")
	link := filepath.Join(dir, "link.json")
	if err := os.WriteFile(target, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink("real.json", link); err != nil {
		t.Skip("no symbolic links here:", err)
	}
	if err := Write(link, []byte("new")); err != nil {
		t.Fatal(err)
	}
	if st, err := os.Lstat(link); err != nil || st.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the link was replaced by a file")
	}
	if got, _ := os.ReadFile(target); string(got) != "new" {
		t.Errorf("target holds %q, want %q", got, "new")
	}
}

func TestWriteNew(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "p0000.cert.json")
	if err := WriteNew(path, []byte("a")); err != nil {
		t.Fatal(err)
	}
	err := WriteNew(path, []byte("b"))
	var oe *Error
	if !errors.As(err, &oe) || oe.Path != path || !strings.Contains(err.Error(), "not overwritten") {
		t.Fatalf("second WriteNew: %v, want an *Error naming the path", err)
	}
	if got, _ := os.ReadFile(path); string(got) != "a" {
		t.Errorf("file holds %q, want the first content", got)
	}
}

// TestWriteUnwritable writes below a regular file: an error for every
// user, root included.
func TestWriteUnwritable(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "file")
	if err := os.WriteFile(file, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(file, "out.json")
	err := Write(path, []byte("x"))
	var oe *Error
	if !errors.As(err, &oe) || oe.Path != path || oe.Hint == "" || strings.Contains(err.Error(), ".tmp") {
		t.Fatalf("err = %v, want an *Error naming %s with a hint and no temporary name", err, path)
	}
}

func TestCheckFile(t *testing.T) {
	dir := t.TempDir()
	input := filepath.Join(dir, "p.json")
	file := filepath.Join(dir, "file")
	for _, f := range []string{input, file} {
		if err := os.WriteFile(f, []byte("{}"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	link := filepath.Join(dir, "link.json")
	haveLink := os.Symlink("p.json", link) == nil
	wd, _ := os.Getwd()
	rel, relErr := filepath.Rel(wd, input)
	for _, tc := range []struct {
		path, input string
		msg         string // "" = accepted
	}{
		{filepath.Join(dir, "c.json"), input, ""},
		{input + ".cert.json", input, ""},
		{input, "", ""}, // not an input: replacing an earlier output is fine
		{input, input, "is an input as well"},
		{filepath.Join(dir, ".", "p.json"), input, "is an input as well"},
		{filepath.Join(dir, "sub", "..", "p.json"), input, "is an input as well"},
		{rel, input, "is an input as well"},
		{link, input, "is the same file as the input"},
		{dir, input, "is a directory"},
		{filepath.Join(file, "c.json"), input, "is not a directory"},
		{filepath.Join(file, "sub", "c.json"), input, "a part of its directory is a file"},
		{filepath.Join(dir, "missing", "c.json"), input, "does not exist"},
		{"", input, "empty output path"},
	} {
		if tc.path == link && !haveLink || tc.path == rel && relErr != nil {
			continue
		}
		var inputs []string
		if tc.input != "" {
			inputs = append(inputs, tc.input)
		}
		before := entries(t, dir)
		err := CheckFile(tc.path, inputs...)
		if got := entries(t, dir); strings.Join(got, ",") != strings.Join(before, ",") {
			t.Errorf("CheckFile(%q) changed the directory: %v → %v", tc.path, before, got)
		}
		if tc.msg == "" {
			if err != nil {
				t.Errorf("CheckFile(%q): %v, want nil", tc.path, err)
			}
			continue
		}
		var oe *Error
		if !errors.As(err, &oe) || !strings.Contains(err.Error(), tc.msg) || oe.Hint == "" {
			t.Errorf("CheckFile(%q) = %v, want an *Error with %q and a hint", tc.path, err, tc.msg)
		}
	}
}

func TestCheckFileDevice(t *testing.T) {
	if runtime.GOOS != "linux" {
		t.Skip("needs /dev/null")
	}
	if err := CheckFile("/dev/null"); err == nil || !strings.Contains(err.Error(), "not a regular file") {
		t.Errorf("CheckFile(/dev/null) = %v, want a refusal (an atomic write would replace the device)", err)
	}
	if err := Write("/dev/null", []byte("x")); err == nil {
		t.Errorf("Write(/dev/null) succeeded")
	}
}

// TestCheckReadOnly probes a directory that refuses new files for every
// user, root included: /proc on Linux.
func TestCheckReadOnly(t *testing.T) {
	if runtime.GOOS != "linux" {
		t.Skip("needs /proc")
	}
	if _, err := os.Stat("/proc/self"); err != nil {
		t.Skip("no /proc")
	}
	if err := CheckFile("/proc/gapcert-out.json"); err == nil || !strings.Contains(err.Error(), "cannot write in /proc") {
		t.Errorf("CheckFile under /proc = %v, want a refusal", err)
	}
	if err := CheckDir("/proc/gapcert-out"); err == nil {
		t.Errorf("CheckDir under /proc: no error")
	}
}

func TestCheckDir(t *testing.T) {
	dir := t.TempDir()
	shard := filepath.Join(dir, "shard-0")
	file := filepath.Join(dir, "file")
	if err := os.Mkdir(shard, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(file, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		dir string
		msg string
	}{
		{shard + "-other", ""},
		{filepath.Join(dir, "a", "b", "c"), ""},
		{dir, ""},
		{shard, "is an input as well"},
		{shard + string(filepath.Separator), "is an input as well"},
		{file, "exists and is not a directory"},
		{filepath.Join(file, "out"), "is not a directory"},
		{filepath.Join(file, "a", "b"), "is not a directory"},
	} {
		before := entries(t, dir)
		err := CheckDir(tc.dir, shard)
		if got := entries(t, dir); strings.Join(got, ",") != strings.Join(before, ",") {
			t.Errorf("CheckDir(%q) changed the directory: %v → %v", tc.dir, before, got)
		}
		if tc.msg == "" {
			if err != nil {
				t.Errorf("CheckDir(%q): %v, want nil", tc.dir, err)
			}
			continue
		}
		var oe *Error
		if !errors.As(err, &oe) || !strings.Contains(err.Error(), tc.msg) || oe.Hint == "" {
			t.Errorf("CheckDir(%q) = %v, want an *Error with %q and a hint", tc.dir, err, tc.msg)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "a")); err == nil {
		t.Errorf("CheckDir created a directory")
	}
}

// TestCheckPermissions: a directory without write permission is refused.
// Permission bits do not stop root, so the test needs another user; the
// refusal for every user is TestCheckFile's path below a regular file.
func TestCheckPermissions(t *testing.T) {
	if runtime.GOOS == "windows" || os.Geteuid() == 0 {
		t.Skip("permission bits do not stop this user")
	}
	dir := filepath.Join(t.TempDir(), "ro")
	if err := os.Mkdir(dir, 0o500); err != nil {
		t.Fatal(err)
	}
	defer os.Chmod(dir, 0o700)
	if err := CheckFile(filepath.Join(dir, "c.json")); err == nil || !strings.Contains(err.Error(), "permission denied") || !strings.Contains(err.Error(), "choose a directory you can write to") {
		t.Errorf("CheckFile in a read-only directory = %v", err)
	}
	if err := CheckDir(filepath.Join(dir, "sub")); err == nil {
		t.Errorf("CheckDir below a read-only directory: no error")
	}
	if err := Write(filepath.Join(dir, "c.json"), []byte("x")); err == nil {
		t.Errorf("Write in a read-only directory: no error")
	}
}
