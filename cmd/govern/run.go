package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"govern/frame"
)

type runFlags struct {
	json, csv       string
	report, out     string
	comparePatterns bool
	crossCheck      bool
	quiet           bool
	acceptIll       bool
}

// options returns the solver options the flags ask for.
func (f *runFlags) options() frame.Options {
	return frame.Options{AcceptIllConditioned: f.acceptIll}
}

func addRunFlags(fs *flag.FlagSet, f *runFlags) {
	fs.StringVar(&f.json, "json", "", "write the envelopes as JSON to `FILE` (- for standard output)")
	fs.StringVar(&f.csv, "csv", "", "write the envelopes as CSV to `FILE` (- for standard output), one row per member, station and effect")
	fs.StringVar(&f.report, "report", "", "write a report as one self-contained HTML page to `FILE` (- for standard output): the frame and its envelopes drawn, tables floor by floor, reactions, combinations, statics check")
	fs.StringVar(&f.out, "out", "", "write "+reportName+", "+jsonName+" and "+csvName+" together into the folder `DIR` (made if missing)")
	fs.BoolVar(&f.comparePatterns, "compare-patterns", false, "report how far the code pattern arrangements fall short of exact placement, member by member, instead of the envelopes")
	fs.BoolVar(&f.quiet, "quiet", false, "print nothing on success: no tables, no progress line (files are still written)")
	fs.BoolVar(&f.crossCheck, "cross-check", false, "solve every case again by moment distribution and print the largest difference in member end moments")
	fs.BoolVar(&f.acceptIll, "accept-ill-conditioned", false, fmt.Sprintf("solve a model whose stiffness matrix has an estimated condition number above %.0e (fewer than three correct digits left), which is refused otherwise; every output then carries the estimate", frame.RefuseCond))
}

var cmdRun = &command{
	name:  "run",
	usage: "[--json FILE] [--csv FILE] [--report FILE.html | --out DIR] [--quiet] [--compare-patterns] [--cross-check] [--accept-ill-conditioned] MODEL.toml",
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
With --report a report is written as one HTML page that needs no network
and no script: the frame drawn to scale with its moment, shear, axial
force and deflection envelopes, the design values and the station tables
floor by floor and column line by column line, the reactions, the
combinations, the statics check and the caution; it prints on A4 or
Letter paper in landscape. --out DIR writes report.html, envelopes.json
and envelopes.csv together into DIR.

A section may give its depth: a beam framing into a column whose section
has one gets stations at the faces of the column, and the tables show the
moments there beside those at the centreline. Combinations marked
service = true (and the EN 1990 serviceability sets) give deflections:
of every span of beams from the chord between its displaced ends, of
every cantilever from its displaced root, with span/deflection (over
twice the length for a cantilever); the envelopes of forces are over the
other, strength, combinations. The tables and the report show every beam
from its left end, +M sagging, whichever way it was entered; the JSON
and CSV keep each member's own axes.
Files are written whole or not at all. A run that takes more than a
second or two shows its progress on standard error when that is a
terminal; --quiet prints nothing but errors. When JSON or CSV goes to standard
output the summary tables are not printed.

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
distribution (Hardy Cross), independently of the stiffness solver, and the
largest difference in member end moments is printed. The method applies to
frames of horizontal beams and vertical columns whose joints are held
vertically, either held against sway or with a single storey free to sway;
for any other model the report says why it does not apply.

See docs/model-format.md for the model file and docs/conventions.md for
the signs.`, staticsLimit),
	flags: func(fs *flag.FlagSet) any {
		f := &runFlags{}
		addRunFlags(fs, f)
		return f
	},
	run: func(env *environ, opts any, args []string) error {
		if len(args) != 1 {
			return usagef("need one model file, got %d arguments", len(args))
		}
		f := opts.(*runFlags)
		f.toStdout(env.stdout)
		if err := f.check(); err != nil {
			return err
		}
		job, err := loadModel(args[0])
		if err != nil {
			return err
		}
		name := filepath.Base(args[0])
		if err := job.CheckUnused(); err != nil {
			return err
		}
		if n := job.Actions.Note; n != "" && !f.quiet {
			fmt.Fprintf(env.stderr, "%s: note: %s: %s\n", env.name, escape(name), escape(n))
		}
		if f.comparePatterns {
			return comparePatterns(env.stdout, job, f.options())
		}
		if err := checkSize(job, f); err != nil {
			return fmt.Errorf("%s: %w", name, err)
		}
		p := newProgress(env.stderr, env.name, f.quiet)
		a, err := analyseWith(job, job.Patterns, p, f.options())
		if err != nil {
			p.end()
			return fmt.Errorf("%s: %w", name, err)
		}
		p.phase("writing results", 0)
		err = a.report(env.stdout, args[0], f)
		p.end()
		// After the progress line is gone, and below the tables.
		env.warn(name, a.sol.Warnings())
		return err
	},
}

// The files --out writes into its folder.
const (
	reportName = "report.html"
	jsonName   = "envelopes.json"
	csvName    = "envelopes.csv"
)

// toStdout turns each output path that names the file standard output
// already is (such as /dev/stdout) into "-", so that the run treats it as
// standard output and leaves out the summary.
func (f *runFlags) toStdout(stdout io.Writer) {
	f.json, f.csv, f.report = stdoutPath(stdout, f.json), stdoutPath(stdout, f.csv), stdoutPath(stdout, f.report)
}

// check refuses combinations of flags that cannot be honoured.
func (f *runFlags) check() error {
	if f.out != "" && (f.json != "" || f.csv != "" || f.report != "") {
		return usagef("--out writes %s, %s and %s into its folder; leave out --json, --csv and --report", reportName, jsonName, csvName)
	}
	if f.out == "-" {
		return usagef("--out names a folder, not standard output")
	}
	n := 0
	for _, p := range []string{f.json, f.csv, f.report} {
		if p == "-" {
			n++
		}
	}
	if n > 1 {
		return usagef("only one of --json, --csv and --report can go to standard output")
	}
	if f.crossCheck && n > 0 {
		return usagef("--cross-check prints a table, so --json, --csv and --report cannot go to standard output with it")
	}
	if f.comparePatterns && (f.json != "" || f.csv != "" || f.report != "" || f.out != "") {
		return usagef("--compare-patterns writes no files; leave out --json, --csv, --report and --out")
	}
	return nil
}

// report writes the requested files and, unless a file goes to standard
// output, the summary tables.
func (a *analysis) report(stdout io.Writer, model string, f *runFlags) error {
	if err := f.check(); err != nil {
		return err
	}
	toStdout := f.json == "-" || f.csv == "-" || f.report == "-"
	bal := a.balances()
	if err := staticsError(bal); err != nil {
		return err
	}
	jsonPath, csvPath, reportPath := f.json, f.csv, f.report
	if f.out != "" {
		jsonPath, csvPath, reportPath = filepath.Join(f.out, jsonName), filepath.Join(f.out, csvName), filepath.Join(f.out, reportName)
	}
	var outs []output
	if jsonPath != "" {
		outs = append(outs, output{path: jsonPath, write: func(w io.Writer) error { return a.writeJSON(w, bal) }})
	}
	if csvPath != "" {
		outs = append(outs, output{path: csvPath, write: a.writeCSV})
	}
	if reportPath != "" {
		outs = append(outs, output{path: reportPath, write: func(w io.Writer) error { return a.writeReport(w, bal) }})
	}
	if !toStdout && !f.quiet {
		outs = append(outs, output{path: "-", write: func(w io.Writer) error {
			a.writeHeading(w)
			if err := a.writeSummary(w); err != nil {
				return err
			}
			if err := a.writeStatics(w, bal); err != nil {
				return err
			}
			if f.crossCheck {
				if err := a.writeCrossCheck(w); err != nil {
					return err
				}
			}
			_, err := fmt.Fprintf(w, "\n%s\n", caution)
			return err
		}})
	}
	if f.out == "" {
		return commitOutputs(stdout, model, outs)
	}
	made, err := makeFolder(f.out)
	if err != nil {
		return err
	}
	err = commitOutputs(stdout, model, outs)
	if made {
		if err != nil {
			os.Remove(f.out) // only if still empty: nothing half-written stays
		}
		forgetFolder(f.out)
	}
	return err
}

// combinationCount says how many combinations there are, and how many are
// strength and service ones when there are both.
func (a *analysis) combinationCount() string {
	n, s := len(a.env.Combinations), len(a.env.Service)
	if s == 0 || s == n {
		return fmt.Sprintf("%d combinations", n)
	}
	return fmt.Sprintf("%d combinations (%d strength, %d service)", n, n-s, s)
}

// faceCount returns the number of beam ends that have a face station.
func (a *analysis) faceCount() int {
	n := 0
	for _, xs := range a.env.Settings.Extra {
		n += len(xs)
	}
	return n
}

// writeHeading prints what was analysed.
func (a *analysis) writeHeading(w io.Writer) {
	mo := a.job.Model
	if a.job.Title != "" {
		fmt.Fprintf(w, "%s\n", escape(a.job.Title))
	}
	info := a.sol.Info()
	fmt.Fprintf(w, "%d nodes, %d members, %d equations; %d load cases, %s; %d stations per member; variable loads %s\n",
		len(mo.Nodes), len(mo.Members), info.Equations, len(mo.Cases), a.combinationCount(), a.env.Settings.Stations, variableLoads(a.env.Settings.AsWritten))
	if n := a.faceCount(); n > 0 {
		fmt.Fprintf(w, "Column faces: %d beam ends get a station at the face of the column they frame into (section depth)\n", n)
	}
	if len(a.job.Patterned) > 0 {
		var names []string
		for _, c := range a.job.Patterned {
			names = append(names, escape(mo.Cases[c].Name))
		}
		fmt.Fprintf(w, "Patterned cases %s: %s placement, %d pieces (%d per beam)\n", strings.Join(names, ", "), a.lay.Mode, len(a.lay.Pieces), a.lay.Segments)
	}
	if note := a.conditionNote(); note != "" {
		fmt.Fprintf(w, "%s\n", note)
	}
	fmt.Fprintf(w, "Units: force %s, length %s. N tension positive; beams: x from the left end, M sagging positive (lower face in tension); columns: local -y face in tension; V = dM/dx.\n\n", escape(a.job.Units.Force), escape(a.job.Units.Length))
}
