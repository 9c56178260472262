package main

import (
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"
	"testing"
)

// twoBeamsModel is two simply supported beams, not joined: A-B of 6 m and
// C-D of 8 m, with dead load on each (DCD on C-D) and live load 5 kN/m on
// both, under 1.4D and 1.2D+1.6L.
const twoBeamsModel = `title = "Two beams"
[[section]]
name = "B"
E = 30.0e6
A = 0.24
I = 7.2e-3
[[node]]
name = "A"
x = 0.0
y = 0.0
support = "pinned"
[[node]]
name = "B"
x = 6.0
y = 0.0
support = "roller"
[[node]]
name = "C"
x = 10.0
y = 0.0
support = "pinned"
[[node]]
name = "D"
x = 18.0
y = 0.0
support = "roller"
[[member]]
start = "A"
end = "B"
section = "B"
[[member]]
start = "C"
end = "D"
section = "B"
[[case]]
name = "D"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "A-B"
  w = 10.0
  [[case.load]]
  type = "udl"
  on = "C-D"
  w = DCD
[[case]]
name = "L"
kind = "live"
  [[case.load]]
  type = "udl"
  on = ["A-B", "C-D"]
  w = 5.0
[[combination]]
name = "1.4D"
factors = { D = 1.4 }
[[combination]]
name = "1.2D+1.6L"
factors = { D = 1.2, L = 1.6 }
`

// resultsOf writes the two-beam model with dead load w on C-D, runs it and
// returns the path of its JSON.
func resultsOf(t *testing.T, dir, name, w string) string {
	t.Helper()
	model := filepath.Join(dir, name+".toml")
	if err := os.WriteFile(model, []byte(strings.Replace(twoBeamsModel, "DCD", w, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, name+".json")
	if code, _, stderr := exec("run", "--quiet", "--json", out, model); code != 0 {
		t.Fatalf("run: exit %d: %s", code, stderr)
	}
	return out
}

func TestDiff(t *testing.T) {
	dir := t.TempDir()
	old, same, changed, slight := resultsOf(t, dir, "old", "10.0"), resultsOf(t, dir, "same", "10.0"), resultsOf(t, dir, "new", "12.0"), resultsOf(t, dir, "slight", "10.1")
	t.Run("identical files: exit 0, nothing listed", func(t *testing.T) {
		code, out, stderr := exec("diff", old, same)
		if code != 0 || stderr != "" || !strings.Contains(out, "0 listed") || strings.Contains(out, "Members") {
			t.Errorf("exit %d\n%s\n%s", code, out, stderr)
		}
	})
	t.Run("one load changed: only its member and supports, exit 1", func(t *testing.T) {
		// By statics (simple beam, L = 8 m, common practice): under
		// 1.2D+1.6L the load on C-D goes from 1.2 × 10 + 8 = 20 to 22.4
		// kN/m, so M max = wL²/8 goes from 160 to 179.2 kN·m at x = 4, V
		// from ±80 to ±89.6 kN and the reactions likewise; the smallest
		// reactions (1.2D alone, live load acting only where adverse) from
		// 48 to 57.6 kN.
		code, out, stderr := exec("diff", old, changed)
		if code != 1 || !strings.Contains(stderr, "govern diff: 7 design values changed") {
			t.Fatalf("exit %d\n%s\n%s", code, out, stderr)
		}
		var names []string
		for _, m := range regexp.MustCompile(`(?m)^│\s+(\S+) │`).FindAllStringSubmatch(out, -1) {
			if m[1] != "member" && m[1] != "node" {
				names = append(names, m[1])
			}
		}
		sort.Strings(names)
		if got := strings.Join(names, " "); got != "C C-D D" {
			t.Errorf("listed %q:\n%s", got, out)
		}
		for _, row := range []string{
			`│ M max │  old │       160.00 │ 4.00 │ 1.2D+1.6L │        │`,
			`│       │  new │       179.20 │ 4.00 │ 1.2D+1.6L │  19.20 │`,
			`│ V max │  old │        80.00 │ 0.00 │ 1.2D+1.6L │        │`,
			`│       │  new │        89.60 │ 0.00 │ 1.2D+1.6L │   9.60 │`,
			`│ Fy min │  old │        48.00 │ 1.2D+1.6L │        │`,
			`│        │  new │        57.60 │ 1.2D+1.6L │   9.60 │`,
		} {
			if !strings.Contains(out, row) {
				t.Errorf("no row %q in:\n%s", row, out)
			}
		}
	})
	t.Run("the tolerance", func(t *testing.T) {
		// 0.1 kN/m more: 0.12 on 20 kN/m, 0.6 %; 1 % of 48 on the smallest
		// reactions. Not listed at 1 %, listed at 0.5 %.
		if code, out, _ := exec("diff", old, slight); code != 0 {
			t.Errorf("default: exit %d\n%s", code, out)
		}
		code, out, _ := exec("diff", "--tolerance", "0.5", old, slight)
		if code != 1 || !strings.Contains(out, "changed by more than 0.5 %") || !strings.Contains(out, "C-D") {
			t.Errorf("--tolerance 0.5: exit %d\n%s", code, out)
		}
		if code, out, _ := exec("diff", "--tolerance", "0.5", "--floor", "50", old, slight); code != 0 {
			t.Errorf("--floor 50: exit %d\n%s", code, out)
		}
	})
	t.Run("bad files: exit 1 with the reason", func(t *testing.T) {
		src, err := os.ReadFile(old)
		if err != nil {
			t.Fatal(err)
		}
		other := filepath.Join(dir, "other.json")
		os.WriteFile(other, []byte(strings.Replace(string(src), `"govern.envelopes/`, `"govern.envelopes/9`, 1)), 0o644)
		broken := filepath.Join(dir, "broken.json")
		os.WriteFile(broken, src[:len(src)/2], 0o644)
		model := filepath.Join(dir, "old.toml")
		for _, tc := range []struct {
			file, want string
		}{
			{other, `other.json: not a result file this version of govern reads: its format is "govern.envelopes/9`},
			{broken, `broken.json:`},
			{model, `old.toml:1: not a result file this version of govern reads: not valid JSON`},
			{filepath.Join(dir, "missing.json"), `cannot read results: open`},
			{dir, `is a directory`},
		} {
			code, out, stderr := exec("diff", old, tc.file)
			if code != 1 || out != "" || !strings.Contains(stderr, tc.want) {
				t.Errorf("%s: exit %d, stdout %q, stderr %q; want %q", tc.file, code, out, stderr, tc.want)
			}
		}
	})
	t.Run("usage errors: exit 2", func(t *testing.T) {
		for _, args := range [][]string{
			{"diff"},
			{"diff", old},
			{"diff", old, same, changed},
			{"diff", "--tolerance", "-1", old, same},
			{"diff", "--tolerance", "abc", old, same},
			{"diff", "--floor", "101", old, same},
			{"diff", "--wide", old, same},
		} {
			code, _, stderr := exec(args...)
			if code != 2 || !strings.Contains(stderr, "usage: govern diff") {
				t.Errorf("%q: exit %d, %q", args, code, stderr)
			}
		}
	})
}
