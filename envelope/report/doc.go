// Package report turns an evaluation (envelope.Evaluation, envelope.Map)
// into material for design reviews: the per-point export (ExportRecord,
// WriteExportCSV, WriteExportJSON), the coverage report (NewCoverage), run
// lists in facility order (PlanRuns, PlanAll, RunRecord) and the pictures
// (MapChart, ReMachChart, rendered as PNG or SVG with gonum/plot).
//
// It reads the engine only through envelope's exported API and computes no
// physics of its own. Values are SI at full precision; names and file names
// from outside pass through envelope.CleanText where they enter an output.
// The CSV columns of each record type are derived from its fields' JSON
// keys (a `csv` tag names a column the JSON does not carry): a new field
// with a JSON tag is a new column in both. The engine package envelope does
// not import a plotting library; the pictures live here.
package report
