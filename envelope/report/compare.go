package report

import (
	"fmt"
	"io"
	"strings"

	"govern/envelope/analysis"
)

// WriteComparison writes, member by member, how far the code arrangements
// of pattern live load fall short of exact placement at the member's worst
// station (analysis.ComparePatterns), as a text table.
func WriteComparison(w io.Writer, job *analysis.Job, rows []analysis.Shortfall) error {
	u := job.Units
	force, moment, _ := mustShown(u)
	fmt.Fprintf(w, "How far the code arrangements (ACI 318-19 6.4, EN 1992-1-1 5.1.3) fall short of exact placement\n")
	fmt.Fprintf(w, "at each member's worst station. Shortfall is in percent of the member's largest |value| of that\n")
	fmt.Fprintf(w, "effect (M and V for beams; N, V and M for columns); + marks a piece loaded by exact placement\n")
	fmt.Fprintf(w, "only, - one loaded by the code arrangement only. x from the left end of a beam (+M sagging),\n")
	fmt.Fprintf(w, "from the start node of a column.\n\n")
	var out [][]string
	for _, r := range rows {
		name := job.Model.Members[r.Member].Name
		if r.Percent == 0 {
			out = append(out, []string{name, "-", "-", "-", "-", "-", fixed(0), "none"})
			continue
		}
		s := force
		if r.Effect == 2 {
			s = moment
		}
		side := "min"
		if r.Max {
			side = "max"
		}
		out = append(out, []string{name, fmt.Sprintf("%s (%s)", memberForces[r.Effect], s.Label), side, fixed(r.X), fixed(s.Of(r.Exact)), fixed(s.Of(r.Code)), fixed(r.Percent), strings.Join(r.Pieces, " ")})
	}
	return renderFitted(w, "", []string{"member", "effect", "extreme", "at x (" + u.Length + ")", "exact", "code", "shortfall (%)", "pieces that make the difference"}, out, TextWidth)
}
