package main

import (
	"strings"
	"testing"

	"govern/envelope/analysis"
	"govern/envelope/report"
)

// Column lines are named as the model names them: by the grid's own
// letters, and without a grid as the "line A" selectors count them. The
// reader passes the names on (analysis.Job.Lines), the tables and the
// report's sections show them.
func TestColumnLinesKeepTheirNames(t *testing.T) {
	titles := func(a *analysis.Result) []string {
		var out []string
		for _, tb := range summary(t, a).find("Columns ") {
			out = append(out, tb.title)
		}
		return out
	}
	t.Run("grid and an extra column off it", func(t *testing.T) {
		// Grid lines A, B, C at x = 0, 6, 12; one more column at x = -3,
		// joined to A1 by a beam.
		src := `[grid]
bays = [6.0, 6.0]
storeys = [4.0]
column = "C"
beam = "B"
` + tsection("C", 2e8, 0.01, 1e-4, 0) + tsection("B", 2e8, 0.01, 1e-4, 0) +
			tnode("P0", -3, 0, "fixed") + tnode("P1", -3, 4, "") +
			tmember("P0", "P1", "C") + tmember("P1", "A1", "B") + tdead(tudl("all beams", 10))
		a := analyseModel(t, src)
		got := titles(a)
		want := []string{
			"Columns at x = -3.00 m, on no grid line",
			"Columns on line A (x = 0.00 m)",
			"Columns on line B (x = 6.00 m)",
			"Columns on line C (x = 12.00 m)",
		}
		if strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Errorf("column lines:\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
		}
		for _, g := range analysis.Groups(a.Job) {
			if g.Line == "B" && (len(g.Members) != 1 || a.Job.Model.Members[g.Members[0]].Name != "B0-B1") {
				t.Errorf("line B holds %v", g.Members)
			}
		}
		var b strings.Builder
		if err := report.New(a).WriteHTML(&b); err != nil {
			t.Fatal(err)
		}
		for _, id := range []string{"line-x1", "line-A", "line-B", "line-C"} {
			if !strings.Contains(b.String(), `<section id="`+id+`">`) {
				t.Errorf("the report has no section %s", id)
			}
		}
	})
	t.Run("no grid: as the selectors count", func(t *testing.T) {
		// Nodes at x = -2 (a cantilever tip), 0 and 6: the selector
		// "line B" is the column at x = 0.
		src := tsection("S", 2e8, 0.01, 1e-4, 0) +
			tnode("T", -2, 4, "") + tnode("P0", 0, 0, "fixed") + tnode("P1", 0, 4, "") + tnode("Q0", 6, 0, "fixed") + tnode("Q1", 6, 4, "") +
			tmember("P0", "P1", "S") + tmember("Q0", "Q1", "S") + tmember("T", "P1", "S") + tmember("P1", "Q1", "S") +
			"[[case]]\nname = \"W\"\nkind = \"wind\"\n  [[case.load]]\n  type = \"udl\"\n  on = \"line B\"\n  direction = \"x\"\n  w = 1.0\n"
		a := analyseModel(t, src)
		want := "Columns on line B (x = 0.00 m)\nColumns on line C (x = 6.00 m)"
		if got := strings.Join(titles(a), "\n"); got != want {
			t.Errorf("column lines:\n%s\nwant\n%s", got, want)
		}
		if ld := a.Job.Model.Cases[0].MemberLoads; len(ld) != 1 || a.Job.Model.Members[ld[0].Member].Name != "P0-P1" {
			t.Fatalf("the selector line B picked %v", ld)
		}
	})
}
