package frame

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// gridFrame returns a regular frame of bays × storeys with its nodes listed
// in a shuffled order, so that only the renumbering can make the band narrow.
func gridFrame(bays, storeys int, seed uint64) *Model {
	rng := rand.New(rand.NewPCG(seed, 0))
	n := (bays + 1) * (storeys + 1)
	perm := rng.Perm(n)
	mo := &Model{Sections: []Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}}}
	mo.Nodes = make([]Node, n)
	id := func(line, level int) int { return perm[level*(bays+1)+line] }
	for lv := 0; lv <= storeys; lv++ {
		for ln := 0; ln <= bays; ln++ {
			s := Free
			if lv == 0 {
				s = Fixed
			}
			mo.Nodes[id(ln, lv)] = Node{Name: fmt.Sprintf("%d-%d", ln, lv), X: 6 * float64(ln), Y: 3.5 * float64(lv), Support: s}
		}
	}
	for lv := 1; lv <= storeys; lv++ {
		for ln := 0; ln <= bays; ln++ {
			mo.Members = append(mo.Members, Member{Name: fmt.Sprintf("c%d-%d", ln, lv), Start: id(ln, lv-1), End: id(ln, lv)})
		}
		for ln := 1; ln <= bays; ln++ {
			mo.Members = append(mo.Members, Member{Name: fmt.Sprintf("b%d-%d", ln, lv), Start: id(ln-1, lv), End: id(ln, lv)})
		}
	}
	return mo
}

func TestReverseCuthillMcKeeKeepsTheBandNarrow(t *testing.T) {
	for _, size := range []struct{ bays, storeys int }{{3, 3}, {10, 10}, {30, 8}} {
		t.Run(fmt.Sprintf("%dx%d shuffled", size.bays, size.storeys), func(t *testing.T) {
			mo := gridFrame(size.bays, size.storeys, 7)
			order := rcmOrder(adjacency(mo))
			if len(order) != len(mo.Nodes) {
				t.Fatalf("order has %d nodes, want %d", len(order), len(mo.Nodes))
			}
			seen := make([]bool, len(order))
			for _, v := range order {
				if seen[v] {
					t.Fatalf("node %d ordered twice", v)
				}
				seen[v] = true
			}
			// A grid numbered along its shorter side has a half-bandwidth of
			// about 3 × (nodes across + 1); allow one more node of slack.
			across := min(size.bays, size.storeys) + 1
			_, _, band := dofMap(mo, order, releasedRotations(mo))
			if limit := 3 * (across + 2); band > limit {
				t.Errorf("half-bandwidth %d, want at most %d", band, limit)
			}
			var identity []int
			for i := range mo.Nodes {
				identity = append(identity, i)
			}
			_, _, naive := dofMap(mo, identity, releasedRotations(mo))
			t.Logf("half-bandwidth %d after RCM, %d in the shuffled order", band, naive)
		})
	}
}
