package reduction

import (
	"fmt"
	"math"
	"testing"

	"govern/envelope/analysis"
	"govern/frame"
	"govern/frame/units"
)

// building is a plane frame of bays bays of width bay and storeys storeys
// of height h, fixed at the base, in units of length scaled by s (1 for
// metres), with one live case loading the beams of the levels in loaded
// (1 the first floor). top, when not nil, gives for each column line the
// highest level its columns reach (a setback); beams run only between
// lines that reach their level.
type building struct {
	mo     *frame.Model
	col    map[[2]int]int // column of line i in storey k (1 the lowest)
	beam   map[[2]int]int // beam of bay i at level k
	loaded []bool
}

func newBuilding(bays, storeys int, bay, h, s float64, loaded []int, top []int) *building {
	b := &building{mo: &frame.Model{Sections: []frame.Section{{Name: "S", E: 30e6 / (s * s), A: 0.2 * s * s, I: 5e-3 * s * s * s * s}}},
		col: map[[2]int]int{}, beam: map[[2]int]int{}}
	mo := b.mo
	reach := func(i int) int {
		if top == nil {
			return storeys
		}
		return top[i]
	}
	node := map[[2]int]int{}
	for k := 0; k <= storeys; k++ {
		for i := 0; i <= bays; i++ {
			if k > reach(i) {
				continue
			}
			sup := frame.Free
			if k == 0 {
				sup = frame.Fixed
			}
			node[[2]int{i, k}] = len(mo.Nodes)
			mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprintf("%d-%d", i, k), X: float64(i) * bay * s, Y: float64(k) * h * s, Support: sup})
		}
	}
	for k := 1; k <= storeys; k++ {
		for i := 0; i <= bays; i++ {
			if k > reach(i) {
				continue
			}
			b.col[[2]int{i, k}] = len(mo.Members)
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("C%d-%d", i, k), Start: node[[2]int{i, k - 1}], End: node[[2]int{i, k}]})
		}
		for i := 0; i < bays; i++ {
			if k > reach(i) || k > reach(i+1) {
				continue
			}
			b.beam[[2]int{i, k}] = len(mo.Members)
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("B%d-%d", i, k), Start: node[[2]int{i, k}], End: node[[2]int{i + 1, k}]})
		}
	}
	b.loaded = make([]bool, len(mo.Members))
	c := frame.Case{Name: "L"}
	for _, k := range loaded {
		for i := 0; i < bays; i++ {
			if m, ok := b.beam[[2]int{i, k}]; ok {
				b.loaded[m] = true
				w := 2.4 * 9 / s // kN/m² × 9 m, in kN per model length
				c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, To: mo.Length(m), W: w, WEnd: w})
			}
		}
	}
	mo.Cases = []frame.Case{c}
	return b
}

// factorOf returns member m's factor in fs.
func factorOf(t *testing.T, fs []analysis.MemberFactor, m int) analysis.MemberFactor {
	t.Helper()
	for _, f := range fs {
		if f.Member == m {
			return f
		}
	}
	t.Fatalf("member %d has no factor", m)
	return analysis.MemberFactor{}
}

func hasFactor(fs []analysis.MemberFactor, m int) bool {
	for _, f := range fs {
		if f.Member == m {
			return true
		}
	}
	return false
}

func metres(t *testing.T) units.System {
	t.Helper()
	sys, err := units.NewSystem("kN", "m", "")
	if err != nil {
		t.Fatal(err)
	}
	return sys
}

// ASCE/SEI 7-16 4.7.2 on a frame of three 9 m bays (tributary width 9 m)
// with three loaded floors and an unloaded roof: the interior columns
// support 1, 2 and 3 floors of 81 m² (K_LL = 4): 324, 648 and 972 m²,
// factors 0.5039, 0.4295 and 0.40 (raw 0.3966, the limit governs).
func TestColumnFactors(t *testing.T) {
	b := newBuilding(3, 4, 9, 3.5, 1, []int{1, 2, 3}, nil)
	c := Case{Case: 0, Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: b.loaded}
	fs := Factors(b.mo, metres(t), nil, c)
	for _, tc := range []struct {
		name   string
		m      int
		want   float64
		floors int
		area   float64
	}{
		{"third storey interior, one floor", b.col[[2]int{1, 3}], 0.5039, 1, 81},
		{"second storey interior, two floors", b.col[[2]int{1, 2}], 0.4295, 2, 162},
		{"first storey interior, three floors", b.col[[2]int{2, 1}], 0.40, 3, 243},
		// Exterior column, half a bay: 40.5 m² a floor, K_LL = 4 (Table
		// 4.7-1, exterior without cantilever slabs): one floor 162 m²,
		// 0.25 + 4.57/√162 = 0.6091.
		{"third storey exterior, half bay", b.col[[2]int{0, 3}], 0.6091, 1, 40.5},
		// Interior beam, 9 m span × 9 m: K_LL = 2, 162 m²: 0.6091.
		{"interior beam", b.beam[[2]int{1, 2}], 0.6091, 1, 81},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f := factorOf(t, fs, tc.m)
			if !near(f.N, tc.want, ruleTol) || f.Basis.Floors != tc.floors || !near(f.Basis.Area, tc.area, 1e-9) {
				t.Errorf("N factor %.5f, %d floors, A_T %g; want %.4f, %d, %g", f.N, f.Basis.Floors, f.Basis.Area, tc.want, tc.floors, tc.area)
			}
		})
	}
	t.Run("column V and M by the one-floor rule", func(t *testing.T) {
		// First storey interior: the floor at its top (81 m², one floor)
		// gives 0.5039; nothing at its base: 0.5039.
		f := factorOf(t, fs, b.col[[2]int{1, 1}])
		if !near(f.V, 0.5039, ruleTol) || f.M != f.V || f.Basis.Ends != OneFloorRule {
			t.Errorf("V %g M %g (%s), want 0.5039", f.V, f.M, f.Basis.Ends)
		}
	})
	t.Run("roof beam not reduced under floor live load", func(t *testing.T) {
		// The floor case does not load the roof: no factor, not reduced.
		if m := b.beam[[2]int{1, 4}]; hasFactor(fs, m) {
			t.Errorf("roof beam has a factor: %+v", factorOf(t, fs, m))
		}
		// The top storey column carries no floor of the case.
		if m := b.col[[2]int{1, 4}]; hasFactor(fs, m) {
			t.Errorf("top storey column has a factor: %+v", factorOf(t, fs, m))
		}
	})
}

// A setback: column line 3 stops at level 1, so the floors above it are
// not counted for the columns below (ASCE/SEI 7-16 4.7.2: the area the
// column supports). Its first storey column carries half of bay 3 at
// level 1 only: 40.5 m², K_LL·A_T = 162 m², 0.6091, one floor.
func TestSetbackColumn(t *testing.T) {
	b := newBuilding(3, 3, 9, 3.5, 1, []int{1, 2, 3}, []int{3, 3, 3, 1})
	fs := Factors(b.mo, metres(t), nil, Case{Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: b.loaded})
	f := factorOf(t, fs, b.col[[2]int{3, 1}])
	if !near(f.N, 0.6091, ruleTol) || f.Basis.Floors != 1 {
		t.Errorf("setback column: %.5f, %d floors; want 0.6091, 1", f.N, f.Basis.Floors)
	}
	// The column of line 2 carries half of bays 1 and 2 at level 1 (81 m²)
	// and half of bay 1 above, where bay 2 is set back (40.5 m² at levels
	// 2 and 3): 162 m², three floors, K_LL·A_T = 648 m²: 0.4295.
	g := factorOf(t, fs, b.col[[2]int{2, 1}])
	if !near(g.N, 0.4295, ruleTol) || g.Basis.Floors != 3 || !near(g.Basis.Area, 162, 1e-9) {
		t.Errorf("column under the setback: %.5f, %d floors, %g; want 0.4295, 3, 162", g.N, g.Basis.Floors, g.Basis.Area)
	}
}

// The factors do not depend on the units the model is written in: the
// 9 m × 9 m interior column with one floor is 0.5039 in kN and m, N and
// mm, kip and ft (ASCE/SEI 7-16 Eq. 4.7-1, SI form).
func TestFactorsInAnyUnits(t *testing.T) {
	for _, u := range []struct{ force, length string }{{"kN", "m"}, {"N", "mm"}, {"kip", "ft"}} {
		t.Run(u.force+"-"+u.length, func(t *testing.T) {
			sys, err := units.NewSystem(u.force, u.length, "")
			if err != nil {
				t.Fatal(err)
			}
			s := 1 / sys.SI(units.Length.Dim) // model lengths per metre
			p := 2.4e3 / sys.SI(units.Pressure.Dim)
			b := newBuilding(3, 4, 9, 3.5, s, []int{1, 2, 3}, nil)
			fs := Factors(b.mo, sys, nil, Case{Rule: ASCE716, Lo: p, Width: 9 * s, Loaded: b.loaded})
			f := factorOf(t, fs, b.col[[2]int{1, 3}])
			if !near(f.N, 0.25+4.57/18, 1e-12) {
				t.Errorf("factor %.6f, want 0.503889", f.N)
			}
		})
	}
}

// EN 1991-1-1 6.3.1.2(11): a first storey column under three loaded
// floors of category B (ψ0 0.7) takes αn = 0.90 where the imposed load
// leads and 1.0 where it accompanies; "smaller" takes min(αA, αn) where
// it leads and αA elsewhere. Beams take αA: 81 m², 0.5 + 10/81 = 0.6235.
func TestEN1991Factors(t *testing.T) {
	b := newBuilding(3, 4, 9, 3.5, 1, []int{1, 2, 3}, nil)
	c := Case{Rule: EN1991, Width: 9, Loaded: b.loaded, Category: "B", Psi0: 0.7}
	fs := Factors(b.mo, metres(t), nil, c)
	col := factorOf(t, fs, b.col[[2]int{1, 1}])
	if !near(col.N, 0.9, 1e-12) || !col.HasAccompanying || col.Accompanying[0] != 1 {
		t.Errorf("column: αn %g, accompanying %v %v; want 0.9 and 1", col.N, col.HasAccompanying, col.Accompanying)
	}
	beam := factorOf(t, fs, b.beam[[2]int{1, 1}])
	if want := 0.5 + 10.0/81; !near(beam.N, want, 1e-12) || beam.HasAccompanying {
		t.Errorf("beam: αA %g, want %g in every combination", beam.N, want)
	}
	c.Smaller = true
	col = factorOf(t, Factors(b.mo, metres(t), nil, c), b.col[[2]int{1, 1}])
	// A = 243 m²: αA = 0.5 + 10/243 = 0.5412 < αn 0.9.
	if a := 0.5 + 10.0/243; !near(col.N, a, 1e-12) || col.HasAccompanying && !near(col.Accompanying[0], a, 1e-12) {
		t.Errorf("smaller: %g, accompanying %v; want %g in both", col.N, col.Accompanying, a)
	}
}

// Node loads standing for an area load Lo (the case's lo): a load of
// 2.4 × 81 kN at the top of the interior third storey column stands for
// 81 m², one floor: 0.5039 (ASCE/SEI 7-16 Eq. 4.7-1).
func TestNodeLoadArea(t *testing.T) {
	b := newBuilding(3, 4, 9, 3.5, 1, nil, nil)
	top := b.mo.Members[b.col[[2]int{1, 3}]].End
	area := make([]float64, len(b.mo.Nodes))
	area[top] = 2.4 * 81 / 2.4
	fs := Factors(b.mo, metres(t), nil, Case{Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: b.loaded, NodeArea: area})
	if f := factorOf(t, fs, b.col[[2]int{1, 3}]); !near(f.N, 0.25+4.57/18, 1e-12) || f.Basis.Floors != 1 {
		t.Errorf("column under the node load: %+v", f)
	}
}

// Odd geometry: every member drawn the other way (columns from top to
// bottom, beams right to left) gives the same factors; a cantilever beam
// carries its whole area to the column at its root (K_LL 1, Table 4.7-1);
// a gable's rafters carry their whole plan area to the eave columns.
func TestFactorsOddGeometry(t *testing.T) {
	t.Run("members drawn the other way", func(t *testing.T) {
		b := newBuilding(3, 4, 9, 3.5, 1, []int{1, 2, 3}, nil)
		want := Factors(b.mo, metres(t), nil, Case{Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: b.loaded})
		for m := range b.mo.Members {
			mem := &b.mo.Members[m]
			mem.Start, mem.End = mem.End, mem.Start
		}
		got := Factors(b.mo, metres(t), nil, Case{Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: b.loaded})
		if len(got) != len(want) {
			t.Fatalf("%d factors, want %d", len(got), len(want))
		}
		for i := range got {
			if got[i] != want[i] {
				t.Errorf("member %s: %+v, want %+v", b.mo.Members[got[i].Member].Name, got[i], want[i])
			}
		}
	})
	t.Run("cantilever", func(t *testing.T) {
		// One bay of 9 m with a 3 m cantilever beyond column B, one
		// storey, 9 m wide: column B carries half the bay (40.5 m²) and
		// the whole cantilever (27 m²): 67.5 m², K_LL 4: 270 m², 0.5281;
		// the cantilever beam 27 m², K_LL 1: below 37.16 m², not reduced.
		mo := &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}},
			Nodes: []frame.Node{{Name: "a0", Support: frame.Fixed}, {Name: "a1", Y: 3.5}, {Name: "b0", X: 9, Support: frame.Fixed},
				{Name: "b1", X: 9, Y: 3.5}, {Name: "c1", X: 12, Y: 3.5}},
			Members: []frame.Member{{Name: "a", Start: 0, End: 1}, {Name: "b", Start: 2, End: 3}, {Name: "ab", Start: 1, End: 3}, {Name: "bc", Start: 3, End: 4}},
		}
		fs := Factors(mo, metres(t), nil, Case{Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: []bool{false, false, true, true}})
		if f := factorOf(t, fs, 1); !near(f.N, 0.25+4.57/math.Sqrt(270), 1e-12) || !near(f.Basis.Area, 67.5, 1e-12) {
			t.Errorf("column b: %+v", f)
		}
		if f := factorOf(t, fs, 3); f.N != 1 || f.Basis.KLL != 1 || f.Basis.Limit != string(SmallArea) {
			t.Errorf("cantilever: %+v", f)
		}
	})
	t.Run("gable", func(t *testing.T) {
		// Eaves at x = 0 and 12 m, ridge at 6 m, 9 m wide: each eave
		// column carries its rafter's 6 m × 9 m = 54 m² in plan.
		mo := &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}},
			Nodes: []frame.Node{{Name: "a0", Support: frame.Fixed}, {Name: "a1", Y: 4}, {Name: "r", X: 6, Y: 5.5},
				{Name: "b1", X: 12, Y: 4}, {Name: "b0", X: 12, Support: frame.Fixed}},
			Members: []frame.Member{{Name: "a", Start: 0, End: 1}, {Name: "ar", Start: 1, End: 2}, {Name: "rb", Start: 2, End: 3}, {Name: "b", Start: 4, End: 3}},
		}
		fs := Factors(mo, metres(t), nil, Case{Rule: ASCE716, Roof: true, Lo: 0.96, Width: 9, Loaded: []bool{false, true, true, false}})
		for _, m := range []int{0, 3} {
			if f := factorOf(t, fs, m); !near(f.Basis.Area, 54, 1e-12) {
				t.Errorf("column %s: A_T %g, want 54", mo.Members[m].Name, f.Basis.Area)
			}
		}
	})
}
