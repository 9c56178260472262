package modelfile

import (
	"strings"
	"testing"
)

// frame3x4 is a grid of three bays (lines A to D) and four storeys
// (levels 0 to 4), every member of section C.
const frame3x4 = `
[grid]
bays = [6.0, 6.0, 6.0]
storeys = [4.0, 3.5, 3.5, 3.5]
column = "C"
beam = "C"
[[section]]
name = "C"
E = 30e6
A = 0.25
I = 5.2e-3
[[section]]
name = "C600"
E = 30e6
A = 0.36
I = 1.08e-2
[[section]]
name = "B"
E = 30e6
A = 0.28
I = 1.14e-2
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "all beams"
  w = 10
`

// picked reads model with one more load of case G on sel and returns the
// names of the members it picks, or the error.
func picked(t *testing.T, model, sel string) (string, error) {
	t.Helper()
	src := model + "  [[case.load]]\n  type = \"udl\"\n  on = \"" + sel + "\"\n  w = 1\n"
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		return "", err
	}
	c := job.Model.Cases[0]
	var names []string
	for _, l := range c.MemberLoads {
		if l.W == 1 {
			names = append(names, job.Model.Members[l.Member].Name)
		}
	}
	return strings.Join(names, " "), nil
}

// TestSelectors: storeys, ranges and intersections pick the members the
// format says (docs/model-format.md), counted by hand on the grid.
func TestSelectors(t *testing.T) {
	for _, tc := range []struct{ sel, want string }{
		{"storey 1", "A0-A1 B0-B1 C0-C1 D0-D1"},
		{"storey 4", "A3-A4 B3-B4 C3-C4 D3-D4"},
		{"storey 2-3", "A1-A2 B1-B2 C1-C2 D1-D2 A2-A3 B2-B3 C2-C3 D2-D3"},
		{"level 1-2", "A1-B1 B1-C1 C1-D1 A2-B2 B2-C2 C2-D2"},
		{"level 4-4", "A4-B4 B4-C4 C4-D4"},
		{"line B-C", "B0-B1 C0-C1 B1-B2 C1-C2 B2-B3 C2-C3 B3-B4 C3-C4"},
		{"line B & storey 1-3", "B0-B1 B1-B2 B2-B3"},
		{"line B&storey 1-3", "B0-B1 B1-B2 B2-B3"},
		{"all beams & roof", "A4-B4 B4-C4 C4-D4"},
		{"level 1-4 & B1-C1", "B1-C1"},
		{"all columns & line D & storey 4", "D3-D4"},
	} {
		t.Run(tc.sel, func(t *testing.T) {
			got, err := picked(t, frame3x4, tc.sel)
			if err != nil {
				t.Fatal(err)
			}
			if got != tc.want {
				t.Errorf("%q picks %s, want %s", tc.sel, got, tc.want)
			}
		})
	}
}

func TestSelectorErrors(t *testing.T) {
	for _, tc := range []struct{ sel, want string }{
		{"storey 0", `selector "storey 0": storeys are numbered 1 to 4 (storey N is between levels N-1 and N); a range is written such as "storey 1-4"`},
		{"storey 5", `selector "storey 5": storeys are numbered 1 to 4`},
		{"level 3-1", `selector "level 3-1": levels are numbered 0 to 4; a range is written such as "level 0-4"`},
		{"level 1-x", `selector "level 1-x": levels are numbered 0 to 4`},
		{"line A-E", `selector "line A-E": column lines are A to D; a range is written such as "line A-D"`},
		{"line B & level 1", `selector "line B & level 1" matches no member: no member is picked by both "line B" and "level 1"`},
		{"line B & storey 2 & level 3", `selector "line B & storey 2 & level 3" matches no member: no member is picked by all of "line B", "storey 2" and "level 3"`},
		{"line B & ", `selector "line B & ": an empty part before or after "&"`},
		{"line B & storey 9", `in selector "line B & storey 9": selector "storey 9": storeys are numbered 1 to 4`},
		{"level 0", `selector "level 0" matches no member`},
	} {
		t.Run(tc.sel, func(t *testing.T) {
			_, err := picked(t, frame3x4, tc.sel)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("%v, want %q", err, tc.want)
			}
		})
	}
}

// TestStoreyOfATallColumn: without a grid, levels are the node heights;
// a column running past a level without a node there is in both storeys
// it spans.
func TestStoreyOfATallColumn(t *testing.T) {
	model := `
[[section]]
name = "S"
E = 200e6
A = 0.01
I = 1e-4
[[node]]
name = "a"
x = 0
y = 0
support = "fixed"
[[node]]
name = "b"
x = 0
y = 7
[[node]]
name = "c"
x = 5
y = 0
support = "fixed"
[[node]]
name = "d"
x = 5
y = 3.5
[[node]]
name = "e"
x = 5
y = 7
[[member]]
start = "a"
end = "b"
section = "S"
[[member]]
start = "c"
end = "d"
section = "S"
[[member]]
start = "d"
end = "e"
section = "S"
[[member]]
start = "b"
end = "e"
section = "S"
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "b-e"
  w = 10
`
	for _, tc := range []struct{ sel, want string }{
		{"storey 1", "a-b c-d"},
		{"storey 2", "a-b d-e"},
		{"storey 1-2", "a-b c-d d-e"},
		{"line A & storey 2", "a-b"},
	} {
		got, err := picked(t, model, tc.sel)
		if err != nil {
			t.Fatal(err)
		}
		if got != tc.want {
			t.Errorf("%q picks %s, want %s", tc.sel, got, tc.want)
		}
	}
}

// TestLevelSelectorsInOneFile: several "level" selectors and "roof" read
// from one file (the members' levels found once for all of them) each
// pick the beams counted by hand on the grid, whatever came before.
func TestLevelSelectorsInOneFile(t *testing.T) {
	sels := []struct{ sel, want string }{
		{"level 1", "A1-B1 B1-C1 C1-D1"},
		{"roof", "A4-B4 B4-C4 C4-D4"},
		{"level 3-4", "A3-B3 B3-C3 C3-D3 A4-B4 B4-C4 C4-D4"},
		{"level 2", "A2-B2 B2-C2 C2-D2"},
	}
	src := frame3x4
	for i, s := range sels {
		src += "  [[case.load]]\n  type = \"udl\"\n  on = \"" + s.sel + "\"\n  w = " + strings.Repeat("1", i+2) + "\n"
	}
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	for i, s := range sels {
		var w float64
		for range i + 2 {
			w = 10*w + 1
		}
		var names []string
		for _, l := range job.Model.Cases[0].MemberLoads {
			if l.W == w {
				names = append(names, job.Model.Members[l.Member].Name)
			}
		}
		if got := strings.Join(names, " "); got != s.want {
			t.Errorf("%q picks %s, want %s", s.sel, got, s.want)
		}
	}
}
