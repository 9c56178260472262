package envelope

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"strings"
	"testing"
	"time"

	"govern/combos"
	"govern/envelope/internal/cputime"
	"govern/frame"
	"govern/patterns"
)

// valuesTol is the agreement of an enveloped value with its direct sum,
// relative: they add the same terms, perhaps in another order.
const valuesTol = 1e-12

// ValuesRows envelopes each quantity as the direct computation does: with
// a dead case D always at its factor and live cases L1 and L2 only where
// adverse, the largest value of 1.2D + 1.6L1 + 1.6L2 is 1.2d + 1.6
// max(l1, 0) + 1.6 max(l2, 0), and 0.9D gives 0.9d (the rule of
// Settings.Kinds); over more quantities than one worker's share, the same
// on one processor and on several; the error is the first quantity's.
func TestValuesRowsAgainstDirectSums(t *testing.T) {
	sol, err := frame.Solve(twoSpans(8, 20, 15))
	if err != nil {
		t.Fatal(err)
	}
	const n = 3*valuesBlock + 7
	rng := rand.New(rand.NewPCG(11, 0))
	vals := make([][3][3]float64, n) // quantity, case, component
	for i := range vals {
		for c := range 3 {
			for q := range 3 {
				vals[i][c][q] = 100 * (rng.Float64() - 0.5)
			}
		}
	}
	cs := []combos.Combination{
		{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}, {Case: 2, Factor: 1.6}}},
		{Name: "0.9D", Terms: []combos.Term{{Case: 0, Factor: 0.9}}},
	}
	set := Settings{Stations: 2, Kinds: []combos.Kind{combos.Dead, combos.Live, combos.Live}}
	fill := func(i int, row, _ [][3]float64) {
		for c := range row {
			row[c] = vals[i][c]
		}
	}
	what := func(i, q int) string { return fmt.Sprintf("quantity %d, component %d", i, q) }
	run := func(procs int) [][3]Extreme {
		defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
		out, err := ValuesRows(sol, cs, []int{0, 1}, set, nil, n, 3, fill, what)
		if err != nil {
			t.Fatal(err)
		}
		return out
	}
	one, two := run(1), run(2)
	t.Run("direct sums", func(t *testing.T) {
		for i := range n {
			for q := range 3 {
				d, l1, l2 := vals[i][0][q], vals[i][1][q], vals[i][2][q]
				hi := []float64{1.2*d + 1.6*max(l1, 0) + 1.6*max(l2, 0), 0.9 * d}
				lo := []float64{1.2*d + 1.6*min(l1, 0) + 1.6*min(l2, 0), 0.9 * d}
				wantMax, wantMin := max(hi[0], hi[1]), min(lo[0], lo[1])
				x := one[i][q]
				if math.Abs(x.Max-wantMax) > valuesTol*math.Abs(wantMax) || math.Abs(x.Min-wantMin) > valuesTol*math.Abs(wantMin) {
					t.Fatalf("quantity %d, component %d: max %v min %v, direct %v and %v", i, q, x.Max, x.Min, wantMax, wantMin)
				}
				if by := x.MaxBy; hi[by] != wantMax && math.Abs(hi[by]-wantMax) > valuesTol*math.Abs(wantMax) {
					t.Fatalf("quantity %d, component %d: largest by combination %d, direct %v", i, q, by, hi)
				}
			}
		}
	})
	t.Run("one processor or two", func(t *testing.T) {
		for i := range n {
			if fmt.Sprint(one[i]) != fmt.Sprint(two[i]) {
				t.Fatalf("quantity %d: %v on one processor, %v on two", i, one[i], two[i])
			}
		}
	})
	t.Run("one component", func(t *testing.T) {
		first, err := ValuesRows(sol, cs, []int{0, 1}, set, nil, n, 1, fill, what)
		if err != nil {
			t.Fatal(err)
		}
		// The first component's extremes as with three, the others taken
		// as zero in the values acting with them.
		none := Extreme{MaxBy: -1, MinBy: -1}
		for i := range n {
			want := one[i][0]
			want.MaxWith[1], want.MaxWith[2], want.MinWith[1], want.MinWith[2] = 0, 0, 0, 0
			if fmt.Sprint(first[i][0]) != fmt.Sprint(want) || fmt.Sprint(first[i][1]) != fmt.Sprint(none) || fmt.Sprint(first[i][2]) != fmt.Sprint(none) {
				t.Fatalf("quantity %d: %v, with three components %v", i, first[i], one[i])
			}
		}
	})
	t.Run("first error", func(t *testing.T) {
		vals[2*valuesBlock+3][1][2] = math.Inf(1)
		vals[valuesBlock+5][2][0] = math.Inf(-1)
		for _, procs := range []int{1, 2} {
			func() {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				_, err := ValuesRows(sol, cs, []int{0, 1}, set, nil, n, 3, fill, what)
				want := fmt.Sprintf("quantity %d, component 0", valuesBlock+5)
				if !errors.Is(err, ErrNotFinite) || !strings.Contains(err.Error(), want) {
					t.Errorf("%d processors: %v, want the error of %s", procs, err, want)
				}
			}()
		}
	})
}

// The quantities of a patterned layout, placed piece by piece, are
// scanned row by row (scanRow): each must give valueOf's envelope, the
// general path's (itself checked against direct sums above and in the
// exact placement's tests), to the last bit: values, combinations, forces
// acting with them, counts and lists of pieces, on one processor and on
// two. The rows are the nodes' displacements of a solved frame, and rows
// of random values with round-off, zeros and repeated sizes, where the
// seeded ranking must fall back to the full one, some with every piece
// near the round-off. As a check of its own,
// the largest of 1.2D + 1.6L + 0.5Lr over random rows is 1.2d plus the
// factored sums of each live load's rest where positive and of its
// pieces that are positive past the round-off (exact placement,
// docs/patterns.md: by superposition the sum of the adverse pieces is the
// worst arrangement), within valuesTol.
func TestValuesRowsPlacedByRows(t *testing.T) {
	lay, err := patterns.Expand(regularFrame(6, 8), []int{1, 2}, 1, patterns.Exact)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	mo := lay.Model
	cs := frameCombos()
	idx := []int{0, 1, 2, 3, 4, 5}
	what := func(i, q int) string { return fmt.Sprintf("quantity %d, component %d", i, q) }
	const n = 3*valuesBlock + 5
	nc := len(mo.Cases)
	rows := make([][][3]float64, n)
	rng := rand.New(rand.NewPCG(7, 3))
	for i := range rows {
		rows[i] = make([][3]float64, nc)
		for c := range rows[i] {
			for q := range 3 {
				switch k := rng.IntN(10); {
				case k == 0:
					rows[i][c][q] = 0
				case k == 1:
					rows[i][c][q] = 1e-12 * (rng.Float64() - 0.5) // round-off
				case k == 2:
					rows[i][c][q] = float64(rng.IntN(5)) - 2 // repeated sizes
				default:
					rows[i][c][q] = math.Ldexp(rng.Float64()-0.5, rng.IntN(8*(1+i%3)))
				}
				if i%5 == 0 && c > 0 {
					// Every piece near the round-off of a large wind load
					// (below): some past it, some not, and the ranking's
					// seed from the row before far too high.
					rows[i][c][q] = 3e-9 * (2*rng.Float64() - 1)
				}
			}
		}
		if i%5 == 4 {
			// Every piece of L positive and large: the ranking of the
			// row after is seeded far above its pieces.
			for _, u := range lay.Patterned[0].Units {
				rows[i][u.Column] = [3]float64{1 + rng.Float64(), 1 + rng.Float64(), 1 + rng.Float64()}
			}
		}
		if i%5 == 0 {
			// No dead load and a large wind: the combinations with W and
			// L govern, and list L's pieces.
			rows[i][0], rows[i][3] = [3]float64{}, [3]float64{1, -1, 1}
			for _, u := range lay.Patterned[1].Units {
				rows[i][u.Column] = [3]float64{} // Lr's pieces none, L's alone listed
			}
		}
	}
	random := func(i int, row, _ [][3]float64) { copy(row, rows[i]) }
	nodes := func(v int, row, _ [][3]float64) { sol.DisplacementsTo(row, v) }
	for _, tc := range []struct {
		name    string
		n       int
		effects int
		fill    func(i int, row, tmp [][3]float64)
		set     Settings
	}{
		{"nodes", len(mo.Nodes), 3, nodes, Settings{}},
		{"nodes, every piece listed", len(mo.Nodes), 3, nodes, Settings{AllSpans: true}},
		{"random rows", n, 3, random, Settings{}},
		{"random rows, one component", n, 1, random, Settings{}},
		{"random rows, one component, every piece listed", n, 1, random, Settings{AllSpans: true}},
		{"random rows, two components", n, 2, random, Settings{}},
		{"random rows, every piece listed", n, 3, random, Settings{AllSpans: true}},
		{"random rows, L and Lr joined", n, 3, random, Settings{Groups: []int{-1, 0, 0, -1}}},
		{"random rows, as written", n, 3, random, Settings{AsWritten: true}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			set := tc.set
			set.Kinds, set.Stations = kindsOf(sol, lay), 2
			e := newEvaluator(mo, cs, idx, tc.effects, set, lay)
			w := e.scratch()
			if newRowScan(e, w) == nil {
				t.Fatal("the rows are not scanned by scanRow")
			}
			want := make([]string, tc.n)
			for i := range tc.n {
				tc.fill(i, w.ev, nil)
				for c := range w.ev { // the components past the effects taken as zero
					for q := tc.effects; q < 3; q++ {
						w.ev[c][q] = 0
					}
				}
				x, ok := valueOf(e, w)
				if !ok {
					t.Fatalf("quantity %d is not finite", i)
				}
				want[i] = fmt.Sprintf("%#v", x)
			}
			for _, procs := range []int{1, 2} {
				func() {
					defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
					got, err := ValuesRows(sol, cs, idx, set, lay, tc.n, tc.effects, tc.fill, what)
					if err != nil {
						t.Fatal(err)
					}
					for i := range tc.n {
						if g := fmt.Sprintf("%#v", got[i]); g != want[i] {
							t.Fatalf("%d processors, quantity %d:\n%s\nvalueOf:\n%s", procs, i, g, want[i])
						}
					}
				}()
			}
		})
	}
	t.Run("direct sums", func(t *testing.T) {
		set := Settings{Kinds: kindsOf(sol, lay), Stations: 2}
		got, err := ValuesRows(sol, cs, idx, set, lay, n, 3, random, what)
		if err != nil {
			t.Fatal(err)
		}
		for i := range n {
			for q := range 3 {
				big := 0.0
				for c := range nc {
					big = max(big, math.Abs(rows[i][c][q]))
				}
				noise := big * roundOff
				want := 1.2 * rows[i][0][q]
				for p, f := range []float64{1.6, 0.5} {
					pc := lay.Patterned[p]
					// The case's rest (its loads that are not pieces)
					// where adverse, then its adverse pieces.
					want += f * max(rows[i][pc.Case][q], 0)
					for _, u := range pc.Units {
						if x := rows[i][u.Column][q]; x > noise {
							want += f * x
						}
					}
				}
				x := got[i][q]
				if x.MaxBy == 1 && math.Abs(x.Max-want) > valuesTol*math.Abs(want) {
					t.Fatalf("quantity %d, component %d: largest %v by 1.2D+1.6L+0.5Lr, direct %v", i, q, x.Max, want)
				}
				if x.MaxBy != 1 && x.Max < want-valuesTol*math.Abs(want) {
					t.Fatalf("quantity %d, component %d: largest %v, below 1.2D+1.6L+0.5Lr's %v", i, q, x.Max, want)
				}
			}
		}
	})
}

// BenchmarkValuesRows measures the node displacement envelopes of
// regularFrame (every node's ux, uy, rz over the combinations of
// frameCombos, the live loads L and Lr placed piece by piece) and the
// envelopes of the columns' drifts (one component), as the analysis asks
// for them; "general" without scanRow (valueOf's path).
func BenchmarkValuesRows(b *testing.B) {
	cs := frameCombos()
	idx := make([]int, len(cs))
	for k := range idx {
		idx[k] = k
	}
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		lay, err := patterns.Expand(regularFrame(size.bays, size.storeys), []int{1, 2}, 1, patterns.Exact)
		if err != nil {
			b.Fatal(err)
		}
		sol, err := frame.Solve(lay.Model)
		if err != nil {
			b.Fatal(err)
		}
		mo := lay.Model
		set := Settings{Kinds: kindsOf(sol, lay), Stations: 2}
		what := func(i, q int) string { return fmt.Sprint(i, q) }
		var cols []int
		for m, mem := range mo.Members {
			if mo.Nodes[mem.Start].X == mo.Nodes[mem.End].X {
				cols = append(cols, m)
			}
		}
		for _, rows := range []bool{false, true} {
			name := fmt.Sprintf("%dx%d/rows", size.bays, size.storeys)
			if !rows {
				name = fmt.Sprintf("%dx%d/general", size.bays, size.storeys)
			}
			rowScans = rows
			b.Run("nodes/"+name, func(b *testing.B) {
				b.ReportAllocs()
				defer reportCPU(b, cputime.Now())
				for b.Loop() {
					if _, err := ValuesRows(sol, cs, idx, set, lay, len(mo.Nodes), 3, func(v int, row, _ [][3]float64) { sol.DisplacementsTo(row, v) }, what); err != nil {
						b.Fatal(err)
					}
				}
			})
			b.Run("drifts/"+name, func(b *testing.B) {
				b.ReportAllocs()
				defer reportCPU(b, cputime.Now())
				for b.Loop() {
					fill := func(i int, row, tmp [][3]float64) {
						mem := mo.Members[cols[i]]
						sol.DisplacementsTo(row, mem.End)
						sol.DisplacementsTo(tmp, mem.Start)
						for c := range row {
							row[c] = [3]float64{row[c][0] - tmp[c][0]}
						}
					}
					if _, err := ValuesRows(sol, cs, idx, set, lay, len(cols), 1, fill, what); err != nil {
						b.Fatal(err)
					}
				}
			})

		}
		rowScans = true
	}
}

// reportCPU reports the processor time used since start, per iteration of
// b, as cpu-ns/op.
func reportCPU(b *testing.B, start time.Duration) {
	b.ReportMetric(float64(cputime.Now()-start)/float64(b.N), "cpu-ns/op")
}

// TestClassify3 checks the pass over a row's units for the three effects
// at once (rowScan.classify3, with AVX and without) against the
// definition, effect by effect, bit for bit: the sums of the components
// of the units whose effect j is positive past the round-off and of
// those of neither sign, in the order of the units, the sums of all, the
// counts of each sign, and the units listed for ranking (of a sign, and
// reaching its threshold), in order. The units have effects of either
// sign, at and near the round-off and zeros of either sign.
func TestClassify3(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 17))
	nz := [3]float64{1e-3, 2e-3, 0}
	num := func(j int) float64 {
		switch rng.IntN(12) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return nz[j]
		case 3:
			return -nz[j]
		case 4:
			return nz[j] * rng.Float64()
		case 5:
			return 0.5 // at the thresholds below
		case 6:
			return -0.25
		}
		return rng.NormFloat64()
	}
	thr := [3][2]float64{{0.5, 0.25}, {0.5, 0.25}, {1, 2}}
	for _, nu := range []int{0, 1, 2, 7, 400} {
		for _, avx := range []bool{false, true} {
			if avx && !hasAVXHere() {
				continue
			}
			units := make([][3]float64, nu)
			for u := range units {
				units[u] = [3]float64{num(0), num(1), num(2)}
			}
			rs := &rowScan{}
			for j := range rs.list {
				rs.list[j] = make([]int32, nu)
			}
			var pos [3][2][3]float64
			var zero [3][3]float64
			var tot [3]float64
			var count [3][2]int
			func() {
				defer func(v bool) { useAVX = v }(useAVX)
				useAVX = avx
				listed := rs.classify3(units, &nz, &thr, &pos, &zero, &tot, &count)
				var wantTot [3]float64
				for _, v := range units {
					for q := range 3 {
						wantTot[q] += v[q]
					}
				}
				if !sameBits(tot[:], wantTot[:]) {
					t.Errorf("%d units, AVX %v: sums %v, want %v", nu, avx, tot, wantTot)
				}
				for j := range 3 {
					var wantPos, wantZero [3]float64
					var wantCount [2]int
					var wantList []int32
					for u, v := range units {
						x := v[j]
						switch {
						case x > nz[j]:
							for q := range 3 {
								wantPos[q] += v[q]
							}
							wantCount[0]++
							if x >= thr[j][0] {
								wantList = append(wantList, int32(u))
							}
						case x < -nz[j]:
							wantCount[1]++
							if -x >= thr[j][1] {
								wantList = append(wantList, int32(u))
							}
						default:
							for q := range 3 {
								wantZero[q] += v[q]
							}
						}
					}
					got := rs.list[j][:listed[j]]
					if !sameBits(pos[j][0][:], wantPos[:]) || !sameBits(zero[j][:], wantZero[:]) || count[j] != wantCount || !slices.Equal(got, wantList) {
						t.Errorf("%d units, AVX %v, effect %d: %v %v %v %v, want %v %v %v %v", nu, avx, j, pos[j][0], zero[j], count[j], got, wantPos, wantZero, wantCount, wantList)
					}
				}
			}()
		}
	}
}

// TestLargestSigns checks the largest positive value and the largest size
// of a negative one of each component of a row's units, with AVX
// (largestSigns), against the definition value by value: +0 for none (a
// zero of either sign counts as neither), infinities as they are, and a
// NaN for both where some value of the component is a NaN.
func TestLargestSigns(t *testing.T) {
	if !hasAVXHere() {
		t.Skip("no AVX")
	}
	rng := rand.New(rand.NewPCG(11, 3))
	for trial := range 300 {
		nu := 1 + rng.IntN(40)
		units := make([][3]float64, nu)
		for u := range units {
			for q := range 3 {
				switch rng.IntN(30) {
				case 0:
					units[u][q] = math.NaN()
				case 1:
					units[u][q] = math.Inf(1)
				case 2:
					units[u][q] = math.Inf(-1)
				case 3, 4:
					units[u][q] = math.Copysign(0, -1)
				case 5, 6:
					units[u][q] = 0
				default:
					units[u][q] = rng.NormFloat64() * math.Pow(10, float64(rng.IntN(9)-4))
				}
			}
		}
		if trial%3 == 0 { // every value of component 1 negative
			for u := range units {
				units[u][1] = -math.Abs(units[u][1]) - 1
			}
		}
		p0, p1, p2, n0, n1, n2 := largestSigns(units)
		got := [3][2]uint64{{p0, n0}, {p1, n1}, {p2, n2}}
		for q := range 3 {
			var pos, neg float64 // +0
			nan := false
			for _, v := range units {
				x := v[q]
				switch {
				case math.IsNaN(x):
					nan = true
				case x > pos:
					pos = x
				case -x > neg:
					neg = -x
				}
			}
			want := [2]uint64{math.Float64bits(pos), math.Float64bits(neg)}
			if nan {
				if !math.IsNaN(math.Float64frombits(got[q][0])) || !math.IsNaN(math.Float64frombits(got[q][1])) {
					t.Errorf("trial %d, component %d: %v, want NaN", trial, q, got[q])
				}
				continue
			}
			if got[q] != want {
				t.Errorf("trial %d, component %d: %v %v, want %v %v", trial, q,
					math.Float64frombits(got[q][0]), math.Float64frombits(got[q][1]), pos, neg)
			}
		}
	}
}
