package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// hostile is a model whose title and names carry terminal controls and
// formula-like text (testdata/control-characters.toml, also a seed of the
// model reader's fuzz test).
var hostile = filepath.Join("..", "..", "testdata", "control-characters.toml")

// raw lists the characters of the hostile model that act on a terminal:
// none may reach standard output or standard error as they are.
var raw = []string{"\x1b", "\x07", "\r", "\t", "\u009b", "\u0085", "\u202e"}

func TestTerminalTextIsEscaped(t *testing.T) {
	for _, args := range [][]string{
		{"run", hostile},
		{"run", "--cross-check", hostile},
		{"run", "--compare-patterns", hostile},
		{"check", hostile},
		{"combos", hostile},
	} {
		t.Run(strings.Join(args[:len(args)-1], " "), func(t *testing.T) {
			code, stdout, stderr := exec(args...)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			for _, c := range raw {
				if i := strings.Index(stdout+stderr, c); i >= 0 {
					t.Errorf("%q printed raw: %q", c, (stdout + stderr)[max(0, i-30):min(len(stdout+stderr), i+30)])
				}
			}
			if args[1] != "--compare-patterns" {
				title := `Hostile names \x1b[2J\x1b]0;owned\x07 done\rX \u009b31m \u202eevil` + "\n"
				if !strings.HasPrefix(stdout, title) {
					t.Errorf("the output does not begin with the escaped title %q:\n%.200s", title, stdout)
				}
			}
		})
	}
	t.Run("names in tables", func(t *testing.T) {
		_, stdout, _ := exec("run", hostile)
		for _, want := range []string{"│ beam \\x1b[2J one │", "│ col\\u009bB │", "│ col\\u202eC │", "\\tbase B", "\\rbase C"} {
			if !strings.Contains(stdout, want) {
				t.Errorf("the tables lack %q", want)
			}
		}
	})
	t.Run("check lists cases and combinations escaped", func(t *testing.T) {
		_, stdout, _ := exec("check", hostile)
		for _, want := range []string{"  D\\x1b]0;t\\x07 dead        2 member loads", "  @service\\u0085               D\\x1b]0;t\\x07 + =L   (service)"} {
			if !strings.Contains(stdout, want) {
				t.Errorf("check output lacks %q:\n%s", want, stdout)
			}
		}
	})
}

// TestMessagesAreEscaped: a file name or a flag given on the command line
// reaches the messages escaped too; tabs stay, so that the marker under a
// quoted line still lines up.
func TestMessagesAreEscaped(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad\x1b[2J.toml")
	if err := os.WriteFile(bad, []byte("title =\t\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	mixed := filepath.Join(dir, "mixed\x07.toml")
	src, _ := os.ReadFile(filepath.Join("..", "..", "testdata", "bad", "mixed-units.toml"))
	os.WriteFile(mixed, src, 0o644)
	for _, tc := range []struct {
		name   string
		args   []string
		stderr string // the first line
	}{
		{"model file name", []string{"check", bad}, "govern check: bad\\x1b[2J.toml:1:9: expected value but found '\\n' instead\ngovern check:     title =\t\ngovern check:            \t^\n"},
		{"flag", []string{"run", "--j\x1b]0;x\x07", "m.toml"}, "govern run: flag provided but not defined: -j\\x1b]0;x\\x07\n"},
		{"warning", []string{"run", "--quiet", mixed}, "govern run: warning: mixed\\x07.toml: member \"A0-A1\" (and 5 more of section \"C\"): L/r"},
		{"output path", []string{"run", "--json", filepath.Join(dir, "no\x1bfolder", "e.json"), writeDemo(t)}, "govern run: cannot write " + dir + "/no\\x1bfolder/e.json: open " + dir + "/no\\x1bfolder/.e.json.tmp"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, _, stderr := exec(tc.args...)
			if !strings.HasPrefix(stderr, tc.stderr) {
				t.Errorf("stderr %q, want it to begin %q", stderr, tc.stderr)
			}
			if strings.ContainsAny(stderr, "\x1b\x07") {
				t.Errorf("stderr carries a control character raw: %q", stderr)
			}
		})
	}
}

func TestProgressLineIsEscaped(t *testing.T) {
	var buf lockedBuffer
	p := startProgress(&buf, "govern run", time.Now().Add(-time.Hour))
	p.phase("solving \x1b]0;owned\x07", 0)
	deadline := time.Now().Add(5 * time.Second)
	for !strings.Contains(buf.String(), "solving") && time.Now().Before(deadline) {
		time.Sleep(10 * time.Millisecond)
	}
	p.end()
	out := buf.String()
	if !strings.Contains(out, "\rgovern run: solving \\x1b]0;owned\\x07\x1b[K") || strings.Contains(out, "\x07") {
		t.Errorf("progress output %q", out)
	}
}
