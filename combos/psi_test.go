package combos

import (
	"testing"
)

func TestCategoriesFollowTableA1_1(t *testing.T) {
	// EN 1990:2002 Annex A1, Table A1.1, recommended values of ψ factors
	// for buildings (recalled from memory; wind ψ0 = 0.6, snow up to
	// 1000 m ψ0 = 0.5 and category H ψ0 = 0 agree with "Steel Buildings in
	// Europe", Part 3: Actions, section 3.2).
	want := map[string][3]float64{
		"A": {0.7, 0.5, 0.3}, "B": {0.7, 0.5, 0.3}, "C": {0.7, 0.7, 0.6}, "D": {0.7, 0.7, 0.6},
		"E": {1.0, 0.9, 0.8}, "F": {0.7, 0.7, 0.6}, "G": {0.7, 0.5, 0.3}, "H": {0, 0, 0},
		"snow-nordic": {0.7, 0.5, 0.2}, "snow-above-1000m": {0.7, 0.5, 0.2}, "snow-up-to-1000m": {0.5, 0.2, 0},
		"wind": {0.6, 0.2, 0}, "temperature": {0.6, 0.5, 0},
	}
	cats := Categories()
	if len(cats) != len(want) {
		t.Fatalf("%d categories, want the %d rows of Table A1.1", len(cats), len(want))
	}
	for _, c := range cats {
		t.Run(c.Name, func(t *testing.T) {
			if w, ok := want[c.Name]; !ok || c.Psi != w {
				t.Errorf("ψ = %v, want %v (%s)", c.Psi, w, c.Row)
			}
		})
	}
	t.Run("rows fit their kinds", func(t *testing.T) {
		b, _ := LookupCategory("B")
		s, _ := LookupCategory("snow-up-to-1000m")
		if !b.Fits(Live) || b.Fits(Snow) || !s.Fits(Snow) || s.Fits(Live) {
			t.Error("category B must fit live loads only and snow rows snow only")
		}
		if _, ok := LookupCategory("b"); ok {
			t.Error("category names are case-sensitive")
		}
	})
}

func TestPsiFactor(t *testing.T) {
	for _, tc := range []struct {
		name string
		ci   CaseInfo
		kind Kind
		p    Psi
		want float64
		ok   bool
	}{
		// Table A1.1, category B office areas: ψ0 0.7, ψ1 0.5, ψ2 0.3 (recalled from memory).
		{"from the category", CaseInfo{Category: "B"}, Live, Psi1, 0.5, true},
		{"given beats category", CaseInfo{Category: "B", Psi: [3]float64{0.6, 0, 0}, PsiGiven: [3]bool{true}}, Live, Psi0, 0.6, true},
		{"given beats category only where given", CaseInfo{Category: "B", Psi: [3]float64{0.6, 0, 0}, PsiGiven: [3]bool{true}}, Live, Psi2, 0.3, true},
		// Table A1.1, wind loads on buildings: ψ0 0.6.
		{"wind without category takes the wind row", CaseInfo{}, Wind, Psi0, 0.6, true},
		{"live without category has none", CaseInfo{}, Live, Psi0, 0, false},
		{"given zero is a value", CaseInfo{PsiGiven: [3]bool{false, false, true}}, Rain, Psi2, 0, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, ok := tc.ci.PsiFactor(tc.p, tc.kind)
			if got != tc.want || ok != tc.ok {
				t.Errorf("PsiFactor = %v, %v; want %v, %v", got, ok, tc.want, tc.ok)
			}
		})
	}
}
