package fileout

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// dirEntries lists the names in dir.
func dirEntries(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, e := range es {
		out = append(out, e.Name())
	}
	return out
}

func TestWriteFileAtomicNew(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "out.txt")
	if err := WriteFileAtomic(p, []byte("hello\n"), false); err != nil {
		t.Fatalf("WriteFileAtomic(new) = %v, want nil", err)
	}
	got, err := os.ReadFile(p)
	if err != nil || string(got) != "hello\n" {
		t.Fatalf("content = %q, %v, want %q", got, err, "hello\n")
	}
	if es := dirEntries(t, dir); len(es) != 1 {
		t.Errorf("folder holds %v, want only out.txt", es)
	}
}

func TestWriteFileAtomicRefusesOverwrite(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "out.txt")
	if err := os.WriteFile(p, []byte("old"), 0o600); err != nil {
		t.Fatal(err)
	}
	called := false
	err := WriteAtomic(p, false, func(w io.Writer) error { called = true; return nil })
	if !errors.Is(err, fs.ErrExist) {
		t.Fatalf("WriteAtomic(existing, no overwrite) = %v, want fs.ErrExist", err)
	}
	if !strings.Contains(err.Error(), "--force") {
		t.Errorf("error %q does not mention --force", err)
	}
	if called {
		t.Error("writer ran although the file exists")
	}
	if got, _ := os.ReadFile(p); string(got) != "old" {
		t.Errorf("content = %q, want the old content kept", got)
	}
	// With overwrite the content is replaced and the mode kept.
	if err := WriteFileAtomic(p, []byte("new"), true); err != nil {
		t.Fatalf("WriteFileAtomic(overwrite) = %v", err)
	}
	if got, _ := os.ReadFile(p); string(got) != "new" {
		t.Errorf("content = %q, want %q", got, "new")
	}
	if fi, _ := os.Stat(p); fi.Mode().Perm() != 0o600 {
		t.Errorf("mode after overwrite = %v, want the old 0600", fi.Mode().Perm())
	}
	if es := dirEntries(t, dir); len(es) != 1 {
		t.Errorf("folder holds %v, want only out.txt", es)
	}
}

func TestWriteAtomicFailures(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "plain")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name string
		path string
	}{
		// Tests may run as root, for whom a read-only folder is
		// writable; a parent that is a file, or missing, fails for
		// everyone.
		{"parent is a file", filepath.Join(file, "out.csv")},
		{"parent missing", filepath.Join(dir, "no-such-folder", "out.csv")},
		{"target is a folder", dir},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := WriteFileAtomic(c.path, []byte("data"), true)
			if err == nil {
				t.Fatalf("WriteFileAtomic(%s) = nil, want an error", c.path)
			}
			if !strings.Contains(err.Error(), c.path) {
				t.Errorf("error %q does not name the file", err)
			}
		})
	}
	if es := dirEntries(t, dir); len(es) != 1 {
		t.Errorf("folder holds %v after failures, want only the plain file", es)
	}
}

func TestWriteAtomicWriterFails(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "out.json")
	boom := errors.New("encoder broke")
	err := WriteAtomic(p, false, func(w io.Writer) error {
		if _, err := w.Write([]byte(strings.Repeat("x", 200_000))); err != nil {
			return err
		}
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("WriteAtomic = %v, want the writer's error", err)
	}
	if es := dirEntries(t, dir); len(es) != 0 {
		t.Errorf("folder holds %v after a failed write, want nothing", es)
	}
}

func TestWriteAtomicReadOnlyFolder(t *testing.T) {
	if os.Geteuid() == 0 {
		t.Skip("running as root: permission bits do not stop writes (covered by the missing-parent cases)")
	}
	dir := t.TempDir()
	ro := filepath.Join(dir, "ro")
	if err := os.Mkdir(ro, 0o555); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { os.Chmod(ro, 0o755) })
	p := filepath.Join(ro, "out.png")
	if err := WriteFileAtomic(p, []byte("data"), false); err == nil {
		t.Fatal("WriteFileAtomic into a read-only folder = nil, want an error")
	}
	if es := dirEntries(t, ro); len(es) != 0 {
		t.Errorf("read-only folder holds %v, want nothing", es)
	}
}

func ExampleWriteFileAtomic() {
	dir, _ := os.MkdirTemp("", "likewind-example")
	defer os.RemoveAll(dir)
	p := filepath.Join(dir, "runs.csv")
	_ = WriteFileAtomic(p, []byte("a,b\n"), false)
	err := WriteFileAtomic(p, []byte("c,d\n"), false)
	fmt.Println(errors.Is(err, fs.ErrExist))
	// Output: true
}

// TestWriteFilesAtomicBothOrNeither: when the second file of a set
// cannot be put in place, the first is taken back: removed when it was
// new, restored when it replaced a file.
func TestWriteFilesAtomicBothOrNeither(t *testing.T) {
	for _, overwrite := range []bool{false, true} {
		dir := t.TempDir()
		a, b := filepath.Join(dir, "a-map.svg"), filepath.Join(dir, "a-remach.svg")
		if overwrite {
			for _, p := range []string{a, b} {
				if err := os.WriteFile(p, []byte("old "+filepath.Base(p)), 0o644); err != nil {
					t.Fatal(err)
				}
			}
		}
		set := []AtomicFile{{a, []byte("new map")}, {b, []byte("new remach")}}
		// A folder appears at the second name after both are staged.
		err := writeFiles(set, overwrite, func(k int) {
			if k == 1 {
				os.Remove(b)
				if err := os.Mkdir(b, 0o755); err != nil {
					t.Fatal(err)
				}
			}
		})
		if err == nil || !strings.Contains(err.Error(), "no file of the set was written") {
			t.Fatalf("overwrite %v: writeFiles = %v, want a failure saying no file was written", overwrite, err)
		}
		got, rerr := os.ReadFile(a)
		switch {
		case overwrite && string(got) != "old a-map.svg":
			t.Errorf("overwrite: first file %q, %v; want the old content restored", got, rerr)
		case !overwrite && !errors.Is(rerr, fs.ErrNotExist):
			t.Errorf("no overwrite: first file left behind (%q)", got)
		}
		want := 1 // the folder
		if overwrite {
			want = 2
		}
		if es := dirEntries(t, dir); len(es) != want {
			t.Errorf("overwrite %v: folder holds %v, want %d entries (no temporary or kept files)", overwrite, es, want)
		}
	}
	// Success: both written, nothing else left.
	dir := t.TempDir()
	set := []AtomicFile{{filepath.Join(dir, "x"), []byte("1")}, {filepath.Join(dir, "y"), []byte("2")}}
	if err := WriteFilesAtomic(set, false); err != nil {
		t.Fatal(err)
	}
	if err := WriteFilesAtomic(set, false); !errors.Is(err, fs.ErrExist) {
		t.Errorf("second WriteFilesAtomic without overwrite = %v, want fs.ErrExist", err)
	}
	set[1].Data = []byte("3")
	if err := WriteFilesAtomic(set, true); err != nil {
		t.Fatal(err)
	}
	if got, _ := os.ReadFile(set[1].Path); string(got) != "3" {
		t.Errorf("overwritten content %q", got)
	}
	if es := dirEntries(t, dir); len(es) != 2 {
		t.Errorf("folder holds %v, want x and y", es)
	}
}
