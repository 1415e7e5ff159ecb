package whatif

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strconv"
	"strings"

	"likewind/envelope"
)

// Changes holds the values changed from the files, in SI, under their
// session keys (Field.Key): Values the settings ("scale", "delta_t_K",
// "mach_tol", "re_tol", "compressibility_mach"), Facilities each
// facility's changed limits by facility name. A key that is missing is
// unchanged. It is the "what_if" object of a session file.
type Changes struct {
	Values     map[string]float64
	Facilities map[string]FacilityChanges
}

// FacilityChanges holds a facility's changed limits (SI) under their
// session keys ("p0_max_Pa", "t0_min_K", "q_max_Pa"), and its operating
// rule ("rule", the session file writing the rule's name) with the value
// a fixed rule holds ("rule_temperature_K", "rule_q_Pa").
type FacilityChanges map[string]float64

// MarshalJSON writes the settings in the table's order, then
// "facilities" (by name) when any facility has a change.
func (w Changes) MarshalJSON() ([]byte, error) {
	if _, err := json.Marshal(w.Values); err != nil { // NaN, ±Inf
		return nil, err
	}
	var b bytes.Buffer
	b.WriteByte('{')
	n, err := writeFieldValues(&b, w.Values, false)
	if err != nil {
		return nil, err
	}
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
func (f FacilityChanges) MarshalJSON() ([]byte, error) {
	if _, err := json.Marshal(map[string]float64(f)); err != nil { // NaN, ±Inf
		return nil, err
	}
	var b bytes.Buffer
	b.WriteByte('{')
	if _, err := writeFieldValues(&b, f, true); err != nil {
		return nil, err
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

// writeFieldValues writes the values of the settings (facility false) or
// facility limits held in vals as JSON members, in the table's order, and
// returns how many it wrote. Keys that are not in the table are left out.
// A choice field's value is written as its word ("rule": "least load").
func writeFieldValues(b *bytes.Buffer, vals map[string]float64, facility bool) (int, error) {
	n := 0
	for f := range FieldCount {
		v, ok := vals[f.Key()]
		if f.Facility() != facility || !ok {
			continue
		}
		if n > 0 {
			b.WriteByte(',')
		}
		num, _ := json.Marshal(v) // checked by the caller
		if f.IsChoice() {
			w, ok := f.Word(v)
			if !ok {
				return n, fmt.Errorf("what-if %s: %g is no choice", f.Key(), v)
			}
			num, _ = json.Marshal(w)
		}
		b.WriteString(strconv.Quote(f.Key()) + ":")
		b.Write(num)
		n++
	}
	return n, nil
}

// UnmarshalJSON reads the settings' keys and "facilities"; any other key
// is refused, as in the rest of the session file. A null value is
// unchanged.
func (w *Changes) UnmarshalJSON(data []byte) error {
	var raw map[string]json.RawMessage
	if err := json.Unmarshal(data, &raw); err != nil {
		return err
	}
	*w = Changes{}
	for k, v := range raw {
		if strings.EqualFold(k, "facilities") {
			if err := json.Unmarshal(v, &w.Facilities); err != nil {
				return err
			}
			continue
		}
		f, ok := ByKey(k, false)
		if !ok {
			return fmt.Errorf("unknown what-if field %q (expected %s or facilities)", k, Keys(false))
		}
		if err := readFieldValue(&w.Values, f, v); err != nil {
			return err
		}
	}
	return nil
}

// UnmarshalJSON reads a facility's limits; any other key is refused.
func (f *FacilityChanges) UnmarshalJSON(data []byte) error {
	var raw map[string]json.RawMessage
	if err := json.Unmarshal(data, &raw); err != nil {
		return err
	}
	*f = nil
	vals := map[string]float64(*f)
	for k, v := range raw {
		fl, ok := ByKey(k, true)
		if !ok {
			return fmt.Errorf("unknown facility what-if field %q (expected %s)", k, Keys(true))
		}
		if err := readFieldValue(&vals, fl, v); err != nil {
			return err
		}
	}
	*f = vals
	return nil
}

// readFieldValue decodes the number data of field f, or a choice field's
// word, into *vals under the field's key (null: nothing).
func readFieldValue(vals *map[string]float64, f Field, data json.RawMessage) error {
	var v *float64
	if c := f.row().choice; c != nil {
		var w *string
		if err := json.Unmarshal(data, &w); err != nil {
			return fmt.Errorf("what-if %s: %w", f.Key(), err)
		}
		if w != nil {
			x, err := c.read(*w)
			if err != nil {
				return fmt.Errorf("what-if %s: %w", f.Key(), err)
			}
			v = &x
		}
	} else if err := json.Unmarshal(data, &v); err != nil {
		return fmt.Errorf("what-if %s: %w", f.Key(), err)
	}
	if v == nil {
		return nil
	}
	if *vals == nil {
		*vals = map[string]float64{}
	}
	(*vals)[f.Key()] = *v
	return nil
}

// Diff lists the values of the settings set and the facilities facs that
// differ from fileSet and fileFacs (the same facilities, as the files have
// them), under their session keys. A facility is matched with the file's
// facility at the same index.
func Diff(set, fileSet envelope.Settings, facs, fileFacs []envelope.Facility) Changes {
	var w Changes
	put := func(vals *map[string]float64, f Field, v float64) {
		if *vals == nil {
			*vals = map[string]float64{}
		}
		(*vals)[f.Key()] = v
	}
	for f := range FieldCount {
		if !f.Facility() {
			if now := f.Get(&set, nil); now != f.Get(&fileSet, nil) {
				put(&w.Values, f, now)
			}
		}
	}
	for k := range min(len(facs), len(fileFacs)) {
		var fw map[string]float64
		for f := range FieldCount {
			// A value a rule does not hold now (a fixed T0 after another
			// rule was chosen) is not the facility's: not saved.
			if f.Facility() && f.Applies(&facs[k]) {
				if now := f.Get(nil, &facs[k]); now != f.Get(nil, &fileFacs[k]) {
					put(&fw, f, now)
				}
			}
		}
		if fw != nil {
			if w.Facilities == nil {
				w.Facilities = map[string]FacilityChanges{}
			}
			w.Facilities[facs[k].Name] = fw
		}
	}
	return w
}
