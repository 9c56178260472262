package analysis

import (
	"fmt"
	"strings"
	"testing"

	"govern/envelope"
	"govern/frame"
)

// TestSpans checks how members are grouped into spans and cantilevers
// (the definitions of Span and docs/output.md).
func TestSpans(t *testing.T) {
	type n = frame.Node
	build := func(nodes []n, members ...[2]string) *frame.Model {
		mo := &frame.Model{Nodes: nodes, Sections: []frame.Section{{Name: "S", E: 1, A: 1, I: 1}}}
		idx := map[string]int{}
		for i, nd := range nodes {
			idx[nd.Name] = i
		}
		for _, m := range members {
			mo.Members = append(mo.Members, frame.Member{Name: m[0] + "-" + m[1], Start: idx[m[0]], End: idx[m[1]]})
		}
		return mo
	}
	describe := func(mo *frame.Model) string {
		var out []string
		for _, r := range Spans(mo) {
			var names []string
			for _, m := range r.Members {
				names = append(names, mo.Members[m].Name)
			}
			kind := "span"
			if r.Cantilever {
				kind = "cantilever from " + mo.Nodes[r.Root].Name
			}
			out = append(out, fmt.Sprintf("%s–%s %s [%s] %g", mo.Nodes[r.Left].Name, mo.Nodes[r.Right].Name, kind, strings.Join(names, " "), r.Length))
		}
		return strings.Join(out, "; ")
	}
	for _, tc := range []struct {
		name string
		mo   *frame.Model
		want string
	}{
		{"a node with nothing else on it is inside the span",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4}, {Name: "B", X: 8, Support: frame.Roller}}, [2]string{"A", "M"}, [2]string{"B", "M"}),
			"A–B span [A-M B-M] 8"},
		{"a column standing on the beam is carried by it",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4}, {Name: "B", X: 8, Support: frame.Roller}, {Name: "T", X: 4, Y: 3}},
				[2]string{"A", "M"}, [2]string{"M", "B"}, [2]string{"M", "T"}),
			"A–B span [A-M M-B] 8"},
		{"a column from below holds it",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4}, {Name: "B", X: 8, Support: frame.Roller}, {Name: "M0", X: 4, Y: -3, Support: frame.Fixed}},
				[2]string{"A", "M"}, [2]string{"M", "B"}, [2]string{"M0", "M"}),
			"A–M span [A-M] 4; M–B span [M-B] 4"},
		{"a support holds it",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4, Support: frame.Roller}, {Name: "B", X: 8, Support: frame.Roller}}, [2]string{"A", "M"}, [2]string{"M", "B"}),
			"A–M span [A-M] 4; M–B span [M-B] 4"},
		{"a cantilever of two members, drawn from its tip",
			build([]n{{Name: "R", Support: frame.Fixed}, {Name: "N", X: 2}, {Name: "T", X: 5}}, [2]string{"T", "N"}, [2]string{"N", "R"}),
			"R–T cantilever from R [N-R T-N] 5"},
		{"an overhang beyond a support",
			build([]n{{Name: "C", X: -2}, {Name: "A", Support: frame.Pinned}, {Name: "B", X: 6, Support: frame.Roller}}, [2]string{"A", "B"}, [2]string{"A", "C"}),
			"C–A cantilever from A [A-C] 2; A–B span [A-B] 6"},
		{"hung from a member above, both ends free: divided at the hanger",
			build([]n{{Name: "L"}, {Name: "H", X: 3}, {Name: "R", X: 6}, {Name: "T", X: 3, Y: 4, Support: frame.Fixed}},
				[2]string{"L", "H"}, [2]string{"H", "R"}, [2]string{"H", "T"}),
			"L–H cantilever from H [L-H] 3; H–R cantilever from H [H-R] 3"},
		{"a rafter of two collinear members",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4, Y: 3}, {Name: "B", X: 8, Y: 6, Support: frame.Roller}}, [2]string{"M", "A"}, [2]string{"M", "B"}),
			"A–B span [M-A M-B] 10"},
		{"a ridge is not a straight line",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "R", X: 4, Y: 3}, {Name: "B", X: 8, Support: frame.Roller}}, [2]string{"A", "R"}, [2]string{"R", "B"}),
			"A–R span [A-R] 5; R–B span [R-B] 5"},
		{"columns are not spans",
			build([]n{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: 3}}, [2]string{"A0", "A1"}),
			""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := describe(tc.mo); got != tc.want {
				t.Errorf("spans: %s\nwant:  %s", got, tc.want)
			}
		})
	}
}

func TestSpanLinesRunLeftToRight(t *testing.T) {
	mo := &frame.Model{
		Nodes:    []frame.Node{{Name: "C", X: -2}, {Name: "A", Support: frame.Pinned}, {Name: "B", X: 6, Support: frame.Roller}, {Name: "D", X: 9}},
		Sections: []frame.Section{{Name: "S", E: 1, A: 1, I: 1}},
		Members:  []frame.Member{{Name: "A-C", Start: 1, End: 0}, {Name: "A-B", Start: 1, End: 2}, {Name: "D-B", Start: 3, End: 2}},
	}
	got := spanLines(mo, Spans(mo))
	want := []envelope.Line{{A: 0, B: 1, From: envelope.ThroughB}, {A: 1, B: 2}, {A: 2, B: 3, From: envelope.ThroughA}}
	for m := range want {
		if got[m] != want[m] {
			t.Errorf("%s: line %+v, want %+v", mo.Members[m].Name, got[m], want[m])
		}
	}
}
