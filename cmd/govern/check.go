package main

import (
	"flag"
	"fmt"
	"path/filepath"

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
	flags: func(fs *flag.FlagSet) any { return nil },
	run: func(env *environ, _ any, args []string) error {
		if len(args) != 1 {
			return usagef("need one model file, got %d arguments", len(args))
		}
		job, err := loadModel(args[0])
		if err != nil {
			return err
		}
		name := filepath.Base(args[0])
		if err := checkSize(job, &runFlags{}); err != nil {
			return fmt.Errorf("%s: %w", name, err)
		}
		mo := job.Model
		// The stiffness of the frame alone: its factorization finds a
		// mechanism and estimates the condition number.
		// The node loads come along: a moment where every member end is
		// released is a mechanism for that case.
		cases := make([]frame.Case, len(mo.Cases))
		for i, c := range mo.Cases {
			cases[i] = frame.Case{Name: c.Name, NodeLoads: c.NodeLoads}
		}
		stiff, err := frame.Solve(&frame.Model{Nodes: mo.Nodes, Sections: mo.Sections, Members: mo.Members, Cases: cases})
		if err != nil {
			return fmt.Errorf("%s: %w", name, acceptHint(err))
		}
		env.warn(name, stiff.Warnings())
		info := stiff.Info()
		w := env.stdout
		if job.Title != "" {
			fmt.Fprintf(w, "%s\n", escape(job.Title))
		}
		supported, beams, cols := census(mo)
		fmt.Fprintf(w, "units:          force %s, length %s\n", escape(job.Units.Force), escape(job.Units.Length))
		fmt.Fprintf(w, "nodes:          %d (%d supported)\n", len(mo.Nodes), supported)
		fmt.Fprintf(w, "members:        %d (%d beams, %d columns, %d other)\n", len(mo.Members), beams, cols, len(mo.Members)-beams-cols)
		fmt.Fprintf(w, "sections:       %d\n", len(mo.Sections))
		fmt.Fprintf(w, "equations:      %d free degrees of freedom\n", info.Equations)
		fmt.Fprintf(w, "bandwidth:      %d (half-bandwidth after reverse Cuthill-McKee numbering)\n", info.Bandwidth)
		fmt.Fprintf(w, "stability:      no mechanism; estimated condition number %.2g\n", stiff.Cond())
		fmt.Fprintf(w, "load cases:     %d\n", len(mo.Cases))
		for i, c := range mo.Cases {
			fmt.Fprintf(w, "  %-12s %-9s %d member loads, %d node loads\n", escape(c.Name), job.Cases[i].Kind, len(c.MemberLoads), len(c.NodeLoads))
		}
		fmt.Fprintf(w, "actions:        %d (two alternatives of one action never act together)\n", len(job.Actions.List))
		for _, row := range actionRows(job) {
			fmt.Fprintf(w, "  %-12s %-9s %s\n", escape(row[0]), row[1], escape(row[2]))
		}
		if n := job.Actions.Note; n != "" {
			fmt.Fprintf(w, "note:           %s\n", escape(n))
		}
		fmt.Fprintf(w, "combinations:   %d\n", len(job.Combinations))
		for _, cb := range job.Combinations {
			service := ""
			if cb.Service {
				service = "   (service)"
			}
			fmt.Fprintf(w, "  %-28s %s%s\n", escape(cb.Name), escape(cb.Describe(job.Cases)), service)
		}
		if u := unusedText(job); u != "" {
			fmt.Fprintf(w, "unused cases:   %s\n", u)
		}
		fmt.Fprintf(w, "stations:       %d per member\n", job.Settings.Stations)
		fmt.Fprintf(w, "variable loads: %s\n", variableLoads(job.Settings.AsWritten))
		return nil
	},
}

// census counts the supported nodes, the beams and the columns of mo.
func census(mo *frame.Model) (supported, beams, columns int) {
	for _, n := range mo.Nodes {
		if n.Support != frame.Free {
			supported++
		}
	}
	for m := range mo.Members {
		switch {
		case mo.IsBeam(m):
			beams++
		case mo.IsColumn(m):
			columns++
		}
	}
	return supported, beams, columns
}
