package review

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestParseKeysRolesAndComments(t *testing.T) {
	ed, vw, dm := newTestKey(t, "ed@lab"), newTestKey(t, "vw@lab"), newTestKey(t, "dm@lab")
	text := "# reviewers of the demo\n\n" +
		ed.line("likewind-role=editor") + "\n" +
		vw.line(`likewind-role="viewer"`) + "\n" +
		dm.line("likewind-dumps") + "\n"
	k, err := ParseKeys("keys", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	if k.Len() != 3 || k.Editors() != 1 {
		t.Errorf("Len %d, Editors %d; want 3 keys, 1 editor", k.Len(), k.Editors())
	}
	cases := []struct {
		key           testKey
		editor, dumps bool
	}{
		{ed, true, true},   // editors may always write dumps
		{vw, false, false}, // a viewer only with likewind-dumps
		{dm, false, true},  // no role: a viewer
	}
	for _, c := range cases {
		r, ok := k.Lookup(c.key.signer.PublicKey())
		if !ok {
			t.Errorf("%s not found", c.key.comment)
			continue
		}
		if r.Name != c.key.comment || r.Editor != c.editor || r.Dumps != c.dumps {
			t.Errorf("%s: %+v; want editor %v, dumps %v", c.key.comment, r, c.editor, c.dumps)
		}
	}
	if _, ok := k.Lookup(newTestKey(t, "x").signer.PublicKey()); ok {
		t.Error("a key not in the file was found")
	}
}

func TestParseKeysHostileCommentCleaned(t *testing.T) {
	k1 := newTestKey(t, "eve\x1b[2J\u202eevil")
	k, err := ParseKeys("keys", []byte(k1.line("likewind-role=editor")))
	if err != nil {
		t.Fatal(err)
	}
	r, _ := k.Lookup(k1.signer.PublicKey())
	if strings.ContainsAny(r.Name, "\x1b\u202e") {
		t.Errorf("name %q keeps control or bidi characters", r.Name)
	}
	if !strings.HasPrefix(r.Name, "eve") {
		t.Errorf("name %q lost the printable part", r.Name)
	}
}

func TestParseKeysNoCommentUsesFingerprint(t *testing.T) {
	k1 := newTestKey(t, "")
	k, err := ParseKeys("keys", []byte(k1.line("")))
	if err != nil {
		t.Fatal(err)
	}
	r, _ := k.Lookup(k1.signer.PublicKey())
	if !strings.HasPrefix(r.Name, "SHA256:") {
		t.Errorf("name of a key without comment = %q, want its fingerprint", r.Name)
	}
}

func TestParseKeysErrorsNameLineAndWhat(t *testing.T) {
	good := newTestKey(t, "ok@lab")
	cases := []struct {
		name, text, want string
	}{
		{"not a key", good.line("") + "\nssh-ed25519 notbase64 x\n", "keys:2: not a public key"},
		{"bad role", good.line("likewind-role=admin"), `keys:1: likewind-role="admin": expected editor or viewer`},
		{"role twice", good.line("likewind-role=editor,likewind-role=viewer"), "keys:1: likewind-role given twice"},
		{"openssh option", good.line(`from="10.0.0.0/8"`), "keys:1: option"},
		{"dumps value", good.line("likewind-dumps=yes"), "keys:1: likewind-dumps takes no value"},
		{"duplicate", good.line("") + "\n" + good.line("likewind-role=editor"), "keys:2: the key of line 1 again"},
		{"empty", "# nobody yet\n", "keys: no keys"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseKeys("keys", []byte(c.text))
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("error = %v, want it to contain %q", err, c.want)
			}
		})
	}
}

func TestHostKeyMadeOnceAndPrivate(t *testing.T) {
	path := filepath.Join(t.TempDir(), "host")
	s1, made, err := HostKey(path)
	if err != nil || !made {
		t.Fatalf("first HostKey: made %v, %v", made, err)
	}
	st, err := os.Stat(path)
	if err != nil || st.Mode().Perm() != 0o600 {
		t.Fatalf("host key file: %v, mode %v; want 0600", err, st.Mode().Perm())
	}
	s2, made, err := HostKey(path)
	if err != nil || made {
		t.Fatalf("second HostKey: made %v, %v; want the same key read back", made, err)
	}
	if Fingerprint(s1) != Fingerprint(s2) || !strings.HasPrefix(Fingerprint(s1), "SHA256:") {
		t.Errorf("fingerprints %s and %s; want one SHA256 fingerprint", Fingerprint(s1), Fingerprint(s2))
	}
	if err := os.Chmod(path, 0o644); err != nil {
		t.Fatal(err)
	}
	if _, _, err := HostKey(path); err == nil || !strings.Contains(err.Error(), "chmod 600") {
		t.Errorf("a host key others may read: %v; want it refused", err)
	}
}

func TestIsLoopback(t *testing.T) {
	for addr, want := range map[string]bool{
		"127.0.0.1:2290": true, "[::1]:22": true, "localhost:22": true, "127.8.0.1:1": true,
		"0.0.0.0:2290": false, ":2290": false, "192.168.1.20:22": false, "lab-host:22": false, "nonsense": false,
	} {
		if got := IsLoopback(addr); got != want {
			t.Errorf("IsLoopback(%q) = %v, want %v", addr, got, want)
		}
	}
}

func TestLoadKeysMissingFileSaysWhatToDo(t *testing.T) {
	_, err := LoadKeys(filepath.Join(t.TempDir(), "authorized_keys"))
	if err == nil || !strings.Contains(err.Error(), "not found: make it") || !strings.Contains(err.Error(), "likewind-role=editor") {
		t.Errorf("LoadKeys of a missing file: %v; want how to make it", err)
	}
}
