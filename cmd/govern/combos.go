package main

import (
	"flag"
	"io"

	"govern/envelope/report"
	"govern/envelope/report/files"
)

type combosFlags struct {
	csv string
}

var cmdCombos = &command{
	name:  "combos",
	usage: "[--csv FILE] MODEL.toml",
	short: "list the load combinations a model is analysed for",
	long: `
Combos reads the model file and lists every load combination it will be
analysed for: those the standard or rule file of its [combinations] table
gives, expanded against the model's load cases, then the model's own
[[combination]] tables. It lists the load cases and their actions, each
with its alternatives (two alternatives of one action, such as wind from
the left and from the right, never act together). For each combination it
shows the name, the rule it came from and the factor on each load case; a
blank means the case is not in the combination. Names start with the rule, such as "2.3.1-3 1.2D+1.6S+0.5W"
for ASCE/SEI 7-16 section 2.3.1 combination 3; "model" marks the model's
own and "case" a case alone, used when the model gives no combinations.

With --csv the same list is written as CSV, one row per combination and a
column per load case. Files are written whole or not at all.

See docs/combinations.md for the built-in sets and the rule format.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		f := &combosFlags{}
		fs.StringVar(&f.csv, "csv", "", "write the combinations as CSV to `FILE` (- for standard output)")
		return func(env *environ, args []string) error { return listCombinations(env, f, args) }
	},
}

// listCombinations is govern combos.
func listCombinations(env *environ, f *combosFlags, args []string) error {
	if len(args) != 1 {
		return usagef("need one model file, got %d arguments", len(args))
	}
	job, err := loadModel(args[0])
	if err != nil {
		return err
	}
	f.csv = files.StdoutPath(env.stdout, f.csv)
	var outs []files.Output
	if f.csv != "" {
		outs = append(outs, files.Output{Path: f.csv, Write: func(w io.Writer) error { return report.WriteCombinationsCSV(w, &job.Job) }})
	}
	if f.csv != "-" {
		outs = append(outs, files.Output{Path: "-", Write: func(w io.Writer) error { return report.WriteCombinations(w, &job.Job) }})
	}
	return files.Commit(env.stdout, args[0], outs)
}
