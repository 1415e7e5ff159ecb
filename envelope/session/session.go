package session

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"slices"

	"likewind/envelope/whatif"
)

// Version is the version written into session files.
const Version = 1

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

// Load reads a session file. A folder, link or special file, or a
// file that is not a session, is refused with an error naming the file.
func Load(path string) (Session, error) {
	data, exists, err := readSessionPath(path)
	if err == nil && !exists {
		err = fs.ErrNotExist
	}
	if err != nil {
		return Session{}, fmt.Errorf("load session %s: %w", path, err)
	}
	s, err := parse(data)
	if err != nil {
		return Session{}, fmt.Errorf("load session %s: %w", path, err)
	}
	return s, nil
}

// parse decodes a session file's content.
func parse(data []byte) (Session, error) {
	var s Session
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&s); err != nil {
		return Session{}, err
	}
	if dec.More() {
		return Session{}, errors.New("text after the session object")
	}
	if s.Version != Version {
		return Session{}, fmt.Errorf("version %d not supported (expected %d)", s.Version, Version)
	}
	return s, nil
}

// encode is the content of a session file for s.
func encode(s Session) ([]byte, error) {
	s.Version = Version
	s.Marks = slices.Clone(s.Marks)
	data, err := json.MarshalIndent(s, "", "  ")
	if err != nil {
		return nil, fmt.Errorf("save session: %w", err)
	}
	return append(data, '\n'), nil
}

// Save writes s to path atomically with fileout.WriteFilePrivate
// (a synced temporary file in the same folder, mode 0600, renamed over path),
// so a crash never leaves a half-written session. It replaces
// whatever is at path: the interface saves through a File instead, which
// never writes over what it did not read.
func Save(path string, s Session) error {
	if path == "" {
		return errors.New("save session: no session file given")
	}
	data, err := encode(s)
	if err != nil {
		return err
	}
	if err := writeSession(path, data, true); err != nil {
		return fmt.Errorf("save session: %w", err)
	}
	return nil
}
