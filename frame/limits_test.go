package frame

import (
	"errors"
	"fmt"
	"testing"
	"unsafe"
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
			// (the hub is numbered next to the last foot). A band matrix is
			// 12,003 × 12,002 values, 8 bytes each: 1.07 GiB. The solution,
			// with its factor and the 12,000 members' elements, twice for the
			// collector's growth, 2.16 GiB; the solve's nine band matrices'
			// worth, 9.66 GiB; the pivot watch's block, 12,001² values,
			// 1.07 GiB; the members' pencils for the critical load factors,
			// 3,624 bytes each (see TestMemoryEstimateArithmetic), 41 MiB;
			// and 14 MiB of the runtime's own: 12.9 GiB.
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
			want: "the model is too large: solving needs about 12.9 GiB of memory (12,003 equations, half-bandwidth 12,001, 0 load cases); the limit is 2.0 GiB",
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

// The estimate's arithmetic on a model small enough to count by hand,
// against the formula documented beside memory (limits.go): a cantilever
// fixed at one end, its free end's 3 equations coupled (half-bandwidth 2),
// one load case with one member load.
func TestMemoryEstimateArithmetic(t *testing.T) {
	mo := cantilever(4, 200e6, 5e-3, 8e-5)
	mo.Cases[0].MemberLoads = []MemberLoad{{Member: 0, To: 4, W: 10, WEnd: 10}}
	// A band matrix: 3 × 3 values, 72 bytes. A solution: 3 × 1
	// displacements and 6 fixed-end forces, 72 bytes, the member's element
	// and its factor. The solve's 9 band matrices, 648 bytes, and the
	// pivot watch's 2 × 2 block, 32 bytes; the member's pencil: on a 64-bit
	// machine its struct, 152 bytes, room for 48 entries of Kg, 16 bytes
	// each, and its element, 688 bytes (pencilBytes, checked below), and
	// its numbers: with no release it has 2 (SubElements − 1) = 6 degrees
	// of freedom of its own (v, θ of three inner nodes), so 6² + 12·6 = 108
	// values of its own block inverted, own rows and their product, and
	// (6 + 6)² = 144 of K, 252 values, 2,016 bytes; 14 MiB of the
	// runtime's own.
	const matrix = 72.0
	solution := 72 + elementBytes + matrix
	rest := 9*matrix + 32 + pencilBytes + 2016 + 14<<20
	if unsafe.Sizeof(uintptr(0)) == 8 && pencilBytes != 152+48*16+688 {
		t.Errorf("a pencil's struct, Kg's room and element take %.0f bytes, want 152 + 768 + 688 = 1,608", pencilBytes)
	}
	for _, tc := range []struct {
		name string
		opt  Options
		want float64
	}{
		{"the solver alone, the heap grown to twice", Options{}, 2*solution + rest},
		{"two solutions, 1000 bytes a member, the heap grown by half, 5000 added", Options{PerMember: 1000, Solutions: 2, Growth: 1.5,
			Held: func(info Info) float64 {
				if info != (Info{Equations: 3, Bandwidth: 2, Columns: 1}) {
					t.Errorf("Held asked for %+v, want 3 equations, half-bandwidth 2, 1 column", info)
				}
				return 5000
			}}, 1.5*(2*solution+1000) + 5000 + rest},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, info, err := EstimateMemory(mo, tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			if info != (Info{Equations: 3, Bandwidth: 2, Columns: 1}) {
				t.Fatalf("info %+v, want 3 equations, half-bandwidth 2, 1 column", info)
			}
			if got != tc.want {
				t.Errorf("estimate %.0f bytes, want %.0f", got, tc.want)
			}
		})
	}
}
