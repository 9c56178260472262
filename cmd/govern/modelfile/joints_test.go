package modelfile

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
)

// newKeysModel gives every key of the new loads, supports and joints, in
// the model's own units (kN, m, °C).
const newKeysModel = `[analysis]
rigid_zones = true
rigid_zone_factor = 0.5
[[section]]
name = "C"
E = 30e6
A = 0.16
I = 2.1e-3
depth = 0.4
[[section]]
name = "B"
E = 30e6
A = 0.18
I = 5.4e-3
depth = 0.6
alpha = 1e-5
[[node]]
name = "a"
x = 0
y = 0
support = ["x", "rotation"]
ky = 2e5
[[node]]
name = "b"
x = 0
y = 4
[[node]]
name = "c"
x = 6
y = 4
support = ["y"]
kx = 1e4
kr = 3e4
[[member]]
start = "a"
end = "b"
section = "C"
[[member]]
start = "b"
end = "c"
section = "B"
spring_end = 5e4
offset_end = 0.1
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "b-c"
  w = 2
  w2 = 6
  from = 1
  to = 5
  [[case.load]]
  type = "moment"
  on = "b-c"
  m = 7
  at = 2
[[case]]
name = "S"
kind = "settlement"
  [[case.load]]
  type = "displacement"
  node = "a"
  dx = 0.002
[[case]]
name = "T"
kind = "temperature"
  [[case.load]]
  type = "temperature"
  on = "b-c"
  dT = 15
  dT_gradient = -10
`

// TestReadNewLoadsAndJoints reads every key of the new loads, supports and
// joints into the frame's values.
func TestReadNewLoadsAndJoints(t *testing.T) {
	job, err := Read("m.toml", []byte(newKeysModel))
	if err != nil {
		t.Fatal(err)
	}
	mo := job.Model
	if a := mo.Nodes[0]; a.Support != frame.HoldX|frame.HoldRZ || a.Springs != [3]float64{0, 2e5, 0} {
		t.Errorf("node a: support %v, springs %v", a.Support, a.Springs)
	}
	if c := mo.Nodes[2]; c.Support != frame.Roller || c.Springs != [3]float64{1e4, 0, 3e4} {
		t.Errorf("node c: support %v, springs %v", c.Support, c.Springs)
	}
	if s := mo.Sections[1]; s.Alpha != 1e-5 {
		t.Errorf("alpha %g", s.Alpha)
	}
	// Rigid zones: the column's top takes half the beam's depth, times
	// 0.5; the beam's start half the column's, times 0.5; the beam's end
	// its own 0.1 (no column at c).
	col, beam := mo.Members[0], mo.Members[1]
	if col.OffsetStart != 0 || col.OffsetEnd != 0.5*0.3 || beam.OffsetStart != 0.5*0.2 || beam.OffsetEnd != 0.1 || beam.SpringEnd != 5e4 || beam.SpringStart != 0 {
		t.Errorf("column %+v, beam %+v", col, beam)
	}
	want := []frame.MemberLoad{
		{Member: 1, From: 1, To: 5, W: 2, WEnd: 6},
		{Member: 1, Moment: true, At: 2, M: 7},
	}
	if got := mo.Cases[0].MemberLoads; len(got) != 2 || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("loads of G: %+v", got)
	}
	if got := mo.Cases[1].Displacements; len(got) != 1 || got[0] != (frame.NodeDisplacement{Node: 0, Ux: 0.002}) {
		t.Errorf("displacements of S: %+v", got)
	}
	if got := mo.Cases[2].MemberLoads; len(got) != 1 || got[0] != (frame.MemberLoad{Member: 1, Thermal: true, DT: 15, DTGrad: -10}) {
		t.Errorf("loads of T: %+v", got)
	}
	if job.Cases[1].Kind != combos.Settlement || job.Cases[2].Kind != combos.Temperature {
		t.Errorf("kinds %v", job.Cases)
	}
}

// TestReadNewKeysErrors: each new key's problems at their lines, with the
// nearest word where one is close. The lines count those of base
// (read_test.go).
func TestReadNewKeysErrors(t *testing.T) {
	for _, tc := range []struct {
		name, old, new string
		want           string
		sentinel       error
	}{
		{"support by direction, misspelt", `support = "fixed"` + "\n[[node]]", `support = ["x", "rotaton"]` + "\n[[node]]",
			`m.toml:10: node "a": support: "rotaton" is not a direction; the directions are "x", "y", "rotation" (did you mean "rotation"?)`, ErrValue},
		{"support by direction, twice", `support = "fixed"` + "\n[[node]]", `support = ["y", "y"]` + "\n[[node]]",
			`m.toml:10: node "a": support: "y" is given twice`, ErrDuplicate},
		{"spring where the support holds", `support = "fixed"` + "\n[[node]]", `support = "fixed"` + "\nkx = 100\n[[node]]",
			`m.toml:11: node "a": kx = 100: the support (fixed) already holds the node in x; a spring acts in a direction the support leaves free`, ErrValue},
		{"negative spring", `support = "fixed"` + "\n[[node]]", `support = "pinned"` + "\nkr = -5\n[[node]]",
			`m.toml:11: node "a": kr = -5: must not be negative`, ErrValue},
		{"a misspelt spring", `support = "fixed"` + "\n[[node]]", `support = "pinned"` + "\nkz = 5\n[[node]]",
			`m.toml:11: node "a": unknown key "kz" (did you mean "kr"?)`, ErrUnknownKey},
		{"spring at a released end", `section = "S"` + "\n[[case]]", `section = "S"` + "\nrelease = \"end\"\nspring_end = 1e4\n[[case]]",
			`m.toml:21: member 1: spring_end: the member's end is released (release = "end"); give a release or a spring, not both`, ErrValue},
		{"spring of no stiffness", `section = "S"` + "\n[[case]]", `section = "S"` + "\nspring_start = 0\n[[case]]",
			`m.toml:20: member 1: spring_start = 0: a spring of no stiffness is a hinge; write release = "start"`, ErrValue},
		{"zones longer than the member", `section = "S"` + "\n[[case]]", `section = "S"` + "\noffset_start = 3\noffset_end = 2\n[[case]]",
			`m.toml:21: member 1: rigid end zones 3 and 2 leave member "a-b" (length 5) no flexible length`, ErrValue},
		{"zone factor out of range", `[[section]]`, "[analysis]\nrigid_zones = true\nrigid_zone_factor = 1.5\n[[section]]",
			`m.toml:3: [analysis]: rigid_zone_factor = 1.5: must be from 0 to 1`, ErrValue},
		{"zone factor without zones", `[[section]]`, "[analysis]\nrigid_zone_factor = 0.5\n[[section]]",
			`m.toml:2: [analysis]: rigid_zone_factor = 0.5 without rigid_zones = true: the factor scales the rigid end zones that rigid_zones gives`, ErrValue},
		{"a misspelt load type", `type = "point"`, `type = "temprature"`,
			`m.toml:24: case "G", load 1: type = "temprature": must be one of "udl", "point", "moment", "area", "temperature", "node", "displacement" (did you mean "temperature"?)`, ErrValue},
		{"a misspelt w2", withLoadOld(), "  type = \"udl\"\n  on = \"a-b\"\n  w = 2\n  w_2 = 3",
			`m.toml:27: case "G", load 1: unknown key "w_2" (did you mean "w2"?)`, ErrUnknownKey},
		{"a moment outside its member", withLoadOld(), "  type = \"moment\"\n  on = \"a-b\"\n  m = 2\n  at = 7",
			`m.toml:27: case "G", load 1: member "a-b": at = 7 is outside the member (length 5)`, ErrValue},
		{"temperature without alpha", withLoadOld(), "  type = \"temperature\"\n  on = \"a-b\"\n  dT = 20",
			`m.toml:26: case "G", load 1: member "a-b": section "S" gives no alpha, the coefficient of thermal expansion a temperature load needs`, ErrMissing},
		{"gradient without depth", withLoadOld(), "  type = \"temperature\"\n  on = \"a-b\"\n  dT_gradient = 20",
			`m.toml:26: case "G", load 1: member "a-b": section "S" gives no alpha, the coefficient of thermal expansion a temperature load needs`, ErrMissing},
		{"temperature with nothing", withLoadOld(), "  type = \"temperature\"\n  on = \"a-b\"",
			`m.toml:23: case "G", load 1: a temperature load needs dT (a uniform change), dT_gradient (the local +y face less the local -y face) or both`, ErrMissing},
		{"displacement where the support does not hold", withLoadOld(), "  type = \"displacement\"\n  node = \"b\"\n  rz = 0.001",
			`m.toml:26: case "G", load 1: node "b": its support (pinned) does not hold it in rotation; a displacement is imposed only where a support holds the node (a spring's node moves with the frame: load it instead)`, ErrValue},
		{"displacement with nothing", withLoadOld(), "  type = \"displacement\"\n  node = \"b\"",
			`m.toml:23: case "G", load 1: a displacement needs dx, dy or rz (in directions the node's support holds)`, ErrMissing},
		{"a settlement patterned", `kind = "dead"`, "kind = \"settlement\"\npattern = true",
			`m.toml:23: case "G": pattern = true: a settlement case imposes displacements, which are not placed span by span`, ErrValue},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := strings.Replace(base, tc.old, tc.new, 1)
			if tc.name == "displacement where the support does not hold" {
				src = strings.Replace(src, "y = 0\nsupport = \"fixed\"\n[[member]]", "y = 0\nsupport = \"pinned\"\n[[member]]", 1)
			}
			if tc.name == "gradient without depth" {
				src = strings.Replace(src, "I = 1e-4", "I = 1e-4\nalpha = 1e-5", 1)
				tc.want = `m.toml:27: case "G", load 1: member "a-b": section "S" gives no depth, which a temperature gradient needs (the curvature is alpha × dT_gradient / depth)`
			}
			if src == base {
				t.Fatalf("edit %q not applied", tc.old)
			}
			_, err := Read("m.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got := err.Error(); !strings.HasPrefix(got, tc.want) {
				t.Errorf("error\n got: %s\nwant: %s", got, tc.want)
			}
			if !errors.Is(err, tc.sentinel) {
				t.Errorf("error does not wrap %v", tc.sentinel)
			}
		})
	}
}

func withLoadOld() string { return "  type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1" }

// withEdits returns src with each edit's first string replaced by its
// second, failing the test where one is not found.
func withEdits(t *testing.T, src string, edits [][2]string) string {
	t.Helper()
	for _, e := range edits {
		if !strings.Contains(src, e[0]) {
			t.Fatalf("%q not in the model", e[0])
		}
		src = strings.Replace(src, e[0], e[1], 1)
	}
	return src
}

// newKeysValues lists the values the new keys gave a model, by name, for
// comparing two readings of it.
func newKeysValues(mo *frame.Model) map[string]float64 {
	v := map[string]float64{}
	for _, n := range mo.Nodes {
		for d, k := range springKeys {
			v[n.Name+" "+k] = n.Springs[d]
		}
	}
	for _, s := range mo.Sections {
		v[s.Name+" depth"], v[s.Name+" alpha"] = s.Depth, s.Alpha
	}
	for _, m := range mo.Members {
		v[m.Name+" spring_start"], v[m.Name+" spring_end"] = m.SpringStart, m.SpringEnd
		v[m.Name+" offset_start"], v[m.Name+" offset_end"] = m.OffsetStart, m.OffsetEnd
	}
	for _, c := range mo.Cases {
		for i, l := range c.MemberLoads {
			p := fmt.Sprintf("%s load %d ", c.Name, i+1)
			v[p+"w"], v[p+"w2"], v[p+"from"], v[p+"to"] = l.W, l.WEnd, l.From, l.To
			v[p+"m"], v[p+"at"], v[p+"dT"], v[p+"dT_gradient"] = l.M, l.At, l.DT, l.DTGrad
		}
		for i, d := range c.Displacements {
			p := fmt.Sprintf("%s displacement %d ", c.Name, i+1)
			v[p+"dx"], v[p+"dy"], v[p+"rz"] = d.Ux, d.Uy, d.Rz
		}
	}
	return v
}

// TestNewKeysTakeUnits reads newKeysModel with every value of the new
// loads, supports and joints written with a unit other than the model's
// (kN, m, °C), and compares each value with the plain one. The units are
// exact multiples (1 kN/mm = 1000 kN/m, 1 mrad = 0.001 rad, a step of 1 K
// is one of 1 °C and 18 °F is 10 K; docs/conventions.md, from the SI and
// NIST SP 811, recalled from memory), so the two readings differ by the
// conversion's round-off only.
func TestNewKeysTakeUnits(t *testing.T) {
	plainSrc := withEdits(t, newKeysModel, [][2]string{{"dx = 0.002", "dx = 0.002\n  rz = 0.001"}})
	plain, err := Read("plain.toml", []byte(plainSrc))
	if err != nil {
		t.Fatal(err)
	}
	src := withEdits(t, newKeysModel, [][2]string{
		{"depth = 0.4", `depth = "400 mm"`},
		{"depth = 0.6", `depth = "60 cm"`},
		{"alpha = 1e-5", `alpha = "1e-5 1/K"`},
		{"ky = 2e5", `ky = "200 kN/mm"`},
		{"kx = 1e4", `kx = "1e7 N/m"`},
		{"kr = 3e4", `kr = "30 MN*m/rad"`},
		{"spring_end = 5e4", `spring_end = "5e7 N·m/rad"`},
		{"offset_end = 0.1", `offset_end = "100 mm"`},
		{"w = 2\n  w2 = 6\n  from = 1\n  to = 5", "w = \"2 N/mm\"\n  w2 = \"6000 N/m\"\n  from = \"1000 mm\"\n  to = \"500 cm\""},
		{"m = 7\n  at = 2", "m = \"7000 N*m\"\n  at = \"2000 mm\""},
		{"dx = 0.002", "dx = \"2 mm\"\n  rz = \"1 mrad\""},
		{"dT = 15\n  dT_gradient = -10", "dT = \"15 K\"\n  dT_gradient = \"-18 °F\""},
	})
	job, err := Read("units.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	got, want := newKeysValues(job.Model), newKeysValues(plain.Model)
	if len(got) != len(want) {
		t.Fatalf("%d values, want %d", len(got), len(want))
	}
	nonzero := 0
	for k, w := range want {
		if w != 0 {
			nonzero++
		}
		if g, ok := got[k]; !ok || math.Abs(g-w) > unitTol*math.Abs(w) {
			t.Errorf("%s = %.17g, want %.17g", k, g, w)
		}
	}
	// The 18 values written with a unit above and the two rigid zones
	// rigid_zones gives from the depths: a key the comparison missed would
	// pass as 0 = 0.
	if nonzero != 20 {
		t.Errorf("%d values not zero, want 20", nonzero)
	}
}

// TestNewKeysInKipFootFahrenheit reads the new keys into a model in kip,
// ft and °F, each against its value worked by hand from the exact
// definitions (1 in = 1/12 ft; a step of 1 °F is 5/9 K, so a coefficient
// per K is 5/9 of itself per °F; 1° = π/180 rad; docs/conventions.md).
func TestNewKeysInKipFootFahrenheit(t *testing.T) {
	src := withEdits(t, "[units]\nforce = \"kip\"\nlength = \"ft\"\ntemperature = \"°F\"\n"+newKeysModel, [][2]string{
		{"alpha = 1e-5", `alpha = "1.2e-5 1/K"`},
		{"kx = 1e4", `kx = "20 kip/in"`},
		{"kr = 3e4", `kr = "1.2e6 kip*in/rad"`},
		{"spring_end = 5e4", `spring_end = "6e5 kip-in/rad"`},
		{"offset_end = 0.1", `offset_end = "6 in"`},
		{"w2 = 6", `w2 = "600 plf"`},
		{"m = 7", `m = "84 kip*in"`},
		{"dx = 0.002", "dx = \"0.6 in\"\n  rz = \"0.5 deg\""},
		{"dT = 15\n  dT_gradient = -10", "dT = \"20 K\"\n  dT_gradient = \"-10 °C\""},
	})
	job, err := Read("kip.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	got := newKeysValues(job.Model)
	for _, v := range []struct {
		key  string
		want float64
	}{
		{"B alpha", 1.2e-5 * 5 / 9},
		{"c kx", 20 * 12},
		{"c kr", 1.2e6 / 12},
		{"b-c spring_end", 6e5 / 12},
		{"b-c offset_end", 0.5},
		{"G load 1 w2", 0.6},
		{"G load 2 m", 7},
		{"S displacement 1 dx", 0.05},
		{"S displacement 1 rz", math.Pi / 360},
		{"T load 1 dT", 36},
		{"T load 1 dT_gradient", -18},
	} {
		if g := got[v.key]; math.Abs(g-v.want) > unitTol*math.Abs(v.want) {
			t.Errorf("%s = %.17g, want %.17g", v.key, g, v.want)
		}
	}
}

// TestNewKeysRefuseWrongDimension: a unit of another dimension on any of
// the new keys is an error at its line, naming the quantity due. The
// angle is a dimension of its own, so that a moment is not taken for a
// rotational stiffness, nor a rotation for a pure number.
func TestNewKeysRefuseWrongDimension(t *testing.T) {
	for _, tc := range []struct {
		old, new string
		where    string // the table, as messages name it
		rest     string // the message after `key = "value": `
	}{
		{"depth = 0.6", `depth = "0.6 kN"`, `section "B"`, `kN is a force, where a length is due (such as m, mm or ft)`},
		{"alpha = 1e-5", `alpha = "1e-5 K"`, `section "B"`, `K is a temperature difference, where a coefficient of thermal expansion (per degree) is due (such as 1/K or 1/°F)`},
		{"ky = 2e5", `ky = "2e5 kN*m/rad"`, `node "a"`, `kN·m/rad is a rotational stiffness (moment per radian), where a stiffness (force per length) is due (such as kN/m or kip/in)`},
		{"kx = 1e4", `kx = "1e4 kN"`, `node "c"`, `kN is a force, where a stiffness (force per length) is due (such as kN/m or kip/in)`},
		{"kr = 3e4", `kr = "3e4 kN*m"`, `node "c"`, `kN·m is a moment (force × length), where a rotational stiffness (moment per radian) is due (such as kN·m/rad or kip·in/rad)`},
		{"spring_end = 5e4", `spring_end = "5e4 kN/m"`, `member 2`, `kN/m is a force per length, where a rotational stiffness (moment per radian) is due (such as kN·m/rad or kip·in/rad)`},
		{"offset_end = 0.1", `offset_end = "0.1 rad"`, `member 2`, `rad is a rotation, where a length is due (such as m, mm or ft)`},
		{"w2 = 6", `w2 = "6 kN"`, `case "G", load 1`, `kN is a force, where a force per length is due (such as kN/m or kip/ft)`},
		{"m = 7", `m = "7 kN"`, `case "G", load 2`, `kN is a force, where a moment (force × length) is due (such as kN·m or kip·ft)`},
		{"at = 2", `at = "2 kN*m"`, `case "G", load 2`, `kN·m is a moment (force × length), where a length is due (such as m, mm or ft)`},
		{"dx = 0.002", `dx = "2 mrad"`, `case "S", load 1`, `mrad is a rotation, where a length is due (such as m, mm or ft)`},
		{"dx = 0.002", "dx = 0.002\n  rz = \"1 mm\"", `case "S", load 1`, `mm is a length, where a rotation is due (such as rad, mrad or degree)`},
		{"dT = 15", `dT = "15 1/K"`, `case "T", load 1`, `1/K is a coefficient of thermal expansion (per degree), where a temperature difference is due (such as K, °C or °F)`},
		{"dT_gradient = -10", `dT_gradient = "-10 mm"`, `case "T", load 1`, `mm is a length, where a temperature difference is due (such as K, °C or °F)`},
	} {
		key, value, _ := strings.Cut(tc.new[strings.LastIndex(tc.new, "\n")+1:], " = ")
		key = strings.TrimSpace(key)
		t.Run(key+" "+value, func(t *testing.T) {
			src := withEdits(t, newKeysModel, [][2]string{{tc.old, tc.new}})
			line := strings.Count(src[:strings.Index(src, key+" = "+value)], "\n") + 1
			want := fmt.Sprintf("m.toml:%d: %s: %s = %s: %s", line, tc.where, key, value, tc.rest)
			_, err := Read("m.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got := err.Error(); got != want {
				t.Errorf("error\n got: %s\nwant: %s", got, want)
			}
			if !errors.Is(err, ErrValue) {
				t.Errorf("error does not wrap ErrValue")
			}
		})
	}
}
