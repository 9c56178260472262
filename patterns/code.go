package patterns

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"govern/frame"
)

// Arrangement is a set of pieces loaded together, all others off.
type Arrangement struct {
	Name   string
	Pieces []int // indices into the pieces it was built from, ascending
}

// Span is a beam's place in the frame: its level, counted from 1 at the
// lowest beam height, its chain of beams joined end to end on that level,
// and its span number along the chain, from 1 at the left.
type Span struct {
	Level, Chain, Number int
}

// heightTol is the relative tolerance under which two beams are at one height.
const heightTol = 1e-9

// Spans numbers every beam of mo by level, chain and span. Members that are
// not beams are absent from the map.
func Spans(mo *frame.Model) map[int]Span {
	type beam struct {
		m      int
		y, x0  float64
		lo, hi int // left and right nodes
	}
	var beams []beam
	for m, mem := range mo.Members {
		if !mo.IsBeam(m) {
			continue
		}
		a, b := mem.Start, mem.End
		if mo.Nodes[b].X < mo.Nodes[a].X {
			a, b = b, a
		}
		beams = append(beams, beam{m: m, y: mo.Nodes[a].Y, x0: mo.Nodes[a].X, lo: a, hi: b})
	}
	sort.SliceStable(beams, func(i, j int) bool {
		if beams[i].y != beams[j].y {
			return beams[i].y < beams[j].y
		}
		return beams[i].x0 < beams[j].x0
	})
	out := map[int]Span{}
	level, chain, num := 0, 0, 0
	scale := 1.0
	for _, n := range mo.Nodes {
		scale = math.Max(scale, math.Abs(n.Y))
	}
	for i, b := range beams {
		switch {
		case i == 0 || b.y-beams[i-1].y > heightTol*scale:
			level, chain, num = level+1, 1, 1
		case b.lo != beams[i-1].hi:
			chain, num = chain+1, 1
		default:
			num++
		}
		out[b.m] = Span{Level: level, Chain: chain, Number: num}
	}
	return out
}

// Arrangements returns the arrangements of pieces that the concrete design standards
// describe for pattern live load (ACI 318-19 section 6.4; EN 1992-1-1
// section 5.1.3): every piece on; for each level (each chain of beams joined
// end to end, when a level has more than one) all its spans alone, its odd
// spans alone, its even spans alone and each pair of adjacent spans alone;
// and two checkerboards over the whole frame, the spans whose span number
// plus level number is even and those where it is odd. Each arrangement
// loads every segment of its spans. Empty and repeated sets are dropped,
// the first name kept.
func Arrangements(mo *frame.Model, pieces []Piece) []Arrangement {
	spans := Spans(mo)
	var out []Arrangement
	seen := map[string]bool{}
	add := func(name string, keep func(Span) bool) {
		var set []int
		for i, p := range pieces {
			if sp, ok := spans[p.Member]; ok && keep(sp) {
				set = append(set, i)
			}
		}
		if len(set) == 0 {
			return
		}
		key := fmt.Sprint(set)
		if seen[key] {
			return
		}
		seen[key] = true
		out = append(out, Arrangement{Name: name, Pieces: set})
	}
	add("all spans", func(Span) bool { return true })
	// Levels and chains that carry pieces, in order.
	type chainKey struct{ level, chain int }
	var chains []chainKey
	count := map[chainKey]int{}
	perLevel := map[int]int{}
	for _, sp := range spans {
		k := chainKey{sp.Level, sp.Chain}
		if count[k] == 0 {
			chains = append(chains, k)
		}
		count[k] = max(count[k], sp.Number)
		perLevel[sp.Level] = max(perLevel[sp.Level], sp.Chain)
	}
	slices.SortFunc(chains, func(a, b chainKey) int {
		if a.level != b.level {
			return a.level - b.level
		}
		return a.chain - b.chain
	})
	for _, k := range chains {
		label := fmt.Sprintf("level %d", k.level)
		if perLevel[k.level] > 1 {
			label += fmt.Sprintf(" chain %d", k.chain)
		}
		on := func(sp Span) bool { return sp.Level == k.level && sp.Chain == k.chain }
		add(label+" all spans", on)
		add(label+" odd spans", func(sp Span) bool { return on(sp) && sp.Number%2 == 1 })
		add(label+" even spans", func(sp Span) bool { return on(sp) && sp.Number%2 == 0 })
		for i := 1; i < count[k]; i++ {
			add(fmt.Sprintf("%s spans %d and %d", label, i, i+1), func(sp Span) bool { return on(sp) && (sp.Number == i || sp.Number == i+1) })
		}
	}
	add("checkerboard, span + level even", func(sp Span) bool { return (sp.Number+sp.Level)%2 == 0 })
	add("checkerboard, span + level odd", func(sp Span) bool { return (sp.Number+sp.Level)%2 == 1 })
	return out
}

// Describe lists the piece names of an arrangement.
func (a *Arrangement) Describe(pieces []Piece) string {
	names := make([]string, len(a.Pieces))
	for i, p := range a.Pieces {
		names[i] = pieces[p].Name
	}
	return strings.Join(names, " ")
}
