package envelope

import (
	"bytes"
	"errors"
	"io/fs"
	"strings"
	"testing"
)

// TestCleanText states the escape of each kind of unsafe character.
func TestCleanText(t *testing.T) {
	tests := []struct{ in, want string }{
		{"Kellen Fold cryogenic tunnel", "Kellen Fold cryogenic tunnel"},
		{"Ærø Überschall 1,5 m — Mach 0,8 °C µ", "Ærø Überschall 1,5 m — Mach 0,8 °C µ"},
		{"\x1b]0;owned\x07", `\x1b]0;owned\x07`},
		{"\x1b[2Jwiped", `\x1b[2Jwiped`},
		{"two\nlines\r\tand tab", `two\nlines\r\tand tab`},
		{"back\bspace\x00nul\x7fdel", `back\x08space\x00nul\x7fdel`},
		{"c1 \u009b31m csi \u0085 nel", `c1 \u009b31m csi \u0085 nel`},
		{"bidi \u202eabc\u202c \u2066x\u2069 \u200e\u200f\u061c", `bidi \u202eabc\u202c \u2066x\u2069 \u200e\u200f\u061c`},
		{"line\u2028para\u2029", `line\u2028para\u2029`},
		{"bad \xff\xc3 utf8", `bad \xff\xc3 utf8`},
		{"replacement \ufffd stays", "replacement \ufffd stays"},
	}
	for _, tt := range tests {
		if got := CleanText(tt.in); got != tt.want {
			t.Errorf("CleanText(%q) = %q, want %q", tt.in, got, tt.want)
		}
	}
	if got, want := CleanLines("a\x1b[1m\nb\tc\r"), "a\\x1b[1m\nb\tc\\r"; got != want {
		t.Errorf("CleanLines = %q, want %q (newline and tab kept)", got, want)
	}
}

// TestCleanWriter: what passes through holds no control character other
// than newline and tab.
func TestCleanWriter(t *testing.T) {
	var b bytes.Buffer
	n, err := CleanWriter{&b}.Write([]byte("likewind: open \x1b[2J.toml: no such file\n"))
	if err != nil || n != 39 {
		t.Fatalf("Write = %d, %v; want 39, nil", n, err)
	}
	if got, want := b.String(), "likewind: open \\x1b[2J.toml: no such file\n"; got != want {
		t.Errorf("CleanWriter wrote %q, want %q", got, want)
	}
}

// TestErrorsEchoOutsideTextCleanly: a file name, an unknown key and a
// missing file's name are echoed escaped in error messages.
func TestErrorsEchoOutsideTextCleanly(t *testing.T) {
	src := "[vehicle]\n\"sp\\u001b[2Jan\" = \"24 m\"\n"
	_, err := ParseVehicle("hostile\x1b]0;x\x07.toml", []byte(src))
	if err == nil {
		t.Fatal("ParseVehicle accepted a bad file")
	}
	msg := err.Error()
	for _, want := range []string{`hostile\x1b]0;x\x07.toml:2: vehicle.sp\x1b[2Jan: found unknown key "sp\x1b[2Jan"`} {
		if !strings.Contains(msg, want) {
			t.Errorf("error %q does not contain %q", msg, want)
		}
	}
	if strings.ContainsAny(msg, "\x1b\x07") {
		t.Errorf("error %q holds raw control characters", msg)
	}
	_, err = LoadVehicle("/nonexistent/\x1b[2J.toml")
	if !errors.Is(err, fs.ErrNotExist) || strings.Contains(err.Error(), "\x1b") || !strings.Contains(err.Error(), `\x1b[2J.toml`) {
		t.Errorf("LoadVehicle(missing hostile name) = %v, want the name escaped and fs.ErrNotExist", err)
	}
}
