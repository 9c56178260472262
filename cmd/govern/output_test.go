package main

import (
	"bytes"
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestCSVCellsCannotBeFormulas: the envelopes and the combinations written
// as CSV from the hostile model: names that look like formulas carry the
// apostrophe, quoted as RFC 4180 requires where they hold a comma or a
// double quote; numbers, negative ones too, are written as numbers.
func TestCSVCellsCannotBeFormulas(t *testing.T) {
	dir := t.TempDir()
	envelopes, combinations := filepath.Join(dir, "env.csv"), filepath.Join(dir, "combos.csv")
	if code, _, stderr := exec("run", "--quiet", "--csv", envelopes, hostile); code != 0 {
		t.Fatalf("run: exit %d: %s", code, stderr)
	}
	if code, _, stderr := exec("combos", "--csv", combinations, hostile); code != 0 {
		t.Fatalf("combos: exit %d: %s", code, stderr)
	}
	read := func(path string) ([]byte, [][]string) {
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		return b, rows
	}

	b, rows := read(envelopes)
	if want := `"'=HYPERLINK(""http://x"",""y"")",0,N,`; !bytes.Contains(b, []byte("\n"+want)) {
		t.Errorf("no row begins %s", want)
	}
	members := map[string]bool{}
	for _, r := range rows[1:] {
		if r[0] == "" && r[1] == "" {
			continue // a row of the whole model: the source (sourceRows)
		}
		members[r[0]] = true
		for _, col := range []int{4, 6} { // max_by, min_by
			// Deflections and node displacements are over the service
			// combination.
			service := r[2] == "deflection" || strings.HasPrefix(r[2], "node ")
			if !service && r[col] != "'=cmd|' /C calc'!A0" {
				t.Errorf("combination cell %q", r[col])
			}
			if service && r[col] != "'@service\u0085" {
				t.Errorf("service combination cell %q", r[col])
			}
		}
		for _, col := range []int{1, 3, 5, 10, 11} { // x, max, min, max_loaded, min_loaded
			if _, err := strconv.ParseFloat(r[col], 64); err != nil {
				t.Errorf("column %d holds %q, not a number", col, r[col])
			}
		}
	}
	for _, name := range []string{`'=HYPERLINK("http://x","y")`, "beam \x1b[2J one", "-2", "col\u009bB", "col\u202eC"} {
		if !members[name] {
			t.Errorf("no rows for member %q (members: %v)", name, members)
		}
	}

	_, rows = read(combinations)
	want := [][]string{
		{"combination", "rule", "use", "D\x1b]0;t\x07", "'=L"},
		{"'=cmd|' /C calc'!A0", "model", "strength", "1.2", "1.6"},
		{"'@service\u0085", "model", "service", "1", "1"},
	}
	if strings.Join(flatten(rows), "|") != strings.Join(flatten(want), "|") {
		t.Errorf("combinations CSV\n got %q\nwant %q", rows, want)
	}
}

func flatten(rows [][]string) []string {
	var out []string
	for _, r := range rows {
		out = append(out, strings.Join(r, ","))
	}
	return out
}
