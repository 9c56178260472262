// Package report writes the results of an analysis (package
// envelope/analysis) in each output format, one file per format: terminal
// tables (text.go), JSON (json.go), CSV (csv.go), one self-contained HTML
// page (html.go) with the frame and its envelopes drawn in SVG (svg.go);
// and the listings that go with them: the combinations of a job
// (combos.go), what a model describes (check.go), the comparison of
// pattern arrangements (compare.go), the cross-check by moment
// distribution (crosscheck.go) and the verification suite (verify.go).
// The page echoes the model as analysed (input.go: nodes, members,
// sections, each case's loads as entered and as applied, a loading
// drawing per case); the JSON, the page and a CSV of their own give the
// unfactored results of each load case (cases.go). A [Source] given with
// [Report.From] (provenance.go: govern's version, the model file's name
// and SHA-256, the run date, the [project] fields, the loads as entered)
// is carried by every file.
//
// The design values (per floor, column line and the other members; the
// supports with column faces; the deflections of spans and cantilevers;
// the reactions; the statics check) are formed once as [Table]s
// (design.go) and rendered by the terminal and the HTML page alike. Every
// number is formatted in format.go (the JSON's and CSV's ten digits by
// digits.go, strconv's bytes, faster); text from the model reaches the
// terminal only through [Escape] (escape.go); CSV cells that a spreadsheet
// would take for formulas are written as text.
//
// # Units and signs
//
// Forces, moments and deflections are shown in the job's output units
// (analysis.Units.Output; by default the model's own: forces in its force
// unit, moments in force·length, deflections in its length unit), through
// one factor each (analysis.Units.Shown) applied where the number is
// written; distances and positions stay in the model's length unit. Every
// column of a number has its unit in its header, and the JSON and CSV
// state theirs (the JSON's units, the CSV's unit column and headers). The terminal tables and the page show each beam or
// rafter from its left end, +M sagging and deflections positive up
// (analysis.Result.Shown), and columns from their start node with M
// positive with their local −y face in tension; the JSON and the CSV keep
// each member's own axes (package frame's conventions); reactions are
// global. docs/output.md describes every format.
//
// # What is never mutated
//
// The writers read the result and the job and never modify them; the
// writers of one [Report] may run at once. The same result (and source,
// whose run date is given, not read from the clock) always gives the same
// bytes. Every output carries the caution ([Caution]).
package report
