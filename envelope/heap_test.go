package envelope

import (
	"cmp"
	"math/rand/v2"
	"slices"
	"testing"
)

// byInfluence orders candidates the most influential first: larger size,
// then the earlier piece.
func byInfluence(x, y candidate) int {
	if c := cmp.Compare(y.a, x.a); c != 0 {
		return c
	}
	return cmp.Compare(x.piece, y.piece)
}

func TestKeepLargestKeepsTheLargest(t *testing.T) {
	// What the heap keeps must be the first limit of all the candidates
	// sorted (the definition of the limit largest), whatever the order
	// they come in; sizes are drawn from a few values so that ties are
	// common and must keep the earlier piece.
	rng := rand.New(rand.NewPCG(13, 6))
	for _, tc := range []struct {
		name         string
		n, limit     int
		sizes        int // distinct sizes; 0 for continuous
		shuffleOrder bool
	}{
		{"limit 1", 50, 1, 0, true},
		{"limit 16 of 200", 200, 16, 0, true},
		{"limit 16 of 200, many ties", 200, 16, 5, true},
		{"ties in piece order", 100, 16, 3, false},
		{"limit above the count", 10, 16, 4, true},
		{"unlimited", 300, int(^uint(0) >> 1), 0, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			for trial := range 20 {
				all := make([]candidate, tc.n)
				for i := range all {
					a := rng.Float64()
					if tc.sizes > 0 {
						a = float64(rng.IntN(tc.sizes))
					}
					all[i] = candidate{piece: i, a: a}
				}
				order := slices.Clone(all)
				if tc.shuffleOrder {
					rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
				}
				var h []candidate
				for _, c := range order {
					h = keepLargest(h, c, tc.limit)
					for i := 1; i < len(h); i++ {
						if h[i].less(h[(i-1)/2]) {
							t.Fatalf("trial %d: not a min-heap at %d: %v", trial, i, h)
						}
					}
				}
				want := slices.SortedFunc(slices.Values(all), byInfluence)
				want = want[:min(tc.limit, len(want))]
				got := slices.SortedFunc(slices.Values(h), byInfluence)
				if !slices.Equal(got, want) {
					t.Fatalf("trial %d: kept %v, want %v", trial, got, want)
				}
			}
		})
	}
}

func TestCandidateOrder(t *testing.T) {
	for _, tc := range []struct {
		name string
		c, d candidate
		less bool
	}{
		{"smaller size", candidate{0, 1}, candidate{1, 2}, true},
		{"larger size", candidate{0, 2}, candidate{1, 1}, false},
		{"equal size, later piece is smaller", candidate{5, 1}, candidate{3, 1}, true},
		{"equal size, earlier piece is larger", candidate{3, 1}, candidate{5, 1}, false},
		{"itself", candidate{3, 1}, candidate{3, 1}, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.c.less(tc.d); got != tc.less {
				t.Errorf("%v.less(%v) = %v", tc.c, tc.d, got)
			}
		})
	}
}

// TestKeepDescendingKeepsTheLargest checks keepDescending and
// keepAscending against the definition of the limit largest (every
// candidate sorted by influence, the first limit of them), in order,
// whatever the order the candidates
// come in, with ties common (they keep the earlier piece) and repeated
// candidates (the same piece and size twice, as two patterned terms of a
// hand-made layout could give); and sortSmallestFirst against a general
// sort, its result still a min-heap of keepLargest.
func TestKeepDescendingKeepsTheLargest(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 7))
	for _, tc := range []struct {
		name     string
		n, limit int
		sizes    int // distinct sizes; 0 for continuous
		order    string
	}{
		{"limit 1", 50, 1, 0, "shuffled"},
		{"limit 16 of 200", 200, 16, 0, "shuffled"},
		{"limit 16 of 200, many ties", 200, 16, 5, "shuffled"},
		{"the largest first", 100, 16, 7, "descending"},
		{"the smallest first", 100, 16, 7, "ascending"},
		{"limit above the count", 10, 16, 4, "shuffled"},
		{"repeated candidates", 40, 16, 3, "repeated"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			for trial := range 20 {
				all := make([]candidate, tc.n)
				for i := range all {
					a := rng.Float64()
					if tc.sizes > 0 {
						a = float64(rng.IntN(tc.sizes))
					}
					all[i] = candidate{piece: i, a: a}
				}
				order := slices.Clone(all)
				switch tc.order {
				case "shuffled":
					rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
				case "descending":
					slices.SortFunc(order, byInfluence)
				case "ascending":
					slices.SortFunc(order, byInfluence)
					slices.Reverse(order)
				case "repeated":
					order = append(order, order[:tc.n/2]...)
					all = slices.Clone(order)
					rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
				}
				var h, asc, heap []candidate
				for _, c := range order {
					h = keepDescending(h, c, tc.limit)
					asc = keepAscending(asc, c, tc.limit)
					heap = keepLargest(heap, c, tc.limit)
				}
				want := slices.SortedFunc(slices.Values(all), byInfluence)
				want = want[:min(tc.limit, len(want))]
				if !slices.Equal(h, want) {
					t.Fatalf("trial %d: kept %v, want %v", trial, h, want)
				}
				sortSmallestFirst(heap)
				slices.Reverse(want)
				if !slices.Equal(heap, want) {
					t.Fatalf("trial %d: sorted %v, want %v", trial, heap, want)
				}
				if !slices.Equal(asc, want) {
					t.Fatalf("trial %d: kept ascending %v, want %v", trial, asc, want)
				}
				// Still a heap: the largest yet is kept.
				c := candidate{piece: -1, a: float64(tc.sizes) + 1}
				heap = keepLargest(heap, c, tc.limit)
				for i := 1; i < len(heap); i++ {
					if heap[i].less(heap[(i-1)/2]) {
						t.Fatalf("trial %d: not a min-heap at %d: %v", trial, i, heap)
					}
				}
				if !slices.Contains(heap, c) || len(heap) != min(len(want)+1, tc.limit) {
					t.Fatalf("trial %d: %v not kept: %v", trial, c, heap)
				}
			}
		})
	}
}
