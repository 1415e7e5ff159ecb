package tui

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"slices"
	"strings"

	"likewind/envelope"
	"likewind/envelope/whatif"
)

// SessionVersion is the version written into session files.
const SessionVersion = 1

// Session is the state of an interactive session that survives a restart:
// what-if values, marked test points, the chosen facility, layer and
// units. It records the input file names and a hash of their content so a
// session is never applied to different data.
type Session struct {
	Version int      `json:"version"`
	Inputs  []string `json:"inputs"`
	Hash    string   `json:"hash"`

	// Facility is the chosen facility's name; empty with BestOfAll.
	Facility  string `json:"facility,omitempty"`
	BestOfAll bool   `json:"best_of_all,omitempty"`
	Layer     string `json:"layer"`
	Units     string `json:"units"`

	WhatIf whatif.Changes `json:"what_if"`
	Marks  []Point        `json:"marks,omitempty"`
	Cursor *Point         `json:"cursor,omitempty"`
}

// Point is a grid point by its altitude (m, as the grid holds it) and its
// speed in the grid's speed kind (Mach, or m/s).
type Point struct {
	Altitude float64 `json:"altitude_m"`
	Speed    float64 `json:"speed"`
}

// ErrSessionMismatch is wrapped by CheckSession when a session belongs to
// other input files.
var ErrSessionMismatch = errors.New("session belongs to different input files")

// DataHash is a content hash of loaded vehicle and facility data. It is
// the default session hash when the caller does not hash the files.
func DataHash(v *envelope.Vehicle, facs []envelope.Facility) string {
	h := sha256.New()
	enc := json.NewEncoder(h)
	// Encoding plain structs of numbers and strings cannot fail.
	_ = enc.Encode(v)
	_ = enc.Encode(facs)
	return "sha256:" + hex.EncodeToString(h.Sum(nil))
}

// HashFiles hashes the contents of the input files, in order.
func HashFiles(paths ...string) (string, error) {
	h := sha256.New()
	for _, p := range paths {
		data, err := os.ReadFile(p)
		if err != nil {
			return "", fmt.Errorf("hash input file: %w", err)
		}
		fmt.Fprintf(h, "%d\n", len(data))
		h.Write(data)
	}
	return "sha256:" + hex.EncodeToString(h.Sum(nil)), nil
}

// CheckSession reports whether s was saved for the same input data.
func CheckSession(s Session, inputs []string, hash string) error {
	if s.Version != SessionVersion {
		return fmt.Errorf("session version %d not supported (expected %d)", s.Version, SessionVersion)
	}
	if s.Hash != hash {
		return fmt.Errorf("%w: saved for %s, now %s", ErrSessionMismatch,
			nameList(s.Inputs), nameList(inputs))
	}
	return nil
}

func nameList(names []string) string {
	if len(names) == 0 {
		return "built-in demo data"
	}
	return envelope.CleanText(strings.Join(names, ", "))
}

// LoadSession reads a session file. A folder, link or special file, or a
// file that is not a session, is refused with an error naming the file.
func LoadSession(path string) (Session, error) {
	data, exists, err := readSessionPath(path)
	if err == nil && !exists {
		err = fs.ErrNotExist
	}
	if err != nil {
		return Session{}, fmt.Errorf("load session %s: %w", path, err)
	}
	s, err := parseSession(data)
	if err != nil {
		return Session{}, fmt.Errorf("load session %s: %w", path, err)
	}
	return s, nil
}

// parseSession decodes a session file's content.
func parseSession(data []byte) (Session, error) {
	var s Session
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&s); err != nil {
		return Session{}, err
	}
	if dec.More() {
		return Session{}, errors.New("text after the session object")
	}
	if s.Version != SessionVersion {
		return Session{}, fmt.Errorf("version %d not supported (expected %d)", s.Version, SessionVersion)
	}
	return s, nil
}

// encodeSession is the content of a session file for s.
func encodeSession(s Session) ([]byte, error) {
	s.Version = SessionVersion
	s.Marks = slices.Clone(s.Marks)
	data, err := json.MarshalIndent(s, "", "  ")
	if err != nil {
		return nil, fmt.Errorf("save session: %w", err)
	}
	return append(data, '\n'), nil
}

// SaveSession writes s to path atomically with fileout.WriteFilePrivate
// (a synced temporary file in the same folder, mode 0600, renamed over path),
// so a crash never leaves a half-written session. It replaces
// whatever is at path: the interface saves through a SessionFile instead,
// which never writes over what it did not read.
func SaveSession(path string, s Session) error {
	if path == "" {
		return errors.New("save session: no session file given")
	}
	data, err := encodeSession(s)
	if err != nil {
		return err
	}
	if err := writeSession(path, data, true); err != nil {
		return fmt.Errorf("save session: %w", err)
	}
	return nil
}

// SnapPoint finds the grid point of a saved point: the altitude and speed
// each within half a grid step of an axis value. It reports false when
// the point is no longer on the grid (the grid or ΔT changed).
func SnapPoint(g *envelope.Grid, p Point) (envelope.GridPoint, bool) {
	if g == nil {
		return envelope.GridPoint{}, false
	}
	i, ok1 := nearestIndex(g.Alts, p.Altitude)
	j, ok2 := nearestIndex(g.Speeds, p.Speed)
	if !ok1 || !ok2 {
		return envelope.GridPoint{}, false
	}
	return envelope.GridPoint{Row: i, Col: j}, true
}

// SnapMarks puts saved marks on the grid with SnapPoint, in their saved
// order without repeats, and counts those no longer on the grid.
func SnapMarks(g *envelope.Grid, pts []Point) (marks []envelope.GridPoint, lost int) {
	seen := map[envelope.GridPoint]bool{}
	for _, p := range pts {
		gp, ok := SnapPoint(g, p)
		if !ok {
			lost++
			continue
		}
		if !seen[gp] {
			seen[gp] = true
			marks = append(marks, gp)
		}
	}
	return marks, lost
}

// CheckSessionInputs accepts a session saved for the same data as the
// input files (their content hash, HashFiles) or as the loaded vehicle
// and facilities (DataHash: the built-in demo, or a session hashed that
// way). It returns CheckSession's reason otherwise.
func CheckSessionInputs(s Session, files []string, v *envelope.Vehicle, facs []envelope.Facility) error {
	var hashes []string
	if len(files) > 0 {
		if h, err := HashFiles(files...); err == nil {
			hashes = append(hashes, h)
		}
	}
	hashes = append(hashes, DataHash(v, facs))
	var err error
	for _, h := range hashes {
		if err = CheckSession(s, files, h); err == nil {
			return nil
		}
	}
	return err
}
