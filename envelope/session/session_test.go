package session

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"likewind/envelope/units"
	"likewind/envelope/whatif"
)

func TestSessionRoundTripFile(t *testing.T) {
	want := Session{
		Version:   Version,
		Inputs:    []string{"a.toml", "b.toml"},
		Hash:      "sha256:abc",
		Facility:  "Tunnel",
		Layer:     "tunnel q / limit",
		Units:     units.Customary.String(),
		WhatIf:    whatif.Changes{Values: map[string]float64{"scale": 0.05, "delta_t_K": -10}, Facilities: map[string]whatif.FacilityChanges{"Tunnel": {"p0_max_Pa": 3e5, "q_max_Pa": 0}}},
		Marks:     []Point{{Altitude: 1000, Speed: 0.8}, {Altitude: 2000, Speed: 0.9}},
		Cursor:    &Point{Altitude: 1000, Speed: 0.8},
		BestOfAll: false,
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "session.json")
	if err := Save(path, want); err != nil {
		t.Fatal(err)
	}
	got, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("Load = %+v, want %+v", got, want)
	}
	// Overwrite, and no temporary file is left behind.
	want.Marks = nil
	if err := Save(path, want); err != nil {
		t.Fatal(err)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("files in the session folder = %v, want only session.json", names)
	}
}

func TestSaveSessionErrors(t *testing.T) {
	if err := Save("", Session{}); err == nil {
		t.Errorf("Save(\"\") = nil, want an error")
	}
	bad := filepath.Join(t.TempDir(), "missing", "s.json")
	if err := Save(bad, Session{}); err == nil || !strings.Contains(err.Error(), "save session") {
		t.Errorf("Save into a missing folder = %v, want a wrapped error", err)
	}
}

func TestLoadSessionRefusesBadFiles(t *testing.T) {
	dir := t.TempDir()
	cases := map[string]string{
		"not json":      "{version: 1",
		"wrong version": `{"version": 99, "inputs": [], "hash": "", "layer": "", "units": "SI", "what_if": {}}`,
		"unknown field": `{"version": 1, "colour": "red"}`,
	}
	for name, body := range cases {
		p := filepath.Join(dir, strings.ReplaceAll(name, " ", "_")+".json")
		if err := os.WriteFile(p, []byte(body), 0o600); err != nil {
			t.Fatal(err)
		}
		if _, err := Load(p); err == nil {
			t.Errorf("%s: Load = nil error, want a refusal", name)
		}
	}
	if _, err := Load(filepath.Join(dir, "none.json")); err == nil {
		t.Errorf("missing file: Load = nil error")
	}
}
