package analysis

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/frame/distribution"
	"govern/patterns"
)

// twoSpans is a beam of two equal spans l = 6 m on knife-edge supports
// (pinned, roller, roller) under dead load 10 kN/m and live load 5 kN/m
// placed span by span, with 1.4D and 1.2D + 1.6L: the job of ExampleRun.
func twoSpans() *Job {
	const l = 6.0
	udl := func(m int, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.24, I: 7.2e-3}},
			Nodes:    []frame.Node{{Name: "a", Support: frame.Pinned}, {Name: "b", X: l, Support: frame.Roller}, {Name: "c", X: 2 * l, Support: frame.Roller}},
			Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}, {Name: "b-c", Start: 1, End: 2}},
			Cases: []frame.Case{
				{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 10), udl(1, 10)}},
				{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 5), udl(1, 5)}},
			},
		},
		Cases: []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}},
		Combinations: []combos.Combination{
			{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
			{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}},
		},
		Patterned: []int{1}, Segments: 1, Patterns: patterns.Exact,
		Settings: Settings{Stations: 11},
	}
}

// closeTol is the agreement asked of the stiffness solution with a closed
// form: far above round-off, far below any error of method.
const closeTol = 1e-9

func TestRunTwoSpans(t *testing.T) {
	job := twoSpans()
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	// Three-moment equation (common practice): with w on both spans the
	// middle support takes −wL²/8; with w on one span only, −wL²/16, and
	// that span's moment is M(x) = (7wL/16)x − wx²/2 with the dead load's
	// (3wL/8)x − wx²/2 beside it.
	const l = 6.0
	wd, wl := 1.2*10.0, 1.6*5.0
	mid := res.Envelope.Members[0].Stations[10]
	if want := -(wd + wl) * l * l / 8; math.Abs(mid.M.Min-want) > closeTol*math.Abs(want) || mid.M.MinBy != 1 {
		t.Errorf("moment at the middle support %g by %d, want %g by 1", mid.M.Min, mid.M.MinBy, want)
	}
	x := 2.4
	st := res.Envelope.Members[0].Stations[4]
	if want := 3*wd*l/8*x + 7*wl*l/16*x - (wd+wl)*x*x/2; math.Abs(st.M.Max-want) > closeTol*want || len(st.M.MaxSpans) != 1 {
		t.Errorf("sagging moment at x = 2.4 %g with pieces %v, want %g with the left span only", st.M.Max, st.M.MaxSpans, want)
	}
	t.Run("per combination", func(t *testing.T) {
		if len(res.Combinations) != 2 || res.Combinations[1].Name != "1.2D+1.6L" || res.Combinations[1].Method != (Method{}) || !(res.Combinations[1].Condition >= 1) {
			t.Errorf("combinations %+v", res.Combinations)
		}
	})
	t.Run("statics of each case", func(t *testing.T) {
		// The reactions carry the whole load: 10 × 12 and 5 × 12 kN.
		for c, want := range []float64{120, 60} {
			b := res.Statics[c]
			if math.Abs(b.Reactions.Fy-want) > closeTol*want || math.Abs(b.Applied.Fy+want) > closeTol*want || !b.OK() {
				t.Errorf("case %s: %+v", b.Case, b)
			}
		}
	})
	t.Run("the job is not modified", func(t *testing.T) {
		fresh := twoSpans()
		if len(job.Model.Cases[1].MemberLoads) != len(fresh.Model.Cases[1].MemberLoads) || job.Settings != fresh.Settings || job.Patterns != fresh.Patterns {
			t.Errorf("job changed: %+v", job)
		}
	})
}

// joining returns actions for twoSpans' two cases that join cases a and b
// (which a program might build; combos.GroupActions never joins a dead
// case).
func joining(a, b int) *combos.Actions {
	return &combos.Actions{
		List: []combos.Action{{Name: "x", Kind: combos.Live, Alternatives: []combos.Alternative{{Name: "x", Cases: []int{a, b}, Joined: [][]int{{a, b}}}}}},
		Of:   make([]combos.Place, 2),
	}
}

func TestRunRefuses(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit func(*Job)
		is   error
		want string
	}{
		{"a member factor of no member", func(j *Job) { j.MemberFactors = []MemberFactor{{Member: 2, Case: 1, N: 1, V: 1, M: 1}} }, nil, "member factor 0 is of member 2"},
		{"a negative member factor", func(j *Job) { j.MemberFactors = []MemberFactor{{Member: 0, Case: 1, N: 1, V: -0.5, M: 1}} }, nil, "factor -0.5 is not a number at least 0"},
		{"a member factor twice", func(j *Job) {
			j.MemberFactors = []MemberFactor{{Member: 0, Case: 1, N: 1, V: 1, M: 1}, {Member: 0, Case: 1, N: 1, V: 1, M: 1}}
		}, nil, "two member factors"},
		{"a stiffness factor above 1", func(j *Job) { j.Sway.StrengthEI = 1.2 }, nil, "a reduction is at most 1"},
		{"factors on I for the wrong sections", func(j *Job) { j.Sway.SectionI = []float64{0.35, 0.7, 1} }, nil, "gives 3 factors for 1 sections"},
		{"a method for each combination", func(j *Job) { j.Methods = []Method{{}} }, nil, "gives 1 methods for 2 combinations"},
		{"a case no combination uses", func(j *Job) { j.Combinations = j.Combinations[:1] }, ErrUnused, `case "L"`},
		{"cases not those of the model", func(j *Job) { j.Cases = j.Cases[:1] }, nil, "names 1 load cases; the model has 2"},
		{"one station", func(j *Job) { j.Settings.Stations = 1 }, nil, "1 stations per member"},
		{"too many station values", func(j *Job) { j.Settings.Stations = MaxStationValues }, nil, "the envelopes would hold 2,000,000 station values"},
		{"a term of no case", func(j *Job) { j.Combinations[0].Terms[0].Case = 5 }, nil, "refers to case 5"},
		{"a patterned case twice", func(j *Job) { j.Patterned = []int{1, 1} }, nil, "patterned case 1"},
		{"actions that join a dead case", func(j *Job) { j.Actions = joining(0, 1) }, nil, `the job's actions join case "D", of dead load`},
		{"actions that join no case of the model", func(j *Job) { j.Actions = joining(1, 2) }, nil, "the job's actions join case 2; the model has 2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job := twoSpans()
			tc.edit(job)
			_, err := Run(context.Background(), job, Options{})
			if err == nil || !strings.Contains(err.Error(), tc.want) || (tc.is != nil && !errors.Is(err, tc.is)) {
				t.Errorf("got %v, want an error with %q", err, tc.want)
			}
		})
	}
	t.Run("an unused case when allowed", func(t *testing.T) {
		job := twoSpans()
		job.Combinations, job.AllowUnused = job.Combinations[:1], true
		if _, err := Run(context.Background(), job, Options{}); err != nil {
			t.Error(err)
		}
	})
	t.Run("a cancelled context", func(t *testing.T) {
		ctx, cancel := context.WithCancel(context.Background())
		cancel()
		if _, err := Run(ctx, twoSpans(), Options{}); !errors.Is(err, context.Canceled) {
			t.Errorf("got %v", err)
		}
	})
	t.Run("a mechanism", func(t *testing.T) {
		job := twoSpans()
		job.Model.Nodes[0].Support = frame.Roller // nothing holds it along X
		var me *frame.MechanismError
		if _, err := Run(context.Background(), job, Options{}); !errors.As(err, &me) {
			t.Errorf("got %v", err)
		}
	})
}

func TestRunReportsProgress(t *testing.T) {
	var phases []Progress
	res, err := Run(context.Background(), regularJob(3, 3, true), Options{Progress: func(p Progress) { phases = append(phases, p) }})
	if err != nil {
		t.Fatal(err)
	}
	if len(phases) != 2 || !strings.HasPrefix(phases[0].Phase, "solving ") || phases[0].Done != nil || phases[1].Done == nil {
		t.Fatalf("phases %+v", phases)
	}
	// Every station enveloped is counted once: 11 a member and the faces.
	want := int64(11*len(res.Job.Model.Members) + res.FaceCount())
	if phases[1].Total != want || phases[1].Done.Load() != want {
		t.Errorf("counted %d of %d stations, want %d", phases[1].Done.Load(), phases[1].Total, want)
	}
}

func TestCrossCheck(t *testing.T) {
	res, err := Run(context.Background(), twoSpans(), Options{})
	if err != nil {
		t.Fatal(err)
	}
	cc, err := res.CrossCheck()
	if err != nil {
		t.Fatal(err)
	}
	// A beam on knife edges carries no axial force: moment distribution
	// (members axially rigid) gives the stiffness solver's end moments,
	// −wL²/8 over the middle support for each case, to round-off, with
	// the areas as given or multiplied.
	if cc.Sway || len(cc.Cases) != 2 {
		t.Fatalf("cross-check %+v", cc)
	}
	for c, w := range []float64{10, 5} {
		k := cc.Cases[c]
		want := w * 36 / 8
		if math.Abs(k.Largest-want) > closeTol*want || !(k.RigidRelative < 1e-9) || !k.RigidAgrees() {
			t.Errorf("case %s: %+v, largest end moment want %g", k.Case, k, want)
		}
		if !(k.Given.Difference < 1e-9*want) || !(k.Axial < 1e-9*want) || !k.GivenAgrees() {
			t.Errorf("case %s: as given %+v", k.Case, k)
		}
	}
	t.Run("does not apply to a rafter", func(t *testing.T) {
		job := twoSpans()
		job.Model.Nodes[2].Y = 1
		res, err := Run(context.Background(), job, Options{})
		if err != nil {
			t.Fatal(err)
		}
		var na *distribution.NotApplicableError
		if _, err := res.CrossCheck(); !errors.As(err, &na) {
			t.Errorf("got %v", err)
		}
	})
}

func TestComparePatterns(t *testing.T) {
	// Two spans: the code arrangements (all spans, each span alone) hold
	// the exact placement's worst cases, so nothing falls short.
	rows, err := ComparePatterns(context.Background(), twoSpans(), Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range rows {
		if r.Percent != 0 {
			t.Errorf("two spans: %+v", r)
		}
	}
	// Four spans of a frame: a checkerboard misses what exact placement
	// finds somewhere; every shortfall is positive and names its pieces.
	rows, err = ComparePatterns(context.Background(), regularJob(4, 3, false), Options{})
	if err != nil {
		t.Fatal(err)
	}
	short := 0
	for _, r := range rows {
		if r.Percent < 0 || (r.Percent > 0 && len(r.Pieces) == 0) {
			t.Errorf("%+v", r)
		}
		if r.Percent > 0 {
			short++
		}
	}
	if short == 0 {
		t.Error("the code arrangements fall short nowhere on a 4 × 3 frame")
	}
	job := twoSpans()
	job.Patterned = nil
	if _, err := ComparePatterns(context.Background(), job, Options{}); !errors.Is(err, ErrNothingPatterned) {
		t.Errorf("nothing patterned: %v", err)
	}
}

func TestGroups(t *testing.T) {
	// A portal on lines A and B, a column off them at x = -3 and a
	// cantilever rafter: floors first, then lines from the left, then
	// the others.
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 1, A: 1, I: 1}},
		Nodes: []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: 4}, {Name: "B0", X: 6, Support: frame.Fixed}, {Name: "B1", X: 6, Y: 4},
			{Name: "P0", X: -3, Support: frame.Fixed}, {Name: "P1", X: -3, Y: 4}, {Name: "R", X: 8, Y: 5}},
		Members: []frame.Member{{Name: "B0-B1", Start: 2, End: 3}, {Name: "A1-B1", Start: 1, End: 3}, {Name: "A0-A1", Start: 0, End: 1},
			{Name: "P0-P1", Start: 4, End: 5}, {Name: "P1-A1", Start: 5, End: 1}, {Name: "B1-R", Start: 3, End: 6}},
	}
	job := &Job{Model: mo, Lines: []GridLine{{"B", 6}, {"A", 0}}}
	var got []string
	for _, g := range Groups(job) {
		var names []string
		for _, m := range g.Members {
			names = append(names, mo.Members[m].Name)
		}
		got = append(got, strings.Join(append([]string{[...]string{"floor", "line", "other"}[g.Kind], g.Line}, names...), " "))
	}
	want := "floor  P1-A1 A1-B1; line  P0-P1; line A A0-A1; line B B0-B1; other  B1-R"
	if s := strings.Join(got, "; "); s != want {
		t.Errorf("groups:\n%s\nwant\n%s", s, want)
	}
}

func TestShownMember(t *testing.T) {
	// A member of length 6 seen from its other end: x' = 6 − x, M' = −M
	// with largest and smallest exchanged, V and N as they were.
	em := envelope.Member{Stations: []envelope.Station{
		{X: 0, M: envelope.Extreme{Max: 5, MaxBy: 1, Min: -20, MinBy: 2, MinWith: [3]float64{0, 3, -20}}, V: envelope.Extreme{Max: 7, Min: 4}},
		{X: 6, M: envelope.Extreme{Max: 1, MaxBy: 3, Min: -2, MinBy: 4}},
	}}
	got := ShownMember(em, 6, true)
	s := got.Stations[1]
	if s.X != 6 || s.M.Max != 20 || s.M.MaxBy != 2 || s.M.Min != -5 || s.M.MinBy != 1 || s.M.MaxWith[2] != 20 || s.V.Max != 7 || s.V.Min != 4 {
		t.Errorf("flipped station %+v", s)
	}
	if got.Stations[0].X != 0 || got.Stations[0].M.Max != 2 || em.Stations[0].M.Max != 5 {
		t.Errorf("flipped %+v; the original must be kept: %+v", got.Stations[0], em.Stations[0])
	}
}

// TestStabilityBesideEnvelopesChangesNothing checks that a first-order
// run that finds the critical load factors and storeys' stability beside
// the envelopes gives every result, warnings and their order included,
// to the last bit as one that finds them first (stabilityBeside off), on
// one processor and two: the regular frame with patterned live loads,
// whose combinations are warned of for αcr below 10, and the cantilever
// whose combination buckles (αcr = 0.88, against the Euler load of a
// cantilever, π²EI/(4L²): TestBucklingIsAnError).
func TestStabilityBesideEnvelopesChangesNothing(t *testing.T) {
	for _, tc := range []struct {
		name string
		job  func() *Job
	}{
		{"regular 6 x 8", func() *Job { return regularJob(6, 8, true) }},
		{"buckling cantilever", func() *Job { return cantileverJob(7, 0.045, Method{}) }},
	} {
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				got, err := Run(context.Background(), tc.job(), Options{})
				if err != nil {
					t.Fatal(err)
				}
				if len(got.Warnings) == 0 {
					t.Fatal("no warning: the case tests nothing of the warnings' order")
				}
				stabilityBeside = false
				defer func() { stabilityBeside = true }()
				want, err := Run(context.Background(), tc.job(), Options{})
				if err != nil {
					t.Fatal(err)
				}
				sameResults(t, got, want, "beside the envelopes")
			})
		}
	}
}

// TestStabilitySharedSolveChangesNothing checks that a first-order run
// that solves the cases of the critical load factors and of the storeys
// together (firstOrderStabilityShared, a strength combination's column
// read for both) gives every result, the critical load factors and the
// storeys' stability indices included, to the last bit as one that
// solves them apart (stabilityShared off), and that the shared solve was
// made: the regular frame with patterned live loads and its service
// combination (no storeys' analysis), the sway frame with strength and
// service stiffness (a first-order group of each, solved on its own
// factor) and its storeys that take a unit shear, the buckling
// cantilever; on one processor and two.
func TestStabilitySharedSolveChangesNothing(t *testing.T) {
	for _, tc := range []struct {
		name string
		job  func() *Job
	}{
		{"regular 6 x 8", func() *Job { return regularJob(6, 8, true) }},
		{"sway frame", swayFrame},
		{"sway frame, strength and service stiffness", func() *Job {
			j := swayFrame()
			j.Sway.StrengthEI = 0.8
			j.Methods = []Method{{Stiffness: Strength}, {Stiffness: Strength}, {}, {Stiffness: Strength}, {Stiffness: Service}}
			return j
		}},
		{"buckling cantilever", func() *Job { return cantileverJob(7, 0.045, Method{}) }},
	} {
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				before := sharedStability.Load()
				got, err := Run(context.Background(), tc.job(), Options{})
				if err != nil {
					t.Fatal(err)
				}
				if sharedStability.Load() == before {
					t.Fatal("no shared solve was made: the case tests nothing")
				}
				stabilityShared = false
				defer func() { stabilityShared = true }()
				want, err := Run(context.Background(), tc.job(), Options{})
				if err != nil {
					t.Fatal(err)
				}
				sameResults(t, got, want, "solved together")
				for k := range got.Combinations {
					if g, w := got.Combinations[k].CriticalFactor, want.Combinations[k].CriticalFactor; g != w {
						t.Errorf("combination %d: αcr %v, apart %v", k, g, w)
					}
				}
			})
		}
	}
}
