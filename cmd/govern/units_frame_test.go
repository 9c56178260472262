package main

import (
	"context"
	"math"
	"os"
	"path/filepath"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope"
	"govern/envelope/analysis"
)

// sameFrameTol is the agreement asked of the one frame entered in three
// systems of units: 1e-9 of the largest value of each quantity, far above
// the round-off of the conversions (a few units in the 16th digit) and
// of the solution, far below any difference that would matter.
const sameFrameTol = 1e-9

// scaled gathers the results of a run as numbers in kN and m: forces,
// lengths, moments and pure numbers apart, each multiplied by the factor
// from the model's units.
type scaled struct {
	force, length, moment, number []float64
}

func runFile(t *testing.T, name string) *analysis.Result {
	t.Helper()
	return runPath(t, filepath.Join("..", "..", "testdata", "units", name))
}

// runPath reads and runs the model at path, failing the test on an error
// or a warning.
func runPath(t *testing.T, path string) *analysis.Result {
	t.Helper()
	name := filepath.Base(path)
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	job, err := modelfile.Read(name, src)
	if err != nil {
		t.Fatal(err)
	}
	res, err := analysis.Run(context.Background(), &job.Job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Warnings) > 0 {
		t.Errorf("%s: warnings %q", name, res.Warnings)
	}
	return res
}

// gather lists every number of res: the envelopes at every station (N, V
// and M with what acts with them, the deflections), the reactions, the
// spans' deflections and span/deflection, the statics of every case, the
// node coordinates.
func gather(res *analysis.Result, f, l float64) scaled {
	var s scaled
	m := f * l
	// put appends v, of kind force, length or moment, in kN and m.
	put := func(kind byte, vs ...float64) {
		for _, v := range vs {
			switch kind {
			case 'f':
				s.force = append(s.force, v*f)
			case 'm':
				s.moment = append(s.moment, v*m)
			default:
				s.length = append(s.length, v*l)
			}
		}
	}
	// ext appends an extreme of kind, and with withs what acts with it (N,
	// V, M; for a reaction Fx, Fy, M).
	ext := func(kind byte, e envelope.Extreme, withs bool) {
		put(kind, e.Max, e.Min)
		if withs {
			for _, w := range [2][3]float64{e.MaxWith, e.MinWith} {
				put('f', w[0], w[1])
				put('m', w[2])
			}
		}
	}
	for _, em := range res.Envelope.Members {
		for k, st := range em.Stations {
			put('l', st.X)
			ext('f', st.N, true)
			ext('f', st.V, true)
			ext('m', st.M, true)
			if em.Deflection != nil {
				ext('l', em.Deflection[k], false)
			}
		}
	}
	for _, r := range res.Envelope.Reactions {
		ext('f', r.Fx, true)
		ext('f', r.Fy, true)
		ext('m', r.M, true)
	}
	for _, sp := range res.Spans {
		put('l', sp.Length, sp.Deflection.Largest.V, sp.Deflection.Largest.X)
		s.number = append(s.number, sp.Deflection.Ratio)
	}
	for _, b := range res.Statics {
		put('f', b.Applied.Fx, b.Applied.Fy, b.Reactions.Fx, b.Reactions.Fy)
		put('m', b.Applied.M, b.Reactions.M)
	}
	for _, n := range res.Job.Model.Nodes {
		put('l', n.X, n.Y)
	}
	return s
}

// TestOneFrameInThreeSystems: testdata/units holds one frame (a grid of
// two bays and two storeys, a section assigned by selector, self weight,
// area, partial, point and node loads, a node moment, patterned live
// load, column faces, a service combination) in kN and m, in N and mm
// with plain numbers, and in kip and ft with every value a string with a
// unit. Their results, converted to kN and m by the exact factors (1 lbf
// = 4.4482216152605 N, 1 ft = 0.3048 m; NIST SP 811 Appendix B, recalled
// from memory), agree to 1e-9.
func TestOneFrameInThreeSystems(t *testing.T) {
	ref := gather(runFile(t, "frame-kn-m.toml"), 1, 1)
	const lbf, ft = 4.4482216152605, 0.3048
	for _, tc := range []struct {
		file          string
		force, length float64 // the model's units in kN and m
	}{
		{"frame-n-mm.toml", 1e-3, 1e-3},
		{"frame-kip-ft.toml", lbf, ft},
	} {
		t.Run(tc.file, func(t *testing.T) {
			sameResults(t, ref, gather(runFile(t, tc.file), tc.force, tc.length))
		})
	}
}

// sameResults compares the results of one frame in two systems of units,
// both in kN and m: each quantity to sameFrameTol of its largest value.
func sameResults(t *testing.T, ref, got scaled) {
	t.Helper()
	for _, q := range []struct {
		name      string
		want, got []float64
	}{{"forces", ref.force, got.force}, {"lengths", ref.length, got.length}, {"moments", ref.moment, got.moment}, {"span/deflection", ref.number, got.number}} {
		if len(q.want) != len(q.got) || len(q.want) == 0 {
			t.Fatalf("%s: %d values, want %d", q.name, len(q.got), len(q.want))
		}
		scale := 0.0
		for _, v := range q.want {
			scale = math.Max(scale, math.Abs(v))
		}
		worst := 0.0
		for i := range q.want {
			worst = math.Max(worst, math.Abs(q.got[i]-q.want[i])/scale)
		}
		if worst > sameFrameTol {
			t.Errorf("%s differ by %.2g of the largest (%g)", q.name, worst, scale)
		}
		t.Logf("%s: %d values, largest difference %.1e of the largest", q.name, len(q.want), worst)
	}
}

// TestJointsInKipFootFahrenheit: testdata/joints.toml, in kN, m and °C,
// and testdata/units/joints-kip-ft.toml, the same frame in kip, ft and °F
// with every value a string with a unit (springs kN/m and kN·m/rad, a
// semi-rigid end in N·m/rad, a settlement in mm, a change of temperature
// in K and °C with alpha per K, a triangular load, a member moment, rigid
// zones from depths in mm and cm), agree to 1e-9 once converted to kN and
// m by the exact factors (1 lbf = 4.4482216152605 N, 1 ft = 0.3048 m; a
// step of 1 °F is 5/9 K; NIST SP 811 Appendix B, recalled from memory).
// The temperature case checks the conversion of both dT and alpha: their
// product, the strain, is what the frame sees.
func TestJointsInKipFootFahrenheit(t *testing.T) {
	const lbf, ft = 4.4482216152605, 0.3048
	ref := gather(runPath(t, filepath.Join("..", "..", "testdata", "joints.toml")), 1, 1)
	res := runPath(t, filepath.Join("..", "..", "testdata", "units", "joints-kip-ft.toml"))
	sameResults(t, ref, gather(res, lbf, ft))
	// The model read in its own units: dT = 25 K is 45 °F and alpha =
	// 1e-5 per K is 1e-5 × 5/9 per °F.
	mo := res.Job.Model
	for _, c := range mo.Cases {
		for _, l := range c.MemberLoads {
			if l.Thermal && (math.Abs(l.DT-45) > 1e-12 || math.Abs(l.DTGrad-18) > 1e-12) {
				t.Errorf("case %s: dT %g, dT_gradient %g, want 45 and 18 °F", c.Name, l.DT, l.DTGrad)
			}
		}
	}
	for _, s := range mo.Sections {
		if s.Alpha != 0 && math.Abs(s.Alpha-1e-5*5/9) > 1e-20 {
			t.Errorf("section %s: alpha %g per °F, want %g", s.Name, s.Alpha, 1e-5*5/9)
		}
	}
}
