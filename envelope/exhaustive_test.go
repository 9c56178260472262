package envelope

import (
	"math"
	"math/rand/v2"
	"testing"
)

// randomTerms returns n terms with factors of either sign and effects in
// [-1, 1).
func randomTerms(rng *rand.Rand, n int) []exTerm {
	ts := make([]exTerm, n)
	for i := range ts {
		f := 1 + rng.Float64()
		if rng.IntN(4) == 0 {
			f = -f
		}
		ts[i] = exTerm{f: f, v: [3]float64{2*rng.Float64() - 1, 2*rng.Float64() - 1, 2*rng.Float64() - 1}}
	}
	return ts
}

// subsetSum returns the sum of effect j of the terms in mask.
func subsetSum(ts []exTerm, mask uint32, j int) float64 {
	s := 0.0
	for i, t := range ts {
		if mask&(1<<i) != 0 {
			s += t.f * t.v[j]
		}
	}
	return s
}

// sumTol is the round-off allowed between sums of a dozen terms of size
// about 1 formed in different orders.
const sumTol = 1e-12

func TestExhaustiveFindsTheAdversePieces(t *testing.T) {
	// Superposition: the largest sum over every subset of independent
	// terms is the sum of the positive ones, the smallest that of the
	// negative ones (closed form), and with no term exactly zero that
	// subset is the only one to reach it.
	rng := rand.New(rand.NewPCG(13, 6))
	for n := 1; n <= 12; n++ {
		ts := randomTerms(rng, n)
		for j := range 3 {
			var pos, neg uint32
			var hi, lo float64
			for i, t := range ts {
				if v := t.f * t.v[j]; v > 0 {
					pos |= 1 << i
					hi += v
				} else {
					neg |= 1 << i
					lo += v
				}
			}
			for _, c := range []struct {
				hi   bool
				mask uint32
				sum  float64
			}{{true, pos, hi}, {false, neg, lo}} {
				got := exhaustive(ts, j, c.hi, 0)
				if got != c.mask || math.Abs(subsetSum(ts, got, j)-c.sum) > sumTol {
					t.Errorf("%d terms, effect %d, hi %v: subset %b (sum %g), want %b (sum %g)", n, j, c.hi, got, subsetSum(ts, got, j), c.mask, c.sum)
				}
			}
		}
	}
}

func TestExhaustiveTriesEverySubset(t *testing.T) {
	// Against a plain count through every subset in binary order: the
	// Gray-code walk must reach the same best sum. Terms come in equal
	// and opposite pairs and zeros, so that many subsets tie.
	rng := rand.New(rand.NewPCG(7, 1))
	for trial := range 50 {
		n := 1 + rng.IntN(10)
		ts := randomTerms(rng, n)
		for i := range ts {
			switch rng.IntN(3) {
			case 0:
				ts[i].v = [3]float64{}
			case 1:
				if i > 0 {
					ts[i] = ts[i-1]
					ts[i].f = -ts[i].f
				}
			}
		}
		for _, hi := range []bool{true, false} {
			best := 0.0
			for m := uint32(0); m < 1<<n; m++ {
				if s := subsetSum(ts, m, 0); (hi && s > best) || (!hi && s < best) {
					best = s
				}
			}
			got := exhaustive(ts, 0, hi, 0)
			if math.Abs(subsetSum(ts, got, 0)-best) > sumTol {
				t.Errorf("trial %d, hi %v: subset %b sums to %g, best %g", trial, hi, got, subsetSum(ts, got, 0), best)
			}
		}
	}
}

func TestExhaustiveTiesAndRoundOff(t *testing.T) {
	one := func(f, v float64) exTerm { return exTerm{f: f, v: [3]float64{v}} }
	for _, tc := range []struct {
		name  string
		ts    []exTerm
		hi    bool
		noise float64
		want  uint32
	}{
		{"a zero piece is left off", []exTerm{one(1, 1), one(1, 0), one(1, 2)}, true, 0, 0b101},
		{"all relieving: empty for the largest", []exTerm{one(1, -1), one(1, -2)}, true, 0, 0},
		{"all relieving: all for the smallest", []exTerm{one(1, -1), one(1, -2)}, false, 0, 0b11},
		{"a negative factor turns a piece over", []exTerm{one(-1, -1), one(1, -2)}, true, 0, 0b01},
		{"round-off is never loaded", []exTerm{one(1, 1e-12), one(1, 3)}, true, 1e-9, 0b10},
		{"round-off is judged unfactored", []exTerm{one(1e6, 1e-12), one(1, 3)}, true, 1e-9, 0b10},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := exhaustive(tc.ts, 0, tc.hi, tc.noise); got != tc.want {
				t.Errorf("subset %b, want %b", got, tc.want)
			}
		})
	}
}

func TestBestSubsetTiesKeepTheEarlier(t *testing.T) {
	// Before round-off is taken out, a piece with no effect ties with
	// leaving it off; the walk keeps the subset it met first, and the
	// empty subset comes first of all.
	one := func(v float64) exTerm { return exTerm{f: 1, v: [3]float64{v}} }
	for _, tc := range []struct {
		name string
		ts   []exTerm
		want uint32
	}{
		{"every piece without effect: the empty subset", []exTerm{one(0), one(0), one(0)}, 0},
		{"the piece without effect met last is left off", []exTerm{one(1), one(2), one(0)}, 0b011},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := bestSubset(tc.ts, 0, true); got != tc.want {
				t.Errorf("subset %b, want %b", got, tc.want)
			}
		})
	}
}
