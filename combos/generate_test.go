package combos

import (
	"errors"
	"fmt"
	"strings"
	"testing"
)

// cases builds load cases from specs such as "D dead", "W wind reversible",
// "Q live category=B" or "Wr wind with=Ww" (also action= and alternative=).
func cases(t *testing.T, specs ...string) ([]Case, []CaseInfo) {
	t.Helper()
	var cs []Case
	var info []CaseInfo
	for _, s := range specs {
		f := strings.Fields(s)
		k, ok := ParseKind(f[1])
		if !ok {
			t.Fatalf("bad kind in %q", s)
		}
		var ci CaseInfo
		for _, opt := range f[2:] {
			switch {
			case opt == "reversible":
				ci.Reversible = true
			case strings.HasPrefix(opt, "category="):
				ci.Category = strings.TrimPrefix(opt, "category=")
			case strings.HasPrefix(opt, "action="):
				ci.Action = strings.TrimPrefix(opt, "action=")
			case strings.HasPrefix(opt, "alternative="):
				ci.Alternative = strings.TrimPrefix(opt, "alternative=")
			case strings.HasPrefix(opt, "with="):
				ci.With = strings.TrimPrefix(opt, "with=")
			default:
				t.Fatalf("bad option in %q", s)
			}
		}
		cs = append(cs, Case{Name: f[0], Kind: k})
		info = append(info, ci)
	}
	return cs, info
}

// factorSets generates the set's combinations and returns each as its
// factors, such as "1.2D+1.6L".
func factorSets(t *testing.T, s *Set, cs []Case, info []CaseInfo, p Params) []string {
	t.Helper()
	got, err := s.Generate(cs, info, p)
	if err != nil {
		t.Fatal(err)
	}
	out := make([]string, len(got))
	for i, cb := range got {
		out[i] = Compact(cb.Terms, cs)
		if want := cb.Name; !strings.HasSuffix(want, " "+out[i]) {
			t.Errorf("combination %q is not named after its factors %s", cb.Name, out[i])
		}
	}
	return out
}

// rule returns a set of one rule, "R", of the terms.
func rule(terms ...RuleTerm) *Set {
	return &Set{Name: "test", Rules: []Rule{{ID: "R", Terms: terms}}}
}

// kinds returns a term of the kinds ks, each at factor.
func kinds(factor float64, ks ...Kind) RuleTerm {
	var rt RuleTerm
	for _, k := range ks {
		rt.Choices = append(rt.Choices, Choice{Kind: k, Factor: factor})
	}
	return rt
}

// with returns rt with its flags set: "lead", "together", or a ψ.
func with(rt RuleTerm, flags ...string) RuleTerm {
	for _, f := range flags {
		switch f {
		case "lead":
			rt.Lead = true
		case "together":
			rt.Together = true
		case "psi2":
			for i := range rt.Choices {
				rt.Choices[i].Psi = Psi2
			}
		default:
			panic("with: " + f)
		}
	}
	return rt
}

func TestGenerateRules(t *testing.T) {
	// The expansion rules of docs/combinations.md, each on a small set.
	for _, tc := range []struct {
		name  string
		terms []RuleTerm
		cases []string
		want  string
	}{
		{"every case of a kind takes its factor",
			[]RuleTerm{kinds(1.4, Dead)},
			[]string{"G1 dead", "G2 dead", "Q live"}, "1.4G1+1.4G2"},
		{"an alternative gives one combination per kind present",
			[]RuleTerm{kinds(1.2, Dead), kinds(1.6, RoofLive, Snow, Rain)},
			[]string{"D dead", "S snow", "Lr roof-live"}, "1.2D+1.6Lr 1.2D+1.6S"},
		{"a term with no kind present drops out",
			[]RuleTerm{kinds(1.2, Dead), kinds(0.5, Snow, Rain)},
			[]string{"D dead", "L live"}, "1.2D"},
		{"a lead with no case drops the rule",
			[]RuleTerm{kinds(1.2, Dead), with(kinds(1.0, Wind), "lead")},
			[]string{"D dead", "L live"}, ""},
		{"every lead must be present",
			[]RuleTerm{with(kinds(0.75, Live), "lead"), with(kinds(0.75, Snow), "lead")},
			[]string{"L live"}, ""},
		{"together puts every kind present in one combination, in the order of the term",
			[]RuleTerm{with(kinds(1.5, Live, Snow, Wind), "together")},
			[]string{"S snow", "L live", "W wind"}, "1.5L+1.5S+1.5W"},
		{"a kind taken earlier is not taken again",
			[]RuleTerm{with(kinds(1.5, Live, Snow), "lead"), with(kinds(0.5, Live, Snow), "together")},
			[]string{"L live", "S snow"}, "1.5L+0.5S 1.5S+0.5L"},
		{"a reversible case enters with both signs",
			[]RuleTerm{kinds(0.9, Dead), kinds(1.0, Wind)},
			[]string{"D dead", "W wind reversible"}, "0.9D+1.0W 0.9D-1.0W"},
		{"two reversible cases give four sign sets",
			[]RuleTerm{with(kinds(1.0, Wind, Seismic), "together")},
			[]string{"W wind reversible", "E seismic reversible"}, "1.0W+1.0E 1.0W-1.0E -1.0W+1.0E -1.0W-1.0E"},
		{"identical factor sets are kept once",
			[]RuleTerm{kinds(1.0, Dead, Dead)},
			[]string{"D dead"}, "1.0D"},
		{"a zero psi leaves the case out",
			[]RuleTerm{kinds(1.0, Dead), with(kinds(1.0, Live, Wind), "together", "psi2")},
			[]string{"D dead", "Q live category=B", "W wind reversible"}, "1.0D+0.3Q"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := rule(tc.terms...)
			cs, info := cases(t, tc.cases...)
			if got := strings.Join(factorSets(t, s, cs, info, Params{}), " "); got != tc.want {
				t.Errorf("got  %q\nwant %q", got, tc.want)
			}
		})
	}
}

func TestGenerateNamesAndRules(t *testing.T) {
	s, _ := Standard("asce7-16-strength")
	cs, info := cases(t, "D dead", "S snow", "W wind")
	got, err := s.Generate(cs, info, Params{})
	if err != nil {
		t.Fatal(err)
	}
	// An example of a readable name: ASCE/SEI 7-16 section 2.3.1
	// combination 3 with snow leading and half the wind.
	for _, cb := range got {
		if cb.Name == "2.3.1-3 1.2D+1.6S+0.5W" {
			if cb.Rule != "asce7-16-strength 2.3.1-3" || cb.Factor(0) != 1.2 || cb.Factor(1) != 1.6 || cb.Factor(2) != 0.5 {
				t.Errorf("combination %+v", cb)
			}
			return
		}
	}
	t.Errorf("no combination named 2.3.1-3 1.2D+1.6S+0.5W among %+v", got)
}

func TestGenerateNeedsPsi(t *testing.T) {
	s, _ := Standard("en1990-6.10")
	cs, info := cases(t, "G dead", "Q live", "S snow", "R rain", "W wind")
	_, err := s.Generate(cs, info, Params{})
	var ce CaseErrors
	if !errors.As(err, &ce) || len(ce) != 3 {
		t.Fatalf("error %v, want one for each of Q, S and R", err)
	}
	for i, want := range []string{
		`en1990-6.10 rule 6.10 needs psi0 of this live case: give category ("A", "B", "C", "D", "E", "F", "G", "H", EN 1990 Table A1.1) or psi0, psi1 and psi2`,
		`needs psi0 of this snow case: give category ("snow-nordic", "snow-above-1000m", "snow-up-to-1000m"`,
		`needs psi0 of this rain case: give psi0, psi1 and psi2 (EN 1990 Table A1.1 has no row for rain load)`,
	} {
		if ce[i].Case != i+1 || !strings.Contains(ce[i].Msg, want) {
			t.Errorf("error %d: case %d, %q\nwant case %d and %q", i, ce[i].Case, ce[i].Msg, i+1, want)
		}
	}
}

func TestGenerateBounded(t *testing.T) {
	s := rule(with(kinds(1.0, Wind, Other), "together"))
	t.Run("sign patterns", func(t *testing.T) {
		// Each other case is an action of its own: 2^16 sign patterns.
		var specs []string
		for i := range 16 {
			specs = append(specs, "T"+strings.Repeat("x", i)+" other reversible")
		}
		cs, info := cases(t, specs...)
		if _, err := s.Generate(cs, info, Params{}); err == nil || !strings.Contains(err.Error(), "more than 20000 combinations") {
			t.Errorf("error %v", err)
		}
	})
	t.Run("alternatives", func(t *testing.T) {
		// 16 wind actions of two alternatives each: 2^16 combinations.
		var specs []string
		for i := range 16 {
			a := fmt.Sprintf("action=W%d", i)
			specs = append(specs, fmt.Sprintf("W%dL wind %s", i, a), fmt.Sprintf("W%dR wind %s", i, a))
		}
		cs, info := cases(t, specs...)
		if _, err := s.Generate(cs, info, Params{}); err == nil || !strings.Contains(err.Error(), "more than 20000 combinations") {
			t.Errorf("error %v", err)
		}
	})
	t.Run("alternatives with zero factors are tried once", func(t *testing.T) {
		// 16 wind actions of two alternatives, all at psi2 = 0: one
		// combination, without enumerating 2^16 of them.
		s := rule(kinds(1.0, Dead), with(kinds(1.0, Wind), "together", "psi2"))
		specs := []string{"G dead"}
		for i := range 16 {
			a := fmt.Sprintf("action=W%d", i)
			specs = append(specs, fmt.Sprintf("W%dL wind %s", i, a), fmt.Sprintf("W%dR wind %s", i, a))
		}
		cs, info := cases(t, specs...)
		if got := strings.Join(factorSets(t, s, cs, info, Params{}), " "); got != "1.0G" {
			t.Errorf("got %s", got)
		}
	})
}

func TestFormatFactor(t *testing.T) {
	for _, tc := range []struct {
		f    float64
		want string
	}{{1, "1.0"}, {1.35, "1.35"}, {-0.5, "-0.5"}, {round12(1.5 * 0.7), "1.05"}, {round12(1.2 + 0.2*0.87), "1.374"}} {
		if got := FormatFactor(tc.f); got != tc.want {
			t.Errorf("FormatFactor(%v) = %q, want %q", tc.f, got, tc.want)
		}
	}
}

// TestGenerateCarriesTheLimit: the combinations of a service rule carry
// its span/deflection limit; a strength set may not have one.
func TestGenerateCarriesTheLimit(t *testing.T) {
	s := &Set{Name: "deflection", Service: true, Rules: []Rule{
		{ID: "total", Terms: []RuleTerm{{Choices: []Choice{{Kind: Dead, Factor: 1}}}, {Choices: []Choice{{Kind: Live, Factor: 1}}}}, Limit: 240},
		{ID: "live", Terms: []RuleTerm{{Choices: []Choice{{Kind: Live, Factor: 1}}, Lead: true}}, Limit: 360},
	}}
	cs, info := cases(t, "D dead", "L live")
	got, err := s.Generate(cs, info, Params{})
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != 2 || got[0].Limit != 240 || got[1].Limit != 360 || !got[0].Service || !got[1].Service {
		t.Errorf("combinations %+v, want the total at 240 and the live load at 360, both service", got)
	}
	s.Service = false
	if err := s.Validate(); err == nil {
		t.Error("a limit in a strength set was accepted")
	}
}
