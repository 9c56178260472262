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
