package main

import (
	"bytes"
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

const designModel = "../../testdata/output/design.toml"

// designRows runs the model with --design-csv and returns the CSV's rows
// by member, as maps from header to cell.
func designRows(t *testing.T, model string) map[string]map[string]string {
	t.Helper()
	out := filepath.Join(t.TempDir(), "design.csv")
	if code, _, stderr := exec("run", "--quiet", "--design-csv", out, model); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	rows := map[string]map[string]string{}
	for _, r := range recs[1:] {
		row := map[string]string{}
		for i, h := range recs[0] {
			row[h] = r[i]
		}
		rows[r[0]] = row
	}
	return rows
}

// designCell returns the cell of a row whose header starts with prefix.
func designCell(t *testing.T, row map[string]string, prefix string) string {
	t.Helper()
	var found []string
	for h, v := range row {
		if strings.HasPrefix(h, prefix) {
			found = append(found, v)
		}
	}
	if len(found) != 1 {
		t.Fatalf("%d columns start with %q", len(found), prefix)
	}
	return found[0]
}

// TestDesignCSVBeam: testdata/output/design.toml, a beam fixed at both
// ends (L = 6 m), entered right to left, under 1.4 × (10 kN/m and a point
// load of 10 kN at a = 0.3 m from its left end, b = 5.7 m), d = 0.5 m.
// Closed forms of the fixed beam (AISC Manual Table 3-23, cases 15 and
// 18, recalled from memory): end moments wL²/12 and Pab²/L², Pa²b/L²;
// midspan wL²/24 less the point load's share; reactions wL/2 and
// Pb²(3a + b)/L³, Pa²(a + 3b)/L³. The shear at d from the right face is
// the right reaction less w·d (statics); at the left end the point load
// lies within d of the face, so the face's shear is given and flagged.
func TestDesignCSVBeam(t *testing.T) {
	const l, w, p, a, d = 6.0, 14.0, 14.0, 0.3, 0.5
	b := l - a
	ra := w*l/2 + p*b*b*(3*a+b)/(l*l*l)
	rb := w*l/2 + p*a*a*(a+3*b)/(l*l*l)
	row := designRows(t, designModel)["B-A"]
	if row == nil {
		t.Fatal("no row of B-A")
	}
	for _, c := range []struct {
		col  string
		want float64
		why  string
	}{
		{"M min at left support", -(w*l*l/12 + p*a*b*b/(l*l)), "−(wL²/12 + Pab²/L²) at the left end"},
		{"M min at left x", 0, "the left end: no column face"},
		{"M min at right support", -(w*l*l/12 + p*a*a*b/(l*l)), "−(wL²/12 + Pa²b/L²)"},
		{"M min at right x", l, "the right end"},
		{"|V| at left support", ra, "the left reaction"},
		{"|V| at right support", rb, "the right reaction"},
		{"|V| at d from right face", rb - w*d, "the right reaction less w·d"},
		{"|V| at d from right x", l - d, "d from the right end"},
		{"|V| at d from left face", ra, "the face's shear: a point load lies within d"},
		{"length", l, "the member's length"},
	} {
		got, err := strconv.ParseFloat(designCell(t, row, c.col), 64)
		if err != nil || !within(got, c.want, 1e-9) && !(c.want == 0 && got == 0) {
			t.Errorf("%s: %s, want %.9g (%s)", c.col, designCell(t, row, c.col), c.want, c.why)
		}
	}
	// The sagging moment peaks at a station: midspan, x = 3, where by
	// statics from the left end M = −M_A + R_A·3 − w·9/2 − P(3 − a).
	mA := w*l*l/12 + p*a*b*b/(l*l)
	mid := -mA + ra*3 - w*9/2 - p*(3-a)
	if got, _ := strconv.ParseFloat(designCell(t, row, "M max in span ("), 64); !within(got, mid, 1e-9) || designCell(t, row, "M max in span x") != "3" {
		t.Errorf("M max in span %s at %s, want %.9g at 3 (statics)", designCell(t, row, "M max in span ("), designCell(t, row, "M max in span x"), mid)
	}
	if note := row["note"]; !strings.Contains(note, "left: a point load at x = 0.30 lies within d of the face") || strings.Contains(note, "right") {
		t.Errorf("note %q: want the left end flagged, not the right", note)
	}
	if row["kind"] != "beam" || row["from node"] != "A" || row["to node"] != "B" {
		t.Errorf("kind %q from %q to %q: want a beam shown from A, its left end", row["kind"], row["from node"], row["to node"])
	}
	if designCell(t, row, "N max: N") != "" {
		t.Error("a beam has column cells")
	}
}

// TestDesignCSVColumns: the portal of testdata/tables/portal.toml; each
// column's N and M of N max, N min and |M| max and its end moments are
// those of the closed forms (columns_portal_test.go: the rigid frame
// formulas, statics) in the governing combination.
func TestDesignCSVColumns(t *testing.T) {
	rows := designRows(t, filepath.Join(renderedDir, "portal.toml"))
	for _, col := range []struct {
		name string
		a    bool
	}{{"A0-A1", true}, {"B0-B1", false}} {
		row := rows[col.name]
		if row == nil || row["kind"] != "column" {
			t.Fatalf("no column row %s: %v", col.name, row)
		}
		for _, s := range []struct {
			what string
			q    func(portalForces) float64
		}{
			{"N max", func(f portalForces) float64 { return f.n }},
			{"N min", func(f portalForces) float64 { return -f.n }},
			{"|M| max", func(f portalForces) float64 { return max(f.m, -f.m) }},
		} {
			pk := portalExtreme(t, portalStrength, col.name, portalColumnX, s.q)
			ma, mb := portalColumn(pk.c, col.a, 0).m, portalColumn(pk.c, col.a, portalH).m
			m1, m2, _, ratio, curvature := wantEnds(ma, mb, "", "")
			for _, c := range []struct {
				col  string
				want float64
			}{{": N (", pk.f.n}, {": M (", pk.f.m}, {": M1 (", m1}, {": M2 (", m2}} {
				got, err := strconv.ParseFloat(designCell(t, row, s.what+c.col), 64)
				if err != nil || !within(got, c.want, 1e-5) {
					t.Errorf("%s %s%s %s, want %.6g (rigid frame formulas, %s)", col.name, s.what, c.col, designCell(t, row, s.what+c.col), c.want, pk.c.name)
				}
			}
			if got := designCell(t, row, s.what+": governing"); got != pk.c.name {
				t.Errorf("%s %s governing %s, want %s", col.name, s.what, got, pk.c.name)
			}
			if got := designCell(t, row, s.what+": curvature"); got != curvature {
				t.Errorf("%s %s curvature %s, want %s", col.name, s.what, got, curvature)
			}
			if got, _ := strconv.ParseFloat(designCell(t, row, s.what+": M1/M2"), 64); !printedNear(designCell(t, row, s.what+": M1/M2"), ratio, 1e-6) {
				t.Errorf("%s %s M1/M2 %g, want %.4f", col.name, s.what, got, ratio)
			}
		}
		if designCell(t, row, "M min at left support") != "" {
			t.Error("a column has beam cells")
		}
	}
}

// TestGoldenDesignCSV compares the design CSV of the small model and of
// testdata/output/design.toml with the golden files beside them (-update
// rewrites them); the values are checked above against closed forms.
func TestGoldenDesignCSV(t *testing.T) {
	for _, c := range []struct{ model, golden string }{
		{smallModel, "../../testdata/output/small.design.csv"},
		{designModel, "../../testdata/output/design.design.csv"},
	} {
		t.Run(filepath.Base(c.golden), func(t *testing.T) {
			out := filepath.Join(t.TempDir(), "design.csv")
			if code, _, stderr := exec("run", "--quiet", "--design-csv", out, c.model); code != 0 {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			got, err := os.ReadFile(out)
			if err != nil {
				t.Fatal(err)
			}
			if *update {
				if err := os.WriteFile(c.golden, got, 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(c.golden)
			if err != nil {
				t.Fatalf("%v (run with -update to write it)", err)
			}
			if !bytes.Equal(got, want) {
				if err := sameCSV(got, want); err != nil {
					t.Errorf("%s differs from the golden file: %v (go test ./cmd/govern -run TestGoldenDesignCSV -update after checking)", c.golden, err)
				}
			}
		})
	}
}
