package main

import (
	"os"
	"path/filepath"
	"regexp"
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
	// moment distribution neglects (small for these sections).
	rows := regexp.MustCompile(`(?m)^│\s+(D|W) │\s+(\S+) │.*│\s+(\S+) │\s+(agrees|differs) │$`).FindAllStringSubmatch(out, -1)
	if len(rows) != 2 {
		t.Fatalf("found %d case rows in:\n%s", len(rows), out)
	}
	for _, r := range rows {
		rel, err := strconv.ParseFloat(r[3], 64)
		if err != nil || rel > 1e-3 || r[4] != "agrees" {
			t.Errorf("case %s: relative difference %s (%s)", r[1], r[3], r[4])
		}
	}
	t.Run("multi-storey frames are reported, not cross-checked", func(t *testing.T) {
		code, out, _ := exec("demo", "--cross-check")
		if code != 0 || !strings.Contains(out, "does not apply to this model: 5 beam lines are free to sway") {
			t.Errorf("exit %d:\n%s", code, out)
		}
	})
	t.Run("not with tables going to standard output", func(t *testing.T) {
		code, _, stderr := exec("run", "--cross-check", "--json", "-", p)
		if code != 2 || !strings.Contains(stderr, "--cross-check prints a table") {
			t.Errorf("exit %d, %q", code, stderr)
		}
	})
}
