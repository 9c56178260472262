package envelope

import (
	"fmt"
	"math"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// beam returns a continuous beam of n equal spans l on a pin and rollers with
// dead load g (case D) and live load q (case L, to be patterned) on every span.
func beam(n int, l, g, q float64) *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "S", E: 200e6, A: 1e-2, I: 1e-4}}}
	d := frame.Case{Name: "D"}
	lv := frame.Case{Name: "L"}
	for i := 0; i <= n; i++ {
		s := frame.Roller
		if i == 0 {
			s = frame.Pinned
		}
		mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprint(i), X: float64(i) * l, Support: s})
	}
	for i := range n {
		mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("span%d", i+1), Start: i, End: i + 1})
		d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: i, To: l, W: g, WEnd: g})
		lv.MemberLoads = append(lv.MemberLoads, frame.MemberLoad{Member: i, To: l, W: q, WEnd: q})
	}
	mo.Cases = []frame.Case{d, lv}
	return mo
}

func patterned(t *testing.T, mo *frame.Model, cases []int, segments int, mode patterns.Mode, cs []combos.Combination, stations int) *Envelope {
	t.Helper()
	lay, err := patterns.Expand(mo, cases, segments, mode)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, lay), Stations: stations}, lay)
	if err != nil {
		t.Fatal(err)
	}
	return env
}

// tableTol is the rounding of three-decimal handbook coefficients.
const tableTol = 0.0005

func TestThreeSpanCoefficients(t *testing.T) {
	// Continuous beam coefficient tables, three equal spans (for example the
	// Reinforced Concrete Designer's Handbook, Reynolds & Steedman, table of
	// bending moment coefficients, recalled from memory): dead load on all
	// spans 0.080, 0.025, -0.100; live load placed for the worst effect
	// 0.101 (end span), 0.075 (centre span, max), -0.050 (centre span, min),
	// -0.117 (interior support). The closed forms beside them are from
	// statics of the three-span beam: 0.10125 = 0.45²/2 at x = 0.45L,
	// -7/60 at the support.
	const l, g, q = 6.0, 1.0, 1.0
	mo := beam(3, l, g, q)
	cs := []combos.Combination{
		{Name: "D", Terms: []combos.Term{{Case: 0, Factor: 1}}},
		{Name: "L", Terms: []combos.Term{{Case: 1, Factor: 1}}},
	}
	// 21 stations: every 0.05L, so 0.4L, 0.45L and 0.5L are stations.
	env := patterned(t, mo, []int{1}, 1, patterns.Exact, cs, 21)
	l2 := l * l
	type check struct {
		name      string
		member, i int
		got       func(Station) float64
		table     float64 // handbook coefficient
		exact     float64 // closed form
	}
	mmax := func(s Station) float64 {
		if s.M.MaxBy != 1 {
			return math.NaN()
		}
		return s.M.Max
	}
	mmin := func(s Station) float64 {
		if s.M.MinBy != 1 {
			return math.NaN()
		}
		return s.M.Min
	}
	for _, c := range []check{
		{"live, end span at 0.45L", 0, 9, mmax, 0.101, 0.10125},
		{"live, centre span max at 0.5L", 1, 10, mmax, 0.075, 0.075},
		{"live, centre span min", 1, 10, mmin, -0.050, -0.05},
		{"live, interior support", 0, 20, mmin, -0.117, -7.0 / 60},
	} {
		t.Run(c.name, func(t *testing.T) {
			got := c.got(env.Members[c.member].Stations[c.i]) / (q * l2)
			if math.Abs(got-c.exact) > 1e-9 || math.Abs(got-c.table) > tableTol {
				t.Errorf("coefficient %.5f, want %.5f (table %.3f)", got, c.exact, c.table)
			}
		})
	}
	// Dead load alone (combination D) on all spans.
	for _, c := range []struct {
		name      string
		member, i int
		table     float64
	}{{"dead, end span at 0.4L", 0, 8, 0.080}, {"dead, centre span", 1, 10, 0.025}, {"dead, interior support", 0, 20, -0.100}} {
		t.Run(c.name, func(t *testing.T) {
			s := env.Members[c.member].Stations[c.i]
			d := envDead(t, mo, c.member, s.X)
			if math.Abs(d/(g*l2)-c.table) > 1e-9 {
				t.Errorf("dead coefficient %.5f, want %.3f", d/(g*l2), c.table)
			}
			// The envelope of D + L at that station is dead plus the live
			// extreme (superposition).
			both := patterned(t, mo, []int{1}, 1, patterns.Exact, []combos.Combination{{Name: "D+L", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}}, 21)
			live := env.Members[c.member].Stations[c.i].M
			got, want := both.Members[c.member].Stations[c.i].M.Max, d+live.Max
			if c.table < 0 {
				got, want = both.Members[c.member].Stations[c.i].M.Min, d+live.Min
			}
			if math.Abs(got-want) > 1e-9*l2 {
				t.Errorf("D+L = %g, want D + L extreme = %g", got, want)
			}
		})
	}
	t.Run("spans loaded for the interior support", func(t *testing.T) {
		s := env.Members[0].Stations[20]
		if got := names(env, s.M.MinSpans); got != "span1 span2" {
			t.Errorf("min spans %q, want \"span1 span2\"", got)
		}
		if got := names(env, env.Members[1].Stations[10].M.MinSpans); got != "span1 span3" {
			t.Errorf("centre min spans %q, want \"span1 span3\"", got)
		}
	})
	t.Run("concurrent forces come from the same arrangement", func(t *testing.T) {
		// At the centre of span 2 with spans 1 and 3 loaded the shear is zero
		// by symmetry, and the moment equals the extreme.
		s := env.Members[1].Stations[10]
		if w := s.M.MinWith; math.Abs(w[2]-s.M.Min) > 1e-12 || math.Abs(w[1]) > 1e-9 {
			t.Errorf("min with = %v", w)
		}
	})
}

// envDead returns the dead-load moment of a member at x, solved directly.
func envDead(t *testing.T, mo *frame.Model, m int, x float64) float64 {
	sol, err := frame.Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	return sol.At(0, m, x).M
}

func names(env *Envelope, idx []int) string {
	s := ""
	for i, p := range idx {
		if i > 0 {
			s += " "
		}
		s += env.Pieces[p].Name
	}
	return s
}

func TestTwoSpansOneLoaded(t *testing.T) {
	// Two equal spans, load on one span: 49/512 qL² at 7L/16 of the loaded
	// span and -qL²/16 at the support (AISC Steel Construction Manual Table
	// 3-23, recalled from memory).
	const l, q = 8.0, 5.0
	mo := beam(2, l, 0, q)
	cs := []combos.Combination{{Name: "L", Terms: []combos.Term{{Case: 1, Factor: 1}}}}
	env := patterned(t, mo, []int{1}, 1, patterns.Exact, cs, 17)
	s := env.Members[0].Stations[7]
	if want := 49 * q * l * l / 512; math.Abs(s.M.Max-want) > 1e-9*want {
		t.Errorf("M max at 7L/16 = %g, want %g", s.M.Max, want)
	}
	if got := names(env, s.M.MaxSpans); got != "span1" {
		t.Errorf("max spans %q, want span1", got)
	}
	// The support moment in the same arrangement (span 1 alone) is the
	// concurrent moment at the support station of a solve of that piece.
	lay, _ := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := sol.At(lay.Patterned[0].Units[0].Column, 0, l).M, -q*l*l/16; math.Abs(got-want) > 1e-9*q*l*l {
		t.Errorf("support moment with span 1 loaded = %g, want %g", got, want)
	}
}

func TestHalfSpanShear(t *testing.T) {
	// Simply supported span, uniform live load placed in two halves: the
	// largest midspan shear is qL/8, with the far half loaded (influence
	// line of shear; common practice).
	const l, q = 10.0, 4.0
	mo := beam(1, l, 0, q)
	cs := []combos.Combination{{Name: "L", Terms: []combos.Term{{Case: 1, Factor: 1}}}}
	env := patterned(t, mo, []int{1}, 2, patterns.Exact, cs, 3)
	s := env.Members[0].Stations[1]
	if want := q * l / 8; math.Abs(s.V.Max-want) > 1e-9 || math.Abs(s.V.Min+want) > 1e-9 {
		t.Errorf("midspan V = [%g, %g], want ±%g", s.V.Min, s.V.Max, want)
	}
	if got := names(env, s.V.MaxSpans); got != "span1:2" {
		t.Errorf("max spans %q, want span1:2", got)
	}
}

// frameModel is a two-bay, three-storey frame with dead load, a patterned
// live load on the floors, a patterned roof live load and wind.
func frameModel() *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "C", E: 30e6, A: 0.16, I: 2.1e-3}, {Name: "B", E: 30e6, A: 0.2, I: 4e-3}}}
	xs, ys := []float64{0, 7, 12}, []float64{0, 4, 7.5, 11}
	id := func(i, j int) int { return j*len(xs) + i }
	for j, y := range ys {
		for i, x := range xs {
			s := frame.Free
			if j == 0 {
				s = frame.Fixed
			}
			mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprintf("%c%d", 'A'+i, j), X: x, Y: y, Support: s})
		}
	}
	d := frame.Case{Name: "D"}
	l := frame.Case{Name: "L"}
	lr := frame.Case{Name: "Lr"}
	w := frame.Case{Name: "W"}
	for j := 1; j < len(ys); j++ {
		for i := range xs {
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("c%d%d", i, j), Start: id(i, j-1), End: id(i, j)})
		}
		for i := 1; i < len(xs); i++ {
			m := len(mo.Members)
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("b%d%d", i, j), Start: id(i-1, j), End: id(i, j), Section: 1})
			span := xs[i] - xs[i-1]
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, To: span, W: 20, WEnd: 20})
			if j < len(ys)-1 {
				l.MemberLoads = append(l.MemberLoads, frame.MemberLoad{Member: m, To: span, W: 15, WEnd: 15},
					frame.MemberLoad{Member: m, Point: true, At: span / 3, P: 12})
			} else {
				lr.MemberLoads = append(lr.MemberLoads, frame.MemberLoad{Member: m, To: span, W: 5, WEnd: 5})
			}
		}
		w.NodeLoads = append(w.NodeLoads, frame.NodeLoad{Node: id(0, j), Fx: 10})
	}
	l.NodeLoads = []frame.NodeLoad{{Node: id(1, 1), Fy: -3}} // not patterned: stays in the rest
	mo.Cases = []frame.Case{d, l, lr, w}
	return mo
}

func frameCombos() []combos.Combination {
	t := func(f ...float64) []combos.Term {
		var ts []combos.Term
		for c, v := range f {
			if v != 0 {
				ts = append(ts, combos.Term{Case: c, Factor: v})
			}
		}
		return ts
	}
	return []combos.Combination{
		{Name: "1.4D", Terms: t(1.4)},
		{Name: "1.2D+1.6L+0.5Lr", Terms: t(1.2, 1.6, 0.5)},
		{Name: "1.2D+1.6Lr+L", Terms: t(1.2, 1, 1.6)},
		{Name: "1.2D+W+L+0.5Lr", Terms: t(1.2, 1, 0.5, 1)},
		{Name: "1.2D-W+L+0.5Lr", Terms: t(1.2, 1, 0.5, -1)},
		{Name: "0.9D-W", Terms: t(0.9, 0, 0, -1)},
	}
}

// sameTol is the agreement expected between two placements that must give
// the same envelope: round-off of sums of a few dozen terms.
const sameTol = 1e-9

func TestExactEqualsExhaustive(t *testing.T) {
	// Superposition: the sum of the adverse pieces is the largest of all
	// subset sums (closed form); exhaustive search must agree at every station.
	mo := frameModel()
	cs := frameCombos()
	// Four floor beams and two roof beams, in two segments: 12 pieces.
	exact := patterned(t, mo, []int{1, 2}, 2, patterns.Exact, cs, 9)
	brute := patterned(t, mo, []int{1, 2}, 2, patterns.Exhaustive, cs, 9)
	if len(exact.Pieces) != 12 {
		t.Fatalf("%d pieces, want 12", len(exact.Pieces))
	}
	scale := 0.0
	forEach(exact, func(m, i, j int, e Extreme) { scale = math.Max(scale, math.Abs(e.Max)+math.Abs(e.Min)) })
	forEach(exact, func(m, i, j int, e Extreme) {
		b := extremeOf(brute, m, i, j)
		if math.Abs(e.Max-b.Max) > sameTol*scale || math.Abs(e.Min-b.Min) > sameTol*scale {
			t.Errorf("member %s station %d effect %d: exact [%g, %g], exhaustive [%g, %g]",
				mo.Members[m].Name, i, j, e.Min, e.Max, b.Min, b.Max)
		}
		for q := range 3 {
			if e.MaxBy == b.MaxBy && math.Abs(e.MaxWith[q]-b.MaxWith[q]) > 1e-6*scale {
				t.Errorf("member %s station %d effect %d: concurrent %d differs: %v vs %v", mo.Members[m].Name, i, j, q, e.MaxWith, b.MaxWith)
			}
		}
	})
	// Reactions too.
	for r := range exact.Reactions {
		for j, pair := range [][2]Extreme{{exact.Reactions[r].Fx, brute.Reactions[r].Fx}, {exact.Reactions[r].Fy, brute.Reactions[r].Fy}, {exact.Reactions[r].M, brute.Reactions[r].M}} {
			if math.Abs(pair[0].Max-pair[1].Max) > sameTol*scale || math.Abs(pair[0].Min-pair[1].Min) > sameTol*scale {
				t.Errorf("reaction %d component %d differs", r, j)
			}
		}
	}
}

func TestCodeIsNeverWorseThanExact(t *testing.T) {
	// The code arrangements are some of all arrangements, so their envelope
	// lies within the exact one (closed form: a maximum over a subset).
	mo := frameModel()
	cs := frameCombos()
	exact := patterned(t, mo, []int{1, 2}, 1, patterns.Exact, cs, 11)
	code := patterned(t, mo, []int{1, 2}, 1, patterns.Code, cs, 11)
	full := patterned(t, mo, []int{1, 2}, 1, patterns.Full, cs, 11)
	worse := 0
	forEach(exact, func(m, i, j int, e Extreme) {
		tol := sameTol * (math.Abs(e.Max) + math.Abs(e.Min) + 1)
		for _, other := range []*Envelope{code, full} {
			c := extremeOf(other, m, i, j)
			if c.Max > e.Max+tol || c.Min < e.Min-tol {
				t.Errorf("member %s station %d effect %d: [%g, %g] outside exact [%g, %g]",
					mo.Members[m].Name, i, j, c.Min, c.Max, e.Min, e.Max)
			}
		}
		if c := extremeOf(code, m, i, j); c.Max < e.Max-tol || c.Min > e.Min+tol {
			worse++
		}
	})
	if worse == 0 {
		t.Error("code arrangements matched exact everywhere; the frame does not exercise patterning")
	}
}

func forEach(env *Envelope, f func(m, i, j int, e Extreme)) {
	for m, mem := range env.Members {
		for i, s := range mem.Stations {
			for j, e := range [3]Extreme{s.N, s.V, s.M} {
				f(m, i, j, e)
			}
		}
	}
}

func extremeOf(env *Envelope, m, i, j int) Extreme {
	s := env.Members[m].Stations[i]
	return [3]Extreme{s.N, s.V, s.M}[j]
}
