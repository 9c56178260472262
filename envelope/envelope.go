package envelope

import (
	"errors"
	"fmt"
	"math"

	"govern/combos"
	"govern/frame"
)

// Extreme is the largest and smallest value of one force over all
// combinations, with the index of the combination that gives each.
type Extreme struct {
	Max   float64
	MaxBy int
	Min   float64
	MinBy int
}

// empty returns an Extreme that any value replaces.
func empty() Extreme {
	return Extreme{Max: math.Inf(-1), MaxBy: -1, Min: math.Inf(1), MinBy: -1}
}

// add folds the range [lo, hi] that combination k gives into e. Ties keep the
// earlier combination.
func (e *Extreme) add(lo, hi float64, k int) {
	if hi > e.Max {
		e.Max, e.MaxBy = hi, k
	}
	if lo < e.Min {
		e.Min, e.MinBy = lo, k
	}
}

// Station holds the envelopes at one point of a member.
type Station struct {
	X       float64 // distance from the start node
	N, V, M Extreme
}

// Member holds the stations of one member, sorted by X.
type Member struct {
	Member   int // index into the model's members
	Stations []Station
}

// Reaction holds the envelopes of the reaction at one supported node.
// Components the support does not restrain are zero.
type Reaction struct {
	Node      int // index into the model's nodes
	Fx, Fy, M Extreme
}

// Settings control how envelopes are formed.
type Settings struct {
	// Stations is the number of equally spaced stations per member, both
	// ends included; at least 2.
	Stations int
	// AsWritten makes every case of a combination act with its factor
	// everywhere, instead of variable cases acting only where adverse.
	AsWritten bool
}

// Envelope is the result of [Compute].
type Envelope struct {
	Settings     Settings
	Combinations []combos.Combination
	Members      []Member
	Reactions    []Reaction
}

// ErrNoCombinations is returned when there is nothing to envelope.
var ErrNoCombinations = errors.New("envelope: no load combinations")

// Compute forms the envelopes of every member and support of the solved
// model over the combinations cs.
func Compute(sol *frame.Solution, cs []combos.Combination, set Settings) (*Envelope, error) {
	if len(cs) == 0 {
		return nil, ErrNoCombinations
	}
	if set.Stations < 2 {
		return nil, fmt.Errorf("envelope: %d stations per member; need at least 2", set.Stations)
	}
	mo := sol.Model()
	for _, cb := range cs {
		for _, t := range cb.Terms {
			if t.Case < 0 || t.Case >= len(mo.Cases) {
				return nil, fmt.Errorf("envelope: combination %q refers to case %d of %d", cb.Name, t.Case, len(mo.Cases))
			}
		}
	}
	variable := make([]bool, len(mo.Cases))
	for c := range mo.Cases {
		variable[c] = !set.AsWritten && mo.Cases[c].Variable()
	}
	env := &Envelope{Settings: set, Combinations: cs}
	nc := len(mo.Cases)
	per := make([][3]float64, nc)
	env.Members = make([]Member, len(mo.Members))
	for m := range mo.Members {
		l := mo.Length(m)
		st := make([]Station, set.Stations)
		for i := range st {
			x := l * float64(i) / float64(set.Stations-1)
			if i == set.Stations-1 {
				x = l // exactly the end, whatever the rounding
			}
			for c := range nc {
				f := sol.At(c, m, x)
				per[c] = [3]float64{f.N, f.V, f.M}
			}
			e := [3]Extreme{empty(), empty(), empty()}
			fold(&e, cs, variable, per)
			st[i] = Station{X: x, N: e[0], V: e[1], M: e[2]}
		}
		env.Members[m] = Member{Member: m, Stations: st}
	}
	for v, nd := range mo.Nodes {
		if nd.Support == frame.Free {
			continue
		}
		for c := range nc {
			fx, fy, mz := sol.Reaction(c, v)
			per[c] = [3]float64{fx, fy, mz}
		}
		e := [3]Extreme{empty(), empty(), empty()}
		fold(&e, cs, variable, per)
		env.Reactions = append(env.Reactions, Reaction{Node: v, Fx: e[0], Fy: e[1], M: e[2]})
	}
	return env, nil
}

// fold adds to e the range of each of three effects that every combination
// gives, per[c] being case c's unfactored effects. A variable case counts
// towards the maximum only where its factored effect is positive and
// towards the minimum only where it is negative.
func fold(e *[3]Extreme, cs []combos.Combination, variable []bool, per [][3]float64) {
	for k := range cs {
		var lo, hi [3]float64
		for _, t := range cs[k].Terms {
			for j := range 3 {
				v := t.Factor * per[t.Case][j]
				switch {
				case !variable[t.Case]:
					lo[j] += v
					hi[j] += v
				case v > 0:
					hi[j] += v
				default:
					lo[j] += v
				}
			}
		}
		for j := range 3 {
			e[j].add(lo[j], hi[j], k)
		}
	}
}
