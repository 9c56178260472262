package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"os"
	osexec "os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"syscall"
	"testing"
	"time"

	"govern/envelope/report"
	"govern/envelope/report/files"
)

// asMain, in the environment, makes the test binary run govern's main
// instead of the tests, for tests that need a process of its own. Its
// value "stall" makes every temporary output file stop after its first
// write, as if the run were writing a very large file, so that a signal
// can be sent while it is there.
const asMain = "GOVERN_TEST_AS_MAIN"

// sourceRows is the number of rows of the source at the end of a CSV:
// program, model file, SHA-256, run date.
const sourceRows = 4

// testDateEpoch is the run date of the tests' outputs: 2026-01-01T00:00:00Z.
const testDateEpoch = "1767225600"

func TestMain(m *testing.M) {
	switch os.Getenv(asMain) {
	case "":
		// Every output carries the run date: the tests fix it, so that
		// golden files are stable.
		if os.Getenv("SOURCE_DATE_EPOCH") == "" {
			os.Setenv("SOURCE_DATE_EPOCH", testDateEpoch)
		}
		os.Exit(m.Run())
	case "stall":
		files.TempWriter = func(f *os.File) io.Writer { return &stall{w: f} }
	}
	main()
}

// stall passes its first write through and then never returns.
type stall struct {
	w     io.Writer
	wrote bool
}

func (s *stall) Write(p []byte) (int, error) {
	if s.wrote {
		for {
			time.Sleep(time.Hour)
		}
	}
	s.wrote = true
	return s.w.Write(p)
}

// signalWait bounds how long the signal test waits for the process to
// start writing and to end.
const signalWait = time.Minute

// TestSignalsRemoveTemporaryFiles: an interrupt, termination or hang-up
// while the outputs are being written removes every temporary file (and a
// folder --out made), leaves the previous files as they were, and ends the
// process by that signal: status 128 + its number in the shell.
func TestSignalsRemoveTemporaryFiles(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("a process cannot be sent these signals here")
	}
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM, syscall.SIGHUP} {
		for _, out := range []string{"--json", "--out"} {
			t.Run(fmt.Sprintf("%v, %s", sig, out), func(t *testing.T) {
				model := writeDemo(t)
				dir := filepath.Dir(model)
				js, cs, folder := filepath.Join(dir, "env.json"), filepath.Join(dir, "env.csv"), filepath.Join(dir, "results")
				os.WriteFile(js, []byte("previous"), 0o644)
				args := []string{"run", "--json", js, "--csv", cs, model}
				temps := dir
				if out == "--out" {
					args, temps = []string{"run", "--out", folder, model}, folder
				}
				cmd := osexec.Command(os.Args[0], args...)
				cmd.Env = append(os.Environ(), asMain+"=stall")
				var stderr bytes.Buffer
				cmd.Stderr = &stderr
				if err := cmd.Start(); err != nil {
					t.Fatal(err)
				}
				defer cmd.Process.Kill()
				for deadline := time.Now().Add(signalWait); ; time.Sleep(10 * time.Millisecond) {
					left, _ := filepath.Glob(filepath.Join(temps, ".*.tmp*"))
					if len(left) > 0 {
						if st, err := os.Stat(left[0]); err == nil && st.Size() > 0 {
							break
						}
					}
					if time.Now().After(deadline) {
						t.Fatalf("no temporary file was written in %v; stderr: %s", signalWait, stderr.String())
					}
				}
				if err := cmd.Process.Signal(sig); err != nil {
					t.Fatal(err)
				}
				done := make(chan error, 1)
				go func() { done <- cmd.Wait() }()
				select {
				case <-done:
				case <-time.After(signalWait):
					t.Fatalf("the process did not end in %v after %v", signalWait, sig)
				}
				ws := cmd.ProcessState.Sys().(syscall.WaitStatus)
				if !(ws.Signaled() && ws.Signal() == sig) && ws.ExitStatus() != 128+int(sig) {
					t.Errorf("the process ended with %v, want by %v or with status %d", cmd.ProcessState, sig, 128+int(sig))
				}
				assertNoTemporaries(t, dir)
				if out == "--out" {
					if files.Exists(folder) {
						left, _ := filepath.Glob(filepath.Join(folder, "*"))
						t.Errorf("the folder --out made is left behind, holding %v", left)
					}
				} else {
					if b, _ := os.ReadFile(js); string(b) != "previous" {
						t.Errorf("the JSON file changed to %d bytes", len(b))
					}
					if files.Exists(cs) {
						t.Error("a CSV file was written")
					}
				}
				if stderr.Len() > 0 {
					t.Errorf("stderr: %s", stderr.String())
				}
			})
		}
	}
}

// TestEveryWriteErrorIsAnError: a command whose standard output cannot be
// written (a full disk, a closed pipe) fails with status 1 and says so,
// whether the first write fails or one part way; so does a successful run
// whose warnings could not be written to standard error.
func TestEveryWriteErrorIsAnError(t *testing.T) {
	model := writeDemo(t)
	csvFile := filepath.Join(filepath.Dir(model), "combos.csv")
	for _, tc := range []struct {
		name  string
		args  []string
		after int // bytes written before the fault
		who   string
	}{
		{"check", []string{"check", model}, 0, "govern check"},
		{"check, part way", []string{"check", model}, 200, "govern check"},
		{"combos", []string{"combos", model}, 0, "govern combos"},
		{"combos, part way", []string{"combos", model}, 1500, "govern combos"},
		{"combos with a CSV file", []string{"combos", "--csv", csvFile, model}, 0, "govern combos"},
		{"verify", []string{"verify"}, 0, "govern verify"},
		{"verify, part way", []string{"verify"}, 3000, "govern verify"},
		{"run", []string{"run", model}, 0, "govern run"},
		{"run, part way", []string{"run", model}, 5000, "govern run"},
		{"run, JSON to standard output", []string{"run", "--json", "-", model}, 0, "govern run"},
		{"new", []string{"new", "--bays", "6", "--storeys", "3"}, 0, "govern new"},
		{"help", []string{"help"}, 0, "govern"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var errb bytes.Buffer
			code := govern(tc.args, &faulty{w: io.Discard, after: tc.after}, &errb)
			want := tc.who + ": cannot write to standard output: no space left on device (simulated)\n"
			if code != 1 || errb.String() != want {
				t.Errorf("exit %d, stderr %q; want 1 and %q", code, errb.String(), want)
			}
		})
	}
	t.Run("check to /dev/full", func(t *testing.T) {
		full, err := os.OpenFile("/dev/full", os.O_WRONLY, 0)
		if err != nil {
			t.Skipf("no /dev/full: %v", err)
		}
		defer full.Close()
		for _, args := range [][]string{{"check", model}, {"combos", model}, {"verify"}} {
			var errb bytes.Buffer
			code := govern(args, full, &errb)
			want := "govern " + args[0] + ": cannot write to standard output: write /dev/full: no space left on device\n"
			if code != 1 || errb.String() != want {
				t.Errorf("govern %s: exit %d, stderr %q; want 1 and %q", args[0], code, errb.String(), want)
			}
		}
	})
	t.Run("a warning that cannot be written", func(t *testing.T) {
		mixed := filepath.Join("..", "..", "testdata", "bad", "mixed-units.toml")
		if code := govern([]string{"run", "--quiet", mixed}, io.Discard, &faulty{w: io.Discard}); code != 1 {
			t.Errorf("exit %d, want 1", code)
		}
		if code := govern([]string{"run", "--quiet", mixed}, io.Discard, io.Discard); code != 0 {
			t.Errorf("with standard error writable: exit %d, want 0", code)
		}
	})
}

// exec runs govern with args and returns the exit status and both streams.
func exec(args ...string) (int, string, string) {
	var out, errb bytes.Buffer
	code := govern(args, &out, &errb)
	return code, out.String(), errb.String()
}

func writeDemo(t *testing.T) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "model.toml")
	if err := os.WriteFile(p, demoModel, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestExitStatus(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.toml")
	os.WriteFile(bad, []byte("title = \n"), 0o644)
	for _, tc := range []struct {
		name   string
		args   []string
		code   int
		stderr string
	}{
		{"no command", nil, 2, "Usage:"},
		{"unknown command", []string{"frobnicate"}, 2, `govern: unknown command "frobnicate"`},
		{"unknown flag", []string{"run", "--jsn", "x", "m.toml"}, 2, "govern run: flag provided but not defined: -jsn"},
		{"missing model", []string{"run"}, 2, "govern run: need one model file, got 0 arguments"},
		{"unreadable model", []string{"run", filepath.Join(dir, "none.toml")}, 1, "govern run: cannot read model"},
		{"bad model", []string{"check", bad}, 1, "govern check: bad.toml:1:9: expected value"},
		{"help", []string{"help", "run"}, 0, ""},
		{"demo", []string{"demo"}, 0, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code, _, stderr := exec(tc.args...)
			if code != tc.code {
				t.Errorf("exit %d, want %d; stderr:\n%s", code, tc.code, stderr)
			}
			if !strings.Contains(stderr, tc.stderr) {
				t.Errorf("stderr %q does not contain %q", stderr, tc.stderr)
			}
		})
	}
}

func TestHelpAndReportCarryTheCaution(t *testing.T) {
	for _, args := range [][]string{{"help"}, {"help", "run"}, {"demo"}} {
		_, out, _ := exec(args...)
		// The caution is wrapped to the terminal's width.
		if !strings.Contains(strings.Join(strings.Fields(out), " "), report.Caution) {
			t.Errorf("govern %s: output lacks the caution", strings.Join(args, " "))
		}
	}
}

func TestRunJSON(t *testing.T) {
	model := writeDemo(t)
	// Flags may follow the model path.
	code, out, stderr := exec("run", model, "--json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var doc struct {
		Format   string `json:"format"`
		Settings struct {
			Stations      int    `json:"stations"`
			VariableLoads string `json:"variable_loads"`
		} `json:"settings"`
		Combinations []struct {
			Name    string             `json:"name"`
			Factors map[string]float64 `json:"factors"`
		} `json:"combinations"`
		Members []struct {
			Name, Start, End string
			Length           float64
			Stations         []struct {
				X       float64
				N, V, M struct {
					Max   float64 `json:"max"`
					MaxBy string  `json:"max_by"`
					Min   float64 `json:"min"`
					MinBy string  `json:"min_by"`
				}
			}
		} `json:"members"`
		Reactions []struct {
			Node string `json:"node"`
		} `json:"reactions"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("output is not JSON: %v", err)
	}
	if doc.Format != "govern.envelopes/2" || doc.Settings.Stations != 11 || doc.Settings.VariableLoads != "adverse" {
		t.Errorf("header = %q %+v", doc.Format, doc.Settings)
	}
	if len(doc.Members) != 35 || len(doc.Reactions) != 4 || len(doc.Combinations) != 9 {
		t.Fatalf("%d members, %d reactions, %d combinations", len(doc.Members), len(doc.Reactions), len(doc.Combinations))
	}
	for _, m := range doc.Members {
		st := m.Stations
		if len(st) != 11 || st[0].X != 0 || st[len(st)-1].X != m.Length {
			t.Errorf("member %s: stations do not run from 0 to %g", m.Name, m.Length)
		}
		for i, s := range st {
			if i > 0 && s.X <= st[i-1].X {
				t.Errorf("member %s: stations not sorted", m.Name)
			}
			if s.M.Max < s.M.Min || s.M.MaxBy == "" || s.M.MinBy == "" {
				t.Errorf("member %s station %d: M = %+v", m.Name, i, s.M)
			}
		}
	}
}

func TestRunFilesAndCSV(t *testing.T) {
	model := writeDemo(t)
	dir := filepath.Dir(model)
	js, cs := filepath.Join(dir, "env.json"), filepath.Join(dir, "env.csv")
	code, out, stderr := exec("run", "--json", js, "--csv", cs, model)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "Governing design values") || !strings.Contains(out, "+M (kN·m)") || !strings.Contains(out, "Columns on line A") {
		t.Errorf("summary missing:\n%s", out)
	}
	f, _ := os.Open(cs)
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	// The unit column's header says the signs are the member's own, where
	// a reader of the file sees it, in the one header row.
	if got := strings.Join(rows[0], ","); got != "member,x (m),effect,max,max_by,min,min_by,"+report.CSVUnitHeader+",max_spans,min_spans,max_loaded,min_loaded,max_with_N (kN),max_with_V (kN),max_with_M (kN·m),min_with_N (kN),min_with_V (kN),min_with_M (kN·m),face" {
		t.Errorf("CSV header %q", got)
	}
	if !strings.Contains(rows[0][7], "member axes") || !strings.Contains(rows[0][7], "local -y face in tension") || strings.Contains(rows[0][7], ",") {
		t.Errorf("the unit column's header %q does not say the signs are in member axes (in one cell without a comma)", rows[0][7])
	}
	// A row per member, station and effect, ux, uy and rz of each of the
	// 24 nodes, then the source's rows.
	if len(rows) != 1+35*11*3+24*3+sourceRows {
		t.Errorf("%d CSV rows, want %d", len(rows), 1+35*11*3+24*3+sourceRows)
	}
	t.Run("same model, identical bytes", func(t *testing.T) {
		first, _ := os.ReadFile(js)
		exec("run", "--json", js, model)
		second, _ := os.ReadFile(js)
		if !bytes.Equal(first, second) {
			t.Error("two runs wrote different JSON")
		}
	})
	t.Run("a failed run leaves the previous file", func(t *testing.T) {
		before, _ := os.ReadFile(js)
		bad := filepath.Join(dir, "bad.toml")
		os.WriteFile(bad, []byte("[[node]]\nname = 1\n"), 0o644)
		if code, _, _ := exec("run", "--json", js, bad); code != 1 {
			t.Errorf("exit %d, want 1", code)
		}
		after, _ := os.ReadFile(js)
		if !bytes.Equal(before, after) {
			t.Error("failed run changed the output file")
		}
	})
	t.Run("output never overwrites the model", func(t *testing.T) {
		code, _, stderr := exec("run", "--json", model, model)
		if code != 1 || !strings.Contains(stderr, "it is the model file") {
			t.Errorf("exit %d, stderr %q", code, stderr)
		}
		src, _ := os.ReadFile(model)
		if !bytes.Equal(src, demoModel) {
			t.Error("model file changed")
		}
	})
}

func TestCheck(t *testing.T) {
	code, out, stderr := exec("check", writeDemo(t))
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for _, want := range []string{"nodes:          24 (4 supported)", "members:        35 (15 beams, 20 columns, 0 other)", "equations:      60", "combinations:   9"} {
		if !strings.Contains(out, want) {
			t.Errorf("check output lacks %q:\n%s", want, out)
		}
	}
}

func TestDemoWrite(t *testing.T) {
	p := filepath.Join(t.TempDir(), "demo.toml")
	if code, _, stderr := exec("demo", "--write", p); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	got, _ := os.ReadFile(p)
	if !bytes.Equal(got, demoModel) {
		t.Error("written model differs from the embedded one")
	}
	if code, _, stderr := exec("demo", "--write", p); code != 1 || !strings.Contains(stderr, "not overwriting") {
		t.Errorf("second write: exit %d, %q", code, stderr)
	}
	// As govern new does: "-" and a path that names standard output write
	// the model there, and no file named "-" is made.
	t.Run("to standard output with -", func(t *testing.T) {
		dir := t.TempDir()
		t.Chdir(dir)
		code, out, stderr := exec("demo", "--write", "-")
		if code != 0 || out != string(demoModel) {
			t.Errorf("exit %d, %q; standard output holds %d bytes, want the model's %d", code, stderr, len(out), len(demoModel))
		}
		if _, err := os.Lstat(filepath.Join(dir, "-")); !os.IsNotExist(err) {
			t.Errorf("a file named - was made (%v)", err)
		}
	})
	t.Run("to a path that names standard output", func(t *testing.T) {
		// Standard output redirected to a file; the path names it through
		// /proc/self/fd, as /dev/stdout does for the process's own.
		out, err := os.Create(filepath.Join(t.TempDir(), "redirected"))
		if err != nil {
			t.Fatal(err)
		}
		defer out.Close()
		path := fmt.Sprintf("/proc/self/fd/%d", out.Fd())
		if _, err := os.Stat(path); err != nil {
			t.Skipf("no %s here", path)
		}
		var errb bytes.Buffer
		if code := govern([]string{"demo", "--write", path}, out, &errb); code != 0 {
			t.Fatalf("exit %d: %s", code, errb.String())
		}
		if b, _ := os.ReadFile(out.Name()); !bytes.Equal(b, demoModel) {
			t.Errorf("standard output holds %d bytes, not the model alone (%d)", len(b), len(demoModel))
		}
	})
}

func TestComparePatterns(t *testing.T) {
	model := writeDemo(t)
	code, out, stderr := exec("run", "--compare-patterns", model)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	// One row per member; the code arrangements never beat exact placement,
	// so no shortfall is negative.
	rows := 0
	for _, line := range strings.Split(out, "\n") {
		f := strings.Split(line, "│")
		if len(f) < 9 || strings.TrimSpace(f[1]) == "member" {
			continue
		}
		rows++
		if v := strings.TrimSpace(f[7]); strings.HasPrefix(v, "-") {
			t.Errorf("negative shortfall: %s", line)
		}
	}
	if rows != 35 {
		t.Errorf("%d member rows, want 35:\n%s", rows, out)
	}
	plain := strings.Replace(string(demoModel), "pattern = true", "pattern = false", -1)
	p := filepath.Join(t.TempDir(), "plain.toml")
	os.WriteFile(p, []byte(plain), 0o644)
	if code, _, stderr := exec("run", "--compare-patterns", p); code != 1 || !strings.Contains(stderr, "no case has pattern = true") {
		t.Errorf("without patterned cases: exit %d, %q", code, stderr)
	}
}
