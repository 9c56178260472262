package modelfile

import "testing"

func TestStarterSections(t *testing.T) {
	// A first depth of span/12 for continuous beams (common practice),
	// rounded up to 50 mm, at least 400 mm.
	for _, tc := range []struct {
		bays    []float64
		storeys int
		col     string
		beam    string
	}{
		{[]float64{7.2, 6, 7.2}, 4, "C500", "B400x600"},
		{[]float64{9.1}, 1, "C450", "B400x800"},
		{[]float64{10.2, 4}, 12, "C600", "B500x850"},
		{[]float64{3}, 60, "C1200", "B400x400"},
	} {
		s := Starter{Bays: tc.bays, Storeys: make([]float64, tc.storeys)}
		col, beam := starterSections(s)
		if col.name != tc.col || beam.name != tc.beam {
			t.Errorf("%v, %d storeys: %s %s, want %s %s", tc.bays, tc.storeys, col.name, beam.name, tc.col, tc.beam)
		}
	}
}

func TestUSStarterSections(t *testing.T) {
	// The same rules in inches from bays in ft: span/12 rounded up to 2 in,
	// at least 16 in, 20 in wide past 32 in; columns 16 in plus 2 in for
	// every three storeys, at most 48 in (common practice).
	for _, tc := range []struct {
		bays    []float64
		storeys int
		col     string
		beam    string
	}{
		{[]float64{24, 20, 24}, 4, "C20", "B16x24"},
		{[]float64{30}, 1, "C18", "B16x30"},
		{[]float64{35, 12}, 12, "C24", "B20x36"},
		{[]float64{10}, 60, "C48", "B16x16"},
	} {
		s := Starter{Units: StarterKipFt, Bays: tc.bays, Storeys: make([]float64, tc.storeys)}
		col, beam := usSections(s)
		if col.name != tc.col || beam.name != tc.beam {
			t.Errorf("%v, %d storeys: %s %s, want %s %s", tc.bays, tc.storeys, col.name, beam.name, tc.col, tc.beam)
		}
	}
}

func TestParseStarterUnits(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want StarterUnits
		ok   bool
	}{{"kN,m", StarterKNm, true}, {"N, mm", StarterNmm, true}, {"kip,ft", StarterKipFt, true}, {"kN,ft", 0, false}, {"", 0, false}} {
		if got, ok := ParseStarterUnits(tc.in); got != tc.want || ok != tc.ok {
			t.Errorf("%q: %v %v", tc.in, got, ok)
		}
	}
}
