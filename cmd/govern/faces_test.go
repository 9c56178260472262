package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"testing"
)

// faceModel is a beam of span 7.5 m between two nodes held fixed, each on a
// column of depth 0.5 m: the beam is exactly fixed-ended, and its faces are
// 0.25 m in from the nodes.
const faceModel = `
title = "fixed beam between columns"
[analysis]
stations = 5
[[section]]
name = "C"
E = 30e6
A = 0.25
I = 5.2e-3
depth = 0.5
[[section]]
name = "B"
E = 30e6
A = 0.2
I = 8e-3
[[node]]
name = "A0"
x = 0
y = 0
support = "fixed"
[[node]]
name = "A1"
x = 0
y = 4
support = "fixed"
[[node]]
name = "B0"
x = 7.5
y = 0
support = "fixed"
[[node]]
name = "B1"
x = 7.5
y = 4
support = "fixed"
[[member]]
start = "A0"
end = "A1"
section = "C"
[[member]]
start = "B0"
end = "B1"
section = "C"
[[member]]
start = "A1"
end = "B1"
section = "B"
[[case]]
name = "D"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "A1-B1"
  w = 22.0
[[combination]]
name = "1.4D"
factors = { D = 1.4 }
`

// The face-of-support moment and shear of a beam fixed at both ends under a
// uniform load: at x from an end, M = w/12 (6Lx − L² − 6x²) and
// V = w (L/2 − x) (AISC Steel Construction Manual, Table 3-23, case 15,
// recalled from memory; by hand, the end moment wL²/12 and reaction wL/2
// carried a distance x along the beam).
func TestFaceMomentsByHand(t *testing.T) {
	const l, w, a = 7.5, 1.4 * 22.0, 0.25
	p := filepath.Join(t.TempDir(), "face.toml")
	if err := os.WriteFile(p, []byte(faceModel), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, stderr := exec("run", p, "--json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var doc struct {
		Members []struct {
			Name     string
			Stations []struct {
				X    float64
				Face bool
				M, V struct{ Max, Min float64 }
			}
		}
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	beam := doc.Members[2]
	if beam.Name != "A1-B1" {
		t.Fatalf("member 3 is %s", beam.Name)
	}
	var faces []float64
	for _, s := range beam.Stations {
		if s.Face {
			faces = append(faces, s.X)
			m := w / 12 * (6*l*s.X - l*l - 6*s.X*s.X)
			v := w * (l/2 - s.X)
			// handTol: the hand values are exact; the solution is exact to
			// round-off.
			const handTol = 1e-9
			if math.Abs(s.M.Min-m) > handTol*w*l*l || math.Abs(s.M.Max-m) > handTol*w*l*l {
				t.Errorf("face at x = %g: M = [%g, %g], by hand %g", s.X, s.M.Min, s.M.Max, m)
			}
			if math.Abs(s.V.Max-v) > handTol*w*l {
				t.Errorf("face at x = %g: V = %g, by hand %g", s.X, s.V.Max, v)
			}
		}
	}
	if !slices.Equal(faces, []float64{a, l - a}) {
		t.Errorf("face stations at %v, want [%g %g]", faces, a, l-a)
	}
	if len(beam.Stations) != 7 {
		t.Errorf("%d stations, want 5 equally spaced and 2 faces", len(beam.Stations))
	}
	for _, m := range doc.Members[:2] {
		for _, s := range m.Stations {
			if s.Face {
				t.Errorf("column %s has a face station", m.Name)
			}
		}
	}
}

// A beam shorter than the depth of the column at one end: its one face
// station belongs to that end, however far along the beam it falls.
func TestFaceOfAShortBeamIsAtItsOwnEnd(t *testing.T) {
	// A 0.3 m stub from the top of a column 0.4 m deep to a pin: the face
	// is 0.2 m from the column's node (half the depth), past midlength.
	src := tsection("C", 2e8, 0.04, 1e-3, 0.4) + tsection("B", 2e8, 0.01, 1e-4, 0) +
		tnode("P0", 0, 0, "fixed") + tnode("P", 0, 3, "") + tnode("Q", 0.3, 3, "pinned") +
		tmember("P0", "P", "C") + tmember("P", "Q", "B") + tdead(tudl("P-Q", 10))
	a := analyseModel(t, src)
	sup := summary(t, a).one(t, "Beams at level 1 (y = 3.00 m): at the supports")
	if got := sup.cell(t, "face at x", 0, "P-Q", "P"); got != "0.20" {
		t.Errorf("end P: face at x = %s, want 0.20", got)
	}
	if got := sup.cell(t, "face at x", 0, "P-Q", "Q"); got != "-" {
		t.Errorf("end Q has no column, but its face is at x = %s", got)
	}
	// The face value is the station's: M at x = 0.2 in the station envelope.
	var face string
	for _, st := range a.Envelope.Members[1].Stations {
		if st.Extra {
			face = strconv.FormatFloat(st.M.Min, 'f', 2, 64)
		}
	}
	if got := sup.cell(t, "M min, face", 0, "P-Q", "P"); got != face || face == "" {
		t.Errorf("end P: face M min %s, want the station's %s", got, face)
	}
}
