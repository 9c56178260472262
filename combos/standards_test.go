package combos

import (
	"math"
	"slices"
	"strings"
	"testing"
)

// Each built-in set against its standard. ASCE/SEI 7-16 expressions are
// recalled from memory (sections 2.3.1, 2.3.6, 2.4.1, 2.4.5 and 12.4.2.2);
// they are also the common practice lists. EN 1990 factors are Annex A1, Table
// A1.2(B) (γG,sup 1.35, γG,inf 1.00, γQ 1.5, ξ 0.85), confirmed by "Steel
// Buildings in Europe", Part 3: Actions, section 3.2 (Table 3.1 and its
// worked example); ψ from Table A1.1 (see psi_test.go).

func generateSet(t *testing.T, name string, p Params, specs ...string) []string {
	t.Helper()
	s, err := Standard(name)
	if err != nil {
		t.Fatal(err)
	}
	cs, info := cases(t, specs...)
	return factorSets(t, s, cs, info, p)
}

func sameList(t *testing.T, got []string, want ...string) {
	t.Helper()
	if !slices.Equal(got, want) {
		t.Errorf("got %d combinations:\n  %s\nwant %d:\n  %s", len(got), strings.Join(got, "\n  "), len(want), strings.Join(want, "\n  "))
	}
}

func TestASCE716StrengthFifteen(t *testing.T) {
	// ASCE/SEI 7-16 section 2.3.1 combinations 1-5 with D, L, Lr, S and a
	// reversible W: exactly the 15 factor sets of those sections, in rule order.
	got := generateSet(t, "asce7-16-strength", Params{}, "D dead", "L live", "Lr roof-live", "S snow", "W wind reversible")
	sameList(t, got,
		"1.4D",                              // 2.3.1 (1) 1.4D
		"1.2D+1.6L+0.5Lr", "1.2D+1.6L+0.5S", // 2.3.1 (2) 1.2D + 1.6L + 0.5(Lr or S or R)
		"1.2D+1.6Lr+1.0L", "1.2D+1.6Lr+0.5W", "1.2D+1.6Lr-0.5W", // 2.3.1 (3) 1.2D + 1.6(Lr or S or R) + (L or 0.5W)
		"1.2D+1.6S+1.0L", "1.2D+1.6S+0.5W", "1.2D+1.6S-0.5W",
		"1.2D+1.0W+1.0L+0.5Lr", "1.2D-1.0W+1.0L+0.5Lr", // 2.3.1 (4) 1.2D + 1.0W + L + 0.5(Lr or S or R)
		"1.2D+1.0W+1.0L+0.5S", "1.2D-1.0W+1.0L+0.5S",
		"0.9D+1.0W", "0.9D-1.0W", // 2.3.1 (5) 0.9D + 1.0W
	)
}

func TestASCE716Strength(t *testing.T) {
	t.Run("only D and L", func(t *testing.T) {
		// Section 2.3.1: combinations 3, 4 and 5 lead with loads the model
		// lacks; 2 keeps 1.6L without a roof load.
		sameList(t, generateSet(t, "asce7-16-strength", Params{}, "D dead", "L live"), "1.4D", "1.2D+1.6L")
	})
	t.Run("every kind present", func(t *testing.T) {
		got := generateSet(t, "asce7-16-strength", Params{}, "D dead", "L live", "Lr roof-live", "S snow", "R rain", "W wind reversible", "E seismic reversible")
		// 2.3.1: 1 + 3 + 3×3 + 3×2 + 2; 2.3.6: 2 + 2.
		if len(got) != 1+3+9+6+2+2+2 {
			t.Errorf("%d combinations, want 25:\n%s", len(got), strings.Join(got, "\n"))
		}
		for _, want := range []string{
			"1.2D+1.6L+0.5R", "1.2D+1.6R-0.5W", "1.2D-1.0W+1.0L+0.5R", // "(Lr or S or R)" takes R too
			"1.2D+1.0E+1.0L+0.2S", "1.2D-1.0E+1.0L+0.2S", // 2.3.6 (6) with Ev = 0 when S_DS is not given
			"0.9D+1.0E", "0.9D-1.0E", // 2.3.6 (7)
		} {
			if !slices.Contains(got, want) {
				t.Errorf("missing %s", want)
			}
		}
	})
	t.Run("Ev = 0.2 SDS D in the dead factor", func(t *testing.T) {
		// Section 2.3.6 with Ev = 0.2 S_DS D (section 12.4.2.2): S_DS = 1.0
		// gives (1.2 + 0.2)D and (0.9 - 0.2)D.
		got := generateSet(t, "asce7-16-strength", Params{SDS: 1.0}, "D dead", "E seismic")
		sameList(t, got, "1.4D", "1.4D+1.0E", "0.7D+1.0E")
		got = generateSet(t, "asce7-16-strength", Params{SDS: 0.87}, "D dead", "E seismic")
		sameList(t, got, "1.4D", "1.374D+1.0E", "0.726D+1.0E")
	})
	t.Run("exception 1: 0.5L in combinations 3, 4 and 6", func(t *testing.T) {
		// Section 2.3.1 exception 1: L factor 0.5 in 3, 4 and 6; 1.6L in 2
		// is unchanged.
		got := generateSet(t, "asce7-16-strength", Params{ReducedLive: true}, "D dead", "L live", "S snow", "W wind", "E seismic")
		for _, want := range []string{"1.2D+1.6L+0.5S", "1.2D+1.6S+0.5L", "1.2D+1.0W+0.5L+0.5S", "1.2D+1.0E+0.5L+0.2S"} {
			if !slices.Contains(got, want) {
				t.Errorf("missing %s in\n%s", want, strings.Join(got, "\n"))
			}
		}
	})
}

func TestASCE716Allowable(t *testing.T) {
	t.Run("only D and L", func(t *testing.T) {
		// Section 2.4.1 (1) D and (2) D + L; (4) needs a roof load too.
		sameList(t, generateSet(t, "asce7-16-allowable", Params{}, "D dead", "L live"), "1.0D", "1.0D+1.0L")
	})
	t.Run("reversible wind", func(t *testing.T) {
		got := generateSet(t, "asce7-16-allowable", Params{}, "D dead", "L live", "W wind reversible")
		sameList(t, got,
			"1.0D", "1.0D+1.0L", // 2.4.1 (1), (2)
			"1.0D+0.6W", "1.0D-0.6W", // (5) D + 0.6W
			"1.0D+0.75L+0.45W", "1.0D+0.75L-0.45W", // (6) D + 0.75L + 0.75(0.6W)
			"0.6D+0.6W", "0.6D-0.6W", // (7) 0.6D + 0.6W
		)
	})
	t.Run("every kind present", func(t *testing.T) {
		got := generateSet(t, "asce7-16-allowable", Params{SDS: 1.0}, "D dead", "L live", "Lr roof-live", "S snow", "R rain", "W wind reversible", "E seismic reversible")
		// 2.4.1: 1 + 1 + 3 + 3 + 2 + 3×2 + 2; 2.4.5: 2 + 2 + 2.
		if len(got) != 18+6 {
			t.Errorf("%d combinations, want 24:\n%s", len(got), strings.Join(got, "\n"))
		}
		// 2.4.5 with Ev = 0.2 S_DS D, S_DS = 1.0: 0.7Ev = 0.14D,
		// 0.525Ev = 0.105D, -0.7Ev = -0.14D.
		for _, want := range []string{
			"1.0D+0.75L+0.75S", "1.0D+0.75L-0.45W+0.75R", // 2.4.1 (4), (6)
			"1.14D+0.7E", "1.105D-0.525E+0.75L+0.75S", "0.46D-0.7E", // 2.4.5 (8), (9), (10)
		} {
			if !slices.Contains(got, want) {
				t.Errorf("missing %s", want)
			}
		}
	})
}

// office is the EN 1990 test building: permanent G, office floor load Q
// (Table A1.1 category B: ψ0 0.7, ψ1 0.5, ψ2 0.3), snow at a site below
// 1000 m (ψ0 0.5, ψ1 0.2, ψ2 0) and reversible wind (ψ0 0.6, ψ1 0.2, ψ2 0).
var office = []string{"G dead", "Q live category=B", "S snow category=snow-up-to-1000m", "W wind reversible"}

func TestEN1990Expression6_10(t *testing.T) {
	got := generateSet(t, "en1990-6.10", Params{}, office...)
	sameList(t, got,
		"1.35G", // permanent actions alone
		// γG,sup = 1.35, each variable action leading with γQ = 1.5, the
		// others at γQ ψ0: 1.5 × 0.5 = 0.75 (S), 1.5 × 0.6 = 0.9 (W),
		// 1.5 × 0.7 = 1.05 (Q). The first is the example.
		"1.35G+1.5Q+0.75S+0.9W", "1.35G+1.5Q+0.75S-0.9W",
		"1.35G+1.5S+1.05Q+0.9W", "1.35G+1.5S+1.05Q-0.9W",
		"1.35G+1.5W+1.05Q+0.75S", "1.35G-1.5W+1.05Q+0.75S",
		// γG,inf = 1.00 for favourable permanent actions.
		"1.0G+1.5Q+0.75S+0.9W", "1.0G+1.5Q+0.75S-0.9W",
		"1.0G+1.5S+1.05Q+0.9W", "1.0G+1.5S+1.05Q-0.9W",
		"1.0G+1.5W+1.05Q+0.75S", "1.0G-1.5W+1.05Q+0.75S",
	)
	t.Run("only G and Q", func(t *testing.T) {
		sameList(t, generateSet(t, "en1990-6.10", Params{}, "G dead", "Q live category=B"), "1.35G", "1.35G+1.5Q", "1.0G+1.5Q")
	})
	t.Run("published example", func(t *testing.T) {
		// "Steel Buildings in Europe", Part 3: Actions, section 3.2: with
		// snow leading 1.35G + 1.5S + 0.9W; with wind leading
		// 1.35G + 1.5W + 0.75S.
		got := generateSet(t, "en1990-6.10", Params{}, "G dead", "S snow category=snow-up-to-1000m", "W wind")
		sameList(t, got, "1.35G", "1.35G+1.5S+0.9W", "1.35G+1.5W+0.75S", "1.0G+1.5S+0.9W", "1.0G+1.5W+0.75S")
	})
	t.Run("seismic design situation 6.12b", func(t *testing.T) {
		// EN 1990 6.4.3.4, expression 6.12b: Gk + AEd + ψ2 Qk (ψ2 = 0.3
		// for category B, 0 for snow below 1000 m and wind).
		got := generateSet(t, "en1990-6.10", Params{}, append(office, "E seismic reversible")...)
		for _, want := range []string{"1.0G+1.0E+0.3Q", "1.0G-1.0E+0.3Q"} {
			if !slices.Contains(got, want) {
				t.Errorf("missing %s", want)
			}
		}
	})
	t.Run("category H roof load is never accompanying", func(t *testing.T) {
		// Table A1.1 category H: ψ0 = 0, so a roof load accompanies nothing.
		got := generateSet(t, "en1990-6.10", Params{}, "G dead", "H roof-live category=H", "W wind")
		sameList(t, got, "1.35G", "1.35G+1.5H+0.9W", "1.35G+1.5W", "1.0G+1.5H+0.9W", "1.0G+1.5W")
	})
}

func TestEN1990Expressions6_10aAnd6_10b(t *testing.T) {
	got := generateSet(t, "en1990-6.10ab", Params{}, office...)
	if len(got) != 2+2+12 {
		t.Errorf("%d combinations, want 16:\n%s", len(got), strings.Join(got, "\n"))
	}
	xi, gSup := 0.85, 1.35 // Table A1.2(B): ξ and γG,sup
	xiG := FormatFactor(math.Round(xi*gSup*1e6) / 1e6)
	for _, want := range []string{
		"1.35G+1.05Q+0.75S+0.9W", "1.0G+1.05Q+0.75S-0.9W", // 6.10a: every variable action at 1.5 ψ0
		xiG + "G+1.5Q+0.75S+0.9W", xiG + "G-1.5W+1.05Q+0.75S", // 6.10b: ξ γG,sup
		"1.0G+1.5S+1.05Q-0.9W", // 6.10b: γG,inf
	} {
		if !slices.Contains(got, want) {
			t.Errorf("missing %s in\n%s", want, strings.Join(got, "\n"))
		}
	}
}

func TestEN1990Serviceability(t *testing.T) {
	t.Run("characteristic 6.14b", func(t *testing.T) {
		sameList(t, generateSet(t, "en1990-characteristic", Params{}, office...),
			"1.0G",
			"1.0G+1.0Q+0.5S+0.6W", "1.0G+1.0Q+0.5S-0.6W", // ψ0: S 0.5, W 0.6
			"1.0G+1.0S+0.7Q+0.6W", "1.0G+1.0S+0.7Q-0.6W", // ψ0: Q 0.7
			"1.0G+1.0W+0.7Q+0.5S", "1.0G-1.0W+0.7Q+0.5S")
	})
	t.Run("frequent 6.15b", func(t *testing.T) {
		sameList(t, generateSet(t, "en1990-frequent", Params{}, office...),
			"1.0G",
			"1.0G+0.5Q",                        // ψ1 Q = 0.5; ψ2 S = ψ2 W = 0
			"1.0G+0.2S+0.3Q",                   // ψ1 S = 0.2; ψ2 Q = 0.3
			"1.0G+0.2W+0.3Q", "1.0G-0.2W+0.3Q") // ψ1 W = 0.2
	})
	t.Run("quasi-permanent 6.16b", func(t *testing.T) {
		sameList(t, generateSet(t, "en1990-quasi-permanent", Params{}, office...), "1.0G+0.3Q") // ψ2 Q = 0.3
	})
	t.Run("only G and Q", func(t *testing.T) {
		sameList(t, generateSet(t, "en1990-characteristic", Params{}, "G dead", "Q live category=E"), "1.0G", "1.0G+1.0Q")
		// Category E storage: ψ1 0.9, ψ2 0.8.
		sameList(t, generateSet(t, "en1990-frequent", Params{}, "G dead", "Q live category=E"), "1.0G", "1.0G+0.9Q")
		sameList(t, generateSet(t, "en1990-quasi-permanent", Params{}, "G dead", "Q live category=E"), "1.0G+0.8Q")
	})
}

// TestSettlementAndTemperature: the new kinds in the built-in sets.
// ASCE/SEI 7-16 takes both as the self-straining load T with a factor of
// 1.0 in every combination (section 2.3.4, recalled from memory: a factor
// not less than 1.0; section 2.4.4 for the allowable set, its least
// factor not confirmed). EN 1990 takes uneven settlements as a permanent
// action with γG,set = 1.2 in a linear analysis (Annex A1, A1.3.1(4),
// recalled from memory), 1.0 in 6.12b and the serviceability
// combinations, and temperature as a variable action with the ψ of Table
// A1.1's temperature row, 0.6, 0.5 and 0.
func TestSettlementAndTemperature(t *testing.T) {
	t.Run("asce7-16-strength", func(t *testing.T) {
		sameList(t, generateSet(t, "asce7-16-strength", Params{}, "D dead", "L live", "Sd settlement", "T temperature"),
			"1.4D+1.0Sd+1.0T", "1.2D+1.6L+1.0Sd+1.0T")
		// T never leads: without D or L nothing is generated.
		s, _ := Standard("asce7-16-strength")
		cs, info := cases(t, "Sd settlement", "T temperature")
		if got, err := s.Generate(cs, info, Params{}); err != nil || len(got) != 0 {
			t.Errorf("T alone: %v, %v", got, err)
		}
	})
	t.Run("asce7-16-allowable", func(t *testing.T) {
		sameList(t, generateSet(t, "asce7-16-allowable", Params{}, "D dead", "W wind", "T temperature"),
			"1.0D+1.0T", "1.0D+0.6W+1.0T", "1.0D+0.45W+1.0T", "0.6D+0.6W+1.0T")
	})
	t.Run("en1990-6.10", func(t *testing.T) {
		// 1.35G + 1.2Sd; (1.35 or 1.0)G + 1.5T (leading) + 1.2Sd; and with
		// Q leading T accompanies at 1.5 × 0.6 = 0.9 (and Q at 1.5 × 0.7
		// = 1.05 when T leads).
		sameList(t, generateSet(t, "en1990-6.10", Params{}, "G dead", "Q live category=B", "Sd settlement", "T temperature"),
			"1.35G+1.2Sd",
			"1.35G+1.5Q+0.9T+1.2Sd", "1.35G+1.5T+1.05Q+1.2Sd",
			"1.0G+1.5Q+0.9T+1.2Sd", "1.0G+1.5T+1.05Q+1.2Sd")
	})
	t.Run("en1990-quasi-permanent", func(t *testing.T) {
		// ψ2 = 0 for temperature: it drops out; the settlement stays at 1.0.
		sameList(t, generateSet(t, "en1990-quasi-permanent", Params{}, "G dead", "Q live category=B", "Sd settlement", "T temperature"),
			"1.0G+0.3Q+1.0Sd")
	})
	t.Run("the temperature row by default", func(t *testing.T) {
		var ci CaseInfo
		if ci.Row(Temperature) != "temperature" || ci.Row(Wind) != "wind" || ci.Row(Other) != "" {
			t.Errorf("rows %q, %q, %q", ci.Row(Temperature), ci.Row(Wind), ci.Row(Other))
		}
		if v, ok := ci.PsiFactor(Psi1, Temperature); !ok || v != 0.5 {
			t.Errorf("ψ1 of temperature %g, %v; want 0.5 (Table A1.1)", v, ok)
		}
	})
	t.Run("grouping", func(t *testing.T) {
		cs, info := cases(t, "S1 settlement", "S2 settlement", "T1 temperature", "T2 temperature")
		a, err := GroupActions(cs, info)
		if err != nil {
			t.Fatal(err)
		}
		// Settlement: one action, its cases together (each acts only where
		// adverse); temperature: one action, each case an alternative
		// (a rise or a fall, never both).
		if len(a.List) != 2 || len(a.List[0].Alternatives) != 1 || len(a.List[1].Alternatives) != 2 {
			t.Errorf("actions %+v", a.List)
		}
		if !strings.Contains(a.Note, "temperature cases T1, T2 as alternatives") || !strings.Contains(a.Note, "settlement cases S1, S2 as one action") {
			t.Errorf("note %q", a.Note)
		}
	})
}

// EN 1990 6.10 (Table A1.2(B)): the combination names the leading
// variable action's cases in Lead, which EN 1991-1-1 6.3.1.2(11) needs (αn
// only where the imposed load leads); the accompanying ones are not in it.
func TestEN1990LeadIsNamed(t *testing.T) {
	s, err := Standard("en1990-6.10")
	if err != nil {
		t.Fatal(err)
	}
	cs, info := cases(t, "G dead", "Q live category=B", "W wind")
	got, err := s.Generate(cs, info, Params{})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string][]int{
		"1.35G": {0}, "1.35G+1.5Q+0.9W": {1}, "1.35G+1.5W+1.05Q": {2}, "1.35G-1.5W+1.05Q": {2},
		"1.0G+1.5Q+0.9W": {1}, "1.0G+1.5W+1.05Q": {2}, "1.0G-1.5W+1.05Q": {2}, "1.35G+1.5Q-0.9W": {1}, "1.0G+1.5Q-0.9W": {1},
	}
	for _, cb := range got {
		name := Compact(cb.Terms, cs)
		w, ok := want[name]
		if !ok {
			t.Errorf("unexpected combination %s", name)
			continue
		}
		if !slices.Equal(cb.Lead, w) {
			t.Errorf("%s: Lead = %v, want %v", name, cb.Lead, w)
		}
	}
}
