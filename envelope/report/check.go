package report

import (
	"fmt"
	"io"

	"govern/envelope/analysis"
)

// WriteCheck writes, as text for the terminal, what a job describes and
// what its stiffness says (analysis.CheckStability): nodes, members,
// degrees of freedom and bandwidth, the condition number, load cases,
// their actions and alternatives, combinations and settings.
func WriteCheck(w io.Writer, job *analysis.Job, st *analysis.Stability) {
	mo := job.Model
	if job.Title != "" {
		fmt.Fprintf(w, "%s\n", Escape(job.Title))
	}
	supported, beams, cols := census(mo)
	if force, moment, defl, err := job.Units.Shown(); err == nil {
		fmt.Fprintf(w, "units:          %s\n", Escape(unitsText(job.Units, force, moment, defl)))
	} else {
		fmt.Fprintf(w, "units:          force %s, length %s (%s)\n", Escape(job.Units.Force), Escape(job.Units.Length), Escape(err.Error()))
	}
	fmt.Fprintf(w, "nodes:          %d (%d supported)\n", len(mo.Nodes), supported)
	fmt.Fprintf(w, "members:        %d (%d beams, %d columns, %d other)\n", len(mo.Members), beams, cols, len(mo.Members)-beams-cols)
	fmt.Fprintf(w, "sections:       %d\n", len(mo.Sections))
	fmt.Fprintf(w, "equations:      %d free degrees of freedom\n", st.Info.Equations)
	fmt.Fprintf(w, "bandwidth:      %d (half-bandwidth after reverse Cuthill-McKee numbering)\n", st.Info.Bandwidth)
	fmt.Fprintf(w, "stability:      no mechanism; estimated condition number %.2g\n", st.Condition)
	fmt.Fprintf(w, "load cases:     %d\n", len(mo.Cases))
	for i, c := range mo.Cases {
		imposed := ""
		if n := len(c.Displacements); n > 0 {
			imposed = fmt.Sprintf(", %d imposed displacements", n)
		}
		fmt.Fprintf(w, "  %-12s %-11s %d member loads, %d node loads%s\n", Escape(c.Name), job.Cases[i].Kind, len(c.MemberLoads), len(c.NodeLoads), imposed)
	}
	writeReductionCheck(w, job)
	if job.Actions != nil {
		fmt.Fprintf(w, "actions:        %d (two alternatives of one action never act together)\n", len(job.Actions.List))
		for _, row := range actionRows(job) {
			fmt.Fprintf(w, "  %-12s %-11s %s\n", Escape(row[0]), row[1], Escape(row[2]))
		}
		if n := job.Actions.Note; n != "" {
			fmt.Fprintf(w, "note:           %s\n", Escape(n))
		}
	}
	fmt.Fprintf(w, "combinations:   %d\n", len(job.Combinations))
	for _, cb := range job.Combinations {
		service := ""
		if cb.Service {
			service = "   (service)"
		}
		fmt.Fprintf(w, "  %-28s %s%s\n", Escape(cb.Name), Escape(cb.Describe(job.Cases)), service)
	}
	if u := unusedText(job); u != "" {
		fmt.Fprintf(w, "unused cases:   %s\n", u)
	}
	fmt.Fprintf(w, "stations:       %d per member\n", job.Settings.Stations)
	fmt.Fprintf(w, "variable loads: %s\n", variableLoads(job.Settings.AsWritten))
}
