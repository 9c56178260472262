package modelfile

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/combos"
)

// portal is a beam with dead, live, roof live, snow and wind cases whose
// combinations come from a standard, plus one of the model's own.
const portal = beamAB + `[[case]]
name = "D"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "a-b"
  w = 2
[[case]]
name = "L"
kind = "live"
category = "B"
  [[case.load]]
  type = "udl"
  on = "a-b"
  w = 3
[[case]]
name = "Lr"
kind = "roof-live"
  [[case.load]]
  type = "udl"
  on = "a-b"
  w = 1
[[case]]
name = "S"
kind = "snow"
category = "snow-up-to-1000m"
  [[case.load]]
  type = "udl"
  on = "a-b"
  w = 1.5
[[case]]
name = "W"
kind = "wind"
reversible = true
  [[case.load]]
  type = "udl"
  on = "a-b"
  direction = "x"
  w = 1
[[combination]]
name = "service"
factors = { D = 1.0, L = 1.0 }
[combinations]
standard = "asce7-16-strength"
`

// lineOf returns the line of the first occurrence of s in src.
func lineOf(t *testing.T, src, s string) int {
	t.Helper()
	i := strings.Index(src, s)
	if i < 0 {
		t.Fatalf("%q not in the model", s)
	}
	return strings.Count(src[:i], "\n") + 1
}

func TestReadStandard(t *testing.T) {
	job, err := Read("p.toml", []byte(portal))
	if err != nil {
		t.Fatal(err)
	}
	if job.Set == nil || job.Set.Name != "asce7-16-strength" || len(job.CaseInfo) != 5 || !job.CaseInfo[4].Reversible {
		t.Fatalf("set %v, case info %+v", job.Set, job.CaseInfo)
	}
	// ASCE/SEI 7-16 section 2.3.1 with D, L, Lr, S and a reversible W
	// gives 15 combinations (see combos/standards_test.go); the model's
	// own follows them.
	cs := job.Combinations
	if len(cs) != 16 {
		t.Fatalf("%d combinations, want 15 generated and 1 of the model", len(cs))
	}
	if cs[0].Name != "2.3.1-1 1.4D" || cs[0].Rule != "asce7-16-strength 2.3.1-1" {
		t.Errorf("first = %+v", cs[0])
	}
	if cs[7].Name != "2.3.1-3 1.2D+1.6S+0.5W" || cs[8].Name != "2.3.1-3 1.2D+1.6S-0.5W" || cs[8].Factor(4) != -0.5 {
		t.Errorf("2.3.1-3 with snow and wind: %+v, %+v", cs[7], cs[8])
	}
	if cs[15].Name != "service" || cs[15].Rule != "model" {
		t.Errorf("last = %+v", cs[15])
	}
}

func TestReadEN1990(t *testing.T) {
	src := strings.Replace(portal, `standard = "asce7-16-strength"`, `standard = "en1990-6.10"`, 1)
	src = strings.Replace(src, "name = \"Lr\"\nkind = \"roof-live\"\n", "name = \"Lr\"\nkind = \"roof-live\"\ncategory = \"H\"\n", 1)
	job, err := Read("p.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	// EN 1990 Table A1.2(B) with Table A1.1 ψ0: office 0.7, snow below
	// 1000 m 0.5, wind 0.6: 1.35G + 1.5Q + 0.75S + 0.9W.
	found := false
	for _, cb := range job.Combinations {
		found = found || cb.Name == "6.10 1.35D+1.5L+0.75S+0.9W"
	}
	if !found {
		t.Errorf("no 6.10 1.35D+1.5L+0.75S+0.9W among %d combinations", len(job.Combinations))
	}
	t.Run("psi given in the case beats its category", func(t *testing.T) {
		src := strings.Replace(src, `category = "B"`, "category = \"B\"\npsi0 = 0.6", 1)
		job, err := Read("p.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		// ψ0 = 0.6 for L: 1.5 × 0.6 = 0.9 with snow leading.
		found := false
		for _, cb := range job.Combinations {
			found = found || cb.Name == "6.10 1.35D+1.5S+0.9L+0.9W"
		}
		if !found {
			t.Error("no 6.10 1.35D+1.5S+0.9L+0.9W")
		}
	})
}

func TestReadRuleFile(t *testing.T) {
	dir := t.TempDir()
	os.Mkdir(filepath.Join(dir, "codes"), 0o755)
	rules := "name = \"office\"\n[[rule]]\nid = \"X1\"\nterms = [\n  { kind = \"dead\", factor = 1.25 },\n  { kind = \"live\", factor = 1.5, lead = true },\n]\n"
	os.WriteFile(filepath.Join(dir, "codes", "office.toml"), []byte(rules), 0o644)
	src := strings.Replace(portal, `standard = "asce7-16-strength"`, `file = "codes/office.toml"`, 1)
	job, err := ReadAt(dir, "p.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if len(job.Combinations) != 2 || job.Combinations[0].Name != "X1 1.25D+1.5L" || job.Combinations[0].Rule != "office X1" {
		t.Errorf("combinations %+v", job.Combinations)
	}
	t.Run("a problem in the rule file names that file and line", func(t *testing.T) {
		os.WriteFile(filepath.Join(dir, "codes", "office.toml"), []byte(strings.Replace(rules, `"live"`, `"lve"`, 1)), 0o644)
		_, err := ReadAt(dir, "p.toml", []byte(src))
		want := `codes/office.toml:6: rule "X1", term 2: kind = "lve": must be one of "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature" (did you mean "live"?)`
		if err == nil || !strings.Contains(err.Error(), want) || !errors.Is(err, ErrValue) {
			t.Errorf("error %v\nwant %s", err, want)
		}
	})
	t.Run("a syntax error in the rule file, with its column", func(t *testing.T) {
		os.WriteFile(filepath.Join(dir, "codes", "office.toml"), []byte(strings.Replace(rules, "factor = 1.25", "factor = ", 1)), 0o644)
		_, err := ReadAt(dir, "p.toml", []byte(src))
		want := "codes/office.toml:5:30: expected value but found '}' instead\n      { kind = \"dead\", factor =  },\n                                 ^"
		if err == nil || err.Error() != want || !errors.Is(err, ErrSyntax) {
			t.Errorf("error %v\nwant %s", err, want)
		}
	})
	t.Run("problems in the model and in its rule file, each file in line order", func(t *testing.T) {
		os.WriteFile(filepath.Join(dir, "codes", "office.toml"), []byte(strings.Replace(strings.Replace(rules, `"live"`, `"lve"`, 1), "id = ", "idd = ", 1)), 0o644)
		_, err := ReadAt(dir, "p.toml", []byte(strings.Replace(src, "[combinations]", "[combinations]\nsds = -1", 1)))
		var l ErrorList
		if !errors.As(err, &l) || len(l) != 4 {
			t.Fatalf("error %v, want four problems", err)
		}
		// The rule without its id (line 2, its header), the misspelt id
		// (line 3), the misspelt kind (line 6); then the model's sds.
		want := []string{"codes/office.toml:2", "codes/office.toml:3", "codes/office.toml:6", fmt.Sprintf("p.toml:%d", lineOf(t, src, "[combinations]")+1)}
		for i, e := range l {
			if e.Pos.String() != want[i] {
				t.Errorf("problem %d at %s, want %s: %v", i+1, e.Pos, want[i], e)
			}
		}
	})
	t.Run("a missing rule file", func(t *testing.T) {
		_, err := ReadAt(dir, "p.toml", []byte(strings.Replace(src, "codes/office.toml", "codes/none.toml", 1)))
		want := fmt.Sprintf(`p.toml:%d: [combinations]: file = "codes/none.toml": cannot read it: no such file or directory`, lineOf(t, src, "file = "))
		if err == nil || err.Error() != want || !errors.Is(err, ErrReference) {
			t.Errorf("error %v\nwant %s", err, want)
		}
	})
}

func TestReadCombinationErrors(t *testing.T) {
	at := func(s string) int { return lineOf(t, portal, s) }
	known := `"asce7-16-allowable", "asce7-16-strength", "en1990-6.10", "en1990-6.10ab", "en1990-characteristic", "en1990-frequent", "en1990-quasi-permanent"`
	if got := quoteList(combos.Standards()); got != known {
		t.Fatalf("standards %s", got)
	}
	std := at("standard = ")
	for _, tc := range []struct {
		name, old, new string
		want           string
		sentinel       error
	}{
		{"unknown standard lists the known ones", `"asce7-16-strength"`, `"asce7-16-strenght"`,
			fmt.Sprintf(`p.toml:%d: [combinations]: standard = "asce7-16-strenght" is not a built-in set (did you mean "asce7-16-strength"?); the known ones are %s`, std, known), ErrValue},
		{"standard and file", `standard = "asce7-16-strength"`, "standard = \"asce7-16-strength\"\nfile = \"x.toml\"",
			fmt.Sprintf(`p.toml:%d: [combinations]: give standard or file, not both`, std+1), ErrValue},
		{"neither standard nor file", `standard = "asce7-16-strength"`, `sds = 0.5`,
			fmt.Sprintf(`p.toml:%d: [combinations]: [combinations] needs standard (one of %s) or file (a rule file of your own)`, std-1, known), ErrMissing},
		{"unknown key in [combinations]", `standard = "asce7-16-strength"`, "standard = \"asce7-16-strength\"\nreduce_live_factor = true",
			fmt.Sprintf(`p.toml:%d: [combinations]: unknown key "reduce_live_factor" (did you mean "reduced_live_factor"?)`, std+1), ErrUnknownKey},
		{"negative sds", `standard = "asce7-16-strength"`, "standard = \"asce7-16-strength\"\nsds = -0.2",
			fmt.Sprintf(`p.toml:%d: [combinations]: sds = -0.2: S_DS, in g, must not be negative`, std+1), ErrValue},
		{"sds for a set without it", `standard = "asce7-16-strength"`, "standard = \"en1990-6.10\"\nsds = 1.0",
			fmt.Sprintf(`p.toml:%d: [combinations]: sds: en1990-6.10 takes no S_DS into its factors`, std+1), ErrValue},
		{"reduced live factor for a set without it", `standard = "asce7-16-strength"`, "standard = \"asce7-16-allowable\"\nreduced_live_factor = true",
			fmt.Sprintf(`p.toml:%d: [combinations]: reduced_live_factor: asce7-16-allowable has no reduced live load factor`, std+1), ErrValue},
		{"unknown category", `category = "B"`, `category = "b"`,
			fmt.Sprintf(`p.toml:%d: case "L": category = "b" is not a row of EN 1990 Table A1.1 (did you mean "B"?); for live load it is one of "A", "B", "C", "D", "E", "F", "G", "H"`, at(`category = "B"`)), ErrValue},
		{"category of another kind", `category = "B"`, `category = "wind"`,
			fmt.Sprintf(`p.toml:%d: case "L": category = "wind" (Wind loads on buildings) does not apply to live load`, at(`category = "B"`)), ErrValue},
		{"psi above 1", `category = "B"`, "psi2 = 1.3",
			fmt.Sprintf(`p.toml:%d: case "L": psi2 = 1.3: must be from 0 to 1`, at(`category = "B"`)), ErrValue},
		{"psi on dead load", "kind = \"dead\"\n", "kind = \"dead\"\npsi0 = 0.5\n",
			fmt.Sprintf(`p.toml:%d: case "D": psi0: dead load is permanent and has no ψ factors`, at(`kind = "dead"`)+1), ErrValue},
		{"reversible dead load", "kind = \"dead\"\n", "kind = \"dead\"\nreversible = true\n",
			fmt.Sprintf(`p.toml:%d: case "D": reversible = true: dead load acts one way only; only variable cases (wind, seismic, …) reverse`, at(`kind = "dead"`)+1), ErrValue},
		{"EN 1990 case without psi", `standard = "asce7-16-strength"`, `standard = "en1990-6.10"`,
			fmt.Sprintf(`p.toml:%d: case "Lr": en1990-6.10 rule 6.10 needs psi0 of this roof-live case: give category ("A", "B", "C", "D", "E", "F", "G", "H", EN 1990 Table A1.1) or psi0, psi1 and psi2`, at(`kind = "roof-live"`)), ErrMissing},
		{"model combination named like a generated one", `name = "service"`, `name = "2.3.1-1 1.4D"`,
			fmt.Sprintf(`p.toml:%d: combination "2.3.1-1 1.4D": asce7-16-strength also gives a combination named "2.3.1-1 1.4D"; rename this one`, at(`name = "service"`)), ErrDuplicate},
		{"combination factor naming a case the model lacks", `factors = { D = 1.0, L = 1.0 }`, `factors = { D = 1.0, Q = 1.0 }`,
			fmt.Sprintf(`p.toml:%d: combination "service": factors: no case named "Q"`, at(`factors = `)), ErrReference},
		{"combination factor that is not a number", `factors = { D = 1.0, L = 1.0 }`, `factors = { D = 1.0, L = "1.0" }`,
			fmt.Sprintf(`p.toml:%d: combination "service": L must be a number, not a string`, at(`factors = `)), ErrType}, // the line of the factor, not of the table

		// Actions and alternatives: each key at its line.
		{"action that is not a string", "name = \"W\"\n", "name = \"W\"\naction = 5\n",
			fmt.Sprintf(`p.toml:%d: case "W": action must be a string, not an integer`, at(`name = "W"`)+1), ErrType},
		{"empty alternative", "name = \"W\"\n", "name = \"W\"\nalternative = \" \"\n",
			fmt.Sprintf(`p.toml:%d: case "W": alternative is empty: give a name`, at(`name = "W"`)+1), ErrValue},
		{"alternative of dead load", "kind = \"dead\"\n", "kind = \"dead\"\nalternative = \"a\"\n",
			fmt.Sprintf(`p.toml:%d: case "D": alternative: dead load is permanent and always acts in full, as one action with every dead case; only variable cases are grouped into actions and alternatives`, at(`kind = "dead"`)+1), ErrValue},
		{"with beside alternative", "name = \"W\"\n", "name = \"W\"\nalternative = \"left\"\nwith = \"S\"\n",
			fmt.Sprintf(`p.toml:%d: case "W": with = "S": give with, or action and alternative, not both (with takes the action and alternative of case "S")`, at(`name = "W"`)+2), ErrValue},
		{"with naming the case itself", "name = \"W\"\n", "name = \"W\"\nwith = \"W\"\n",
			fmt.Sprintf(`p.toml:%d: case "W": with = "W" names the case itself; name the case whose action and alternative this one shares`, at(`name = "W"`)+1), ErrValue},
		{"with naming no case", "name = \"L\"\n", "name = \"L\"\nwith = \"Lx\"\n",
			fmt.Sprintf(`p.toml:%d: case "L": with = "Lx": no such case (did you mean "L"?)`, at(`name = "L"`)+1), ErrReference},
		{"with naming a case of another kind", "kind = \"snow\"\n", "kind = \"snow\"\nwith = \"W\"\n",
			fmt.Sprintf(`p.toml:%d: case "S": with = "W": case "W" is wind load and case "S" is snow load; with joins cases of one kind`, at(`kind = "snow"`)+1), ErrValue},
		{"unused neither error nor allow", `standard = "asce7-16-strength"`, "standard = \"asce7-16-strength\"\nunused = \"ignore\"",
			fmt.Sprintf(`p.toml:%d: [combinations]: unused = "ignore": must be one of "error", "allow"`, std+1), ErrValue},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := strings.Replace(portal, tc.old, tc.new, 1)
			if src == portal {
				t.Fatalf("edit %q not applied", tc.old)
			}
			_, err := Read("p.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got := err.Error(); got != tc.want {
				t.Errorf("error\n got: %s\nwant: %s", got, tc.want)
			}
			if !errors.Is(err, tc.sentinel) {
				t.Errorf("error does not wrap %v", tc.sentinel)
			}
		})
	}
}

func TestReadSetGivingNothing(t *testing.T) {
	// EN 1990 expression 6.16b with wind alone: ψ2 = 0 for wind (Table
	// A1.1), so nothing is left to combine; that is an error, not an
	// analysis of each case alone.
	src := portal[:strings.Index(portal, "[[case]]")] + "[[case]]\nname = \"W\"\nkind = \"wind\"\n  [[case.load]]\n  type = \"node\"\n  node = \"b\"\n  fx = 1\n[combinations]\nstandard = \"en1990-quasi-permanent\"\n"
	_, err := Read("p.toml", []byte(src))
	want := fmt.Sprintf("p.toml:%d: [combinations]: en1990-quasi-permanent gives no combinations for load cases of kinds wind", lineOf(t, src, "[combinations]"))
	if err == nil || err.Error() != want {
		t.Errorf("error %v\nwant %s", err, want)
	}
}

func TestReadActionOfTwoKinds(t *testing.T) {
	src := strings.Replace(portal, "name = \"L\"\n", "name = \"L\"\naction = \"Q\"\n", 1)
	src = strings.Replace(src, "kind = \"snow\"\n", "kind = \"snow\"\naction = \"Q\"\n", 1)
	want := fmt.Sprintf(`p.toml:%d: case "S": action = "Q": case "L" is in this action too and is live load, case "S" is snow load; the cases of one action are of one kind`, lineOf(t, src, "kind = \"snow\"")+1)
	_, err := Read("p.toml", []byte(src))
	if err == nil || err.Error() != want || !errors.Is(err, ErrValue) {
		t.Errorf("error %v\nwant %s", err, want)
	}
}

func TestReadActions(t *testing.T) {
	// The action keys reach the case information and the grouping: a
	// windward wall and a roof suction case of one direction joined with
	// with, and a second direction.
	src := strings.Replace(portal, "[[combination]]", `[[case]]
name = "Wr"
kind = "wind"
with = "W"
  [[case.load]]
  type = "udl"
  on = "a-b"
  w = -1
[[case]]
name = "W2"
kind = "wind"
alternative = "right"
  [[case.load]]
  type = "udl"
  on = "a-b"
  direction = "x"
  w = -1
[[combination]]`, 1)
	job, err := Read("p.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if job.CaseInfo[5].With != "W" || job.CaseInfo[6].Alternative != "right" || job.Actions == nil {
		t.Fatalf("case info %+v, actions %v", job.CaseInfo[5:], job.Actions)
	}
	wind := job.Actions.List[job.Actions.Of[4].Action]
	if len(wind.Alternatives) != 2 || len(wind.Alternatives[0].Cases) != 2 || !wind.Alternatives[0].Reversible || wind.Default {
		t.Errorf("wind action %+v", wind)
	}
	// ASCE/SEI 7-16 2.3.1 (5) 0.9D + 1.0W: W with Wr, both signs together,
	// and W2 alone.
	var names []string
	for _, cb := range job.Combinations {
		if strings.HasPrefix(cb.Name, "2.3.1-5 ") {
			names = append(names, cb.Name)
		}
	}
	if got := strings.Join(names, ", "); got != "2.3.1-5 0.9D+1.0W+1.0Wr, 2.3.1-5 0.9D-1.0W-1.0Wr, 2.3.1-5 0.9D+1.0W2" {
		t.Errorf("2.3.1-5: %s", got)
	}
}

func TestReadUnused(t *testing.T) {
	// A case no combination uses reads (check and
	// combos list it), and CheckUnused, which run calls, names it at its
	// line unless [combinations] unused = "allow".
	src := strings.Replace(portal, "[[combination]]", "[[case]]\nname = \"T\"\nkind = \"other\"\n  [[case.load]]\n  type = \"node\"\n  node = \"b\"\n  fx = 1\n[[combination]]", 1)
	job, err := Read("p.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if u := job.Unused(); len(u) != 1 || u[0] != 5 {
		t.Fatalf("unused %v", u)
	}
	want := fmt.Sprintf(`p.toml:%d: case "T": no load combination uses this case, so it would be left out of every envelope; put it in a combination, or write unused = "allow" in [combinations] to analyse the model without it`, lineOf(t, src, "name = \"T\"")-1)
	if err := job.CheckUnused(); err == nil || err.Error() != want || !errors.Is(err, ErrUnused) {
		t.Errorf("error %v\nwant %s", err, want)
	}
	t.Run("a zero factor does not use a case", func(t *testing.T) {
		src := strings.Replace(src, "factors = { D = 1.0, L = 1.0 }", "factors = { D = 1.0, L = 1.0, T = 0 }", 1)
		job, err := Read("p.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		if job.CheckUnused() == nil {
			t.Error("no error")
		}
	})
	t.Run("allowed", func(t *testing.T) {
		src := strings.Replace(src, `standard = "asce7-16-strength"`, "standard = \"asce7-16-strength\"\nunused = \"allow\"", 1)
		job, err := Read("p.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		if err := job.CheckUnused(); err != nil || !job.AllowUnused || len(job.Unused()) != 1 {
			t.Errorf("error %v, allow %v, unused %v", err, job.AllowUnused, job.Unused())
		}
	})
	t.Run("allowed without a standard", func(t *testing.T) {
		// [combinations] may hold unused alone, for a model that writes
		// its combinations itself.
		src := strings.Replace(src, `standard = "asce7-16-strength"`, `unused = "allow"`, 1)
		job, err := Read("p.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		if err := job.CheckUnused(); err != nil || job.Set != nil || len(job.Combinations) != 1 {
			t.Errorf("error %v, set %v, %d combinations", err, job.Set, len(job.Combinations))
		}
	})
	t.Run("each case alone uses every case", func(t *testing.T) {
		src := src[:strings.Index(src, "[[combination]]")]
		job, err := Read("p.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		if err := job.CheckUnused(); err != nil {
			t.Errorf("error %v", err)
		}
	})
}
