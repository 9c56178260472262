package envelope

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"
)

func TestSpanListOrder(t *testing.T) {
	for _, tc := range []struct {
		name   string
		l      spanList
		pieces []int
	}{
		{"nothing loaded", spanList{}, nil},
		{"found in order: sorted, each once", spanList{pieces: []int{5, 2, 5, 1}}, []int{1, 2, 5}},
		{
			"ranked: the most influential first, ties the earlier piece, each once",
			spanList{ranked: []candidate{{3, 1}, {5, 2}, {1, 2}, {3, 0.5}, {7, 4}}},
			[]int{7, 1, 5, 3},
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if n := tc.l.order(); n != len(tc.pieces) || !slices.Equal(tc.l.pieces, tc.pieces) {
				t.Errorf("order gives %d: %v, want %v", n, tc.l.pieces, tc.pieces)
			}
		})
	}
	t.Run("a long ranked list with repeats", func(t *testing.T) {
		// Past 32 candidates repeats are found by a map: the list must be
		// that of sorting them all and keeping the first of each piece.
		rng := rand.New(rand.NewPCG(13, 6))
		var l spanList
		for range 60 {
			l.ranked = append(l.ranked, candidate{piece: rng.IntN(25), a: float64(rng.IntN(8))})
		}
		sorted := slices.SortedFunc(slices.Values(l.ranked), byInfluence)
		var want []int
		for _, c := range sorted {
			if !slices.Contains(want, c.piece) {
				want = append(want, c.piece)
			}
		}
		if l.order(); !slices.Equal(l.pieces, want) {
			t.Errorf("order gives %v, want %v", l.pieces, want)
		}
	})
}

// sortLargestFirst gives the order of a general sort by influence
// (byInfluence, the definition of candidate.less), on short lists
// (insertion) and long ones, with repeated pieces and sizes.
func TestSortLargestFirst(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 21))
	for _, n := range []int{0, 1, 2, 16, 4 * maxSpans, 4*maxSpans + 1, 200} {
		t.Run(fmt.Sprint(n), func(t *testing.T) {
			c := make([]candidate, n)
			for i := range c {
				c[i] = candidate{piece: rng.IntN(n/2 + 1), a: float64(rng.IntN(6))}
			}
			want := slices.SortedFunc(slices.Values(c), byInfluence)
			if sortLargestFirst(c); !slices.Equal(c, want) {
				t.Errorf("sortLargestFirst gives %v, want %v", c, want)
			}
		})
	}
}
