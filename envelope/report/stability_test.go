package report

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/frame"
)

// storeyResult analyses one storey of two equal columns fixed at their
// bases, EI = 250, L = 10, under a beam rigid in bending and along its
// axis, each column carrying P = 4, with 0.045 along X per column: the
// model whose answers are closed forms (Timoshenko & Gere, Theory of
// Elastic Stability; ACI 318-19 6.6.4.4.1; AISC 360-16 Appendix 8).
func storeyResult(t *testing.T, second bool) *analysis.Result {
	t.Helper()
	const ei, l = 250.0, 10.0
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "C", E: 2e8, A: 10, I: ei / 2e8}, {Name: "R", E: 2e8, A: 10, I: 10}},
			Nodes: []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: l},
				{Name: "B1", X: 6, Y: l}, {Name: "B0", X: 6, Support: frame.Fixed}},
			Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "A1-B1", Start: 1, End: 2, Section: 1}, {Name: "B0-B1", Start: 3, End: 2}},
			Cases: []frame.Case{
				{Name: "D", NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -4}, {Node: 2, Fy: -4}}},
				{Name: "W", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 0.09}}},
			},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{{Name: "D+W", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}},
		Methods:      []analysis.Method{{SecondOrder: second}},
		Settings:     analysis.Settings{Stations: 5},
		Levels:       []analysis.Level{{Name: "level 0"}, {Name: "level 1", Y: l}},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func tableNamed(t *testing.T, p *Report, prefix string) Table {
	t.Helper()
	for _, tb := range p.Tables() {
		if strings.HasPrefix(tb.Title, prefix) {
			return tb
		}
	}
	t.Fatalf("no table %q", prefix)
	return Table{}
}

// TestStoreyTableMeaning states each column of the storey table on the
// storey of closed forms: the drift is the second-order sway, the
// first-order V L³/(24 EI) = 0.015 times 3(tan u − u)/u³ = 1.190916
// (Timoshenko & Gere); Δ/h its ratio to the height; Q = P L²/(12 EI) =
// 0.1333 (ACI 318-19 6.6.4.4.1); B2 = 1/(1 − Q/0.85) = 1.186 (AISC
// 360-16 Appendix 8); αcr = π²EI/L²/P = 6.169.
func TestStoreyTableMeaning(t *testing.T) {
	p := New(storeyResult(t, true))
	tb := tableNamed(t, p, "Storeys")
	if len(tb.Rows) != 1 {
		t.Fatalf("rows %v", tb.Rows)
	}
	row := tb.Rows[0]
	u := math.Sqrt(4.0/250) * 5
	drift := 0.015 * 3 * (math.Tan(u) - u) / (u * u * u)
	want := []string{"level 0 to level 1", "10.00", sig4(drift), "", "D+W", ratio(10 / drift), "0.1333", "1.186", "6.17", "D+W"}
	want[5] = "h" + strings.TrimPrefix(want[5], "L")
	for i, w := range want {
		if i == 3 {
			if row[i] != "A0-A1" && row[i] != "B0-B1" {
				t.Errorf("column cell %q, want a column of the storey", row[i])
			}
			continue
		}
		if i == 2 {
			// Within the subdivision's 0.1 % of the closed form.
			if !strings.HasPrefix(row[i], w[:5]) {
				t.Errorf("drift %q, want %q", row[i], w)
			}
			continue
		}
		if i == 5 || i == 8 {
			if row[i] == "" {
				t.Errorf("cell %d empty", i)
			}
			continue
		}
		if row[i] != w {
			t.Errorf("cell %d (%s) %q, want %q", i, tb.Header[i], row[i], w)
		}
	}
	if a := row[8]; !strings.HasPrefix(a, "6.17") && !strings.HasPrefix(a, "6.168") && !strings.HasPrefix(a, "6.169") {
		t.Errorf("αcr %q, want π²EI/L²/P = 6.1685", a)
	}
}

// TestStabilityTablesMeaning states the columns of the table by
// combination and of the columns' moments: αcr of the storey (6.1685,
// Timoshenko & Gere), the analysis named; each column's end moment in
// second order, H tan(u)/k per column = 0.2607 (Timoshenko & Gere), beside
// the first-order H L/2 = 0.225, ratio 1.159, not flagged (ACI 318-19
// 6.2.5.3 asks a review above 1.4).
func TestStabilityTablesMeaning(t *testing.T) {
	p := New(storeyResult(t, true))
	tb := tableNamed(t, p, "Frame stability by combination")
	if r := tb.Rows[0]; r[0] != "D+W" || r[1] != "second-order" || !strings.HasPrefix(r[2], "6.17") || r[3] == "-" || r[4] != "-" {
		t.Errorf("row %q", r)
	}
	am := tableNamed(t, p, "Columns: governing moment")
	k := math.Sqrt(4.0 / 250)
	m2 := 0.045 * math.Tan(k*5) / k
	if len(am.Rows) != 2 {
		t.Fatalf("rows %v", am.Rows)
	}
	for _, r := range am.Rows {
		if r[2] != "D+W" || r[3] != fixed(m2) || r[4] != fixed(0.225) || !strings.HasPrefix(r[5], sig4(m2 / 0.225)[:4]) || r[6] != "" {
			t.Errorf("row %q, want |M| %s against %s", r, fixed(m2), fixed(0.225))
		}
	}
	var text bytes.Buffer
	if err := p.WriteText(&text, false); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), "Analysis: second-order elastic") {
		t.Errorf("the heading does not say second-order")
	}
	first := New(storeyResult(t, false))
	if err := first.WriteText(&text, false); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), "Analysis: first-order elastic") {
		t.Errorf("the heading does not say first-order")
	}
}

// TestJSONStabilityMeaning: each JSON combination carries its critical
// load factor (π²EI/L²/P = 6.1685, Timoshenko & Gere) and the nodes their
// displacement envelopes: the top's ux is the storey's drift.
func TestJSONStabilityMeaning(t *testing.T) {
	res := storeyResult(t, true)
	var b bytes.Buffer
	if err := New(res).WriteJSON(&b); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Combinations []struct {
			Name     string   `json:"name"`
			Analysis string   `json:"analysis"`
			Critical *float64 `json:"critical_load_factor"`
		} `json:"combinations"`
		Nodes []struct {
			Node string `json:"node"`
			Ux   struct {
				Max   float64 `json:"max"`
				MaxBy string  `json:"max_by"`
			} `json:"ux"`
		} `json:"nodes"`
		Storeys []struct {
			Drift struct {
				Max float64 `json:"max"`
			} `json:"drift"`
		} `json:"storeys"`
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	c := doc.Combinations[0]
	if c.Analysis != "second-order" || c.Critical == nil || math.Abs(*c.Critical-6.168503)/6.168503 > 1e-3 {
		t.Errorf("combination %+v", c)
	}
	if len(doc.Nodes) != 4 || doc.Nodes[1].Node != "A1" || doc.Nodes[1].Ux.MaxBy != "D+W" || doc.Nodes[1].Ux.Max != doc.Storeys[0].Drift.Max {
		t.Errorf("nodes %+v, storeys %+v", doc.Nodes, doc.Storeys)
	}
}

// TestNotionalListingMeaning: govern combos lists each combination's
// notional loads level by level, Yi the gravity load of the level and Ni =
// 0.002 Yi (AISC 360-16 C2.2b), a gravity-only combination in each
// direction as alternatives: here 1.4 × (20 kN/m × 6 m + 2 × 50 kN) = 308
// kN at level 1, Ni = 0.616 kN.
func TestNotionalListingMeaning(t *testing.T) {
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 2e8, A: 5e-3, I: 8e-5}},
			Nodes: []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: 4},
				{Name: "B1", X: 6, Y: 4}, {Name: "B0", X: 6, Support: frame.Fixed}},
			Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "A1-B1", Start: 1, End: 2}, {Name: "B0-B1", Start: 3, End: 2}},
			Cases: []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 1, To: 6, W: 20, WEnd: 20}},
				NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -50}, {Node: 2, Fy: -50}}}},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}},
		Combinations: []combos.Combination{{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}}},
		Sway:         analysis.Sway{Notional: analysis.NotionalAISC360},
		Settings:     analysis.Settings{Stations: 5},
		Levels:       []analysis.Level{{Name: "level 0"}, {Name: "level 1", Y: 4}},
	}
	var b bytes.Buffer
	if err := WriteCombinations(&b, job); err != nil {
		t.Fatal(err)
	}
	out := b.String()
	var rows [][]string
	for _, line := range strings.Split(out[strings.Index(out, "Notional loads"):], "\n") {
		if !strings.HasPrefix(line, "│") {
			continue
		}
		var cells []string
		for _, c := range strings.Split(strings.Trim(line, "│"), "│") {
			cells = append(cells, strings.TrimSpace(c))
		}
		rows = append(rows, cells)
	}
	want := [][]string{
		{"combination", "direction", "ratio", "level", "Yi (kN)", "Ni (kN)"},
		{"1.4D", "+X (alternative)", "0.002000", "level 1", "308.00", "0.6160"},
		{"", "-X (alternative)", "0.002000", "level 1", "308.00", "0.6160"},
	}
	if len(rows) != len(want) {
		t.Fatalf("rows %q", rows)
	}
	for i := range want {
		if strings.Join(rows[i], "|") != strings.Join(want[i], "|") {
			t.Errorf("row %q, want %q", rows[i], want[i])
		}
	}
}

// TestNotionalTablesMeaning: on a symmetric portal under gravity only with
// AISC 360-16 C2.2b notional loads (0.002 × 308 kN = 0.616 kN, each
// direction an alternative), the table by combination names both
// directions and their base shear, and the reactions without the notional
// loads are the gravity thrusts alone, equal and opposite at the two feet
// (common practice: a symmetric frame under symmetric load does not sway).
func TestNotionalTablesMeaning(t *testing.T) {
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 2e8, A: 5e-3, I: 8e-5}},
			Nodes: []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: 4},
				{Name: "B1", X: 6, Y: 4}, {Name: "B0", X: 6, Support: frame.Fixed}},
			Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "A1-B1", Start: 1, End: 2}, {Name: "B0-B1", Start: 3, End: 2}},
			Cases: []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 1, To: 6, W: 20, WEnd: 20}},
				NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -50}, {Node: 2, Fy: -50}}}},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}},
		Combinations: []combos.Combination{{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}}},
		Sway:         analysis.Sway{Notional: analysis.NotionalAISC360},
		Settings:     analysis.Settings{Stations: 5},
		Levels:       []analysis.Level{{Name: "level 0"}, {Name: "level 1", Y: 4}},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	p := New(res)
	tb := tableNamed(t, p, "Frame stability by combination")
	if got, want := tb.Rows[0][4], "+X 0.002000 × gravity = 0.62 kN; -X 0.002000 × gravity = 0.62 kN (alternatives)"; got != want {
		t.Errorf("notional loads %q, want %q", got, want)
	}
	bare := tableNamed(t, p, "Reactions without the notional loads")
	// Rows: A0 Fx, Fy, M, then B0 Fx, Fy, M; max and min alike, opposite at the feet.
	if len(bare.Rows) != 6 || bare.Rows[0][2] != bare.Rows[0][4] || strings.TrimPrefix(bare.Rows[3][2], "-") != strings.TrimPrefix(bare.Rows[0][2], "-") || bare.Rows[3][2] == bare.Rows[0][2] {
		t.Errorf("reactions without notional loads %q", bare.Rows)
	}
	with := tableNamed(t, p, "Reactions (global")
	if with.Rows[0][2] == with.Rows[0][4] {
		t.Errorf("with the notional loads the feet's Fx should differ between the alternatives: %q", with.Rows[0])
	}
}
