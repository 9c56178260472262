package main

import (
	"context"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/combos"
	"govern/envelope/analysis"
)

func TestParseLengths(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want []float64
		err  string
	}{
		{"4.5,3.6x3", []float64{4.5, 3.6, 3.6, 3.6}, ""},
		{" 7.2, 6 ,7.2 ", []float64{7.2, 6, 7.2}, ""},
		{"8X2,6x1", []float64{8, 8, 6}, ""},
		{"5", []float64{5}, ""},
		{"4.5,,3.6", nil, `--storeys "4.5,,3.6": item 2 is empty`},
		{"4.5,three", nil, `--storeys "4.5,three": item 2, "three": "three" is not a length`},
		{"0,3", nil, `--storeys "0,3": item 1, "0": a length must be greater than zero`},
		{"-3.6", nil, `item 1, "-3.6": a length must be greater than zero`},
		{"3.6x0", nil, `item 1, "3.6x0": the count after x must be a whole number from 1 to 2000`},
		{"3.6x1.5", nil, `the count after x must be a whole number from 1 to 2000`},
		{"3.6x", nil, `the count after x must be a whole number from 1 to 2000`},
		{"x3", nil, `item 1, "x3": "" is not a length`},
		{"NaN", nil, `"NaN" is not a length`},
		{"3x1999,3x2", nil, `--storeys "3x1999,3x2": more than 2000 in all`},
	} {
		t.Run(tc.in, func(t *testing.T) {
			got, err := parseLengths("--storeys", tc.in)
			if tc.err == "" {
				if err != nil || !slices.Equal(got, tc.want) {
					t.Errorf("= %v, %v; want %v", got, err, tc.want)
				}
				return
			}
			if err == nil || !strings.Contains(err.Error(), tc.err) {
				t.Errorf("err = %v, want it to contain %q", err, tc.err)
			}
			if _, ok := err.(*usageError); !ok {
				t.Errorf("%T is not a usage error", err)
			}
		})
	}
}

func TestNewWritesAModelThatRuns(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "office.toml")
	code, out, stderr := exec("new", "--bays", "7.2,6,7.2", "--storeys", "4.5,3.6x3", "--spacing", "7.5", p)
	if code != 0 || !strings.Contains(out, "wrote "+p) {
		t.Fatalf("exit %d: %s%s", code, out, stderr)
	}
	src, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	job, err := modelfile.Read("office.toml", src)
	if err != nil {
		t.Fatal(err)
	}
	mo := job.Model
	t.Run("the grid asked for", func(t *testing.T) {
		g := job.Grid
		if g == nil || g.Spacing != 7.5 || len(g.Lines) != 4 || len(g.Levels) != 5 {
			t.Fatalf("grid %+v", g)
		}
		// Lines at the running sums of the bays, levels of the storeys.
		for i, want := range []float64{0, 7.2, 13.2, 20.4} {
			if abs(g.Lines[i]-want) > 1e-9 {
				t.Errorf("line %d at %g, want %g", i, g.Lines[i], want)
			}
		}
		for i, want := range []float64{0, 4.5, 8.1, 11.7, 15.3} {
			if abs(g.Levels[i]-want) > 1e-9 {
				t.Errorf("level %d at %g, want %g", i, g.Levels[i], want)
			}
		}
		if len(mo.Nodes) != 4*5 || len(mo.Members) != 4*4+3*4 {
			t.Errorf("%d nodes, %d members; want 20, 28", len(mo.Nodes), len(mo.Members))
		}
	})
	t.Run("sections with depths: faces on every beam end", func(t *testing.T) {
		for _, s := range mo.Sections {
			if !(s.Depth > 0) || !(s.Weight > 0) {
				t.Errorf("section %+v", s)
			}
			// A rectangle b × h: I = A h²/12 (to the four figures written).
			if want := s.A * s.Depth * s.Depth / 12; abs(s.I-want) > 5e-4*want {
				t.Errorf("section %s: I = %g, A h²/12 = %g", s.Name, s.I, want)
			}
		}
		n := 0
		for _, f := range analysis.ColumnFaces(mo) {
			for _, x := range f {
				if x >= 0 {
					n++
				}
			}
		}
		if n != 2*3*4 {
			t.Errorf("%d face stations, want two on each of the 12 beams", n)
		}
	})
	t.Run("a dead, a patterned live, a roof live and a reversible wind case", func(t *testing.T) {
		var kinds []combos.Kind
		for _, c := range job.Cases {
			kinds = append(kinds, c.Kind)
		}
		if !slices.Equal(kinds, []combos.Kind{combos.Dead, combos.Live, combos.RoofLive, combos.Wind}) {
			t.Errorf("kinds %v", kinds)
		}
		if !slices.Equal(job.Patterned, []int{1, 2}) || !job.CaseInfo[3].Reversible {
			t.Errorf("patterned %v, wind reversible %v", job.Patterned, job.CaseInfo[3].Reversible)
		}
		// Wind on a storey's tributary height: 1 kPa × 7.5 m × (4.5 + 3.6)/2
		// at level 1, half a storey at the roof.
		w := mo.Cases[3].NodeLoads
		if len(w) != 4 || abs(w[0].Fx-1.0*7.5*(4.5+3.6)/2) > 1e-9 || abs(w[3].Fx-1.0*7.5*3.6/2) > 1e-9 {
			t.Errorf("wind loads %+v", w)
		}
	})
	t.Run("strength set and a service combination", func(t *testing.T) {
		if job.Set == nil || job.Set.Name != "asce7-16-strength" {
			t.Fatalf("set %v", job.Set)
		}
		last := job.Combinations[len(job.Combinations)-1]
		if !last.Service || last.Rule != "model" {
			t.Errorf("last combination %+v", last)
		}
	})
	t.Run("it runs, with faces and deflections", func(t *testing.T) {
		code, out, stderr := exec("run", p)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		for _, want := range []string{"at the supports, centreline and column face", "Deflection of spans and cantilevers", "Column faces: 24 beam ends"} {
			if !strings.Contains(out, want) {
				t.Errorf("run output lacks %q", want)
			}
		}
	})
	t.Run("never overwrites", func(t *testing.T) {
		code, _, stderr := exec("new", "--bays", "6", "--storeys", "3", p)
		if code != 1 || !strings.Contains(stderr, "exists; not overwriting it") {
			t.Errorf("exit %d: %s", code, stderr)
		}
		if now, _ := os.ReadFile(p); string(now) != string(src) {
			t.Error("file changed")
		}
	})
	t.Run("to standard output without a file", func(t *testing.T) {
		code, out, _ := exec("new", "--bays", "6", "--storeys", "3", "--title", "shed")
		if code != 0 || !strings.Contains(out, `title = "shed"`) {
			t.Errorf("exit %d:\n%s", code, out)
		}
		if _, err := modelfile.Read("-", []byte(out)); err != nil {
			t.Error(err)
		}
	})
	t.Run("usage errors", func(t *testing.T) {
		for _, args := range [][]string{
			{"new", "--bays", "6"},
			{"new", "--bays", "6", "--storeys", "3,,3"},
			{"new", "--bays", "6", "--storeys", "3", "--spacing", "-2"},
			{"new", "--bays", "6", "--storeys", "3", "a.toml", "b.toml"},
			{"new", "--bays", "6x2000", "--storeys", "3x2000"},
			{"new", "--bays", "6", "--storeys", "3", "--units", "kN,ft"},
			{"new", "--bays", "6", "--storeys", "3", "--spacing", "0", "--units", "kip,ft"},
			{"new", "--bays", "6", "--storeys", "3", "--spacing", "six"},
		} {
			if code, _, stderr := exec(args...); code != 2 || !strings.HasPrefix(stderr, "govern new: ") {
				t.Errorf("%v: exit %d: %s", args, code, stderr)
			}
		}
	})
}

// writtenModel writes a starting model with govern new and reads it back.
func writtenModel(t *testing.T, args ...string) (*modelfile.Job, string) {
	t.Helper()
	code, out, stderr := exec(append([]string{"new"}, args...)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	job, err := modelfile.Read("new.toml", []byte(out))
	if err != nil {
		t.Fatal(err)
	}
	return job, out
}

// TestNewUnits: govern new --units writes a model in kN and m, N and mm,
// or kip and ft, each read back in its units, giving no warning (the
// plausibility checks included) and, in N and mm, the same frame as in kN
// and m.
func TestNewUnits(t *testing.T) {
	t.Run("kip and ft: US sizes and loads, with their units", func(t *testing.T) {
		job, src := writtenModel(t, "--units", "kip,ft", "--bays", "24,20,24", "--storeys", "14,12x3")
		if job.Units.Force != "kip" || job.Units.Length != "ft" || job.Grid.Spacing != 20 {
			t.Fatalf("units %+v, spacing %g", job.Units, job.Grid.Spacing)
		}
		for _, want := range []string{`E = "3600 ksi"`, `A = "400 in2"`, `I = "13333 in4"`, `depth = "20 in"`, `q = "125 psf"`, `q = "65 psf"`, `q = "20 psf"`} {
			if !strings.Contains(src, want) {
				t.Errorf("the model lacks %s", want)
			}
		}
		// C20, 20 × 20 in: E = 3600 ksi = 3600 × 144 ksf, A = 400/144 ft²,
		// I = 13333/12⁴ ft⁴; its weight 150 pcf × 400/144 ft² = 0.4167 klf.
		c := job.Model.Sections[0]
		for _, v := range [][3]float64{{c.E, 3600 * 144, 1e-12}, {c.A, 400.0 / 144, 1e-12}, {c.I, 13333.0 / 20736, 1e-12}, {c.Depth, 20.0 / 12, 1e-12}, {c.Weight, 0.15 * 400 / 144, 1e-4}} {
			if abs(v[0]-v[1]) > v[2]*v[1] {
				t.Errorf("C20: %.10g, want %.10g", v[0], v[1])
			}
		}
		// Wind 20 psf × 20 ft × (14 + 12)/2 ft = 5.2 kip at level 1.
		if fx := job.Model.Cases[3].NodeLoads[0].Fx; abs(fx-5.2) > 1e-12 {
			t.Errorf("wind at level 1: %g kip", fx)
		}
		if w := plausibleRun(t, job); len(w) > 0 {
			t.Errorf("warnings %q", w)
		}
	})
	t.Run("N and mm: the frame of kN and m", func(t *testing.T) {
		a, _ := writtenModel(t, "--bays", "7.2,6,7.2", "--storeys", "4.5,3.6x3")
		b, src := writtenModel(t, "--units", "N,mm", "--bays", "7200,6000,7200", "--storeys", "4500,3600x3")
		if b.Units.Force != "N" || b.Units.Length != "mm" || b.Grid.Spacing != 6000 || !strings.Contains(src, `q = "6 kPa"`) {
			t.Fatalf("units %+v, spacing %g", b.Units, b.Grid.Spacing)
		}
		ra, rb := runJob(t, a), runJob(t, b)
		if len(ra.Warnings)+len(rb.Warnings) > 0 {
			t.Errorf("warnings %q %q", ra.Warnings, rb.Warnings)
		}
		// Every moment of the envelopes: kN·m = 1e6 N·mm, to the four
		// figures A and I are written with.
		worst, scale := 0.0, 0.0
		for i, em := range ra.Envelope.Members {
			for k, st := range em.Stations {
				o := rb.Envelope.Members[i].Stations[k]
				scale = max(scale, abs(st.M.Max), abs(st.M.Min))
				worst = max(worst, abs(st.M.Max-o.M.Max/1e6), abs(st.M.Min-o.M.Min/1e6))
			}
		}
		if worst > 1e-9*scale {
			t.Errorf("moments differ by %g of %g", worst, scale)
		}
	})
}

func runJob(t *testing.T, job *modelfile.Job) *analysis.Result {
	t.Helper()
	res, err := analysis.Run(context.Background(), &job.Job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func plausibleRun(t *testing.T, job *modelfile.Job) []string {
	t.Helper()
	return runJob(t, job).Warnings
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}
