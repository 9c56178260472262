package main

import (
	"flag"
	"fmt"
	"io"
	"strings"

	"govern/cmd/govern/modelfile"
	"govern/combos"
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
	flags: func(fs *flag.FlagSet) any {
		f := &combosFlags{}
		fs.StringVar(&f.csv, "csv", "", "write the combinations as CSV to `FILE` (- for standard output)")
		return f
	},
	run: func(env *environ, opts any, args []string) error {
		if len(args) != 1 {
			return usagef("need one model file, got %d arguments", len(args))
		}
		f := opts.(*combosFlags)
		job, err := loadModel(args[0])
		if err != nil {
			return err
		}
		f.csv = stdoutPath(env.stdout, f.csv)
		var outs []output
		if f.csv != "" {
			outs = append(outs, output{path: f.csv, write: func(w io.Writer) error { return writeCombosCSV(w, job) }})
		}
		if f.csv != "-" {
			outs = append(outs, output{path: "-", write: func(w io.Writer) error { return writeCombosTable(w, job) }})
		}
		return commitOutputs(env.stdout, args[0], outs)
	},
}

// writeCombosTable prints where the combinations come from, the load
// cases, the combinations with their factors, and the caution.
func writeCombosTable(w io.Writer, job *modelfile.Job) error {
	mo := job.Model
	if job.Title != "" {
		fmt.Fprintf(w, "%s\n", escape(job.Title))
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
		fmt.Fprintf(w, ": %d from %s, %d from the model.\n", n, escape(s.Name), bySource["model"])
		if s.Title != "" {
			fmt.Fprintf(w, "%s: %s.\n", escape(s.Name), escape(s.Title))
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
		fmt.Fprintf(w, "Note: %s\n", escape(job.Actions.Note))
	}
	fmt.Fprintf(w, "\n")

	psi := job.Set != nil && job.Set.UsesPsi()
	header := []string{"case", "kind", "reversible"}
	if psi {
		header = append(header, "ψ0", "ψ1", "ψ2", "ψ from")
	}
	var rows [][]string
	for i, c := range mo.Cases {
		var ci combos.CaseInfo
		if i < len(job.CaseInfo) {
			ci = job.CaseInfo[i]
		}
		rev := ci.Reversible
		if a := job.Actions; a != nil {
			// a case changes sign with its alternative
			p := a.Of[i]
			rev = a.List[p.Action].Alternatives[p.Alternative].Reversible
		}
		row := []string{c.Name, job.Cases[i].Kind.String(), map[bool]string{true: "yes", false: "no"}[rev]}
		if psi {
			row = append(row, psiCells(ci, job.Cases[i].Kind)...)
		}
		rows = append(rows, row)
	}
	fmt.Fprintf(w, "Load cases\n")
	t := newTable(w, header...)
	if err := t.Bulk(rows); err != nil {
		return err
	}
	if err := t.Render(); err != nil {
		return err
	}

	if job.Actions != nil {
		fmt.Fprintf(w, "\nActions (two alternatives of one action never act together)\n")
		t = newTable(w, "action", "kind", "alternatives: cases")
		if err := t.Bulk(actionRows(job)); err != nil {
			return err
		}
		if err := t.Render(); err != nil {
			return err
		}
	}

	header = []string{"combination", "rule"}
	service := hasService(job)
	if service {
		header = append(header, "use")
	}
	for _, c := range mo.Cases {
		header = append(header, c.Name)
	}
	rows = rows[:0]
	for _, cb := range job.Combinations {
		row := []string{cb.Name, cb.Rule}
		if service {
			row = append(row, use(cb))
		}
		for i := range mo.Cases {
			cell := ""
			for _, tm := range cb.Terms {
				if tm.Case == i {
					cell = combos.FormatFactor(cb.Factor(i))
					break
				}
			}
			row = append(row, cell)
		}
		rows = append(rows, row)
	}
	fmt.Fprintf(w, "\nLoad combinations (factor on each load case)\n")
	t = newTable(w, header...)
	if err := t.Bulk(rows); err != nil {
		return err
	}
	if err := t.Render(); err != nil {
		return err
	}
	if u := unusedText(job); u != "" {
		fmt.Fprintf(w, "\n%s\n", u)
	}
	fmt.Fprintf(w, "\n%s\n", caution)
	return nil
}

// unusedText names the cases no combination uses and what a run does
// with them; "" when every case is used.
func unusedText(job *modelfile.Job) string {
	var names []string
	for _, c := range job.Unused() {
		names = append(names, fmt.Sprintf("%s (%s)", escape(job.Cases[c].Name), job.Cases[c].Kind))
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
func actionRows(job *modelfile.Job) [][]string {
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
		row := ci.Category
		if row == "" {
			row = "wind"
		}
		from = append(from, "Table A1.1 "+row)
	}
	return append(out, strings.Join(from, ", "))
}

// hasService reports whether any combination of the job is a service one.
func hasService(job *modelfile.Job) bool {
	for _, cb := range job.Combinations {
		if cb.Service {
			return true
		}
	}
	return false
}

// use names what a combination is for.
func use(cb combos.Combination) string {
	if cb.Service {
		return "service"
	}
	return "strength"
}

// writeCombosCSV writes one row per combination: name, rule, with service
// combinations their use, then the factor on each load case, empty where
// the case is not in it.
func writeCombosCSV(w io.Writer, job *modelfile.Job) error {
	cases := job.Model.Cases
	cw := newCSVWriter(w)
	header := []string{"combination", "rule"}
	service := hasService(job)
	if service {
		header = append(header, "use")
	}
	for _, c := range cases {
		header = append(header, c.Name)
	}
	if err := cw.Write(header); err != nil {
		return err
	}
	for _, cb := range job.Combinations {
		row := []string{cb.Name, cb.Rule}
		if service {
			row = append(row, use(cb))
		}
		for i := range cases {
			cell := ""
			for _, tm := range cb.Terms {
				if tm.Case == i {
					cell = num(cb.Factor(i))
					break
				}
			}
			row = append(row, cell)
		}
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
