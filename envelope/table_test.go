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
