package analysis

import (
	"context"
	"math"
	"testing"

	"govern/frame"
)

// TestStreamedEnvelopeMatchesDirectSum checks the streamed "exact"
// envelope of a 10 × 10 frame against a straightforward computation: at
// every station, every combination, every effect, the sum over cases of
// each one's factored value where it acts, and over pattern pieces of each
// piece's factored value where adverse (the closed form of the worst
// arrangement under superposition), each value taken from Solution.At.
func TestStreamedEnvelopeMatchesDirectSum(t *testing.T) {
	job := regularJob(10, 10, false)
	a, err := Run(context.Background(), job, Options{})
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
	for _, em := range a.Envelope.Members {
		for _, st := range em.Stations {
			for _, e := range [3]float64{st.N.Max, st.V.Max, st.M.Max} {
				scale = math.Max(scale, math.Abs(e))
			}
		}
	}
	comp := func(f frame.Forces, j int) float64 { return [3]float64{f.N, f.V, f.M}[j] }
	bad := 0
	for m, em := range a.Envelope.Members {
		for _, st := range em.Stations {
			for j := range 3 {
				hi, lo := math.Inf(-1), math.Inf(1)
				for _, cb := range job.Combinations {
					var h, l float64
					for _, term := range cb.Terms {
						v := term.Factor * comp(a.sol.At(term.Case, m, st.X), j)
						switch {
						case job.Cases[term.Case].Kind.Permanent():
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

// TestStreamedDeflectionMatchesDirectSum checks the deflection envelope of
// a 5 × 6 frame with column faces, a service combination and patterned
// live load against the same direct sum as above,
// each value from Solution.Deflection, at every station including the faces.
func TestStreamedDeflectionMatchesDirectSum(t *testing.T) {
	job := regularJob(5, 6, true)
	a, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	mo := job.Model
	piecesOf := map[int][]int{}
	for _, p := range a.lay.Patterned {
		for _, u := range p.Units {
			piecesOf[p.Case] = append(piecesOf[p.Case], u.Column)
		}
	}
	if len(a.Envelope.Service) != 1 || len(a.Envelope.Strength) != len(job.Combinations)-1 {
		t.Fatalf("strength %v, service %v", a.Envelope.Strength, a.Envelope.Service)
	}
	// scaleTol: agreement to 1e-9 of the largest deflection of the frame.
	const scaleTol = 1e-9
	scale := 0.0
	faces := 0
	for _, em := range a.Envelope.Members {
		for i, d := range em.Deflection {
			scale = math.Max(scale, math.Max(math.Abs(d.Max), math.Abs(d.Min)))
			if em.Stations[i].Extra {
				faces++
			}
		}
	}
	if faces != 2*5*6 {
		t.Errorf("%d face stations, want two on each of the 30 beams", faces)
	}
	for m, em := range a.Envelope.Members {
		for i, st := range em.Stations {
			hi, lo := math.Inf(-1), math.Inf(1)
			for _, k := range a.Envelope.Service {
				var h, l float64
				for _, term := range job.Combinations[k].Terms {
					v := term.Factor * a.sol.Deflection(term.Case, m, st.X)
					switch {
					case job.Cases[term.Case].Kind.Permanent():
						h, l = h+v, l+v
					case v > 0:
						h += v
					default:
						l += v
					}
					for _, col := range piecesOf[term.Case] {
						v := term.Factor * a.sol.Deflection(col, m, st.X)
						if v > 0 {
							h += v
						} else {
							l += v
						}
					}
				}
				hi, lo = math.Max(hi, h), math.Min(lo, l)
			}
			d := em.Deflection[i]
			if math.Abs(d.Max-hi) > scaleTol*scale || math.Abs(d.Min-lo) > scaleTol*scale || d.MaxBy != a.Envelope.Service[0] {
				t.Errorf("member %s x %g: streamed [%g, %g] by %d, direct [%g, %g]", mo.Members[m].Name, st.X, d.Min, d.Max, d.MaxBy, lo, hi)
			}
		}
	}
}
