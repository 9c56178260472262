package frame

import (
	"errors"
	"fmt"
	"testing"
)

func TestModelsPastTheLimitsAreRefused(t *testing.T) {
	for _, tc := range []struct {
		name  string
		model func() *Model
		want  string
	}{
		{
			// 333,334 free nodes of three degrees of freedom each; refused
			// from the node count alone, before members are even looked at.
			name: "more than a million degrees of freedom",
			model: func() *Model {
				return &Model{Nodes: make([]Node, MaxEquations/3+1)}
			},
			want: "the model is too large: 1,000,002 free degrees of freedom (333,334 nodes); the limit is 1,000,000",
		},
		{
			// A star: one hub joined to 12,000 pinned feet. Every foot's
			// rotation couples to the hub, so reverse Cuthill–McKee cannot
			// narrow the band: 12,003 equations and a half-bandwidth of 12,001
			// (the hub is numbered next to the last foot); band, factor and
			// diagnosis copy, 3 × 12,003 × 12,002 values, and the pivot
			// watch's block, 12,001², × 8 bytes = 4.29 GiB, and 6 MiB
			// of the runtime's own: 4.3 GiB.
			name: "a stiffness band past the memory limit",
			model: func() *Model {
				const feet = 12000
				mo := &Model{Sections: []Section{{Name: "S", E: 1, A: 1, I: 1}}}
				mo.Nodes = append(mo.Nodes, Node{Name: "hub"})
				for i := range feet {
					mo.Nodes = append(mo.Nodes, Node{Name: fmt.Sprint("f", i), X: float64(i%100) - 50, Y: -1 - float64(i/100), Support: Pinned})
					mo.Members = append(mo.Members, Member{Name: fmt.Sprint("m", i), Start: 0, End: i + 1})
				}
				return mo
			},
			want: "the model is too large: solving needs about 4.3 GiB of memory (12,003 equations, half-bandwidth 12,001, 0 load cases); the limit is 2.0 GiB",
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Solve(tc.model())
			if !errors.Is(err, ErrTooLarge) {
				t.Fatalf("err = %v, want ErrTooLarge", err)
			}
			if err.Error() != tc.want {
				t.Errorf("error\n got: %s\nwant: %s", err, tc.want)
			}
		})
	}
}

func TestThousands(t *testing.T) {
	for n, want := range map[int]string{0: "0", 999: "999", 1000: "1,000", -1234567: "-1,234,567", 1000000: "1,000,000"} {
		if got := thousands(n); got != want {
			t.Errorf("thousands(%d) = %q, want %q", n, got, want)
		}
	}
}
