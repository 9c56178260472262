package envelope

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
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
		none := Extreme{MaxBy: -1, MinBy: -1}
		for i := range n {
			if fmt.Sprint(first[i][0]) != fmt.Sprint(one[i][0]) || fmt.Sprint(first[i][1]) != fmt.Sprint(none) || fmt.Sprint(first[i][2]) != fmt.Sprint(none) {
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
