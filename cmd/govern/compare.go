package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"sort"
	"strings"

	"govern/cmd/govern/modelfile"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// errNothingPatterned is returned by --compare-patterns on a model without
// patterned cases.
var errNothingPatterned = errors.New("no case has pattern = true: there is nothing to compare")

// shortfall is how far the code arrangements fall short of exact placement
// for one member at its worst station.
type shortfall struct {
	member      int
	effect      int  // 0 N, 1 V, 2 M
	max         bool // the maximum (else the minimum) falls short
	x           float64
	exact, code float64
	percent     float64 // of the member's largest |exact| value of that effect
	pieces      []string
}

// comparePatterns analyses the job with exact and with code placement and
// reports, member by member, the largest shortfall of the code envelope.
func comparePatterns(w io.Writer, job *modelfile.Job, opt frame.Options) error {
	if len(job.Patterned) == 0 {
		return errNothingPatterned
	}
	set := job.Settings
	set.AllSpans = true
	j2 := *job
	j2.Settings = set
	ex, err := analyseWith(&j2, patterns.Exact, nil, opt)
	if err != nil {
		return err
	}
	code, err := analyseWith(&j2, patterns.Code, nil, opt)
	if err != nil {
		return err
	}
	rows := make([]shortfall, 0, len(ex.env.Members))
	for m := range ex.env.Members {
		rows = append(rows, worstShortfall(ex, code, m))
	}
	u := job.Units
	fmt.Fprintf(w, "How far the code arrangements (ACI 318-19 6.4, EN 1992-1-1 5.1.3) fall short of exact placement\n")
	fmt.Fprintf(w, "at each member's worst station. Shortfall is in percent of the member's largest |value| of that\n")
	fmt.Fprintf(w, "effect (M and V for beams; N, V and M for columns); + marks a piece loaded by exact placement\n")
	fmt.Fprintf(w, "only, - one loaded by the code arrangement only. x from the left end of a beam (+M sagging),\n")
	fmt.Fprintf(w, "from the start node of a column.\n\n")
	t := newTable(w, "member", "effect", "extreme", "at x ("+u.Length+")", "exact", "code", "shortfall (%)", "pieces that make the difference")
	var out [][]string
	for _, r := range rows {
		name := job.Model.Members[r.member].Name
		if r.percent == 0 {
			out = append(out, []string{name, "-", "-", "-", "-", "-", fixed(0), "none"})
			continue
		}
		unit := u.Force
		if r.effect == 2 {
			unit = u.Moment()
		}
		side := "min"
		if r.max {
			side = "max"
		}
		out = append(out, []string{name, fmt.Sprintf("%s (%s)", memberForces[r.effect], unit), side, fixed(r.x), fixed(r.exact), fixed(r.code), fixed(r.percent), strings.Join(r.pieces, " ")})
	}
	if err := t.Bulk(out); err != nil {
		return err
	}
	return t.Render()
}

// worstShortfall finds member m's largest shortfall of code against exact:
// over M and V for a beam, over N, V and M for any other member.
func worstShortfall(ex, code *analysis, m int) shortfall {
	best := shortfall{member: m}
	// As the tables show it: a beam from its left end, +M sagging.
	em, cm := ex.shown(m), code.shown(m)
	local := func(x float64) float64 { // x along the member as entered
		if flipped(ex.job.Model, m) {
			return ex.job.Model.Length(m) - x
		}
		return x
	}
	for j := range 3 {
		if j == 0 && ex.job.Model.IsBeam(m) {
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
				if pct > best.percent+1e-9 {
					best = shortfall{member: m, effect: j, max: side.max, x: st.X, exact: side.exact, code: side.code, percent: pct,
						pieces: difference(ex, m, local(st.X), j, side.es, side.cs)}
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
func difference(ex *analysis, m int, x float64, j int, exact, code []int) []string {
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
			items = append(items, item{"+" + ex.env.Pieces[p].Name, math.Abs([3]float64{f.N, f.V, f.M}[j])})
		}
	}
	for _, p := range code {
		if !slices.Contains(exact, p) {
			f := ex.sol.At(column[p], m, x)
			items = append(items, item{"-" + ex.env.Pieces[p].Name, math.Abs([3]float64{f.N, f.V, f.M}[j])})
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
