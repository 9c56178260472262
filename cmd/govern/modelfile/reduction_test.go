package modelfile

import (
	"math"
	"strings"
	"testing"

	"govern/envelope/analysis"
	"govern/frame/units"
)

// office is a frame of three 9 m bays and four storeys, 9 m between
// frames, every value with its unit, with live load 2.4 kN/m² on levels 1
// to 3 reduced by ASCE/SEI 7-16, in the units of [units] given.
func office(force, length, caseKeys, more string) string {
	return `[units]
force = "` + force + `"
length = "` + length + `"
[grid]
bays = ["9 m", "9 m", "9 m"]
storeys = ["4 m", "3.5 m", "3.5 m", "3.5 m"]
spacing = "9 m"
column = "C"
beam = "C"
[[section]]
name = "C"
E = "30 GPa"
A = "0.25 m2"
I = "5.2e-3 m4"
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "area"
  on = "all beams"
  q = "5 kPa"
[[case]]
name = "L"
kind = "live"
reduction = "asce7-16"
` + caseKeys + `
  [[case.load]]
  type = "area"
  on = "level 1-3"
  q = "2.4 kPa"
` + more
}

// factorOf returns member name's factor of case c in job.
func factorOf(t *testing.T, job *Job, name string, c int) (analysis.MemberFactor, bool) {
	t.Helper()
	for _, f := range job.MemberFactors {
		if job.Model.Members[f.Member].Name == name && f.Case == c {
			return f, true
		}
	}
	return analysis.MemberFactor{}, false
}

// ASCE/SEI 7-16 4.7.2 from the model file, in any units: the third storey
// interior column supports one floor of 81 m² (K_LL·A_T = 324 m²):
// 0.5039; the first storey's three: 0.40 (the limit); an interior beam
// 81 m², K_LL = 2: 0.6091. A_T is given back in the model's units.
func TestReductionFromModelFile(t *testing.T) {
	for _, u := range []struct{ force, length string }{{"kN", "m"}, {"N", "mm"}, {"kip", "ft"}} {
		t.Run(u.force+"-"+u.length, func(t *testing.T) {
			job, err := Read("m.toml", []byte(office(u.force, u.length, "", "")))
			if err != nil {
				t.Fatal(err)
			}
			toM2 := job.System.SI(units.Area.Dim)
			for _, c := range []struct {
				name   string
				want   float64
				floors int
				area   float64
			}{{"B2-B3", 0.25 + 4.57/18, 1, 81}, {"B0-B1", 0.40, 3, 243}, {"B1-C1", 0.25 + 4.57/math.Sqrt(162), 1, 81}} {
				f, ok := factorOf(t, job, c.name, 1)
				if !ok {
					t.Fatalf("%s has no factor", c.name)
				}
				if math.Abs(f.N-c.want) > 1e-12 || f.Basis.Floors != c.floors || math.Abs(f.Basis.Area*toM2-c.area) > 1e-9 {
					t.Errorf("%s: %.6f, %d floors, %g m²; want %.6f, %d, %g", c.name, f.N, f.Basis.Floors, f.Basis.Area*toM2, c.want, c.floors, c.area)
				}
			}
			if _, ok := factorOf(t, job, "B3-B4", 1); ok {
				t.Errorf("the top storey column, which carries no floor of L, has a factor")
			}
			if _, ok := factorOf(t, job, "B0-B1", 0); ok {
				t.Errorf("the dead case has a factor")
			}
		})
	}
	t.Run("member keys", func(t *testing.T) {
		// kll = 2 on the column (a corner column with cantilever slabs,
		// Table 4.7-1): one floor, 2 × 81 = 162 m²: 0.6091; a
		// tributary_area of 100 m² on a beam, K_LL 2: 0.25 + 4.57/√200.
		job, err := Read("m.toml", []byte(office("kN", "m", "", "[[member]]\nname = \"B2-B3\"\nkll = 2\n[[assign]]\non = \"B1-C1\"\ntributary_area = \"100 m2\"\n")))
		if err != nil {
			t.Fatal(err)
		}
		if f, _ := factorOf(t, job, "B2-B3", 1); math.Abs(f.N-(0.25+4.57/math.Sqrt(162))) > 1e-12 || f.Basis.KLL != 2 {
			t.Errorf("kll 2: %+v", f)
		}
		if f, _ := factorOf(t, job, "B1-C1", 1); math.Abs(f.N-(0.25+4.57/math.Sqrt(200))) > 1e-12 {
			t.Errorf("tributary_area 100 m²: %+v", f)
		}
	})
	t.Run("node load standing for lo", func(t *testing.T) {
		// 194.4 kN at the top of the top storey's interior column, lo =
		// 2.4 kN/m²: 81 m², one floor, K_LL 4: 0.5039 (Eq. 4.7-1).
		job, err := Read("m.toml", []byte(office("kN", "m", `lo = "2.4 kPa"`, "  [[case.load]]\n  type = \"node\"\n  node = \"B4\"\n  fy = \"-194.4 kN\"\n")))
		if err != nil {
			t.Fatal(err)
		}
		if f, _ := factorOf(t, job, "B3-B4", 1); math.Abs(f.N-(0.25+4.57/18)) > 1e-12 || f.Basis.Floors != 1 {
			t.Errorf("column under the node load: %+v", f)
		}
	})
	t.Run("roof live", func(t *testing.T) {
		// ASCE/SEI 7-16 4.8.2: a roof beam of 81 m² (R1 = 0.6) at 6 on 12
		// (R2 = 0.9) under 0.96 kN/m²: 0.518 kN/m², raised to 0.58.
		job, err := Read("m.toml", []byte(office("kN", "m", "", "[[case]]\nname = \"Lr\"\nkind = \"roof-live\"\nreduction = \"asce7-16\"\nslope = 6\n  [[case.load]]\n  type = \"area\"\n  on = \"roof\"\n  q = \"0.96 kPa\"\n")))
		if err != nil {
			t.Fatal(err)
		}
		if f, _ := factorOf(t, job, "B4-C4", 2); math.Abs(f.N-0.58/0.96) > 1e-12 || f.Basis.Rule != "ASCE/SEI 7-16 4.8.2" {
			t.Errorf("roof beam: %+v", f)
		}
	})
	t.Run("en1991", func(t *testing.T) {
		// EN 1991-1-1 6.3.1.2(11): three storeys of category B above the
		// first storey column: αn = (2 + 1 × 0.7)/3 = 0.90 where it leads.
		src := strings.Replace(office("kN", "m", "category = \"B\"", ""), `reduction = "asce7-16"`, `reduction = "en1991"`, 1)
		job, err := Read("m.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		f, _ := factorOf(t, job, "B0-B1", 1)
		if math.Abs(f.N-0.9) > 1e-12 || !f.HasAccompanying || f.Accompanying[0] != 1 {
			t.Errorf("αn: %+v", f)
		}
	})
}

// A reduced case with second_order = true, with notional loads, or with
// a stiffness reduction is read, its factors those of the first-order
// model (ASCE/SEI 7-16 4.7.2: the interior column supporting one floor of
// 81 m², K_LL·A_T = 324 m²: 0.5039; the ground-floor one supporting
// three: 0.40, the limit), and every combination keeps its method: in a
// second-order analysis the geometric stiffness is built from the
// unreduced loads (docs/analysis.md).
func TestReductionWithSecondOrder(t *testing.T) {
	for _, tc := range []struct{ name, keys string }{
		{"second order", "second_order = true"},
		{"notional loads", "second_order = true\nnotional = \"aisc360\""},
		{"stiffness reduction", "stiffness_EI = 0.8"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := strings.Replace(office("kN", "m", "", ""), "[grid]", "[analysis]\n"+tc.keys+"\n[grid]", 1)
			job, err := Read("m.toml", []byte(src))
			if err != nil {
				t.Fatal(err)
			}
			for _, c := range []struct {
				name string
				want float64
			}{{"B2-B3", 0.25 + 4.57/18}, {"B0-B1", 0.40}} {
				f, ok := factorOf(t, job, c.name, 1)
				if !ok || math.Abs(f.N-c.want) > 1e-12 {
					t.Errorf("%s: %+v (found %v), want N factor %.6f", c.name, f, ok, c.want)
				}
			}
			if tc.name == "second order" {
				if len(job.Methods) != len(job.Combinations) || len(job.Methods) == 0 {
					t.Fatalf("%d methods for %d combinations", len(job.Methods), len(job.Combinations))
				}
				for k, m := range job.Methods {
					if !m.SecondOrder {
						t.Errorf("combination %q is not second order", job.Combinations[k].Name)
					}
				}
			}
		})
	}
}

func TestReductionErrors(t *testing.T) {
	for _, tc := range []struct{ name, keys, more, want string }{
		{"point load", "", "  [[case.load]]\n  type = \"point\"\n  on = \"A1-B1\"\n  P = 10\n  at = 2\n",
			`m.toml:32: case "L", load 2: a point load in a case with reduction = "asce7-16": concentrated live loads are never reduced; put it in a case without reduction`},
		{"udl without lo", "", "  [[case.load]]\n  type = \"udl\"\n  on = \"A1-B1\"\n  w = 10\n",
			`m.toml:32: case "L", load 2: a udl in a case with reduction = "asce7-16": give the case lo, the area load (per area) it stands for, or use an area load`},
		{"unknown rule", "", "", ""},
		{"use of a roof", "use = \"garage\"\nslope = 3", "", `m.toml:27: case "L": slope: the roof slope of ASCE/SEI 7-16 4.8.2 (R2) applies to a roof-live case with reduction = "asce7-16"`},
		{"bad use", "use = \"shop\"", "", `m.toml:26: case "L": use = "shop": must be one of "office", "storage", "garage", "assembly"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := office("kN", "m", tc.keys, tc.more)
			if tc.name == "unknown rule" {
				src = strings.Replace(src, `reduction = "asce7-16"`, `reduction = "asce7"`, 1)
				tc.want = `m.toml:25: case "L": reduction = "asce7": must be one of "asce7-16", "en1991"`
			}
			_, err := Read("m.toml", []byte(src))
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("\n got: %v\nwant: %s", err, tc.want)
			}
		})
	}
	t.Run("reduction of a dead case", func(t *testing.T) {
		src := strings.Replace(office("kN", "m", "", ""), "kind = \"dead\"\n", "kind = \"dead\"\nreduction = \"asce7-16\"\n", 1)
		_, err := Read("m.toml", []byte(src))
		if want := `m.toml:18: case "G": reduction = "asce7-16": only live and roof-live cases are reduced, not dead load`; err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("\n got: %v\nwant: %s", err, want)
		}
	})
	t.Run("en1991 without category", func(t *testing.T) {
		src := strings.Replace(office("kN", "m", "psi0 = 0.7\npsi1 = 0.5\npsi2 = 0.3", ""), `reduction = "asce7-16"`, `reduction = "en1991"`, 1)
		_, err := Read("m.toml", []byte(src))
		if want := `m.toml:25: case "L": reduction = "en1991" needs the case's category`; err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("\n got: %v\nwant: %s", err, want)
		}
	})
	t.Run("keys without reduction", func(t *testing.T) {
		src := strings.Replace(office("kN", "m", "lo = \"2.4 kPa\"", ""), "reduction = \"asce7-16\"\n", "", 1)
		_, err := Read("m.toml", []byte(src))
		if want := `m.toml:25: case "L": lo without reduction`; err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("\n got: %v\nwant: %s", err, want)
		}
	})
}
