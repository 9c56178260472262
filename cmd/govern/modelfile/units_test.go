package modelfile

import (
	"math"
	"strings"
	"testing"
)

// unitTol is the relative difference allowed between a value read with a
// unit and the same value written in the model's units: the conversion's
// round-off, a few units in the last place.
const unitTol = 1e-14

// TestEveryValueTakesAUnit reads gridModel with every value that has a
// dimension written with a unit (in other units than the model's kN and
// m), and compares the model it gives, value by value, with the one read
// from the plain numbers. The conversions are exact definitions (1 in =
// 25.4 mm, 1 lbf = 4.4482216152605 N; frame/units), so each value written
// here is the plain one in another unit.
func TestEveryValueTakesAUnit(t *testing.T) {
	plain, err := Read("plain.toml", []byte(gridModel))
	if err != nil {
		t.Fatal(err)
	}
	src := gridModel
	for _, e := range [][2]string{
		{"bays = [6.0, 4.0]", `bays = ["6000 mm", "400 cm"]`},
		{"storeys = [4.0, 3.0]", `storeys = ["4 m", 3.0]`},
		{"spacing = 5.0", `spacing = "5000mm"`},
		{"E = 30e6\nA = 0.16\nI = 2.1e-3\nweight = 3.8", "E = \"30 GPa\"\nA = \"1600 cm2\"\nI = \"2.1e9 mm4\"\nweight = \"3.8 N/mm\""},
		{"E = 30e6\nA = 0.2\nI = 4e-3\nweight = 5", "E = \"30000 MPa\"\nA = \"200000 mm²\"\nI = \"4e-3 m^4\"\nweight = \"5 kN/m\""},
		{"q = 2.0", `q = "2 kPa"`},
		{"w = 10\n  from = 1.0\n  to = 3.0", "w = \"10 N/mm\"\n  from = \"1000 mm\"\n  to = \"3 m\""},
		{"P = 20\n  at = 2", "P = \"20000 N\"\n  at = \"200 cm\""},
		{"w = 3", `w = "0.003 MN/m"`},
		{"fx = 5", `fx = "5 kN"`},
	} {
		if !strings.Contains(src, e[0]) {
			t.Fatalf("%q not in the model", e[0])
		}
		src = strings.Replace(src, e[0], e[1], 1)
	}
	job, err := Read("units.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	near := func(what string, got, want float64) {
		t.Helper()
		if d := math.Abs(got - want); d > unitTol*math.Abs(want) {
			t.Errorf("%s = %.17g, want %.17g", what, got, want)
		}
	}
	a, b := job.Model, plain.Model
	for i := range b.Nodes {
		near(b.Nodes[i].Name+" x", a.Nodes[i].X, b.Nodes[i].X)
		near(b.Nodes[i].Name+" y", a.Nodes[i].Y, b.Nodes[i].Y)
	}
	for i, s := range b.Sections {
		got := a.Sections[i]
		near(s.Name+" E", got.E, s.E)
		near(s.Name+" A", got.A, s.A)
		near(s.Name+" I", got.I, s.I)
		near(s.Name+" weight", got.Weight, s.Weight)
	}
	near("spacing", job.Grid.Spacing, plain.Grid.Spacing)
	for c := range b.Cases {
		if len(a.Cases[c].MemberLoads) != len(b.Cases[c].MemberLoads) {
			t.Fatalf("case %d: %d member loads, want %d", c, len(a.Cases[c].MemberLoads), len(b.Cases[c].MemberLoads))
		}
		for i, l := range b.Cases[c].MemberLoads {
			g := a.Cases[c].MemberLoads[i]
			for _, v := range [][3]any{{"W", g.W, l.W}, {"WEnd", g.WEnd, l.WEnd}, {"From", g.From, l.From}, {"To", g.To, l.To}, {"P", g.P, l.P}, {"At", g.At, l.At}} {
				near(b.Cases[c].Name+" load "+v[0].(string), v[1].(float64), v[2].(float64))
			}
		}
		for i, l := range b.Cases[c].NodeLoads {
			near("node load fx", a.Cases[c].NodeLoads[i].Fx, l.Fx)
		}
	}
}

// TestValuesInAnotherSystem reads values written with units (examples of the trade's usage) into a
// model in kip and ft and one in N and mm, each against its value worked
// by hand from the exact definitions.
func TestValuesInAnotherSystem(t *testing.T) {
	const lbf = 4.4482216152605
	model := func(force, length, sec, load string) string {
		return `[units]
force = "` + force + `"
length = "` + length + `"
[[section]]
name = "S"
` + sec + `
[[node]]
name = "a"
x = 0
y = 0
support = "fixed"
[[node]]
name = "b"
x = "30 ft"
y = 0
[[member]]
start = "a"
end = "b"
section = "S"
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "a-b"
` + load + `
  [[case.load]]
  type = "node"
  node = "b"
  fy = "-12 kN"
  m = "10 kip*in"
`
	}
	for _, tc := range []struct {
		name, force, length string
		e, a, i, w          float64 // in the model's units
		x, fy, m            float64
	}{
		// 29000 ksi = 29000 × 144 ksf; 1830 in⁴ = 1830/12⁴ ft⁴; 26.5 in² =
		// 26.5/144 ft²; 2.4 kip/ft; 30 ft; 12 kN = 12000/4448.2216152605
		// kip; 10 kip·in = 10/12 kip·ft.
		{"kip and ft", "kip", "ft", 29000 * 144, 26.5 / 144, 1830.0 / 20736, 2.4, 30, -12000 / (1000 * lbf), 10.0 / 12},
		// In N and mm: 29000 ksi = 29000 × 1000 lbf / 25.4² N/mm²;
		// 1830 in⁴ × 25.4⁴ mm⁴; 2.4 kip/ft = 2400 lbf / 304.8 N/mm.
		{"N and mm", "N", "mm", 29e6 * lbf / (25.4 * 25.4), 26.5 * 25.4 * 25.4, 1830 * math.Pow(25.4, 4), 2400 * lbf / 304.8, 9144, -12000, 10 * 1000 * lbf * 25.4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := model(tc.force, tc.length, "E = \"29000 ksi\"\nA = \"26.5 in2\"\nI = \"1830 in4\"", `  w = "2.4 kip/ft"`)
			job, err := Read("m.toml", []byte(src))
			if err != nil {
				t.Fatal(err)
			}
			s := job.Model.Sections[0]
			c := job.Model.Cases[0]
			for _, v := range []struct {
				what      string
				got, want float64
			}{{"E", s.E, tc.e}, {"A", s.A, tc.a}, {"I", s.I, tc.i}, {"w", c.MemberLoads[0].W, tc.w},
				{"x", job.Model.Nodes[1].X, tc.x}, {"fy", c.NodeLoads[0].Fy, tc.fy}, {"m", c.NodeLoads[0].M, tc.m}} {
				if math.Abs(v.got-v.want) > unitTol*math.Abs(v.want) {
					t.Errorf("%s = %.17g, want %.17g", v.what, v.got, v.want)
				}
			}
			if job.Units.Force != tc.force || job.Units.Length != tc.length {
				t.Errorf("units %+v", job.Units)
			}
		})
	}
}

// TestUnitsRecordedAsWritten: [units] gives the labels the outputs carry
// (the table's own symbol for an alias), the output units, and the
// system; without [units] a model is in kN, m and °C.
func TestUnitsRecordedAsWritten(t *testing.T) {
	job, err := Read("m.toml", []byte("[units]\nforce = \"kips\"\nlength = \"feet\"\ntemperature = \"degF\"\nmoment = \"kip*in\"\ndeflection = \"in\"\noutput_force = \"lbf\"\n"+base))
	if err != nil {
		t.Fatal(err)
	}
	u := job.Units
	if u.Force != "kip" || u.Length != "ft" || u.Output.Moment != "kip·in" || u.Output.Deflection != "in" || u.Output.Force != "lbf" {
		t.Errorf("units %+v", u)
	}
	if job.System.Temperature.Symbol != "°F" {
		t.Errorf("temperature %s", job.System.Temperature.Symbol)
	}
	job, err = Read("m.toml", []byte(base))
	if err != nil {
		t.Fatal(err)
	}
	if s := job.System; s.Force.Symbol != "kN" || s.Length.Symbol != "m" || s.Temperature.Symbol != "°C" {
		t.Errorf("default system %+v", s)
	}
}
