package frame

import "testing"

// written gives n zeros, its length and capacity n, of any type, as make
// does.
func TestWrittenZeros(t *testing.T) {
	for _, n := range []int{0, 1, 5000, 1 << 17} {
		f := written[float64](n)
		if len(f) != n || cap(f) != n {
			t.Errorf("n = %d: len %d, cap %d", n, len(f), cap(f))
		}
		for i, v := range f {
			if v != 0 {
				t.Fatalf("n = %d: [%d] = %g, want 0", n, i, v)
			}
		}
		s := written[[]int32](n)
		for i, v := range s {
			if v != nil {
				t.Fatalf("n = %d: slice [%d] not nil", n, i)
			}
		}
	}
}
