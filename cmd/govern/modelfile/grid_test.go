package modelfile

import (
	"errors"
	"strings"
	"testing"
)

// gridEdit applies old → new replacements, in pairs, to gridModel.
func gridEdit(t *testing.T, pairs ...string) string {
	t.Helper()
	src := gridModel
	for i := 0; i+1 < len(pairs); i += 2 {
		if !strings.Contains(src, pairs[i]) {
			t.Fatalf("edit %q not applied", pairs[i])
		}
		src = strings.Replace(src, pairs[i], pairs[i+1], 1)
	}
	return src
}

// gridNotGenerated is the one message that stands for everything a grid
// that could not be generated leaves unchecked.
const gridNotGenerated = "m.toml:8: [grid]: no frame is generated until the problems in [grid] are corrected; until then, what refers to its nodes, members, levels and lines is not checked"

// TestGridProblemIsReportedOnce: one bad value in [grid] gives its own
// message and one saying that the grid is not generated, and nothing of
// what refers to the grid (the grid model's member and node overrides,
// loads on its members, levels and lines, an area load, a node load)
// adds a message that only follows from it.
func TestGridProblemIsReportedOnce(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit []string
		want string
	}{
		{"a string among the bays", []string{"bays = [6.0, 4.0]", `bays = [6.0, "4"]`},
			`m.toml:9: [grid]: bays[2] = "4": "4" has no unit: write the number without quotes for the model's own units, or give a unit, such as "4 m"`},
		{"a force among the bays", []string{"bays = [6.0, 4.0]", `bays = [6.0, "4 kN"]`},
			`m.toml:9: [grid]: bays[2] = "4 kN": kN is a force, where a length is due (such as m, mm or ft)`},
		{"a negative storey", []string{"storeys = [4.0, 3.0]", "storeys = [4.0, -3.0]"},
			"m.toml:10: [grid]: storeys[2] = -3: must be greater than zero"},
		// Lines or levels within the coincidence tolerance (1e-9) of each
		// other would put every node of one on a node of the other.
		{"a bay shorter than the coincidence tolerance", []string{"bays = [6.0, 4.0]", "bays = [6.0, 1e-12]"},
			"m.toml:9: [grid]: bays[2] = 1e-12 puts column lines B and C 1e-12 apart, not more than 1e-09, the distance within which two nodes are one position"},
		{"a bay lost in the rounding of the one before", []string{"bays = [6.0, 4.0]", "bays = [1e17, 4.0]"},
			"m.toml:9: [grid]: bays[2] = 4 puts column lines B and C 0 apart, not more than 1e-09, the distance within which two nodes are one position"},
		{"a storey of the coincidence tolerance", []string{"storeys = [4.0, 3.0]", "storeys = [1e-9, 3.0]"},
			"m.toml:10: [grid]: storeys[1] = 1e-09 puts levels 0 and 1 1e-09 apart, not more than 1e-09, the distance within which two nodes are one position"},
		{"an unknown column section", []string{`column = "C"`, `column = "C1"`},
			`m.toml:12: [grid]: column = "C1": no such section (did you mean "C"?)`},
		{"an unknown base", []string{`base = "pinned"`, `base = "hinged"`},
			`m.toml:11: [grid]: base = "hinged": must be one of "fixed", "pinned" (did you mean "pinned"?)`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := gridEdit(t, append(tc.edit, "[[case]]\nname = \"D\"", "[[node]]\nname = \"A0\"\nsupport = \"fixed\"\n[[case]]\nname = \"D\"")...)
			_, err := Read("m.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got, want := err.Error(), gridNotGenerated+"\n"+tc.want; got != want {
				t.Errorf("problems\n got: %s\nwant: %s", got, want)
			}
		})
	}
}

// TestGridSpacingProblemIsReportedOnce: a bad spacing is reported where it
// is given, not again by every area load as missing.
func TestGridSpacingProblemIsReportedOnce(t *testing.T) {
	_, err := Read("m.toml", []byte(gridEdit(t, "spacing = 5.0", "spacing = -5.0")))
	want := "m.toml:14: [grid]: spacing = -5: must be greater than zero"
	if err == nil || err.Error() != want {
		t.Errorf("problems\n got: %v\nwant: %s", err, want)
	}
}

// TestGridOverriddenTwice: a grid node or member changed by two tables is
// an error naming both lines.
func TestGridOverriddenTwice(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit []string
		want string
	}{
		{"member", []string{"release = \"start\"\n", "release = \"start\"\n[[member]]\nname = \"A2-B2\"\nsection = \"C\"\n"},
			`m.toml:31: member "A2-B2": grid member "A2-B2" is already changed at line 28; give each grid member one [[member]] table`},
		{"node", []string{"[[member]]\nname = \"A2-B2\"", "[[node]]\nname = \"C0\"\nsupport = \"fixed\"\n[[node]]\nname = \"C0\"\nsupport = \"free\"\n[[member]]\nname = \"A2-B2\""},
			`m.toml:31: node "C0": grid node "C0" is already changed at line 28; give each grid node one [[node]] table`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read("m.toml", []byte(gridEdit(t, tc.edit...)))
			if err == nil || err.Error() != tc.want || !errors.Is(err, ErrDuplicate) {
				t.Errorf("problems\n got: %v\nwant: %s", err, tc.want)
			}
		})
	}
}

// TestGridSelectorsOverlap: on a one-storey grid, level 1 is the roof, so
// one load on both would load every beam twice.
func TestGridSelectorsOverlap(t *testing.T) {
	src := gridEdit(t, "storeys = [4.0, 3.0]", "storeys = [4.0]",
		"[[member]]\nname = \"A2-B2\"\nrelease = \"start\"\n", "",
		"on = [\"level 1\"]", "on = [\"level 1\", \"roof\"]",
		"on = \"roof\"", "on = \"level 1\"",
		"node = \"A2\"", "node = \"A1\"")
	_, err := Read("m.toml", []byte(src))
	want := `m.toml:41: case "L", load 1: on: "level 1" and "roof" both pick member "A1-B1" and 1 more; a load acts once on each member, so remove one of them`
	if err == nil || err.Error() != want {
		t.Errorf("problems\n got: %v\nwant: %s", err, want)
	}
}

// TestNodeOnGridBeam: a column whose top lies on a grid beam without being
// joined to it is refused, unless the beam is allowed to pass by it.
func TestNodeOnGridBeam(t *testing.T) {
	column := "[[node]]\nname = \"P\"\nx = 3.0\ny = 4.0\n[[node]]\nname = \"Q\"\nx = 3.0\ny = 0.0\nsupport = \"fixed\"\n[[member]]\nstart = \"Q\"\nend = \"P\"\nsection = \"C\"\n[[member]]\nname = \"A2-B2\""
	_, err := Read("m.toml", []byte(gridEdit(t, "[[member]]\nname = \"A2-B2\"", column)))
	want := `m.toml:29: node "P": node "P" lies on member "A1-B1", 3 from its start, but is not joined to it: split the member at the node, or, if the two cross without a connection, give the member passes = ["P"]`
	if err == nil || err.Error() != want {
		t.Errorf("problems\n got: %v\nwant: %s", err, want)
	}
	allowed := strings.Replace(column, "[[member]]\nname = \"A2-B2\"", "[[member]]\nname = \"A1-B1\"\npasses = \"P\"\n[[member]]\nname = \"A2-B2\"", 1)
	if _, err := Read("m.toml", []byte(gridEdit(t, "[[member]]\nname = \"A2-B2\"", allowed))); err != nil {
		t.Errorf("with passes = \"P\": %v", err)
	}
}
