package combos

import (
	"strings"
	"testing"
)

func TestStandards(t *testing.T) {
	want := "asce7-16-allowable asce7-16-strength en1990-6.10 en1990-6.10ab en1990-characteristic en1990-frequent en1990-quasi-permanent"
	if got := strings.Join(Standards(), " "); got != want {
		t.Fatalf("Standards() = %s\nwant %s", got, want)
	}
	for _, name := range Standards() {
		t.Run(name, func(t *testing.T) {
			s, err := Standard(name)
			if err != nil {
				t.Fatal(err)
			}
			if s.Name != name || s.Title == "" || len(s.Rules) == 0 {
				t.Errorf("set %q: name %q, title %q, %d rules", name, s.Name, s.Title, len(s.Rules))
			}
			for _, r := range s.Rules {
				if r.ID == "" || r.Text == "" {
					t.Errorf("rule %+v lacks an id or its text", r)
				}
			}
		})
	}
}

func TestUnknownStandardListsTheKnownOnes(t *testing.T) {
	for _, name := range []string{"asce7-16-strenght", "../sets/en1990-6.10", ""} {
		_, err := Standard(name)
		if err == nil {
			t.Fatalf("Standard(%q): no error", name)
		}
		msg := err.Error()
		if !strings.Contains(msg, "unknown standard") || !strings.Contains(msg, strings.Join(Standards(), ", ")) {
			t.Errorf("Standard(%q): %v", name, err)
		}
	}
}

func TestSetOptions(t *testing.T) {
	for _, tc := range []struct {
		name               string
		sds, reduced, psis bool
	}{
		{"asce7-16-strength", true, true, false},
		{"asce7-16-allowable", true, false, false},
		{"en1990-6.10", false, false, true},
		{"en1990-quasi-permanent", false, false, true},
	} {
		s, _ := Standard(tc.name)
		if s.UsesSDS() != tc.sds || s.UsesReducedLive() != tc.reduced || s.UsesPsi() != tc.psis {
			t.Errorf("%s: uses sds %v, reduced live %v, psi %v", tc.name, s.UsesSDS(), s.UsesReducedLive(), s.UsesPsi())
		}
	}
}

func TestEveryRuleGivesCombinations(t *testing.T) {
	// With a case of every kind (ψ from EN 1990 Table A1.1 rows), every
	// rule of every built-in set is used: none is unreachable.
	cs, info := cases(t, "D dead", "L live category=B", "Lr roof-live category=H", "S snow category=snow-nordic",
		"R rain", "W wind reversible", "E seismic reversible", "T other category=temperature")
	info[4].Psi, info[4].PsiGiven = [3]float64{0.6, 0.5, 0.3}, [3]bool{true, true, true}
	for _, name := range Standards() {
		t.Run(name, func(t *testing.T) {
			s, _ := Standard(name)
			got, err := s.Generate(cs, info, Params{SDS: 0.5})
			if err != nil {
				t.Fatal(err)
			}
			for i, r := range s.Rules {
				found := false
				for _, cb := range got {
					found = found || cb.Rule == name+" "+r.ID
				}
				if !found {
					t.Errorf("rule %d (%s, %s) gives nothing", i+1, r.ID, r.Text)
				}
			}
		})
	}
}

// EN 1990 section 6.5.3 gives the characteristic (6.14b), frequent (6.15b)
// and quasi-permanent (6.16b) combinations for the serviceability limit
// states, and Annex A1 section A1.4.3 checks deformations with them; the
// strength sets (ASCE/SEI 7-16 section 2.3, EN 1990 6.10) are ultimate limit
// state sets, and the allowable stress set of section 2.4 is for member
// strength too (recalled from memory).
func TestServiceSets(t *testing.T) {
	service := map[string]bool{"en1990-characteristic": true, "en1990-frequent": true, "en1990-quasi-permanent": true}
	cs, info := cases(t, "G dead", "Q live category=B", "W wind")
	for _, name := range Standards() {
		t.Run(name, func(t *testing.T) {
			s, _ := Standard(name)
			if s.Service != service[name] {
				t.Fatalf("Service = %v, want %v", s.Service, service[name])
			}
			got, err := s.Generate(cs, info, Params{})
			if err != nil || len(got) == 0 {
				t.Fatalf("%d combinations, %v", len(got), err)
			}
			for _, cb := range got {
				if cb.Service != s.Service {
					t.Errorf("%s: Service = %v, want the set's %v", cb.Name, cb.Service, s.Service)
				}
			}
		})
	}
}
