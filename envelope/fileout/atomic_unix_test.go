//go:build unix

package fileout

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// withUmask runs f with the process umask set to mask.
func withUmask(t *testing.T, mask int, f func()) {
	t.Helper()
	old := syscall.Umask(mask)
	defer syscall.Umask(old)
	f()
}

// TestWriteAtomicHonoursUmask: a new output gets 0666 less the umask,
// as other programs' outputs do.
func TestWriteAtomicHonoursUmask(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		mask int
		want fs.FileMode
	}{{0o022, 0o644}, {0o027, 0o640}, {0o077, 0o600}, {0o002, 0o664}} {
		p := filepath.Join(dir, "out-"+c.want.String()+".txt")
		withUmask(t, c.mask, func() {
			if err := WriteFileAtomic(p, []byte("x"), false); err != nil {
				t.Fatal(err)
			}
		})
		if fi, err := os.Stat(p); err != nil || fi.Mode().Perm() != c.want {
			t.Errorf("umask %03o: mode %v, %v; want %v", c.mask, fi.Mode().Perm(), err, c.want)
		}
	}
}

// TestWriteFilePrivate: a session file is 0600 whatever the umask, also
// when it replaces a file others could read.
func TestWriteFilePrivate(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "session.json")
	withUmask(t, 0o002, func() {
		if err := WriteFilePrivate(p, []byte("{}\n"), true); err != nil {
			t.Fatal(err)
		}
	})
	if fi, _ := os.Stat(p); fi.Mode().Perm() != 0o600 {
		t.Errorf("new private file mode %v, want 0600", fi.Mode().Perm())
	}
	if err := os.Chmod(p, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := WriteFilePrivate(p, []byte("{\"a\": 1}\n"), true); err != nil {
		t.Fatal(err)
	}
	if fi, _ := os.Stat(p); fi.Mode().Perm() != 0o600 {
		t.Errorf("replacing private file mode %v, want 0600", fi.Mode().Perm())
	}
	if got, _ := os.ReadFile(p); string(got) != "{\"a\": 1}\n" {
		t.Errorf("content %q", got)
	}
	if es := dirEntries(t, dir); len(es) != 1 {
		t.Errorf("folder holds %v, want only the session", es)
	}
}

// TestWriteAtomicOnlyOverRegularFiles: a symbolic link, a named pipe, a
// folder and a device are refused, with overwrite too, and left as they
// were.
func TestWriteAtomicOnlyOverRegularFiles(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "target.txt")
	if err := os.WriteFile(target, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.txt")
	if err := os.Symlink(target, link); err != nil {
		t.Fatal(err)
	}
	fifo := filepath.Join(dir, "pipe")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	folder := filepath.Join(dir, "folder")
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}
	cases := []struct{ path, want string }{
		{link, "is a symbolic link"},
		{fifo, "is a named pipe"},
		{folder, "is a folder"},
	}
	if _, err := os.Stat("/dev/null"); err == nil {
		cases = append(cases, struct{ path, want string }{"/dev/null", "is a device"})
	}
	for _, c := range cases {
		for _, overwrite := range []bool{false, true} {
			err := CheckOutputTarget(c.path, overwrite)
			if err == nil || !strings.Contains(err.Error(), c.want+"; outputs are written only over regular files, even with --force") {
				t.Errorf("CheckOutputTarget(%s, %v) = %v, want %q", c.path, overwrite, err, c.want)
			}
			if errors.Is(err, fs.ErrExist) {
				t.Errorf("CheckOutputTarget(%s) wraps fs.ErrExist: a caller would offer --force", c.path)
			}
			if c.path == "/dev/null" {
				continue // never write there, even in a test
			}
			if err := WriteFileAtomic(c.path, []byte("new"), overwrite); err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("WriteFileAtomic(%s, overwrite %v) = %v, want %q", c.path, overwrite, err, c.want)
			}
		}
	}
	if fi, err := os.Lstat(link); err != nil || fi.Mode()&fs.ModeSymlink == 0 {
		t.Errorf("link replaced: %v, %v", fi.Mode(), err)
	}
	if got, _ := os.ReadFile(target); string(got) != "keep" {
		t.Errorf("link target content %q, want it kept", got)
	}
	if fi, err := os.Lstat(fifo); err != nil || fi.Mode()&fs.ModeNamedPipe == 0 {
		t.Errorf("pipe replaced: %v, %v", fi.Mode(), err)
	}
	if es := dirEntries(t, dir); len(es) != 4 {
		t.Errorf("folder holds %v, want the four originals only", es)
	}
}
