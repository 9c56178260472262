package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/envelope/report"
)

func TestCombosTable(t *testing.T) {
	code, out, stderr := exec("combos", writeDemo(t))
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	// The demo has D, L, Lr and a reversible W under ASCE/SEI 7-16 section
	// 2.3.1: 1.4D; 1.2D+1.6L+0.5Lr; 1.2D+1.6Lr+(1.0L or ±0.5W);
	// 1.2D±1.0W+1.0L+0.5Lr; 0.9D±1.0W: nine combinations.
	for _, want := range []string{
		"9 load combinations: 9 from asce7-16-strength, 0 from the model.",
		"asce7-16-strength: ASCE/SEI 7-16 strength design",
		"2.3.1-3 1.2D+1.6Lr+0.5W", "2.3.1-3 1.2D+1.6Lr-0.5W", "2.3.1-4 1.2D-1.0W+1.0L+0.5Lr",
		"asce7-16-strength 2.3.1-5",
		report.Caution,
	} {
		// Prose is wrapped to the terminal's width.
		if !strings.Contains(strings.Join(strings.Fields(out), " "), want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestCombosCSV(t *testing.T) {
	model := writeDemo(t)
	p := filepath.Join(filepath.Dir(model), "combos.csv")
	if code, _, stderr := exec("combos", model, "--csv", p); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	f, err := os.Open(p)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 10 || strings.Join(rows[0], ",") != "combination,rule,D,L,Lr,W" {
		t.Fatalf("%d rows, header %v", len(rows), rows[0])
	}
	// ASCE/SEI 7-16 section 2.3.1 combination 5 with wind from the other side.
	if got := strings.Join(rows[9], ","); got != "2.3.1-5 0.9D-1.0W,asce7-16-strength 2.3.1-5,0.9,,,-1" {
		t.Errorf("last row %s", got)
	}
	t.Run("to standard output alone", func(t *testing.T) {
		_, out, _ := exec("combos", "--csv", "-", model)
		if !strings.HasPrefix(out, "combination,rule,D,L,Lr,W\n") || strings.Contains(out, report.Caution) {
			t.Errorf("output:\n%s", out)
		}
	})
}

func TestCombosRuleFileBesideTheModel(t *testing.T) {
	dir := t.TempDir()
	rules := "[[rule]]\nid = \"K1\"\nterms = [{ kind = \"dead\", factor = 1.25 }, { kind = \"live\", factor = 1.5, lead = true }]\n"
	os.WriteFile(filepath.Join(dir, "office-code.toml"), []byte(rules), 0o644)
	src := strings.Replace(string(demoModel), `standard = "asce7-16-strength"`, `file = "office-code.toml"`, 1)
	model := filepath.Join(dir, "m.toml")
	os.WriteFile(model, []byte(src), 0o644)
	// Run from elsewhere: the rule file is found beside the model.
	code, out, stderr := exec("combos", model)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "1 load combinations: 1 from office-code, 0 from the model.") || !strings.Contains(out, "K1 1.25D+1.5L") {
		t.Errorf("output:\n%s", out)
	}
	if !strings.Contains(out, "Not in any combination: Lr (roof-live), W (wind); govern run refuses the model") {
		t.Errorf("unused cases not named:\n%s", out)
	}
	// Run refuses the cases no combination uses, each
	// named at its line, and writes nothing; check still lists them.
	code, out, stderr = exec("run", model)
	lr, w := sourceLine(t, src, "name = \"Lr\"")-1, sourceLine(t, src, "name = \"W\"")-1
	for _, want := range []string{
		fmt.Sprintf("govern run: m.toml:%d: case \"Lr\": no load combination uses this case, so it would be left out of every envelope; put it in a combination, or write unused = \"allow\" in [combinations] to analyse the model without it\n", lr),
		fmt.Sprintf("govern run: m.toml:%d: case \"W\": no load combination uses this case", w),
	} {
		if code != 1 || out != "" || !strings.Contains(stderr, want) {
			t.Errorf("run: exit %d, %d bytes out, stderr\n%s\nwant\n%s", code, len(out), stderr, want)
		}
	}
	code, out, _ = exec("check", model)
	if code != 0 || !strings.Contains(out, "unused cases:   Not in any combination: Lr (roof-live), W (wind)") {
		t.Errorf("check: exit %d\n%s", code, out)
	}
	allow := strings.Replace(src, `file = "office-code.toml"`, "file = \"office-code.toml\"\nunused = \"allow\"", 1)
	os.WriteFile(model, []byte(allow), 0o644)
	code, out, stderr = exec("run", model)
	if code != 0 || !strings.Contains(out, "K1 1.25D+1.5L") {
		t.Errorf("run with unused = \"allow\": exit %d, %s", code, stderr)
	}
	code, out, _ = exec("combos", model)
	if code != 0 || !strings.Contains(out, "Not in any combination: Lr (roof-live), W (wind); left out of every envelope ([combinations] unused = \"allow\").") {
		t.Errorf("combos with unused = \"allow\": exit %d\n%s", code, out)
	}
}

func TestCombosErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.toml")
	os.WriteFile(bad, []byte(strings.Replace(string(demoModel), `"asce7-16-strength"`, `"asce7-16"`, 1)), 0o644)
	code, _, stderr := exec("combos", bad)
	if code != 1 || !strings.Contains(stderr, `govern combos: bad.toml:`) || !strings.Contains(stderr, `standard = "asce7-16" is not a built-in set`) {
		t.Errorf("exit %d, stderr %q", code, stderr)
	}
	if code, _, stderr := exec("combos"); code != 2 || !strings.Contains(stderr, "need one model file") {
		t.Errorf("no model: exit %d, stderr %q", code, stderr)
	}
}

func TestRunNamesGeneratedCombinations(t *testing.T) {
	_, out, stderr := exec("run", writeDemo(t), "--json", "-")
	var doc struct {
		Combinations []struct{ Name string } `json:"combinations"`
		Members      []struct {
			Stations []struct {
				M struct {
					MaxBy string `json:"max_by"`
					MinBy string `json:"min_by"`
				} `json:"M"`
			} `json:"stations"`
		} `json:"members"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("%v: %s", err, stderr)
	}
	names := map[string]bool{}
	for _, c := range doc.Combinations {
		if !strings.HasPrefix(c.Name, "2.3.1-") {
			t.Errorf("combination %q does not name its ASCE/SEI 7-16 rule", c.Name)
		}
		names[c.Name] = true
	}
	for _, m := range doc.Members {
		for _, s := range m.Stations {
			if !names[s.M.MaxBy] || !names[s.M.MinBy] {
				t.Fatalf("governing %q / %q is not a generated combination", s.M.MaxBy, s.M.MinBy)
			}
		}
	}
}

func TestCombosMarksServiceCombinations(t *testing.T) {
	code, out, stderr := exec("combos", "--csv", "-", smallModel)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if lines[0] != "combination,rule,use,D,L,W" || lines[5] != "D+L,model,service,1,1," || lines[1] != "1.4D,model,strength,1.4,," {
		t.Errorf("CSV:\n%s", out)
	}
	code, out, _ = exec("combos", "--csv", "-", writeDemo(t))
	if code != 0 || strings.Contains(out, ",use,") {
		t.Errorf("a model without service combinations has a use column:\n%s", out)
	}
}
