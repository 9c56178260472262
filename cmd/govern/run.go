package main

import (
	"flag"
	"fmt"
	"io"
)

type runFlags struct {
	json, csv  string
	crossCheck bool
}

func addRunFlags(fs *flag.FlagSet, f *runFlags) {
	fs.StringVar(&f.json, "json", "", "write the envelopes as JSON to `FILE` (- for standard output)")
	fs.StringVar(&f.csv, "csv", "", "write the envelopes as CSV to `FILE` (- for standard output), one row per member, station and effect")
	fs.BoolVar(&f.crossCheck, "cross-check", false, "solve every case again by moment distribution and print the largest difference in member end moments")
}

var cmdRun = &command{
	name:  "run",
	usage: "[--json FILE] [--csv FILE] [--cross-check] MODEL.toml",
	short: "analyse a model and report its envelopes",
	long: fmt.Sprintf(`
Run reads the model file, solves every load case by the direct stiffness
method, combines the cases into the model's load combinations and reports,
for every member, the largest and smallest axial force N, shear V and
moment M with where along the member they occur and which combination
governs, then the envelope of every support reaction.

With --json or --csv the full envelopes, at every station of every member,
are written to a file as well; flags may come before or after the model path.
Files are written whole or not at all. When JSON or CSV goes to standard
output the summary tables are not printed.

Every run checks statics for each load case: the reactions against the
applied loads in X, Y and moment about the origin, and the largest
out-of-balance force and moment at any joint. The check is printed and
carried in the JSON; a case out of balance by more than %g of its load
fails the run and nothing is written.

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
		job, err := loadModel(args[0])
		if err != nil {
			return err
		}
		a, err := analyse(job)
		if err != nil {
			return err
		}
		return a.report(env.stdout, args[0], opts.(*runFlags))
	},
}

// report writes the requested files and, unless a file goes to standard
// output, the summary tables.
func (a *analysis) report(stdout io.Writer, model string, f *runFlags) error {
	bal := a.balances()
	if err := staticsError(bal); err != nil {
		return err
	}
	var outs []*output
	toStdout := false
	if f.json != "" {
		o := &output{path: f.json}
		if err := a.writeJSON(&o.buf); err != nil {
			return err
		}
		outs = append(outs, o)
		toStdout = toStdout || f.json == "-"
	}
	if f.csv != "" {
		o := &output{path: f.csv}
		if err := a.writeCSV(&o.buf); err != nil {
			return err
		}
		outs = append(outs, o)
		toStdout = toStdout || f.csv == "-"
	}
	if f.json == "-" && f.csv == "-" {
		return usagef("only one of --json and --csv can go to standard output")
	}
	if f.crossCheck && toStdout {
		return usagef("--cross-check prints a table, so --json and --csv cannot go to standard output with it")
	}
	if !toStdout {
		o := &output{path: "-"}
		a.writeHeading(&o.buf)
		if err := a.writeSummary(&o.buf); err != nil {
			return err
		}
		if err := a.writeStatics(&o.buf, bal); err != nil {
			return err
		}
		if f.crossCheck {
			if err := a.writeCrossCheck(&o.buf); err != nil {
				return err
			}
		}
		fmt.Fprintf(&o.buf, "\n%s\n", caution)
		outs = append(outs, o)
	}
	return commitOutputs(stdout, model, outs)
}

// writeHeading prints what was analysed.
func (a *analysis) writeHeading(w io.Writer) {
	mo := a.job.Model
	if a.job.Title != "" {
		fmt.Fprintf(w, "%s\n", a.job.Title)
	}
	info := a.sol.Info()
	fmt.Fprintf(w, "%d nodes, %d members, %d equations; %d load cases, %d combinations; %d stations per member; variable loads %s\n",
		len(mo.Nodes), len(mo.Members), info.Equations, len(mo.Cases), len(a.env.Combinations), a.env.Settings.Stations, variableLoads(a.env.Settings.AsWritten))
	fmt.Fprintf(w, "Units: force %s, length %s. N tension positive; M sagging positive (local -y face in tension); V = dM/dx.\n\n", a.job.Units.Force, a.job.Units.Length)
}
