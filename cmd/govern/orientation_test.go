package main

import (
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"

	"govern/envelope/report"
)

// fixedBeamRTL is a beam of 6 m fixed at both ends under 10 kN/m, entered
// from its right end to its left: member R-L starts at x = 6.
var fixedBeamRTL = tsection("S", 2e8, 0.01, 1e-4, 0) +
	tnode("L", 0, 0, "fixed") + tnode("R", 6, 0, "fixed") +
	tmember("R", "L", "S") + tdead(tudl("R-L", 10))

// num parses a table cell as a number.
func cellNum(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("cell %q is not a number", s)
	}
	return v
}

// A beam drawn right to left is shown as one drawn left to right: x from
// its left end, +M sagging (lower face in tension), deflection + up.
func TestBeamDrawnRightToLeft(t *testing.T) {
	const w, l, ei = 10.0, 6.0, 2e8 * 1e-4
	a := analyseModel(t, fixedBeamRTL)
	r := summary(t, a)
	tb := r.one(t, "Beams at level 0 (y = 0.00 m)")
	// Fixed-ended beam under a uniform load: wL²/24 sagging at midspan,
	// wL²/12 hogging at the ends, wL/2 shear (AISC Steel Construction
	// Manual Table 3-23 case 15, recalled from memory; statics by hand).
	if got := tb.cell(t, "+M", 0, "R-L"); got != "15.00" {
		t.Errorf("+M = %s, want wL²/24 = 15.00", got)
	}
	if got := tb.cell(t, "at x", 0, "R-L"); got != "3.00" {
		t.Errorf("+M at x = %s, want 3.00", got)
	}
	if got := tb.cell(t, "-M", 0, "R-L"); got != "-30.00" {
		t.Errorf("-M = %s, want -wL²/12 = -30.00", got)
	}
	if got := tb.cell(t, "|V|", 0, "R-L"); got != "30.00" {
		t.Errorf("|V| = %s, want wL/2 = 30.00", got)
	}
	// Deflection at midspan wL⁴/384EI, downward (same table, case 15).
	d := r.one(t, "Deflection of spans and cantilevers")
	want := -w * math.Pow(l, 4) / (384 * ei)
	if got := cellNum(t, d.cell(t, "down", 0, "L–R")); math.Abs(got-want) > 5e-4*math.Abs(want) {
		t.Errorf("down = %g, want -wL⁴/384EI = %g", got, want)
	}
	if got := d.cell(t, "up", 0, "L–R"); got != "0" {
		t.Errorf("up = %s, want 0", got)
	}

	t.Run("report station table", func(t *testing.T) {
		var b strings.Builder
		if err := report.New(a).WriteHTML(&b); err != nil {
			t.Fatal(err)
		}
		root := parseXML(t, []byte(b.String()))
		st := root.find(func(e *element) bool { return e.name == "table" && e.attr["class"] == "st" })
		if len(st) != 1 {
			t.Fatalf("%d station tables, want 1", len(st))
		}
		rows := map[string][]string{}
		for _, tr := range st[0].find(func(e *element) bool { return e.name == "tr" }) {
			var cells []string
			for _, td := range tr.children {
				if td.name == "td" {
					cells = append(cells, td.text.String())
				}
			}
			if len(cells) > 0 {
				rows[cells[0]] = cells
			}
		}
		// Cells: x, face, N max, comb., N min, comb., V max, comb.,
		// V min, comb., M max, comb., M min, comb.
		left, mid := rows["0.000"], rows["3.000"]
		if left == nil || mid == nil {
			t.Fatalf("no rows at x = 0 and 3: %v", rows)
		}
		if left[12] != "-30.00" || mid[10] != "15.00" || left[6] != "30.00" {
			t.Errorf("M at the left end %s, at midspan %s, V at the left end %s; want -30.00, 15.00, 30.00", left[12], mid[10], left[6])
		}
	})

	t.Run("JSON keeps member-local signs", func(t *testing.T) {
		code, out, stderr := exec("run", writeModel(t, fixedBeamRTL), "--json", "-")
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		var doc struct {
			Signs   string
			Members []struct {
				Stations []struct {
					X          float64
					M          struct{ Max float64 }
					Deflection struct{ Max float64 }
				}
			}
		}
		if err := json.Unmarshal([]byte(out), &doc); err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(doc.Signs, "member") {
			t.Errorf("signs = %q: the JSON does not say its signs are the member's own", doc.Signs)
		}
		st := doc.Members[0].Stations[5]
		// Local y of a member drawn right to left points down: the
		// midspan sag is -wL²/24 and the deflection +wL⁴/384EI.
		if st.X != 3 || math.Abs(st.M.Max+w*l*l/24) > 1e-9 || math.Abs(st.Deflection.Max-w*math.Pow(l, 4)/(384*ei)) > 1e-12 {
			t.Errorf("station %+v, want x 3, M -15, deflection %g", st, w*math.Pow(l, 4)/(384*ei))
		}
	})
}

// twoSpanRTL is a beam continuous over two 6 m spans on a pin and two
// rollers, the right span entered from right to left, under 10 kN/m; a
// column of depth 0.4 m rises, unloaded and free at its top, from each
// support, so that the beam ends have faces 0.2 m in from the nodes.
var twoSpanRTL = tsection("B", 2e8, 0.01, 1e-4, 0) + tsection("C", 2e8, 0.01, 1e-4, 0.4) +
	tnode("A1", 0, 3, "pinned") + tnode("B1", 6, 3, "roller") + tnode("C1", 12, 3, "roller") +
	tnode("A2", 0, 6, "") + tnode("B2", 6, 6, "") + tnode("C2", 12, 6, "") +
	tmember("A1", "B1", "B") + tmember("C1", "B1", "B") +
	tmember("A1", "A2", "C") + tmember("B1", "B2", "C") + tmember("C1", "C2", "C") +
	tdead(tudl("A1-B1", 10), tudl("C1-B1", 10))

func TestSupportTableOfABeamDrawnRightToLeft(t *testing.T) {
	a := analyseModel(t, twoSpanRTL)
	r := summary(t, a)
	// Two equal spans, uniform load: -wL²/8 = -45 over the middle
	// support, M = 3wLx/8 - wx²/2 in a span, so -37.70 at the face 0.2 m
	// from it and 4.30 at the face 0.2 m from an end support (three-moment
	// equation, by hand); +M 9wL²/128 near 3L/8, 25.20 at the station
	// 2.4 m from the end support.
	sup := r.one(t, "Beams at level 0 (y = 3.00 m): at the supports")
	for _, c := range []struct{ beam, node, cl, face, at string }{
		{"A1-B1", "A1", "0.00", "4.30", "0.20"},
		{"A1-B1", "B1", "-45.00", "-37.70", "5.80"},
		{"C1-B1", "B1", "-45.00", "-37.70", "0.20"},
		{"C1-B1", "C1", "0.00", "4.30", "5.80"},
	} {
		if got := sup.cell(t, "M min, centreline", 0, c.beam, c.node); got != c.cl {
			t.Errorf("%s at %s: centreline M min %s, want %s", c.beam, c.node, got, c.cl)
		}
		if got := sup.cell(t, "M min, face", 0, c.beam, c.node); got != c.face {
			t.Errorf("%s at %s: face M min %s, want %s", c.beam, c.node, got, c.face)
		}
		if got := sup.cell(t, "face at x", 0, c.beam, c.node); got != c.at {
			t.Errorf("%s at %s: face at x = %s, want %s", c.beam, c.node, got, c.at)
		}
	}
	// The rows of each beam run from its left end.
	var order []string
	for _, row := range sup.rows {
		order = append(order, row[0]+"@"+row[1])
	}
	if got := strings.Join(order, " "); got != "A1-B1@A1 A1-B1@B1 C1-B1@B1 C1-B1@C1" {
		t.Errorf("rows %s, want each beam from its left end", got)
	}
	beams := r.one(t, "Beams at level 0 (y = 3.00 m)")
	for _, c := range []struct{ beam, at string }{{"A1-B1", "2.40"}, {"C1-B1", "3.60"}} {
		if got, x := beams.cell(t, "+M", 0, c.beam), beams.cell(t, "at x", 0, c.beam); got != "25.20" || x != c.at {
			t.Errorf("%s: +M %s at x %s, want 25.20 at %s", c.beam, got, x, c.at)
		}
	}
}

// A rafter (a sloping member) shows the same numbers whichever way it is
// drawn: x from its lower, left end, +M sagging.
func TestRafterDrawnEitherWay(t *testing.T) {
	model := func(start, end string) string {
		return tsection("S", 2e8, 0.01, 1e-4, 0) + tnode("A", 0, 0, "pinned") + tnode("B", 6, 3, "roller") +
			tmember(start, end, "S") + tdead(tudl(start+"-"+end, 10))
	}
	ltr, rtl := analyseModel(t, model("A", "B")), analyseModel(t, model("B", "A"))
	a, b := ltr.Shown(0), rtl.Shown(0)
	// A simply supported sloping member under a gravity load W = wL along
	// it: M = Wa/8 at midspan, a the horizontal span (statics by hand).
	l := math.Hypot(6, 3)
	mid := len(a.Stations) / 2
	if m := a.Stations[mid].M.Max; math.Abs(m-10*l*6/8) > 1e-9 {
		t.Errorf("midspan M = %g, want wLa/8 = %g", m, 10*l*6/8)
	}
	for i := range a.Stations {
		p, q := a.Stations[i], b.Stations[i]
		for _, d := range []float64{p.X - q.X, p.N.Max - q.N.Max, p.V.Max - q.V.Max, p.M.Max - q.M.Max, p.M.Min - q.M.Min} {
			if math.Abs(d) > 1e-9 {
				t.Errorf("station %d: drawn A to B %+v, B to A %+v", i, p, q)
				break
			}
		}
	}
}

// The report draws a beam the same whichever way it was entered: the
// envelopes' curves (sagging below the beam, deflection as it moves) pass
// through the same points.
func TestReportDrawsABeamEitherWayAlike(t *testing.T) {
	fixedBeamLTR := strings.Replace(fixedBeamRTL, tmember("R", "L", "S"), tmember("L", "R", "S"), 1)
	fixedBeamLTR = strings.Replace(fixedBeamLTR, `on = "R-L"`, `on = "L-R"`, 1)
	curves := func(src string) map[string]string {
		a := analyseModel(t, src)
		var b strings.Builder
		if err := report.New(a).WriteHTML(&b); err != nil {
			t.Fatal(err)
		}
		root := parseXML(t, []byte(b.String()))
		out := map[string]string{}
		for _, id := range []string{"moment", "shear", "deflection"} {
			for _, p := range byID(root, id).find(func(e *element) bool { return e.name == "path" }) {
				out[id+" "+p.attr["class"]] += p.attr["d"] + ";"
			}
			for _, tx := range byID(root, id).find(func(e *element) bool { return e.name == "text" && e.attr["text-anchor"] != "" }) {
				if p := tx.text.String(); p != "" {
					out[id+" labels"] += tx.attr["x"] + "," + tx.attr["y"] + " " + p + ";"
				}
			}
		}
		return out
	}
	ltr, rtl := curves(fixedBeamLTR), curves(fixedBeamRTL)
	if len(ltr) < 9 {
		t.Fatalf("curves %v", ltr)
	}
	for k, v := range ltr {
		if rtl[k] != v {
			t.Errorf("%s: drawn left to right\n%s\nright to left\n%s", k, v, rtl[k])
		}
	}
	if !strings.Contains(ltr["moment labels"], " 15.0;") || !strings.Contains(ltr["moment labels"], " -30.0;") {
		t.Errorf("moment labels %q, want 15.0 (wL²/24) and -30.0 (wL²/12)", ltr["moment labels"])
	}
}
