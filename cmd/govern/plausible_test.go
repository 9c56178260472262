package main

import (
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
)

// analyseFile reads and analyses a model file and returns the warnings of
// the check (govern check) and of the run.
func analyseFile(t *testing.T, path string) (check, run []string) {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	job, err := modelfile.ReadAt(filepath.Dir(path), filepath.Base(path), src)
	if err != nil {
		t.Fatal(err)
	}
	job.AllowUnused = true
	res, err := analysis.Run(context.Background(), &job.Job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return analysis.Plausibility(&job.Job), res.Warnings
}

// TestUnitSlipsAreNamed: each slip of testdata/units (A and I left in in²
// and in⁴ in a US frame in kip and ft; I in cm⁴ in a model in N and mm; E
// in MPa in a model in kN and m) gets the warnings of docs/errors.md,
// each naming the section or member and the slip. The numbers follow from
// the section tables' values (AISC Manual Table 1-1; European tables for
// HEB 300 and IPE 450; recalled from memory): W14x90 r = √(999/26.5) =
// 6.14 and W21x83 r = √(1830/24.4) = 8.66, read as ft; HEB 300
// r = √(25170/14910) = 1.299 mm; E = 30000 kN/m² = 0.03 GPa.
func TestUnitSlipsAreNamed(t *testing.T) {
	for _, tc := range []struct {
		file string
		want []string // the start of each warning, in order
	}{
		{"us-steel-slip.toml", []string{
			`section "W14x90": its radius of gyration r = √(I/A) = 6.14 ft is 5.263 times its depth 1.167 ft, where sections have 0.15 to 0.6 (a solid rectangle 0.29, an I-section about 0.4): I and A look like in⁴ and in² in a ft model`,
			`section "W21x83": its radius of gyration r = √(I/A) = 8.66 ft is 4.856 times its depth 1.783 ft, where sections have 0.15 to 0.6 (a solid rectangle 0.29, an I-section about 0.4): I and A look like in⁴ and in² in a ft model`,
			`member "A1-A2" (and 8 more of section "W14x90"): L/r = 1.954 (L = 12 ft, r = √(I/A) = 6.14 ft), below 4: shorter than any member is deep: I and A look like in⁴ and in² in a ft model`,
			`member "A1-B1" (and 5 more of section "W21x83"): L/r = 3.464 (L = 30 ft, r = √(I/A) = 8.66 ft), below 4: shorter than any member is deep: I and A look like in⁴ and in² in a ft model`,
			`span A1–B1 (and 5 more spans and cantilevers of beams): span/deflection L/15,216,007 under the service combinations, above 20,000: far stiffer than any floor: I of section "W21x83" looks like in⁴ in a ft model`,
		}},
		{"steel-n-mm-cm4-slip.toml", []string{
			`section "HEB300": its radius of gyration r = √(I/A) = 1.299 mm is 0.004331 times its depth 300 mm, where sections have 0.15 to 0.6 (a solid rectangle 0.29, an I-section about 0.4): I looks like cm⁴ in a mm model`,
			`section "IPE450": its radius of gyration r = √(I/A) = 1.848 mm is 0.004107 times its depth 450 mm`,
			`member "A-B" (and 1 more of section "HEB300"): L/r = 3848 (L = 5000 mm, r = √(I/A) = 1.299 mm), above 1000: more slender than any member of a frame: I looks like cm⁴ in a mm model`,
			`member "B-C" (section "IPE450"): L/r = 6494 (L = 12000 mm, r = √(I/A) = 1.848 mm), above 1000: more slender than any member of a frame: I looks like cm⁴ in a mm model`,
			// The slip makes the frame buckle under its loads (the
			// critical load factor, π²EI/L² with I 10⁴ too small).
			`the frame buckles: combination "1.35G+1.5Q": the critical load factor αcr = 0.006494 is not above 1`,
			`the frame buckles: combination "1.35G+1.5W+1.05Q": the critical load factor αcr = 0.007357 is not above 1`,
			`the frame buckles: combination "G+Q": the critical load factor αcr = 0.009161 is not above 1`,
			`span B–C: span/deflection L/0.0386 under the service combinations, below 50: far more flexible than any floor: I of section "IPE450" looks like cm⁴ in a mm model`,
		}},
		{"m-mpa-slip.toml", []string{
			`section "C450": E = 30000 kN/m² is 0.03 GPa, outside the 1 to 250 GPa (145 to 36,000 ksi; 1e+06 to 2.5e+08 kN/m² in this model's units) of building materials: E looks like MPa in a kN, m model`,
			`section "C600": E = 30000 kN/m² is 0.03 GPa`,
			`section "B350x650": E = 30000 kN/m² is 0.03 GPa`,
			`the frame buckles: combination "1.2D+1.6L": the critical load factor αcr = 0.1202 is not above 1`,
			`the frame buckles: combination "1.2D+1.0W+1.0L": the critical load factor αcr = 0.1322 is not above 1`,
			`the frame buckles: combination "0.9D-1.0W": the critical load factor αcr = 0.2113 is not above 1`,
			`the frame buckles: combination "D+L": the critical load factor αcr = 0.1537 is not above 1`,
			`span A1–B1 (and 3 more spans and cantilevers of beams): span/deflection L/1.991 under the service combinations, below 50: far more flexible than any floor: E of section "B350x650" looks like MPa in a kN, m model`,
		}},
	} {
		t.Run(tc.file, func(t *testing.T) {
			check, run := analyseFile(t, filepath.Join("..", "..", "testdata", "units", tc.file))
			if len(run) != len(tc.want) {
				t.Fatalf("%d warnings, want %d:\n%s", len(run), len(tc.want), strings.Join(run, "\n"))
			}
			for i, w := range tc.want {
				if !strings.HasPrefix(run[i], w) {
					t.Errorf("warning %d\n got: %s\nwant: %s", i+1, run[i], w)
				}
			}
			// govern check gives all but span/deflection and the critical
			// load factors, which need the run.
			buckles := 0
			for _, w := range run {
				if strings.HasPrefix(w, "the frame buckles") {
					buckles++
				}
			}
			if len(check) != len(run)-1-buckles {
				t.Errorf("check gives %d warnings, want %d", len(check), len(run)-1-buckles)
			}
		})
	}
}

// TestNoSlipWarnings: no warning on the demonstration, on any test model
// (testdata, but for the bad models), nor on the consistent models of
// testdata/units (among them the frame in N and mm and the steel portal
// in N and mm).
func TestNoSlipWarnings(t *testing.T) {
	var files []string
	err := filepath.WalkDir(filepath.Join("..", "..", "testdata"), func(p string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && d.Name() == "bad" {
			return filepath.SkipDir
		}
		if strings.HasSuffix(p, ".toml") && !strings.HasSuffix(p, "-slip.toml") {
			files = append(files, p)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	files = append(files, "demo.toml")
	if len(files) < 20 {
		t.Fatalf("only %d models", len(files))
	}
	for _, f := range files {
		t.Run(f, func(t *testing.T) {
			check, run := analyseFile(t, f)
			if len(check)+len(run) > 0 {
				t.Errorf("warnings:\n%s", strings.Join(append(check, run...), "\n"))
			}
		})
	}
}
