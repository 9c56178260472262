package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/combos"
	"govern/envelope"
)

// sourceLine returns the line of the first occurrence of s in src.
func sourceLine(t *testing.T, src, s string) int {
	t.Helper()
	i := strings.Index(src, s)
	if i < 0 {
		t.Fatalf("%q not in the model", s)
	}
	return strings.Count(src[:i], "\n") + 1
}

// portalReactions solves the wind portal (testdata/wind-portal.toml:
// fixed feet A (0, 0) and D (6, 0), knees B (0, 3) and C (6, 3), EI = 2e4,
// EA = 2e6) by the force method, independently of the stiffness solver:
// the base D released, its reactions X = (Fx, Fy, M) are the redundants,
// found from the flexibility equations f X = -Δ0 with
// f_ij = Σ∫ m_i m_j / EI + n_i n_j / EA ds (virtual work, bending and axial
// strain; the force method of structural analysis textbooks, recalled
// from memory). Loads: fx at B and at C, q up per unit length on the beam
// (q = -10 is the dead load, +3 the uplift).
// Returns the reactions on the structure at A and D, [Fx, Fy, M], M
// counter-clockwise.
func portalReactions(fxB, fxC, q float64) (a, d [3]float64) {
	const h, l, ei, ea = 3.0, 6.0, 2e8 * 1e-4, 2e8 * 0.01
	// The path A → B → C → D, u from 0 to 12: the point at u, the unit
	// vector along the path, and whether u is on the beam.
	at := func(u float64) (x, y, tx, ty float64) {
		switch {
		case u <= h:
			return 0, u, 0, 1
		case u <= h+l:
			return u - h, h, 1, 0
		}
		return l, h - (u - h - l), 0, -1
	}
	// The resultant of the forces on the part beyond u (towards the free
	// end D): moment about the point at u, counter-clockwise, and the
	// axial force, tension positive. x, y, fx, fy, m are the forces
	// acting at D (the redundants) or the loads.
	type force struct{ x, y, fx, fy, m, u float64 }
	cut := func(u float64, fs []force) (mom, n float64) {
		px, py, tx, ty := at(u)
		var fx, fy float64
		for _, f := range fs {
			if f.u < u {
				continue
			}
			fx += f.fx
			fy += f.fy
			mom += f.m + (f.x-px)*f.fy - (f.y-py)*f.fx
		}
		return mom, fx*tx + fy*ty
	}
	loads := func(u float64) (mom, n float64) {
		fs := []force{{x: 0, y: h, fx: fxB, u: h}, {x: l, y: h, fx: fxC, u: h + l}}
		// the beam load beyond u, as its resultant
		from := math.Max(u, h)
		if from < h+l {
			fs = append(fs, force{x: (from - h + l) / 2, y: h, fy: q * (h + l - from), u: h + l})
		}
		return cut(u, fs)
	}
	unit := []func(u float64) (float64, float64){
		func(u float64) (float64, float64) { return cut(u, []force{{x: l, y: 0, fx: 1, u: 2*h + l}}) },
		func(u float64) (float64, float64) { return cut(u, []force{{x: l, y: 0, fy: 1, u: 2*h + l}}) },
		func(u float64) (float64, float64) { return cut(u, []force{{x: l, y: 0, m: 1, u: 2*h + l}}) },
	}
	// Simpson's rule over each member, exact for the cubics met here.
	integral := func(f, g func(u float64) (float64, float64)) float64 {
		s := 0.0
		for _, seg := range [][2]float64{{0, h}, {h, h + l}, {h + l, 2*h + l}} {
			const n = 8
			w := (seg[1] - seg[0]) / n
			for k := 0; k <= n; k++ {
				c := 2.0
				switch {
				case k == 0 || k == n:
					c = 1
				case k%2 == 1:
					c = 4
				}
				// just inside the member, so that loads at its ends count
				// as they do along it
				u := seg[0] + float64(k)*w
				u = math.Min(math.Max(u, seg[0]+1e-12), seg[1]-1e-12)
				m1, n1 := f(u)
				m2, n2 := g(u)
				s += c * w / 3 * (m1*m2/ei + n1*n2/ea)
			}
		}
		return s
	}
	var fm [3][3]float64
	var rhs [3]float64
	for i := range 3 {
		for j := range 3 {
			fm[i][j] = integral(unit[i], unit[j])
		}
		rhs[i] = -integral(unit[i], loads)
	}
	x := solve3(fm, rhs)
	d = x
	// Equilibrium of the whole frame gives the reactions at A.
	fx, fy := fxB+fxC, q*l
	a[0] = -(fx + d[0])
	a[1] = -(fy + d[1])
	// moments about A: loads at height h, beam load at mid-span, D at (l, 0)
	mA := -h*fxB - h*fxC + q*l*l/2 + l*d[1] + d[2]
	a[2] = -mA
	return a, d
}

// solve3 solves a 3 × 3 system by Cramer's rule.
func solve3(m [3][3]float64, b [3]float64) [3]float64 {
	det := func(m [3][3]float64) float64 {
		return m[0][0]*(m[1][1]*m[2][2]-m[1][2]*m[2][1]) - m[0][1]*(m[1][0]*m[2][2]-m[1][2]*m[2][0]) + m[0][2]*(m[1][0]*m[2][1]-m[1][1]*m[2][0])
	}
	d := det(m)
	var x [3]float64
	for k := range 3 {
		mk := m
		for i := range 3 {
			mk[i][k] = b[i]
		}
		x[k] = det(mk) / d
	}
	return x
}

func readPortal(t *testing.T, name string, edit func(string) string) (*modelfile.Job, string) {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("..", "..", "testdata", name))
	if err != nil {
		t.Fatal(err)
	}
	s := edit(string(src))
	job, err := modelfile.Read(name, []byte(s))
	if err != nil {
		t.Fatal(err)
	}
	return job, s
}

// withVariableLoads sets [analysis] variable_loads.
func withVariableLoads(m string) func(string) string {
	return func(s string) string {
		return strings.Replace(s, "[combinations]", "[analysis]\nvariable_loads = \""+m+"\"\n\n[combinations]", 1)
	}
}

// byHand writes out the combinations ASCE/SEI 7-16 section 2.3.1 gives
// for D and the two wind directions, each direction on its own:
// (1) 1.4D, (4) 1.2D + 1.0W, (5) 0.9D + 1.0W (with no live or roof load,
// 2 and 3 give nothing).
func byHand(m string) func(string) string {
	return func(s string) string {
		s = withVariableLoads(m)(s)
		i := strings.Index(s, "[combinations]")
		return s[:i] + `[[combination]]
name = "1.4D"
factors = { D = 1.4 }
[[combination]]
name = "1.2D+WL"
factors = { D = 1.2, WL = 1.0 }
[[combination]]
name = "1.2D+WR"
factors = { D = 1.2, WR = 1.0 }
[[combination]]
name = "0.9D+WL"
factors = { D = 0.9, WL = 1.0 }
[[combination]]
name = "0.9D+WR"
factors = { D = 0.9, WR = 1.0 }
`
	}
}

// sameEnvelopes compares two envelopes value by value: at every station of
// every member to rel of the largest |value| of that force in the member,
// and every reaction component to rel of its largest |value| over all
// supports.
func sameEnvelopes(t *testing.T, got, want *envelope.Envelope, rel float64) {
	t.Helper()
	pick := func(s envelope.Station, k int) envelope.Extreme { return [3]envelope.Extreme{s.N, s.V, s.M}[k] }
	for m := range want.Members {
		for k, q := range []string{"N", "V", "M"} {
			scale := 0.0
			for _, s := range want.Members[m].Stations {
				e := pick(s, k)
				scale = math.Max(scale, math.Max(math.Abs(e.Max), math.Abs(e.Min)))
			}
			for j, s := range want.Members[m].Stations {
				g, w := pick(got.Members[m].Stations[j], k), pick(s, k)
				if math.Abs(g.Max-w.Max) > rel*scale || math.Abs(g.Min-w.Min) > rel*scale {
					t.Errorf("member %d station %d %s: max %.12g min %.12g, want %.12g %.12g", m, j, q, g.Max, g.Min, w.Max, w.Min)
				}
			}
		}
	}
	rpick := func(r envelope.Reaction, k int) envelope.Extreme { return [3]envelope.Extreme{r.Fx, r.Fy, r.M}[k] }
	for k, q := range []string{"Fx", "Fy", "M"} {
		scale := 0.0
		for _, r := range want.Reactions {
			e := rpick(r, k)
			scale = math.Max(scale, math.Max(math.Abs(e.Max), math.Abs(e.Min)))
		}
		for i, r := range want.Reactions {
			g, w := rpick(got.Reactions[i], k), rpick(r, k)
			if math.Abs(g.Max-w.Max) > rel*scale || math.Abs(g.Min-w.Min) > rel*scale {
				t.Errorf("reaction %d %s: max %.12g min %.12g, want %.12g %.12g", i, q, g.Max, g.Min, w.Max, w.Min)
			}
		}
	}
}

func TestWindPortalAsHandWritten(t *testing.T) {
	// The envelopes from asce7-16-strength with WL and WR as
	// alternatives equal those of the combinations written out by hand,
	// each wind direction on its own (ASCE/SEI 7-16 section 2.3.1), at
	// every station and reaction, as written and with variable loads only
	// where adverse.
	const rel = 1e-9
	for _, file := range []string{"wind-portal.toml", "wind-portal-uplift.toml"} {
		for _, m := range []string{"as-written", "adverse"} {
			t.Run(file+" "+m, func(t *testing.T) {
				gen, _ := readPortal(t, file, withVariableLoads(m))
				hand, _ := readPortal(t, file, byHand(m))
				if len(gen.Combinations) != 5 || len(hand.Combinations) != 5 {
					t.Fatalf("%d and %d combinations, want 5", len(gen.Combinations), len(hand.Combinations))
				}
				a, err := analyseJob(gen)
				if err != nil {
					t.Fatal(err)
				}
				b, err := analyseJob(hand)
				if err != nil {
					t.Fatal(err)
				}
				sameEnvelopes(t, a.Envelope, b.Envelope, rel)
			})
		}
	}
}

func TestWindPortalNumbers(t *testing.T) {
	// The wind portal's numbers, each against the force method solution
	// (portalReactions) combined by hand, to two decimals.
	// Equilibrium of the force method: symmetric gravity gives wL/2 at
	// each foot; the reactions balance every load.
	const rel = 1e-9
	aD, dD := portalReactions(0, 0, -10)
	aL, dL := portalReactions(5, 0, 0)
	aR, _ := portalReactions(0, -5, 0)
	aLu, _ := portalReactions(5, 0, 3)
	aRu, _ := portalReactions(0, -5, 3)
	if math.Abs(aD[1]-30) > 1e-9 || math.Abs(dD[1]-30) > 1e-9 || math.Abs(aD[0]+dD[0]) > 1e-9 || math.Abs(aD[2]+dD[2]) > 1e-9 {
		t.Fatalf("force method, dead load: A %v D %v; want Fy 30 at each foot, symmetric", aD, dD)
	}
	if math.Abs(aL[0]+dL[0]+5) > 1e-9 || math.Abs(aL[1]+dL[1]) > 1e-9 {
		t.Fatalf("force method, WL: A %v D %v do not balance 5 kN", aL, dL)
	}
	near := func(got, want, tol float64) bool { return math.Abs(got-want) <= tol }
	reaction := func(t *testing.T, job *modelfile.Job) envelope.Reaction {
		t.Helper()
		a, err := analyseJob(job)
		if err != nil {
			t.Fatal(err)
		}
		return a.Envelope.Reactions[0] // node A
	}
	old := func(s string) string {
		return strings.Replace(s, "name = \"WR\"\n", "name = \"WR\"\nwith = \"WL\"\n", 1)
	}

	t.Run("base moment, as written", func(t *testing.T) {
		// ASCE/SEI 7-16 2.3.1 (1) 1.4D, (4) 1.2D + 1.0W, (5) 0.9D + 1.0W,
		// each wind direction alone: the least base moment at A is
		// 1.2D + WR, -18.89 kN·m.
		want := math.Inf(1)
		for _, m := range []float64{1.4 * aD[2], 1.2*aD[2] + aL[2], 1.2*aD[2] + aR[2], 0.9*aD[2] + aL[2], 0.9*aD[2] + aR[2]} {
			want = math.Min(want, m)
		}
		if want != 1.2*aD[2]+aR[2] || !near(want, -18.89, 0.005) {
			t.Errorf("force method: least M at A %.6f, want 1.2D+WR = %.6f, -18.89", want, 1.2*aD[2]+aR[2])
		}
		job, _ := readPortal(t, "wind-portal.toml", withVariableLoads("as-written"))
		if r := reaction(t, job); !near(r.M.Min, want, rel*math.Abs(want)) {
			t.Errorf("least M at A %.12g, want %.12g", r.M.Min, want)
		}
		// Before alternatives, WL and WR in one combination cancel and
		// 1.4D governs: -16.60. with = "WL" on WR puts them
		// in one alternative, which is what the tool did.
		today := math.Min(1.4*aD[2], 1.2*aD[2]+aL[2]+aR[2])
		if today != 1.4*aD[2] || !near(today, -16.60, 0.005) {
			t.Errorf("force method, both directions together: %.6f, want 1.4D, -16.60", today)
		}
		job, _ = readPortal(t, "wind-portal.toml", func(s string) string { return old(withVariableLoads("as-written")(s)) })
		if r := reaction(t, job); !near(r.M.Min, today, rel*math.Abs(today)) {
			t.Errorf("with = \"WL\": least M at A %.12g, want %.12g", r.M.Min, today)
		}
	})
	t.Run("least vertical reaction, adverse", func(t *testing.T) {
		// Variable loads only where adverse (docs/analysis.md): each wind
		// case adds min(0, its Fy at A). Alone, 0.9D + WL governs: 17.06
		// by statics 0.9 × 30 - 3 × 6 / 2 minus the couple
		// of the lateral load.
		adv := func(ws ...float64) float64 {
			s := 0.0
			for _, w := range ws {
				s += math.Min(0, w)
			}
			return s
		}
		want := math.Min(0.9*aD[1]+adv(aLu[1]), 0.9*aD[1]+adv(aRu[1]))
		if !near(want, 17.06, 0.005) || !near(want, 27-9+math.Min(aL[1], aR[1]), 1e-8) {
			t.Errorf("force method: least Fy at A %.6f, want 17.06", want)
		}
		job, _ := readPortal(t, "wind-portal-uplift.toml", withVariableLoads("adverse"))
		if r := reaction(t, job); !near(r.Fy.Min, want, rel*math.Abs(want)) {
			t.Errorf("least Fy at A %.12g, want %.12g", r.Fy.Min, want)
		}
		// Both directions summed, as before: 9.00, both
		// uplifts counted (27 - 9 - 9).
		today := 0.9*aD[1] + adv(aLu[1], aRu[1])
		if !near(today, 9.00, 0.005) {
			t.Errorf("force method, both directions together: %.6f, want 9.00", today)
		}
		job, _ = readPortal(t, "wind-portal-uplift.toml", func(s string) string { return old(withVariableLoads("adverse")(s)) })
		if r := reaction(t, job); !near(r.Fy.Min, today, rel*math.Abs(today)) {
			t.Errorf("with = \"WL\": least Fy at A %.12g, want %.12g", r.Fy.Min, today)
		}
	})
	t.Run("every reaction of each case against the force method", func(t *testing.T) {
		job, _ := readPortal(t, "wind-portal-uplift.toml", withVariableLoads("as-written"))
		each := combos.EachCase(job.Cases)
		for c, want := range [][2][3]float64{{aD, dD}, pair(portalReactions(5, 0, 3)), pair(portalReactions(0, -5, 3))} {
			job.Combinations, job.AllowUnused = each[c:c+1], true // each case alone
			a, err := analyseJob(job)
			if err != nil {
				t.Fatal(err)
			}
			for n := range 2 {
				r := a.Envelope.Reactions[n]
				for k, e := range []envelope.Extreme{r.Fx, r.Fy, r.M} {
					if w := want[n][k]; !near(e.Max, w, 1e-9*60) || e.Max != e.Min {
						t.Errorf("case %s node %d component %d: %.12g, force method %.12g", job.Model.Cases[c].Name, n, k, e.Max, w)
					}
				}
			}
		}
	})
}

func pair(a, d [3]float64) [2][3]float64 { return [2][3]float64{a, d} }

func TestActionsListedAndNoted(t *testing.T) {
	model := filepath.Join("..", "..", "testdata", "wind-portal.toml")
	note := "note: wind-portal.toml: cases read by the default rule: wind cases WL, WR as alternatives of one action, one at a time. To group them otherwise give action, alternative or with (docs/combinations.md).\n"
	code, out, stderr := exec("run", model)
	if code != 0 || stderr != "govern run: "+note {
		t.Errorf("run: exit %d, stderr %q", code, stderr)
	}
	code, out, _ = exec("check", model)
	for _, want := range []string{
		"actions:        2 (two alternatives of one action never act together)\n  dead         dead        D\n  wind         wind        WL or WR\n",
		"note:           cases read by the default rule: wind cases WL, WR as alternatives",
	} {
		if code != 0 || !strings.Contains(out, want) {
			t.Errorf("check: exit %d, want %q in\n%s", code, want, out)
		}
	}
	code, out, _ = exec("combos", model)
	for _, want := range []string{"Note: cases read by the default rule: wind cases WL, WR", "│   wind │ wind │            WL or WR │"} {
		if code != 0 || !strings.Contains(out, want) {
			t.Errorf("combos: exit %d, want %q in\n%s", code, want, out)
		}
	}
	t.Run("no note once the cases say how they act", func(t *testing.T) {
		src, _ := os.ReadFile(model)
		dir := t.TempDir()
		m := filepath.Join(dir, "m.toml")
		os.WriteFile(m, []byte(strings.Replace(string(src), "name = \"WL\"\n", "name = \"WL\"\nalternative = \"left\"\nreversible = true\n", 1)), 0o644)
		code, out, stderr := exec("check", m)
		if code != 0 || strings.Contains(out, "note:") || stderr != "" {
			t.Errorf("exit %d, stderr %q\n%s", code, stderr, out)
		}
		if !strings.Contains(out, "  wind         wind        left: WL ± or WR\n") {
			t.Errorf("actions not listed:\n%s", out)
		}
	})
}

func TestModelCombinationOfTwoAlternatives(t *testing.T) {
	// A combination written in the model with both wind
	// directions is an error naming the combination, the action and both
	// cases, with the one-line fix.
	src, err := os.ReadFile(filepath.Join("..", "..", "testdata", "wind-portal.toml"))
	if err != nil {
		t.Fatal(err)
	}
	s := strings.Replace(string(src), "[combinations]", "[[combination]]\nname = \"both\"\nfactors = { D = 1.2, WL = 1.0, WR = 1.0 }\n\n[combinations]", 1)
	line := sourceLine(t, s, "factors = { D = 1.2, WL")
	for _, tc := range []struct {
		name, edit, want string
	}{
		{"default rule", "",
			fmt.Sprintf(`m.toml:%d: combination "both": factors: WL and WR are alternatives of action "wind" and never act together (read by the default rule for wind cases: each wind case is an alternative of its own); if they are parts of one load, write with = "WL" in case "WR"`, line)},
		{"named alternatives", "alternative",
			fmt.Sprintf(`m.toml:%d: combination "both": factors: WL and WR are alternatives "left" and "right" of action "wind" and never act together; if they act together, write with = "WL" in case "WR" (in place of its action, alternative or with)`, line+2)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := s
			if tc.edit != "" {
				src = strings.Replace(src, "name = \"WL\"\n", "name = \"WL\"\nalternative = \"left\"\n", 1)
				src = strings.Replace(src, "name = \"WR\"\n", "name = \"WR\"\nalternative = \"right\"\n", 1)
			}
			_, err := modelfile.Read("m.toml", []byte(src))
			if err == nil || err.Error() != tc.want {
				t.Errorf("error\n%v\nwant\n%s", err, tc.want)
			}
		})
	}
	t.Run("with joins them", func(t *testing.T) {
		src := strings.Replace(s, "name = \"WR\"\n", "name = \"WR\"\nwith = \"WL\"\n", 1)
		if _, err := modelfile.Read("m.toml", []byte(src)); err != nil {
			t.Errorf("error %v", err)
		}
	})
}

func TestWindPortalJoinedCases(t *testing.T) {
	// testdata/wind-portal-split.toml: each wind direction entered as a
	// wall load and a roof suction joined by with. The cases of a joined
	// set act together or not at all, where variable loads act only where
	// adverse too: the model declares WR without WRr impossible. Each
	// reaction is checked against the force method solution
	// (portalReactions) of each case, combined by hand: 1.4D, 1.2D + W and
	// 0.9D + W for W each direction with its roof suction (ASCE/SEI 7-16
	// section 2.3.1), a direction acting where the sum of its two cases'
	// effects is adverse, or always as written.
	cases := map[string][2][3]float64{
		"D":   pair(portalReactions(0, 0, -10)),
		"WL":  pair(portalReactions(5, 0, 0)),
		"WLr": pair(portalReactions(0, 0, 3)),
		"WR":  pair(portalReactions(0, -5, 0)),
		"WRr": pair(portalReactions(0, 0, 3)),
	}
	// Equilibrium of the force method: each case's reactions balance its
	// loads (5 kN across, 3 × 6 = 18 kN of suction).
	for name, load := range map[string][2]float64{"WL": {5, 0}, "WLr": {0, 18}, "WR": {-5, 0}, "WRr": {0, 18}} {
		r := cases[name]
		if math.Abs(r[0][0]+r[1][0]+load[0]) > 1e-9 || math.Abs(r[0][1]+r[1][1]+load[1]) > 1e-9 {
			t.Fatalf("force method, %s: reactions %v do not balance %v", name, r, load)
		}
	}
	type combination struct {
		name string
		dead float64
		wind []string
	}
	cs := []combination{
		{"2.3.1-1 1.4D", 1.4, nil},
		{"2.3.1-4 1.2D+1.0WL+1.0WLr", 1.2, []string{"WL", "WLr"}},
		{"2.3.1-4 1.2D+1.0WR+1.0WRr", 1.2, []string{"WR", "WRr"}},
		{"2.3.1-5 0.9D+1.0WL+1.0WLr", 0.9, []string{"WL", "WLr"}},
		{"2.3.1-5 0.9D+1.0WR+1.0WRr", 0.9, []string{"WR", "WRr"}},
	}
	// extremes returns the largest and smallest of component k at support
	// n over cs, with the combinations that give them (the first of equal
	// values).
	extremes := func(n, k int, adverse bool) (hi, lo float64, hiBy, loBy string) {
		hi, lo = math.Inf(-1), math.Inf(1)
		for _, c := range cs {
			d := c.dead * cases["D"][n][k]
			w := 0.0
			for _, name := range c.wind {
				w += cases[name][n][k]
			}
			up, down := d+w, d+w
			if adverse {
				up, down = d+math.Max(0, w), d+math.Min(0, w)
			}
			if up > hi {
				hi, hiBy = up, c.name
			}
			if down < lo {
				lo, loBy = down, c.name
			}
		}
		return hi, lo, hiBy, loBy
	}
	const rel = 1e-9
	for _, mode := range []string{"adverse", "as-written"} {
		t.Run(mode, func(t *testing.T) {
			job, _ := readPortal(t, "wind-portal-split.toml", withVariableLoads(mode))
			a, err := analyseJob(job)
			if err != nil {
				t.Fatal(err)
			}
			if len(a.Envelope.Combinations) != len(cs) {
				t.Fatalf("%d combinations, want %d", len(a.Envelope.Combinations), len(cs))
			}
			names := []string{"A", "D"}
			for n, r := range a.Envelope.Reactions[:2] {
				for k, e := range []envelope.Extreme{r.Fx, r.Fy, r.M} {
					hi, lo, hiBy, loBy := extremes(n, k, mode == "adverse")
					scale := math.Max(1, math.Max(math.Abs(hi), math.Abs(lo)))
					if math.Abs(e.Max-hi) > rel*scale || math.Abs(e.Min-lo) > rel*scale {
						t.Errorf("node %s component %d: [%.12g, %.12g], force method [%.12g, %.12g]", names[n], k, e.Min, e.Max, lo, hi)
					}
					if got := a.Envelope.Combinations[e.MaxBy].Name; got != hiBy {
						t.Errorf("node %s component %d: max by %s, want %s", names[n], k, got, hiBy)
					}
					if got := a.Envelope.Combinations[e.MinBy].Name; got != loBy {
						t.Errorf("node %s component %d: min by %s, want %s", names[n], k, got, loBy)
					}
				}
			}
			// By statics: the least base moment at A is 1.4D's,
			// -16.60 kN·m to two decimals, in both modes; WR acting without
			// its roof suction gave -18.89 (1.2D + WR alone).
			m := a.Envelope.Reactions[0].M
			if by := a.Envelope.Combinations[m.MinBy].Name; math.Abs(m.Min+16.60) > 0.005 || by != "2.3.1-1 1.4D" {
				t.Errorf("least M at A %.4f by %s, want -16.60 by 2.3.1-1 1.4D", m.Min, by)
			}
			if wrong := 1.2*cases["D"][0][2] + cases["WR"][0][2]; math.Abs(wrong+18.89) > 0.005 || math.Abs(m.Min-wrong) < 1 {
				t.Errorf("1.2D + WR alone: %.4f, want -18.89, and not the envelope's %.4f", wrong, m.Min)
			}
			// Entered as one case per direction, the same portal gives the
			// same envelopes at every station and support.
			one, _ := readPortal(t, "wind-portal-uplift.toml", withVariableLoads(mode))
			b, err := analyseJob(one)
			if err != nil {
				t.Fatal(err)
			}
			sameEnvelopes(t, a.Envelope, b.Envelope, rel)
		})
	}
}
