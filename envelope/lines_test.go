package envelope

import (
	"errors"
	"math"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// service is one service combination of case 0 with factor 1.
var service = []combos.Combination{{Name: "S", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}}}}

// line envelopes mo under the service combination with the given lines.
func line(t *testing.T, mo *frame.Model, stations int, lines []Line) *Envelope {
	t.Helper()
	sol, err := frame.Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	env, err := Compute(sol, service, Settings{Kinds: kindsOf(sol, nil), Stations: stations, Lines: lines}, nil)
	if err != nil {
		t.Fatal(err)
	}
	return env
}

func TestLineOfTwoMembersIsOneSpan(t *testing.T) {
	// A simply supported span of 8 m built of two members, the second
	// drawn from right to left, w = 10, EI = 4e4: midspan deflection
	// 5wL⁴/384EI = 13.33 mm, and at x from the left support
	// w x (L³ − 2Lx² + x³)/24EI (AISC Steel Construction Manual Table
	// 3-23 case 1, recalled from memory). Each member alone deflects
	// much less from its own chord.
	const l, w, ei = 8.0, 10.0, 4e4
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 2e8, A: 0.01, I: ei / 2e8}},
		Nodes:    []frame.Node{{Name: "A", Support: frame.Pinned}, {Name: "M", X: l / 2}, {Name: "B", X: l, Support: frame.Roller}},
		Members:  []frame.Member{{Name: "A-M", Start: 0, End: 1}, {Name: "B-M", Start: 2, End: 1}},
		Cases: []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{
			{Member: 0, To: l / 2, W: w, WEnd: w}, {Member: 1, To: l / 2, W: w, WEnd: w},
		}}},
	}
	span := Line{A: 0, B: 2}
	env := line(t, mo, 5, []Line{span, span})
	exact := func(x float64) float64 { return -w * x * (l*l*l - 2*l*x*x + x*x*x) / (24 * ei) }
	for m, em := range env.Members {
		for i, st := range em.Stations {
			x := st.X // from A along the line
			if m == 1 {
				x = l - st.X
			}
			d := em.LineDeflection[i]
			if math.Abs(d.Max-exact(x)) > tol*5*w*math.Pow(l, 4)/(384*ei) || d.Max != d.Min || d.MaxBy != 0 {
				t.Errorf("%s at x = %g: %+v, want %g", mo.Members[m].Name, st.X, d, exact(x))
			}
		}
	}
	if got, want := env.Members[0].LineDeflection[4].Max, -5*w*math.Pow(l, 4)/(384*ei); math.Abs(got-want) > tol*math.Abs(want) {
		t.Errorf("midspan %g, want %g", got, want)
	}
	if env.Members[0].Deflection[4].Max != 0 {
		t.Errorf("relative to its own chord, A-M ends at %g, want 0", env.Members[0].Deflection[4].Max)
	}
}

func TestLineOfACantileverIncludesItsRootRotation(t *testing.T) {
	// An overhang c = 2 m beyond a simply supported back span a = 6 m,
	// EI = 4e4, w = 10 on the overhang only. Relative to the displaced
	// root, the tip deflects wc⁴/8EI + wc³a/6EI = 2.5 mm: the cantilever's
	// own bending and the root's rotation wc²/2 · a/3EI times c (beam
	// tables, recalled from memory).
	const a, c, w, ei = 6.0, 2.0, 10.0, 4e4
	for _, drawn := range []struct {
		name       string
		start, end int
		line       Line
	}{
		{"root first, held at A", 1, 2, Line{A: 1, B: 2, From: ThroughA}},
		{"tip first, held at B", 2, 1, Line{A: 2, B: 1, From: ThroughB}},
		{"root first, line from the tip", 1, 2, Line{A: 2, B: 1, From: ThroughB}},
	} {
		t.Run(drawn.name, func(t *testing.T) {
			mo := &frame.Model{
				Sections: []frame.Section{{Name: "S", E: 2e8, A: 0.01, I: ei / 2e8}},
				Nodes:    []frame.Node{{Name: "A", Support: frame.Pinned}, {Name: "B", X: a, Support: frame.Roller}, {Name: "C", X: a + c}},
				Members:  []frame.Member{{Name: "AB", Start: 0, End: 1}, {Name: "over", Start: drawn.start, End: drawn.end}},
				Cases:    []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 1, To: c, W: w, WEnd: w}}}},
			}
			env := line(t, mo, 3, []Line{{}, drawn.line})
			if env.Members[0].LineDeflection != nil {
				t.Error("a member without a line has line deflections")
			}
			em := env.Members[1]
			tip := 2
			if drawn.start == 2 {
				tip = 0
			}
			want := -(w*math.Pow(c, 4)/(8*ei) + w*c*c*c*a/(6*ei))
			if drawn.line.A == 2 {
				want = -want // the line runs right to left: its normal points down
			}
			if got := em.LineDeflection[tip].Max; math.Abs(got-want) > tol*math.Abs(want) {
				t.Errorf("tip %g, want %g", got, want)
			}
			if root := em.LineDeflection[2-tip].Max; math.Abs(root) > tol*math.Abs(want) {
				t.Errorf("root %g, want 0", root)
			}
		})
	}
}

func TestLinesAreChecked(t *testing.T) {
	mo := twoSpans(6, 1, 1)
	sol, err := frame.Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		lines []Line
		msg   string
	}{
		{[]Line{{A: 0, B: 7}}, "names no node"},
		{[]Line{{}, {}, {}}, "lines for 3 members"},
		{[]Line{{A: 0, B: 1, From: 9}}, "no reference"},
	} {
		if _, err := Compute(sol, service, Settings{Kinds: kindsOf(sol, nil), Stations: 3, Lines: tc.lines}, nil); err == nil || !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("lines %v: %v, want %q", tc.lines, err, tc.msg)
		}
	}
}

// At x = 0 a station is inside the member, past a point load at its start.
func TestStartStationIsInsideTheMember(t *testing.T) {
	// A 3 m cantilever drawn from its free tip, 10 down at the tip: by
	// statics V = -10 and M = -10x all along (M = -30 at the root).
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 2e8, A: 0.01, I: 1e-4}},
		Nodes:    []frame.Node{{Name: "T"}, {Name: "R", X: 3, Support: frame.Fixed}},
		Members:  []frame.Member{{Name: "T-R", Start: 0, End: 1}},
		Cases:    []frame.Case{{Name: "P", MemberLoads: []frame.MemberLoad{{Member: 0, Point: true, P: 10}}}},
	}
	sol, err := frame.Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	env, err := Compute(sol, []combos.Combination{{Name: "P", Terms: []combos.Term{{Case: 0, Factor: 1}}}}, Settings{Kinds: kindsOf(sol, nil), Stations: 3}, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, st := range env.Members[0].Stations {
		if !near(st.V.Max, -10) || !near(st.V.Min, -10) || !near(st.M.Max, -10*st.X) || !near(st.M.MaxWith[1], -10) {
			t.Errorf("x = %g: V %+v, M %+v; want V -10, M %g", st.X, st.V, st.M, -10*st.X)
		}
	}
}

// A pattern piece whose effect is round-off is not loaded for it.
func TestRoundOffPiecesAreNotLoaded(t *testing.T) {
	// A beam continuous over two spans on a pin and rollers: the moment
	// at the end roller is zero by statics, and each piece's effect on it
	// is round-off at most.
	mo := beam(2, 6, 10, 5)
	for _, mode := range []patterns.Mode{patterns.Exact, patterns.Code, patterns.Exhaustive} {
		lay, err := patterns.Expand(mo, []int{1}, 1, mode)
		if err != nil {
			t.Fatal(err)
		}
		sol, err := frame.Solve(lay.Model)
		if err != nil {
			t.Fatal(err)
		}
		cs := []combos.Combination{{Name: "D+L", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}}
		env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, lay), Stations: 3}, lay)
		if err != nil {
			t.Fatal(err)
		}
		// The far end of span 2 at the roller: M = 0.
		st := env.Members[1].Stations[2]
		if st.M.MaxLoaded+st.M.MinLoaded+len(st.M.MaxSpans)+len(st.M.MinSpans) != 0 || math.Abs(st.M.Max) > 1e-9 {
			t.Errorf("%s: M at the roller %+v: pieces loaded", mode, st.M)
		}
		// The middle support's hogging moment takes both spans.
		mid := env.Members[0].Stations[2]
		if mid.M.MinLoaded != 2 {
			t.Errorf("%s: M over the middle support %+v: want both pieces", mode, mid.M)
		}
	}
}

func TestNonFiniteCombinationIsNamed(t *testing.T) {
	sol, err := frame.Solve(twoSpans(6, 10, 5))
	if err != nil {
		t.Fatal(err)
	}
	cs := []combos.Combination{
		{Name: "fine", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "huge", Terms: []combos.Term{{Case: 0, Factor: 1e308}, {Case: 1, Factor: 1e308}}},
	}
	_, err = Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 3}, nil)
	want := `combination "huge": V of member "AB" at x = 0 is +Inf, not a finite number: a factor or a load is too large`
	if err == nil || err.Error() != want || !errors.Is(err, ErrNotFinite) {
		t.Errorf("error %v, want %s", err, want)
	}
}
