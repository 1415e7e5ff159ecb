package review

import (
	"bufio"
	"bytes"
	"crypto/ed25519"
	"crypto/rand"
	"encoding/pem"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"strings"

	gossh "golang.org/x/crypto/ssh"

	"likewind/envelope"
	"likewind/envelope/fileout"
)

// The options of our own naming in an authorized-keys line. Every other
// option is refused: an OpenSSH restriction such as from= that likewind
// cannot honour must not be dropped silently.
const (
	// OptRole is likewind-role=editor or likewind-role=viewer; a key
	// without it is a viewer.
	OptRole = "likewind-role"
	// OptDumps lets a viewer write text dumps of their view (w) on the
	// server; editors always may.
	OptDumps = "likewind-dumps"
)

// Reviewer is one admitted key.
type Reviewer struct {
	// Name is the key's comment, cleaned for the screen, or its
	// fingerprint when it has none.
	Name        string
	Editor      bool
	Dumps       bool // may write dumps (editors, and viewers with likewind-dumps)
	Fingerprint string
	Line        int
}

// Keys are the reviewers admitted, by public key.
type Keys struct {
	byKey map[string]Reviewer
}

// Lookup is the reviewer holding key.
func (k *Keys) Lookup(key gossh.PublicKey) (Reviewer, bool) {
	if k == nil || key == nil {
		return Reviewer{}, false
	}
	r, ok := k.byKey[string(key.Marshal())]
	return r, ok
}

// Len is how many keys are admitted.
func (k *Keys) Len() int { return len(k.byKey) }

// Editors is how many of them are editors.
func (k *Keys) Editors() int {
	n := 0
	for _, r := range k.byKey {
		if r.Editor {
			n++
		}
	}
	return n
}

// maxKeysBytes bounds an authorized-keys file.
const maxKeysBytes = 4 << 20

// LoadKeys reads an authorized-keys file in the OpenSSH format: one key a
// line ("[options] type base64 [comment]"), blank lines and # comments
// skipped. Errors name the file, the line and what was expected; the
// whole file is refused on any error, so that no key is admitted on a
// half-read file.
func LoadKeys(path string) (*Keys, error) {
	f, err := os.Open(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, fmt.Errorf("authorized keys %s not found: make it with one reviewer's public key a line "+
			"(the line of their ~/.ssh/id_ed25519.pub; %s=editor before it for those who may change the shared work), or give --authorized-keys FILE", path, OptRole)
	}
	if err != nil {
		return nil, fmt.Errorf("authorized keys: %w", err)
	}
	defer f.Close()
	data, err := readLimited(f, maxKeysBytes)
	if err != nil {
		return nil, fmt.Errorf("authorized keys %s: %w", path, err)
	}
	return ParseKeys(path, data)
}

func readLimited(f *os.File, n int64) ([]byte, error) {
	data, err := io.ReadAll(io.LimitReader(f, n+1))
	if err != nil {
		return nil, err
	}
	if int64(len(data)) > n {
		return nil, fmt.Errorf("larger than %d MiB; not an authorized-keys file", n>>20)
	}
	return data, nil
}

// ParseKeys reads authorized-keys text; name is the file for messages.
func ParseKeys(name string, data []byte) (*Keys, error) {
	k := &Keys{byKey: map[string]Reviewer{}}
	var errs []error
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 0, 64<<10), 1<<20)
	line := 0
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		where := fmt.Sprintf("%s:%d", name, line)
		pub, comment, opts, _, err := gossh.ParseAuthorizedKey([]byte(text))
		if err != nil {
			errs = append(errs, fmt.Errorf("%s: not a public key (expected [options] TYPE BASE64 [COMMENT], e.g. ssh-ed25519 AAAA... alice@lab): %v", where, err))
			continue
		}
		r := Reviewer{Name: envelope.CleanText(strings.TrimSpace(comment)), Fingerprint: gossh.FingerprintSHA256(pub), Line: line}
		if err := r.options(opts); err != nil {
			errs = append(errs, fmt.Errorf("%s: %w", where, err))
			continue
		}
		if r.Name == "" {
			r.Name = r.Fingerprint
		}
		if prev, dup := k.byKey[string(pub.Marshal())]; dup {
			errs = append(errs, fmt.Errorf("%s: the key of line %d again (%s); give each key once", where, prev.Line, r.Fingerprint))
			continue
		}
		k.byKey[string(pub.Marshal())] = r
	}
	if err := sc.Err(); err != nil {
		errs = append(errs, fmt.Errorf("%s: %w", name, err))
	}
	if len(errs) > 0 {
		return nil, errors.Join(errs...)
	}
	if len(k.byKey) == 0 {
		return nil, fmt.Errorf("%s: no keys; add a reviewer's public key a line, with likewind-role=editor for those who may change the shared work", name)
	}
	return k, nil
}

// options reads a key line's options.
func (r *Reviewer) options(opts []string) error {
	role := ""
	for _, o := range opts {
		name, value, hasValue := strings.Cut(o, "=")
		value = strings.Trim(value, `"`)
		switch strings.ToLower(name) {
		case OptRole:
			if role != "" {
				return fmt.Errorf("%s given twice", OptRole)
			}
			switch value {
			case "editor", "viewer":
				role = value
			default:
				return fmt.Errorf("%s=%q: expected editor or viewer", OptRole, envelope.CleanText(value))
			}
		case OptDumps:
			if hasValue {
				return fmt.Errorf("%s takes no value", OptDumps)
			}
			r.Dumps = true
		default:
			return fmt.Errorf("option %q is not one likewind serve knows (only %s=editor|viewer and %s); remove it, likewind cannot honour it",
				envelope.CleanText(o), OptRole, OptDumps)
		}
	}
	r.Editor = role == "editor"
	r.Dumps = r.Dumps || r.Editor
	return nil
}

// HostKey is the server's key: read from path, or made (ed25519) and
// written there 0600 on first start. A key file others may read or
// write is refused: whoever can read it can pose as this server.
func HostKey(path string) (gossh.Signer, bool, error) {
	data, err := os.ReadFile(path)
	made := false
	switch {
	case errors.Is(err, fs.ErrNotExist):
		_, priv, gerr := ed25519.GenerateKey(rand.Reader)
		if gerr != nil {
			return nil, false, fmt.Errorf("host key: %w", gerr)
		}
		block, merr := gossh.MarshalPrivateKey(priv, "likewind review host key")
		if merr != nil {
			return nil, false, fmt.Errorf("host key: %w", merr)
		}
		data = pem.EncodeToMemory(block)
		if werr := fileout.WriteFilePrivate(path, data, false); werr != nil {
			return nil, false, fmt.Errorf("host key: %w", werr)
		}
		made = true
	case err != nil:
		return nil, false, fmt.Errorf("host key: %w", err)
	default:
		st, serr := os.Stat(path)
		if serr != nil {
			return nil, false, fmt.Errorf("host key: %w", serr)
		}
		if st.Mode().Perm()&0o077 != 0 {
			return nil, false, fmt.Errorf("host key %s has mode %04o: others may read it; chmod 600 %s (or remove it for a new key, which reviewers must then check again)",
				path, st.Mode().Perm(), path)
		}
	}
	signer, err := gossh.ParsePrivateKey(data)
	if err != nil {
		return nil, false, fmt.Errorf("host key %s: %w", path, err)
	}
	return signer, made, nil
}
