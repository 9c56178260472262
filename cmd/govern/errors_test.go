package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/report/files"
	"govern/frame"
)

var update = flag.Bool("update", false, "rewrite the golden files of testdata/bad and testdata/output")

// TestBadModels runs "govern run" on every model in testdata/bad and
// compares the exit status and standard error with the golden file beside
// it (go test -run BadModels -update rewrites them). Standard output must be
// empty whenever the exit status is not 0: a broken model never gets
// plausible-looking numbers.
func TestBadModels(t *testing.T) {
	models, err := filepath.Glob(filepath.Join("..", "..", "testdata", "bad", "*.toml"))
	if err != nil || len(models) == 0 {
		t.Fatalf("no models in testdata/bad: %v", err)
	}
	for _, m := range models {
		name := strings.TrimSuffix(filepath.Base(m), ".toml")
		t.Run(name, func(t *testing.T) {
			code, stdout, stderr := exec("run", m)
			got := fmt.Sprintf("exit %d\n%s", code, stderr)
			golden := strings.TrimSuffix(m, ".toml") + ".golden"
			if *update {
				if err := os.WriteFile(golden, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("%v (run with -update to create it)", err)
			}
			if got != string(want) {
				t.Errorf("govern run %s\n got:\n%s\nwant:\n%s", filepath.Base(m), got, want)
			}
			if code != 0 && stdout != "" {
				t.Errorf("exit %d but standard output has %d bytes", code, len(stdout))
			}
			for _, line := range strings.Split(strings.TrimSuffix(stderr, "\n"), "\n") {
				if !strings.HasPrefix(line, "govern run: ") {
					t.Errorf("stderr line without the command prefix: %q", line)
				}
			}
		})
	}
}

// TestExitStatusAndPrefix: 0 success, 1 bad model or analysis failure, 2
// usage; every message on stderr prefixed with the command name.
func TestExitStatusAndPrefix(t *testing.T) {
	dir := t.TempDir()
	model := writeDemo(t)
	bad := filepath.Join("..", "..", "testdata", "bad")
	for _, tc := range []struct {
		name   string
		args   []string
		code   int
		stderr string // every line must start with "govern" and this line must be present
	}{
		{"success", []string{"run", model}, 0, ""},
		{"check success", []string{"check", model}, 0, ""},
		{"warning only", []string{"run", filepath.Join(bad, "mixed-units.toml")}, 0, `govern run: warning: mixed-units.toml: member "A0-A1" (and 5 more of section "C"): L/r = 3.033e-05`},
		{"check warns too", []string{"check", filepath.Join(bad, "mixed-units.toml")}, 0, `govern check: warning: mixed-units.toml: member "A0-A1" (and 5 more of section "C"): L/r = 3.033e-05`},
		{"strict makes a warning an error", []string{"run", "--strict", filepath.Join(bad, "mixed-units.toml")}, 1, `govern run: mixed-units.toml: 1 warning, which --strict makes errors, so no results are given:`},
		{"strict names the warning", []string{"run", "--strict", filepath.Join(bad, "mixed-units.toml")}, 1, `govern run: mixed-units.toml: member "A0-A1" (and 5 more of section "C"): L/r = 3.033e-05 (L = 3.5 m, r = √(I/A) = 115380 m), below 4: shorter than any member is deep: I looks like mm⁴ in a m model`},
		{"strict check", []string{"check", "--strict", filepath.Join(bad, "mixed-units.toml")}, 1, `govern check: mixed-units.toml: 1 warning, which --strict makes errors, so no results are given:`},
		{"strict without warnings", []string{"run", "--strict", model}, 0, ""},
		{"bad model", []string{"run", filepath.Join(bad, "typos.toml")}, 1, `govern run: typos.toml:2: unknown key "titel" (did you mean "title"?) at the top level`},
		{"mechanism", []string{"run", filepath.Join(bad, "sway.toml")}, 1, `govern run: sway.toml: the structure is a mechanism (it cannot carry load): node "C" is free to move along X (ux)`},
		{"check finds a mechanism, at the line of the moment", []string{"check", filepath.Join(bad, "released-node-moment.toml")}, 1, `govern check: released-node-moment.toml:47: case "M", load 1: the structure is a mechanism (it cannot carry load): node "B" is free to rotate (rz): every member end there is released (hinged) and no support holds its rotation, so nothing resists the moment that case "M" applies there`},
		{"check refuses an ill-conditioned model", []string{"check", filepath.Join(bad, "ill-conditioned.toml")}, 1, "(govern run --accept-ill-conditioned solves it anyway"},
		{"check finds too many stations", []string{"check", filepath.Join(bad, "too-many-stations.toml")}, 1, "govern check: too-many-stations.toml: the envelopes would hold 3,243,240 station values"},
		{"model is a directory", []string{"check", dir}, 1, "govern check: cannot read model: " + dir + " is a directory"},
		{"missing model", []string{"run", filepath.Join(dir, "none.toml")}, 1, "govern run: cannot read model: open " + filepath.Join(dir, "none.toml")},
		{"output is the model", []string{"run", "--csv", model, model}, 1, "govern run: refusing to write " + model + ": it is the model file"},
		{"output is a directory", []string{"run", "--json", dir, model}, 1, "govern run: cannot write " + dir + ": it is a directory"},
		{"two outputs, one file", []string{"run", "--json", filepath.Join(dir, "e"), "--csv", filepath.Join(dir, "e"), model}, 1, "govern run: refusing to write " + filepath.Join(dir, "e") + " twice: two outputs name the same file"},
		{"no model", []string{"run"}, 2, "govern run: need one model file, got 0 arguments"},
		{"two models", []string{"check", model, model}, 2, "govern check: need one model file, got 2 arguments"},
		{"both outputs to stdout", []string{"run", "--json", "-", "--csv", "-", model}, 2, "govern run: only one of --json, --csv, --cases-csv, --design-csv and --report can go to standard output"},
		{"unknown flag", []string{"check", "--fast", model}, 2, "govern check: flag provided but not defined: -fast"},
		{"flag without its value", []string{"run", model, "--json"}, 2, "govern run: flag needs an argument: -json"},
		{"unknown command", []string{"analyse"}, 2, `govern: unknown command "analyse"`},
		{"demo takes no model", []string{"demo", model}, 2, "govern demo: demo takes no arguments"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := exec(tc.args...)
			if code != tc.code {
				t.Errorf("exit %d, want %d; stderr:\n%s", code, tc.code, stderr)
			}
			if !strings.Contains(stderr, tc.stderr) {
				t.Errorf("stderr %q does not contain %q", stderr, tc.stderr)
			}
			for _, line := range strings.Split(strings.TrimSuffix(stderr, "\n"), "\n") {
				if line != "" && !strings.HasPrefix(line, "govern") && !strings.HasPrefix(line, "usage: govern") && !strings.HasPrefix(line, "Run 'govern help") {
					t.Errorf("stderr line without the command prefix: %q", line)
				}
			}
			if code == 1 && stdout != "" {
				t.Errorf("failed run wrote to standard output:\n%s", stdout)
			}
		})
	}
}

func TestPanicIsReportedNotRaised(t *testing.T) {
	model := writeDemo(t)
	out := filepath.Join(filepath.Dir(model), "env.json")
	defer func(f func(*os.File) io.Writer) { files.TempWriter = f }(files.TempWriter)
	files.TempWriter = func(f *os.File) io.Writer { return &faulty{w: f, after: 0, panics: true} }
	code, stdout, stderr := exec("run", "--json", out, model)
	want := "govern run: internal error: interrupted (simulated)\ngovern run: please report this with the model that caused it\n"
	if code != 1 || stderr != want || stdout != "" {
		t.Errorf("exit %d, stdout %q, stderr %q; want 1 and %q", code, stdout, stderr, want)
	}
	if files.Exists(out) {
		t.Error("an output was left behind")
	}
	assertNoTemporaries(t, filepath.Dir(out))
}

// faulty passes the first after bytes written through it to w, then fails
// as a full disk would, or panics as an interrupted run would.
type faulty struct {
	w      io.Writer
	after  int
	panics bool
}

var errDisk = errors.New("no space left on device (simulated)")

func (f *faulty) Write(p []byte) (int, error) {
	if len(p) <= f.after {
		f.after -= len(p)
		return f.w.Write(p)
	}
	n, _ := f.w.Write(p[:f.after])
	f.after = 0
	if f.panics {
		panic("interrupted (simulated)")
	}
	return n, errDisk
}

// assertNoTemporaries fails if a temporary output file is left in dir.
func assertNoTemporaries(t *testing.T, dir string) {
	t.Helper()
	left, _ := filepath.Glob(filepath.Join(dir, ".*.tmp*"))
	if len(left) > 0 {
		t.Errorf("temporary files left behind: %v", left)
	}
}

func TestInterruptedWriteLeavesThePreviousFile(t *testing.T) {
	model := writeDemo(t)
	dir := filepath.Dir(model)
	js, cs := filepath.Join(dir, "env.json"), filepath.Join(dir, "env.csv")
	if code, _, stderr := exec("run", "--json", js, "--csv", cs, model); code != 0 {
		t.Fatalf("first run: exit %d: %s", code, stderr)
	}
	goodJSON, _ := os.ReadFile(js)
	goodCSV, _ := os.ReadFile(cs)
	// A second model whose results differ, so that a write that got through
	// would show.
	other := filepath.Join(dir, "other.toml")
	if err := os.WriteFile(other, bytes.Replace(demoModel, []byte("stations = 11"), []byte("stations = 5"), 1), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		temp func(file int, f *os.File) io.Writer // the writer of the file-th temporary file
	}{
		{"the disk fills part way through the first file", func(_ int, f *os.File) io.Writer {
			return &faulty{w: f, after: 1000}
		}},
		{"the first file is written, the second fails part way", func(file int, f *os.File) io.Writer {
			if file == 1 {
				return f
			}
			return &faulty{w: f, after: 1000}
		}},
		{"the run is stopped part way through a write", func(_ int, f *os.File) io.Writer {
			return &faulty{w: f, after: 1000, panics: true}
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			defer func(f func(*os.File) io.Writer) { files.TempWriter = f }(files.TempWriter)
			n := 0
			files.TempWriter = func(f *os.File) io.Writer {
				n++
				return tc.temp(n, f)
			}
			if code, _, _ := exec("run", "--json", js, "--csv", cs, other); code != 1 {
				t.Errorf("exit %d, want 1", code)
			}
			if got, _ := os.ReadFile(js); !bytes.Equal(got, goodJSON) {
				t.Error("the JSON file changed")
			}
			if got, _ := os.ReadFile(cs); !bytes.Equal(got, goodCSV) {
				t.Error("the CSV file changed")
			}
			assertNoTemporaries(t, dir)
		})
	}
	t.Run("after the fault, a run writes both files", func(t *testing.T) {
		if code, _, stderr := exec("run", "--json", js, "--csv", cs, other); code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		if got, _ := os.ReadFile(js); bytes.Equal(got, goodJSON) {
			t.Error("the JSON file was not replaced")
		}
		assertNoTemporaries(t, dir)
	})
}

func TestOutputKeepsThePermissionsOfTheFileItReplaces(t *testing.T) {
	model := writeDemo(t)
	out := filepath.Join(filepath.Dir(model), "env.csv")
	if err := os.WriteFile(out, []byte("old"), 0o640); err != nil {
		t.Fatal(err)
	}
	if code, _, stderr := exec("run", "--csv", out, model); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	st, err := os.Stat(out)
	if err != nil {
		t.Fatal(err)
	}
	if st.Mode().Perm() != 0o640 {
		t.Errorf("mode %v, want 0640", st.Mode().Perm())
	}
}

// TestTwoRunsGiveIdenticalBytes: the same model, run again, gives the same
// bytes in every output: no map-order or other drift.
func TestTwoRunsGiveIdenticalBytes(t *testing.T) {
	model := writeDemo(t)
	dir := filepath.Dir(model)
	var first [3][]byte
	for run := range 3 {
		js, cs := filepath.Join(dir, fmt.Sprint("e", run, ".json")), filepath.Join(dir, fmt.Sprint("e", run, ".csv"))
		code, summary, stderr := exec("run", model, "--json", js, "--csv", cs)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		j, _ := os.ReadFile(js)
		c, _ := os.ReadFile(cs)
		got := [3][]byte{j, c, []byte(summary)}
		if run == 0 {
			first = got
			continue
		}
		for i, what := range []string{"JSON", "CSV", "summary"} {
			if !bytes.Equal(got[i], first[i]) {
				t.Errorf("run %d: %s differs from the first run", run+1, what)
			}
		}
	}
}

func TestCheckReportsStability(t *testing.T) {
	job, err := modelfile.Read("demo.toml", demoModel)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(job.Model)
	if err != nil {
		t.Fatal(err)
	}
	code, out, stderr := exec("check", writeDemo(t))
	if code != 0 || stderr != "" {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	// The condition number depends on the stiffness alone, not the loads.
	want := fmt.Sprintf("stability:      no mechanism; estimated condition number %.2g\n", sol.Cond())
	if !strings.Contains(out, want) {
		t.Errorf("check output lacks %q:\n%s", want, out)
	}
}
