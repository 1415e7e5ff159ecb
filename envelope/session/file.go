package session

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync"

	"likewind/envelope/fileout"
)

// ErrInUse is wrapped by (*File).Save when another likewind holds the
// session file's lock: this interface then saves only to another file.
var ErrInUse = errors.New("session file is in use by another likewind")

// errLockHeld is tryLock's answer when another open file holds the lock.
var errLockHeld = errors.New("lock held by another process")

// maxSessionBytes bounds what is read from a session path: a session is a
// few kilobytes; anything far larger is not one.
const maxSessionBytes = 16 << 20

// File is the session file an interface reads and saves: its path,
// the advisory lock held on it while the interface runs, and what the
// file held when it was last read or written, so that a save never writes
// over something it did not read.
//
// The lock is an exclusive flock on PATH.lock beside the session (the
// session itself is replaced by rename on every save, so it cannot carry
// the lock). A second interface on the same file does not get the lock: it
// opens read-only and saves only to another file. The lock file holds the
// holder's process id and is removed when the lock is released.
//
// A File is safe for use from several goroutines.
type File struct {
	mu sync.Mutex

	path     string
	lockFile *os.File // nil when no lock is held
	lockErr  error    // why no lock could be taken (nil: held, or read-only)
	readOnly bool     // another likewind holds the lock
	holder   string   // that process, e.g. "pid 1234"

	// What the file held when last read or written.
	data   []byte
	exists bool

	refused error    // why the file read at open is not a session for these inputs
	found   *Session // the session read at open, when usable
}

// Open takes the lock on the session file at path and reads what is there
// for the given inputs (names and content hash). It fails only when path
// is empty; a file that cannot be used is reported by Refused, a lock held
// elsewhere by ReadOnly, a lock that could not be taken by LockError.
// Close releases the lock.
func Open(path string, inputs []string, hash string) (*File, error) {
	return open(path, inputs, hash, true)
}

// OpenUnlocked reads the session file at path as Open does, without
// taking its lock (an interface model built without Run, tests). A save
// through it still never writes over what it did not read.
func OpenUnlocked(path string, inputs []string, hash string) (*File, error) {
	return open(path, inputs, hash, false)
}

func open(path string, inputs []string, hash string, lock bool) (*File, error) {
	if path == "" {
		return nil, errors.New("session: no session file given")
	}
	f := &File{path: path}
	if lock {
		lf, holder, err := takeLock(path)
		switch {
		case errors.Is(err, errLockHeld):
			f.readOnly, f.holder = true, holder
		case err != nil:
			f.lockErr = err
		default:
			f.lockFile = lf
		}
	}
	data, exists, err := readSessionPath(path)
	f.data, f.exists = data, exists
	switch {
	case err != nil:
		f.refused = err
	case exists && len(data) > 0:
		s, perr := parse(data)
		if perr != nil {
			f.refused = fmt.Errorf("is not a likewind session file (%v)", perr)
			break
		}
		if cerr := Check(s, inputs, hash); cerr != nil {
			if !errors.Is(cerr, ErrMismatch) {
				f.refused = cerr
			} else if InputNames(s.Inputs) == InputNames(inputs) {
				f.refused = fmt.Errorf("was saved for other contents of the input files %s (they changed since)", InputNames(inputs))
			} else {
				f.refused = fmt.Errorf("was saved for other input files (%s, not %s)", InputNames(s.Inputs), InputNames(inputs))
			}
			break
		}
		f.found = &s
	}
	return f, nil
}

// readSessionPath reads the regular file at path. A missing file is not an
// error (exists false); a folder, link, device or other special file is,
// and so is a file larger than any session.
func readSessionPath(path string) (data []byte, exists bool, err error) {
	fi, err := os.Lstat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, false, nil
	}
	if err != nil {
		return nil, false, fmt.Errorf("cannot be read: %w", err)
	}
	switch m := fi.Mode(); {
	case m.IsDir():
		return nil, true, errors.New("is a folder, not a session file")
	case m&fs.ModeSymlink != 0:
		return nil, true, errors.New("is a symbolic link, not a session file (give the file it points to)")
	case !m.IsRegular():
		return nil, true, errors.New("is a device or other special file, not a session file")
	}
	fh, err := os.Open(path)
	if err != nil {
		return nil, true, fmt.Errorf("cannot be read: %w", err)
	}
	defer fh.Close()
	data, err = io.ReadAll(io.LimitReader(fh, maxSessionBytes+1))
	if err != nil {
		return nil, true, fmt.Errorf("cannot be read: %w", err)
	}
	if len(data) > maxSessionBytes {
		return nil, true, fmt.Errorf("is larger than %d MB, not a session file", maxSessionBytes>>20)
	}
	return data, true, nil
}

// takeLock creates PATH.lock (0600) and takes an exclusive lock on it
// without waiting. When another process holds it, the error wraps
// errLockHeld and holder names that process.
func takeLock(path string) (lf *os.File, holder string, err error) {
	lp := path + ".lock"
	for range 5 {
		lf, err = os.OpenFile(lp, os.O_RDWR|os.O_CREATE, 0o600)
		if err != nil {
			return nil, "", fmt.Errorf("cannot create the lock file: %w", err)
		}
		if err = tryLock(lf); err != nil {
			if errors.Is(err, errLockHeld) {
				holder = lockHolder(lf)
			}
			lf.Close()
			return nil, holder, err
		}
		// The holder before us may have removed the file between our open
		// and our lock: then the lock is on a file no one else sees.
		if !sameFile(lf, lp) {
			lf.Close()
			continue
		}
		if err := lf.Truncate(0); err == nil {
			_, _ = fmt.Fprintf(lf, "pid %d\n", os.Getpid())
		}
		return lf, "", nil
	}
	return nil, "", errors.New("the lock file keeps being replaced")
}

// lockHolder reads the process id a lock file names, as "pid N" (only the
// digits are kept: the file's text is not trusted).
func lockHolder(lf *os.File) string {
	buf := make([]byte, 32)
	n, _ := lf.ReadAt(buf, 0)
	s := strings.TrimPrefix(strings.TrimSpace(string(buf[:n])), "pid ")
	digits := strings.TrimFunc(s, func(r rune) bool { return r < '0' || r > '9' })
	if digits == "" || digits != s {
		return "another process"
	}
	return "pid " + digits
}

// releaseLock removes the lock file (while still holding the lock, so no
// one can take a lock on the file being removed) and closes it.
func releaseLock(lf *os.File) {
	if lf == nil {
		return
	}
	if sameFile(lf, lf.Name()) {
		os.Remove(lf.Name())
	}
	lf.Close()
}

// Close releases the lock. The File must not be used afterwards.
func (f *File) Close() error {
	if f == nil {
		return nil
	}
	f.mu.Lock()
	defer f.mu.Unlock()
	releaseLock(f.lockFile)
	f.lockFile = nil
	return nil
}

// Path is the file the session is saved to now (it moves when a save had
// to go beside the original, or to a file the user named).
func (f *File) Path() string {
	f.mu.Lock()
	defer f.mu.Unlock()
	return f.path
}

// ReadOnly reports whether another likewind holds the lock, and which.
func (f *File) ReadOnly() (bool, string) {
	f.mu.Lock()
	defer f.mu.Unlock()
	return f.readOnly, f.holder
}

// LockError is why no lock could be taken on a file no one else holds
// (e.g. a read-only folder), or nil.
func (f *File) LockError() error {
	f.mu.Lock()
	defer f.mu.Unlock()
	return f.lockErr
}

// Refused is why the file found at open cannot be used as a session for
// these inputs (it is then never written over), or nil when there was no
// file or a usable session.
func (f *File) Refused() error {
	f.mu.Lock()
	defer f.mu.Unlock()
	return f.refused
}

// Found is the usable session read at open.
func (f *File) Found() (Session, bool) {
	f.mu.Lock()
	defer f.mu.Unlock()
	if f.found == nil {
		return Session{}, false
	}
	return *f.found, true
}

// SaveResult says where a save put the session.
type SaveResult struct {
	// Path is the file that now holds the session.
	Path string
	// Written is false when the file already held exactly this session.
	Written bool
	// Note says what else happened, for the screen: the earlier file kept
	// beside under another name, or why the session went to another file.
	Note string
}

// Save writes s to the session file, never over something it did not read:
// it reads the file again first, and when the file changed on disk since it
// was last read or written (another program wrote it), or holds something
// that is not a session for these inputs, the session goes to a new
// numbered file beside it instead (Path moves there). With keepOld (the
// session on disk was not restored), an existing session is first kept
// beside under a numbered name. A save without change writes nothing.
// Session files are written 0600.
func (f *File) Save(s Session, keepOld bool) (SaveResult, error) {
	f.mu.Lock()
	defer f.mu.Unlock()
	if f.readOnly {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %s: %w (%s); this likewind can save only to another file", f.path, ErrInUse, f.holder)
	}
	data, err := encode(s)
	if err != nil {
		return SaveResult{Path: f.path}, err
	}
	cur, exists, err := readSessionPath(f.path)
	if err != nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %s %w", f.path, err)
	}
	switch {
	case exists != f.exists || !bytes.Equal(cur, f.data):
		return f.divert(data, f.path+" changed on disk since likewind read it")
	case f.refused != nil:
		return f.divert(data, fmt.Sprintf("%s %v", f.path, f.refused))
	case exists && bytes.Equal(cur, data):
		return SaveResult{Path: f.path}, nil
	}
	var note string
	if keepOld && exists && len(cur) > 0 {
		kept, err := keepAside(f.path, cur)
		if err != nil {
			return SaveResult{Path: f.path}, fmt.Errorf("save session: cannot keep the earlier session in %s beside it: %w", f.path, err)
		}
		note = "the earlier session (not restored) is kept as " + kept
	}
	if err := writeSession(f.path, data, true); err != nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %w", err)
	}
	f.data, f.exists, f.found = data, true, nil
	return SaveResult{Path: f.path, Written: true, Note: note}, nil
}

// divert writes data to a new numbered file beside the session file, which
// is left as it is, and makes that the session file. The caller holds mu.
func (f *File) divert(data []byte, reason string) (SaveResult, error) {
	sib, err := freeSibling(f.path)
	if err != nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %s; %w", reason, err)
	}
	if err := f.switchTo(sib, data); err != nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %s; %w", reason, err)
	}
	return SaveResult{Path: sib, Written: true, Note: reason + "; it is left as it is and this session is saved to " + sib}, nil
}

// SaveAs writes s to a new file at path (a leading ~/ is the home folder)
// and makes it the session file, taking its lock. It refuses a path that
// exists: a file likewind did not read as this session is never written
// over.
func (f *File) SaveAs(path string, s Session) (SaveResult, error) {
	path = expandHome(strings.TrimSpace(path))
	if path == "" {
		return SaveResult{}, errors.New("save session: no file name given")
	}
	f.mu.Lock()
	defer f.mu.Unlock()
	if _, err := os.Lstat(path); err == nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %s exists; likewind writes a session only to a new file here, so choose another name", path)
	} else if !errors.Is(err, fs.ErrNotExist) {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %s: %w", path, err)
	}
	data, err := encode(s)
	if err != nil {
		return SaveResult{Path: f.path}, err
	}
	if err := f.switchTo(path, data); err != nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %w", err)
	}
	return SaveResult{Path: path, Written: true}, nil
}

// SaveBeside writes s to a new numbered file beside the session file and
// makes that the session file: what a read-only interface does when it
// must save without asking (a hang-up).
func (f *File) SaveBeside(s Session) (SaveResult, error) {
	f.mu.Lock()
	defer f.mu.Unlock()
	data, err := encode(s)
	if err != nil {
		return SaveResult{Path: f.path}, err
	}
	old, holder := f.path, f.holder
	sib, err := freeSibling(old)
	if err == nil {
		err = f.switchTo(sib, data)
	}
	if err != nil {
		return SaveResult{Path: f.path}, fmt.Errorf("save session: %w", err)
	}
	note := "this session is saved beside " + old
	if holder != "" {
		note = fmt.Sprintf("%s is in use by another likewind (%s), so this session is saved to %s", old, holder, sib)
	}
	return SaveResult{Path: sib, Written: true, Note: note}, nil
}

// switchTo takes the lock on the new file path, writes data there (never
// over an existing file) and makes it the session file, releasing the old
// lock. The caller holds mu.
func (f *File) switchTo(path string, data []byte) error {
	lf, holder, lockErr := takeLock(path)
	if errors.Is(lockErr, errLockHeld) {
		return fmt.Errorf("%s: %w (%s)", path, ErrInUse, holder)
	}
	// Without a lock file (a folder that refuses it) the write below says
	// what is wrong; a written file is kept even so.
	if err := writeSession(path, data, false); err != nil {
		releaseLock(lf)
		return err
	}
	releaseLock(f.lockFile)
	f.lockFile, f.lockErr = lf, lockErr
	f.path, f.data, f.exists = path, data, true
	f.readOnly, f.holder, f.refused, f.found = false, "", nil, nil
	return nil
}

// Suggest is a file name to offer for saving elsewhere: a free numbered
// name beside the session file, or, when that folder is the trouble
// (elsewhere), a free name in dir.
func (f *File) Suggest(dir string, elsewhere bool) string {
	f.mu.Lock()
	path := f.path
	f.mu.Unlock()
	if elsewhere && dir != "" {
		base := filepath.Base(path)
		if base == "." || base == string(filepath.Separator) {
			base = "likewind-session.json"
		}
		cand := filepath.Join(dir, base)
		if _, err := os.Lstat(cand); errors.Is(err, fs.ErrNotExist) {
			return cand
		}
		path = cand
	}
	if sib, err := freeSibling(path); err == nil {
		return sib
	}
	return path
}

// keepAside puts the content cur of the session file at path under a free
// numbered name beside it (a hard link, or a copy where links are not
// available), and returns that name.
func keepAside(path string, cur []byte) (string, error) {
	for range 100 {
		sib, err := freeSibling(path)
		if err != nil {
			return "", err
		}
		err = os.Link(path, sib)
		if err == nil {
			return sib, nil
		}
		if errors.Is(err, fs.ErrExist) {
			continue // taken meanwhile
		}
		if err := writeSession(sib, cur, false); err != nil {
			return "", err
		}
		return sib, nil
	}
	return "", errors.New("no free numbered name beside it")
}

// numberedPath inserts .N before the extension: session.json → session.2.json.
func numberedPath(path string, n int) string {
	ext := filepath.Ext(path)
	if strings.ContainsRune(ext, filepath.Separator) || ext == path {
		ext = ""
	}
	return fmt.Sprintf("%s.%d%s", strings.TrimSuffix(path, ext), n, ext)
}

// freeSibling is the first numbered name beside path that does not exist
// and whose lock no one holds.
func freeSibling(path string) (string, error) {
	for n := 1; n <= 999; n++ {
		p := numberedPath(path, n)
		if _, err := os.Lstat(p); !errors.Is(err, fs.ErrNotExist) {
			continue
		}
		if _, err := os.Lstat(p + ".lock"); err == nil {
			continue // perhaps another likewind saving there right now
		}
		return p, nil
	}
	return "", fmt.Errorf("no free numbered name beside %s", path)
}

// expandHome turns a leading ~/ into the home folder.
func expandHome(p string) string {
	if p == "~" || strings.HasPrefix(p, "~/") {
		if home, err := os.UserHomeDir(); err == nil {
			return filepath.Join(home, strings.TrimPrefix(p, "~"))
		}
	}
	return p
}

// writeSession writes a session file atomically and makes it 0600 (it may
// hold the marks of unreleased test plans).
func writeSession(path string, data []byte, overwrite bool) error {
	return fileout.WriteFilePrivate(path, data, overwrite)
}
