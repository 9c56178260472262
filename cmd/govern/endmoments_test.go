package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// stateRows returns, by member and value ("N max", ...), the rows of the
// tables of end moments: a member's name is on its first row only.
func stateRows(t *testing.T, r *recTables) (header []string, rows map[string]map[string][]string) {
	t.Helper()
	tbs := r.find("End moments, ")
	if len(tbs) == 0 {
		t.Fatal("no table of end moments")
	}
	rows = map[string]map[string][]string{}
	for _, tb := range tbs {
		header = tb.header
		member := ""
		for _, row := range tb.rows {
			if row[0] != "" {
				member = row[0]
				rows[member] = map[string][]string{}
			}
			rows[member][row[1]] = row
		}
	}
	return header, rows
}

// stateCell returns the cell of a row under the column headed name.
func stateCell(t *testing.T, header, row []string, name string) string {
	t.Helper()
	for i, h := range header {
		if headed(h, name) {
			return row[i]
		}
	}
	t.Fatalf("no column %q in %q", name, header)
	return ""
}

// wantEnds gives what the end moment columns show for end moments ma at
// the start and mb at the end: M1 the smaller in size, M2 the larger and
// its node, M1/M2 with the sign of ACI 318-19 6.6.4.5.3 and AISC 360-16
// Appendix 8 (negative in single curvature, where the moments at the two
// ends bend the same face into tension, positive in double).
func wantEnds(ma, mb float64, start, end string) (m1, m2 float64, at string, ratio float64, curvature string) {
	m1, m2, at = ma, mb, end
	if math.Abs(ma) > math.Abs(mb) {
		m1, m2, at = mb, ma, start
	}
	ratio = -m1 / m2
	curvature = "single"
	if m1*m2 < 0 {
		curvature = "double"
	}
	return
}

// checkState checks one row of the tables of end moments.
func checkState(t *testing.T, header, row []string, n, m float64, combo string, ma, mb float64, start, end string, tol float64, why string) {
	t.Helper()
	num := func(col string, v float64) {
		t.Helper()
		if s := stateCell(t, header, row, col); !printedNear(s, v, tol) {
			t.Errorf("%s %s: %s %s, want %.6g (%s)", row[0], row[1], col, s, v, why)
		}
	}
	text := func(col, want string) {
		t.Helper()
		if s := stateCell(t, header, row, col); s != want {
			t.Errorf("%s %s: %s %q, want %q (%s)", row[0], row[1], col, s, want, why)
		}
	}
	num("N", n)
	num("M", m)
	text("governing", combo)
	m1, m2, at, ratio, curvature := wantEnds(ma, mb, start, end)
	num("M1", m1)
	num("M2", m2)
	if math.Abs(math.Abs(ma)-math.Abs(mb)) <= tol {
		// Equal in size: either end is the larger, to round-off.
		if s := stateCell(t, header, row, "M2 at"); s != start && s != end {
			t.Errorf("%s %s: M2 at %q, want %s or %s", row[0], row[1], s, start, end)
		}
	} else {
		text("M2 at", at)
	}
	num("M1/M2", ratio)
	text("curvature", curvature)
}

// TestEndMomentsPortal: the fixed-base portal of testdata/tables/portal.toml
// (closed forms in columns_portal_test.go: the rigid frame formulas of
// docs/verification.md and statics). For each column and each governing
// value (N max, N min, |M| max) the state is the combination the
// closed forms make govern; the moment is linear along a column, so its
// ends are the closed forms at x = 0 and x = h in that same combination.
func TestEndMomentsPortal(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(renderedDir, "portal.toml"))
	if err != nil {
		t.Fatal(err)
	}
	header, rows := stateRows(t, summary(t, analyseModel(t, string(src))))
	tol := columnsFormulaTol * columnsScale
	for _, col := range []struct {
		name, start, end string
		a                bool
	}{{"A0-A1", "A0", "A1", true}, {"B0-B1", "B0", "B1", false}} {
		t.Run(col.name, func(t *testing.T) {
			for _, s := range []struct {
				what string
				q    func(portalForces) float64
			}{
				{"N max", func(f portalForces) float64 { return f.n }},
				{"N min", func(f portalForces) float64 { return -f.n }},
				{"|M| max", func(f portalForces) float64 { return math.Abs(f.m) }},
			} {
				pk := portalExtreme(t, portalStrength, col.name, portalColumnX, s.q)
				row := rows[col.name][s.what]
				if row == nil {
					t.Fatalf("no row %s %s", col.name, s.what)
				}
				ma, mb := portalColumn(pk.c, col.a, 0).m, portalColumn(pk.c, col.a, portalH).m
				checkState(t, header, row, pk.f.n, pk.f.m, pk.c.name, ma, mb, col.start, col.end, tol,
					fmt.Sprintf("%s by %s at x = %g: base moment and top moment of the rigid frame formulas in the same combination", s.what, pk.c.name, pk.x))
			}
		})
	}
}

// TestEndMomentsCurvature: single curvature and one end moment alone,
// for a column drawn from its foot up and from its top down.
//
//   - A column fixed at both ends under a uniform lateral load w: both end
//     moments are wh²/12 and bend the loaded face's opposite side into
//     tension at both ends (fixed-end moments, common practice), so the
//     moment at the two ends has one sign: single curvature, M1/M2 = −1
//     by the sign of ACI 318-19 6.6.4.5.3.
//   - A cantilever column, fixed at its foot and free at its top, under a
//     lateral load H at its top: by statics M = H·h at the foot and 0 at
//     the top: M1 = 0, M1/M2 = 0, bent one way only (single curvature).
func TestEndMomentsCurvature(t *testing.T) {
	const h, w, load = 4.0, 10.0, 5.0
	for _, down := range []bool{false, true} {
		member := func() string {
			if down {
				return tmember("T", "F", "C")
			}
			return tmember("F", "T", "C")
		}
		start, end := "F", "T"
		if down {
			start, end = "T", "F"
		}
		t.Run("fixed-fixed, drawn down "+strconv.FormatBool(down), func(t *testing.T) {
			src := tsection("C", 2e8, 0.01, 1e-4, 0) + tnode("F", 0, 0, "fixed") + tnode("T", 0, h, "fixed") + member() +
				tdead("  [[case.load]]\n  type = \"udl\"\n  on = \"all columns\"\n  w = "+strconv.FormatFloat(w, 'g', -1, 64)+"\n  direction = \"x\"\n")
			header, rows := stateRows(t, summary(t, analyseModel(t, src)))
			name := start + "-" + end
			if rows[name] == nil {
				t.Fatalf("no rows of %s: %v", name, rows)
			}
			row := rows[name]["|M| max"]
			fem := w * h * h / 12
			m := stateCell(t, header, row, "M")
			v, err := strconv.ParseFloat(m, 64)
			if err != nil || !printedNear(strings.TrimPrefix(m, "-"), fem, columnsExactTol*columnsScale) {
				t.Fatalf("|M| max %s, want ±%.6g (wh²/12)", m, fem)
			}
			// Both ends carry the same moment, of the sign of |M| max's.
			end := math.Copysign(fem, v)
			checkState(t, header, row, 0, end, "1.0D", end, end, start, name[len(start)+1:], columnsExactTol*columnsScale, "fixed-end moments wh²/12 at both ends, one sign: single curvature")
			if r := stateCell(t, header, row, "M1/M2"); r != "-1.00" {
				t.Errorf("M1/M2 %s, want -1.00", r)
			}
		})
		t.Run("cantilever, drawn down "+strconv.FormatBool(down), func(t *testing.T) {
			src := tsection("C", 2e8, 0.01, 1e-4, 0) + tnode("F", 0, 0, "fixed") + tnode("T", 0, h, "") + member() +
				tdead("  [[case.load]]\n  type = \"node\"\n  node = \"T\"\n  fx = "+strconv.FormatFloat(load, 'g', -1, 64)+"\n")
			header, rows := stateRows(t, summary(t, analyseModel(t, src)))
			name := start + "-" + end
			row := rows[name]["|M| max"]
			m := stateCell(t, header, row, "M")
			v, err := strconv.ParseFloat(m, 64)
			if err != nil || !printedNear(strings.TrimPrefix(m, "-"), load*h, columnsExactTol*columnsScale) {
				t.Fatalf("|M| max %s, want ±%.6g (H·h)", m, load*h)
			}
			base := math.Copysign(load*h, v)
			ma, mb := base, 0.0
			if down {
				ma, mb = 0, base
			}
			checkState(t, header, row, 0, base, "1.0D", ma, mb, start, end, columnsExactTol*columnsScale, "statics: H·h at the foot, 0 at the free top")
			if got := stateCell(t, header, row, "M2 at"); got != "F" {
				t.Errorf("M2 at %s, want the foot F", got)
			}
		})
	}
}

// TestFoundationLoadsPortal: the table of foundation loads of the portal
// of testdata/tables/portal.toml gives, for each extreme of each reaction
// component, the whole reaction of that same combination: Fx, Fy and M at
// the base from the closed forms of columns_portal_test.go (rigid frame
// formulas of docs/verification.md and statics), all three of the
// combination that gives the extreme.
func TestFoundationLoadsPortal(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(renderedDir, "portal.toml"))
	if err != nil {
		t.Fatal(err)
	}
	tb := summary(t, analyseModel(t, string(src))).one(t, "Foundation loads")
	rows := map[string][]string{}
	node := ""
	for _, r := range tb.rows {
		if r[0] != "" {
			node = r[0]
		}
		rows[node+" "+r[1]] = r
	}
	tol := columnsFormulaTol * columnsScale
	for _, n := range []struct {
		name string
		a    bool
	}{{"A0", true}, {"B0", false}} {
		for k, comp := range []string{"Fx", "Fy", "M"} {
			var cs []combValue
			for _, c := range portalStrength {
				cs = append(cs, combValue{c.name, portalReaction(c, n.a)[k]})
			}
			for _, e := range []struct {
				what string
				x    combExtreme
			}{{"max", largestOf(cs)}, {"min", smallestOf(cs)}} {
				row := rows[n.name+" "+comp+" "+e.what]
				if row == nil {
					t.Fatalf("no row %s %s %s in %q", n.name, comp, e.what, tb.rows)
				}
				if !printedNear(stateCell(t, tb.header, row, "value"), e.x.v, tol) {
					t.Errorf("%s %s %s: %s, want %.6g", n.name, comp, e.what, row[2], e.x.v)
				}
				by := stateCell(t, tb.header, row, "governing")
				var c *portalCombo
				for i := range portalStrength {
					if portalStrength[i].name == by {
						c = &portalStrength[i]
					}
				}
				if c == nil || !slices.Contains(e.x.by, by) {
					t.Fatalf("%s %s %s: governed by %q, want one of %q", n.name, comp, e.what, by, e.x.by)
				}
				r := portalReaction(*c, n.a)
				for i, with := range []string{"with Fx", "with Fy", "with M"} {
					if s := stateCell(t, tb.header, row, with); !printedNear(s, r[i], tol) {
						t.Errorf("%s %s %s by %s: %s %s, want %.6g (the reaction of the same combination)", n.name, comp, e.what, by, with, s, r[i])
					}
				}
			}
		}
	}
}

// TestBeamConcurrentForces: the forces acting with each of a beam's
// governing values, on the beam fixed at both ends of
// testdata/tables/fixed-beam.toml (L = 6 m, the heavier load 1.2D+1.6L,
// w = 1.2·10 + 1.6·5 = 20 kN/m). Fixed-end beam (AISC Manual Table 3-23,
// case 15, recalled from memory): at midspan +M = wL²/24 with V = 0; at
// an end −M = −wL²/12 with V = ±wL/2, and the largest shear wL/2 with
// M = −wL²/12 (statics).
func TestBeamConcurrentForces(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(renderedDir, "fixed-beam.toml"))
	if err != nil {
		t.Fatal(err)
	}
	tb := summary(t, analyseModel(t, string(src))).one(t, "Beams at level")
	if len(tb.rows) != 1 {
		t.Fatalf("rows %q", tb.rows)
	}
	row := tb.rows[0]
	const w, l = 20.0, 6.0
	tol := columnsExactTol * columnsScale
	cell := func(path ...string) string {
		t.Helper()
		at := -1
		for _, name := range path {
			for i := at + 1; i < len(tb.header); i++ {
				if headed(tb.header[i], name) {
					at = i
					break
				}
			}
		}
		if at < 0 {
			t.Fatalf("no column %q in %q", path, tb.header)
		}
		return row[at]
	}
	for _, c := range []struct {
		path []string
		want float64
		why  string
	}{
		{[]string{"+M"}, w * l * l / 24, "wL²/24 at midspan"},
		{[]string{"+M", "with V"}, 0, "V = 0 at midspan"},
		{[]string{"-M"}, -w * l * l / 12, "−wL²/12 at an end"},
		{[]string{"|V|"}, w * l / 2, "wL/2 at an end"},
		{[]string{"|V|", "with M"}, -w * l * l / 12, "−wL²/12 at that end"},
	} {
		if s := cell(c.path...); !printedNear(s, c.want, tol) {
			t.Errorf("%v: %s, want %.6g (%s)", c.path, s, c.want, c.why)
		}
	}
	// −M is at one end or the other (they tie): V there is +wL/2 at the
	// left end and −wL/2 at the right.
	want := w * l / 2
	if cell("-M", "at x") != "0.00" {
		want = -want
	}
	if s := cell("-M", "with V"); !printedNear(s, want, tol) {
		t.Errorf("-M with V: %s, want %.6g (±wL/2 at the end of −M)", s, want)
	}
}

// TestEndMomentsSlopingMember: a member neither beam nor column (rising
// 4 in 3, length 5 m), fixed at both ends under a gravity load of 10 kN/m
// along its length, drawn from either end. The load across it is
// 10 × 3/5 = 6 kN/m, so both end moments are 6 × 5²/12 = 12.5 kN·m
// (fixed-end moments, common practice) and of one sign: single curvature,
// M1/M2 = −1, whichever way the member was drawn.
func TestEndMomentsSlopingMember(t *testing.T) {
	for _, rev := range []bool{false, true} {
		t.Run("drawn from the top "+strconv.FormatBool(rev), func(t *testing.T) {
			m := tmember("P", "Q", "S")
			if rev {
				m = tmember("Q", "P", "S")
			}
			src := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("P", 0, 0, "fixed") + tnode("Q", 3, 4, "fixed") + m +
				tdead("  [[case.load]]\n  type = \"udl\"\n  on = \"all\"\n  w = 10\n")
			src = strings.Replace(src, `on = "all"`, `on = "`+map[bool]string{false: "P-Q", true: "Q-P"}[rev]+`"`, 1)
			header, rows := stateRows(t, summary(t, analyseModel(t, src)))
			name := map[bool]string{false: "P-Q", true: "Q-P"}[rev]
			row := rows[name]["|M| max"]
			if row == nil {
				t.Fatalf("no |M| max row of %s: %v", name, rows)
			}
			for col, want := range map[string]string{"M1/M2": "-1.00", "curvature": "single"} {
				if got := stateCell(t, header, row, col); got != want {
					t.Errorf("%s %s, want %s", col, got, want)
				}
			}
			for _, col := range []string{"M1", "M2"} {
				if s := stateCell(t, header, row, col); !printedNear(strings.TrimPrefix(s, "-"), 12.5, columnsExactTol*columnsScale) {
					t.Errorf("%s %s, want ±12.5 (6 × 5²/12)", col, s)
				}
			}
		})
	}
}

// TestEndMomentsSlopingPropped: the sloping member of
// TestEndMomentsSlopingMember fixed at its foot P and pinned at Q: the
// fixed end takes w⊥L²/8 = 6 × 5²/8 = 18.75 kN·m and the pin none
// (propped cantilever, common practice): M2 at P whichever way the member
// was drawn, M1 = 0, M1/M2 = 0, single curvature.
func TestEndMomentsSlopingPropped(t *testing.T) {
	for _, rev := range []bool{false, true} {
		t.Run("drawn from the top "+strconv.FormatBool(rev), func(t *testing.T) {
			name, m := "P-Q", tmember("P", "Q", "S")
			if rev {
				name, m = "Q-P", tmember("Q", "P", "S")
			}
			src := tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("P", 0, 0, "fixed") + tnode("Q", 3, 4, "pinned") + m +
				tdead("  [[case.load]]\n  type = \"udl\"\n  on = \""+name+"\"\n  w = 10\n")
			header, rows := stateRows(t, summary(t, analyseModel(t, src)))
			row := rows[name]["|M| max"]
			if row == nil {
				t.Fatalf("no |M| max row of %s: %v", name, rows)
			}
			for col, want := range map[string]string{"M2 at": "P", "M1/M2": "0.00", "curvature": "single", "M1": "0.00"} {
				if got := stateCell(t, header, row, col); got != want {
					t.Errorf("%s %s, want %s", col, got, want)
				}
			}
			if s := stateCell(t, header, row, "M2"); !printedNear(strings.TrimPrefix(s, "-"), 18.75, columnsExactTol*columnsScale) {
				t.Errorf("M2 %s, want ±18.75 (w⊥L²/8)", s)
			}
		})
	}
}
