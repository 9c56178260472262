package report

import (
	"fmt"
	"io"
	"math"
	"strings"

	"govern/combos"
	"govern/envelope/analysis"
)

// WriteCombinations writes, as text for the terminal, where the job's
// combinations come from, its load cases (kind, reversible, and for sets
// that use them the ψ factors with their source), its actions with their
// alternatives, the combinations with the factor on each case, the cases
// no combination uses, and the caution.
func WriteCombinations(w io.Writer, job *analysis.Job) error {
	mo := job.Model
	if job.Title != "" {
		fmt.Fprintf(w, "%s\n", Escape(job.Title))
	}
	bySource := map[string]int{}
	for _, cb := range job.Combinations {
		bySource[cb.Rule]++
	}
	fmt.Fprintf(w, "%d load combinations", len(job.Combinations))
	switch s := job.Set; {
	case s != nil:
		n := 0
		for _, cb := range job.Combinations {
			if strings.HasPrefix(cb.Rule, s.Name+" ") {
				n++
			}
		}
		fmt.Fprintf(w, ": %d from %s, %d from the model.\n", n, Escape(s.Name), bySource["model"])
		if s.Title != "" {
			fmt.Fprintf(w, "%s: %s.\n", Escape(s.Name), Escape(s.Title))
		}
		seismic := false
		for _, c := range job.Cases {
			seismic = seismic || c.Kind == combos.Seismic
		}
		if s.UsesSDS() && seismic {
			if job.Params.SDS == 0 {
				fmt.Fprintf(w, "No sds given: the vertical seismic load effect Ev is taken as zero.\n")
			} else {
				fmt.Fprintf(w, "S_DS = %s g: Ev = %s D is in the dead load factors.\n", num(job.Params.SDS), num(0.2*job.Params.SDS))
			}
		}
		if job.Params.ReducedLive {
			fmt.Fprintf(w, "The reduced live load factor is used where the rules give one.\n")
		}
	case bySource["case"] > 0:
		fmt.Fprintf(w, ": the model gives none, so each load case alone.\n")
	default:
		fmt.Fprintf(w, ", all from the model.\n")
	}
	if job.Actions != nil && job.Actions.Note != "" {
		fmt.Fprintf(w, "Note: %s\n", Escape(job.Actions.Note))
	}
	fmt.Fprintf(w, "\n")

	psi := job.Set != nil && job.Set.UsesPsi()
	header := []string{"case", "kind", "reversible"}
	if psi {
		header = append(header, "ψ0", "ψ1", "ψ2", "ψ from")
	}
	var rows [][]string
	for i, c := range mo.Cases {
		row := []string{c.Name, job.Cases[i].Kind.String(), map[bool]string{true: "yes", false: "no"}[reversible(job, i)]}
		if psi {
			row = append(row, psiCells(caseInfo(job, i), job.Cases[i].Kind)...)
		}
		rows = append(rows, row)
	}
	fmt.Fprintf(w, "Load cases\n")
	if err := renderFitted(w, "", header, rows, TextWidth); err != nil {
		return err
	}
	if job.Actions != nil {
		fmt.Fprintf(w, "\nActions (two alternatives of one action never act together)\n")
		if err := renderFitted(w, "", []string{"action", "kind", "alternatives: cases"}, actionRows(job), TextWidth); err != nil {
			return err
		}
	}
	fmt.Fprintf(w, "\nLoad combinations (factor on each load case)\n")
	if err := renderFitted(w, "", combinationHeader(job), combinationRows(job, combos.FormatFactor), TextWidth); err != nil {
		return err
	}
	if u := unusedText(job); u != "" {
		fmt.Fprintf(w, "\n%s\n", u)
	}
	if err := writeNotional(w, job); err != nil {
		return err
	}
	fmt.Fprintf(w, "\n%s\n", wrapLines(Caution, TextWidth))
	return nil
}

// writeNotional lists the notional loads of each combination, level by
// level, where the job asks for them.
func writeNotional(w io.Writer, job *analysis.Job) error {
	if job.Sway.Notional == analysis.NoNotional && job.Sway.TauB != analysis.TauBNotional {
		return nil
	}
	ns, err := analysis.NotionalLoads(job)
	if err != nil {
		return err
	}
	force, _, _ := mustShown(job.Units)
	fmt.Fprintf(w, "\nNotional loads (%s): the ratio times the gravity load Yi each level receives, along X\n", job.Sway.Notional)
	var rows [][]string
	for k, cb := range job.Combinations {
		name := cb.Name
		for _, n := range ns[k] {
			dir := "+X"
			if n.Direction < 0 {
				dir = "-X"
			}
			if n.Alternative {
				dir += " (alternative)"
			}
			for _, lv := range n.Levels {
				level := lv.Level
				if level == "" {
					level = "y = " + fixed(lv.Y)
				}
				rows = append(rows, []string{name, dir, sig4(n.Ratio), level, fixed(force.Of(lv.Gravity)), sig4(force.Of(math.Abs(lv.Force)))})
				name, dir = "", ""
			}
		}
	}
	return renderTable(w, []string{"combination", "direction", "ratio", "level", "Yi (" + force.Label + ")", "Ni (" + force.Label + ")"}, rows)
}

// WriteCombinationsCSV writes one row per combination: name, rule, with
// service combinations their use, then the factor on each load case, empty
// where the case is not in it.
func WriteCombinationsCSV(w io.Writer, job *analysis.Job) error {
	cw := newCSVWriter(w)
	if err := cw.Write(combinationHeader(job)); err != nil {
		return err
	}
	for _, row := range combinationRows(job, num) {
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// combinationHeader heads the list of combinations: name, rule, with
// service combinations their use, then a column per case.
func combinationHeader(job *analysis.Job) []string {
	header := []string{"combination", "rule"}
	if hasService(job) {
		header = append(header, "use")
	}
	for _, c := range job.Model.Cases {
		header = append(header, c.Name)
	}
	return header
}

// combinationRows lists the combinations with the factor on each case,
// formatted by f, blank where the case is not in the combination.
func combinationRows(job *analysis.Job, f func(float64) string) [][]string {
	service := hasService(job)
	var rows [][]string
	for _, cb := range job.Combinations {
		row := []string{cb.Name, cb.Rule}
		if service {
			row = append(row, use(cb))
		}
		for i := range job.Model.Cases {
			cell := ""
			for _, tm := range cb.Terms {
				if tm.Case == i {
					cell = f(cb.Factor(i))
					break
				}
			}
			row = append(row, cell)
		}
		rows = append(rows, row)
	}
	return rows
}

// caseInfo returns the CaseInfo of case i; the zero value when the job
// gives none.
func caseInfo(job *analysis.Job, i int) combos.CaseInfo {
	if i < len(job.CaseInfo) {
		return job.CaseInfo[i]
	}
	return combos.CaseInfo{}
}

// reversible reports whether case i changes sign: with its alternative
// when the job has actions, else by its own CaseInfo.
func reversible(job *analysis.Job, i int) bool {
	if a := job.Actions; a != nil {
		p := a.Of[i]
		return a.List[p.Action].Alternatives[p.Alternative].Reversible
	}
	return caseInfo(job, i).Reversible
}

// unusedText names the cases no combination uses and what a run does
// with them; "" when every case is used. Names are escaped.
func unusedText(job *analysis.Job) string {
	var names []string
	for _, c := range job.Unused() {
		names = append(names, fmt.Sprintf("%s (%s)", Escape(job.Cases[c].Name), job.Cases[c].Kind))
	}
	if len(names) == 0 {
		return ""
	}
	if job.AllowUnused {
		return fmt.Sprintf("Not in any combination: %s; left out of every envelope ([combinations] unused = \"allow\").", strings.Join(names, ", "))
	}
	return fmt.Sprintf("Not in any combination: %s; govern run refuses the model until it is in one or [combinations] has unused = \"allow\".", strings.Join(names, ", "))
}

// actionRows gives each action of the job: its name, kind and
// alternatives, "WL or WR", an alternative's cases joined by "+" and
// named when the action has several alternatives and it is not a case's
// own; reversible ones are marked ±.
func actionRows(job *analysis.Job) [][]string {
	var rows [][]string
	for _, act := range job.Actions.List {
		var alts []string
		for _, alt := range act.Alternatives {
			var names []string
			for _, c := range alt.Cases {
				names = append(names, job.Model.Cases[c].Name)
			}
			s := strings.Join(names, " + ")
			if len(act.Alternatives) > 1 && (len(alt.Cases) > 1 || names[0] != alt.Name) {
				s = alt.Name + ": " + s
			}
			if alt.Reversible {
				s += " ±"
			}
			alts = append(alts, s)
		}
		rows = append(rows, []string{act.Name, act.Kind.String(), strings.Join(alts, " or ")})
	}
	return rows
}

// psiCells gives ψ0, ψ1, ψ2 of a variable case and where they come from.
func psiCells(ci combos.CaseInfo, k combos.Kind) []string {
	if k.Permanent() {
		return []string{"", "", "", ""}
	}
	out := make([]string, 0, 4)
	given, fromRow := false, false
	for p := combos.Psi0; p <= combos.Psi2; p++ {
		v, ok := ci.PsiFactor(p, k)
		if !ok {
			out = append(out, "")
			continue
		}
		out = append(out, num(v))
		if ci.PsiGiven[p-combos.Psi0] {
			given = true
		} else {
			fromRow = true
		}
	}
	var from []string
	if given {
		from = append(from, "the case")
	}
	if fromRow {
		from = append(from, "Table A1.1 "+ci.Row(k))
	}
	return append(out, strings.Join(from, ", "))
}

// hasService reports whether any combination of the job is a service one.
func hasService(job *analysis.Job) bool {
	for _, cb := range job.Combinations {
		if cb.Service {
			return true
		}
	}
	return false
}

// use names what a combination is for.
func use(cb combos.Combination) string {
	switch {
	case cb.Service:
		return "service"
	case cb.Allowable:
		return "allowable"
	}
	return "strength"
}
