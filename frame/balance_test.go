package frame

import (
	"fmt"
	"math"
	"testing"
)

func TestBalanceOfAPortal(t *testing.T) {
	// A pinned-base portal with a UDL w on the beam and a horizontal load H at
	// the left corner. By statics (closed form) the loads reduce at the origin
	// to Fx = H, Fy = -wL and M = -wL·L/2 - H·h, and the reactions must be the
	// opposite.
	const l, h, w, hx = 8.0, 4.0, 12.0, 30.0
	mo := portal(Pinned, l, h, 2e-3, 1e-3)
	for i := range mo.Sections {
		mo.Sections[i].A = 0.1 // a real area: the resultants do not depend on it
	}
	mo.Cases = []Case{{Name: "D+W", MemberLoads: []MemberLoad{{Member: 1, To: l, W: w, WEnd: w}},
		NodeLoads: []NodeLoad{{Node: 1, Fx: hx}}}}
	sol := solve(t, mo)
	b := sol.Balance(0)
	want := Resultant{Fx: hx, Fy: -w * l, M: -w*l*l/2 - hx*h}
	for _, q := range []struct {
		name      string
		got, want float64
	}{
		{"applied Fx", b.Applied.Fx, want.Fx},
		{"applied Fy", b.Applied.Fy, want.Fy},
		{"applied M", b.Applied.M, want.M},
		{"reactions Fx", b.Reactions.Fx, -want.Fx},
		{"reactions Fy", b.Reactions.Fy, -want.Fy},
		{"reactions M", b.Reactions.M, -want.M},
		{"load size wL + H", b.Load, w*l + hx},
		{"length: diagonal of the frame", b.Length, math.Hypot(l, h)},
	} {
		if !near(q.got, q.want, tightTol) {
			t.Errorf("%s = %g, want %g", q.name, q.got, q.want)
		}
	}
	if r := b.Relative(); r > tightTol {
		t.Errorf("relative out of balance %g, want round-off", r)
	}
	if b.JointForce > tightTol*b.Load || b.JointMoment > tightTol*b.Load*b.Length {
		t.Errorf("joint residuals %g, %g", b.JointForce, b.JointMoment)
	}
	if got := sol.Residual(0); got != math.Max(b.JointForce, b.JointMoment) {
		t.Errorf("Residual = %g, want the larger of %g and %g", got, b.JointForce, b.JointMoment)
	}
}

func TestBalanceRelative(t *testing.T) {
	for _, tc := range []struct {
		name string
		b    Balance
		want float64
	}{
		{"exact balance", Balance{Applied: Resultant{1, 2, 3}, Reactions: Resultant{-1, -2, -3}, Load: 3, Length: 2}, 0},
		{"force out by 1e-3 of the load", Balance{Applied: Resultant{Fy: -10}, Reactions: Resultant{Fy: 10.01}, Load: 10, Length: 5}, 1e-3},
		{"moment out, scaled by load times length", Balance{Applied: Resultant{M: -50}, Reactions: Resultant{M: 50.5}, Load: 10, Length: 5}, 1e-2},
		{"joint residual counts", Balance{JointForce: 2e-6, Load: 1, Length: 1}, 2e-6},
		{"joint moment residual counts", Balance{JointMoment: 4e-6, Load: 1, Length: 2}, 2e-6},
		{"unloaded and balanced", Balance{}, 0},
		{"unloaded yet out of balance", Balance{JointForce: 1e-9}, math.Inf(1)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.b.Relative(); !near(got, tc.want, 1e-9) && got != tc.want {
				t.Errorf("Relative = %g, want %g", got, tc.want)
			}
		})
	}
}

func TestLoadSize(t *testing.T) {
	// The integral of |w| for a load changing sign is the sum of two
	// triangles (closed form): w from -1 to 3 over 4 crosses zero at 1,
	// giving 1/2 + 9/2 = 5.
	if got := absIntegral(-1, 3, 4); !near(got, 5, tightTol) {
		t.Errorf("absIntegral(-1, 3, 4) = %g, want 5", got)
	}
	if got := absIntegral(2, 4, 3); !near(got, 9, tightTol) {
		t.Errorf("absIntegral(2, 4, 3) = %g, want 9", got)
	}
	mo := continuous(2, 5, 0, []int{})
	mo.Cases[0].MemberLoads = []MemberLoad{
		{Member: 0, From: 1, To: 3, W: 2, WEnd: 2},
		{Member: 1, Point: true, At: 2, P: -7},
	}
	mo.Cases[0].NodeLoads = []NodeLoad{{Node: 1, Fx: 3, Fy: 4, M: 20}}
	// 2·2 + 7 + 5 + 20/10 (the frame is 10 long).
	if got := loadSize(mo, 0, extent(mo)); !near(got, 18, tightTol) {
		t.Errorf("loadSize = %g, want 18", got)
	}
}

func TestBalanceFarFromTheOrigin(t *testing.T) {
	// The portal of TestBalanceOfAPortal placed with its lower left corner
	// at (1e12, 1e12): statics does not depend on where the frame stands,
	// so moments taken about the corner of the frame give the closed form
	// M = -wL·L/2 - H·h, and the check balances to round-off. Taken about
	// the global origin they would be sums of terms near 1e13·wL, whose
	// round-off alone (about 1e-3) is far above the 1e-6 statics limit.
	const l, h, w, hx = 8.0, 4.0, 12.0, 30.0
	for _, at := range [][2]float64{{1e12, 0}, {0, 1e12}, {-1e12, 1e12}} {
		t.Run(fmt.Sprintf("corner at (%g, %g)", at[0], at[1]), func(t *testing.T) {
			mo := portal(Pinned, l, h, 2e-3, 1e-3)
			for i := range mo.Sections {
				mo.Sections[i].A = 0.1
			}
			for i := range mo.Nodes {
				mo.Nodes[i].X += at[0]
				mo.Nodes[i].Y += at[1]
			}
			mo.Cases = []Case{{Name: "D+W", MemberLoads: []MemberLoad{{Member: 1, To: l, W: w, WEnd: w}},
				NodeLoads: []NodeLoad{{Node: 1, Fx: hx}}}}
			sol, err := Solve(mo)
			if err != nil {
				t.Fatal(err)
			}
			b := sol.Balance(0)
			if r := b.Relative(); !(r <= tightTol) {
				t.Errorf("relative out of balance %g, want round-off", r)
			}
			if !near(b.Applied.M, -w*l*l/2-hx*h, tightTol) || !near(b.Reactions.M, w*l*l/2+hx*h, tightTol) {
				t.Errorf("moments of loads %g and of reactions %g about the corner, want ∓%g", b.Applied.M, b.Reactions.M, w*l*l/2+hx*h)
			}
			if b.X0 != at[0] || b.Y0 != at[1] {
				t.Errorf("moments taken about (%g, %g), want the lower left corner (%g, %g)", b.X0, b.Y0, at[0], at[1])
			}
		})
	}
}

// BalanceSums gives BalanceOf's check and leaves in u the displacements
// summed over the cases, as DisplacementSums gives them and as the sums
// of Displacement over the cases in their order, to the bit: on a frame
// with every kind of load and a settlement, each case alone, several
// together and none.
func TestBalanceSumsIsBalanceOfAndTheSums(t *testing.T) {
	mo := columnsFrame()
	sol := solve(t, mo)
	all := make([]int, len(mo.Cases))
	for c := range all {
		all[c] = c
	}
	sets := [][]int{nil, all, {len(all) - 1, 0}}
	for c := range all {
		sets = append(sets, []int{c})
	}
	for _, cs := range sets {
		u := make([]float64, 3*len(mo.Nodes))
		for i := range u {
			u[i] = 7 // overwritten
		}
		got := sol.BalanceSums(u, cs)
		if want := sol.BalanceOf(cs); got != want {
			t.Errorf("cases %v: BalanceSums %+v, BalanceOf %+v", cs, got, want)
		}
		sums := make([]float64, len(u))
		sol.DisplacementSums(sums, cs)
		for v := range mo.Nodes {
			var direct [3]float64 // the sum of Displacement over cs, in order
			for _, c := range cs {
				ux, uy, rz := sol.Displacement(c, v)
				if sol.RotationFree(v) {
					rz = 0
				}
				direct[0], direct[1], direct[2] = direct[0]+ux, direct[1]+uy, direct[2]+rz
			}
			for d := range 3 {
				i := 3*v + d
				if math.Float64bits(u[i]) != math.Float64bits(sums[i]) || (!sol.RotationFree(v) || d < 2) && u[i] != direct[d] {
					t.Fatalf("cases %v, node %d, direction %d: %v, DisplacementSums %v, summed directly %v", cs, v, d, u[i], sums[i], direct[d])
				}
			}
		}
	}
}

// BenchmarkBalanceOf measures the statics check of every case of a
// regular frame with one load case per beam, acting together, as a
// patterned case is checked through the sum of its pieces: most of it is
// the sums of the displacements over the cases (rowSums).
func BenchmarkBalanceOf(b *testing.B) {
	mo := pieceFrame(30, 60)
	sol, err := Solve(mo)
	if err != nil {
		b.Fatal(err)
	}
	all := make([]int, len(mo.Cases))
	for c := range all {
		all[c] = c
	}
	b.Run(fmt.Sprintf("30x60/%d-cases", len(all)), func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sol.BalanceOf(all)
		}
	})
}
