// Package tui is the terminal interface of likewind: a keyboard-driven
// view of a vehicle's altitude–speed envelope as a matrix, with the flight
// conditions and the facility answer of the point under the cursor,
// what-if editing of settings and facility limits, marked test points and
// a session that survives restarts. It also holds the matrix renderer and
// the text dump, plain functions that `likewind dump` uses without Bubble
// Tea.
//
// New builds the root model and Run runs it; the session is kept through
// a session.File (envelope/session). The root composes components
// (picker, what-if editor, details, save-as question; see component.go)
// that own their keys and report what the user chose; the keys are in one
// KeyMap and the styles in one Styles. Each what-if value is one row of
// the field table of envelope/whatif, which the editor, the header and
// the session file all use; values are shown in an envelope/units system.
// Recomputes run in commands and return typed messages; View draws
// stored state.
//
// Results are planning estimates. Pressure vessels, cryogenic nitrogen and
// model loads need the facility's own procedures, local codes and licensed
// engineering practice.
package tui
