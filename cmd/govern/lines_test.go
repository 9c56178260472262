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

// Levels are named as the model names them: without a grid, the distinct
// node heights numbered from 0 at the lowest, as the "level N" selectors
// count them; with a grid, the grid's levels. The titles, the deflection
// table and the report's sections all use those names.
func TestLevelsKeepTheirNames(t *testing.T) {
	floors := func(a *analysis.Result) []string {
		var out []string
		for _, tb := range summary(t, a).find("Beams ") {
			if !strings.Contains(tb.title, ":") {
				out = append(out, tb.title)
			}
		}
		return out
	}
	t.Run("no grid: a node at mid-height of a column", func(t *testing.T) {
		// Node heights 0, 2 and 4: the beam at 4 is what "level 2" picks,
		// the beam on supports at 0 what "level 0" picks.
		src := tsection("S", 2e8, 0.01, 1e-4, 0) +
			tnode("A0", 0, 0, "pinned") + tnode("B0", 6, 0, "roller") +
			tnode("C0", 10, 0, "fixed") + tnode("C1", 10, 2, "") + tnode("C2", 10, 4, "") + tnode("D2", 16, 4, "pinned") +
			tmember("A0", "B0", "S") + tmember("C0", "C1", "S") + tmember("C1", "C2", "S") + tmember("C2", "D2", "S") +
			tdead(tudl("level 2", 10), tudl("level 0", 5))
		a := analyseModel(t, src)
		mo := a.Job.Model
		for _, ld := range mo.Cases[0].MemberLoads {
			if name := mo.Members[ld.Member].Name; (name == "C2-D2") != (ld.W == 10) {
				t.Errorf("%s carries %g", name, ld.W)
			}
		}
		want := "Beams at level 0 (y = 0.00 m)\nBeams at level 2 (y = 4.00 m)"
		if got := strings.Join(floors(a), "\n"); got != want {
			t.Errorf("floors:\n%s\nwant\n%s", got, want)
		}
		tb := summary(t, a).one(t, "Deflection of spans and cantilevers")
		for _, c := range []struct{ span, level string }{{"A0–B0", "0"}, {"C2–D2", "2"}} {
			if got := tb.cell(t, "level", 0, c.span); got != c.level {
				t.Errorf("%s: level %s, want %s", c.span, got, c.level)
			}
		}
		var b strings.Builder
		if err := report.New(a).WriteHTML(&b); err != nil {
			t.Fatal(err)
		}
		for _, id := range []string{"level-0", "level-2"} {
			if !strings.Contains(b.String(), `<section id="`+id+`">`) {
				t.Errorf("the report has no section %s", id)
			}
		}
		if strings.Contains(b.String(), `<section id="level-1">`) {
			t.Error("the report has a section level-1, a level with no beams")
		}
	})
	t.Run("grid: its own levels, and a beam on none of them", func(t *testing.T) {
		// Grid levels 0, 4 and 7, and a beam of its own at y = 2 beside
		// the grid, on a pin and a roller: the grid's levels keep their
		// numbers, and the beam is on none of them.
		src := `[grid]
bays = [6.0]
storeys = [4.0, 3.0]
column = "S"
beam = "S"
` + tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("P", 9, 2, "pinned") + tnode("Q", 12, 2, "roller") +
			tmember("P", "Q", "S") + tdead(tudl("level 1", 10), tudl("P-Q", 5))
		a := analyseModel(t, src)
		if ld := a.Job.Model.Cases[0].MemberLoads[0]; a.Job.Model.Members[ld.Member].Name != "A1-B1" {
			t.Errorf("level 1 picked %s", a.Job.Model.Members[ld.Member].Name)
		}
		want := "Beams at y = 2.00 m, on no grid level\nBeams at level 1 (y = 4.00 m)\nBeams at level 2 (y = 7.00 m)"
		if got := strings.Join(floors(a), "\n"); got != want {
			t.Errorf("floors:\n%s\nwant\n%s", got, want)
		}
	})
}
