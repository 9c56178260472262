package envelope

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// The seeded ranking lists the same units as ranking every unit of the
// sign with spanShare of the largest alone: checked against a direct
// computation (every unit of the sign sorted by size, the earlier unit
// first among equal sizes, the first maxSpans that reach the share kept),
// on random values with repeated sizes, for lists kept of every kind: the
// largest units, all but one of them and a unit of the other sign, random
// ones, fewer than maxSpans, units of the other sign. The sums and largest sizes formed with the seed are sumsOver's and
// largestOver's to the last bit.
func TestSeededRankingListsTheSame(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11)) // fixed seed
	const nu, nz = 400, 1e-9
	for trial := range 200 {
		vals := make([]float64, nu)
		n, v := make([]float64, nu), make([]float64, nu)
		for u := range vals {
			// Sizes over several decades, a tenth of them round-off and
			// some repeated exactly.
			vals[u] = math.Copysign(math.Pow(10, 4*rng.Float64()), rng.Float64()-0.5)
			switch rng.IntN(10) {
			case 0:
				vals[u] *= 1e-12
			case 1:
				if u > 0 {
					vals[u] = vals[rng.IntN(u)]
				}
			}
			n[u], v[u] = rng.NormFloat64(), rng.NormFloat64()
		}
		pos, neg, zer := make([]int32, nu), make([]int32, nu), make([]int32, nu)
		_, np, nn, _ := classify(vals, nz, pos, neg, zer)
		pos, neg = pos[:np], neg[:nn]
		for s, list := range [2][]int32{pos, neg} {
			negative := s == 1
			size := func(u int32) float64 {
				if negative {
					return -vals[u]
				}
				return vals[u]
			}
			// The direct computation.
			sorted := slices.Clone(list)
			slices.SortStableFunc(sorted, func(a, b int32) int { return cmp.Compare(size(b), size(a)) })
			big := 0.0
			if len(sorted) > 0 {
				big = size(sorted[0])
			}
			var want []int
			for _, u := range sorted {
				if len(want) < maxSpans && size(u) >= spanShare*big {
					want = append(want, int(u))
				}
			}
			for _, kind := range []string{"largest", "one of the other sign", "random", "short", "other sign"} {
				t.Run(fmt.Sprintf("trial %d/sign %d/%s", trial, s, kind), func(t *testing.T) {
					var kept []int32
					switch kind {
					case "largest":
						for _, u := range want {
							kept = append(kept, int32(u))
						}
					case "one of the other sign":
						for _, u := range want[:max(len(want)-1, 0)] {
							kept = append(kept, int32(u))
						}
						if other := [2][]int32{neg, pos}[s]; len(other) > 0 {
							kept = append(kept, other[0])
						}
					case "random", "short":
						k := maxSpans
						if kind == "short" {
							k = rng.IntN(maxSpans)
						}
						for _, u := range rng.Perm(nu)[:k] {
							kept = append(kept, int32(u))
						}
					case "other sign":
						other := [2][]int32{neg, pos}[s]
						kept = other[:min(maxSpans, len(other))]
					}
					pre, full := keptAt(kept, vals, nz, negative, spanShare, maxSpans)
					// keptRows, for rows of values, is the bound of a full
					// list alone, 0 otherwise.
					rows := make([][3]float64, nu)
					for u := range rows {
						rows[u][2] = vals[u]
					}
					byRows := keptRows(kept, rows, 2, nz, negative, maxSpans)
					if full {
						lo := math.Inf(1)
						for _, u := range kept {
							lo = min(lo, size(u))
						}
						if byRows != lo {
							t.Fatalf("keptRows %v, the smallest size kept %v", byRows, lo)
						}
					} else if byRows != 0 {
						t.Fatalf("keptRows %v of a list not full", byRows)
					}
					if h := rankListed(nil, list, vals, negative, max(spanShare*big, byRows), maxSpans); !sameUnits(h, want) {
						t.Fatalf("seeded by keptRows %v: listed %v, directly %v", byRows, h, want)
					}
					ranked := make([]int32, nu)
					var nr int
					var gotBig float64
					if negative {
						gotBig, nr = largestReaching(list, vals, -pre, ranked)
						if wantBig := largestOver(list, vals); gotBig != wantBig {
							t.Fatalf("largest size %v, largestOver %v", gotBig, wantBig)
						}
					} else {
						var sn, sv, sa float64
						sn, sv, sa, gotBig, nr = sumsReaching(list, n, v, vals, vals, pre, ranked)
						wn, wv, wa, wb := sumsOver(list, n, v, vals, vals)
						if sn != wn || sv != wv || sa != wa || gotBig != wb {
							t.Fatalf("sums %v %v %v %v, sumsOver %v %v %v %v", sn, sv, sa, gotBig, wn, wv, wa, wb)
						}
					}
					if gotBig != big {
						t.Fatalf("largest size %v, directly %v", gotBig, big)
					}
					h := rankListed(nil, ranked[:nr], vals, negative, max(spanShare*big, pre), maxSpans)
					got := make([]int, len(h))
					for q, c := range h {
						got[q] = c.piece
					}
					slices.SortStableFunc(got, func(a, b int) int {
						return cmp.Or(cmp.Compare(size(int32(b)), size(int32(a))), cmp.Compare(a, b))
					})
					if !slices.Equal(got, want) {
						t.Fatalf("seed %v (%d of %d units ranked): listed %v, directly %v", pre, nr, len(list), got, want)
					}
					if kind == "largest" && len(want) == maxSpans && nr >= len(list) && len(list) > 2*maxSpans {
						t.Errorf("the seed from the largest left every unit (%d) to rank", nr)
					}
				})
			}
		}
	}
}

// On a frame with many pieces to a sign (8 bays, 9 storeys: 64 pieces of
// L), where the lists are full and the seeds cut most units out of the
// ranking, the folded envelope lists, counts and governs as evaluating
// every column at every station with no seed does (every unit ranked),
// in first and in second order (the axial forces of D in first order,
// times 1.5).
func TestSeededListsEqualUnfolded(t *testing.T) {
	for _, second := range []bool{false, true} {
		t.Run(fmt.Sprintf("second order %v", second), func(t *testing.T) {
			mo := regularFrame(8, 9)
			sol, lay := solvePatterned(t, mo, 1, second)
			set := Settings{Kinds: kindsOf(sol, lay), Stations: 11}
			folded, err := Compute(sol, frameCombos(), set, lay)
			if err != nil {
				t.Fatal(err)
			}
			folding, seeding = false, false
			defer func() { folding, seeding = true, true }()
			plain, err := Compute(sol, frameCombos(), set, lay)
			if err != nil {
				t.Fatal(err)
			}
			folding, seeding = true, true
			full := 0
			for m := range plain.Members {
				a, b := folded.Members[m], plain.Members[m]
				var scale [3]float64
				for _, s := range b.Stations {
					for j, x := range [3]Extreme{s.N, s.V, s.M} {
						scale[j] = max(scale[j], math.Abs(x.Max), math.Abs(x.Min))
					}
				}
				for i, s := range b.Stations {
					r := a.Stations[i]
					for j, pair := range [3][2]Extreme{{r.N, s.N}, {r.V, s.V}, {r.M, s.M}} {
						got, want := pair[0], pair[1]
						where := fmt.Sprintf("member %s station %d effect %d", mo.Members[m].Name, i, j)
						if tol := foldTol * scale[j]; math.Abs(got.Max-want.Max) > tol || math.Abs(got.Min-want.Min) > tol {
							t.Errorf("%s: folded [%v, %v], unfolded [%v, %v]", where, got.Min, got.Max, want.Min, want.Max)
						}
						if got.MaxBy != want.MaxBy || got.MinBy != want.MinBy || got.MaxLoaded != want.MaxLoaded || got.MinLoaded != want.MinLoaded ||
							!slices.Equal(got.MaxSpans, want.MaxSpans) || !slices.Equal(got.MinSpans, want.MinSpans) {
							t.Fatalf("%s: folded by %d/%d loading %d/%d %v/%v, unfolded by %d/%d loading %d/%d %v/%v", where,
								got.MaxBy, got.MinBy, got.MaxLoaded, got.MinLoaded, got.MaxSpans, got.MinSpans,
								want.MaxBy, want.MinBy, want.MaxLoaded, want.MinLoaded, want.MaxSpans, want.MinSpans)
						}
						if len(want.MaxSpans) == maxSpans && want.MaxLoaded > 2*maxSpans {
							full++
						}
					}
				}
			}
			if full == 0 {
				t.Fatal("no list is full: the seeds are not exercised")
			}
		})
	}
}

// sameUnits reports whether h lists the units of want, in any order.
func sameUnits(h []candidate, want []int) bool {
	got := make([]int, len(h))
	for q, c := range h {
		got[q] = c.piece
	}
	slices.Sort(got)
	w := slices.Clone(want)
	slices.Sort(w)
	return slices.Equal(got, w)
}
