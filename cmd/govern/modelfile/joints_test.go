package modelfile

import (
	"errors"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
)

// TestReadNewLoadsAndJoints reads every key of the new loads, supports and
// joints into the frame's values.
func TestReadNewLoadsAndJoints(t *testing.T) {
	src := `[analysis]
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
	job, err := Read("m.toml", []byte(src))
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
