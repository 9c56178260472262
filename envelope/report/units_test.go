package report

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"

	"govern/envelope/analysis"
)

// Exact factors from the model's kN and m (1 lbf = 4.4482216152605 N,
// 1 ft = 0.3048 m exactly; NIST SP 811 Appendix B, recalled from memory).
const (
	kNToKip      = 1 / 4.4482216152605
	kNmToKipFt   = 1 / (4.4482216152605 * 0.3048)
	mToMM        = 1000
	outputDigTol = 2e-9 // ten significant digits on each side (appendNum)
)

// shownPortal is portal with its results shown in kip, kip·ft and mm.
func shownPortal(t *testing.T) (model, shown *Report) {
	t.Helper()
	res := portal(t, "beam")
	job := *res.Job
	job.Units.Output = analysis.OutputUnits{Force: "kip", Moment: "kip*ft", Deflection: "mm"}
	res2, err := analysis.Run(context.Background(), &job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return New(res), New(res2)
}

// TestOutputUnitsJSON: every number of the JSON of a result shown in kip,
// kip·ft and mm is that of the same result in kN, kN·m and m times the
// exact factor, and the file says so in its units.
func TestOutputUnitsJSON(t *testing.T) {
	a, b := shownPortal(t)
	var ja, jb bytes.Buffer
	if err := a.WriteJSON(&ja); err != nil {
		t.Fatal(err)
	}
	if err := b.WriteJSON(&jb); err != nil {
		t.Fatal(err)
	}
	var da, db map[string]any
	if err := json.Unmarshal(ja.Bytes(), &da); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(jb.Bytes(), &db); err != nil {
		t.Fatal(err)
	}
	u := db["units"].(map[string]any)
	if u["force"] != "kip" || u["moment"] != "kip·ft" || u["deflection"] != "mm" || u["length"] != "m" {
		t.Errorf("units %v", u)
	}
	// factor gives the factor of a number by the key it is under.
	factor := func(path []string) float64 {
		k := path[len(path)-1]
		in := func(s string) bool { return strings.Contains(strings.Join(path, "/"), s) }
		switch {
		case in("deflection"), in("nodes/") && (in("/ux/") || in("/uy/")), in("drift"), in("displacements") && (k == "ux" || k == "uy"):
			return mToMM
		case in("nodes/") && in("/rz/"):
			return 1 // radians
		case in("storeys/") && (k == "P" || k == "H"), k == "base_shear", k == "gravity", k == "force" && in("notional"):
			return kNToKip
		case k == "second_order" || k == "first_order":
			return kNmToKipFt
		case k == "N" || k == "V" || k == "Fx" || k == "Fy" || k == "force" && in("joint_residual"):
			return kNToKip
		case k == "M" || k == "moment" && in("joint_residual"):
			return kNmToKipFt
		case in("/N/") || in("/V/") || in("/Fx/") || in("/Fy/"):
			return kNToKip
		case in("/M/"):
			return kNmToKipFt
		}
		return 1 // positions, lengths, factors, counts, ratios
	}
	n := 0
	var walk func(path []string, x, y any)
	walk = func(path []string, x, y any) {
		switch xv := x.(type) {
		case map[string]any:
			for k, v := range xv {
				walk(append(path, k), v, y.(map[string]any)[k])
			}
		case []any:
			for i, v := range xv {
				walk(append(path, strconv.Itoa(i)), v, y.([]any)[i])
			}
		case float64:
			f := factor(path)
			yv := y.(float64)
			if math.Abs(xv*f-yv) > outputDigTol*math.Max(math.Abs(yv), 1e-6) {
				t.Errorf("%s: %g × %g = %g, shown %g", strings.Join(path, "/"), xv, f, xv*f, yv)
			}
			n++
		}
	}
	delete(da, "units")
	delete(db, "units")
	walk(nil, da, db)
	if n < 500 {
		t.Errorf("only %d numbers compared", n)
	}
}

// TestOutputUnitsTables: the tables show the values in the output units,
// with those units in their headers.
func TestOutputUnitsTables(t *testing.T) {
	a, b := shownPortal(t)
	ta, tb := a.Tables(), b.Tables()
	if len(ta) != len(tb) {
		t.Fatalf("%d tables, then %d", len(ta), len(tb))
	}
	for i := range ta {
		for c, h := range tb[i].Header {
			f := 1.0
			switch {
			case strings.HasPrefix(h, "down (") || strings.HasPrefix(h, "up ("):
				f = mToMM
			case strings.Contains(h, "(kip·ft)"):
				f = kNmToKipFt
			case strings.Contains(h, "(kip)"):
				f = kNToKip
			case strings.Contains(h, "kN"):
				t.Errorf("table %q: header %q in the model's units", tb[i].Title, h)
			}
			if strings.Contains(ta[i].Title, "Reactions") && c >= 2 {
				continue // mixed units: checked below
			}
			if strings.HasPrefix(ta[i].Title, "Foundation loads") && h == "value" {
				// The unit of the component the row names.
				for r, row := range tb[i].Rows {
					g := kNToKip
					if strings.HasPrefix(row[1], "M ") {
						g = kNmToKipFt
					}
					checkCell(t, ta[i].Title+" / "+row[1], ta[i].Rows[r][c], row[c], g)
				}
				continue
			}
			for r := range tb[i].Rows {
				checkCell(t, ta[i].Title+" / "+h, ta[i].Rows[r][c], tb[i].Rows[r][c], f)
			}
		}
	}
	for _, tab := range tb {
		if strings.HasPrefix(tab.Title, "Reactions") {
			for _, row := range tab.Rows {
				if row[1] != "Fx (kip)" && row[1] != "Fy (kip)" && row[1] != "M (kip·ft)" {
					t.Errorf("reaction component %q", row[1])
				}
			}
		}
	}
	var text bytes.Buffer
	if err := b.WriteText(&text, false); err != nil {
		t.Fatal(err)
	}
	if want := "Units: force kip, moment kip·ft, length m, deflection mm (the model's values are in kN and m)."; !strings.Contains(text.String(), want) {
		t.Errorf("the terminal does not say %q", want)
	}
}

// checkCell compares a cell shown in the model's units, times f, with the
// one shown in the output units, to the figures shown.
func checkCell(t *testing.T, what, model, shown string, f float64) {
	t.Helper()
	x, errA := strconv.ParseFloat(model, 64)
	y, errB := strconv.ParseFloat(shown, 64)
	if errA != nil || errB != nil {
		if model != shown && (errA == nil) != (errB == nil) {
			t.Errorf("%s: %q, then %q", what, model, shown)
		}
		return
	}
	// Two decimals, or four significant figures for deflections.
	tol := 0.0051 + 0.51*math.Abs(x*f)*1e-3
	if math.Abs(x*f-y) > tol {
		t.Errorf("%s: %s × %g = %g, shown %s", what, model, f, x*f, shown)
	}
}

// TestOutputUnitsCSV: the CSV says the unit of each row and of its
// "with" columns, and its numbers are in them.
func TestOutputUnitsCSV(t *testing.T) {
	_, b := shownPortal(t)
	var out bytes.Buffer
	if err := b.WriteCSV(&out); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&out).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if h := strings.Join(rows[0][12:18], ","); h != "max_with_N (kip),max_with_V (kip),max_with_M (kip·ft),min_with_N (kip),min_with_V (kip),min_with_M (kip·ft)" {
		t.Errorf("header %s", h)
	}
	units := map[string]string{"N": "kip", "V": "kip", "M": "kip·ft", "deflection": "mm", "node ux": "mm", "node uy": "mm", "node rz": "rad"}
	for _, r := range rows[1:] {
		if r[7] != units[r[2]] {
			t.Errorf("row %v: unit %q, want %q", r[:3], r[7], units[r[2]])
		}
	}
}
