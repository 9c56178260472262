package frame

import "sort"

// adjacency returns, for each node, the sorted distinct nodes joined to it
// by a member.
func adjacency(mo *Model) [][]int {
	adj := make([][]int, len(mo.Nodes))
	for _, m := range mo.Members {
		if m.Start == m.End {
			continue
		}
		adj[m.Start] = append(adj[m.Start], m.End)
		adj[m.End] = append(adj[m.End], m.Start)
	}
	for i, a := range adj {
		sort.Ints(a)
		out := a[:0]
		for j, v := range a {
			if j == 0 || v != a[j-1] {
				out = append(out, v)
			}
		}
		adj[i] = out
	}
	return adj
}

// rcmOrder returns the nodes in reverse Cuthill–McKee order: a breadth-first
// order from a pseudo-peripheral node, visiting neighbours by increasing
// degree, reversed. Numbering degrees of freedom in this order keeps the
// stiffness matrix's band narrow. Ties are broken by node index, so the order
// is deterministic.
func rcmOrder(adj [][]int) []int {
	n := len(adj)
	order := make([]int, 0, n)
	placed := make([]bool, n)
	level := make([]int, n)
	bfs := func(root int, visit func(int)) (last []int, depth int) {
		for i := range level {
			level[i] = -1
		}
		level[root] = 0
		queue := []int{root}
		for h := 0; h < len(queue); h++ {
			v := queue[h]
			if visit != nil {
				visit(v)
			}
			nb := append([]int(nil), adj[v]...)
			sort.SliceStable(nb, func(i, j int) bool { return len(adj[nb[i]]) < len(adj[nb[j]]) })
			for _, w := range nb {
				if level[w] < 0 {
					level[w] = level[v] + 1
					queue = append(queue, w)
				}
			}
		}
		depth = level[queue[len(queue)-1]]
		for _, v := range queue {
			if level[v] == depth {
				last = append(last, v)
			}
		}
		return last, depth
	}
	for start := range n {
		if placed[start] {
			continue
		}
		// Lowest-degree node of this component, then George–Liu search for a
		// pseudo-peripheral node.
		root := start
		bfs(start, func(v int) {
			if len(adj[v]) < len(adj[root]) {
				root = v
			}
		})
		last, depth := bfs(root, nil)
		for range n {
			cand := last[0]
			for _, v := range last {
				if len(adj[v]) < len(adj[cand]) {
					cand = v
				}
			}
			l2, d2 := bfs(cand, nil)
			if d2 <= depth {
				break
			}
			root, last, depth = cand, l2, d2
		}
		first := len(order)
		bfs(root, func(v int) {
			placed[v] = true
			order = append(order, v)
		})
		comp := order[first:]
		for i, j := 0, len(comp)-1; i < j; i, j = i+1, j-1 {
			comp[i], comp[j] = comp[j], comp[i]
		}
	}
	return order
}

// dofMap numbers the free degrees of freedom of mo node by node in the given
// order. dof[3*node+d] is the equation number of direction d at node, or -1
// where the support restrains it or, for a rotation, where released[node]
// says that nothing carries it (see releasedRotations). It returns the
// number of equations and the half-bandwidth (the largest distance of a
// nonzero from the diagonal).
func dofMap(mo *Model, order []int, released []bool) (dof []int, n, band int) {
	dof = make([]int, 3*len(mo.Nodes))
	for _, v := range order {
		for d := range 3 {
			if mo.Nodes[v].Support.Restrained(d) || d == 2 && released[v] {
				dof[3*v+d] = -1
				continue
			}
			dof[3*v+d] = n
			n++
		}
	}
	for _, m := range mo.Members {
		lo, hi := n, -1
		for _, v := range [2]int{m.Start, m.End} {
			for d := range 3 {
				if e := dof[3*v+d]; e >= 0 {
					lo, hi = min(lo, e), max(hi, e)
				}
			}
		}
		if hi >= lo {
			band = max(band, hi-lo)
		}
	}
	return dof, n, band
}
