package main

import (
	"flag"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
	"govern/envelope/report"
	"govern/frame"
)

var cmdCheck = &command{
	name:  "check",
	usage: "[--strict] MODEL.toml",
	short: "read and validate a model without analysing it",
	long: `
Check reads and validates the model file and prints what it describes:
nodes, members, degrees of freedom and bandwidth of the stiffness matrix,
load cases, their actions and alternatives, and combinations; with live
load reduction, each member's factors and how they were found (tributary
area, K_LL, floors supported, the limit that governed). It also factorizes the stiffness matrix,
without solving any load case, to find a structure that cannot carry load
(a mechanism) and to estimate the matrix's condition number. Every problem
found is reported, with the line it is on, and the exit status is 1.
Numbers that look like a slip of units (E, the radius of gyration against
a section's depth, a member's L/r) are warned of; --strict makes every
warning an error. The [[assign]] tables are listed, with every member
given a section or release by two tables. See docs/errors.md.`,
	setup: func(fs *flag.FlagSet) func(*environ, []string) error {
		strict := fs.Bool("strict", false, "treat every warning as an error")
		return func(env *environ, args []string) error { return check(env, args, *strict) }
	},
}

// check is govern check.
func check(env *environ, args []string, strict bool) error {
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
	if strict && len(st.Warnings) > 0 {
		return strictError(name, st.Warnings)
	}
	env.warn(name, st.Warnings)
	report.WriteCheck(env.stdout, &job.Job, st)
	writeAssignments(env.stdout, job)
	return nil
}

// writeAssignments lists the model's [[assign]] tables and where they,
// or [[member]] tables, give a member what another table gave it.
func writeAssignments(w io.Writer, job *modelfile.Job) {
	if len(job.Assignments) == 0 {
		return
	}
	fmt.Fprintf(w, "assignments:    %d, applied in file order\n", len(job.Assignments))
	for _, a := range job.Assignments {
		fmt.Fprintf(w, "  line %-6d %s on %s: %d members\n", a.Line, report.Escape(a.What(job.Units.Length)), report.Escape(quoted(a.On)), len(a.Members))
	}
	if len(job.Overlaps) == 0 {
		fmt.Fprintf(w, "overlaps:       none\n")
		return
	}
	fmt.Fprintf(w, "overlaps:       %d (a later table replaces what an earlier one gave)\n", len(job.Overlaps))
	for _, o := range job.Overlaps {
		fmt.Fprintf(w, "  %s\n", report.Escape(job.DescribeOverlap(o)))
	}
}

// quoted writes selectors as they are written in on.
func quoted(on []string) string {
	q := make([]string, len(on))
	for i, s := range on {
		q[i] = strconv.Quote(s)
	}
	if len(q) == 1 {
		return q[0]
	}
	return "[" + strings.Join(q, ", ") + "]"
}
