package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"testing"
)

// randomFrame returns a frame of bays × storeys with fixed or pinned
// bases, random bay widths, storey heights and sections, some beams
// released at one or both ends, some semi-rigid, some with rigid end
// zones, and axial forces from gravity on the columns (compression) and a
// few beams in tension or compression.
func randomFrame(rng *rand.Rand, bays, storeys int) (*Model, []float64) {
	mo := &Model{}
	xs := []float64{0}
	for range bays {
		xs = append(xs, xs[len(xs)-1]+4+4*rng.Float64())
	}
	ys := []float64{0}
	for range storeys {
		ys = append(ys, ys[len(ys)-1]+3+1.5*rng.Float64())
	}
	for range 4 {
		mo.Sections = append(mo.Sections, Section{Name: fmt.Sprintf("S%d", len(mo.Sections)), E: 2e8, A: 5e-3 + 1e-2*rng.Float64(), I: 5e-5 + 3e-4*rng.Float64()})
	}
	node := func(i, j int) int { return j*(bays+1) + i }
	for j, y := range ys {
		for _, x := range xs {
			n := Node{Name: fmt.Sprintf("N%d", len(mo.Nodes)), X: x, Y: y}
			if j == 0 {
				n.Support = Fixed
				if rng.IntN(3) == 0 {
					n.Support = Pinned
				}
			}
			mo.Nodes = append(mo.Nodes, n)
		}
	}
	var axial []float64
	for j := range storeys {
		for i := range bays + 1 {
			m := Member{Name: fmt.Sprintf("C%d", len(mo.Members)), Start: node(i, j), End: node(i, j+1), Section: rng.IntN(4)}
			if rng.IntN(4) == 0 {
				m.OffsetStart, m.OffsetEnd = 0.2*rng.Float64(), 0.3*rng.Float64()
			}
			mo.Members = append(mo.Members, m)
			axial = append(axial, -float64(storeys-j)*(100+400*rng.Float64()))
		}
		for i := range bays {
			m := Member{Name: fmt.Sprintf("B%d", len(mo.Members)), Start: node(i, j+1), End: node(i+1, j+1), Section: rng.IntN(4)}
			switch rng.IntN(6) {
			case 0:
				m.Release = ReleaseStart
			case 1:
				m.Release = ReleaseBoth
			case 2:
				m.SpringStart, m.SpringEnd = 1e4*(1+rng.Float64()), 5e4
			case 3:
				m.OffsetStart, m.OffsetEnd = 0.25, 0.1*rng.Float64()
			}
			mo.Members = append(mo.Members, m)
			axial = append(axial, 200*(rng.Float64()-0.6))
		}
	}
	return mo, axial
}

// TestBucklingAgainstBisection compares αcr by Lanczos iteration on one
// factor of K with the search that factors K + λ·Kg at each trial λ and
// brackets the singular one (each trial's positive definiteness is Sylvester's
// law of inertia, independent of any eigenvector): on random frames with
// releases, semi-rigid ends and rigid end zones, to 1e-6.
func TestBucklingAgainstBisection(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 2))
	for _, size := range [][2]int{{1, 1}, {2, 3}, {3, 5}, {4, 8}, {6, 4}} {
		for k := range 3 {
			mo, axial := randomFrame(rng, size[0], size[1])
			t.Run("", func(t *testing.T) {
				want, err := criticalBisect(mo, axial)
				if err != nil {
					t.Fatal(err)
				}
				b, err := NewBuckling(mo)
				if err != nil {
					t.Fatal(err)
				}
				got, err := b.Factor(axial)
				if err != nil {
					t.Fatal(err)
				}
				if !within(got, want, 1e-6) {
					t.Errorf("%d × %d frame %d: αcr %.9g, bisection %.9g", size[0], size[1], k, got, want)
				}
			})
		}
	}
}

// TestBucklingPencil checks that each member's pencil, its own degrees of
// freedom condensed out at axial force n (condensedAt, which the check of
// a factor assembles), is the member stiffness the second-order solve
// uses (newElementAxial: condensed in the other order, inner nodes, then
// releases and springs, then rigid zones), to 1e-9 of its largest
// diagonal term; and that a member beyond its own buckling load between
// held ends (Euler, π²EI/L² for the pinned-pinned flexible part: a
// released end) is refused by both.
func TestBucklingPencil(t *testing.T) {
	mo := &Model{
		Sections: []Section{{Name: "S", E: 2e8, A: 1e-2, I: 2e-4}},
		Nodes:    []Node{{Name: "A", Support: Fixed}, {Name: "B", X: 3, Y: 4}},
	}
	for _, m := range []Member{
		{Name: "rigid"},
		{Name: "released start", Release: ReleaseStart},
		{Name: "released end", Release: ReleaseEnd},
		{Name: "released both", Release: ReleaseBoth},
		{Name: "springs", SpringStart: 3e3, SpringEnd: 7e4},
		{Name: "zones", OffsetStart: 0.3, OffsetEnd: 0.5},
		{Name: "all", Release: ReleaseEnd, SpringStart: 2e4, OffsetStart: 0.2, OffsetEnd: 0.4},
	} {
		t.Run(m.Name, func(t *testing.T) {
			m.Start, m.End = 0, 1
			mo.Members = []Member{m}
			e := newElement(mo, 0)
			var p pencil
			var st pencilStore
			k0, ok := p.build(&e, &st)
			if !ok {
				t.Fatal("pencil not positive definite")
			}
			for _, n := range []float64{-300, 0, 500} {
				k, ok := p.condensedAt(n)
				if !ok {
					t.Fatal("pencil at n not positive definite")
				}
				if n == 0 {
					for i := range 6 {
						for j := range 6 {
							if math.Abs(k[i][j]-k0[i][j]) > 1e-12*math.Abs(k0[i][i]) {
								t.Errorf("k[%d][%d] at n = 0 %.15g, built %.15g", i, j, k[i][j], k0[i][j])
							}
						}
					}
				}
				want, ok := newElementAxial(mo, 0, n, true)
				if !ok {
					t.Fatal("element not positive definite")
				}
				scale := 0.0
				for i := range 6 {
					scale = max(scale, math.Abs(want.k[i][i]))
				}
				for i := range 6 {
					for j := range 6 {
						if math.Abs(k[i][j]-want.k[i][j]) > 1e-9*scale {
							t.Errorf("N = %g: k[%d][%d] %.10g, the element's %.10g", n, i, j, k[i][j], want.k[i][j])
						}
					}
				}
			}
			if m.Release == ReleaseBoth && m.OffsetStart == 0 && m.OffsetEnd == 0 {
				euler := math.Pi * math.Pi * 2e8 * 2e-4 / 25
				if _, ok := p.condensedAt(-1.01 * euler); ok {
					t.Errorf("pinned member at 1.01 × the Euler load accepted")
				}
				if _, ok := newElementAxial(mo, 0, -1.01*euler, true); ok {
					t.Errorf("pinned member at 1.01 × the Euler load accepted by the element")
				}
				if _, ok := p.condensedAt(-0.99 * euler); !ok {
					t.Errorf("pinned member at 0.99 × the Euler load refused")
				}
			}
		})
	}
}

// BenchmarkCriticalFactor measures αcr of a random frame: the factor of K
// once per size (NewBuckling) and one set of axial forces (Factor), and
// the search by factorizations it replaces.
func BenchmarkCriticalFactor(b *testing.B) {
	for _, size := range [][2]int{{10, 10}, {30, 20}, {30, 60}} {
		mo, axial := randomFrame(rand.New(rand.NewPCG(18, 1)), size[0], size[1])
		name := fmt.Sprintf("%dx%d", size[0], size[1])
		b.Run(name+"/new", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := NewBuckling(mo); err != nil {
					b.Fatal(err)
				}
			}
		})
		bk, err := NewBuckling(mo)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(name+"/factor", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := bk.Factor(axial); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(name+"/bisection", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := criticalBisect(mo, axial); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestBucklingBatch checks that the factors of several sets of axial
// forces found side by side (the others started from their Ritz vectors
// on the first's Lanczos vectors)
// are those found one by one, within 1e-7, and
// that the check a factor passes tells the two sides of it apart: K + λ·Kg
// positive definite at 0.999 αcr and not at 1.001 αcr (Sylvester's law of
// inertia).
func TestBucklingBatch(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 3))
	mo, axial := randomFrame(rng, 3, 4)
	sets := [][]float64{axial, make([]float64, len(axial)), nil, nil}
	for _, k := range []int{2, 3} {
		a := make([]float64, len(axial))
		for m := range a {
			a[m] = axial[m] * (1 + 0.5*rng.Float64()) / float64(k)
		}
		sets[k] = a
	}
	b, err := NewBuckling(mo)
	if err != nil {
		t.Fatal(err)
	}
	all, err := b.Factors(sets)
	if err != nil {
		t.Fatal(err)
	}
	// The sets after the first are split between the processors: on one
	// the same numbers, to the last bit.
	single := func() []float64 {
		defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(1))
		out, err := b.Factors(sets)
		if err != nil {
			t.Fatal(err)
		}
		return out
	}()
	for i := range sets {
		if single[i] != all[i] {
			t.Errorf("set %d: αcr %.17g on one processor, %.17g on several", i, single[i], all[i])
		}
	}
	for i, set := range sets {
		one, err := b.Factor(set)
		if err != nil {
			t.Fatal(err)
		}
		if !(one == all[i] || within(all[i], one, 1e-7)) {
			t.Errorf("set %d: αcr %.10g side by side, %.10g alone", i, all[i], one)
		}
		if i == 1 {
			if !math.IsInf(one, 1) {
				t.Errorf("no axial force: αcr %g, want +Inf", one)
			}
			continue
		}
		if !b.definite(0.999*one, set, nil) || b.definite(1.001*one, set, nil) {
			t.Errorf("set %d: the stiffness at 0.999 and 1.001 αcr = %.7g is not positive definite below and indefinite above", i, one)
		}
	}
}

// TestBucklingCertify: a Ritz value that is not the largest eigenvalue's
// (a mode missed: here the second buckling mode's) is never reported; the
// check sees K + λ·Kg indefinite below it and the search of
// factorizations gives αcr. On the pinned strut, the Euler loads
// π²EI/L² and 4π²EI/L² (Timoshenko & Gere, Theory of Elastic Stability).
func TestBucklingCertify(t *testing.T) {
	const ei, l, p = 250.0, 10.0, 4.0
	mo := &Model{
		Sections: []Section{{Name: "S", E: 1, A: 1e6 * ei / (l * l), I: ei}},
		Nodes:    []Node{{Name: "A", Support: Pinned}, {Name: "B", X: l, Support: HoldY}},
		Members:  []Member{{Name: "AB", Start: 0, End: 1}},
	}
	b, err := NewBuckling(mo)
	if err != nil {
		t.Fatal(err)
	}
	axial := []float64{-p}
	want := math.Pi * math.Pi * ei / (l * l) / p
	for _, tc := range []struct {
		name string
		mu   float64
	}{{"the first mode", 1 / want}, {"the second mode", 1 / (4 * want)}, {"none", 1e-13}} {
		t.Run(tc.name, func(t *testing.T) {
			got, err := b.certify(tc.mu, axial, nil)
			if err != nil {
				t.Fatal(err)
			}
			if !within(got, want, 6e-4) {
				t.Errorf("αcr %.7g, want π²EI/L²/P = %.7g", got, want)
			}
		})
	}
}

// randomSets returns k sets of axial forces for the frame of axial: the
// first axial itself, the others each member's force times a random
// factor between 0.5 and 1.5 (fixed seed), as a frame's combinations
// differ.
func randomSets(rng *rand.Rand, axial []float64, k int) [][]float64 {
	sets := [][]float64{axial}
	for range k - 1 {
		a := make([]float64, len(axial))
		for m := range a {
			a[m] = axial[m] * (0.5 + rng.Float64())
		}
		sets = append(sets, a)
	}
	return sets
}

// BenchmarkCriticalFactors measures what a run pays for αcr of its
// combinations: the factor of K (NewBuckling) and the factors of nine
// sets of axial forces on it (Factors), on random frames of a few sizes.
// Beside the time, cpu-ns/op is the process's processor time (user and
// system, every thread) per operation: on a machine shared with other
// work it is the steadier figure.
func BenchmarkCriticalFactors(b *testing.B) {
	for _, size := range [][2]int{{10, 10}, {30, 20}, {30, 60}} {
		rng := rand.New(rand.NewPCG(18, 2))
		mo, axial := randomFrame(rng, size[0], size[1])
		sets := randomSets(rng, axial, 9)
		b.Run(fmt.Sprintf("%dx%d", size[0], size[1]), func(b *testing.B) {
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				bk, err := NewBuckling(mo)
				if err != nil {
					b.Fatal(err)
				}
				if _, err := bk.Factors(sets); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		})
	}
}
