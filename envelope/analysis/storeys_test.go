package analysis

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"slices"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
)

// storeyJob is one storey of two equal columns fixed at their bases, EI =
// 250, L = 10, under a beam rigid in bending and along its axis, each
// column carrying P = 4, with a horizontal load of 0.045 per column.
func storeyJob(m Method) *Job {
	const ei, l = 250.0, 10.0
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "C", E: 2e8, A: 10, I: ei / 2e8}, {Name: "R", E: 2e8, A: 10, I: 10}},
			Nodes: []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: l},
				{Name: "B1", X: 6, Y: l}, {Name: "B0", X: 6, Support: frame.Fixed}},
			Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "A1-B1", Start: 1, End: 2, Section: 1}, {Name: "B0-B1", Start: 3, End: 2}},
			Cases: []frame.Case{
				{Name: "D", NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -4}, {Node: 2, Fy: -4}}},
				{Name: "W", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 0.09}}},
			},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{{Name: "D+W", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}},
		Methods:      []Method{m},
		Settings:     Settings{Stations: 5},
		Levels:       []Level{{Name: "level 0"}, {Name: "level 1", Y: l}},
	}
}

// TestStoreyStability checks one storey of equal fixed-base columns under
// an axially rigid beam rigid in bending, each column free to sway but not
// to rotate at its top, against closed forms: the stability index Q =
// ΣPu Δo/(Vus lc) (ACI 318-19 6.6.4.4.1) = P L²/(12 EI) = 0.133333 with
// Δo/V = L³/(24 EI); αcr = π²EI/L²/P = 6.168503 (Timoshenko & Gere), so
// Q αcr = π²/12 = 0.822467; B2 = 1/(1 − P/Pe,story) with RM = 0.85 (AISC
// 360-16 Appendix 8) = 1.186047; and the second-order sway amplification
// of the beam-column, 3(tan u − u)/u³ = 1.190916 with u = kL/2
// (Timoshenko & Gere), from the drift envelope of a second-order run
// against a first-order one.
func TestStoreyStability(t *testing.T) {
	first, err := Run(context.Background(), storeyJob(Method{}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(first.Storeys) != 1 || len(first.Storeys[0].Columns) != 2 {
		t.Fatalf("storeys %+v", first.Storeys)
	}
	s := first.Storeys[0]
	st := s.Stability[0]
	if !within(st.Q, 4.0/30, 1e-6) {
		t.Errorf("Q = %.7g, want P L²/(12 EI) = 0.133333", st.Q)
	}
	if !within(st.RM, 0.85, 1e-12) || !within(st.B2, 1/(1-(4.0/30)/0.85), 1e-6) || !within(st.B2, 1.186047, 1e-6) {
		t.Errorf("RM = %.7g, B2 = %.7g, want 0.85 and 1.186047", st.RM, st.B2)
	}
	a := first.Combinations[0].CriticalFactor
	if !within(a, 6.168503, 1e-3) || !within(st.Q*a, math.Pi*math.Pi/12, 1e-3) {
		t.Errorf("αcr = %.7g, Q αcr = %.7g; want 6.168503 and π²/12 = 0.822467", a, st.Q*a)
	}
	if !within(st.H, 0.09, 1e-12) || st.Unit {
		t.Errorf("storey shear %g (unit %v), want the wind's 0.09", st.H, st.Unit)
	}
	d1 := s.Drift.Max
	if want := 0.09 * 1000 / (24 * 250); !within(d1, want, 1e-6) || !within(s.Drift.Max/s.Height, want/10, 1e-6) {
		t.Errorf("first-order drift %.7g, want V L³/(24 EI) = %.7g", d1, want)
	}
	second, err := Run(context.Background(), storeyJob(Method{SecondOrder: true}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	u := math.Sqrt(4.0/250) * 10 / 2
	amp := 3 * (math.Tan(u) - u) / (u * u * u)
	if !within(amp, 1.190916, 1e-6) {
		t.Fatalf("closed form amplification %.7g", amp)
	}
	if got := second.Storeys[0].Drift.Max / d1; !within(got, amp, 1e-3) {
		t.Errorf("second-order drift / first-order %.7g, want 3(tan u − u)/u³ = %.7g", got, amp)
	}
	// The node displacement envelope gives the same sway at the top.
	if ux := second.Displacements[1].Ux; !within(ux.Max, second.Storeys[0].Drift.Max, 1e-9) || ux.MaxBy != 0 {
		t.Errorf("top node's ux %+v, the drift %g", ux, second.Storeys[0].Drift.Max)
	}
}

// TestStoreyUnitShear checks a combination without horizontal load: Q
// comes from a unit storey shear (ACI 318-19 6.6.4.4.1), the same
// P L²/(12 EI) = 0.133333.
func TestStoreyUnitShear(t *testing.T) {
	job := storeyJob(Method{})
	job.Methods = nil
	job.Combinations = append(job.Combinations, combos.Combination{Name: "D", Terms: []combos.Term{{Case: 0, Factor: 1}}})
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	st := res.Storeys[0].Stability[1]
	if !st.Unit || !within(st.H, 1, 0) || !within(st.Q, 4.0/30, 1e-6) {
		t.Errorf("gravity only: %+v, want a unit storey shear and Q = 0.133333", st)
	}
}

// swayFrame is a job of 2 bays and 4 storeys, fixed bases, with dead,
// live and wind cases and five combinations: one without horizontal load
// (its storeys take a unit shear), one with the wind each way, one with
// the live load alone on the dead, and a service one.
func swayFrame() *Job {
	const bay, storey = 6.0, 3.5
	mo := &frame.Model{Sections: []frame.Section{
		{Name: "C", E: 2e8, A: 8e-3, I: 1.2e-4}, {Name: "B", E: 2e8, A: 6e-3, I: 2e-4}}}
	node := func(i, j int) int { return j*3 + i }
	var levels []Level
	for j := range 5 {
		levels = append(levels, Level{Name: fmt.Sprintf("L%d", j), Y: float64(j) * storey})
		for i := range 3 {
			n := frame.Node{Name: fmt.Sprintf("N%d%d", i, j), X: float64(i) * bay, Y: float64(j) * storey}
			if j == 0 {
				n.Support = frame.Fixed
			}
			mo.Nodes = append(mo.Nodes, n)
		}
	}
	var d, l, w frame.Case
	d.Name, l.Name, w.Name = "D", "L", "W"
	for j := range 4 {
		for i := range 3 {
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("C%d%d", i, j), Start: node(i, j), End: node(i, j+1)})
		}
		for i := range 2 {
			m := len(mo.Members)
			mem := frame.Member{Name: fmt.Sprintf("B%d%d", i, j+1), Start: node(i, j+1), End: node(i+1, j+1), Section: 1}
			if i == 1 && j == 2 {
				mem.Release = frame.ReleaseBoth // a leaning bay
			}
			mo.Members = append(mo.Members, mem)
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, From: 0, To: bay, W: 20, WEnd: 20})
			l.MemberLoads = append(l.MemberLoads, frame.MemberLoad{Member: m, From: 0, To: bay, W: 10 + 2*float64(i), WEnd: 10})
		}
		w.NodeLoads = append(w.NodeLoads, frame.NodeLoad{Node: node(0, j+1), Fx: 8 + float64(j)})
	}
	mo.Cases = []frame.Case{d, l, w}
	t := func(c int, f float64) combos.Term { return combos.Term{Case: c, Factor: f} }
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: mo,
		Cases: []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{
			{Name: "1.4D", Terms: []combos.Term{t(0, 1.4)}},
			{Name: "1.2D+1.6L", Terms: []combos.Term{t(0, 1.2), t(1, 1.6)}},
			{Name: "1.2D+1.0W+L", Terms: []combos.Term{t(0, 1.2), t(2, 1), t(1, 1)}},
			{Name: "0.9D-1.0W", Terms: []combos.Term{t(0, 0.9), t(2, -1)}},
			{Name: "D+L", Terms: []combos.Term{t(0, 1), t(1, 1)}, Service: true},
		},
		Settings: Settings{Stations: 5},
		Levels:   levels,
	}
}

// The storey stability indices and critical load factors Run finds on
// the factor of the stiffness it solved the load cases with are those of
// each combination solved alone, by an assembly and factor of its own
// (frame.SolveWith): with the sections as given and no notional load
// (every combination on the one solution), with notional loads as
// alternatives each way, with strength and service stiffness, and in
// second order (each combination's storeys solved on their own).
func TestStoreyStabilityOnSharedFactor(t *testing.T) {
	for _, tc := range []struct {
		name string
		set  func(*Job)
		unit int // combinations whose storeys take a unit shear
	}{
		{"nominal", func(*Job) {}, 2},
		{"notional loads", func(j *Job) { j.Sway.Notional, j.Sway.NotionalRatio = NotionalRatio, 0.003 }, 0},
		{"strength stiffness", func(j *Job) {
			j.Sway.StrengthEI = 0.8
			j.Methods = []Method{{Stiffness: Strength}, {Stiffness: Strength}, {}, {Stiffness: Strength}, {Stiffness: Service}}
		}, 2},
		{"second order", func(j *Job) {
			so := Method{SecondOrder: true}
			j.Methods = []Method{so, {SecondOrder: true, Allowable: true}, so, {SecondOrder: true, Stiffness: Strength}, {}}
		}, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job := swayFrame()
			tc.set(job)
			res, err := Run(context.Background(), job, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Storeys) != 4 {
				t.Fatalf("%d storeys, want 4", len(res.Storeys))
			}
			// Each unit alone, as the stability indices were found before
			// they shared a factor.
			sv := favourableSplit(job)
			pl, err := makePlan(job, &sv)
			if err != nil {
				t.Fatal(err)
			}
			alone := &Result{Job: job, Storeys: storeysOf(job)}
			critical := make([]float64, len(job.Combinations))
			for i := range pl.units {
				u := &pl.units[i]
				if err := alone.storeyStability(u, sv.model, u.method.Stiffness, nil); err != nil {
					t.Fatal(err)
				}
				if err := alone.firstOrderCritical(u, sv.model, u.method.Stiffness); err != nil {
					t.Fatal(err)
				}
				critical[u.k] = minCritical(critical[u.k], u.critical)
			}
			for s := range res.Storeys {
				for k, got := range res.Storeys[s].Stability {
					if want := alone.Storeys[s].Stability[k]; got != want {
						t.Errorf("storey %d, combination %q: %+v, alone %+v", s, job.Combinations[k].Name, got, want)
					}
				}
			}
			units := 0
			for k, cb := range res.Combinations {
				if cb.CriticalFactor != critical[k] {
					t.Errorf("combination %q: αcr = %v, alone %v", cb.Name, cb.CriticalFactor, critical[k])
				}
				if !cb.Service && res.Storeys[0].Stability[k].Unit {
					units++
				}
			}
			if units != tc.unit {
				t.Errorf("%d combinations take a unit storey shear at the bottom storey, want %d", units, tc.unit)
			}
		})
	}
}

// upLines orders columns up each line from its foot: on three storeys of
// lines A and B listed storey by storey, with B's middle column missing
// (its top column stands on a beam: a line of its own) and A's top column
// drawn downwards, A1 A2 A3, then B1, then B3; and keeps every column
// once when the tops and bottoms close on themselves.
func TestUpLines(t *testing.T) {
	// Nodes: A0..A3 = 0..3, B0..B3 = 4..7.
	bottom := []int{0, 4, 1, 2, 6}
	top := []int{1, 5, 2, 3, 7}
	if got, want := upLines(bottom, top), []int{0, 2, 3, 1, 4}; !slices.Equal(got, want) {
		t.Errorf("order %v, want %v", got, want)
	}
	// A ring of three (no foot) and one column apart.
	got := upLines([]int{1, 2, 3, 8}, []int{2, 3, 1, 9})
	if want := []int{3, 0, 1, 2}; !slices.Equal(got, want) {
		t.Errorf("order %v, want %v", got, want)
	}
}

// The drifts are enveloped up each column line, each column's bottom
// displacements those its neighbour below left: the same envelopes, to
// the last bit, as with both ends' displacements read for every column in
// the storeys' order, on one processor and on two; on a regular frame,
// and on one with a column missing, columns drawn downwards and the
// members in another order (the storeys' columns then out of line order).
func TestDriftsUpLines(t *testing.T) {
	odd := regularJob(13, 11, false)
	mo := *odd.Model
	mo.Members = slices.Clone(mo.Members)
	for m := range mo.Members {
		if m%3 == 0 && mo.IsColumn(m) {
			mo.Members[m].Start, mo.Members[m].End = mo.Members[m].End, mo.Members[m].Start
		}
	}
	// Column C3 (line C, storey 3) out: its top joint rests on the beams.
	cut := slices.IndexFunc(mo.Members, func(m frame.Member) bool { return m.Name == "CC3" })
	mo.Members = slices.Delete(mo.Members, cut, cut+1)
	slices.Reverse(mo.Members)
	for c := range mo.Cases {
		// The loads follow their members.
		cs := &mo.Cases[c]
		cs.MemberLoads = slices.Clone(cs.MemberLoads)
		for i := range cs.MemberLoads {
			m := cs.MemberLoads[i].Member
			if m > cut {
				m--
			}
			cs.MemberLoads[i].Member = len(mo.Members) - 1 - m
		}
	}
	odd.Model = &mo
	for _, tc := range []struct {
		name string
		job  *Job
	}{{"regular 12x12", regularJob(12, 12, false)}, {"odd 13x11", odd}} {
		res, err := Run(context.Background(), tc.job, Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				_, drifts := res.displacementRequests()
				if drifts.n < 2*envelope.ValuesBlock {
					t.Fatalf("%d drifts: fewer than two blocks", drifts.n)
				}
				var cols []int
				for _, s := range res.Storeys {
					cols = append(cols, s.Columns...)
				}
				m := res.Job.Model
				in := 0 // the columns enveloped right after the one below them
				for q := 1; q < len(drifts.order); q++ {
					below, c := cols[drifts.order[q-1]], cols[drifts.order[q]]
					if m.Bottom(c) == m.Members[below].Start+m.Members[below].End-m.Bottom(below) {
						in++
					}
				}
				if in < drifts.n*3/4 {
					t.Fatalf("%d of %d drifts follow the column below them", in, drifts.n)
				}
				each := bothEnds(res, drifts)
				for _, vr := range []*valuesRequest{drifts, each} {
					if err := vr.add(res.sol, res.lay, res.solved, allOf(res.solved), res.Envelope.Settings); err != nil {
						t.Fatal(err)
					}
				}
				for i := range cols {
					if g, w := fmt.Sprintf("%#v", drifts.out[i][0]), fmt.Sprintf("%#v", each.out[i][0]); g != w {
						t.Fatalf("column %q: %s, both ends read %s", m.Members[cols[i]].Name, g, w)
					}
				}
			})
		}
	}
}

// Quantities enveloped in an order of their own report the error of the
// first in their own order that has one, as in that order.
func TestValuesRequestOrderFirstError(t *testing.T) {
	res, err := Run(context.Background(), regularJob(12, 12, false), Options{})
	if err != nil {
		t.Fatal(err)
	}
	n := 3 * envelope.ValuesBlock
	order := make([]int, n)
	for q := range order {
		order[q] = n - 1 - q
	}
	bad := map[int]bool{5: true, 2*envelope.ValuesBlock + 1: true}
	idx := make([]int, len(res.solved))
	for k := range idx {
		idx[k] = k
	}
	for _, o := range [][]int{nil, order} {
		vr := &valuesRequest{n: n, effects: 1, targets: displacementTargets(res.Job.Combinations), order: o,
			what: func(i, _ int) string { return fmt.Sprintf("quantity %d", i) },
			fill: func(sol *frame.Solution, i, _ int, row, _ [][3]float64) {
				sol.DisplacementsTo(row, i%len(sol.Model().Nodes))
				if bad[i] {
					row[0][0] = math.Inf(1) // in the dead load
				}
			}}
		err := vr.add(res.sol, res.lay, res.solved, idx, res.Envelope.Settings)
		if err == nil || !strings.Contains(err.Error(), "quantity 5 ") {
			t.Errorf("order %v: error %v, want quantity 5's", o != nil, err)
		}
	}
}

// bothEnds is the request of the drifts of res's storeys in their order,
// each column's top and bottom displacements read for it alone: drifts
// as displacementRequests made it before the columns were taken up the
// lines (upLines).
func bothEnds(res *Result, drifts *valuesRequest) *valuesRequest {
	var cols []int
	for _, s := range res.Storeys {
		cols = append(cols, s.Columns...)
	}
	m := res.Job.Model
	return &valuesRequest{n: len(cols), effects: 1, targets: drifts.targets, what: drifts.what,
		fill: func(sol *frame.Solution, i, _ int, row, tmp [][3]float64) {
			b := m.Bottom(cols[i])
			sol.DisplacementsTo(row, m.Members[cols[i]].Start+m.Members[cols[i]].End-b)
			sol.DisplacementsTo(tmp, b)
			for c := range row {
				row[c] = [3]float64{row[c][0] - tmp[c][0]}
			}
		}}
}

// allOf returns the indices of cs.
func allOf[T any](cs []T) []int {
	idx := make([]int, len(cs))
	for k := range idx {
		idx[k] = k
	}
	return idx
}
