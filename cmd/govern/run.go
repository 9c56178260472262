package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
	"govern/envelope/report"
	"govern/envelope/report/files"
	"govern/frame"
)

type runFlags struct {
	json, csv       string
	designCSV       string
	casesCSV        string
	report, out     string
	comparePatterns bool
	crossCheck      bool
	quiet           bool
	acceptIll       bool
	strict          bool
	wide            bool
	date            string
}

// options returns the analysis options the flags ask for, with progress
// shown on p (nil for none).
func (f *runFlags) options(p *progress) analysis.Options {
	opt := analysis.Options{Solver: frame.Options{AcceptIllConditioned: f.acceptIll}}
	if p != nil {
		opt.Progress = p.track
	}
	return opt
}

func (f *runFlags) add(fs *flag.FlagSet) {
	fs.StringVar(&f.json, "json", "", "write the envelopes as JSON to `FILE` (- for standard output)")
	fs.StringVar(&f.csv, "csv", "", "write the envelopes as CSV to `FILE` (- for standard output), one row per member, station and effect")
	fs.StringVar(&f.casesCSV, "cases-csv", "", "write the unfactored results of every load case as CSV to `FILE` (- for standard output): reactions, member end forces and node displacements, one value a row")
	fs.StringVar(&f.designCSV, "design-csv", "", "write the design values as CSV to `FILE` (- for standard output), one row per member: a beam's moments and shears at its supports' faces, at d from them and in the span, a column's N and M with its end moments M1, M2")
	fs.StringVar(&f.report, "report", "", "write a report as one self-contained HTML page to `FILE` (- for standard output): the frame and its envelopes drawn, tables floor by floor, reactions, combinations, statics check")
	fs.StringVar(&f.out, "out", "", "write "+reportName+", "+jsonName+", "+csvName+" and "+casesName+" together into the folder `DIR` (made if missing)")
	fs.BoolVar(&f.comparePatterns, "compare-patterns", false, "report how far the code pattern arrangements fall short of exact placement, member by member, instead of the envelopes")
	fs.BoolVar(&f.quiet, "quiet", false, "print nothing on success: no tables, no progress line (files are still written)")
	fs.BoolVar(&f.crossCheck, "cross-check", false, "solve every case again by moment distribution and print the largest difference in member end moments")
	fs.BoolVar(&f.wide, "wide", false, fmt.Sprintf("print the tables as wide as their columns make them, instead of splitting those wider than %d characters", report.TextWidth))
	fs.BoolVar(&f.strict, "strict", false, "treat every warning as an error: a model with numbers that look like a slip of units, or an ill-conditioned stiffness matrix, gives no results")
	fs.StringVar(&f.date, "date", "", "give every output this run `DATE` (YYYY-MM-DD, or YYYY-MM-DDThh:mm:ssZ in UTC) instead of the time now, so that a run gives the same bytes again; without it SOURCE_DATE_EPOCH (seconds since 1970) is used when set")
	fs.BoolVar(&f.acceptIll, "accept-ill-conditioned", false, fmt.Sprintf("solve a model whose stiffness matrix has an estimated condition number above %.0e (fewer than three correct digits left), which is refused otherwise; every output then carries the estimate", frame.RefuseCond))
}

var cmdRun = &command{
	name:  "run",
	usage: "[--json FILE] [--csv FILE] [--cases-csv FILE] [--design-csv FILE] [--report FILE.html | --out DIR] [--quiet] [--wide] [--compare-patterns] [--cross-check] [--strict] [--accept-ill-conditioned] [--date DATE] MODEL.toml",
	short: "analyse a model and report its envelopes",
	long: fmt.Sprintf(`
Run reads the model file, solves every load case by the direct stiffness
method, combines the cases into the model's load combinations and reports,
for every member, the largest and smallest axial force N, shear V and
moment M with where along the member they occur and which combination
governs, then the envelope of every support reaction.

Cases marked pattern = true have their beam loads placed span by span as
[analysis] patterns says (docs/patterns.md); each extreme then names the
spans loaded to produce it. With --compare-patterns, run instead reports
for each member how far the code arrangements fall short of exact
placement at its worst station, and which spans make the difference.

With --json or --csv the full envelopes, at every station of every member,
are written to a file as well; flags may come before or after the model path.
The JSON, the report and --cases-csv give the unfactored results of every
load case (a patterned one with every span loaded): reactions, member end
forces and node displacements.
With --design-csv the design values are written as CSV, one row per member
(docs/output.md): for a beam the least moment at each support's face, the
largest in the span, the largest shear at each face and, where its section
gives the effective depth d, at d from it (whether that section may be
designed for is the user's to confirm: ACI 318-19 9.4.3.2, EN 1992-1-1
6.2.1(8)); for a column N and M of N max, N min and |M| max, each with the
end moments M1 and M2 of the same state, M1/M2 and the curvature.
With --report a report is written as one HTML page that needs no network
and no script: the frame drawn to scale with its moment, shear, axial
force and deflection envelopes, the design values and the station tables
floor by floor and column line by column line, the reactions, the
combinations, the statics check and the caution; it prints on A4 or
Letter paper in landscape. --out DIR writes report.html, envelopes.json,
envelopes.csv and cases.csv together into DIR.

A section may give its depth: a beam framing into a column whose section
has one gets stations at the faces of the column, and the tables show the
moments there beside those at the centreline. Combinations marked
service = true (and the EN 1990 serviceability sets) give deflections:
of every span of beams from the chord between its displaced ends, of
every cantilever from its displaced root, of a pitched roof's rafters
from their chords and its ridge across the line between the eaves, with
span/deflection (over twice the length for a cantilever), checked
against each service combination's limit where it has one (limit = 360
for span/360); a member
hanging from a beam or standing on it, free at its other end, does not
divide its span (docs/output.md); the envelopes of forces are over the
other (strength or allowable stress) combinations. The tables and the
report show every beam from its left end, +M sagging, whichever way it
was entered; the JSON and CSV keep each member's own axes.
Every file carries govern's version, the model file's name and SHA-256,
the run date and the model's [project] fields; --date DATE (or the
environment's SOURCE_DATE_EPOCH) fixes the date, so that a run can be
repeated byte for byte. Files are written whole or not at all. A run
that takes more than a second or two shows its progress on standard
error when that is a terminal; --quiet prints nothing but errors. When JSON or CSV goes to standard
output the summary tables are not printed. The tables fit 120 characters:
a wider one is split into narrower ones, each repeating the columns that
name its rows; --wide prints them whole.

Every run checks statics for each load case: the reactions against the
applied loads in X, Y and moment about the lower left corner of the
frame (the smallest x and y of any node), and the largest
out-of-balance force and moment at any joint. The check is printed and
carried in the JSON; a case out of balance by more than %g of its load
(or, for an ill-conditioned stiffness matrix, than the round-off its
condition number allows, docs/analysis.md) fails the run and nothing is
written. A model whose stiffness matrix is so ill-conditioned that fewer
than three digits would be left is refused unless --accept-ill-conditioned
is given; the outputs then carry the estimated condition number.

A load case that no combination uses would be left out of every envelope:
run refuses the model, naming the case, unless [combinations] has
unused = "allow". Two alternatives of one action, such as wind from the
left and wind from the right, are never combined (docs/combinations.md);
where several wind, seismic or snow cases do not say how they act, run
notes on standard error how it read them.

With --cross-check every case is solved a second time by moment
distribution (Hardy Cross), independently of the stiffness solver, with
one sway correction per storey free to sway, and the largest difference in
member end moments is printed twice: against the frame with every area
multiplied by 1e6 (no axial strain; limit 1e-6 of the largest end moment)
and against the model as given, within a limit derived from moment
distribution's estimate of the axial strain it neglects. The method
applies to frames of horizontal beams and vertical columns whose joints are
held vertically, with any number of storeys; for any other model the
report says why it does not apply. It is first-order: a model with
[analysis] second_order = true is refused with it.

Numbers that no building frame has are warned of, with the slip of
units that would explain them: E outside 1 to 250 GPa, a radius of
gyration √(I/A) outside 0.15 to 0.6 times a section's depth, a member's
L/r below 4 or above 1000, a span of beams with span/deflection above
20,000 or below 50 under the service combinations (docs/errors.md).
With --strict every warning is an error, and no results are given.

See docs/model-format.md for the model file and docs/conventions.md for
the units and signs.`, analysis.StaticsLimit),
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		f := &runFlags{}
		f.add(fs)
		return func(env *environ, args []string) error { return run(env, f, args) }
	},
}

// run is govern run.
func run(env *environ, f *runFlags, args []string) error {
	if len(args) != 1 {
		return usagef("need one model file, got %d arguments", len(args))
	}
	f.toStdout(env.stdout)
	if err := f.check(); err != nil {
		return err
	}
	job, err := loadModel(args[0])
	if err != nil {
		return err
	}
	return runModel(env, f, job, filepath.Base(args[0]), args[0])
}

// runModel analyses the model job, read from the file named name at path
// ("" for the demonstration), as the flags ask.
func runModel(env *environ, f *runFlags, job *modelfile.Job, name, path string) error {
	if err := job.CheckUnused(); err != nil {
		return err
	}
	if n := job.Actions.Note; n != "" && !f.quiet {
		fmt.Fprintf(env.stderr, "%s: note: %s: %s\n", env.name, report.Escape(name), report.Escape(n))
	}
	if f.comparePatterns {
		rows, err := analysis.ComparePatterns(context.Background(), &job.Job, f.options(nil))
		if err != nil {
			return acceptHint(err)
		}
		return report.WriteComparison(env.stdout, &job.Job, rows)
	}
	return analyse(env, job, name, path, f)
}

// analyse runs the analysis of job, the model file named name at path (""
// for the demonstration), and writes the results the flags ask for.
func analyse(env *environ, job *modelfile.Job, name, path string, f *runFlags) error {
	if f.crossCheck {
		for _, m := range job.Methods {
			if m.SecondOrder {
				return fmt.Errorf("%s: --cross-check solves each load case by first-order moment distribution, which cannot check a second-order analysis ([analysis] second_order = true); run without one of them", name)
			}
		}
	}
	date, err := f.runDate()
	if err != nil {
		return err
	}
	if err := report.CheckSize(&job.Job, report.Formats{JSON: f.json != "" || f.out != "", CSV: f.csv != "" || f.out != "", HTML: f.report != "" || f.out != "", Cases: f.casesCSV != "" || f.out != ""}); err != nil {
		return fmt.Errorf("%s: %w", name, err)
	}
	// The files the run will replace leave the system's cache beside the
	// analysis, not in the renames at its end (files.Release); waited for
	// before they are written, so that it is the old files' copies it
	// drops, never the new ones'.
	jsonPath, csvPath, reportPath, casesPath := f.paths()
	released := make(chan struct{})
	go func() {
		defer close(released)
		files.Release(jsonPath, csvPath, reportPath, casesPath, f.designCSV)
	}()
	unlimit := limitMemory(&job.Job)
	p := newProgress(env.stderr, env.name, f.quiet)
	res, err := analysis.Run(context.Background(), &job.Job, f.options(p))
	unlimit()
	if err != nil {
		p.end()
		var se *analysis.StaticsError
		if errors.As(err, &se) {
			env.warn(name, se.Warnings)
			return err
		}
		return located(job, name, err)
	}
	if f.strict && len(res.Warnings) > 0 {
		p.end()
		return strictError(name, res.Warnings)
	}
	p.phase("writing results", 0)
	<-released
	err = writeResults(env.stdout, path, f, report.New(res).From(source(job, name, date)))
	p.end()
	// After the progress line is gone, and below the tables.
	env.warn(name, res.Warnings)
	return err
}

// The files --out writes into its folder.
const (
	reportName = "report.html"
	jsonName   = "envelopes.json"
	csvName    = "envelopes.csv"
	casesName  = "cases.csv"
)

// toStdout turns each output path that names the file standard output
// already is (such as /dev/stdout) into "-", so that the run treats it as
// standard output and leaves out the summary.
func (f *runFlags) toStdout(stdout io.Writer) {
	f.json, f.csv, f.report = files.StdoutPath(stdout, f.json), files.StdoutPath(stdout, f.csv), files.StdoutPath(stdout, f.report)
	f.casesCSV = files.StdoutPath(stdout, f.casesCSV)
	f.designCSV = files.StdoutPath(stdout, f.designCSV)
}

// check refuses combinations of flags that cannot be honoured.
func (f *runFlags) check() error {
	if f.out != "" && (f.json != "" || f.csv != "" || f.report != "" || f.casesCSV != "") {
		return usagef("--out writes %s, %s, %s and %s into its folder; leave out --json, --csv, --cases-csv and --report", reportName, jsonName, csvName, casesName)
	}
	if f.out == "-" {
		return usagef("--out names a folder, not standard output")
	}
	n := 0
	for _, p := range []string{f.json, f.csv, f.report, f.casesCSV, f.designCSV} {
		if p == "-" {
			n++
		}
	}
	if n > 1 {
		return usagef("only one of --json, --csv, --cases-csv, --design-csv and --report can go to standard output")
	}
	if f.crossCheck && n > 0 {
		return usagef("--cross-check prints a table, so --json, --csv, --cases-csv, --design-csv and --report cannot go to standard output with it")
	}
	if f.comparePatterns && (f.json != "" || f.csv != "" || f.report != "" || f.casesCSV != "" || f.designCSV != "" || f.out != "") {
		return usagef("--compare-patterns writes no files; leave out --json, --csv, --cases-csv, --design-csv, --report and --out")
	}
	return nil
}

// paths returns the files the run writes its JSON, CSV, report and load
// cases' CSV to ("" for those not asked for): the flags', or those of the
// --out folder.
func (f *runFlags) paths() (json, csv, report, cases string) {
	if f.out != "" {
		return filepath.Join(f.out, jsonName), filepath.Join(f.out, csvName), filepath.Join(f.out, reportName), filepath.Join(f.out, casesName)
	}
	return f.json, f.csv, f.report, f.casesCSV
}

// writeResults writes the requested files and, unless a file goes to
// standard output, the summary tables.
func writeResults(stdout io.Writer, model string, f *runFlags, rp *report.Report) error {
	if err := f.check(); err != nil {
		return err
	}
	toStdout := f.json == "-" || f.csv == "-" || f.report == "-" || f.casesCSV == "-" || f.designCSV == "-"
	rp.Wide = f.wide
	jsonPath, csvPath, reportPath, casesPath := f.paths()
	var outs []files.Output
	for _, o := range []files.Output{{Path: jsonPath, Write: rp.WriteJSON}, {Path: csvPath, Write: rp.WriteCSV}, {Path: casesPath, Write: rp.WriteCasesCSV}, {Path: f.designCSV, Write: rp.WriteDesignCSV}, {Path: reportPath, Write: rp.WriteHTML}} {
		if o.Path != "" {
			outs = append(outs, o)
		}
	}
	if !toStdout && !f.quiet {
		outs = append(outs, files.Output{Path: "-", Write: func(w io.Writer) error { return rp.WriteText(w, f.crossCheck) }})
	}
	if f.out == "" {
		return files.Commit(stdout, model, outs)
	}
	made, err := files.MakeFolder(f.out)
	if err != nil {
		return err
	}
	err = files.Commit(stdout, model, outs)
	if made {
		if err != nil {
			os.Remove(f.out) // only if still empty: nothing half-written stays
		}
		files.ForgetFolder(f.out)
	}
	return err
}

// strictError is the error of a run or check with warnings under
// --strict: the warnings, each on a line of its own, as errors.
func strictError(model string, warnings []string) error {
	n := "1 warning"
	if len(warnings) != 1 {
		n = fmt.Sprintf("%d warnings", len(warnings))
	}
	var b strings.Builder
	fmt.Fprintf(&b, "%s: %s, which --strict makes errors, so no results are given:", model, n)
	for _, w := range warnings {
		fmt.Fprintf(&b, "\n%s: %s", model, w)
	}
	return errors.New(b.String())
}
