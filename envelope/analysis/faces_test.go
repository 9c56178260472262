package analysis

import (
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
	got := faceStations(ColumnFaces(mo))
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
	if got := faceStations(ColumnFaces(mo)); got != nil {
		t.Errorf("without depths: %v", got)
	}
}
