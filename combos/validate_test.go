package combos

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestBuiltInSetsAreValid(t *testing.T) {
	for _, name := range Standards() {
		s, _ := Standard(name)
		if err := s.Validate(); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
}

// TestValidate: each check of a set built in code, with the part at fault
// and the message.
func TestValidate(t *testing.T) {
	dead := func(c Choice) RuleTerm { c.Kind = Dead; return RuleTerm{Choices: []Choice{c}} }
	live := func(c Choice) RuleTerm { c.Kind = Live; return RuleTerm{Choices: []Choice{c}} }
	for _, tc := range []struct {
		name               string
		set                *Set
		rule, term, choice int
		key, want          string
	}{
		{"no name", &Set{Rules: []Rule{{ID: "R", Terms: []RuleTerm{kinds(1, Dead)}}}},
			-1, -1, -1, "name", "name is empty: the rule column of every combination starts with the set's name"},
		{"no rules", &Set{Name: "s"},
			-1, -1, -1, "rule", "the set has no rules: give at least one rule"},
		{"a rule without an id", &Set{Name: "s", Rules: []Rule{{Terms: []RuleTerm{kinds(1, Dead)}}}},
			0, -1, -1, "id", "rule 1: id is required: it starts the name of every combination the rule gives"},
		{"a rule without terms", &Set{Name: "s", Rules: []Rule{{ID: "R"}}},
			0, -1, -1, "terms", `rule "R": terms is empty: a rule needs at least one term`},
		{"a term without a kind", rule(kinds(1, Dead), RuleTerm{Lead: true}),
			0, 1, -1, "kind", `rule "R", term 2: kind is empty: a term needs at least one load kind`},
		{"each action and together", rule(RuleTerm{Choices: []Choice{{Kind: Live, Factor: 1}}, EachAction: true, Together: true}),
			0, 0, -1, "each_action", `rule "R", term 1: each_action cannot be used with together`},
		{"an unknown kind", rule(kinds(1, Dead, Kind(10))),
			0, 0, 1, "kind", `rule "R", term 1: kind Kind(10) is not a load kind; the kinds are "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature"`},
		{"an infinite factor", rule(dead(Choice{Factor: math.Inf(1)})),
			0, 0, 0, "factor", `rule "R", term 1: factor must be a finite number, not +Inf`},
		{"S_DS on live load", rule(live(Choice{Factor: 1, SDSFactor: 0.2})),
			0, 0, 0, "sds_factor", `rule "R", term 1: sds_factor applies to dead load only (Ev = 0.2 S_DS D), not to live`},
		{"a reduced factor for dead load", rule(dead(Choice{Factor: 1, ReducedLive: 0.5, HasReducedLive: true})),
			0, 0, 0, "reduced_live_factor", `rule "R", term 1: reduced_live_factor applies to live load only (ASCE/SEI 7-16 section 2.3.1 exception 1), not to dead`},
		{"a reduced factor that is not a number", rule(live(Choice{Factor: 1, ReducedLive: math.NaN(), HasReducedLive: true})),
			0, 0, 0, "reduced_live_factor", `rule "R", term 1: reduced_live_factor must be a finite number, not NaN`},
		{"ψ of dead load", rule(dead(Choice{Factor: 1, Psi: Psi0})),
			0, 0, 0, "psi", `rule "R", term 1: psi applies to variable loads; dead load has no ψ factors`},
		{"an unknown ψ", rule(live(Choice{Factor: 1, Psi: Psi(7)})),
			0, 0, 0, "psi", `rule "R", term 1: psi Psi(7) is not one of psi0, psi1, psi2`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			err := tc.set.Validate()
			var es SetErrors
			if !errors.As(err, &es) || len(es) != 1 {
				t.Fatalf("error %v, want one problem", err)
			}
			e := es[0]
			if e.Rule != tc.rule || e.Term != tc.term || e.Choice != tc.choice || e.Key != tc.key {
				t.Errorf("at rule %d, term %d, choice %d, key %q; want %d, %d, %d, %q", e.Rule, e.Term, e.Choice, e.Key, tc.rule, tc.term, tc.choice, tc.key)
			}
			if !strings.HasPrefix(e.Error(), tc.want) {
				t.Errorf("error\n got: %s\nwant: %s", e.Error(), tc.want)
			}
			// Generate refuses the set rather than expanding it.
			cs, info := cases(t, "D dead", "L live")
			if _, err := tc.set.Generate(cs, info, Params{}); !errors.As(err, &es) {
				t.Errorf("Generate: error %v, want the set's problems", err)
			}
		})
	}
}

func TestStandardReturnsACopy(t *testing.T) {
	s, _ := Standard("asce7-16-strength")
	s.Name = "changed"
	s.Rules[0].ID = "changed"
	s.Rules[0].Terms[0].Choices[0].Factor = 99
	again, _ := Standard("asce7-16-strength")
	if again.Name != "asce7-16-strength" || again.Rules[0].ID != "2.3.1-1" || again.Rules[0].Terms[0].Choices[0].Factor != 1.4 {
		t.Errorf("a change to one set returned reached the next: %+v", again.Rules[0])
	}
}
