package envelope

import (
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"govern/frame"
)

// TestMomentTableIsDirect checks the table of second-order moments
// (momentTable, with AVX where the processor has it, and the pure-Go
// loop) against each unit's M formed directly, one station at a time, as
// the unfolded path forms it: (M₀ + x·V) + N·frame.Sway(Hᵢ, u), with
// H₀ = H₃ = 0. The numbers must be the same to the last bit (no
// tolerance: the same operations in the same order), and so must each
// row's sum of the units in their order from +0 and the largest size
// (NaN left out). The data are random (fixed seed), with zeros of either
// sign, repeated values and sizes from 1e-300 to 1e300; the counts of
// stations cover groups of four with every remainder.
func TestMomentTableIsDirect(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	num := func() float64 {
		switch rng.IntN(8) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return 1.5
		case 3:
			return math.Ldexp(rng.NormFloat64(), rng.IntN(1990)-995)
		}
		return rng.NormFloat64() * 100
	}
	for _, ns := range []int{1, 2, 3, 4, 5, 8, 11, 13} {
		for _, nu := range []int{0, 1, 3, 17, 200} {
			t.Run(fmt.Sprintf("%d stations, %d units", ns, nu), func(t *testing.T) {
				xs := make([]float64, ns)
				wts := make([][6]float64, ns)
				for i := range xs {
					xs[i] = float64(i) * 0.7
					wts[i] = [6]float64{0, num(), num(), 0, num(), num()}
				}
				n := num()
				a, v, d := make([]float64, nu), make([]float64, nu), make([][6]float64, nu)
				for u := range nu {
					a[u], v[u] = num(), num()
					for k := range d[u] {
						d[u][k] = num()
					}
				}
				want := make([]float64, ns*nu)
				wantTot := make([]float64, ns)
				wantBig := 0.25 // the largest so far, passed in
				for i, x := range xs {
					for u := range nu {
						mm := (a[u] + x*v[u]) + n*frame.Sway(&wts[i], &d[u])
						want[i*nu+u] = mm
						wantTot[i] += mm
						if s := math.Abs(mm); s > wantBig {
							wantBig = s
						}
					}
				}
				for _, avx := range []bool{false, true} {
					if avx && !hasAVXHere() {
						continue
					}
					func() {
						defer func(v bool) { useAVX = v }(useAVX)
						useAVX = avx
						mt := make([]float64, ns*nu)
						tot := make([]float64, ns)
						big, summed := momentTable(mt, tot, xs, wts, n, a, v, d, 0.25)
						if !sameBits(mt, want) {
							t.Errorf("AVX %v: the table differs from the direct M", avx)
						}
						if math.Float64bits(big) != math.Float64bits(wantBig) {
							t.Errorf("AVX %v: largest size %v, want %v", avx, big, wantBig)
						}
						if summed != (avx && nu > 0) {
							t.Errorf("AVX %v: summed %v", avx, summed)
						}
						if summed && !sameBits(tot, wantTot) {
							t.Errorf("AVX %v: sums %v, want %v", avx, tot, wantTot)
						}
					}()
				}
			})
		}
	}
	t.Run("NaN left out of the largest size", func(t *testing.T) {
		if !hasAVXHere() {
			t.Skip("no AVX")
		}
		xs := []float64{0, 1, 2}
		wts := make([][6]float64, 3)
		for i := range wts {
			wts[i] = [6]float64{0, 1, 1, 0, 1, 1}
		}
		a, v := []float64{2, math.NaN(), -3}, []float64{0, 0, 0}
		d := make([][6]float64, 3)
		for _, avx := range []bool{false, true} {
			func() {
				defer func(v bool) { useAVX = v }(useAVX)
				useAVX = avx
				big, _ := momentTable(make([]float64, 9), make([]float64, 3), xs, wts, 1, a, v, d, 0)
				if big != 3 {
					t.Errorf("AVX %v: largest size %v, want 3", avx, big)
				}
			}()
		}
	})
}

// TestComputeWithAndWithoutAVX holds the second-order envelope of a
// patterned frame formed with the table of moments in AVX to the one
// formed by the pure-Go loop, every number to the last bit and every
// list the same (the same operations, by TestMomentTableIsDirect; the
// station's sum taken from the table rather than classify).
func TestComputeWithAndWithoutAVX(t *testing.T) {
	if !hasAVXHere() {
		t.Skip("no AVX")
	}
	mo := regularFrame(6, 7)
	sol, lay := solvePatterned(t, mo, 1, true)
	set := Settings{Kinds: kindsOf(sol, lay), Stations: 11}
	with, err := Compute(sol, frameCombos(), set, lay)
	if err != nil {
		t.Fatal(err)
	}
	defer func(v bool) { useAVX = v }(useAVX)
	useAVX = false
	without, err := Compute(sol, frameCombos(), set, lay)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(with, without) {
		t.Fatal("the envelope with AVX differs from the one without")
	}
}

// hasAVXHere reports whether this build and processor use AVX.
func hasAVXHere() bool { return useAVX }

// sameBits reports whether a and b hold the same numbers bit for bit.
func sameBits(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
			return false
		}
	}
	return true
}

// TestSignsOfIsClassify checks the sums, largest sizes and counts by sign
// formed four stations at once (signsOf, AVX) against classify,
// sumsOver and largestOver at each station, the direct pass over the
// units: the same numbers to the last bit (no tolerance: the same sums in
// the same order, +0 added for the units of another class). The rows are
// random (fixed seed) with values at and near the round-off of either
// sign, zeros of either sign and NaN.
func TestSignsOfIsClassify(t *testing.T) {
	if !hasAVXHere() {
		t.Skip("no AVX")
	}
	rng := rand.New(rand.NewPCG(3, 5))
	const nz = 1e-6
	num := func() float64 {
		switch rng.IntN(10) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return nz
		case 3:
			return -nz
		case 4:
			return math.NaN()
		case 5:
			return math.Nextafter(nz, 1)
		}
		return rng.NormFloat64() * 10
	}
	for _, ns := range []int{1, 3, 4, 6, 11, 13} {
		for _, nu := range []int{0, 1, 5, 300} {
			t.Run(fmt.Sprintf("%d stations, %d units", ns, nu), func(t *testing.T) {
				mt := make([]float64, ns*nu)
				for q := range mt {
					mt[q] = num()
				}
				n, v := make([]float64, nu), make([]float64, nu)
				for u := range nu {
					n[u], v[u] = rng.NormFloat64(), rng.NormFloat64()
				}
				sg := make([]stationSigns, ns)
				signsOf(sg, mt, n, v, nz)
				pos, neg, zer := make([]int32, nu), make([]int32, nu), make([]int32, nu)
				for i := range ns {
					mv := mt[i*nu : (i+1)*nu]
					_, np, nn, nr := classify(mv, nz, pos, neg, zer)
					var want stationSigns
					want.pos[0], want.pos[1], want.pos[2], want.big[0] = sumsOver(pos[:np], n, v, mv, mv)
					want.zero[0], want.zero[1], want.zero[2], _ = sumsOver(zer[:nr], n, v, mv, mv)
					want.big[1] = largestOver(neg[:nn], mv)
					want.count = [2]int{np, nn}
					got := sg[i]
					if !sameBits(append(got.pos[:], append(got.zero[:], got.big[:]...)...), append(want.pos[:], append(want.zero[:], want.big[:]...)...)) || got.count != want.count {
						t.Errorf("station %d: %+v, want %+v", i, got, want)
					}
				}
			})
		}
	}
}

// TestListReaching checks the units listed for ranking (listReaching,
// with AVX four at a time and in pure Go) against the units of each sign
// past the round-off that reach the thresholds, compared one by one: the
// same units in the same order, for every count of units to 40 and for
// 503; a NaN threshold lists none.
func TestListReaching(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 1))
	mv := make([]float64, 503)
	for u := range mv {
		mv[u] = rng.NormFloat64()
		if u%50 == 0 {
			mv[u] = math.NaN()
		}
	}
	mv[7], mv[9] = 1, -2 // exactly at the thresholds {1, 2}
	const nz = 0.05
	all := mv
	for _, th := range [][2]float64{{0.1, 0.1}, {1, 2}, {3, 0.06}, {10, 10}, {math.NaN(), math.NaN()}} {
		for _, avx := range []bool{false, true} {
			if avx && !hasAVXHere() {
				continue
			}
			// Every length to 40 (groups of eight and four, and what
			// is left), and all of them.
			for n := 0; n <= len(all); n++ {
				if n > 40 && n < len(all) {
					continue
				}
				mv := all[:n]
				t.Run(fmt.Sprintf("%v AVX %v %d units", th, avx, n), func(t *testing.T) {
					defer func(v bool) { useAVX = v }(useAVX)
					useAVX = avx
					got := listReaching(mv, th[0], th[1], make([]int32, len(mv)+4), make([]int32, len(mv)+4))
					var want [2][]int32
					for u, m := range mv {
						if m > nz && m >= th[0] {
							want[0] = append(want[0], int32(u))
						} else if m < -nz && -m >= th[1] {
							want[1] = append(want[1], int32(u))
						}
					}
					if !reflect.DeepEqual(append([]int32{}, got[0]...), append([]int32{}, want[0]...)) || !reflect.DeepEqual(append([]int32{}, got[1]...), append([]int32{}, want[1]...)) {
						t.Errorf("listed %v, want %v", got, want)
					}
				})
			}
		}
	}
}

// TestLargestFirst checks the units' N, V and M₀ and the largest sizes a
// first-order member's fold starts from (largestFirst, with AVX run by
// run between the units that load the member, and in pure Go) against
// the definition unit by unit: N = −g₀, V = g₁, M₀ = −g₂ from each unit's
// forces at the member's start, zero for the units of own, and the
// largest |N|, |V| and |M| (M at the start, M₀, and at the end, M₀ + l·V)
// over the others, raising the sizes given, NaN left out; bit for bit.
// own lists are ascending, as the fold forms them, and also out of order
// or past the units, where an entry not past the one before is never met
// and stops the zeroing (as a merge of two ascending lists would).
func TestLargestFirst(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 2))
	num := func() float64 {
		switch rng.IntN(12) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return math.NaN()
		case 3:
			return math.Inf(-1)
		}
		return rng.NormFloat64() * 100
	}
	const l = 6.5
	for _, nu := range []int{0, 1, 3, 4, 17, 300} {
		for _, own := range [][]int{nil, {0}, {2}, {0, 1, 2}, {1, 5, 16}, {5, 5, 7}, {7, 3, 9}, {nu - 1}, {nu + 2, 1}} {
			for _, start := range [][3]float64{{0, 0, 0}, {50, 60, 70}, {1e9, 1e9, 1e9}} {
				ends := make([][6]float64, nu)
				for u := range ends {
					for k := range ends[u] {
						ends[u][k] = num()
					}
				}
				// The definition.
				wantN, wantV, wantA := make([]float64, nu), make([]float64, nu), make([]float64, nu)
				want := start
				next := 0 // own[next] is the unit of own met next
				raise := func(b *float64, s float64) {
					if s > *b {
						*b = s
					}
				}
				for u := range nu {
					if next < len(own) && own[next] == u {
						next++
						continue
					}
					x, y, z := -ends[u][0], ends[u][1], -ends[u][2]
					wantN[u], wantV[u], wantA[u] = x, y, z
					raise(&want[0], math.Abs(x))
					raise(&want[1], math.Abs(y))
					raise(&want[2], math.Abs(z))
					raise(&want[2], math.Abs(z+l*y))
				}
				for _, avx := range []bool{false, true} {
					if avx && !hasAVXHere() {
						continue
					}
					func() {
						defer func(v bool) { useAVX = v }(useAVX)
						useAVX = avx
						n, v, a := make([]float64, nu), make([]float64, nu), make([]float64, nu)
						for u := range nu { // what the units of own must overwrite
							n[u], v[u], a[u] = 1, 1, 1
						}
						got := start
						largestFirst(&got, n, v, a, ends, own, l)
						if !sameBits(n, wantN) || !sameBits(v, wantV) || !sameBits(a, wantA) || !sameBits(got[:], want[:]) {
							t.Errorf("%d units, own %v, sizes from %v, AVX %v: sizes %v, want %v", nu, own, start, avx, got, want)
						}
					}()
				}
			}
		}
	}
}
