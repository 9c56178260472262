package analysis

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"

	"govern/envelope"
	"govern/patterns"
)

// ErrNothingPatterned is returned by ComparePatterns for a job without
// patterned cases.
var ErrNothingPatterned = errors.New("no case has pattern = true: there is nothing to compare")

// Shortfall is how far the code arrangements fall short of exact placement
// for one member at its worst station, as the member is shown (Shown).
type Shortfall struct {
	Member  int
	Effect  int  // 0 N, 1 V, 2 M
	Max     bool // the maximum (else the minimum) falls short
	X       float64
	Exact   float64
	Code    float64
	Percent float64 // of the member's largest |exact| value of that effect; 0 for none
	// Pieces lists the pieces loaded by one placement and not the other,
	// the most influential first: "+name" loaded by exact placement only,
	// "-name" by the code arrangement only, then "(+n with less influence)".
	Pieces []string
}

// ComparePatterns analyses job with exact placement of its patterned cases
// and with the code arrangements (patterns.Exact and patterns.Code, every
// loaded piece listed) and returns, member by member, the largest shortfall
// of the code envelope: over M and V for a beam, over N, V and M for any
// other member.
func ComparePatterns(ctx context.Context, job *Job, opt Options) ([]Shortfall, error) {
	if len(job.Patterned) == 0 {
		return nil, ErrNothingPatterned
	}
	opt.allPieces = true
	exact, code := patterns.Exact, patterns.Code
	opt.placement = &exact
	ex, err := Run(ctx, job, opt)
	if err != nil {
		return nil, err
	}
	opt.placement = &code
	cd, err := Run(ctx, job, opt)
	if err != nil {
		return nil, err
	}
	out := make([]Shortfall, 0, len(ex.Envelope.Members))
	for m := range ex.Envelope.Members {
		out = append(out, worstShortfall(ex, cd, m))
	}
	return out, nil
}

// worstShortfall finds member m's largest shortfall of code against exact.
func worstShortfall(ex, code *Result, m int) Shortfall {
	mo := ex.Job.Model
	best := Shortfall{Member: m}
	// As the tables show it: a beam from its left end, +M sagging.
	em, cm := ex.Shown(m), code.Shown(m)
	local := func(x float64) float64 { // x along the member as entered
		if Flipped(mo, m) {
			return mo.Length(m) - x
		}
		return x
	}
	for j := range 3 {
		if j == 0 && mo.IsBeam(m) {
			continue // a beam's axial force is rarely what governs it
		}
		peak := 0.0
		for _, st := range em.Stations {
			e := effectOf(st, j)
			peak = math.Max(peak, math.Max(math.Abs(e.Max), math.Abs(e.Min)))
		}
		if peak == 0 {
			continue
		}
		for i, st := range em.Stations {
			e, c := effectOf(st, j), effectOf(cm.Stations[i], j)
			for _, side := range []struct {
				max         bool
				gap         float64
				exact, code float64
				es, cs      []int
			}{
				{true, e.Max - c.Max, e.Max, c.Max, e.MaxSpans, c.MaxSpans},
				{false, c.Min - e.Min, e.Min, c.Min, e.MinSpans, c.MinSpans},
			} {
				pct := 100 * side.gap / peak
				if pct > best.Percent+1e-9 {
					best = Shortfall{Member: m, Effect: j, Max: side.max, X: st.X, Exact: side.exact, Code: side.code, Percent: pct,
						Pieces: difference(ex, m, local(st.X), j, side.es, side.cs)}
				}
			}
		}
	}
	return best
}

func effectOf(st envelope.Station, j int) envelope.Extreme {
	return [3]envelope.Extreme{st.N, st.V, st.M}[j]
}

// difference lists the pieces loaded by one placement and not the other,
// the most influential first (by their own effect j at the station), up to
// six, leaving out those with under 5% of the largest one's influence.
func difference(ex *Result, m int, x float64, j int, exact, code []int) []string {
	column := map[int]int{}
	for _, p := range ex.lay.Patterned {
		for _, u := range p.Units {
			column[u.Pieces[0]] = u.Column
		}
	}
	type item struct {
		name string
		v    float64
	}
	var items []item
	for _, p := range exact {
		if !slices.Contains(code, p) {
			f := ex.sol.At(column[p], m, x)
			items = append(items, item{"+" + ex.Envelope.Pieces[p].Name, math.Abs([3]float64{f.N, f.V, f.M}[j])})
		}
	}
	for _, p := range code {
		if !slices.Contains(exact, p) {
			f := ex.sol.At(column[p], m, x)
			items = append(items, item{"-" + ex.Envelope.Pieces[p].Name, math.Abs([3]float64{f.N, f.V, f.M}[j])})
		}
	}
	sort.SliceStable(items, func(a, b int) bool { return items[a].v > items[b].v })
	var out []string
	for i, it := range items {
		if i == 6 || it.v < 0.05*items[0].v {
			if rest := len(items) - i; rest > 0 {
				out = append(out, fmt.Sprintf("(+%d with less influence)", rest))
			}
			break
		}
		out = append(out, it.name)
	}
	return out
}
