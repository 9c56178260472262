package frame

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// columnsFrame is a shuffled 3 × 3 grid (gridFrame) with, in one case
// each, distributed, point (one at a member's start), moment and
// temperature loads, a node load and a settlement of a support: every way
// a case can act on a member or leave it unloaded.
func columnsFrame() *Model {
	mo := gridFrame(3, 3, 11)
	rng := rand.New(rand.NewPCG(5, 0))
	mo.Sections[0].Alpha, mo.Sections[0].Depth = 1e-5, 0.5
	base := -1
	for v, nd := range mo.Nodes {
		if nd.Support == Fixed {
			base = v
			break
		}
	}
	for c := range 6 {
		cs := Case{Name: string(rune('A' + c))}
		for range 3 {
			m := rng.IntN(len(mo.Members))
			l := mo.Length(m)
			switch c {
			case 0:
				cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, From: 0.1 * l, To: 0.8 * l, W: -3, WEnd: -7})
			case 1:
				cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, Point: true, At: 0, P: -4}, MemberLoad{Member: m, Point: true, At: l / 3, P: -9})
			case 2:
				cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, Moment: true, At: l / 2, M: 5})
			case 3:
				cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, Thermal: true, DT: 20, DTGrad: 10})
			case 4:
				cs.NodeLoads = append(cs.NodeLoads, NodeLoad{Node: rng.IntN(len(mo.Nodes)), Fx: 10, Fy: -3, M: 2})
			case 5:
				cs.Displacements = []NodeDisplacement{{Node: base, Uy: -0.01}}
			}
		}
		mo.Cases = append(mo.Cases, cs)
	}
	return mo
}

// The per-member access gives, to the last bit, what the per-case calls
// give: the envelope's folding relies on it for the same results.
func TestColumnsAgreeWithPerCaseCalls(t *testing.T) {
	mo := columnsFrame()
	sol := solve(t, mo)
	xs := []float64{0, 0.3, 1.1, 2.5}
	ends := make([][6]float64, len(mo.Cases))
	start := make([]Forces, len(mo.Cases))
	want := make([]Forces, len(xs)*len(mo.Cases))
	got := make([]Forces, len(xs))
	loadedSomewhere := 0
	for m := range mo.Members {
		sol.StartForcesEach(ends, m)
		for c := range mo.Cases {
			if f := sol.EndForces(c, m); [3]float64(f[:3]) != [3]float64(ends[c][:3]) || ends[c][3] != 0 || ends[c][4] != 0 || ends[c][5] != 0 {
				t.Fatalf("member %d case %d: StartForcesEach %v, EndForces %v", m, c, ends[c], f)
			}
		}
		sol.EndForcesEach(ends, m)
		sol.StartLoadsTo(start, m)
		sol.StationsTo(want, m, xs)
		var on []int32
		for c := range mo.Cases {
			if f := sol.EndForces(c, m); f != ends[c] {
				t.Fatalf("member %d case %d: EndForcesEach %v, EndForces %v", m, c, ends[c], f)
			}
			if f := sol.StartLoad(c, m); f != start[c] {
				t.Errorf("member %d case %d: StartLoad %v, StartLoadsTo %v", m, c, f, start[c])
			}
			dg, dw := make([]float64, len(xs)), make([]float64, len(xs))
			sol.DeflectionsFrom(dg, c, m, &ends[c], xs)
			sol.deflectionsOf(dw, c, m, xs)
			if !slices.Equal(dg, dw) {
				t.Errorf("member %d case %d: DeflectionsFrom %v, DeflectionsTo %v", m, c, dg, dw)
			}
			sol.StationsFrom(got, c, m, &ends[c], xs)
			if !slices.Equal(got, want[c*len(xs):(c+1)*len(xs)]) {
				t.Errorf("member %d case %d: StationsFrom %v, StationsTo %v", m, c, got, want[c*len(xs):(c+1)*len(xs)])
			}
			if idx, _ := sol.loadsOn(c, m); len(idx) > 0 {
				on = append(on, int32(c))
			}
		}
		if !slices.Equal(sol.CasesOn(m), on) {
			t.Errorf("member %d: CasesOn %v, want %v", m, sol.CasesOn(m), on)
		}
		loadedSomewhere += len(on)
	}
	if loadedSomewhere == 0 {
		t.Fatal("no member is loaded: the test checks nothing")
	}
}

// The statics check's row sums are the displacements summed case by case,
// in the order given, to the last bit.
func TestRowSumsAreCaseSums(t *testing.T) {
	mo := columnsFrame()
	sol := solve(t, mo)
	cs := []int{5, 0, 3, 1}
	got := make([]float64, 3*len(mo.Nodes))
	sol.rowSums(got, cs)
	settled := false
	for i := range got {
		want := 0.0
		for _, c := range cs {
			want += sol.u(c, i)
		}
		if got[i] != want {
			t.Errorf("component %d: row sum %v, case sum %v", i, got[i], want)
		}
		settled = settled || sol.dof[i] < -1
	}
	if !settled {
		t.Error("no imposed displacement: the test misses that branch")
	}
}

// In second order the per-member access gives, to the last bit, what the
// per-case calls give: StationsFrom then SecondFrom is StationsTo, the
// deflections those of DeflectionsTo, and for a case that does not load
// the member M = −f₂ + x·f₁ + N·Sway, as the envelope folds it. The frame
// has a released end, rigid end zones and a rotational spring.
func TestColumnsAgreeInSecondOrder(t *testing.T) {
	mo := columnsFrame()
	mo.Members[1].Release = ReleaseStart
	mo.Members[2].OffsetStart, mo.Members[2].OffsetEnd = 0.3, 0.2
	mo.Members[4].SpringEnd = 2e4
	axial := make([]float64, len(mo.Members))
	for m := range axial {
		axial[m] = -150 + 20*float64(m%5) // mostly compression, some tension
	}
	axial[3] = 40
	sol, err := SolveWith(mo, Options{Axial: axial})
	if err != nil {
		t.Fatal(err)
	}
	xs := []float64{0, 0.3, 1.1, 2.5, 3.5}
	nc := len(mo.Cases)
	ends := make([][6]float64, nc)
	disp := make([][6]float64, nc)
	want := make([]Forces, len(xs)*nc)
	wantDefl := make([]float64, len(xs)*nc)
	got := make([]Forces, len(xs))
	gotDefl := make([]float64, len(xs))
	w := make([][6]float64, len(xs))
	unloaded := 0
	for m := range mo.Members {
		if sol.Unloaded(m) {
			t.Fatalf("member %d: Unloaded in a second-order solution", m)
		}
		sol.StartForcesEach(ends, m)
		sol.DisplacementsEach(disp, m)
		n := sol.SecondOrderWeightsTo(w, m, xs)
		if n != axial[m] {
			t.Errorf("member %d: axial force %v, solved with %v", m, n, axial[m])
		}
		sol.StationsAndDeflectionsTo(want, wantDefl, m, xs)
		for c := range mo.Cases {
			if u := sol.localU(c, m); u != disp[c] {
				t.Fatalf("member %d case %d: DisplacementsEach %v, localU %v", m, c, disp[c], u)
			}
			sol.StationsFrom(got, c, m, &ends[c], xs)
			sol.SecondFrom(got, gotDefl, c, m, &disp[c], w, xs)
			if !slices.Equal(got, want[c*len(xs):(c+1)*len(xs)]) {
				t.Errorf("member %d case %d: StationsFrom and SecondFrom %v, StationsTo %v", m, c, got, want[c*len(xs):(c+1)*len(xs)])
			}
			if !slices.Equal(gotDefl, wantDefl[c*len(xs):(c+1)*len(xs)]) {
				t.Errorf("member %d case %d: SecondFrom deflections %v, StationsAndDeflectionsTo %v", m, c, gotDefl, wantDefl[c*len(xs):(c+1)*len(xs)])
			}
			if slices.Contains(sol.CasesOn(m), int32(c)) {
				continue
			}
			unloaded++
			f := &ends[c]
			for i, x := range xs {
				if mm := (-f[2] + x*f[1]) + n*Sway(&w[i], &disp[c]); mm != want[c*len(xs)+i].M {
					t.Errorf("member %d case %d x %v: folded M %v, StationsTo %v", m, c, x, mm, want[c*len(xs)+i].M)
				}
			}
		}
	}
	if unloaded == 0 {
		t.Fatal("no case leaves a member unloaded: the fold's formula is not checked")
	}
}
