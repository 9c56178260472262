package main

import (
	_ "embed"
	"flag"

	"govern/cmd/govern/modelfile"
)

// demoModel is a fictional five-storey, three-bay office frame.
//
//go:embed demo.toml
var demoModel []byte

type demoFlags struct {
	runFlags
	write string
}

var cmdDemo = &command{
	name:  "demo",
	usage: "[--json FILE] [--csv FILE] [--cases-csv FILE] [--design-csv FILE] [--report FILE.html | --out DIR] [--quiet] [--wide] [--compare-patterns] [--cross-check] [--strict] [--accept-ill-conditioned] [--date DATE] [--write FILE]",
	short: "run the analysis on a built-in demonstration model",
	long: `
Demo analyses a built-in model of a fictional five-storey, three-bay
reinforced concrete office frame with dead, floor live, roof live and wind
load cases and the strength combinations of ASCE/SEI 7-16 section 2.3.1,
and reports as 'govern run' does, with the same flags.

With --write FILE it writes that model out instead, as a starting point to
edit; an existing file is not overwritten. With --write - (or a path that
names standard output, such as /dev/stdout) the model goes to standard
output.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		f := &demoFlags{}
		f.runFlags.add(fs)
		fs.StringVar(&f.write, "write", "", "write the demonstration model to `FILE` instead of analysing it")
		return func(env *environ, args []string) error { return demo(env, f, args) }
	},
}

// demo is govern demo.
func demo(env *environ, f *demoFlags, args []string) error {
	if len(args) != 0 {
		return usagef("demo takes no arguments")
	}
	if f.write != "" {
		return writeModelFile(env, f.write, demoModel, "")
	}
	f.toStdout(env.stdout)
	job, err := modelfile.Read("demo.toml", demoModel)
	if err != nil {
		return err
	}
	return runModel(env, &f.runFlags, job, "demo.toml", "")
}
