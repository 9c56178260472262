package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"testing"
)

// TestProjectIsDirect checks the projection of the later sets' −Kg on the
// first set's vectors, formed member by member in two halves, against
// the direct product Qᵀ(−Kg Q), −Kg Q by the Lanczos iteration's own
// product (mulKg, every member's Kg times the whole vector), to 1e-12 of
// the largest entry, on a random frame (fixed seed) and random vectors.
func TestProjectIsDirect(t *testing.T) {
	const tol = 1e-12
	rng := rand.New(rand.NewPCG(30, 1))
	mo, axial := randomFrame(rng, 4, 5)
	b, err := NewBuckling(mo)
	if err != nil {
		t.Fatal(err)
	}
	sets := randomSets(rng, axial, 3)
	for _, m := range []int{1, 5} {
		t.Run("", func(t *testing.T) {
			qs := make([][]float64, m)
			for j := range qs {
				qs[j] = make([]float64, b.size)
				for i := range qs[j] {
					qs[j][i] = rng.Float64() - 0.5
				}
			}
			got := b.project(sets, qs)
			for c, set := range sets {
				scale, worst := 0.0, 0.0
				for j := range m {
					out := make([]float64, b.size)
					b.mulKg(out, qs[j], [][]float64{set})
					for i := range m {
						want := dot(qs[i], out)
						scale = max(scale, math.Abs(want))
						worst = max(worst, math.Abs(got[c][i*m+j]-want))
					}
				}
				if worst > tol*scale {
					t.Errorf("%d vectors, set %d: Qᵀ(−Kg)Q off by %.3g of its largest entry %.3g", m, c, worst/scale, scale)
				}
			}
		})
	}
}

// TestRitzStarts checks each later set's start against the bounds of the
// Rayleigh–Ritz projection (Courant–Fischer; Parlett, The Symmetric
// Eigenvalue Problem, ch. 11, from memory): its Rayleigh quotient in the
// K inner product, yᵀ(−Kg)y / yᵀKy, is at least that of the first set's
// mode (which lies in the space projected on) and at most μ = 1/αcr of
// the set, αcr by the search of factorizations (Sylvester's law of
// inertia); both to 1e-9 relative.
func TestRitzStarts(t *testing.T) {
	const tol = 1e-9
	rng := rand.New(rand.NewPCG(30, 2))
	mo, axial := randomFrame(rng, 5, 6)
	sets := randomSets(rng, axial, 5)
	b, err := NewBuckling(mo)
	if err != nil {
		t.Fatal(err)
	}
	z := make([]float64, b.size)
	for i := range z {
		z[i] = rng.Float64() - 0.5
	}
	r := append([]float64(nil), z...)
	b.solveK(r, 1)
	_, errs, first := b.lanczos(sets[:1], [][]float64{r}, [][]float64{z}, true, nil)
	if errs[0] != nil || first == nil {
		t.Fatal("the first set's iteration failed", errs[0])
	}
	mode, kmode := ritzVector(first.qs, first.ps, first.alpha, first.beta)
	rayleigh := func(y, ky []float64, set []float64) float64 {
		g := make([]float64, b.size)
		b.mulKg(g, y, [][]float64{set})
		return dot(y, g) / dot(y, ky)
	}
	rs, zs := b.ritzStarts(sets[1:], first, make([]float64, b.size), make([]float64, b.size))
	for c, set := range sets[1:] {
		t.Run("", func(t *testing.T) {
			alpha, err := criticalBisect(mo, set)
			if err != nil {
				t.Fatal(err)
			}
			got, low, high := rayleigh(rs[c], zs[c], set), rayleigh(mode, kmode, set), 1/alpha
			if got < low*(1-tol) || got > high*(1+tol) {
				t.Errorf("set %d: Rayleigh quotient of the start %.10g, not between the first set's mode's %.10g and 1/αcr = %.10g", c+1, got, low, high)
			}
		})
	}
}

// TestBucklingLongFirst checks the factors when the first set's
// iteration is longer than the space the others' starts are projected
// on (here, more than 2 vectors: they start from its mode alone, the
// other way): against the search of factorizations to 1e-6, and the same
// to the last bit on one processor and on several.
func TestBucklingLongFirst(t *testing.T) {
	defer func(m int) { maxRitzBasis = m }(maxRitzBasis)
	maxRitzBasis = 2
	rng := rand.New(rand.NewPCG(30, 3))
	mo, axial := randomFrame(rng, 3, 5)
	sets := randomSets(rng, axial, 4)
	b, err := NewBuckling(mo)
	if err != nil {
		t.Fatal(err)
	}
	all, err := b.Factors(sets)
	if err != nil {
		t.Fatal(err)
	}
	single := func() []float64 {
		defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(1))
		out, err := b.Factors(sets)
		if err != nil {
			t.Fatal(err)
		}
		return out
	}()
	for i, set := range sets {
		t.Run("", func(t *testing.T) {
			want, err := criticalBisect(mo, set)
			if err != nil {
				t.Fatal(err)
			}
			if !within(all[i], want, 1e-6) {
				t.Errorf("set %d: αcr %.9g, bisection %.9g", i, all[i], want)
			}
			if single[i] != all[i] {
				t.Errorf("set %d: αcr %.17g on one processor, %.17g on several", i, single[i], all[i])
			}
		})
	}
}

// combinedSets returns the regular frame of bays × storeys of gridFrame
// and nine sets of axial forces on it as a run's combinations make them:
// the member forces of three load cases solved on it (a permanent load on
// every beam, an imposed one on every other bay, and a wind load at each
// floor), added with the factors of the basic combinations 1.4D,
// 1.2D + 1.6L and so on (ASCE 7-16 2.3.1, from memory).
func combinedSets(tb testing.TB, bays, storeys int) (*Model, [][]float64) {
	mo := gridFrame(bays, storeys, 1)
	dead, live, wind := Case{Name: "D"}, Case{Name: "L"}, Case{Name: "W"}
	for m := range mo.Members {
		if mo.IsBeam(m) {
			dead.MemberLoads = append(dead.MemberLoads, MemberLoad{Member: m, To: mo.Length(m), W: 20, WEnd: 20})
			if m%2 == 0 {
				live.MemberLoads = append(live.MemberLoads, MemberLoad{Member: m, To: mo.Length(m), W: 12, WEnd: 12})
			}
		}
	}
	for v, n := range mo.Nodes {
		if n.X == 0 && n.Y > 0 {
			wind.NodeLoads = append(wind.NodeLoads, NodeLoad{Node: v, Fx: 15})
		}
	}
	mo.Cases = []Case{dead, live, wind}
	sol, err := Solve(mo)
	if err != nil {
		tb.Fatal(err)
	}
	forces := make([][]float64, 3)
	for c := range forces {
		forces[c] = make([]float64, len(mo.Members))
		for m := range mo.Members {
			f := sol.EndForces(c, m)
			forces[c][m] = (-f[0] + f[3]) / 2
		}
	}
	var sets [][]float64
	for _, f := range [][3]float64{{1.4, 0, 0}, {1.2, 1.6, 0}, {1.2, 1, 0.5}, {1.2, 1, -0.5}, {1.2, 1, 1}, {1.2, 1, -1}, {0.9, 0, 1}, {0.9, 0, -1}, {1.2, 0.5, 0}} {
		s := make([]float64, len(mo.Members))
		for m := range s {
			s[m] = f[0]*forces[0][m] + f[1]*forces[1][m] + f[2]*forces[2][m]
		}
		sets = append(sets, s)
	}
	return &Model{Nodes: mo.Nodes, Sections: mo.Sections, Members: mo.Members}, sets
}

// BenchmarkCriticalCombinations is BenchmarkCriticalFactors on the
// regular frames of combinedSets, the nine sets of axial forces those of
// combinations of three load cases, whose modes are alike as a building
// frame's are (the sets of BenchmarkCriticalFactors differ member by
// member at random); "alone" finds each set's factor by a call of its
// own on the same factor of K, as a second-order run did for each of its
// combinations. cpu-ns/op as there.
func BenchmarkCriticalCombinations(b *testing.B) {
	for _, size := range [][2]int{{10, 10}, {30, 20}, {30, 60}} {
		mo, sets := combinedSets(b, size[0], size[1])
		for _, alone := range []bool{false, true} {
			name := fmt.Sprintf("%dx%d", size[0], size[1])
			if alone {
				name += "/alone"
			}
			b.Run(name, func(b *testing.B) {
				b.ReportAllocs()
				start := cpuTime()
				for b.Loop() {
					bk, err := NewBuckling(mo)
					if err != nil {
						b.Fatal(err)
					}
					if !alone {
						if _, err := bk.Factors(sets); err != nil {
							b.Fatal(err)
						}
						continue
					}
					for _, set := range sets {
						if _, err := bk.Factor(set); err != nil {
							b.Fatal(err)
						}
					}
				}
				b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
			})
		}
	}
}

// TestFactorsLendVectors checks that the later sets' Lanczos iterations,
// which write over the vectors of the first set's and of those done
// before them (vectors), read none of them before writing it: with each
// vector lent again filled with NaN (poisonVectors) every factor is the
// same to the last bit, on one processor and two, on the regular frame
// with the combinations of combinedSets and on a random frame whose sets
// differ member by member (both checked against the search of
// factorizations, criticalBisect, to 1e-6).
func TestFactorsLendVectors(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 7))
	rmo, axial := randomFrame(rng, 4, 6)
	gmo, gsets := combinedSets(t, 5, 7)
	for _, tc := range []struct {
		name string
		mo   *Model
		sets [][]float64
	}{{"regular 5 x 7", gmo, gsets}, {"random 4 x 6", rmo, randomSets(rng, axial, 6)}} {
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				b, err := NewBuckling(tc.mo)
				if err != nil {
					t.Fatal(err)
				}
				want, err := b.Factors(tc.sets)
				if err != nil {
					t.Fatal(err)
				}
				poisonVectors = true
				defer func() { poisonVectors = false }()
				got, err := b.Factors(tc.sets)
				if err != nil {
					t.Fatal(err)
				}
				for i := range want {
					if got[i] != want[i] {
						t.Errorf("set %d: αcr %.17g with vectors lent again, %.17g", i, got[i], want[i])
					}
					if i < 3 {
						if bis, err := criticalBisect(tc.mo, tc.sets[i]); err != nil || !within(got[i], bis, 1e-6) {
							t.Errorf("set %d: αcr %.9g, bisection %.9g (%v)", i, got[i], bis, err)
						}
					}
				}
			})
		}
	}
}
