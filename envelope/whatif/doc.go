// Package whatif declares the values a user can change without editing
// files: the model scale, ΔT of the day, the Mach and Reynolds tolerances,
// the compressibility threshold, and a facility's p0 max, T0 min and q max,
// its operating rule and the value a fixed rule holds.
//
// Each is one row of one table (fields.go), named by a Field: its labels,
// its session key, where its starting value comes from, how it is read
// and written in envelope.Settings or envelope.Facility, its parser and
// bound (shared with the files and the command line, envelope/bounds.go),
// an optional check against the other settings and how it is shown.
// The interface's editor and header, the session file and the command
// line's --session all work from that row: Field.Parse reads a typed value,
// Field.Check a stored one; Changes is the set of values changed from the
// files as a session file holds it (Diff makes it, Apply applies it).
//
// Values are SI; typed text takes units, a bare number the field's unit in
// the display unit system (envelope/units). A choice field (the operating
// rule) takes one of the words it offers (Field.Choices); its value is the
// engine's, and the session file writes its word. The value a fixed rule
// holds is a field only while that rule is chosen (Field.Applies).
// CheckEdits checks edits applied together, the facility's rule with the
// engine's own check.
package whatif
