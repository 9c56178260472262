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
			kind := r.Kind.String()
			switch r.Kind {
			case KindCantilever:
				kind += " from " + mo.Nodes[r.Root].Name
			case KindRidge, KindValley:
				kind += fmt.Sprintf(" at %s, %g along", mo.Nodes[r.Node].Name, r.At)
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
		{"a ridge: two rafters and the ridge across the line between their ends",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "R", X: 4, Y: 3}, {Name: "B", X: 8, Support: frame.Roller}}, [2]string{"A", "R"}, [2]string{"R", "B"}),
			"A–R rafter [A-R] 5; R–B rafter [R-B] 5; A–B ridge at R, 4 along [A-R R-B] 8"},
		{"a pitched portal: the ridge is neither a support nor a column",
			build([]n{{Name: "A", Support: frame.Fixed}, {Name: "B", Y: 4}, {Name: "R", X: 6, Y: 5}, {Name: "C", X: 12, Y: 4}, {Name: "D", X: 12, Support: frame.Fixed}},
				[2]string{"A", "B"}, [2]string{"B", "R"}, [2]string{"C", "R"}, [2]string{"D", "C"}),
			"B–R rafter [B-R] 6.0827625302982185; R–C rafter [C-R] 6.0827625302982185; B–C ridge at R, 6 along [B-R C-R] 12"},
		{"a valley between two bays, held by nothing",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "V", X: 4, Y: -1}, {Name: "B", X: 8, Support: frame.Roller}}, [2]string{"A", "V"}, [2]string{"V", "B"}),
			"A–V rafter [A-V] 4.123105625617661; V–B rafter [V-B] 4.123105625617661; A–B valley at V, 4 along [A-V V-B] 8"},
		{"a column under the ridge holds it: two spans",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "R", X: 4, Y: 3}, {Name: "B", X: 8, Support: frame.Roller}, {Name: "R0", X: 4, Support: frame.Fixed}},
				[2]string{"A", "R"}, [2]string{"R", "B"}, [2]string{"R0", "R"}),
			"A–R span [A-R] 5; R–B span [R-B] 5"},
		{"a hanger at midspan leading to a free node is carried: one span",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4}, {Name: "B", X: 8, Support: frame.Roller}, {Name: "H", X: 4, Y: -2}},
				[2]string{"M", "H"}, [2]string{"M", "A"}, [2]string{"M", "B"}),
			"A–B span [M-A M-B] 8"},
		{"a hanger at a cantilever's tip: still a cantilever",
			build([]n{{Name: "R", Y: 3, Support: frame.Fixed}, {Name: "T", X: 3, Y: 3}, {Name: "H", X: 3, Y: 2}}, [2]string{"R", "T"}, [2]string{"T", "H"}),
			"R–T cantilever from R [R-T] 3"},
		{"a post on a cantilever's tip: still a cantilever",
			build([]n{{Name: "R", Y: 3, Support: frame.Fixed}, {Name: "T", X: 3, Y: 3}, {Name: "H", X: 3, Y: 4}}, [2]string{"R", "T"}, [2]string{"T", "H"}),
			"R–T cantilever from R [R-T] 3"},
		{"a hanger part way along a cantilever does not divide it; the beam it carries hangs from it",
			build([]n{{Name: "R", Support: frame.Fixed}, {Name: "N", X: 1}, {Name: "T", X: 3}, {Name: "H", X: 1, Y: -1}, {Name: "G", X: 2, Y: -1}},
				[2]string{"R", "N"}, [2]string{"N", "T"}, [2]string{"N", "H"}, [2]string{"H", "G"}),
			"H–G cantilever from H [H-G] 1; R–T cantilever from R [R-N N-T] 3"},
		{"a strut from below to a support holds the tip: a span",
			build([]n{{Name: "R", Y: 3, Support: frame.Fixed}, {Name: "T", X: 3, Y: 3}, {Name: "S", X: 3, Support: frame.Pinned}}, [2]string{"R", "T"}, [2]string{"S", "T"}),
			"R–T span [R-T] 3"},
		{"a king post on the tie of the same beam does not hold it: one span",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "M", X: 4}, {Name: "B", X: 8, Support: frame.Roller}, {Name: "P", X: 4, Y: -1}},
				[2]string{"A", "M"}, [2]string{"M", "B"}, [2]string{"M", "P"}, [2]string{"A", "P"}, [2]string{"P", "B"}),
			"A–B span [A-M M-B] 8; A–P rafter [A-P] 4.123105625617661; P–B rafter [P-B] 4.123105625617661; A–B valley at P, 4 along [A-P P-B] 8"},
		{"a column from below standing on a lower beam holds the upper beam",
			build([]n{{Name: "A0", Support: frame.Pinned}, {Name: "B0", X: 8, Support: frame.Roller}, {Name: "M0", X: 4}, {Name: "A1", Y: 3, Support: frame.Pinned}, {Name: "M1", X: 4, Y: 3}, {Name: "B1", X: 8, Y: 3, Support: frame.Roller}},
				[2]string{"A0", "M0"}, [2]string{"M0", "B0"}, [2]string{"A1", "M1"}, [2]string{"M1", "B1"}, [2]string{"M0", "M1"}),
			"A0–B0 span [A0-M0 M0-B0] 8; A1–M1 span [A1-M1] 4; M1–B1 span [M1-B1] 4"},
		{"a cantilever that changes slope is one cantilever, across the line from root to tip",
			build([]n{{Name: "R", Support: frame.Fixed}, {Name: "K", X: 3}, {Name: "T", X: 4, Y: 1}}, [2]string{"R", "K"}, [2]string{"K", "T"}),
			"R–T cantilever from R [R-K K-T] 4.123105625617661"},
		{"a brace steeper than 45° is no run",
			build([]n{{Name: "A", Support: frame.Pinned}, {Name: "B", X: 1, Y: 3}}, [2]string{"A", "B"}),
			""},
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
