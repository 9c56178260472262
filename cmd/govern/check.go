package main

import (
	"flag"
	"fmt"
	"path/filepath"

	"govern/envelope/analysis"
	"govern/envelope/report"
	"govern/frame"
)

var cmdCheck = &command{
	name:  "check",
	usage: "MODEL.toml",
	short: "read and validate a model without analysing it",
	long: `
Check reads and validates the model file and prints what it describes:
nodes, members, degrees of freedom and bandwidth of the stiffness matrix,
load cases, their actions and alternatives, and combinations. It also factorizes the stiffness matrix,
without solving any load case, to find a structure that cannot carry load
(a mechanism) and to estimate the matrix's condition number. Every problem
found is reported, with the line it is on, and the exit status is 1.
See docs/errors.md.`,
	setup: func(*flag.FlagSet) func(*environ, []string) error { return check },
}

// check is govern check.
func check(env *environ, args []string) error {
	if len(args) != 1 {
		return usagef("need one model file, got %d arguments", len(args))
	}
	job, err := loadModel(args[0])
	if err != nil {
		return err
	}
	name := filepath.Base(args[0])
	if err := job.CheckSize(); err != nil {
		return fmt.Errorf("%s: %w", name, err)
	}
	st, err := analysis.CheckStability(&job.Job, frame.Options{})
	if err != nil {
		return located(job, name, err)
	}
	env.warn(name, st.Warnings)
	report.WriteCheck(env.stdout, &job.Job, st)
	return nil
}
