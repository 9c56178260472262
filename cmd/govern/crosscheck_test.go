package main

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// singleStorey is an invented two-bay, single-storey frame with gravity and
// wind cases, for the cross-check. The areas are made 100 times the real
// ones so that axial strain, which moment distribution neglects, leaves a
// difference of order 1e-4 (with the real areas it is about 1%).
const singleStorey = `title = "Single-storey test frame"
[grid]
bays = [6.0, 8.0]
storeys = [4.5]
column = "C"
beam = "B"
[[section]]
name = "C"
E = 30.0e6
A = 16.0
I = 2.13e-3
[[section]]
name = "B"
E = 30.0e6
A = 18.0
I = 5.4e-3
[[case]]
name = "D"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "roof"
  w = 20.0
[[case]]
name = "W"
kind = "wind"
  [[case.load]]
  type = "node"
  node = "A1"
  fx = 15.0
  [[case.load]]
  type = "udl"
  on = "line A"
  direction = "x"
  w = 3.0
`

// crossCheckRows returns the rows of the two cross-check tables: without
// axial strain (case, largest difference, at, largest end moment,
// relative, limit, check) and as given (case, largest difference, axial
// strain estimate, difference less estimate, at, limit, check).
func crossCheckRows(t *testing.T, out string) (rigid, given [][]string) {
	t.Helper()
	i := strings.Index(out, "Without axial strain:")
	j := strings.Index(out, "As given:")
	if i < 0 || j < i {
		t.Fatalf("no cross-check tables in:\n%s", out)
	}
	rows := func(s string) [][]string {
		var rs [][]string
		for _, line := range strings.Split(s, "\n") {
			if !strings.HasPrefix(line, "│") {
				continue
			}
			var cells []string
			for _, c := range strings.Split(strings.Trim(line, "│"), "│") {
				cells = append(cells, strings.TrimSpace(c))
			}
			if cells[0] != "case" {
				rs = append(rs, cells)
			}
		}
		return rs
	}
	end := strings.Index(out[j:], "\n\n")
	if end < 0 {
		end = len(out) - j
	}
	return rows(out[i:j]), rows(out[j : j+end])
}

// checkCrossCheck checks that every case agrees in both tables and that,
// without axial strain, the relative difference is at most 1e-6 (the
// limit docs/verification.md states).
func checkCrossCheck(t *testing.T, out string, cases int) {
	t.Helper()
	rigid, given := crossCheckRows(t, out)
	if len(rigid) != cases || len(given) != cases {
		t.Fatalf("%d and %d rows, want %d:\n%s", len(rigid), len(given), cases, out)
	}
	for _, r := range rigid {
		rel, err := strconv.ParseFloat(r[4], 64)
		if err != nil || rel > 1e-6 || r[6] != "agrees" {
			t.Errorf("case %s without axial strain: relative difference %s (%s)", r[0], r[4], r[6])
		}
	}
	for _, r := range given {
		diff, err1 := strconv.ParseFloat(r[3], 64)
		limit, err2 := strconv.ParseFloat(r[5], 64)
		if err1 != nil || err2 != nil || diff > limit || r[6] != "agrees" {
			t.Errorf("case %s as given: %s less the estimate, limit %s (%s)", r[0], r[3], r[5], r[6])
		}
	}
}

func TestRunCrossCheck(t *testing.T) {
	p := filepath.Join(t.TempDir(), "shed.toml")
	if err := os.WriteFile(p, []byte(singleStorey), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, stderr := exec("run", "--cross-check", p)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "With the sway correction for the storey at joints A1, B1, C1.") {
		t.Fatalf("cross-check did not make the sway correction:\n%s", out)
	}
	// Both methods solve the same frame; they differ only by the axial strain
	// moment distribution neglects, which its estimate accounts for.
	checkCrossCheck(t, out, 2)
	t.Run("the README's example", func(t *testing.T) {
		// README, quick start: govern new --bays 7.2,6,7.2 --storeys
		// 4.5,3.6x3 office.toml, then govern run office.toml --cross-check.
		p := filepath.Join(t.TempDir(), "office.toml")
		if code, _, stderr := exec("new", "--bays", "7.2,6,7.2", "--storeys", "4.5,3.6x3", p); code != 0 {
			t.Fatalf("new: exit %d: %s", code, stderr)
		}
		code, out, stderr := exec("run", p, "--cross-check")
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		if !strings.Contains(out, "With a sway correction for each of 4 storeys") {
			t.Fatalf("no sway corrections:\n%s", out)
		}
		checkCrossCheck(t, out, 4)
	})
	t.Run("the demo", func(t *testing.T) {
		code, out, stderr := exec("demo", "--cross-check")
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		if !strings.Contains(out, "With a sway correction for each of 5 storeys") {
			t.Fatalf("no sway corrections:\n%s", out)
		}
		checkCrossCheck(t, out, 4)
	})
	t.Run("a frame where it does not apply is reported", func(t *testing.T) {
		q := filepath.Join(t.TempDir(), "rafter.toml")
		// A canopy strut from the roof down to a new base: inclined.
		src := singleStorey + "[[node]]\nname = \"S\"\nx = 17.0\ny = 0.0\nsupport = \"pinned\"\n" +
			"[[member]]\nstart = \"C1\"\nend = \"S\"\nsection = \"C\"\n"
		if err := os.WriteFile(q, []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
		code, out, stderr := exec("run", "--cross-check", q)
		if code != 0 || !strings.Contains(out, "does not apply to this model: member") || !strings.Contains(out, "is inclined") {
			t.Errorf("exit %d: %s\n%s", code, stderr, out)
		}
	})
	t.Run("not with tables going to standard output", func(t *testing.T) {
		code, _, stderr := exec("run", "--cross-check", "--json", "-", p)
		if code != 2 || !strings.Contains(stderr, "--cross-check prints a table") {
			t.Errorf("exit %d, %q", code, stderr)
		}
	})
}

// TestCrossCheckRefusedInSecondOrder: moment distribution is first-order,
// so --cross-check is refused for a second-order model, with a message.
func TestCrossCheckRefusedInSecondOrder(t *testing.T) {
	code, _, stderr := exec("run", "--cross-check", filepath.Join("..", "..", "testdata", "tables", "sway-storey.toml"))
	if code == 0 || !strings.Contains(stderr, "--cross-check solves each load case by first-order moment distribution") || !strings.Contains(stderr, "second_order = true") {
		t.Errorf("exit %d: %s", code, stderr)
	}
}
