package main

import (
	"bytes"
	"math"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/frame"
)

// TestStreamedEnvelopeMatchesDirectSum checks the streamed "exact"
// envelope of a 10 × 10 frame against a straightforward computation: at
// every station, every combination, every effect, the sum over cases of
// each one's factored value where it acts, and over pattern pieces of each
// piece's factored value where adverse (the closed form of the worst
// arrangement under superposition), each value taken from Solution.At.
func TestStreamedEnvelopeMatchesDirectSum(t *testing.T) {
	var src bytes.Buffer
	if err := generateModel(&src, regularSpec(10, 10)); err != nil {
		t.Fatal(err)
	}
	job, err := modelfile.Read("ten.toml", src.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	a, err := analyse(job)
	if err != nil {
		t.Fatal(err)
	}
	if len(a.lay.Pieces) != 100 {
		t.Fatalf("%d pieces, want 100", len(a.lay.Pieces))
	}
	mo := job.Model
	piecesOf := map[int][]int{} // original case → piece columns
	for _, p := range a.lay.Patterned {
		for _, u := range p.Units {
			piecesOf[p.Case] = append(piecesOf[p.Case], u.Column)
		}
	}
	// scaleTol: agreement to 1e-9 of the largest value of the frame.
	const scaleTol = 1e-9
	scale := 0.0
	for _, em := range a.env.Members {
		for _, st := range em.Stations {
			for _, e := range [3]float64{st.N.Max, st.V.Max, st.M.Max} {
				scale = math.Max(scale, math.Abs(e))
			}
		}
	}
	comp := func(f frame.Forces, j int) float64 { return [3]float64{f.N, f.V, f.M}[j] }
	bad := 0
	for m, em := range a.env.Members {
		for _, st := range em.Stations {
			for j := range 3 {
				hi, lo := math.Inf(-1), math.Inf(1)
				for _, cb := range job.Combinations {
					var h, l float64
					for _, term := range cb.Terms {
						v := term.Factor * comp(a.sol.At(term.Case, m, st.X), j)
						switch {
						case !mo.Cases[term.Case].Variable():
							h, l = h+v, l+v
						case v > 0:
							h += v
						default:
							l += v
						}
						for _, col := range piecesOf[term.Case] {
							v := term.Factor * comp(a.sol.At(col, m, st.X), j)
							if v > 0 {
								h += v
							} else {
								l += v
							}
						}
					}
					hi, lo = math.Max(hi, h), math.Min(lo, l)
				}
				got := [3][2]float64{{st.N.Max, st.N.Min}, {st.V.Max, st.V.Min}, {st.M.Max, st.M.Min}}[j]
				if math.Abs(got[0]-hi) > scaleTol*scale || math.Abs(got[1]-lo) > scaleTol*scale {
					if bad++; bad < 10 {
						t.Errorf("member %s x %g effect %d: streamed [%g, %g], direct [%g, %g]", mo.Members[m].Name, st.X, j, got[1], got[0], lo, hi)
					}
				}
			}
		}
	}
}
