package main

import (
	"context"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/combos"
	"govern/envelope/analysis"
)

// reducedNs returns the first storey column col's axial force at its foot
// in testdata/tables/reduced-frame.toml: under 1.2D alone and under
// 1.2D + 1.6L without reduction (the same frame, solved by the library),
// from which the reduced value is 1.2D's plus the factor times 1.6L's
// (linearity).
func reducedNs(t *testing.T, col string) (dead, full, deadM, fullM float64) {
	t.Helper()
	path := filepath.Join(renderedDir, "reduced-frame.toml")
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	run := func(cs []combos.Combination) (float64, float64) {
		job, err := modelfile.Read(path, src)
		if err != nil {
			t.Fatal(err)
		}
		job.MemberFactors = nil
		job.Combinations = cs
		job.AllowUnused = true
		res, err := analysis.Run(context.Background(), &job.Job, analysis.Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, em := range res.Envelope.Members {
			if job.Model.Members[em.Member].Name == col {
				st := em.Stations[0]
				return st.N.Max, st.M.Max
			}
		}
		t.Fatalf("no member %s", col)
		return 0, 0
	}
	dead, deadM = run([]combos.Combination{{Name: "1.2D", Terms: []combos.Term{{Case: 0, Factor: 1.2}}}})
	full, fullM = run([]combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}})
	return dead, full, deadM, fullM
}

// TestColumnsReduced: the live load factor column of the design tables
// and the table of member factors, on testdata/tables/reduced-frame.toml:
// ASCE/SEI 7-16 Eq. 4.7-1 with K_LL of Table 4.7-1, and the column's N as
// printed is the dead load's plus the factor times the live load's.
func TestColumnsReduced(t *testing.T) {
	f := func(kll, at float64) float64 { return 0.25 + 4.57/math.Sqrt(kll*at) } // ASCE/SEI 7-16 Eq. 4.7-1 (SI)
	f4 := func(v float64) string { return strconv.FormatFloat(v, 'f', 4, 64) }
	interior, interiorOne := f(4, 162), f(4, 81) // two floors of 81 m²; the one-floor rule
	exterior, exteriorOne := f(4, 81), f(4, 40.5)
	beam := f(2, 81)
	dead, full, _, _ := reducedNs(t, "A0-A1")
	for _, v := range columnsViews(t, "reduced-frame") {
		t.Run(v.name, func(t *testing.T) {
			tb, row := v.row(t, isColumnTable, "B0-B1")
			checkRowCells(t, tb, row, []cellWant{
				wantText("the interior column: N by two floors (648 m²), V and M by one (324 m²)", hdr("live load factor"),
					"L N "+f4(interior)+", V M "+f4(interiorOne)),
			})
			tb, row = v.row(t, isColumnTable, "A0-A1")
			checkRowCells(t, tb, row, []cellWant{
				wantText("the exterior column: half a bay, two floors (324 m²), V and M by one (162 m²)", hdr("live load factor"),
					"L N "+f4(exterior)+", V M "+f4(exteriorOne)),
				wantApprox(dead+exterior*(full-dead), "N = N(1.2D) + factor × N(1.6L): the live load's part reduced", "N max (kN)"),
			})
			// The end moments of the state of A0-A1's |M| max are those
			// of the reduced envelope: its base moment (the moment with
			// N max, 82.43) and its top, |M| max itself (linearity: the
			// state is formed with the same factors).
			found := 0
			for _, tb := range v.tablesOf(func(h []string) bool { return slices.Contains(h, "M1 (kN·m)") }) {
				for _, r := range tb.rows {
					if r.cells[0].text == "A0-A1" && r.cells[1].text == "N max" {
						found++
						m1, m2 := r.cells[columnIndex(t, tb, "M1 (kN·m)")].text, r.cells[columnIndex(t, tb, "M2 (kN·m)")].text
						_, mrow := v.row(t, isColumnTable, "A0-A1")
						withM := mrow[columnIndex(t, tb0(v), "N max (kN)", "with M")].text
						if m1 != withM || m2 == "-" {
							t.Errorf("A0-A1 end moments %s, %s; want the base moment %s and the top's", m1, m2, withM)
						}
					}
				}
			}
			if found != 1 {
				t.Errorf("%d rows of A0-A1's end moments at N max, want 1", found)
			}
			tb, row = v.row(t, isBeamTable, "A1-B1")
			checkRowCells(t, tb, row, []cellWant{wantText("a 9 m × 9 m beam, K_LL = 2", hdr("live load factor"), "L "+f4(beam))})
			tb, row = v.row(t, isReductionTable, "L", "B0-B1")
			checkRowCells(t, tb, row, []cellWant{
				wantText("N's factor", hdr("N"), f4(interior)),
				wantText("V's factor", hdr("V"), f4(interiorOne)),
				wantText("M's factor", hdr("M"), f4(interiorOne)),
				wantText("no factor that depends on the combination", hdr("N where accompanying"), "-"),
				wantText("the clause", hdr("rule"), "ASCE/SEI 7-16 4.7.2"),
				wantApprox(162, "A_T: half of each 9 m bay × 9 m, two floors", "A_T (m²)"),
				wantText("K_LL of Table 4.7-1 for an interior column", hdr("K_LL"), "4"),
				wantText("levels 1 and 2", hdr("floors"), "2"),
				wantText("no limit governs (0.4295 > 0.40)", hdr("limit"), "-"),
			})
			// Three-floor rule's limit does not show here; the roof beam is
			// not reduced: the floor case does not load it.
			for _, tb := range v.tablesOf(isReductionTable) {
				for _, r := range tb.rows {
					if r.cells[1].text == "A3-B3" || r.cells[1].text == "B2-B3" {
						t.Errorf("%s has a factor, but case L does not load the roof", r.cells[1].text)
					}
				}
			}
		})
	}
}

func isReductionTable(h []string) bool { return len(h) > 2 && h[0] == "case" && h[1] == "member" }

// TestReducedJSONAndCSV (numbers in the JSON carry ten significant
// digits, hence 1e-9): the JSON's live_load_reduction of a member and
// the CSV's live_load_factor and live_load_basis columns, on
// testdata/tables/reduced-frame.toml: the interior first storey column's
// factors by ASCE/SEI 7-16 Eq. 4.7-1 (two floors of 81 m², K_LL 4: N
// 0.25 + 4.57/√648; V and M the one-floor 0.25 + 4.57/√324).
func TestReducedJSONAndCSV(t *testing.T) {
	model := filepath.Join(renderedDir, "reduced-frame.toml")
	n, vm := 0.25+4.57/math.Sqrt(648), 0.25+4.57/math.Sqrt(324)
	t.Run("json", func(t *testing.T) {
		code, out, stderr := exec("run", "--quiet", "--json", "-", model)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		var doc struct {
			Cases []struct {
				Name      string
				Reactions []map[string]any
				Reduced   []map[string]any `json:"reduced_reactions"`
			}
			Members []struct {
				Name      string
				Reduction []struct {
					Case          string
					N, V, M       float64
					Rule          string
					TributaryArea float64 `json:"tributary_area"`
					KLL           float64
					Floors        int
					Limit, Ends   string
				} `json:"live_load_reduction"`
			}
		}
		if err := json.Unmarshal([]byte(out), &doc); err != nil {
			t.Fatal(err)
		}
		found := false
		for _, m := range doc.Members {
			switch m.Name {
			case "B0-B1":
				found = true
				if len(m.Reduction) != 1 {
					t.Fatalf("B0-B1: %+v", m.Reduction)
				}
				r := m.Reduction[0]
				if r.Case != "L" || math.Abs(r.N-n) > 1e-9 || math.Abs(r.V-vm) > 1e-9 || math.Abs(r.M-vm) > 1e-9 ||
					r.Rule != "ASCE/SEI 7-16 4.7.2" || math.Abs(r.TributaryArea-162) > 1e-9 || r.KLL != 4 || r.Floors != 2 || r.Limit != "" || r.Ends == "" {
					t.Errorf("B0-B1: %+v", r)
				}
			case "A3-B3":
				if m.Reduction != nil {
					t.Errorf("the roof beam, which L does not load, has %+v", m.Reduction)
				}
			}
		}
		if !found {
			t.Fatal("no member B0-B1")
		}
		// The load case results: L's reactions, and reduced beside them
		// node for node: under B0-B1 Fy by its N factor; Σ unreduced Fy =
		// 777.6 kN (statics: 2.4 kN/m² × 18 m × 9 m × 2 floors). D has no
		// reduced reactions.
		for _, c := range doc.Cases {
			switch c.Name {
			case "D":
				if c.Reduced != nil {
					t.Errorf("case D has reduced reactions %v", c.Reduced)
				}
			case "L":
				if len(c.Reduced) != len(c.Reactions) || len(c.Reactions) != 3 {
					t.Fatalf("L: %d reactions, %d reduced", len(c.Reactions), len(c.Reduced))
				}
				sum := 0.0
				for i, r := range c.Reactions {
					u, red := r["Fy"].(float64), c.Reduced[i]["Fy"].(float64)
					sum += u
					if r["node"] != c.Reduced[i]["node"] {
						t.Errorf("reduced %v beside %v", c.Reduced[i]["node"], r["node"])
					}
					if r["node"] == "B0" && math.Abs(red-n*u) > 1e-6 {
						t.Errorf("B0: Fy %g reduced %g, want × %g", u, red, n)
					}
				}
				if math.Abs(sum-777.6) > 1e-6 {
					t.Errorf("Σ Fy %g, want 777.6", sum)
				}
			}
		}
	})
	t.Run("cases csv", func(t *testing.T) {
		// The load case results, one value a row: L's reduced reactions
		// beside its reactions, result "reduced reaction"; under B0-B1,
		// Fy by its N factor.
		code, out, stderr := exec("run", "--quiet", "--cases-csv", "-", model)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		var u, red float64
		reduced := 0
		for _, r := range rows[1:] {
			if r[0] == "L" && r[2] == "B0" && r[4] == "Fy" {
				v, _ := strconv.ParseFloat(r[5], 64)
				switch r[1] {
				case "reaction":
					u = v
				case "reduced reaction":
					red = v
				}
			}
			if r[1] == "reduced reaction" {
				reduced++
				if r[0] != "L" {
					t.Errorf("case %s has a reduced reaction", r[0])
				}
			}
		}
		if reduced != 9 || u == 0 || math.Abs(red-n*u) > 1e-6 {
			t.Errorf("%d reduced reaction rows; B0 Fy %g reduced %g, want × %g", reduced, u, red, n)
		}
	})
	t.Run("design csv", func(t *testing.T) {
		// A reduced member's note names its factors: B0-B1's N by two
		// floors, V and M by one.
		code, out, stderr := exec("run", "--quiet", "--design-csv", "-", model)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		note := slices.Index(rows[0], "note")
		want := "live load reduced: L N " + strconv.FormatFloat(n, 'f', 4, 64) + ", V M " + strconv.FormatFloat(vm, 'f', 4, 64)
		seen := false
		for _, r := range rows[1:] {
			switch r[0] {
			case "B0-B1":
				seen = true
				if !strings.Contains(r[note], want) {
					t.Errorf("B0-B1 note %q, want %q", r[note], want)
				}
			case "A3-B3":
				if strings.Contains(r[note], "live load") {
					t.Errorf("roof beam note %q", r[note])
				}
			}
		}
		if !seen {
			t.Fatal("no row of B0-B1")
		}
	})
	t.Run("csv", func(t *testing.T) {
		code, out, stderr := exec("run", "--quiet", "--csv", "-", model)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		h := rows[0]
		fc, bc := slices.Index(h, "live_load_factor"), slices.Index(h, "live_load_basis")
		if fc < 0 || bc < 0 {
			t.Fatalf("header %q", h)
		}
		want := map[string]string{"N": "L " + strconv.FormatFloat(n, 'f', 4, 64), "V": "L " + strconv.FormatFloat(vm, 'f', 4, 64), "M": "L " + strconv.FormatFloat(vm, 'f', 4, 64)}
		seen := 0
		for _, r := range rows[1:] {
			if r[0] != "B0-B1" {
				continue
			}
			seen++
			if r[fc] != want[r[2]] || !strings.Contains(r[bc], "A_T 162.0 m², K_LL 4, 2 floors") {
				t.Errorf("B0-B1 %s: %q, %q; want %q", r[2], r[fc], r[bc], want[r[2]])
			}
		}
		if seen == 0 {
			t.Fatal("no rows of B0-B1")
		}
	})
}

// TestCheckListsFactors: govern check lists each member factor with how
// it was found, on testdata/tables/reduced-frame.toml with K_LL 3 given to
// the columns of line A (an edge column with cantilever slabs, ASCE/SEI
// 7-16 Table 4.7-1): A0-A1 supports two floors of 40.5 m²: K_LL·A_T =
// 243 m², N 0.25 + 4.57/√243 = 0.5432; V and M by the one-floor rule,
// 121.5 m²: 0.6646 (Eq. 4.7-1).
func TestCheckListsFactors(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(renderedDir, "reduced-frame.toml"))
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "m.toml")
	if err := os.WriteFile(path, append(src, "[[assign]]\non = \"line A\"\nkll = 3\n"...), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, stderr := exec("check", path)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	f4 := func(v float64) string { return strconv.FormatFloat(v, 'f', 4, 64) }
	for _, want := range []string{
		"live load reduction: 10 member factors (L by ASCE/SEI 7-16 4.7.2)\n",
		"  A0-A1        L N " + f4(0.25+4.57/math.Sqrt(243)) + ", V M " + f4(0.25+4.57/math.Sqrt(121.5)) +
			"; ASCE/SEI 7-16 4.7.2, A_T 81.00 m², K_LL 3, 2 floors; V, M by the one-floor rule\n",
		"  A1-B1        L " + f4(0.25+4.57/math.Sqrt(162)) + "; ASCE/SEI 7-16 4.7.2, A_T 81.00 m², K_LL 2, 1 floor\n",
		"  line 58     kll 3 on \"line A\": 3 members\n",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("check output lacks %q:\n%s", want, out)
		}
	}
}

// TestColumnsReducedReactions: the table of the reduced cases' reactions
// on testdata/tables/reduced-frame.toml. "unreduced" is the case's
// reaction as solved: the three vertical ones carry the whole floor load,
// 2.4 kN/m² × 18 m × 9 m × 2 floors = 777.6 kN (statics); "reduced" is
// each member's end force times its factor, here the one column at each
// support: Fy by the column's N factor, Fx and M by its V and M factor
// (ASCE/SEI 7-16 Eq. 4.7-1: interior 0.4295, V M 0.5039; exterior 0.5039,
// V M 0.6091).
func TestColumnsReducedReactions(t *testing.T) {
	f := func(kll, at float64) float64 { return 0.25 + 4.57/math.Sqrt(kll*at) }
	factors := map[string][3]float64{
		// N, V, M: two floors, and one floor at the column's top.
		"A0": {f(4, 81), f(4, 40.5), f(4, 40.5)}, "B0": {f(4, 162), f(4, 81), f(4, 81)}, "C0": {f(4, 81), f(4, 40.5), f(4, 40.5)},
	}
	comp := map[string]int{"Fx (kN)": 0, "Fy (kN)": 1, "M (kN·m)": 2}
	order := [3]int{1, 0, 2} // Fx takes V's factor, Fy N's, M M's
	for _, v := range columnsViews(t, "reduced-frame") {
		t.Run(v.name, func(t *testing.T) {
			tbs := v.tablesOf(func(h []string) bool { return len(h) == 5 && h[3] == "unreduced" && h[4] == "reduced" })
			if len(tbs) != 1 {
				t.Fatalf("%d tables of reduced reactions", len(tbs))
			}
			sum, node := 0.0, ""
			for _, r := range tbs[0].rows {
				if r.cells[1].text != "" {
					node = r.cells[1].text
				}
				d := comp[r.cells[2].text]
				u, err1 := strconv.ParseFloat(r.cells[3].text, 64)
				red, err2 := strconv.ParseFloat(r.cells[4].text, 64)
				if err1 != nil || err2 != nil {
					t.Fatalf("row %q", renderedTexts(r.cells))
				}
				if d == 1 {
					sum += u
				}
				// Two decimals printed: the product is within the rounding
				// of the unreduced value times the factor, and its own.
				if want := factors[node][order[d]] * u; math.Abs(red-want) > 0.006 {
					t.Errorf("%s %s: reduced %g, want %g × %g = %g", node, r.cells[2].text, red, factors[node][order[d]], u, want)
				}
			}
			if math.Abs(sum-777.6) > 0.015 {
				t.Errorf("Σ unreduced Fy = %g, want 777.6", sum)
			}
			if v.name != "report" {
				return
			}
			// The report's load case results: L's reactions with the
			// reduced ones beside them, column for column.
			cases := v.tablesOf(func(h []string) bool { return slices.Contains(h, "reduced Fy (kN)") })
			if len(cases) != 1 {
				t.Fatalf("%d case tables with reduced reactions, want 1 (case L)", len(cases))
			}
			for _, r := range cases[0].rows {
				node := r.cells[0].text
				for d, col := range []string{"Fx (kN)", "Fy (kN)", "M (kN·m)"} {
					u, err1 := strconv.ParseFloat(r.cells[columnIndex(t, cases[0], col)].text, 64)
					red, err2 := strconv.ParseFloat(r.cells[columnIndex(t, cases[0], "reduced "+col)].text, 64)
					if err1 != nil || err2 != nil {
						t.Fatalf("row %q", renderedTexts(r.cells))
					}
					if want := factors[node][order[d]] * u; math.Abs(red-want) > 0.006 {
						t.Errorf("case L, %s %s: reduced %g, want %g", node, col, red, want)
					}
				}
			}
		})
	}
}

// tb0 returns the first column table of v.
func tb0(v columnsView) renderedTable { return v.tablesOf(isColumnTable)[0] }

// govern run takes live load reduction with a second-order analysis and
// notional loads: testdata/tables/reduced-frame.toml
// with second_order = true and notional = "aisc360" runs, its heading
// says second-order, and the table of member factors is printed (the
// factors themselves and their effect in a second-order combination are
// checked in envelope/analysis, TestMemberFactorsSecondOrder).
func TestRunReducedSecondOrder(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(renderedDir, "reduced-frame.toml"))
	if err != nil {
		t.Fatal(err)
	}
	s := strings.Replace(string(src), "[analysis]\n", "[analysis]\nsecond_order = true\nnotional = \"aisc360\"\n", 1)
	if s == string(src) {
		t.Fatal("no [analysis] table to add second_order to")
	}
	path := filepath.Join(t.TempDir(), "reduced-second-order.toml")
	if err := os.WriteFile(path, []byte(s), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, stderr := exec("run", path)
	if code != 0 {
		t.Fatalf("exit %d; stderr:\n%s", code, stderr)
	}
	for _, want := range []string{"Analysis: second-order elastic", "Live load reduction: factors on each member's effects", "B0-B1 │ 0.4295"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q", want)
		}
	}
}
