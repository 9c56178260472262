package frame

import "testing"

// TestIsColumnPlumbTolerance: a member counts as a column out of plumb by
// at most PlumbTol (1/100: past the erection tolerances of the codes,
// such as h/500 to h/300, common practice), whichever way it is drawn;
// beyond that it is not one.
func TestIsColumnPlumbTolerance(t *testing.T) {
	for _, c := range []struct {
		name   string
		dx, dy float64
		column bool
	}{
		{"plumb", 0, 3, true},
		{"a millimetre out over 3 m", 0.001, 3, true},
		{"just within 1/100", 0.0299, 3, true},
		{"drawn top down, just within 1/100", -0.0299, -3, true},
		{"1/99 out", 3.0 / 99, 3, false},
		{"a brace at 60°", 1.732, 3, false},
		{"a beam", 6, 0, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			mo := &Model{Nodes: []Node{{Name: "a", X: 1, Y: 1}, {Name: "b", X: 1 + c.dx, Y: 1 + c.dy}}, Members: []Member{{Name: "m", Start: 0, End: 1}}}
			if got := mo.IsColumn(0); got != c.column {
				t.Errorf("IsColumn = %v, want %v", got, c.column)
			}
			want := 0
			if c.dy < 0 {
				want = 1
			}
			if got := mo.Bottom(0); got != want {
				t.Errorf("Bottom = %d, want %d", got, want)
			}
		})
	}
}

// BenchmarkValidate measures Model.Validate on a regular frame with one
// load case per beam, as pattern loading builds it (pieceFrame): a run
// validates its model several times.
func BenchmarkValidate(b *testing.B) {
	mo := pieceFrame(30, 60)
	b.ReportAllocs()
	for b.Loop() {
		if err := mo.Validate(); err != nil {
			b.Fatal(err)
		}
	}
}
