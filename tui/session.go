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
	"strconv"
	"strings"

	"likewind/envelope"
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

	WhatIf WhatIf  `json:"what_if"`
	Marks  []Point `json:"marks,omitempty"`
	Cursor *Point  `json:"cursor,omitempty"`
}

// WhatIf holds the values changed from the files, in SI, under their
// session keys (the what-if field table, fields.go): Values the settings
// ("scale", "delta_t_K", "mach_tol", "re_tol", "compressibility_mach"),
// Facilities each facility's changed limits by facility name. A key that
// is missing is unchanged.
type WhatIf struct {
	Values     map[string]float64
	Facilities map[string]FacilityWhatIf
}

// FacilityWhatIf holds a facility's changed limits (SI) under their
// session keys ("p0_max_Pa", "t0_min_K", "q_max_Pa").
type FacilityWhatIf map[string]float64

// MarshalJSON writes the settings in the table's order, then
// "facilities" (by name) when any facility has a change.
func (w WhatIf) MarshalJSON() ([]byte, error) {
	if _, err := json.Marshal(w.Values); err != nil { // NaN, ±Inf
		return nil, err
	}
	var b bytes.Buffer
	b.WriteByte('{')
	n := writeFieldValues(&b, w.Values, false)
	if len(w.Facilities) > 0 {
		if n > 0 {
			b.WriteByte(',')
		}
		facs, err := json.Marshal(w.Facilities)
		if err != nil {
			return nil, err
		}
		b.WriteString(`"facilities":`)
		b.Write(facs)
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

// MarshalJSON writes the limits in the table's order.
func (f FacilityWhatIf) MarshalJSON() ([]byte, error) {
	if _, err := json.Marshal(map[string]float64(f)); err != nil { // NaN, ±Inf
		return nil, err
	}
	var b bytes.Buffer
	b.WriteByte('{')
	writeFieldValues(&b, f, true)
	b.WriteByte('}')
	return b.Bytes(), nil
}

// writeFieldValues writes the values of the settings (facility false) or
// facility limits held in vals as JSON members, in the table's order, and
// returns how many it wrote. Keys that are not in the table are left out.
func writeFieldValues(b *bytes.Buffer, vals map[string]float64, facility bool) int {
	n := 0
	for f := range fieldCount {
		d := f.def()
		v, ok := vals[d.key]
		if d.facility != facility || !ok {
			continue
		}
		if n > 0 {
			b.WriteByte(',')
		}
		num, _ := json.Marshal(v) // checked by the caller
		b.WriteString(strconv.Quote(d.key) + ":")
		b.Write(num)
		n++
	}
	return n
}

// UnmarshalJSON reads the settings' keys and "facilities"; any other key
// is refused, as in the rest of the session file. A null value is
// unchanged.
func (w *WhatIf) UnmarshalJSON(data []byte) error {
	var raw map[string]json.RawMessage
	if err := json.Unmarshal(data, &raw); err != nil {
		return err
	}
	*w = WhatIf{}
	for k, v := range raw {
		if strings.EqualFold(k, "facilities") {
			if err := json.Unmarshal(v, &w.Facilities); err != nil {
				return err
			}
			continue
		}
		f, ok := fieldByKey(k, false)
		if !ok {
			return fmt.Errorf("unknown what-if field %q (expected %s or facilities)", k, fieldKeys(false))
		}
		if err := readFieldValue(&w.Values, f, v); err != nil {
			return err
		}
	}
	return nil
}

// UnmarshalJSON reads a facility's limits; any other key is refused.
func (f *FacilityWhatIf) UnmarshalJSON(data []byte) error {
	var raw map[string]json.RawMessage
	if err := json.Unmarshal(data, &raw); err != nil {
		return err
	}
	*f = nil
	vals := map[string]float64(*f)
	for k, v := range raw {
		fl, ok := fieldByKey(k, true)
		if !ok {
			return fmt.Errorf("unknown facility what-if field %q (expected %s)", k, fieldKeys(true))
		}
		if err := readFieldValue(&vals, fl, v); err != nil {
			return err
		}
	}
	*f = vals
	return nil
}

// readFieldValue decodes the number data of field f into *vals under the
// field's key (null: nothing).
func readFieldValue(vals *map[string]float64, f field, data json.RawMessage) error {
	var v *float64
	if err := json.Unmarshal(data, &v); err != nil {
		return fmt.Errorf("what-if %s: %w", f.def().key, err)
	}
	if v == nil {
		return nil
	}
	if *vals == nil {
		*vals = map[string]float64{}
	}
	(*vals)[f.def().key] = *v
	return nil
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
