package combos

import (
	"testing"
)

func TestEachCase(t *testing.T) {
	cases := []Case{{Name: "D"}, {Name: "L", Kind: Live}}
	got := EachCase(cases)
	if len(got) != 2 || got[1].Name != "L" || got[1].Factor(1) != 1 || got[1].Factor(0) != 0 {
		t.Errorf("EachCase = %+v", got)
	}
}

func TestDescribe(t *testing.T) {
	cases := []Case{{Name: "D"}, {Name: "L"}, {Name: "W"}}
	for _, tc := range []struct {
		name  string
		terms []Term
		want  string
	}{
		{"factored sum", []Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}, "1.2D + 1.6L"},
		{"negative wind", []Term{{Case: 0, Factor: 0.9}, {Case: 2, Factor: -1}}, "0.9D - W"},
		{"leading negative", []Term{{Case: 2, Factor: -1}}, "-W"},
		{"a favourable factor", []Term{{Case: 0, Factor: 1.4, Favourable: 1, HasFavourable: true}, {Case: 1, Factor: 1.6}}, "1.4/1D + 1.6L"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			cb := Combination{Terms: tc.terms}
			if got := cb.Describe(cases); got != tc.want {
				t.Errorf("Describe = %q, want %q", got, tc.want)
			}
		})
	}
}
