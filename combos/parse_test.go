package combos

import (
	"strings"
	"testing"
)

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

func TestParseSet(t *testing.T) {
	s, err := ParseSet("office.toml", []byte(officeCode))
	if err != nil {
		t.Fatal(err)
	}
	if s.Name != "office-code" || s.Title != "Two rules" || len(s.Rules) != 2 {
		t.Fatalf("set = %+v", s)
	}
	r1, r2 := s.Rules[0], s.Rules[1]
	if r1.ID != "R1" || len(r1.Terms) != 2 || !r1.Terms[1].Lead || r1.Terms[0].Lead {
		t.Errorf("R1 = %+v", r1)
	}
	alt := r1.Terms[1].Choices
	if len(alt) != 2 || alt[0] != (Choice{Kind: Live, Factor: 1.5}) || alt[1] != (Choice{Kind: Snow, Factor: 1.5}) {
		t.Errorf("R1 alternative = %+v", alt)
	}
	if c := r2.Terms[0].Choices[0]; c.Kind != Dead || c.Factor != 1 || c.SDSFactor != 0.2 {
		t.Errorf("R2 dead = %+v", c)
	}
	or := r2.Terms[1].Choices
	if len(or) != 2 || !or[0].HasReducedLive || or[0].ReducedLive != 0.5 || or[1].Psi != Psi0 || or[1].Factor != 0.5 || !r2.Terms[1].Lead {
		t.Errorf("R2 or = %+v", or)
	}
	t.Run("name defaults to the file's", func(t *testing.T) {
		s, err := ParseSet("codes/my-code.toml", []byte(strings.Replace(officeCode, `name = "office-code"`, "", 1)))
		if err != nil || s.Name != "my-code" {
			t.Errorf("name %q, err %v", s.Name, err)
		}
	})
}

func TestParseSetErrors(t *testing.T) {
	for _, tc := range []struct {
		name      string
		old, new  string // replaced in officeCode
		want      string
		wantLines []int
	}{
		{"rule naming an unknown kind", `kind = ["live", "snow"]`, `kind = ["live", "snw"]`,
			`office.toml:10: rule "R1", term 2: kind "snw" is not a load kind; the kinds are "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other"`, nil},
		{"factor that is not a number", `{ kind = "dead", factor = 1.3 }`, `{ kind = "dead", factor = "1.3x" }`,
			`office.toml:9: rule "R1", term 1: factor must be a number, not a string`, nil},
		{"factor missing", `{ kind = "dead", factor = 1.3 }`, `{ kind = "dead" }`,
			`office.toml:9: rule "R1", term 1: factor is required`, nil},
		{"unknown key in a term", `factor = 1.5, lead = true }`, `factor = 1.5, leading = true }`,
			`office.toml:10: rule "R1", term 2: unknown key "leading"; the keys here are kind, factor, lead, together, each_action, psi, sds_factor, reduced_live_factor, or` + "\n", nil},
		{"unknown key in a rule", `text = "1.3G + 1.5(Q or S)"`, `txt = "1.3G"`,
			`office.toml:7: rule "R1": unknown key "txt"; the keys here are id, text, terms` + "\n", nil},
		{"rule without id", `id = "R1"`, ``,
			`office.toml:5: rule 1: id is required`, nil},
		{"psi on dead load", `factor = 1.3 }`, `factor = 1.3, psi = "psi0" }`,
			`rule "R1", term 1: psi applies to variable loads; dead load has no ψ factors`, nil},
		{"unknown psi", `psi = "psi0"`, `psi = "psi3"`,
			`office.toml:20: rule "R2", term 2, alternative 2: psi = "psi3": must be "psi0", "psi1" or "psi2"`, nil},
		{"sds_factor on live load", `factor = 1.5, lead = true }`, `factor = 1.5, lead = true, sds_factor = 0.2 }`,
			`sds_factor applies to dead load only (Ev = 0.2 S_DS D), not to live`, nil},
		{"factor beside or", `  lead = true`, `  lead = true` + "\n  factor = 1.0",
			`office.toml:22: rule "R2", term 2: factor cannot stand beside or: give it inside each alternative`, nil},
		{"no rules", `[[rule]]`, `[[rules]]`,
			`unknown key "rules"`, nil},
		{"not TOML", `title = "Two rules"`, `title = `,
			`office.toml:3: expected value`, nil},
		{"two problems reported together", `factor = 1.3 }`, `factor = nan }`,
			`factor must be a finite number`, []int{9, 17}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := strings.Replace(officeCode, tc.old, tc.new, 1)
			if src == officeCode {
				t.Fatal("test does not change the file")
			}
			if tc.wantLines != nil {
				src = strings.Replace(src, "  factor = 1.0\n", "  factor = true\n", 1)
			}
			_, err := ParseSet("office.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			// A want ending in a newline is the whole message.
			if want, whole := strings.CutSuffix(tc.want, "\n"); whole && err.Error() != want || !whole && !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error:\n%v\nwant it to contain\n%s", err, tc.want)
			}
			if tc.wantLines != nil {
				es := err.(SetErrors)
				var lines []int
				for _, e := range es {
					lines = append(lines, e.Line)
				}
				if len(lines) != len(tc.wantLines) || lines[0] != tc.wantLines[0] || lines[1] != tc.wantLines[1] {
					t.Errorf("lines %v, want %v:\n%v", lines, tc.wantLines, err)
				}
			}
		})
	}
}
