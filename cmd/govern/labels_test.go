package main

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// Labels that must be true for what they mark, whatever the geometry.

// A column set out a millimetre off plumb over 3 m is a column: the "all
// columns" and "line A" selectors pick it, it is tabulated on its line
// (by its lower end, as the selectors count lines), and it gets no
// span/deflection as a beam would.
func TestLeaningColumnIsAColumn(t *testing.T) {
	src := tsection("S", 2e8, 0.01, 1e-4, 0) +
		tnode("A", 0, 0, "fixed") + tnode("B", 0.001, 3, "") + tnode("C", 6, 3, "") + tnode("D", 6, 0, "fixed") +
		tmember("A", "B", "S") + tmember("B", "C", "S") + tmember("D", "C", "S") +
		tdead(tudl("B-C", 10)) +
		"[[case]]\nname = \"W\"\nkind = \"wind\"\n" +
		"  [[case.load]]\n  type = \"udl\"\n  on = \"all columns\"\n  direction = \"x\"\n  w = 1\n" +
		"  [[case.load]]\n  type = \"udl\"\n  on = \"line A\"\n  direction = \"x\"\n  w = 0.5\n" +
		"[[combination]]\nname = \"W\"\nfactors = { W = 1.0 }\n"
	a := analyseModel(t, src)
	// Statics: 1 kN/m along both columns and 0.5 kN/m more along the one
	// on line A (length √(3² + 0.001²)): ΣFx = 1·(l + 3) + 0.5·l = 7.5000003,
	// and the supports take it back.
	l := math.Hypot(0.001, 3)
	want := l + 3 + 0.5*l
	w := a.Statics[1]
	if math.Abs(w.Applied.Fx-want) > 1e-9 || math.Abs(w.Reactions.Fx+want) > 1e-9 {
		t.Errorf("wind: loads ΣFx %.9g, reactions %.9g; want %.9g and its opposite (both columns selected)", w.Applied.Fx, w.Reactions.Fx, want)
	}
	r := summary(t, a)
	var titles []string
	for _, tb := range r.tables {
		titles = append(titles, tb.title)
	}
	all := strings.Join(titles, "\n")
	if strings.Contains(all, "Other members") {
		t.Errorf("the leaning column is among the other members:\n%s", all)
	}
	if got := r.one(t, "Columns on line A (x = 0.00 m)").rows; len(got) != 1 || got[0][0] != "A-B" {
		t.Errorf("line A holds %q, want A-B", got)
	}
	// Without a grid, lines are every distinct node X from the left, as
	// the selectors count them: B at x = 0.001 is line B, so the column at
	// x = 6 is on line C, which is what `on = "line C"` picks.
	if got := r.one(t, "Columns on line C (x = 6.00 m)").rows; len(got) != 1 || got[0][0] != "D-C" {
		t.Errorf("line C holds %q, want D-C", got)
	}
	tb := r.one(t, "Deflection of spans and cantilevers")
	if len(tb.rows) != 1 || tb.rows[0][0] != "B–C" {
		t.Errorf("deflection rows %q, want the beam B–C alone", tb.rows)
	}
}

// The table of the beam ends at the column faces lists the ends that hold
// a span (supports, columns), not a cantilever's free tip.
func TestFaceTableHasNoFreeTip(t *testing.T) {
	src := tsection("C", 2e8, 0.36, 0.0108, 0.6) + tsection("B", 2e8, 0.2, 0.004, 0) +
		tnode("A0", 0, 0, "fixed") + tnode("A1", 0, 3, "") + tnode("T", -1.5, 3, "") +
		tnode("B0", 6, 0, "fixed") + tnode("B1", 6, 3, "") +
		tmember("A0", "A1", "C") + tmember("B0", "B1", "C") + tmember("A1", "T", "B") + tmember("A1", "B1", "B") +
		tdead(tudl("all beams", 10))
	tb := summary(t, analyseModel(t, src)).one(t, "Beams at level 1 (y = 3.00 m): at the supports")
	var ends []string
	for _, row := range tb.rows {
		ends = append(ends, row[0]+"@"+row[1])
	}
	if got := strings.Join(ends, " "); got != "A1-T@A1 A1-B1@A1 A1-B1@B1" {
		t.Errorf("rows %s; want every end but the free tip T", got)
	}
	// The cantilever's root carries -wc²/2 = -11.25 at the centreline
	// (statics).
	if got := tb.cell(t, "M min, centreline", 0, "A1-T", "A1"); got != "-11.25" {
		t.Errorf("root of the cantilever: %s, want -11.25", got)
	}
}

// The headings say how the members they hold are shown: with members
// that are neither beams nor columns (rafters), that they are shown as
// beams are.
func TestHeadingsNameOtherMembers(t *testing.T) {
	rafter := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 3, "roller") +
		tmember("B", "A", "S") + tdead(tudl("B-A", 10))
	beam := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 0, "roller") +
		tmember("A", "B", "S") + tdead(tudl("A-B", 10))
	for _, c := range []struct {
		name, src, want string
	}{
		{"a rafter", rafter, "beams and other members: x from the left end, +M sagging; columns: x from the start node"},
		{"beams only", beam, "(in m; beams: x from the left end, +M sagging; columns: x from the start node)"},
	} {
		t.Run(c.name, func(t *testing.T) {
			code, out, stderr := exec("run", writeModel(t, c.src))
			if code != 0 {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			// Headings are wrapped to the terminal's width: read them
			// with line breaks as spaces.
			if !strings.Contains(strings.Join(strings.Fields(out), " "), c.want) {
				t.Errorf("the headings do not say %q:\n%s", c.want, out)
			}
			if unit := strings.Contains(strings.Join(strings.Fields(out), " "), "; beams and other members: x from the left end, M sagging positive"); unit != (c.name == "a rafter") {
				t.Errorf("the units line names other members: %v", unit)
			}
		})
	}
}

// A unit slip (E = 200 for 2e8) gives a deflection larger than the span:
// span/deflection is shown as it is, never as L/0, and numbers keep a
// bounded width however large.
func TestUnitSlipShownHonestly(t *testing.T) {
	// A simple span of 6 m, w = 10, EI = 200 × 1e-4 = 0.02: 5wL⁴/384EI =
	// 8437.5 (AISC Table 3-23 case 1, recalled from memory), so
	// span/deflection 6/8437.5 = 0.000711, shown rounded down L/0.00071.
	slip := func(e float64) string {
		return tsection("S", e, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 0, "roller") +
			tmember("A", "B", "S") + tdead(tudl("A-B", 10))
	}
	tb := summary(t, analyseModel(t, slip(200))).one(t, "Deflection of spans and cantilevers")
	if got := tb.cell(t, "span/deflection", 0, "A–B"); got != "L/0.00071" {
		t.Errorf("span/deflection %s, want L/0.00071", got)
	}
	if got := tb.cell(t, "down", 0, "A–B"); !near(got, -8437.5, 1e-4) || strings.Contains(got, ".") {
		t.Errorf("down %s, want -8437.5 to four figures", got)
	}
	// E = 2e-285: a deflection of 8.4e290, written with an exponent; no
	// number of any table is longer than 20 characters.
	r := summary(t, analyseModel(t, slip(2e-285)))
	if got := r.one(t, "Deflection of spans and cantilevers").cell(t, "down", 0, "A–B"); !near(got, -8.4375e290, 1e-3) || !strings.Contains(got, "e+290") {
		t.Errorf("down %s, want -8.4375e+290 with an exponent", got)
	}
	for _, tb := range r.tables {
		for _, row := range tb.rows {
			for _, cell := range row {
				if len(cell) > 20 {
					t.Errorf("%s: a cell of %d characters: %q", tb.title, len(cell), cell)
				}
			}
		}
	}
}

// near reports whether the cell s holds a number within rel of want.
func near(s string, want, rel float64) bool {
	v, err := strconv.ParseFloat(s, 64)
	return err == nil && math.Abs(v-want) <= rel*math.Abs(want)
}

// A reaction component that is zero in every combination has no
// governing combination: "-", not one picked by round-off; a component
// that is not zero names its combination.
func TestZeroReactionNamesNoCombination(t *testing.T) {
	// A simple span of 6 m under 10 kN/m on a pin and a roller: the pin's
	// Fx is zero in every combination; each Fy is wL/2 = 30 under 1.0D
	// (statics).
	src := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 0, "roller") +
		tmember("A", "B", "S") + tdead(tudl("A-B", 10))
	tb := summary(t, analyseModel(t, src)).one(t, "Reactions")
	for i, want := range []string{"-", "-"} {
		if got := tb.cell(t, "governing", i, "A", "Fx (kN)"); got != want {
			t.Errorf("A Fx, governing %d: %q, want %q", i, got, want)
		}
	}
	if got, v := tb.cell(t, "governing", 0, "", "Fy (kN)"), tb.cell(t, "max", 0, "", "Fy (kN)"); got != "1.0D" || v != "30.00" {
		t.Errorf("A Fy: %s by %q, want 30.00 by 1.0D", v, got)
	}
}
