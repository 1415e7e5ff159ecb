// Package report turns an evaluation (envelope.Evaluation, envelope.Map)
// into material for design reviews: the per-point export (ExportRecord,
// WriteExportCSV, WriteExportJSON), the coverage report (NewCoverage),
// run lists in facility order (PlanRuns, RunRecords) and the pictures
// (MapChart, ReMachChart, rendered as PNG or SVG).
//
// It reads the engine only through envelope's exported API and computes no
// physics of its own. Every value is SI at full precision; names and file
// names from outside pass through envelope.CleanText where they enter an
// output. CSV columns are derived from the JSON keys of each record type
// (csvTable), so the two cannot drift apart. The engine package envelope
// does not import a plotting library: the pictures live here.
package report
