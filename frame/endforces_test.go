package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// oddFrame is slopedFrame (a pitched rafter released at its start, a
// beam hinged at its far end) with a beam drawn right to left across the
// top of the columns and a leaning strut, and nc cases drawn from rng:
// member loads on random members, node loads, and in every seventh case a
// settlement of a support; a case of its own loads nothing.
func oddFrame(rng *rand.Rand, nc int) *Model {
	mo := slopedFrame(ReleaseStart, -1, 0)
	mo.Cases = nil
	// d to b, right to left, and a strut from a to c.
	mo.Members = append(mo.Members, Member{Name: "d-b", Start: 3, End: 1, Section: 1},
		Member{Name: "a-c", Start: 0, End: 2, Section: 0, Release: ReleaseBoth})
	for c := range nc {
		cs := Case{Name: fmt.Sprint("case ", c)}
		switch {
		case c == 2:
			// nothing: every displacement and end force is zero
		case c%7 == 6:
			cs.Displacements = []NodeDisplacement{{Node: 4, Uy: -0.01 * rng.Float64(), Rz: 1e-3}}
		default:
			for range 1 + rng.IntN(3) {
				m := rng.IntN(len(mo.Members))
				l := mo.Length(m)
				cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, From: 0.1 * l, To: 0.7 * l, W: rng.Float64()*20 - 10, WEnd: -3})
			}
			cs.NodeLoads = []NodeLoad{{Node: 1 + rng.IntN(3), Fx: rng.Float64()*10 - 5, Fy: -rng.Float64() * 20}}
		}
		mo.Cases = append(mo.Cases, cs)
	}
	return mo
}

// The end forces of every case at once, four lanes at a time with AVX,
// are the pure-Go ones to the last bit (with the local displacements,
// those of DisplacementsEach), and those of EndForces, for every
// number of cases around the width of the lanes, members sloping, drawn
// right to left and released, cases that load a member and cases that do
// not.
func TestEndForcesLanesAreThePureGoOnes(t *testing.T) {
	if !hasAVX() {
		t.Skip("no AVX here: the pure-Go path only, which TestColumnsAgreeWithPerCaseCalls checks")
	}
	defer func(v bool) { useAVX = v }(useAVX)
	rng := rand.New(rand.NewPCG(11, 3))
	for _, nc := range []int{1, 3, 4, 5, 7, 8, 9, 14, 37} {
		mo := oddFrame(rng, nc)
		sol := solve(t, mo)
		for _, rows := range []int{3, 6} {
			t.Run(fmt.Sprintf("%d-cases/%d-rows", nc, rows), func(t *testing.T) {
				lanes, plain := make([][6]float64, nc), make([][6]float64, nc)
				both, disp, plainDisp := make([][6]float64, nc), make([][6]float64, nc), make([][6]float64, nc)
				for m := range mo.Members {
					for c := range lanes {
						lanes[c] = [6]float64{1, 2, 3, 4, 5, 6} // overwritten
					}
					useAVX = true
					sol.endForcesEach(lanes, m, rows)
					if rows == 3 {
						sol.StartForcesAndDisplacementsEach(both, disp, m)
					}
					useAVX = false
					sol.endForcesEach(plain, m, rows)
					if rows == 3 {
						sol.DisplacementsEach(plainDisp, m)
					}
					for c := range nc {
						if !sameBits(lanes[c][:], plain[c][:]) {
							t.Fatalf("member %d case %d: lanes %v, pure Go %v", m, c, lanes[c], plain[c])
						}
						if rows == 3 && (!sameBits(both[c][:], plain[c][:]) || !sameBits(disp[c][:], plainDisp[c][:])) {
							t.Fatalf("member %d case %d: StartForcesAndDisplacementsEach %v %v, pure Go %v %v", m, c, both[c], disp[c], plain[c], plainDisp[c])
						}
						f := sol.EndForces(c, m)
						for i := range 6 {
							want := f[i]
							if i >= rows {
								want = 0
							}
							if math.Float64bits(lanes[c][i]) != math.Float64bits(want) {
								t.Fatalf("member %d case %d: end force %d %v, EndForces %v", m, c, i, lanes[c][i], want)
							}
						}
					}
				}
			})
		}
	}
}

// The kernel alone, on numbers a solution rarely holds: signed zeros
// (0 + (−0) is +0, which the sum's first term must keep), subnormals,
// very large and very small values, against the pure-Go column.
func TestEndForces4Bits(t *testing.T) {
	if !hasAVX() {
		t.Skip("no AVX here")
	}
	rng := rand.New(rand.NewPCG(2, 9))
	special := []float64{0, math.Copysign(0, -1), 5e-324, -1e-310, 1e300, -3e-300, 1, -1}
	value := func() float64 {
		if rng.IntN(3) == 0 {
			return special[rng.IntN(len(special))]
		}
		return (rng.Float64()*2 - 1) * math.Ldexp(1, rng.IntN(40)-20)
	}
	const nc = 4 * 25
	for trial := range 20 {
		var k [6][6]float64
		for i := range k {
			for j := range k[i] {
				k[i][j] = value()
			}
		}
		angle := rng.Float64() * 2 * math.Pi
		cs, sn := math.Cos(angle), math.Sin(angle)
		if trial%4 == 0 {
			cs, sn = 0, -1 // a member drawn straight down
		}
		var disp [6][]float64
		for d := range disp {
			disp[d] = make([]float64, nc)
			for c := range disp[d] {
				disp[d][c] = value()
			}
		}
		if trial%5 == 1 {
			// Displacements +0 and a negative stiffness: every product is
			// −0, whose sum is +0 only because the first term is added to
			// 0, as the pure-Go sum adds it.
			cs, sn = math.Abs(cs), math.Abs(sn)
			for i := range k {
				for j := range k[i] {
					k[i][j] = -math.Abs(k[i][j]) - 1
				}
			}
			for d := range disp {
				clear(disp[d])
			}
		}
		for _, rows := range []int{3, 6} {
			got, local := make([][6]float64, nc), make([][6]float64, nc)
			endForces4(&got[0], &disp[0][0], &disp[1][0], &disp[2][0], &disp[3][0], &disp[4][0], &disp[5][0], nc/4, &k, cs, sn, rows, &local[0])
			alone := make([][6]float64, nc) // without the displacements
			endForces4(&alone[0], &disp[0][0], &disp[1][0], &disp[2][0], &disp[3][0], &disp[4][0], &disp[5][0], nc/4, &k, cs, sn, rows, nil)
			for c := range nc {
				var want [6]float64
				u := endForcesCol(&want, &k, cs, sn, &disp, c, rows)
				if !sameBits(got[c][:], want[:]) || !sameBits(alone[c][:], want[:]) {
					t.Fatalf("trial %d, %d rows, case %d: kernel %v (%v without the displacements), pure Go %v", trial, rows, c, got[c], alone[c], want)
				}
				if !sameBits(local[c][:], u[:]) {
					t.Fatalf("trial %d, %d rows, case %d: local displacements %v, pure Go %v", trial, rows, c, local[c], u)
				}
			}
		}
	}
}

// sameBits reports whether a and b hold the same numbers to the bit (a
// NaN equal to a NaN of the same bits).
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

// BenchmarkEndForcesEach measures every member's end forces in every case
// (EndForcesEach, and StartForcesEach, the start's only), the pure-Go
// loop against the four lanes of AVX.
func BenchmarkEndForcesEach(b *testing.B) {
	defer func(v bool) { useAVX = v }(useAVX)
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		mo := pieceFrame(size.bays, size.storeys)
		sol, err := Solve(mo)
		if err != nil {
			b.Fatal(err)
		}
		dst := make([][6]float64, len(mo.Cases))
		for _, rows := range []int{6, 3} {
			for _, avx := range []bool{false, true} {
				if avx && !hasAVX() {
					continue
				}
				b.Run(fmt.Sprintf("%dx%d/%d-columns/%d-rows/avx=%v", size.bays, size.storeys, len(mo.Cases), rows, avx), func(b *testing.B) {
					useAVX = avx
					b.ReportAllocs()
					for b.Loop() {
						for m := range mo.Members {
							sol.endForcesEach(dst, m, rows)
						}
					}
				})
			}
		}
	}
}

// stationsToRef is stationsTo as it was, each case's end forces formed
// alone (endForcesTo, from values a row apart): the reference the
// per-member form must equal to the last bit.
func (sol *Solution) stationsToRef(dst []Forces, defl []float64, m int, xs []float64) {
	e := &sol.elems[m]
	var w [][6]float64
	if e.so != nil {
		w = e.weights(xs)
	}
	var f [6]float64
	for c := range len(sol.model.Cases) {
		sol.endForcesTo(&f, c, m)
		idx, _ := sol.loadsOn(c, m)
		row := dst[c*len(xs) : (c+1)*len(xs)]
		loads := sol.model.Cases[c].MemberLoads
		if defl != nil {
			deflectionsTo(defl[c*len(xs):(c+1)*len(xs)], &f, e, loads, idx, xs)
		}
		if len(idx) == 0 {
			for i, x := range xs {
				row[i] = Forces{N: -f[0], V: f[1], M: -f[2] + x*f[1]}
			}
		} else {
			for i, x := range xs {
				row[i] = stationForces(f[0], f[1], f[2], x, e.l, e.c, e.s, loads, idx)
			}
		}
		if e.so != nil {
			var d []float64
			if defl != nil {
				d = defl[c*len(xs) : (c+1)*len(xs)]
			}
			sol.secondWith(w, row, d, c, m, xs)
		}
	}
}

// The stations of every case, formed from the end forces of all of them
// at once, are those of each case formed alone, to the last bit: first and
// second order, with and without AVX, on the odd frame (sloping, drawn
// right to left, released) and on a shuffled grid with every kind of load.
func TestStationsFromEveryCaseAreThePerCaseOnes(t *testing.T) {
	defer func(v bool) { useAVX = v }(useAVX)
	odd := oddFrame(rand.New(rand.NewPCG(8, 1)), 11)
	grid := columnsFrame()
	axial := make([]float64, len(grid.Members))
	for m := range axial {
		axial[m] = -150 + 20*float64(m%5)
	}
	xs := []float64{0, 0.3, 1.1, 2.5, 3.5}
	for _, tc := range []struct {
		name  string
		mo    *Model
		axial []float64
	}{{"odd frame", odd, nil}, {"grid", grid, nil}, {"grid, second order", grid, axial}} {
		sol, err := SolveWith(tc.mo, Options{Axial: tc.axial})
		if err != nil {
			t.Fatal(err)
		}
		nc := len(tc.mo.Cases)
		for _, avx := range []bool{false, true} {
			if avx && !hasAVX() {
				continue
			}
			t.Run(fmt.Sprintf("%s/avx=%v", tc.name, avx), func(t *testing.T) {
				useAVX = avx
				got, want := make([]Forces, len(xs)*nc), make([]Forces, len(xs)*nc)
				gotDefl, wantDefl := make([]float64, len(xs)*nc), make([]float64, len(xs)*nc)
				for m := range tc.mo.Members {
					sol.StationsAndDeflectionsTo(got, gotDefl, m, xs)
					sol.stationsToRef(want, wantDefl, m, xs)
					for i := range got {
						g, w := got[i], want[i]
						if !sameBits([]float64{g.N, g.V, g.M, gotDefl[i]}, []float64{w.N, w.V, w.M, wantDefl[i]}) {
							t.Fatalf("member %d case %d x %v: %v (deflection %v), case by case %v (%v)", m, i/len(xs), xs[i%len(xs)], g, gotDefl[i], w, wantDefl[i])
						}
					}
				}
			})
		}
	}
}
