package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"testing"

	"govern/frame"
)

func TestFaceStations(t *testing.T) {
	// Line A: a 400 column below level 1 and a 300 one above; line B: a
	// 500 column below only; line C: a column without a depth.
	sec := []frame.Section{{Name: "C400", Depth: 0.4}, {Name: "C300", Depth: 0.3}, {Name: "C500", Depth: 0.5}, {Name: "C?"}, {Name: "B"}}
	mo := &frame.Model{
		Sections: sec,
		Nodes: []frame.Node{
			{Name: "A0"}, {Name: "A1", Y: 4}, {Name: "A2", Y: 7},
			{Name: "B0", X: 6}, {Name: "B1", X: 6, Y: 4},
			{Name: "C0", X: 10}, {Name: "C1", X: 10, Y: 4},
			{Name: "A2'", X: 0.12, Y: 7},
		},
		Members: []frame.Member{
			{Name: "A0-A1", Start: 0, End: 1, Section: 0},
			{Name: "A1-A2", Start: 1, End: 2, Section: 1},
			{Name: "B0-B1", Start: 3, End: 4, Section: 2},
			{Name: "C0-C1", Start: 5, End: 6, Section: 3},
			{Name: "A1-B1", Start: 1, End: 4, Section: 4},
			{Name: "B1-C1", Start: 4, End: 6, Section: 4},
			{Name: "A2-A2'", Start: 2, End: 7, Section: 4}, // shorter than the face
		},
	}
	got := faceStations(mo)
	want := [][]float64{nil, nil, nil, nil, {0.15, 6 - 0.25}, {0.25}, nil}
	if len(got) != len(want) {
		t.Fatalf("%d members, want %d", len(got), len(want))
	}
	for m := range want {
		if !slices.Equal(got[m], want[m]) {
			t.Errorf("%s: faces %v, want %v", mo.Members[m].Name, got[m], want[m])
		}
	}
	for i := range sec {
		sec[i].Depth = 0
	}
	if got := faceStations(mo); got != nil {
		t.Errorf("without depths: %v", got)
	}
}

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
