package main

import (
	_ "embed"
	"flag"
	"fmt"

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
	usage: "[--json FILE] [--csv FILE] [--report FILE.html | --out DIR] [--cross-check] [--write FILE]",
	short: "run the analysis on a built-in demonstration model",
	long: `
Demo analyses a built-in model of a fictional five-storey, three-bay
reinforced concrete office frame with dead, floor live, roof live and wind
load cases and the strength combinations of ASCE/SEI 7-16 section 2.3.1,
and reports as 'govern run' does.

With --write FILE it writes that model out instead, as a starting point to
edit; an existing file is not overwritten.`,
	flags: func(fs *flag.FlagSet) any {
		f := &demoFlags{}
		addRunFlags(fs, &f.runFlags)
		fs.StringVar(&f.write, "write", "", "write the demonstration model to `FILE` instead of analysing it")
		return f
	},
	run: func(env *environ, opts any, args []string) error {
		f := opts.(*demoFlags)
		if len(args) != 0 {
			return usagef("demo takes no arguments")
		}
		if f.write != "" {
			if fileExists(f.write) {
				return fmt.Errorf("%s exists; not overwriting it", f.write)
			}
			if err := writeNew(f.write, demoModel); err != nil {
				return err
			}
			fmt.Fprintf(env.stdout, "wrote %s\n", escape(f.write))
			return nil
		}
		f.toStdout(env.stdout)
		job, err := modelfile.Read("demo.toml", demoModel)
		if err != nil {
			return err
		}
		if err := checkSize(job, &f.runFlags); err != nil {
			return fmt.Errorf("demo.toml: %w", err)
		}
		p := newProgress(env.stderr, env.name, f.quiet)
		a, err := analyseWith(job, job.Patterns, p, f.options())
		p.end()
		if err != nil {
			return fmt.Errorf("demo.toml: %w", err)
		}
		env.warn("demo.toml", a.sol.Warnings())
		return a.report(env.stdout, "", &f.runFlags)
	},
}
