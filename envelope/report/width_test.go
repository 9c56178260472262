package report

import (
	"slices"
	"strings"
	"testing"
)

// TestTablePartsKeepGroupsAndKeys: a table wider than the width is split
// between groups of columns, never inside one (a value, where it is and
// what governs it), each part led by the columns that name its rows; a
// table that fits, or a width of 0, is left whole.
func TestTablePartsKeepGroupsAndKeys(t *testing.T) {
	header := []string{"member", "value", "N (kN)", "at x (m)", "governing", "M1 (kN·m)", "M2 (kN·m)", "M2 at", "M1/M2", "curvature"}
	row := []string{"A0-A1", "N max", "-1.00", "0.00", strings.Repeat("c", 40), "1.00", "2.00", "A1", "-0.50", "single"}
	for _, c := range []struct {
		name  string
		width int
		want  [][]int
	}{
		{"whole", 0, [][]int{{0, 1, 2, 3, 4, 5, 6, 7, 8, 9}}},
		{"fits", 200, [][]int{{0, 1, 2, 3, 4, 5, 6, 7, 8, 9}}},
		// keys 0-1 (member, value); groups {2,3,4} and {5..9}.
		{"split", 100, [][]int{{0, 1, 2, 3, 4}, {0, 1, 5, 6, 7, 8, 9}}},
		// Narrower than any group: one group a part.
		{"narrow", 10, [][]int{{0, 1, 2, 3, 4}, {0, 1, 5, 6, 7, 8, 9}}},
	} {
		t.Run(c.name, func(t *testing.T) {
			got := tableParts(header, [][]string{row}, c.width)
			if len(got) != len(c.want) {
				t.Fatalf("parts %v, want %v", got, c.want)
			}
			for i := range got {
				if !slices.Equal(got[i], c.want[i]) {
					t.Errorf("part %d: %v, want %v", i, got[i], c.want[i])
				}
			}
		})
	}
}
