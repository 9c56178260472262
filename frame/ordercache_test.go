package frame

import (
	"slices"
	"sync"
	"testing"
)

// nodeOrder gives the order rcmOrder finds for the model in hand, never
// one kept from another: the same frame again (kept), with other
// sections (kept), with a member joining other nodes, with a node more,
// and frames numbered from two goroutines at once.
func TestNodeOrderIsTheModelsOwn(t *testing.T) {
	a := gridFrame(5, 4, 3)
	b := gridFrame(5, 4, 3)
	b.Sections[0].I *= 2
	c := gridFrame(5, 4, 3)
	c.Members[7].End, c.Members[7].Start = c.Members[7].Start, c.Members[9].End
	d := gridFrame(5, 4, 3)
	d.Nodes = append(d.Nodes, Node{Name: "extra", X: 100, Support: Fixed})
	lastOrder.Lock()
	lastOrder.order = nil // none kept from another test
	lastOrder.Unlock()
	for _, tc := range []struct {
		name string
		mo   *Model
		kept bool
	}{{"frame", a, false}, {"again", a, true}, {"other sections", b, true}, {"a member moved", c, false}, {"a node more", d, false}, {"the first again", a, false}} {
		t.Run(tc.name, func(t *testing.T) {
			before := lastOrder.order
			got := nodeOrder(tc.mo)
			if want := rcmOrder(adjacency(tc.mo)); !slices.Equal(got, want) {
				t.Fatalf("order %v, rcmOrder %v", got, want)
			}
			if kept := before != nil && &got[0] == &before[0]; kept != tc.kept {
				t.Errorf("kept %v, want %v", kept, tc.kept)
			}
		})
	}
	t.Run("two goroutines", func(t *testing.T) {
		var wg sync.WaitGroup
		for _, mo := range []*Model{a, c, d, a, c, d} {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for range 20 {
					if got, want := nodeOrder(mo), rcmOrder(adjacency(mo)); !slices.Equal(got, want) {
						t.Errorf("order %v, rcmOrder %v", got, want)
						return
					}
				}
			}()
		}
		wg.Wait()
	})
}
