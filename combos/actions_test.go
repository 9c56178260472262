package combos

import (
	"errors"
	"slices"
	"strings"
	"testing"
)

// describe writes the actions as "name(kind): alt1 | alt2", an
// alternative as its cases joined by "+", reversible ones marked "±".
func describe(a *Actions, cs []string) string {
	var out []string
	for _, act := range a.List {
		var alts []string
		for _, alt := range act.Alternatives {
			var names []string
			for _, c := range alt.Cases {
				names = append(names, strings.Fields(cs[c])[0])
			}
			s := alt.Name + "=" + strings.Join(names, "+")
			if alt.Reversible {
				s += "±"
			}
			alts = append(alts, s)
		}
		out = append(out, act.Name+"("+act.Kind.String()+"): "+strings.Join(alts, " | "))
	}
	return strings.Join(out, "; ")
}

func TestGroupActionsByDefault(t *testing.T) {
	// The default rule: live, roof-live and snow cases one
	// action each, acting together (EN 1991-1-1 6.1: the imposed load is a
	// single action; drift and sliding surcharges are superimposed on the
	// balanced snow load, common practice); wind and seismic one action,
	// each case an alternative; dead as one action; each rain and other
	// case an action of its own.
	specs := []string{"G1 dead", "L1 live", "WL wind", "G2 dead", "L2 live", "WR wind reversible",
		"Lr roof-live", "S1 snow", "S2 snow", "EX seismic reversible", "EY seismic", "R1 rain", "R2 rain", "T1 other", "T2 other"}
	cs, info := cases(t, specs...)
	a, err := GroupActions(cs, info)
	if err != nil {
		t.Fatal(err)
	}
	want := "dead(dead): dead=G1+G2; live(live): live=L1+L2; wind(wind): WL=WL | WR=WR±; " +
		"roof-live(roof-live): roof-live=Lr; snow(snow): snow=S1+S2; seismic(seismic): EX=EX± | EY=EY; " +
		"R1(rain): R1=R1; R2(rain): R2=R2; T1(other): T1=T1; T2(other): T2=T2"
	if got := describe(a, specs); got != want {
		t.Errorf("got  %s\nwant %s", got, want)
	}
	for _, act := range a.List {
		if !act.Default {
			t.Errorf("action %s not marked default", act.Name)
		}
	}
	for i, p := range a.Of {
		if !slices.Contains(a.List[p.Action].Alternatives[p.Alternative].Cases, i) {
			t.Errorf("case %d placed in %+v, which does not hold it", i, p)
		}
	}
	wantNote := "cases read by the default rule: wind cases WL, WR as alternatives of one action, one at a time; " +
		"seismic cases EX, EY as alternatives of one action, one at a time; snow cases S1, S2 as one action, all acting together. " +
		"To group them otherwise give action, alternative or with (docs/combinations.md)."
	if a.Note != wantNote {
		t.Errorf("note\n got %s\nwant %s", a.Note, wantNote)
	}
	t.Run("no note with one case of a kind, or with keys", func(t *testing.T) {
		for _, specs := range [][]string{
			{"G dead", "W wind", "S snow", "L1 live", "L2 live"},
			{"G dead", "WL wind alternative=left", "WR wind"},
			{"G dead", "WL wind", "WR wind with=WL", "S1 snow action=snow", "S2 snow"},
		} {
			cs, info := cases(t, specs...)
			a, err := GroupActions(cs, info)
			if err != nil {
				t.Fatal(err)
			}
			if a.Note != "" {
				t.Errorf("%v: note %q", specs, a.Note)
			}
		}
	})
}

func TestGroupActionsKeys(t *testing.T) {
	for _, tc := range []struct {
		name  string
		specs []string
		want  string
	}{
		{"with joins a case to another's alternative",
			[]string{"Ww wind", "Wr wind with=Ww", "Lw wind", "Lr wind with=Lw"},
			"wind(wind): Ww=Ww+Wr | Lw=Lw+Lr"},
		{"with chains are followed, whatever the order",
			[]string{"A wind with=B", "B wind with=C", "C wind", "D wind"},
			"wind(wind): C=A+B+C | D=D"},
		{"reversible on one case makes its alternative reversible",
			[]string{"Ww wind", "Wr wind with=Ww reversible", "X wind"},
			"wind(wind): Ww=Ww+Wr± | X=X"},
		{"named alternatives",
			[]string{"WLw wind alternative=left", "WLr wind alternative=left", "WRw wind alternative=right", "WRr wind alternative=right"},
			"wind(wind): left=WLw+WLr | right=WRw+WRr"},
		{"live cases with alternatives",
			[]string{"L1 live alternative=a", "L2 live alternative=b", "L3 live"},
			"live(live): a=L1 | b=L2 | live=L3"},
		{"balanced or unbalanced snow, with a drift on the balanced load",
			[]string{"Sb snow alternative=balanced", "Sd snow with=Sb", "Su snow alternative=unbalanced"},
			"snow(snow): balanced=Sb+Sd | unbalanced=Su"},
		{"named actions of one kind",
			[]string{"Q1 live action=office", "Q2 live action=storage", "Q3 live action=office"},
			"office(live): office=Q1+Q3; storage(live): storage=Q2"},
		{"an alternative of other cases joins the kind's action",
			[]string{"T1 other alternative=summer", "T2 other alternative=winter", "T3 other"},
			"other(other): summer=T1 | winter=T2; T3(other): T3=T3"},
		{"action named like a kind's default action joins it",
			[]string{"W1 wind action=wind", "W2 wind"},
			"wind(wind): W1=W1 | W2=W2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			cs, info := cases(t, tc.specs...)
			a, err := GroupActions(cs, info)
			if err != nil {
				t.Fatal(err)
			}
			if got := describe(a, tc.specs); got != tc.want {
				t.Errorf("got  %s\nwant %s", got, tc.want)
			}
		})
	}
}

func TestGroupActionsErrors(t *testing.T) {
	for _, tc := range []struct {
		name  string
		specs []string
		at    int
		key   string
		msg   string
	}{
		{"with names no case", []string{"W wind with=X"}, 0, "with", `with = "X": no such case`},
		{"with names the case itself", []string{"W wind with=W"}, 0, "with", `with = "W" names the case itself`},
		{"with names a case of another kind", []string{"S snow", "W wind with=S"}, 1, "with",
			`with = "S": case "S" is snow load and case "W" is wind load; with joins cases of one kind`},
		{"with beside alternative", []string{"A wind", "B wind with=A alternative=x"}, 1, "with",
			`with = "A": give with, or action and alternative, not both`},
		{"a ring of with", []string{"G dead", "A wind with=B", "B wind with=A"}, 1, "with",
			`with: cases "A" and "B" name each other in a ring; one of them must give no with`},
		{"dead with an alternative", []string{"G dead alternative=x"}, 0, "alternative",
			"alternative: dead load is permanent and always acts in full"},
		{"an action of two kinds", []string{"L live action=Q", "S snow action=Q"}, 1, "action",
			`action = "Q": case "L" is in this action too and is live load, case "S" is snow load; the cases of one action are of one kind`},
		{"an action named like another kind's default action", []string{"W wind", "L live action=wind"}, 1, "action",
			`action = "wind": case "W" is in this action too and is wind load, case "L" is live load; the cases of one action are of one kind (the wind cases without action are in action "wind")`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			cs, info := cases(t, tc.specs...)
			_, err := GroupActions(cs, info)
			var ce CaseErrors
			if !errors.As(err, &ce) || len(ce) != 1 {
				t.Fatalf("error %v, want one", err)
			}
			if ce[0].Case != tc.at || ce[0].Key != tc.key || !strings.Contains(ce[0].Msg, tc.msg) {
				t.Errorf("case %d key %q: %s\nwant case %d key %q: %s", ce[0].Case, ce[0].Key, ce[0].Msg, tc.at, tc.key, tc.msg)
			}
			// Generate reports the same.
			s, _ := Standard("asce7-16-strength")
			if _, err := s.Generate(cs, info, Params{}); !errors.As(err, &ce) {
				t.Errorf("Generate: %v", err)
			}
		})
	}
}

// together reports whether some combination has factors other than 0 on
// both cases a and b (by name), and the first such combination.
func together(cbs []Combination, cs []string, a, b string) (string, bool) {
	idx := func(n string) int {
		for i, s := range cs {
			if strings.Fields(s)[0] == n {
				return i
			}
		}
		panic("no case " + n)
	}
	ia, ib := idx(a), idx(b)
	for _, cb := range cbs {
		if cb.Factor(ia) != 0 && cb.Factor(ib) != 0 {
			return cb.Name, true
		}
	}
	return "", false
}

// windModel is the wind portal's model: D; L (category B); Lr (category H); S
// (snow, site up to 1000 m); wind from the left WL and from the right WR,
// two cases of kind wind.
var windModel = []string{"D dead", "L live category=B", "Lr roof-live category=H", "S snow category=snow-up-to-1000m", "WL wind", "WR wind"}

func TestActionsNeverCombineAlternatives(t *testing.T) {
	// EN 1990 6.1(1)P and 6.1(2), and Annex A1 A1.2.1(1): effects of
	// actions that cannot occur together for physical or functional
	// reasons are not considered together in combinations (wording
	// recalled from memory). Wind from the left and from the right are
	// such actions: no set gives a combination holding both.
	for _, name := range Standards() {
		t.Run(name, func(t *testing.T) {
			s, _ := Standard(name)
			cs, info := cases(t, windModel...)
			cbs, err := s.Generate(cs, info, Params{})
			if err != nil {
				t.Fatal(err)
			}
			if n, ok := together(cbs, windModel, "WL", "WR"); ok {
				t.Errorf("%s holds both WL and WR", n)
			}
			// and each alternative is used: the service sets with ψ2 = 0
			// for wind (Table A1.1) leave wind out of 6.16b altogether.
			if name == "en1990-quasi-permanent" {
				return
			}
			for _, w := range []int{4, 5} {
				found := false
				for _, cb := range cbs {
					found = found || cb.Factor(w) != 0
				}
				if !found {
					t.Errorf("no combination with %s", cs[w].Name)
				}
			}
		})
	}
}

func TestActionsCounts(t *testing.T) {
	// The wind portal's model against ASCE/SEI 7-16 sections 2.3.1 and 2.4.1 and
	// EN 1990 Annex A1 (expressions 6.10, 6.10a/b, 6.14b, 6.15b, 6.16b):
	// the same counts as one reversible wind case W, the two directions
	// taking the places of +W and -W. Hand count for the strength set:
	// 1 (1.4D) + 2 (1.6L with 0.5Lr or 0.5S) + 6 (1.6Lr or 1.6S, each with
	// L, 0.5WL or 0.5WR) + 4 (WL or WR, each with 0.5Lr or 0.5S) + 2
	// (0.9D with WL or WR) = 15.
	reversible := []string{"D dead", "L live category=B", "Lr roof-live category=H", "S snow category=snow-up-to-1000m", "W wind reversible"}
	for _, tc := range []struct {
		set  string
		want int
	}{
		{"asce7-16-strength", 15},
		{"asce7-16-allowable", 14},
		{"en1990-6.10", 17},
		{"en1990-6.10ab", 20},
		{"en1990-characteristic", 9},
		{"en1990-frequent", 5},
		{"en1990-quasi-permanent", 1},
	} {
		t.Run(tc.set, func(t *testing.T) {
			got := generateSet(t, tc.set, Params{}, windModel...)
			if len(got) != tc.want {
				t.Errorf("%d combinations, want %d:\n  %s", len(got), tc.want, strings.Join(got, "\n  "))
			}
			if old := generateSet(t, tc.set, Params{}, reversible...); len(old) != tc.want {
				t.Errorf("one reversible W: %d combinations, want %d", len(old), tc.want)
			}
		})
	}
	t.Run("asce7-16-strength by name", func(t *testing.T) {
		// ASCE/SEI 7-16 section 2.3.1, combinations 1-5, in rule order.
		sameList(t, generateSet(t, "asce7-16-strength", Params{}, windModel...),
			"1.4D",                              // (1)
			"1.2D+1.6L+0.5Lr", "1.2D+1.6L+0.5S", // (2)
			"1.2D+1.6Lr+1.0L", "1.2D+1.6Lr+0.5WL", "1.2D+1.6Lr+0.5WR", // (3)
			"1.2D+1.6S+1.0L", "1.2D+1.6S+0.5WL", "1.2D+1.6S+0.5WR",
			"1.2D+1.0WL+1.0L+0.5Lr", "1.2D+1.0WL+1.0L+0.5S", // (4), the readable name's example first
			"1.2D+1.0WR+1.0L+0.5Lr", "1.2D+1.0WR+1.0L+0.5S",
			"0.9D+1.0WL", "0.9D+1.0WR", // (5)
		)
	})
}

func TestActionsLeadInTurn(t *testing.T) {
	// EN 1990 6.4.3.2 (expression 6.10): one leading variable action, the
	// others accompanying with ψ0. Wind leads as one action, from the
	// left or from the right; two live cases are one action (EN 1991-1-1
	// 6.1) and lead together; two other cases are two actions, each
	// leading in turn.
	got := generateSet(t, "en1990-6.10", Params{}, "G dead", "Q1 live category=B", "Q2 live category=B", "WL wind", "WR wind", "T1 other category=temperature", "T2 other category=temperature")
	for _, want := range []string{
		"1.35G+1.5WL+1.05Q1+1.05Q2+0.9T1+0.9T2", // wind from the left leading: Q at 1.5 × 0.7, T at 1.5 × 0.6
		"1.35G+1.5WR+1.05Q1+1.05Q2+0.9T1+0.9T2", // from the right
		"1.35G+1.5Q1+1.5Q2+0.9WL+0.9T1+0.9T2",   // the imposed load leading as one action, wind at 1.5 × 0.6
		"1.35G+1.5Q1+1.5Q2+0.9WR+0.9T1+0.9T2",
		"1.35G+1.5T1+1.05Q1+1.05Q2+0.9WL+0.9T2", // T1 leading, T2 accompanying
		"1.35G+1.5T2+1.05Q1+1.05Q2+0.9WL+0.9T1",
	} {
		if !slices.Contains(got, want) {
			t.Errorf("missing %s in\n  %s", want, strings.Join(got, "\n  "))
		}
	}
	for _, c := range got {
		if strings.Contains(c, "1.5Q1+1.05Q2") || strings.Contains(c, "1.5Q2") && !strings.Contains(c, "1.5Q1") {
			t.Errorf("%s: the live cases do not lead apart", c)
		}
	}
	// 1.35G alone, then for γG = 1.35 and 1.00 each of four leading
	// actions (Q, W, T1, T2) with both wind alternatives: 1 + 2 × 4 × 2.
	if len(got) != 17 {
		t.Errorf("%d combinations, want 17", len(got))
	}
}

func TestActionsLiveAlternatives(t *testing.T) {
	// Two live cases with different alternatives never act together (EN
	// 1990 A1.2.1(1), recalled from memory); without, they act together
	// as one action, as before (ASCE/SEI 7-16 2.3.1: L is the live load).
	apart := []string{"D dead", "L1 live category=B alternative=a", "L2 live category=B alternative=b", "W wind"}
	joint := []string{"D dead", "L1 live category=B", "L2 live category=B", "W wind"}
	for _, name := range Standards() {
		t.Run(name, func(t *testing.T) {
			s, _ := Standard(name)
			cs, info := cases(t, apart...)
			cbs, err := s.Generate(cs, info, Params{})
			if err != nil {
				t.Fatal(err)
			}
			if n, ok := together(cbs, apart, "L1", "L2"); ok {
				t.Errorf("%s holds both L1 and L2", n)
			}
			cs, info = cases(t, joint...)
			cbs, err = s.Generate(cs, info, Params{})
			if err != nil {
				t.Fatal(err)
			}
			if _, ok := together(cbs, joint, "L1", "L2"); !ok {
				t.Errorf("L1 and L2 never together")
			}
			for _, cb := range cbs {
				if (cb.Factor(1) == 0) != (cb.Factor(2) == 0) {
					t.Errorf("%s has one live case without the other", cb.Name)
				}
			}
		})
	}
	t.Run("asce7-16-strength 2.3.1 (2)", func(t *testing.T) {
		sameList(t, generateSet(t, "asce7-16-strength", Params{}, "D dead", "L1 live alternative=a", "L2 live alternative=b"),
			"1.4D", "1.2D+1.6L1", "1.2D+1.6L2")
		sameList(t, generateSet(t, "asce7-16-strength", Params{}, "D dead", "L1 live", "L2 live"),
			"1.4D", "1.2D+1.6L1+1.6L2")
	})
}

func TestActionsWithReversible(t *testing.T) {
	// Windward wall pressure Ww and roof suction Wr of one direction,
	// joined with with, reversible: two sign patterns, both cases + or
	// both -, never mixed (ASCE/SEI 7-16 2.3.1 (5) 0.9D + 1.0W).
	got := generateSet(t, "asce7-16-strength", Params{}, "D dead", "Ww wind reversible", "Wr wind with=Ww")
	sameList(t, got, "1.4D", "1.2D+1.0Ww+1.0Wr", "1.2D-1.0Ww-1.0Wr", "0.9D+1.0Ww+1.0Wr", "0.9D-1.0Ww-1.0Wr")
	t.Run("two directions, each reversible", func(t *testing.T) {
		got := generateSet(t, "asce7-16-strength", Params{}, "D dead",
			"WLw wind reversible", "WLr wind with=WLw", "WRw wind reversible", "WRr wind with=WRw")
		sameList(t, got, "1.4D",
			"1.2D+1.0WLw+1.0WLr", "1.2D-1.0WLw-1.0WLr", "1.2D+1.0WRw+1.0WRr", "1.2D-1.0WRw-1.0WRr",
			"0.9D+1.0WLw+1.0WLr", "0.9D-1.0WLw-1.0WLr", "0.9D+1.0WRw+1.0WRr", "0.9D-1.0WRw-1.0WRr")
	})
	t.Run("two actions, each reversible, give every pattern", func(t *testing.T) {
		// Different actions keep the rule of docs/combinations.md: every
		// sign pattern, all + first.
		got := generateSet(t, "asce7-16-strength", Params{}, "D dead", "W wind reversible", "E seismic reversible")
		for _, want := range []string{"1.2D+1.0W", "1.2D-1.0W", "1.2D+1.0E", "1.2D-1.0E", "0.9D+1.0E", "0.9D-1.0E"} {
			if !slices.Contains(got, want) {
				t.Errorf("missing %s", want)
			}
		}
	})
}

func TestActionsClash(t *testing.T) {
	cs, info := cases(t, windModel...)
	a, err := GroupActions(cs, info)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name   string
		terms  []Term
		c1, c2 int
		clash  bool
	}{
		{"both directions", []Term{{Case: 0, Factor: 1.2}, {Case: 4, Factor: 1}, {Case: 5, Factor: 1}}, 4, 5, true},
		{"one direction", []Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}, {Case: 4, Factor: 1}}, 0, 0, false},
		{"a zero factor is not acting", []Term{{Case: 0, Factor: 1.2}, {Case: 4, Factor: 1}, {Case: 5, Factor: 0}}, 0, 0, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c1, c2, ok := a.Clash(&Combination{Terms: tc.terms})
			if ok != tc.clash || c1 != tc.c1 || c2 != tc.c2 {
				t.Errorf("Clash = %d, %d, %v", c1, c2, ok)
			}
		})
	}
}

func TestJoinedSets(t *testing.T) {
	// Cases joined explicitly (with, or two or more sharing an explicit
	// alternative) are parts of one load and are listed as a set; cases put
	// together only by the default rule of their kind, such as the live
	// loads of several floors, are not, since loading part of the
	// structure may be worse (ASCE/SEI 7-16 section 4.3.3, partial
	// loading; EN 1991-1-1 section 6.2.1(1), imposed loads placed for the
	// most unfavourable effect).
	for _, tc := range []struct {
		name   string
		specs  []string
		joined string // sets, "+" within, "; " between
		groups []int
	}{
		{"with joins a wall pressure and a roof suction of each direction",
			[]string{"G dead", "WL wind", "WLr wind with=WL", "WR wind", "WRr wind with=WR"},
			"WL+WLr; WR+WRr", []int{-1, 0, 0, 1, 1}},
		{"wind directions by default: each alone",
			[]string{"G dead", "WL wind", "WR wind"}, "", nil},
		{"live cases by default act together, each on its own where adverse",
			[]string{"G dead", "L1 live", "L2 live"}, "", nil},
		{"with inside the live action: only the cases it joins",
			[]string{"L1 live", "L2 live", "L2p live with=L2"},
			"L2+L2p", []int{-1, 0, 0}},
		{"a named alternative of two cases is one set, the rest of the kind alone",
			[]string{"L1 live alternative=a", "L3 live", "L2 live alternative=a"},
			"L1+L2", []int{0, -1, 0}},
		{"a named alternative of one case joins nothing",
			[]string{"T1 other alternative=summer", "T2 other alternative=winter"}, "", nil},
		{"a named action alone joins nothing: its live cases act together by default",
			[]string{"Q1 live action=office", "Q3 live action=office"}, "", nil},
		{"with into a named alternative joins the whole alternative",
			[]string{"Sb snow alternative=balanced", "Sd snow with=Sb", "Su snow alternative=unbalanced", "Sx snow alternative=balanced"},
			"Sb+Sd+Sx", []int{0, 0, -1, 0}},
		{"chains of with, whatever the order",
			[]string{"A wind with=B", "B wind with=C", "C wind", "D wind"},
			"A+B+C", []int{0, 0, 0, -1}},
		{"with on rain cases, each an action of its own by default",
			[]string{"R1 rain", "R2 rain with=R1", "R3 rain"},
			"R1+R2", []int{0, 0, -1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			cs, info := cases(t, tc.specs...)
			a, err := GroupActions(cs, info)
			if err != nil {
				t.Fatal(err)
			}
			var sets []string
			for _, act := range a.List {
				for _, alt := range act.Alternatives {
					for _, set := range alt.Joined {
						var names []string
						for _, c := range set {
							names = append(names, cs[c].Name)
						}
						sets = append(sets, strings.Join(names, "+"))
					}
				}
			}
			if got := strings.Join(sets, "; "); got != tc.joined {
				t.Errorf("joined %q, want %q", got, tc.joined)
			}
			if got := a.Groups(); !slices.Equal(got, tc.groups) || (got == nil) != (tc.groups == nil) {
				t.Errorf("groups %v, want %v", got, tc.groups)
			}
		})
	}
}
