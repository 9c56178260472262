package frame

import "sync"

// lastOrder is the node order of the last model numbered: a second-order
// iteration solves the same frame, member for member, again and again
// (with other sections and axial forces), and the reverse Cuthill–McKee
// order depends only on how many nodes there are and which nodes each
// member joins.
var lastOrder struct {
	sync.Mutex
	nodes int
	ends  [][2]int
	order []int
}

// nodeOrder returns rcmOrder(adjacency(mo)): the last order found when
// mo's members join the same nodes as those of the model it was found
// for, else found anew (and kept). The slice is shared: do not modify it.
func nodeOrder(mo *Model) []int {
	lastOrder.Lock()
	defer lastOrder.Unlock()
	if lastOrder.order != nil && lastOrder.nodes == len(mo.Nodes) && len(lastOrder.ends) == len(mo.Members) {
		same := true
		for m, e := range lastOrder.ends {
			if mem := &mo.Members[m]; mem.Start != e[0] || mem.End != e[1] {
				same = false
				break
			}
		}
		if same {
			return lastOrder.order
		}
	}
	order := rcmOrder(adjacency(mo))
	ends := make([][2]int, len(mo.Members))
	for m, mem := range mo.Members {
		ends[m] = [2]int{mem.Start, mem.End}
	}
	lastOrder.nodes, lastOrder.ends, lastOrder.order = len(mo.Nodes), ends, order
	return order
}
