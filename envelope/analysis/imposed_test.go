package analysis

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/frame/distribution"
)

// TestPatternedPermanentLoad: dead load patterned span by span under a
// rule that gives it a favourable factor, as BS 8110-1 clause 3.2.1.2.2
// asks (1.4Gk on the loaded spans, 1.0Gk on the others), on the beam of
// twoSpans. Three-moment equation (common practice): with w1 on the left
// span and w2 on the right, the middle support takes −(w1 + w2)L²/16, the
// left reaction is w1L/2 − |M_B|/L, and the left span's largest moment
// R²/2w1.
func TestPatternedPermanentLoad(t *testing.T) {
	const l, g = 6.0, 10.0
	job := twoSpans()
	job.Cases = []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}}
	job.Combinations = []combos.Combination{{Name: "1.4/1.0D", Terms: []combos.Term{{Case: 0, Factor: 1.4, Favourable: 1.0, HasFavourable: true}}}}
	job.Patterned = []int{0}
	job.AllowUnused = true
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	mid := res.Envelope.Members[0].Stations[10]
	if want := -1.4 * 2 * g * l * l / 16; math.Abs(mid.M.Min-want) > closeTol*math.Abs(want) {
		t.Errorf("hogging at the middle support %g, want 1.4G on both spans: %g", mid.M.Min, want)
	}
	w1, w2 := 1.4*g, 1.0*g
	r := w1*l/2 - (w1+w2)*l/16
	x := 2.4 // a station near the largest moment, R/w1 = 2.357
	want := r*x - w1*x*x/2
	if got := res.Envelope.Members[0].Stations[4].M.Max; math.Abs(got-want) > closeTol*want {
		t.Errorf("sagging at x = 2.4: %g, want 1.4G on the left span and 1.0G on the right: %g", got, want)
	}
	// Unpatterned, the same rule takes 1.4 or 1.0 on the whole case:
	// 1.4G on both spans gives the largest sagging, (3/8)(1.4g)L x − ….
	job.Patterned = nil
	res, err = Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if got, want := res.Envelope.Members[0].Stations[4].M.Max, 3*w1*l/8*x-w1*x*x/2; math.Abs(got-want) > closeTol*want {
		t.Errorf("unpatterned: %g, want %g", got, want)
	}
	if got, want := res.Envelope.Members[0].Stations[4].M.Min, 3*w2*l/8*x-w2*x*x/2; math.Abs(got-want) > closeTol*want {
		t.Errorf("unpatterned, least: %g, want 1.0G: %g", got, want)
	}
	if res.Envelope.Combinations[0].Terms[0].Factor != 1.4 || len(res.Statics) != 2 {
		t.Errorf("the job's combinations and cases are reported, not their split: %+v, %d cases", res.Envelope.Combinations[0], len(res.Statics))
	}
	// Without a favourable factor the job is refused.
	job.Patterned = []int{0}
	job.Combinations[0].Terms[0].HasFavourable = false
	if _, err := Run(context.Background(), job, Options{}); err == nil || !strings.Contains(err.Error(), "a permanent case is patterned only where each term that takes it gives a favourable factor") {
		t.Errorf("got %v", err)
	}
}

// fixedFixed is a beam of length 6 between fixed supports, EI = 1e4 and
// EA = 1e6, α = 1.2e-5, h = 0.5, with a settlement case (the right end
// down by 0.01), a temperature case (top 20 degrees hotter) and a dead
// load of 10 kN/m.
func fixedFixed() *Job {
	const l = 6.0
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 1e7, A: 0.1, I: 1e-3, Alpha: 1.2e-5, Depth: 0.5}},
			Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l, Support: frame.Fixed}},
			Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
			Cases: []frame.Case{
				{Name: "D", MemberLoads: []frame.MemberLoad{{To: l, W: 10, WEnd: 10}}},
				{Name: "S", Displacements: []frame.NodeDisplacement{{Node: 1, Uy: -0.01}}},
				{Name: "T", MemberLoads: []frame.MemberLoad{{Thermal: true, DTGrad: 20}}},
			},
		},
		Cases:    []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "S", Kind: combos.Settlement}, {Name: "T", Kind: combos.Temperature}},
		Settings: Settings{Stations: 3},
	}
}

// TestSettlementAndTemperatureInCombinations: the new kinds act only where
// adverse. Fixed-end moments (Hibbeler, inside back cover): D gives
// −wL²/12 = −30 at the ends and wL²/24 = 15 at midspan; the settlement
// −6EIΔ/L² = −16.667 at the left end and +16.667 at the right
// (slope-deflection), the warmer top a constant sagging EIαΔT/h = 4.8.
// Under 1.2D + 1.2S + 1.5T (EN 1990 6.10 with γG,set = 1.2 and T
// leading) the least moment at the left end takes D and S and leaves T
// out; the largest at the right end takes S and T and leaves nothing of D
// out (D always acts).
func TestSettlementAndTemperatureInCombinations(t *testing.T) {
	job := fixedFixed()
	job.Combinations = []combos.Combination{{Name: "c", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.2}, {Case: 2, Factor: 1.5}}}}
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	st := res.Envelope.Members[0].Stations
	ms, mt := 6*1e4*0.01/36, 1e4*1.2e-5*20/0.5
	for _, c := range []struct {
		what      string
		got, want float64
	}{
		{"least at the left end", st[0].M.Min, 1.2*-30 + 1.2*-ms},
		{"largest at the left end", st[0].M.Max, 1.2*-30 + 1.5*mt},
		{"largest at the right end", st[2].M.Max, 1.2*-30 + 1.2*ms + 1.5*mt},
		{"least at the right end", st[2].M.Min, 1.2 * -30},
	} {
		if math.Abs(c.got-c.want) > closeTol*math.Abs(c.want) {
			t.Errorf("%s: %g, want %g", c.what, c.got, c.want)
		}
	}
	// Statics: the settlement and temperature cases have no load; their
	// reactions balance each other, checked against the largest.
	for _, b := range res.Statics[1:] {
		if !b.Imposed || b.Load != 0 || !(b.Reaction > 0) || !b.OK() || b.Relative() > 1e-12 {
			t.Errorf("case %s: imposed %v, load %g, largest reaction %g, relative %g", b.Case, b.Imposed, b.Load, b.Reaction, b.Relative())
		}
	}
	if got, want := res.Statics[1].Reaction, 12*1e4*0.01/216; math.Abs(got-want) > closeTol*want {
		t.Errorf("largest reaction of the settlement %g, want 12EIΔ/L³ = %g (6EIΔ/L² over the frame's length is smaller)", got, want)
	}
}

// TestCrossCheckRefusesWhatItDoesNotModel: moment distribution is not
// made, with the reason, for imposed deformations, springs, semi-rigid
// ends and rigid end zones.
func TestCrossCheckRefusesWhatItDoesNotModel(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit func(job *Job)
		want string
	}{
		{"settlement", func(job *Job) {}, `case "S" imposes displacements on supports`},
		{"spring", func(job *Job) {
			job.Model.Cases = job.Model.Cases[:1]
			job.Cases = job.Cases[:1]
			job.Model.Nodes[1].Support = frame.Pinned
			job.Model.Nodes[1].Springs[2] = 1e3
		}, `node "b" has a spring support`},
		{"semi-rigid end", func(job *Job) {
			job.Model.Cases, job.Cases = job.Model.Cases[:1], job.Cases[:1]
			job.Model.Members[0].SpringEnd = 1e3
		}, `member "a-b" has a semi-rigid end`},
		{"rigid zones", func(job *Job) {
			job.Model.Cases, job.Cases = job.Model.Cases[:1], job.Cases[:1]
			job.Model.Members[0].OffsetStart = 0.3
		}, `member "a-b" has rigid end zones`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job := fixedFixed()
			tc.edit(job)
			job.Combinations = combos.EachCase(job.Cases)
			res, err := Run(context.Background(), job, Options{})
			if err != nil {
				t.Fatal(err)
			}
			_, err = res.CrossCheck()
			var na *distribution.NotApplicableError
			if !errors.As(err, &na) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("got %v, want a refusal with %q", err, tc.want)
			}
		})
	}
}
