package main

import (
	"bytes"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf8"

	"govern/envelope/report"
)

// frame45 writes the starting model of four bays and five storeys: 25
// columns and 20 beams, 45 members. It returns the model's path.
func frame45(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "frame45.toml")
	var stdout, stderr bytes.Buffer
	if code := govern([]string{"new", "--bays", "6x4", "--storeys", "4,3.5x4", path}, &stdout, &stderr); code != 0 {
		t.Fatalf("govern new: exit %d: %s", code, stderr.String())
	}
	return path
}

// isTableLine reports whether a line of the terminal is part of a table.
func isTableLine(l string) bool {
	return strings.HasPrefix(l, "┌") || strings.HasPrefix(l, "│") || strings.HasPrefix(l, "├") || strings.HasPrefix(l, "└")
}

// TestTablesFitTheTerminal: every table of the demo and of the 45-member
// frame fits report.TextWidth characters, and --wide prints them whole,
// wider, as one table each.
func TestTablesFitTheTerminal(t *testing.T) {
	for _, c := range []struct {
		name string
		args []string
	}{{"demo", []string{"demo"}}, {"45 members", []string{"run", frame45(t)}}} {
		t.Run(c.name, func(t *testing.T) {
			var out, wide, stderr bytes.Buffer
			if code := govern(c.args, &out, &stderr); code != 0 {
				t.Fatalf("exit %d: %s", code, stderr.String())
			}
			if code := govern(append(c.args, "--wide"), &wide, &stderr); code != 0 {
				t.Fatalf("--wide: exit %d: %s", code, stderr.String())
			}
			widest := func(s string) int {
				n := 0
				for _, l := range strings.Split(s, "\n") {
					if isTableLine(l) {
						n = max(n, utf8.RuneCountInString(l))
					}
				}
				return n
			}
			if n := widest(out.String()); n > report.TextWidth {
				t.Errorf("a table is %d characters wide, more than %d", n, report.TextWidth)
			}
			if !strings.Contains(out.String(), "(continued)") {
				t.Error("no table was split: the test no longer tests splitting")
			}
			if n := widest(wide.String()); n <= report.TextWidth {
				t.Errorf("--wide: the widest table is %d characters, not wider than %d", n, report.TextWidth)
			}
			if strings.Contains(wide.String(), "(continued)") {
				t.Error("--wide split a table")
			}
			// The split tables read back into the wide ones, cell for cell.
			split, whole := renderedTextTables(t, out.String()), renderedTextTables(t, wide.String())
			if len(split) != len(whole) {
				t.Fatalf("%d tables split, %d whole", len(split), len(whole))
			}
			for i := range whole {
				if strings.Join(split[i].header, "|") != strings.Join(whole[i].header, "|") {
					t.Errorf("table %q: header %q read back from its parts, %q whole", whole[i].title, split[i].header, whole[i].header)
					continue
				}
				for r := range whole[i].rows {
					if a, b := renderedTexts(split[i].rows[r].cells), renderedTexts(whole[i].rows[r].cells); strings.Join(a, "|") != strings.Join(b, "|") {
						t.Errorf("table %q row %d: %q from its parts, %q whole", whole[i].title, r, a, b)
					}
				}
			}
		})
	}
}
