package modelfile

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// randomPoints returns n points in clusters: most far apart, some within
// the tolerance of another, with others placed between them in X or Y, and
// some at large coordinates, where the tolerance is near the spacing of
// floating-point numbers.
func randomPoints(rng *rand.Rand, n int, scale float64) (xs, ys []float64) {
	for len(xs) < n {
		x, y := scale*rng.Float64(), scale*rng.Float64()
		switch rng.IntN(4) {
		case 0: // a near pair with a third point between them in X
			d := coordTol * rng.Float64()
			xs = append(xs, x, x+d/2, x+d)
			ys = append(ys, y, y+1, y)
		case 1: // a near pair in Y
			d := coordTol * (0.5 + rng.Float64())
			xs = append(xs, x, x)
			ys = append(ys, y, y+d)
		default:
			xs = append(xs, x)
			ys = append(ys, y)
		}
	}
	return xs, ys
}

// TestNearPointsFindsEveryPair: the cell search finds, for every point,
// the first earlier point within the tolerance, as a search of every pair
// does, whatever order the points come in.
func TestNearPointsFindsEveryPair(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 8))
	for _, scale := range []float64{1, 100, 1e7, 1e12} {
		t.Run(fmt.Sprintf("coordinates up to %g", scale), func(t *testing.T) {
			xs, ys := randomPoints(rng, 600, scale)
			rng.Shuffle(len(xs), func(i, j int) { xs[i], xs[j], ys[i], ys[j] = xs[j], xs[i], ys[j], ys[i] })
			want := make([]int, len(xs))
			pairs := 0
			for j := range xs {
				want[j] = -1
				for i := range j {
					if math.Hypot(xs[j]-xs[i], ys[j]-ys[i]) <= coordTol {
						want[j] = i
						pairs++
						break
					}
				}
			}
			if pairs == 0 && scale < 1e12 {
				t.Fatal("no near pairs: the test cannot fail")
			}
			got := make([]int, len(xs))
			for j := range got {
				got[j] = -1
			}
			nearPoints(xs, ys, coordTol, func(i, j int) bool {
				if got[j] < 0 || i < got[j] {
					got[j] = i
				}
				return false
			})
			if !slices.Equal(got, want) {
				for j := range got {
					if got[j] != want[j] {
						t.Errorf("point %d (%g, %g): first near point %d, want %d", j, xs[j], ys[j], got[j], want[j])
					}
				}
			}
		})
	}
}

// TestPointsOnSegments: the cell search finds every point that lies on a
// segment's interior, as a test of every point against every segment does.
func TestPointsOnSegments(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 7))
	const n = 400
	xs, ys := make([]float64, n), make([]float64, n)
	for i := range xs { // a 20 × 20 lattice of unit spacing
		xs[i], ys[i] = float64(i%20), float64(i/20)
	}
	var segs [][2]int
	for range 300 { // horizontal, vertical and sloping members of 1 to 6 bays
		a := rng.IntN(n)
		dx, dy := rng.IntN(7)-3, rng.IntN(7)-3
		if dx == 0 && dy == 0 {
			continue
		}
		if bx, by := a%20+dx, a/20+dy; bx >= 0 && bx < 20 && by >= 0 && by < 20 {
			segs = append(segs, [2]int{a, by*20 + bx})
		}
	}
	// One very long member among short ones.
	xs, ys = append(xs, -1e6), append(ys, 5)
	segs = append(segs, [2]int{n, 5*20 + 19})
	type hit struct{ seg, point int }
	var want []hit
	for s, e := range segs {
		ax, ay, bx, by := xs[e[0]], ys[e[0]], xs[e[1]], ys[e[1]]
		l := math.Hypot(bx-ax, by-ay)
		for p := range xs {
			if p == e[0] || p == e[1] {
				continue
			}
			along := ((xs[p]-ax)*(bx-ax) + (ys[p]-ay)*(by-ay)) / l
			off := math.Abs((xs[p]-ax)*(by-ay)-(ys[p]-ay)*(bx-ax)) / l
			if off <= coordTol && along > coordTol && along < l-coordTol {
				want = append(want, hit{s, p})
			}
		}
	}
	if len(want) == 0 {
		t.Fatal("no point on a segment: the test cannot fail")
	}
	var got []hit
	pointsOnSegments(xs, ys, segs, coordTol, func(s, p int, _ float64) { got = append(got, hit{s, p}) })
	cmp := func(a, b hit) int {
		if a.seg != b.seg {
			return a.seg - b.seg
		}
		return a.point - b.point
	}
	slices.SortFunc(got, cmp)
	slices.SortFunc(want, cmp)
	if !slices.Equal(got, want) {
		t.Errorf("found %d points on members, want %d:\n got %v\nwant %v", len(got), len(want), got, want)
	}
}

// BenchmarkPositionChecks times the two cell searches on regular frames of
// growing size, to show that they grow with the model, not its square.
func BenchmarkPositionChecks(b *testing.B) {
	for _, side := range []int{30, 100, 300} {
		var xs, ys []float64
		for lv := range side + 1 {
			for ln := range side + 1 {
				xs, ys = append(xs, 7.2*float64(ln)), append(ys, 3.6*float64(lv))
			}
		}
		id := func(ln, lv int) int { return lv*(side+1) + ln }
		var segs [][2]int
		for lv := 1; lv <= side; lv++ {
			for ln := range side + 1 {
				segs = append(segs, [2]int{id(ln, lv-1), id(ln, lv)})
				if ln > 0 {
					segs = append(segs, [2]int{id(ln-1, lv), id(ln, lv)})
				}
			}
		}
		b.Run(fmt.Sprintf("%dx%d", side, side), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				nearPoints(xs, ys, coordTol, func(int, int) bool { return false })
				pointsOnSegments(xs, ys, segs, coordTol, func(int, int, float64) {})
			}
		})
	}
}
