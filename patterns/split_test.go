package patterns

import (
	"errors"
	"testing"

	"govern/frame"
)

// beamAndColumn is a column A0-A1 and a beam A1-B1 of span 8 on a column
// B0-B1, with a pattern case holding beam, column and node loads.
func beamAndColumn() *frame.Model {
	return &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}},
		Nodes: []frame.Node{
			{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: 4},
			{Name: "B1", X: 8, Y: 4}, {Name: "B0", X: 8, Support: frame.Fixed},
		},
		Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "A1-B1", Start: 1, End: 2}, {Name: "B0-B1", Start: 3, End: 2}},
		Cases: []frame.Case{{Name: "L",
			MemberLoads: []frame.MemberLoad{
				{Member: 1, From: 0, To: 8, W: 10, WEnd: 30},
				{Member: 1, Point: true, At: 4, P: 50},
				{Member: 0, Direction: frame.GlobalX, From: 0, To: 4, W: 2, WEnd: 2},
			},
			NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 5}},
		}},
	}
}

func TestSplit(t *testing.T) {
	mo := beamAndColumn()
	t.Run("whole beam is one piece; column and node loads stay in the rest", func(t *testing.T) {
		rest, pieces := Split(mo, 0, 1)
		if len(pieces) != 1 || pieces[0].Name != "A1-B1" || len(pieces[0].Loads) != 2 {
			t.Fatalf("pieces = %+v", pieces)
		}
		if len(rest.MemberLoads) != 1 || rest.MemberLoads[0].Member != 0 || len(rest.NodeLoads) != 1 {
			t.Errorf("rest = %+v", rest)
		}
	})
	t.Run("two segments cut the trapezoid and place the point load after the cut", func(t *testing.T) {
		_, pieces := Split(mo, 0, 2)
		if len(pieces) != 2 || pieces[0].Name != "A1-B1:1" || pieces[1].Name != "A1-B1:2" {
			t.Fatalf("pieces = %+v", pieces)
		}
		first, second := pieces[0].Loads, pieces[1].Loads
		if len(first) != 1 || first[0].From != 0 || first[0].To != 4 || first[0].W != 10 || first[0].WEnd != 20 {
			t.Errorf("first segment = %+v", first)
		}
		if len(second) != 2 || second[0].W != 20 || second[0].WEnd != 30 || !second[1].Point {
			t.Errorf("second segment = %+v", second)
		}
	})
	t.Run("pieces carry the whole load", func(t *testing.T) {
		// Superposition: the resultant of the pieces and the rest equals the case's.
		rest, pieces := Split(mo, 0, 3)
		sum := frame.Case{Name: "sum", MemberLoads: rest.MemberLoads, NodeLoads: rest.NodeLoads}
		for _, p := range pieces {
			sum.MemberLoads = append(sum.MemberLoads, p.Loads...)
		}
		probe := *mo
		probe.Cases = []frame.Case{mo.Cases[0], sum}
		a, b := frame.AppliedResultant(&probe, 0), frame.AppliedResultant(&probe, 1)
		const tol = 1e-9
		if d := [3]float64{a.Fx - b.Fx, a.Fy - b.Fy, a.M - b.M}; abs(d[0]) > tol || abs(d[1]) > tol || abs(d[2]) > tol*100 {
			t.Errorf("resultants differ: %+v vs %+v", a, b)
		}
	})
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// level is a continuous beam of n equal spans at height 3 on columns.
func level(n int) *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}}}
	for i := 0; i <= n; i++ {
		mo.Nodes = append(mo.Nodes, frame.Node{Name: string(rune('A'+i)) + "0", X: 6 * float64(i), Support: frame.Fixed},
			frame.Node{Name: string(rune('A'+i)) + "1", X: 6 * float64(i), Y: 3})
		mo.Members = append(mo.Members, frame.Member{Name: string(rune('A'+i)) + "0-1", Start: 2 * i, End: 2*i + 1})
	}
	c := frame.Case{Name: "L"}
	for i := range n {
		mo.Members = append(mo.Members, frame.Member{Name: string(rune('A'+i)) + "-" + string(rune('B'+i)), Start: 2*i + 1, End: 2*i + 3})
		c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: len(mo.Members) - 1, To: 6, W: 1, WEnd: 1})
	}
	mo.Cases = []frame.Case{c}
	return mo
}

func TestArrangementsOfOneLevel(t *testing.T) {
	// ACI 318-19 section 6.4.3 (recalled from memory): live load on all
	// spans, on alternate spans, and on adjacent spans.
	mo := level(3)
	_, pieces := Split(mo, 0, 1)
	got := Arrangements(mo, pieces)
	want := []string{
		"all spans: A-B B-C C-D",
		"level 1 odd spans: A-B C-D",
		"level 1 even spans: B-C",
		"level 1 spans 1 and 2: A-B B-C",
		"level 1 spans 2 and 3: B-C C-D",
	}
	if len(got) != len(want) {
		t.Fatalf("%d arrangements, want %d: %+v", len(got), len(want), got)
	}
	for i, a := range got {
		if s := a.Name + ": " + a.Describe(pieces); s != want[i] {
			t.Errorf("arrangement %d = %q, want %q", i, s, want[i])
		}
	}
}

func TestCheckerboardAcrossLevels(t *testing.T) {
	// Two levels of two spans: span + level is even for span 1 of level 1
	// and span 2 of level 2, odd for the other two.
	mo := level(2)
	top := len(mo.Nodes)
	for i := 0; i <= 2; i++ {
		mo.Nodes = append(mo.Nodes, frame.Node{Name: string(rune('A'+i)) + "2", X: 6 * float64(i), Y: 6})
		mo.Members = append(mo.Members, frame.Member{Name: string(rune('A'+i)) + "1-2", Start: 2*i + 1, End: top + i})
	}
	for i := range 2 {
		mo.Members = append(mo.Members, frame.Member{Name: "top" + string(rune('1'+i)), Start: top + i, End: top + i + 1})
		mo.Cases[0].MemberLoads = append(mo.Cases[0].MemberLoads, frame.MemberLoad{Member: len(mo.Members) - 1, To: 6, W: 1, WEnd: 1})
	}
	_, pieces := Split(mo, 0, 1)
	var names []string
	for _, a := range Arrangements(mo, pieces) {
		names = append(names, a.Name+": "+a.Describe(pieces))
	}
	want := map[string]bool{
		"checkerboard, span + level even: A-B top2": true,
		"checkerboard, span + level odd: B-C top1":  true,
	}
	for _, n := range names {
		delete(want, n)
	}
	if len(want) != 0 {
		t.Errorf("missing %v among %q", want, names)
	}
	sp := Spans(mo)
	if s := sp[len(mo.Members)-1]; s.Level != 2 || s.Number != 2 {
		t.Errorf("top2 = %+v, want level 2 span 2", s)
	}
}

func TestExhaustiveRefusesTooManyPieces(t *testing.T) {
	mo := level(7)
	if _, err := Expand(mo, []int{0}, 3, Exhaustive); !errors.Is(err, ErrTooManyPieces) ||
		err.Error() != `patterns: too many pieces for exhaustive patterns: 21 pieces, at most 20 (2^20 arrangements); use "exact", which gives the same envelope` {
		t.Errorf("err = %v", err)
	}
	if _, err := Expand(mo, []int{0}, 2, Exhaustive); err != nil {
		t.Errorf("14 pieces: %v", err)
	}
}

func TestExpandKeepsTheOriginal(t *testing.T) {
	mo := beamAndColumn()
	before := len(mo.Cases[0].MemberLoads)
	lay, err := Expand(mo, []int{0}, 2, Exact)
	if err != nil {
		t.Fatal(err)
	}
	if len(mo.Cases) != 1 || len(mo.Cases[0].MemberLoads) != before {
		t.Error("Expand changed the model it was given")
	}
	// The rest keeps the column load; one case per piece follows.
	if len(lay.Model.Cases) != 3 || len(lay.Model.Cases[0].MemberLoads) != 1 || lay.Patterned[0].Units[1].Column != 2 {
		t.Errorf("expanded cases = %+v", lay.Model.Cases)
	}
}

func TestWholeAddsUpToTheCase(t *testing.T) {
	// Superposition: the columns Whole names carry, together, exactly the
	// loads of the original case (common practice: linear analysis).
	mo := level(3)
	mo.Cases[0].NodeLoads = []frame.NodeLoad{{Node: 1, Fx: 4}}
	for _, mode := range []Mode{Exact, Code, Exhaustive, Full} {
		lay, err := Expand(mo, []int{0}, 2, mode)
		if err != nil {
			t.Fatal(err)
		}
		var sum frame.Resultant
		for _, c := range lay.Whole(0) {
			r := frame.AppliedResultant(lay.Model, c)
			sum.Fx, sum.Fy, sum.M = sum.Fx+r.Fx, sum.Fy+r.Fy, sum.M+r.M
		}
		want := frame.AppliedResultant(mo, 0)
		if abs(sum.Fx-want.Fx) > 1e-9 || abs(sum.Fy-want.Fy) > 1e-9 || abs(sum.M-want.M) > 1e-7 {
			t.Errorf("%v: columns sum to %+v, case is %+v", mode, sum, want)
		}
	}
}
