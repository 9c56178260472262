package envelope

import (
	"fmt"
	"testing"

	"govern/combos"
	"govern/envelope/internal/cputime"
	"govern/frame"
	"govern/patterns"
)

// regularFrame is a frame of equal bays and storeys on fixed bases, with
// dead load (case D) on every beam, a live load (L) on the floor beams
// with a point load at a third of each span, a roof live load (Lr) on the
// roof beams and wind (W) at every floor: a frame of the size and loading
// of an office building, for the benchmarks.
func regularFrame(bays, storeys int) *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "C", E: 30e6, A: 0.16, I: 2.1e-3}, {Name: "B", E: 30e6, A: 0.2, I: 4e-3}}}
	const bay, storey = 7.2, 3.6
	id := func(i, j int) int { return j*(bays+1) + i }
	for j := 0; j <= storeys; j++ {
		for i := 0; i <= bays; i++ {
			s := frame.Free
			if j == 0 {
				s = frame.Fixed
			}
			mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprintf("n%d-%d", i, j), X: float64(i) * bay, Y: float64(j) * storey, Support: s})
		}
	}
	d, l, lr, w := frame.Case{Name: "D"}, frame.Case{Name: "L"}, frame.Case{Name: "Lr"}, frame.Case{Name: "W"}
	for j := 1; j <= storeys; j++ {
		for i := 0; i <= bays; i++ {
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("c%d-%d", i, j), Start: id(i, j-1), End: id(i, j)})
		}
		for i := 1; i <= bays; i++ {
			m := len(mo.Members)
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("b%d-%d", i, j), Start: id(i-1, j), End: id(i, j), Section: 1})
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, To: bay, W: 25, WEnd: 25})
			if j < storeys {
				l.MemberLoads = append(l.MemberLoads, frame.MemberLoad{Member: m, To: bay, W: 15, WEnd: 15},
					frame.MemberLoad{Member: m, Point: true, At: bay / 3, P: 12})
			} else {
				lr.MemberLoads = append(lr.MemberLoads, frame.MemberLoad{Member: m, To: bay, W: 5, WEnd: 5})
			}
		}
		w.NodeLoads = append(w.NodeLoads, frame.NodeLoad{Node: id(0, j), Fx: 10})
	}
	mo.Cases = []frame.Case{d, l, lr, w}
	return mo
}

// BenchmarkCompute measures Compute alone (the model solved beforehand) at
// 11 stations per member over the combinations of frameCombos and a
// service combination D+L, for each way of placing the patterned live
// loads L and Lr. Exhaustive placement is measured on a frame small enough
// for it (at most patterns.MaxExhaustive pieces). The "joined" runs put L
// and Lr in one group (Settings.Groups), which takes the path of
// combinations with joined terms; with patterns "full" the two act as
// whole cases, so the group decides for every station. The "strength"
// sizes leave out the service combination (no deflections), as a run of
// a model without one does.
func BenchmarkCompute(b *testing.B) {
	cs := append(frameCombos(), combos.Combination{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}})
	for _, bc := range []struct {
		mode          patterns.Mode
		bays, storeys int
		segments      int
		groups        []int
		strength      bool
	}{
		{patterns.Full, 10, 10, 1, nil, false},
		{patterns.Exact, 10, 10, 1, nil, false},
		{patterns.Exact, 10, 10, 3, nil, false},
		{patterns.Code, 10, 10, 1, nil, false},
		{patterns.Exhaustive, 3, 3, 1, nil, false},
		{patterns.Full, 10, 10, 1, []int{-1, 0, 0, -1}, false},
		{patterns.Exact, 10, 10, 1, []int{-1, 0, 0, -1}, false},
		{patterns.Exact, 30, 60, 1, nil, false},
		{patterns.Exact, 30, 60, 1, nil, true},
	} {
		size := fmt.Sprintf("%dx%d", bc.bays, bc.storeys)
		cs := cs
		if bc.strength {
			size += "-strength"
			cs = frameCombos()
		}
		name := fmt.Sprintf("%s/%s/segments=%d", bc.mode, size, bc.segments)
		if bc.groups != nil {
			name += "/joined"
		}
		b.Run(name, func(b *testing.B) {
			lay, err := patterns.Expand(regularFrame(bc.bays, bc.storeys), []int{1, 2}, bc.segments, bc.mode)
			if err != nil {
				b.Fatal(err)
			}
			sol, err := frame.Solve(lay.Model)
			if err != nil {
				b.Fatal(err)
			}
			set := Settings{Kinds: kindsOf(sol, lay), Stations: 11, Groups: bc.groups}
			b.ReportAllocs()
			b.ResetTimer()
			start := cputime.Now()
			for b.Loop() {
				if _, err := Compute(sol, cs, set, lay); err != nil {
					b.Fatal(err)
				}
			}
			reportCPU(b, start)
		})
	}
}

// BenchmarkComputeFactors measures the envelopes with live load
// reduction factors on L in every member (Settings.Factors): one table
// ("uniform"), and one whose factors depend on which case leads
// ("leading", two parts of the combinations).
func BenchmarkComputeFactors(b *testing.B) {
	cs := frameCombos()
	for _, bc := range []struct {
		mode          patterns.Mode
		bays, storeys int
		leading       bool
	}{
		{patterns.Full, 10, 10, false},
		{patterns.Exact, 10, 10, false},
		{patterns.Exact, 10, 10, true},
		{patterns.Exact, 20, 20, false},
	} {
		name := fmt.Sprintf("%s/%dx%d", bc.mode, bc.bays, bc.storeys)
		if bc.leading {
			name += "/leading"
		}
		b.Run(name, func(b *testing.B) {
			mo := regularFrame(bc.bays, bc.storeys)
			lay, err := patterns.Expand(mo, []int{1, 2}, 1, bc.mode)
			if err != nil {
				b.Fatal(err)
			}
			sol, err := frame.Solve(lay.Model)
			if err != nil {
				b.Fatal(err)
			}
			kinds := kindsOf(sol, lay)
			f := &Factors{Of: uniform(len(mo.Members), len(kinds), 0.6, 1)}
			if bc.leading {
				f.Accompanying = uniform(len(mo.Members), len(kinds), 1, 1)
			}
			set := Settings{Kinds: kinds, Stations: 11, Factors: f}
			b.ReportAllocs()
			b.ResetTimer()
			start := cputime.Now()
			for b.Loop() {
				if _, err := Compute(sol, cs, set, lay); err != nil {
					b.Fatal(err)
				}
			}
			reportCPU(b, start)
		})
	}
}

// BenchmarkComputeSecondOrder measures Compute on a second-order solution
// (frame.Options.Axial: the axial forces of D in first order, times 1.4),
// exact placement, over the combinations of frameCombos: every member
// then carries N·(v(x) − v(0)) in its moments (fold.go).
func BenchmarkComputeSecondOrder(b *testing.B) {
	cs := frameCombos()
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 20}, {30, 60}} {
		b.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(b *testing.B) {
			mo := regularFrame(size.bays, size.storeys)
			first, err := frame.Solve(mo)
			if err != nil {
				b.Fatal(err)
			}
			axial := make([]float64, len(mo.Members))
			for m := range axial {
				f := first.EndForces(0, m)
				axial[m] = 1.4 * (-f[0] + f[3]) / 2
			}
			lay, err := patterns.Expand(mo, []int{1, 2}, 1, patterns.Exact)
			if err != nil {
				b.Fatal(err)
			}
			sol, err := frame.SolveWith(lay.Model, frame.Options{Axial: axial})
			if err != nil {
				b.Fatal(err)
			}
			set := Settings{Kinds: kindsOf(sol, lay), Stations: 11}
			b.ReportAllocs()
			b.ResetTimer()
			start := cputime.Now()
			for b.Loop() {
				if _, err := Compute(sol, cs, set, lay); err != nil {
					b.Fatal(err)
				}
			}
			reportCPU(b, start)
		})
	}
}

// BenchmarkFirstOrderMembers measures Compute on first-order solutions of
// regularFrame with its live loads placed span by span (exact), over the
// strength combinations of frameCombos (no deflections), where nearly all
// the time goes to the folded members: with the AVX kernels where the
// processor has them ("avx": the table of moments classified four stations
// at once, the fold of N and V both at once, the units that may be listed
// found four at a time) and without ("go": each station classified one by
// one, as -tags purego builds it), to the same results.
func BenchmarkFirstOrderMembers(b *testing.B) {
	cs := frameCombos()
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 20}, {30, 60}} {
		lay, err := patterns.Expand(regularFrame(size.bays, size.storeys), []int{1, 2}, 1, patterns.Exact)
		if err != nil {
			b.Fatal(err)
		}
		sol, err := frame.Solve(lay.Model)
		if err != nil {
			b.Fatal(err)
		}
		set := Settings{Kinds: kindsOf(sol, lay), Stations: 11}
		for _, avx := range []bool{true, false} {
			if avx && !useAVX {
				continue
			}
			kernels := "go"
			if avx {
				kernels = "avx"
			}
			b.Run(fmt.Sprintf("%dx%d/%s", size.bays, size.storeys, kernels), func(b *testing.B) {
				defer func(v bool) { useAVX = v }(useAVX)
				useAVX = avx
				b.ReportAllocs()
				b.ResetTimer()
				start := cputime.Now()
				for b.Loop() {
					if _, err := Compute(sol, cs, set, lay); err != nil {
						b.Fatal(err)
					}
				}
				reportCPU(b, start)
			})
		}
	}
}
