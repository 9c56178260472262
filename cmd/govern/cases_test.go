package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// caseRun runs model and returns its JSON "cases", its cases CSV as a map
// from "case/result/name/end/quantity" to value, and the report's tables.
func caseRun(t *testing.T, model string) ([]jsonCase, map[string]float64, []renderedTable) {
	t.Helper()
	dir := t.TempDir()
	js, cc, rep := filepath.Join(dir, "e.json"), filepath.Join(dir, "c.csv"), filepath.Join(dir, "r.html")
	if code, _, stderr := exec("run", "--quiet", "--json", js, "--cases-csv", cc, "--report", rep, model); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var doc struct{ Cases []jsonCase }
	b, _ := os.ReadFile(js)
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	f, err := os.Open(cc)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	values := map[string]float64{}
	for _, r := range rows[1:] {
		if r[1] == "source" {
			continue // the model file and run date (provenance_test.go)
		}
		v, err := strconv.ParseFloat(r[5], 64)
		if err != nil {
			t.Fatalf("row %q: %v", r, err)
		}
		values[strings.Join(r[:5], "/")] = v
	}
	page, _ := os.ReadFile(rep)
	return doc.Cases, values, renderedReportTables(t, page)
}

type jsonCase struct {
	Name      string
	Reactions []struct {
		Node      string
		Fx, Fy, M *float64
	}
	Members []struct {
		Name       string
		Start, End struct{ N, V, M float64 }
	}
	Displacements []struct {
		Node       string
		Ux, Uy, Rz *float64
	}
}

// reportTable returns the table of the report whose title ends in suffix.
func reportTable(t *testing.T, tables []renderedTable, suffix string) renderedTable {
	t.Helper()
	for _, tb := range tables {
		if strings.HasSuffix(tb.title, suffix) {
			return tb
		}
	}
	t.Fatalf("no table %q in the report", suffix)
	return renderedTable{}
}

func cellsOf(r renderedRow) []string {
	var out []string
	for _, c := range r.cells {
		out = append(out, c.text)
	}
	return out
}

const caseTol = 1e-9

func nearly(a, b float64) bool { return math.Abs(a-b) <= caseTol*math.Max(1, math.Abs(b)) }

// TestCaseResultsFixedBeam: testdata/tables/fixed-beam.toml, L = 6 m fixed
// at both ends, live case L of w = 5 kN/m: end moments −wL²/12 = −15
// kN·m (hogging), end shears ±wL/2 = 15 kN, reactions Fy = 15 kN and M =
// wL²/12 = 15 kN·m counter-clockwise at the left support, clockwise at the
// right (AISC Steel Construction Manual, Table 3-23, beam fixed at both
// ends with a uniform load; from memory). The same beam drawn from B to A
// gives, in the member's own axes (JSON, CSV), the opposite M and V at
// its start and end, and in the report the same table as drawn from A.
func TestCaseResultsFixedBeam(t *testing.T) {
	src, err := os.ReadFile("../../testdata/tables/fixed-beam.toml")
	if err != nil {
		t.Fatal(err)
	}
	reversed := strings.Replace(strings.Replace(string(src), "start = \"A\"\nend = \"B\"", "start = \"B\"\nend = \"A\"", 1), "on = \"A-B\"", "on = \"B-A\"", -1)
	if reversed == string(src) {
		t.Fatal("the model was not reversed")
	}
	rev := filepath.Join(t.TempDir(), "fixed-beam-reversed.toml")
	if err := os.WriteFile(rev, []byte(reversed), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, model, member string
		sign                float64 // +1 drawn left to right
	}{
		{"A to B", "../../testdata/tables/fixed-beam.toml", "A-B", 1},
		{"B to A", rev, "B-A", -1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			cases, csvValues, tables := caseRun(t, tc.model)
			if len(cases) != 2 || cases[1].Name != "L" {
				t.Fatalf("cases %+v", cases)
			}
			l := cases[1]
			m := l.Members[0]
			s := tc.sign
			for _, c := range []struct {
				what      string
				got, want float64
			}{
				{"start M", m.Start.M, -15 * s}, {"end M", m.End.M, -15 * s},
				{"start V", m.Start.V, 15 * s}, {"end V", m.End.V, -15 * s},
				{"start N", m.Start.N, 0},
				{"CSV start M", csvValues["L/member/"+tc.member+"/start/M"], -15 * s},
				{"CSV end V", csvValues["L/member/"+tc.member+"/end/V"], -15 * s},
				{"CSV reaction A Fy", csvValues["L/reaction/A//Fy"], 15},
				{"CSV reaction A M", csvValues["L/reaction/A//M"], 15},
				{"CSV reaction B M", csvValues["L/reaction/B//M"], -15},
				{"CSV uy of B", csvValues["L/displacement/B//uy"], 0},
			} {
				if !nearly(c.got, c.want) {
					t.Errorf("%s = %g, want %g", c.what, c.got, c.want)
				}
			}
			if m.Name != tc.member || m.Name != l.Members[0].Name {
				t.Errorf("member %q, want %q", m.Name, tc.member)
			}
			for _, r := range l.Reactions {
				want := map[string]float64{"A": 15, "B": -15}[r.Node]
				if r.Fx == nil || r.Fy == nil || r.M == nil || !nearly(*r.Fy, 15) || !nearly(*r.M, want) {
					t.Errorf("reaction %+v", r)
				}
			}
			// The report shows the beam from its left end, A, +M sagging.
			ends := reportTable(t, tables, "Member end forces of L")
			if got, want := strings.Join(cellsOf(ends.rows[0]), " "), tc.member+" A 0.00 15.00 -15.00 B 0.00 -15.00 -15.00"; got != want {
				t.Errorf("report row %q, want %q", got, want)
			}
			re := reportTable(t, tables, "Reactions of L")
			if got := strings.Join(cellsOf(re.rows[0]), " ") + " | " + strings.Join(cellsOf(re.rows[1]), " "); got != "A 0.00 15.00 15.00 | B 0.00 15.00 -15.00" {
				t.Errorf("report reactions %q", got)
			}
		})
	}
}

// TestCaseResultsCantilever: testdata/tables/cantilever.toml, L = 6 m
// fixed at A, EI = 20 000 kN·m², live case L of w = 5 kN/m: the free end C
// deflects wL⁴/8EI = 0.0405 m down and turns wL³/6EI = 0.009 rad
// clockwise; the root's reactions are wL = 30 kN up and wL²/2 = 90 kN·m
// counter-clockwise (AISC Steel Construction Manual, Table 3-23,
// cantilever with a uniform load; from memory).
func TestCaseResultsCantilever(t *testing.T) {
	cases, csvValues, tables := caseRun(t, "../../testdata/tables/cantilever.toml")
	l := cases[1]
	var tip *float64
	for _, d := range l.Displacements {
		if d.Node == "C" {
			tip = d.Uy
			if d.Rz == nil || !nearly(*d.Rz, -0.009) {
				t.Errorf("tip rotation %v, want -0.009", d.Rz)
			}
		}
	}
	if tip == nil || !nearly(*tip, -0.0405) {
		t.Errorf("tip deflection %v, want -0.0405", tip)
	}
	for key, want := range map[string]float64{"L/reaction/A//Fy": 30, "L/reaction/A//M": 90, "L/displacement/C//uy": -0.0405, "L/displacement/C//rz": -0.009, "L/member/A-C/start/M": -90, "L/member/A-C/end/M": 0} {
		if got, ok := csvValues[key]; !ok || !nearly(got, want) {
			t.Errorf("CSV %s = %g (%v), want %g", key, got, ok, want)
		}
	}
	d := reportTable(t, tables, "Node displacements of L")
	if got := strings.Join(cellsOf(d.rows[1]), " "); got != "C 0 -0.04050 -0.009000" {
		t.Errorf("report displacement row %q", got)
	}
	if _, ok := csvValues["L/reaction/C//Fy"]; ok {
		t.Errorf("a reaction at the free end")
	}
}

// TestCaseResultsReleasedNode: testdata/released-node.toml, two simple
// spans of 5 m made with releases at B, w = 5 kN/m: reactions wL/2 = 12.5
// kN at A and C and wL = 25 kN at B, no moment at B (by statics); B has no
// one rotation, so the JSON leaves out its rz, the CSV has no row for it
// and the report says "free".
func TestCaseResultsReleasedNode(t *testing.T) {
	cases, csvValues, tables := caseRun(t, "../../testdata/released-node.toml")
	c := cases[0]
	for _, d := range c.Displacements {
		if (d.Node == "B") != (d.Rz == nil) {
			t.Errorf("node %s: rz %v", d.Node, d.Rz)
		}
	}
	name := c.Name
	for key, want := range map[string]float64{"/reaction/A//Fy": 12.5, "/reaction/B//Fy": 25, "/reaction/C//Fy": 12.5, "/member/A-B/end/M": 0} {
		if got, ok := csvValues[name+key]; !ok || !nearly(got, want) {
			t.Errorf("CSV %s%s = %g (%v), want %g", name, key, got, ok, want)
		}
	}
	if _, ok := csvValues[name+"/displacement/B//rz"]; ok {
		t.Errorf("CSV has a rotation of B")
	}
	d := reportTable(t, tables, "Node displacements of "+name)
	if got := strings.Join(cellsOf(d.rows[1]), " "); !strings.HasPrefix(got, "B ") || !strings.HasSuffix(got, " free") {
		t.Errorf("report row %q, want B's rotation free", got)
	}
}
