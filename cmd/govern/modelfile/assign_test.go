package modelfile

import (
	"strings"
	"testing"

	"govern/frame"
)

// sectionsOf returns, for each named member, its section's name.
func sectionsOf(job *Job, names ...string) []string {
	out := make([]string, len(names))
	mo := job.Model
	for i, n := range names {
		for _, m := range mo.Members {
			if m.Name == n {
				out[i] = mo.Sections[m.Section].Name
			}
		}
	}
	return out
}

func TestAssign(t *testing.T) {
	// Lines of the model below: frame3x4 is 28 lines; the tables follow
	// from line 29.
	src := frame3x4 + `[[assign]]
on = "all columns"
section = "C600"
[[member]]
name = "B1-B2"
section = "B"
[[assign]]
on = ["line B & storey 1-3", "line C & storey 1"]
section = "C"
[[assign]]
on = "roof"
release = "both"
section = "B"
[[member]]
name = "C0-C1"
section = "B"
`
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	t.Run("later tables win, in file order", func(t *testing.T) {
		got := strings.Join(sectionsOf(job, "A0-A1", "B0-B1", "B1-B2", "B2-B3", "B3-B4", "C0-C1", "C1-C2", "A1-B1", "A4-B4"), " ")
		// A0-A1: all columns; B0-B1, B2-B3: line B storeys 1-3 after all
		// columns; B1-B2: the [[member]] (line 32) comes before the second
		// assign (line 35), which replaces it; B3-B4: storey 4, all
		// columns; C0-C1: the last [[member]] comes after every assign;
		// C1-C2: all columns; A1-B1: the grid's; A4-B4: the roof's assign.
		if want := "C600 C C C C600 B C600 C B"; got != want {
			t.Errorf("sections %s, want %s", got, want)
		}
	})
	t.Run("releases", func(t *testing.T) {
		for _, m := range job.Model.Members {
			roof := strings.HasSuffix(m.Name, "4") && !strings.Contains(m.Name, "3")
			if want := map[bool]frame.Release{true: frame.ReleaseBoth, false: frame.ReleaseNone}[roof]; m.Release != want {
				t.Errorf("%s: release %v, want %v", m.Name, m.Release, want)
			}
		}
	})
	t.Run("assignments recorded", func(t *testing.T) {
		if len(job.Assignments) != 3 {
			t.Fatalf("%d assignments", len(job.Assignments))
		}
		a := job.Assignments[1]
		if a.Line != 35 || a.Section != "C" || len(a.Members) != 4 || len(a.On) != 2 {
			t.Errorf("assignment 2: %+v", a)
		}
		if a := job.Assignments[2]; a.Release != "both" || a.Section != "B" || len(a.Members) != 3 {
			t.Errorf("assignment 3: %+v", a)
		}
	})
	t.Run("overlaps", func(t *testing.T) {
		var got []string
		for _, o := range job.Overlaps {
			got = append(got, job.DescribeOverlap(o))
		}
		want := []string{
			"line 32: [[member]] gives section B to 1 member given section C600 by the [[assign]] at line 29, which it follows in the file and so replaces: B1-B2",
			"line 35: [[assign]] gives section C to 2 members given section C600 by the [[assign]] at line 29, which it follows in the file and so replaces: B0-B1, B2-B3",
			"line 35: [[assign]] gives section C to 1 member given section B by the [[member]] at line 32, which it follows in the file and so replaces: B1-B2",
			"line 42: [[member]] gives section B to 1 member given section C600 by the [[assign]] at line 29, which it follows in the file and so replaces: C0-C1",
			"line 42: [[member]] gives section B to 1 member given section C by the [[assign]] at line 35, which it follows in the file and so replaces: C0-C1",
		}
		if strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Errorf("overlaps\n got: %s\nwant: %s", strings.Join(got, "\n      "), strings.Join(want, "\n      "))
		}
	})
}

func TestAssignErrors(t *testing.T) {
	for _, tc := range []struct{ add, want string }{
		{"[[assign]]\non = \"roof\"\n", `m.toml:29: assign 1: an [[assign]] gives section or release (or both), or tributary_area, tributary_width or kll, to the members its on selects`},
		{"[[assign]]\nsection = \"C\"\n", `m.toml:29: assign 1: on is required`},
		{"[[assign]]\non = \"roof\"\nsection = \"C700\"\n", `m.toml:31: assign 1: section = "C700": no such section (did you mean "C600"?)`},
		{"[[assign]]\non = \"line B & level 2\"\nsection = \"C\"\n", `m.toml:30: assign 1: selector "line B & level 2" matches no member: no member is picked by both "line B" and "level 2"`},
		{"[[assign]]\non = \"roof\"\nrelease = \"hinged\"\n", `m.toml:31: assign 1: release = "hinged": must be one of "none", "start", "end", "both"`},
		{"[[assign]]\non = []\nsection = \"C\"\n", `m.toml:30: assign 1: on is empty: name at least one member or selector`},
		{"[[assign]]\non = \"roof\"\nsection = \"C\"\ncolour = 1\n", `m.toml:32: assign 1: unknown key "colour"`},
		// A hinge where a member has a semi-rigid end: the error is the
		// [[assign]]'s, at its release, naming the member and its spring.
		{"[[member]]\nname = \"A4-B4\"\nspring_end = 1e4\n[[assign]]\non = \"roof\"\nrelease = \"both\"\n",
			`m.toml:34: assign 1: release = "both": member "A4-B4" has a semi-rigid end (spring_end, line 31); give a release or a spring, not both`},
		{"[[member]]\nname = \"A1-B1\"\nspring_start = 1e4\n[[member]]\nname = \"B1-C1\"\nspring_start = 1e4\n[[assign]]\non = \"level 1\"\nrelease = \"start\"\n",
			`m.toml:37: assign 1: release = "start": member "A1-B1" has a semi-rigid start (spring_start, line 31), and 1 more members have a spring at an end it releases; give a release or a spring, not both`},
	} {
		t.Run(tc.want, func(t *testing.T) {
			_, err := Read("m.toml", []byte(frame3x4+tc.add))
			if err == nil || err.Error() != tc.want {
				t.Errorf("\n got: %v\nwant: %s", err, tc.want)
			}
		})
	}
}

// TestAssignUnionPicksOnce: in an assignment, selectors that pick the same
// member are a union (the member is given its section once), unlike a
// load's, where that is an error.
func TestAssignUnionPicksOnce(t *testing.T) {
	job, err := Read("m.toml", []byte(frame3x4+"[[assign]]\non = [\"line A\", \"storey 1\"]\nsection = \"C600\"\n"))
	if err != nil {
		t.Fatal(err)
	}
	if n := len(job.Assignments[0].Members); n != 7 {
		t.Errorf("%d members, want 4 on line A and 3 more in storey 1", n)
	}
}

// TestAssignReleaseBesideSpring: a [[member]] that gives its own release
// after an [[assign]] keeps it, so the assign's hinge never meets the
// member's spring at the other end.
func TestAssignReleaseBesideSpring(t *testing.T) {
	job, err := Read("m.toml", []byte(frame3x4+"[[assign]]\non = \"roof\"\nrelease = \"end\"\n[[member]]\nname = \"A4-B4\"\nrelease = \"start\"\nspring_end = 1e4\n"))
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range job.Model.Members {
		if m.Name == "A4-B4" && (m.Release != frame.ReleaseStart || m.SpringEnd != 1e4) {
			t.Errorf("A4-B4: release %v, spring at its end %g", m.Release, m.SpringEnd)
		}
	}
}

// TestAssignBeforeRigidZones: the rigid end zones of [analysis]
// rigid_zones take the depths of the sections as assigned: a beam's end
// is rigid for half the depth of the column it frames into (column
// sections given by [[assign]]), a column's for half the beam's.
func TestAssignBeforeRigidZones(t *testing.T) {
	src := "[analysis]\nrigid_zones = true\n" + frame3x4 + `[[section]]
name = "D"
E = 30e6
A = 0.36
I = 1.08e-2
depth = 0.6
[[section]]
name = "BD"
E = 30e6
A = 0.28
I = 1.14e-2
depth = 0.5
[[assign]]
on = "all columns"
section = "D"
[[assign]]
on = "all beams"
section = "BD"
`
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	mo := job.Model
	for _, m := range mo.Members {
		want := [2]float64{0.3, 0.3} // a beam: half the columns' depth
		if strings.HasPrefix(m.Name, "A0") || strings.HasPrefix(m.Name, "B0") || strings.HasPrefix(m.Name, "C0") || strings.HasPrefix(m.Name, "D0") {
			want = [2]float64{0, 0.25} // a ground-floor column: a base, then half the beams' depth
		} else if m.Name[0] == m.Name[3] { // another column: beams at both ends
			want = [2]float64{0.25, 0.25}
		}
		if got := [2]float64{m.OffsetStart, m.OffsetEnd}; got != want {
			t.Errorf("%s: rigid zones %v, want %v", m.Name, got, want)
		}
	}
}
