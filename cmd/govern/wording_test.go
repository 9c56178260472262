package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestAllowableIsNotStrength: the combinations of ASCE/SEI 7-16 section 2.4
// (allowable stress design) are called allowable, never strength, in the
// listing of combinations, its CSV, the run's summary, the JSON and the
// report; the strength set's are still strength.
func TestAllowableIsNotStrength(t *testing.T) {
	portal, err := os.ReadFile("../../testdata/portal.toml")
	if err != nil {
		t.Fatal(err)
	}
	base := portal[:bytes.Index(portal, []byte("[[combination]]"))]
	write := func(t *testing.T, set string) string {
		p := filepath.Join(t.TempDir(), "m.toml")
		src := string(base) + "[combinations]\nstandard = \"" + set + "\"\n\n[[combination]]\nname = \"service D+L\"\nfactors = { D = 1.0, L = 1.0 }\nservice = true\n"
		if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	for _, tc := range []struct {
		set, use, other string
		n               int // combinations the set gives for D, L and W
	}{
		{"asce7-16-allowable", "allowable", "strength", 5},
		{"asce7-16-strength", "strength", "allowable", 4},
	} {
		t.Run(tc.set, func(t *testing.T) {
			model := write(t, tc.set)
			dir := t.TempDir()
			csvPath := filepath.Join(dir, "c.csv")
			code, listing, stderr := exec("combos", model)
			if code != 0 {
				t.Fatalf("combos: exit %d: %s", code, stderr)
			}
			if code, _, stderr := exec("combos", "--csv", csvPath, model); code != 0 {
				t.Fatalf("combos --csv: exit %d: %s", code, stderr)
			}
			listCSV, _ := os.ReadFile(csvPath)
			out := filepath.Join(dir, "out")
			code, summary, stderr := exec("run", "--out", out, model)
			if code != 0 {
				t.Fatalf("run: exit %d: %s", code, stderr)
			}
			js, _ := os.ReadFile(filepath.Join(out, jsonName))
			page, _ := os.ReadFile(filepath.Join(out, reportName))
			for _, o := range []struct {
				name string
				text string
				want []string
			}{
				{"listing", listing, []string{"│ " + tc.use + " │", " service │"}},
				{"listing CSV", string(listCSV), []string{"," + tc.use + ","}},
				{"summary", summary, []string{fmt.Sprintf("%d %s, 1 service", tc.n, tc.use), "over the " + map[string]string{"allowable": "allowable stress", "strength": "strength"}[tc.use] + " combinations"}},
				{"JSON", string(js), []string{`"use": "` + tc.use + `"`, `"use": "service"`}},
				{"report", string(page), []string{"<td>" + tc.use + "</td>", fmt.Sprintf("(%d %s, 1 service)", tc.n, tc.use)}},
			} {
				for _, w := range o.want {
					if !strings.Contains(o.text, w) {
						t.Errorf("%s lacks %q", o.name, w)
					}
				}
				if strings.Contains(o.text, tc.other) {
					t.Errorf("%s says %q", o.name, tc.other)
				}
			}
		})
	}
}
