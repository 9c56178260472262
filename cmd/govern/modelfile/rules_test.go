package modelfile

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"govern/combos"
)

// officeCode is a rule file with terms written both ways: inline, and as
// [[rule.terms]] tables. Its lines are numbered in the comments of
// TestReadSetErrors.
const officeCode = `# An office's own code, for the tests.
name = "office-code"
title = "Two rules"

[[rule]]
id = "R1"
text = "1.3G + 1.5(Q or S)"
terms = [
  { kind = "dead", factor = 1.3 },
  { kind = ["live", "snow"], factor = 1.5, lead = true },
]

[[rule]]
id = "R2"
  [[rule.terms]]
  kind = "dead"
  factor = 1.0
  sds_factor = 0.2
  [[rule.terms]]
  or = [{ kind = "live", factor = 1.0, reduced_live_factor = 0.5 }, { kind = "wind", factor = 0.5, psi = "psi0" }]
  lead = true
`

func TestReadSet(t *testing.T) {
	s, err := ReadSet("office.toml", []byte(officeCode))
	if err != nil {
		t.Fatal(err)
	}
	want := &combos.Set{Name: "office-code", Title: "Two rules", Rules: []combos.Rule{
		{ID: "R1", Text: "1.3G + 1.5(Q or S)", Terms: []combos.RuleTerm{
			{Choices: []combos.Choice{{Kind: combos.Dead, Factor: 1.3}}},
			{Choices: []combos.Choice{{Kind: combos.Live, Factor: 1.5}, {Kind: combos.Snow, Factor: 1.5}}, Lead: true},
		}},
		{ID: "R2", Terms: []combos.RuleTerm{
			{Choices: []combos.Choice{{Kind: combos.Dead, Factor: 1, SDSFactor: 0.2}}},
			{Choices: []combos.Choice{{Kind: combos.Live, Factor: 1, ReducedLive: 0.5, HasReducedLive: true}, {Kind: combos.Wind, Factor: 0.5, Psi: combos.Psi0}}, Lead: true},
		}},
	}}
	if fmt.Sprintf("%+v", s) != fmt.Sprintf("%+v", want) {
		t.Errorf("set\n got: %+v\nwant: %+v", s, want)
	}
	t.Run("name defaults to the file's", func(t *testing.T) {
		s, err := ReadSet("codes/my-code.toml", []byte(strings.Replace(officeCode, `name = "office-code"`, "", 1)))
		if err != nil || s.Name != "my-code" {
			t.Errorf("name %q, err %v", s.Name, err)
		}
	})
	t.Run("service", func(t *testing.T) {
		s, err := ReadSet("office.toml", []byte(strings.Replace(officeCode, `title = "Two rules"`, "title = \"Two rules\"\nservice = true", 1)))
		if err != nil || !s.Service {
			t.Errorf("Service = %v, err %v", s != nil && s.Service, err)
		}
	})
}

// TestReadSetErrors: each way a rule file can be wrong gives exactly the
// message shown, at the line (and for syntax the column) of the key at
// fault, and wraps the sentinel named. The lines of officeCode: 2 name, 3
// title, 5 [[rule]] R1, 6 id, 7 text, 9 and 10 its terms, 13 [[rule]] R2,
// 15 and 19 its [[rule.terms]], 16 kind, 17 factor, 18 sds_factor, 20 or,
// 21 lead.
func TestReadSetErrors(t *testing.T) {
	const kinds = `"dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature"`
	for _, tc := range []struct {
		name     string
		edit     []string // old, new, … replaced in officeCode
		src      string   // the whole file, when edit is nil
		want     string
		sentinel error
	}{
		// Syntax: the column, and the line with a caret under it.
		{name: "a value missing", edit: []string{`title = "Two rules"`, `title = `},
			want: "office.toml:3:9: expected value but found '\\n' instead\n    title = \n            ^", sentinel: ErrSyntax},
		{name: "a syntax error after a multi-line string", edit: []string{`text = "1.3G + 1.5(Q or S)"`, "text = \"\"\"\n1.3G\n+ 1.5(Q or S)\n\"\"\"", `factor = 1.3 }`, `factor = 1.3. }`},
			want: "office.toml:12:29: Invalid float \"1.3.\": '.' must be followed by one or more digits\n      { kind = \"dead\", factor = 1.3. },\n                                ^", sentinel: ErrSyntax},

		{name: "nesting deeper than the format allows", src: "name = " + strings.Repeat("[", 20) + strings.Repeat("]", 20) + "\n",
			want: "office.toml:1:24: arrays, inline tables or table names nested deeper than the format allows\n    name = " + strings.Repeat("[", 20) + strings.Repeat("]", 20) + "\n" + strings.Repeat(" ", 27) + "^", sentinel: ErrSyntax},

		{name: "allowable and service at once", edit: []string{`title = "Two rules"`, "title = \"Two rules\"\nallowable = true\nservice = true"},
			want: `office.toml:4: allowable = true with service = true: a set is for strength, allowable stress or service, one of them`, sentinel: ErrValue},

		// Unknown keys, with the nearest known one.
		{name: "unknown key at the top level", edit: []string{`title = "Two rules"`, `titel = "Two rules"`},
			want: `office.toml:3: unknown key "titel" (did you mean "title"?) at the top level`, sentinel: ErrUnknownKey},
		// A deflection limit: only in a service set, positive.
		{name: "a limit in a strength set", edit: []string{`text = "1.3G + 1.5(Q or S)"`, "text = \"1.3G + 1.5(Q or S)\"\nlimit = 360"},
			want: `office.toml:8: rule "R1": limit = 360: only a service set's combinations have a deflection limit; give the set service = true`, sentinel: ErrValue},
		{name: "a limit not positive", edit: []string{`title = "Two rules"`, "title = \"Two rules\"\nservice = true", `text = "1.3G + 1.5(Q or S)"`, "text = \"1.3G + 1.5(Q or S)\"\nlimit = -240"},
			want: `office.toml:9: rule "R1": limit = -240: span/deflection must be a positive number, such as 360 for span/360`, sentinel: ErrValue},
		{name: "unknown key in a rule", edit: []string{`text = "1.3G + 1.5(Q or S)"`, `txt = "1.3G"`},
			want: `office.toml:7: rule "R1": unknown key "txt" (did you mean "text"?)`, sentinel: ErrUnknownKey},
		{name: "unknown key in an inline term", edit: []string{`factor = 1.5, lead = true }`, `factor = 1.5, togther = true }`},
			want: `office.toml:10: rule "R1", term 2: unknown key "togther" (did you mean "together"?)`, sentinel: ErrUnknownKey},
		{name: "unknown key in a [[rule.terms]] table", edit: []string{`  sds_factor = 0.2`, `  sds_facor = 0.2`},
			want: `office.toml:18: rule "R2", term 1: unknown key "sds_facor" (did you mean "sds_factor"?)`, sentinel: ErrUnknownKey},
		{name: "unknown key with nothing close", edit: []string{`factor = 1.5, lead = true }`, `factor = 1.5, leading = true }`},
			want: `office.toml:10: rule "R1", term 2: unknown key "leading"`, sentinel: ErrUnknownKey},
		{name: "a term's key in an alternative of or", edit: []string{`psi = "psi0" }`, `psi = "psi0", lead = true }`},
			want: `office.toml:20: rule "R2", term 2, alternative 2: unknown key "lead"`, sentinel: ErrUnknownKey},

		// Values and types.
		{name: "an unknown kind, with the nearest", edit: []string{`kind = ["live", "snow"]`, `kind = ["live", "snw"]`},
			want: `office.toml:10: rule "R1", term 2: kind = "snw": must be one of ` + kinds + ` (did you mean "snow"?)`, sentinel: ErrValue},
		{name: "an unknown psi, with the nearest", edit: []string{`psi = "psi0"`, `psi = "PSI1"`},
			want: `office.toml:20: rule "R2", term 2, alternative 2: psi = "PSI1": must be one of "psi0", "psi1", "psi2" (did you mean "psi1"?)`, sentinel: ErrValue},
		{name: "a factor that is not a number", edit: []string{`{ kind = "dead", factor = 1.3 }`, `{ kind = "dead", factor = "1.3x" }`},
			want: `office.toml:9: rule "R1", term 1: factor must be a number, not a string`, sentinel: ErrType},
		{name: "service that is not a boolean", edit: []string{`title = "Two rules"`, "title = \"Two rules\"\nservice = \"yes\""},
			want: `office.toml:4: service must be true or false, not a string`, sentinel: ErrType},
		{name: "terms that are not tables", edit: []string{"id = \"R2\"\n", "id = \"R2\"\nterms = \"dead\"\n", "  [[rule.terms]]\n  kind = \"dead\"\n  factor = 1.0\n  sds_factor = 0.2\n  [[rule.terms]]\n  or = [{ kind = \"live\", factor = 1.0, reduced_live_factor = 0.5 }, { kind = \"wind\", factor = 0.5, psi = \"psi0\" }]\n  lead = true\n", ""},
			want: `office.toml:15: rule "R2": terms must be an array of tables ([[rule.terms]]), not a string`, sentinel: ErrType},
		{name: "several kinds in an alternative of or", edit: []string{`{ kind = "wind", factor = 0.5`, `{ kind = ["wind", "snow"], factor = 0.5`},
			want: `office.toml:20: rule "R2", term 2, alternative 2: kind must be one kind in an alternative of or, not an array`, sentinel: ErrType},

		// Missing keys.
		{name: "a factor missing", edit: []string{`{ kind = "dead", factor = 1.3 }`, `{ kind = "dead" }`},
			want: `office.toml:9: rule "R1", term 1: factor is required`, sentinel: ErrMissing},
		{name: "a kind missing", edit: []string{`{ kind = "dead", factor = 1.3 }`, `{ factor = 1.3 }`},
			want: `office.toml:9: rule "R1", term 1: kind is required: the load kind the factor applies to (` + kinds + `)`, sentinel: ErrMissing},
		{name: "a rule without id", edit: []string{`id = "R1"`, ``},
			want: `office.toml:5: rule 1: id is required: it starts the name of every combination the rule gives`, sentinel: ErrMissing},
		{name: "a rule without terms", edit: []string{"  [[rule.terms]]\n  kind = \"dead\"\n  factor = 1.0\n  sds_factor = 0.2\n  [[rule.terms]]\n  or = [{ kind = \"live\", factor = 1.0, reduced_live_factor = 0.5 }, { kind = \"wind\", factor = 0.5, psi = \"psi0\" }]\n  lead = true\n", ""},
			want: `office.toml:13: rule "R2": terms is required: the loads of the rule with their factors`, sentinel: ErrMissing},
		{name: "a rule with no terms", edit: []string{"id = \"R2\"\n", "id = \"R2\"\nterms = []\n", "  [[rule.terms]]\n  kind = \"dead\"\n  factor = 1.0\n  sds_factor = 0.2\n  [[rule.terms]]\n  or = [{ kind = \"live\", factor = 1.0, reduced_live_factor = 0.5 }, { kind = \"wind\", factor = 0.5, psi = \"psi0\" }]\n  lead = true\n", ""},
			want: `office.toml:15: rule "R2": terms is empty: a rule needs at least one term`, sentinel: ErrValue},
		{name: "a file without rules", src: "name = \"empty\"\n",
			want: `office.toml: the file has no rules: give at least one [[rule]] table`, sentinel: ErrMissing},

		// The checks of the set (combos.Set.Validate), at their keys.
		{name: "psi on dead load", edit: []string{`factor = 1.3 }`, `factor = 1.3, psi = "psi0" }`},
			want: `office.toml:9: rule "R1", term 1: psi applies to variable loads; dead load has no ψ factors`, sentinel: ErrValue},
		{name: "favourable_factor on live load", edit: []string{`factor = 1.5, lead = true }`, `factor = 1.5, lead = true, favourable_factor = 0 }`},
			want: `office.toml:10: rule "R1", term 2: favourable_factor applies to permanent loads only, not to live: a variable load is left out where favourable`, sentinel: ErrValue},
		{name: "favourable_factor above the factor", edit: []string{`factor = 1.3 }`, `factor = 1.3, favourable_factor = 1.4 }`},
			want: `office.toml:9: rule "R1", term 1: favourable_factor = 1.4 must be from 0 to the factor, 1.3`, sentinel: ErrValue},
		{name: "sds_factor on live load", edit: []string{`factor = 1.5, lead = true }`, `factor = 1.5, lead = true, sds_factor = 0.2 }`},
			want: `office.toml:10: rule "R1", term 2: sds_factor applies to dead load only (Ev = 0.2 S_DS D), not to live`, sentinel: ErrValue},
		{name: "reduced_live_factor on wind load, in an alternative", edit: []string{`factor = 0.5, psi = "psi0" }`, `factor = 0.5, psi = "psi0", reduced_live_factor = 0.3 }`},
			want: `office.toml:20: rule "R2", term 2, alternative 2: reduced_live_factor applies to live load only (ASCE/SEI 7-16 section 2.3.1 exception 1), not to wind`, sentinel: ErrValue},
		{name: "each_action with together", edit: []string{`factor = 1.5, lead = true }`, `factor = 1.5, together = true, each_action = true }`},
			want: `office.toml:10: rule "R1", term 2: each_action cannot be used with together: together puts every action in one combination, each_action gives one combination for each`, sentinel: ErrValue},
		{name: "a type error is not reported again by the set's checks", edit: []string{`id = "R1"`, `id = 1`},
			want: `office.toml:6: rule 1: id must be a string, not an integer`, sentinel: ErrType},

		// or.
		{name: "factor beside or", edit: []string{`  lead = true`, "  lead = true\n  factor = 1.0"},
			want: `office.toml:22: rule "R2", term 2: factor cannot stand beside or: give it inside each alternative`, sentinel: ErrValue},
		{name: "each_action with or", edit: []string{`  lead = true`, "  lead = true\n  each_action = true"},
			want: `office.toml:22: rule "R2", term 2: each_action cannot be used with or: give the kinds as one term's kind instead`, sentinel: ErrValue},
		{name: "or empty", edit: []string{`or = [{ kind = "live", factor = 1.0, reduced_live_factor = 0.5 }, { kind = "wind", factor = 0.5, psi = "psi0" }]`, `or = []`},
			want: `office.toml:20: rule "R2", term 2: or is empty: list the alternatives`, sentinel: ErrValue},

		// Positions come from the decoder's keys: lines of a multi-line
		// string that read as a table header and keys are text.
		{name: "a key after a multi-line string", edit: []string{`text = "1.3G + 1.5(Q or S)"`, "text = '''\n[[rule]]\nid = \"X\"\nterms = [{ kind = \"dead\" }]\n'''", `  sds_factor = 0.2`, `  sds_factor = "0.2"`},
			want: `office.toml:22: rule "R2", term 1: sds_factor must be a number, not a string`, sentinel: ErrType},
		{name: "an inline term after a multi-line string in its rule", edit: []string{`text = "1.3G + 1.5(Q or S)"`, "text = \"\"\"\n1.3G\n[[rule.terms]]\nkind = \"snow\"\n\"\"\"", `kind = ["live", "snow"]`, `kind = ["live", "snw"]`},
			want: `office.toml:14: rule "R1", term 2: kind = "snw": must be one of ` + kinds + ` (did you mean "snow"?)`, sentinel: ErrValue},

		// Every problem at once, in line order.
		{name: "two problems reported together", edit: []string{`factor = 1.3 }`, `factor = nan }`, "  factor = 1.0\n", "  factor = true\n"},
			want: "office.toml:9: rule \"R1\", term 1: factor must be a finite number, not NaN\noffice.toml:17: rule \"R2\", term 1: factor must be a number, not a boolean", sentinel: ErrValue},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := tc.src
			if tc.edit != nil {
				src = officeCode
				for i := 0; i+1 < len(tc.edit); i += 2 {
					if !strings.Contains(src, tc.edit[i]) {
						t.Fatalf("edit %q not applied", tc.edit[i])
					}
					src = strings.Replace(src, tc.edit[i], tc.edit[i+1], 1)
				}
			}
			_, err := ReadSet("office.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got := err.Error(); got != tc.want {
				t.Errorf("error\n got: %s\nwant: %s", got, tc.want)
			}
			if !errors.Is(err, tc.sentinel) {
				t.Errorf("error does not wrap %v", tc.sentinel)
			}
			var l ErrorList
			if !errors.As(err, &l) {
				t.Errorf("error is not an ErrorList: %T", err)
			}
		})
	}
}

func TestReadSetRefusesALargeFile(t *testing.T) {
	_, err := ReadSet("r.toml", make([]byte, MaxRuleFileSize+1))
	want := fmt.Sprintf("r.toml: the file is %d bytes; the limit for a rule file is %d (1 MiB)", MaxRuleFileSize+1, MaxRuleFileSize)
	if err == nil || err.Error() != want || !errors.Is(err, ErrTooLarge) {
		t.Errorf("error\n got: %v\nwant: %s", err, want)
	}
}
