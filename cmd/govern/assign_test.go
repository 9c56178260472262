package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestCheckListsAssignments: govern check lists the [[assign]] tables, in
// file order, and every member given a section by two tables, the later
// one's being the member's.
func TestCheckListsAssignments(t *testing.T) {
	model := `title = "assignments"
[grid]
bays = [6.0, 6.0]
storeys = [4.0, 3.5, 3.5]
column = "C450"
beam = "B"
[[section]]
name = "C450"
E = 30e6
A = 0.2025
I = 3.42e-3
[[section]]
name = "C600"
E = 30e6
A = 0.36
I = 1.08e-2
[[section]]
name = "B"
E = 30e6
A = 0.28
I = 1.14e-2
[[assign]]
on = "all columns"
section = "C450"
[[assign]]
on = "line B & storey 1-2"
section = "C600"
[[assign]]
on = "roof"
release = "both"
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "all beams"
  w = 10
`
	p := filepath.Join(t.TempDir(), "m.toml")
	if err := os.WriteFile(p, []byte(model), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, stderr := exec("check", p)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for _, want := range []string{
		"assignments:    3, applied in file order\n",
		"  line 22     section C450 on \"all columns\": 9 members\n",
		"  line 25     section C600 on \"line B & storey 1-2\": 2 members\n",
		"  line 28     release both on \"roof\": 2 members\n",
		"overlaps:       1 (a later table replaces what an earlier one gave)\n",
		"  line 25: [[assign]] gives section C600 to 2 members given section C450 by the [[assign]] at line 22, which it follows in the file and so replaces: B0-B1, B1-B2\n",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("check does not print %q:\n%s", want, out)
		}
	}
}
