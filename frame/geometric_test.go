package frame

import (
	"errors"
	"math"
	"testing"
)

// secondTol is the agreement asked of the subdivided members with the
// closed forms: 0.1 %, the accuracy asked of P-δ.
const secondTol = 1e-3

// beamColumn returns a vertical member of length l with EI = ei from a
// base node at the origin, supports base and top, loaded at the top by a
// horizontal force h and a downward force p.
func beamColumn(l, ei, h, p float64, base, top Support) *Model {
	return &Model{
		// EA large against EI/L²: the closed forms neglect shortening.
		Sections: []Section{{Name: "S", E: 1, A: 1e6 * ei / (l * l), I: ei}},
		Nodes:    []Node{{Name: "B", Support: base}, {Name: "T", Y: l, Support: top}},
		Members:  []Member{{Name: "BT", Start: 0, End: 1}},
		Cases:    []Case{{Name: "c", NodeLoads: []NodeLoad{{Node: 1, Fx: h, Fy: -p}}}},
	}
}

func within(got, want, tol float64) bool { return math.Abs(got-want) <= tol*math.Abs(want) }

func solveAxial(t *testing.T, mo *Model, axial []float64) *Solution {
	t.Helper()
	sol, err := SolveWith(mo, Options{Axial: axial})
	if err != nil {
		t.Fatal(err)
	}
	return sol
}

// TestSecondOrderCantilever checks the cantilever column (fixed base, free
// top) against the closed form of the beam-column (Timoshenko & Gere,
// Theory of Elastic Stability, the cantilever under axial load P and
// lateral load H at the top): δ = H(tan kL − kL)/(P k), k = √(P/EI),
// base moment H L + P δ = H tan(kL)/k, and the Euler load of the
// cantilever π²EI/(4L²).
func TestSecondOrderCantilever(t *testing.T) {
	const ei, l, p, h = 250.0, 10.0, 4.0, 0.045
	k := math.Sqrt(p / ei)
	delta := h * (math.Tan(k*l) - k*l) / (p * k)
	if !within(delta, 0.169134, 2e-6) {
		t.Fatalf("closed form δ = %.7g, want 0.169134", delta)
	}
	mBase := h * l * math.Tan(k*l) / (k * l)
	if !within(mBase, 1.126536, 2e-6) {
		t.Fatalf("closed form base moment %.7g, want 1.126536", mBase)
	}
	for _, tc := range []struct {
		name string
		zone float64 // a rigid zone at the base: the flexible length stays l
	}{{"plain", 0}, {"on a rigid base zone", 2}} {
		t.Run(tc.name, func(t *testing.T) {
			mo := beamColumn(l+tc.zone, ei, h, p, Fixed, Free)
			mo.Members[0].OffsetStart = tc.zone
			sol := solveAxial(t, mo, []float64{-p})
			ux, _, _ := sol.Displacement(0, 1)
			if !within(ux, delta, secondTol) {
				t.Errorf("tip sway %.7g, want %.7g (Timoshenko & Gere)", ux, delta)
			}
			// The base node's moment adds H times the zone's length.
			want := mBase + h*tc.zone
			if _, _, m := sol.Reaction(0, 0); !within(math.Abs(m), want, secondTol) {
				t.Errorf("base moment reaction %.7g, want %.7g", m, want)
			}
			// The station moments: the base's from the end forces, the top's
			// zero, and at mid-height H(L−x)+P(δ−v(x)) with the closed-form
			// shape v(x) = δ(1 − cos kx)... of the beam-column: M(x) =
			// H sin(k(L−x))/(k cos kL) (Timoshenko & Gere).
			f0 := sol.At(0, 0, 0)
			if !within(math.Abs(f0.M), want, secondTol) {
				t.Errorf("station moment at the base %.7g, want %.7g", f0.M, want)
			}
			if ft := sol.At(0, 0, l+tc.zone); math.Abs(ft.M) > 1e-9 {
				t.Errorf("station moment at the free top %.3g, want 0", ft.M)
			}
			for _, x := range []float64{0.3, 0.5, 0.62, 0.75} {
				xf := x * l
				got := sol.At(0, 0, tc.zone+xf).M
				exact := h * math.Sin(k*(l-xf)) / (k * math.Cos(k*l))
				if !within(math.Abs(got), exact, secondTol) {
					t.Errorf("station moment at %g L %.7g, want %.7g (Timoshenko & Gere)", x, got, exact)
				}
			}
			b := sol.Balance(0)
			if r := b.Relative(); r > 1e-9 {
				t.Errorf("statics on the deformed geometry out by %.3g: %+v", r, b.Out())
			}
		})
	}
	t.Run("critical load factor", func(t *testing.T) {
		mo := beamColumn(l, ei, h, p, Fixed, Free)
		got, err := CriticalFactor(mo, []float64{-p})
		if err != nil {
			t.Fatal(err)
		}
		want := math.Pi * math.Pi * ei / (4 * l * l) / p
		if !within(want, 1.542126, 1e-6) || !within(got, want, secondTol) {
			t.Errorf("αcr %.7g, want π²EI/(4L²)/P = %.7g", got, want)
		}
	})
}

// TestSecondOrderStrut checks the critical load factor of a pinned strut,
// modelled horizontally with pinned and roller ends and one member,
// against the Euler load π²EI/L² (Timoshenko & Gere): 6.168503 for
// EI = 250, L = 10, P = 4; held by supports, and by releases at both ends.
func TestSecondOrderStrut(t *testing.T) {
	const ei, l, p = 250.0, 10.0, 4.0
	want := math.Pi * math.Pi * ei / (l * l) / p
	if !within(want, 6.168503, 1e-6) {
		t.Fatalf("closed form %.7g", want)
	}
	for _, rel := range []Release{ReleaseNone, ReleaseBoth} {
		t.Run("release "+rel.String(), func(t *testing.T) {
			mo := &Model{
				Sections: []Section{{Name: "S", E: 1, A: 1e6, I: ei}},
				Nodes:    []Node{{Name: "A", Support: Pinned}, {Name: "B", X: l, Support: Roller}},
				Members:  []Member{{Name: "AB", Start: 0, End: 1, Release: rel}},
				Cases:    []Case{{Name: "c", NodeLoads: []NodeLoad{{Node: 1, Fx: -p}}}},
			}
			got, err := CriticalFactor(mo, []float64{-p})
			if err != nil {
				t.Fatal(err)
			}
			// Four sub-elements reach the Euler load from above within 0.05 %.
			if !within(got, want, 6e-4) || got < want {
				t.Errorf("αcr %.7g, want π²EI/L²/P = %.7g (from above, within 0.06 %%)", got, want)
			}
			// Just above it the solve is refused.
			if _, err := SolveWith(mo, Options{Axial: []float64{-p * got * 1.01}}); !errors.Is(err, ErrUnstable) {
				t.Errorf("solved at 1.01 αcr: %v", err)
			}
		})
	}
}

// TestSecondOrderSwayWithoutRotation checks a column fixed at its base
// with its top free to sway but not to rotate (a support holding only the
// rotation) against the closed form of the beam-column (Timoshenko &
// Gere): with u = kL/2, sway 2H(tan u − u)/(P k) = 0.017864 (first order
// HL³/12EI = 0.015), end moments H tan(u)/k = 0.260727 each, and the
// critical load π²EI/L², αcr = 6.168503.
func TestSecondOrderSwayWithoutRotation(t *testing.T) {
	const ei, l, p, h = 250.0, 10.0, 4.0, 0.045
	k := math.Sqrt(p / ei)
	u := k * l / 2
	sway := 2 * h * (math.Tan(u) - u) / (p * k)
	mEnd := h * math.Tan(u) / k
	if !within(mEnd, 0.260727, 3e-6) {
		t.Fatalf("closed form end moment %.7g, want 0.260727", mEnd)
	}
	if !within(sway, 0.017864, 3e-5) {
		t.Fatalf("closed form sway %.7g, want 0.017864", sway)
	}
	mo := beamColumn(l, ei, h, p, Fixed, HoldRZ)
	first := solveAxial(t, mo, []float64{0})
	if ux, _, _ := first.Displacement(0, 1); !within(ux, h*l*l*l/(12*ei), 1e-9) {
		t.Errorf("first-order sway %.7g, want HL³/12EI = %.7g", ux, h*l*l*l/(12*ei))
	}
	sol := solveAxial(t, mo, []float64{-p})
	ux, _, _ := sol.Displacement(0, 1)
	if !within(ux, sway, secondTol) {
		t.Errorf("sway %.7g, want 2H(tan u − u)/(P k) = %.7g", ux, sway)
	}
	f := sol.EndForces(0, 0)
	for i, m := range []float64{f[2], f[5]} {
		if !within(math.Abs(m), mEnd, secondTol) {
			t.Errorf("end moment %d %.7g, want %.7g", i, m, mEnd)
		}
	}
	got, err := CriticalFactor(mo, []float64{-p})
	if err != nil {
		t.Fatal(err)
	}
	if want := math.Pi * math.Pi * ei / (l * l) / p; !within(got, want, secondTol) {
		t.Errorf("αcr %.7g, want π²EI/L²/P = %.7g", got, want)
	}
}

// TestSecondOrderBenchmarkCantilever checks the cantilever beam-column of
// AISC 360-16 Commentary to Chapter C (benchmark geometry as recalled,
// from memory: E = 29,000 ksi, I = 484 in⁴, L = 28 ft, H = 1 kip) against
// the flexure-only closed form H tan(kL)/k (Timoshenko & Gere): base
// moments 336.0, 469.1, 598.7, 849.0 kip·in for P = 0, 100, 150, 200 kip.
func TestSecondOrderBenchmarkCantilever(t *testing.T) {
	const ei, l, h = 29000 * 484.0, 28 * 12.0, 1.0
	for i, p := range []float64{0, 100, 150, 200} {
		want := []float64{336.0, 469.1, 598.7, 849.0}[i]
		exact := h * l
		if p > 0 {
			k := math.Sqrt(p / ei)
			exact = h * math.Tan(k*l) / k
		}
		if math.Abs(exact-want) > 0.05 {
			t.Fatalf("P = %g: closed form %.2f, the benchmark's %.1f", p, exact, want)
		}
		sol := solveAxial(t, beamColumn(l, ei, h, p, Fixed, Free), []float64{-p})
		if _, _, m := sol.Reaction(0, 0); !within(math.Abs(m), exact, secondTol) {
			t.Errorf("P = %g: base moment %.2f kip·in, want %.2f", p, m, exact)
		}
	}
}
