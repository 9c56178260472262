package envelope

import (
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"runtime"
	"testing"

	"govern/combos"
	"govern/frame"
)

// TestFirstSignsIsDirect checks the table of first-order moments and its
// classification (firstSigns, four stations at once with AVX) against
// each unit's M formed one station at a time as scanFolded's pure-Go
// loop forms it, a + x·v (the product rounded, then added), then
// classify, sumsOver and largestOver over it (the direct pass over the
// units): the table, each row's sum of the units in their order from +0,
// the sums of N, V and M of the positive and round-off units, the largest
// sizes and the counts by sign, the same to the last bit, no tolerance.
// The data are random (fixed seed), with zeros of either sign, values at
// and next to the round-off, repeated values, sizes from 1e-300 to
// 1e300, infinities and NaN; the counts of stations cover groups of four
// with every remainder.
func TestFirstSignsIsDirect(t *testing.T) {
	if !hasAVXHere() {
		t.Skip("no AVX")
	}
	rng := rand.New(rand.NewPCG(17, 23))
	const nz = 1e-6
	num := func() float64 {
		switch rng.IntN(12) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return 1.5
		case 3:
			return math.Ldexp(rng.NormFloat64(), rng.IntN(1990)-995)
		case 4:
			if rng.IntN(20) == 0 {
				return math.Inf(1 - 2*rng.IntN(2))
			}
		case 5:
			if rng.IntN(20) == 0 {
				return math.NaN()
			}
		case 6:
			return nz * float64(1-2*rng.IntN(2))
		case 7:
			return math.Nextafter(nz, 1)
		}
		return rng.NormFloat64() * 100
	}
	for _, ns := range []int{1, 2, 3, 4, 5, 7, 8, 11, 13} {
		for _, nu := range []int{1, 2, 3, 17, 200} {
			t.Run(fmt.Sprintf("%d stations, %d units", ns, nu), func(t *testing.T) {
				xs := make([]float64, ns)
				for i := range xs {
					xs[i] = float64(i) * 0.7 * (1 + rng.Float64()/100)
				}
				a, v, n := make([]float64, nu), make([]float64, nu), make([]float64, nu)
				for u := range nu {
					a[u], n[u] = num(), num()
					if rng.IntN(3) == 0 {
						v[u] = 0 // M = a at every station: at the round-off too
					} else {
						v[u] = num()
					}
				}
				mt, tot, sg := make([]float64, ns*nu), make([]float64, ns), make([]stationSigns, ns)
				if !firstSigns(mt, tot, sg, xs, a, v, n, nz) {
					t.Fatal("firstSigns formed no table with AVX")
				}
				pos, neg, zer := make([]int32, nu), make([]int32, nu), make([]int32, nu)
				mv := make([]float64, nu)
				for i, x := range xs {
					for u := range nu {
						mv[u] = a[u] + x*v[u]
					}
					if !sameBits(mt[i*nu:(i+1)*nu], mv) {
						t.Errorf("station %d: the table differs from the direct M", i)
					}
					m0, np, nn, nr := classify(mv, nz, pos, neg, zer)
					if math.Float64bits(tot[i]) != math.Float64bits(m0) {
						t.Errorf("station %d: sum %v, want %v", i, tot[i], m0)
					}
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
	t.Run("no units, no table", func(t *testing.T) {
		if firstSigns(nil, make([]float64, 3), make([]stationSigns, 3), []float64{0, 1, 2}, nil, nil, nil, 0) {
			t.Error("firstSigns reported a table of no units")
		}
	})
	t.Run("without AVX, no table", func(t *testing.T) {
		defer func(v bool) { useAVX = v }(useAVX)
		useAVX = false
		if firstSigns(make([]float64, 3), make([]float64, 3), make([]stationSigns, 3), []float64{0, 1, 2}, []float64{1}, []float64{2}, []float64{3}, 0) {
			t.Error("firstSigns reported a table without AVX")
		}
	})
}

// oddFrame is a small patterned frame of the shapes a member can take:
// regularFrame(4, 3) with a beam drawn right to left (b2-2), the top
// right node raised 0.6 m (the last roof beam sloping, the column under
// it longer), a beam hinged at its start (b1-1) and one at its end
// (b4-3), a cantilever of 2.5 m off the right of the second floor drawn
// from its tip, carrying D and L (one more pattern piece) with a point
// load at its tip, the columns' own weight along them and a point load
// at a column's start (D).
func oddFrame() *frame.Model {
	mo := regularFrame(4, 3)
	for m := range mo.Members {
		switch mem := &mo.Members[m]; mem.Name {
		case "b2-2":
			mem.Start, mem.End = mem.End, mem.Start
		case "b1-1":
			mem.Release = frame.ReleaseStart
		case "b4-3":
			mem.Release = frame.ReleaseEnd
		}
	}
	mo.Nodes[len(mo.Nodes)-1].Y += 0.6
	at := 2*5 + 4 // node n4-2
	mo.Nodes = append(mo.Nodes, frame.Node{Name: "tip", X: mo.Nodes[at].X + 2.5, Y: mo.Nodes[at].Y})
	c := len(mo.Members)
	mo.Members = append(mo.Members, frame.Member{Name: "cantilever", Start: len(mo.Nodes) - 1, End: at, Section: 1})
	d, l := &mo.Cases[0], &mo.Cases[1]
	d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: c, To: 2.5, W: 25, WEnd: 25},
		frame.MemberLoad{Member: c, Point: true, At: 0, P: 8})
	l.MemberLoads = append(l.MemberLoads, frame.MemberLoad{Member: c, To: 2.5, W: 15, WEnd: 15})
	for m, mem := range mo.Members {
		if mo.Nodes[mem.Start].X == mo.Nodes[mem.End].X { // a column
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, Direction: frame.Gravity, To: mo.Length(m), W: 4, WEnd: 4})
		}
	}
	d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: 0, Point: true, At: 0, P: 30})
	return mo
}

// TestFirstOrderWithAndWithoutAVX holds the first-order envelope of a
// patterned frame whose folded members' moments are tabled with AVX
// (firstSigns, then listReaching) to the one formed by the
// pure-Go loop of scanFolded, station by station (classify, the sums and
// the ranking of every listed unit): every number to the last bit and
// every list the same, on foldFrame and oddFrame, with one and two
// pieces per beam, without and with member factors (foldFactors, which
// also make the envelope be formed in parts), with a service combination
// (deflections) and on one and two cores. It also checks that the table
// was used: the units of every used patterned case of every folded
// member signed from it.
func TestFirstOrderWithAndWithoutAVX(t *testing.T) {
	if !hasAVXHere() {
		t.Skip("no AVX")
	}
	for _, shape := range []string{"foldFrame", "oddFrame"} {
		for _, segments := range []int{1, 2} {
			for _, factors := range []bool{false, true} {
				for _, procs := range []int{1, 2} {
					t.Run(fmt.Sprintf("%s/segments=%d/factors=%v/GOMAXPROCS=%d", shape, segments, factors, procs), func(t *testing.T) {
						defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
						mo := oddFrame()
						if shape == "foldFrame" {
							mo = foldFrame(false)
						}
						sol, lay := solvePatterned(t, mo, segments, false)
						cs := append(frameCombos(), combos.Combination{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}})
						set := Settings{Kinds: kindsOf(sol, lay), Stations: 11, Extra: [][]float64{nil, {0.4, 1.7}}}
						if factors {
							set.Factors = foldFactors(mo)
						}
						with, err := Compute(sol, cs, set, lay)
						if err != nil {
							t.Fatal(err)
						}
						// The table was formed and signed.
						strength, _ := split(cs)
						e := newEvaluator(sol.Model(), cs, strength, 3, set, lay)
						w := e.scratch()
						for m := range mo.Members {
							w.stations(mo.Length(m), set.Stations, nil)
							if _, ok := e.foldable(w, sol, m); !ok {
								t.Fatalf("member %s is not folded", mo.Members[m].Name)
							}
							w.fold.load(e, w, sol, m)
							for p := range w.fold.cases {
								if fc := &w.fold.cases[p]; e.uses(p) && (!fc.tabled || !fc.signed) {
									t.Errorf("member %s, patterned case %d: tabled %v, signed %v", mo.Members[m].Name, p, fc.tabled, fc.signed)
								}
							}
						}
						defer func(v bool) { useAVX = v }(useAVX)
						useAVX = false
						without, err := Compute(sol, cs, set, lay)
						if err != nil {
							t.Fatal(err)
						}
						if !reflect.DeepEqual(with, without) {
							t.Fatal("the envelope with AVX differs from the one without")
						}
					})
				}
			}
		}
	}
}

// TestFoldSignsIsDirect checks the fold of N and V formed for both
// effects at once (foldSigns, AVX) against classify, sumsOver and
// largestOver over each effect's values, the direct pass over the units
// that foldCase.fold makes otherwise: the sums of N, V and M₀ of the
// positive and the round-off units, the largest sizes and counts by sign
// and the sum of the values, the same to the last bit, no tolerance.
// The values are random (fixed seed) with sizes at and next to each
// effect's own round-off, zeros of either sign, infinities and NaN.
func TestFoldSignsIsDirect(t *testing.T) {
	if !hasAVXHere() {
		t.Skip("no AVX")
	}
	rng := rand.New(rand.NewPCG(5, 29))
	nz := [2]float64{1e-6, 3e-4}
	num := func(nz float64) float64 {
		switch rng.IntN(12) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return nz
		case 3:
			return -nz
		case 4:
			return math.Nextafter(nz, 1)
		case 5:
			if rng.IntN(10) == 0 {
				return math.NaN()
			}
		case 6:
			if rng.IntN(10) == 0 {
				return math.Inf(1 - 2*rng.IntN(2))
			}
		}
		return rng.NormFloat64() * 10
	}
	for _, nu := range []int{1, 2, 5, 300} {
		t.Run(fmt.Sprintf("%d units", nu), func(t *testing.T) {
			x := [2][]float64{make([]float64, nu), make([]float64, nu)}
			n, v, a := make([]float64, nu), make([]float64, nu), make([]float64, nu)
			for u := range nu {
				x[0][u], x[1][u] = num(nz[0]), num(nz[1])
				n[u], v[u], a[u] = rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()
			}
			sg, tot := foldSigns(x[0], x[1], n, v, a, nz)
			pos, neg, zer := make([]int32, nu), make([]int32, nu), make([]int32, nu)
			for j := range 2 {
				m0, np, nn, nr := classify(x[j], nz[j], pos, neg, zer)
				var want stationSigns
				want.pos[0], want.pos[1], want.pos[2], want.big[0] = sumsOver(pos[:np], n, v, a, x[j])
				want.zero[0], want.zero[1], want.zero[2], _ = sumsOver(zer[:nr], n, v, a, x[j])
				want.big[1] = largestOver(neg[:nn], x[j])
				want.count = [2]int{np, nn}
				got := sg[j]
				if !sameBits(append(got.pos[:], append(got.zero[:], got.big[:]...)...), append(want.pos[:], append(want.zero[:], want.big[:]...)...)) || got.count != want.count {
					t.Errorf("effect %d: %+v, want %+v", j, got, want)
				}
				if math.Float64bits(tot[j]) != math.Float64bits(m0) {
					t.Errorf("effect %d: sum %v, want %v", j, tot[j], m0)
				}
			}
		})
	}
}
