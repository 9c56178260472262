package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"govern/patterns"
)

// sagAt is one deflection of a span or cantilever and where it occurs.
type sagAt struct {
	v, x   float64 // the deflection (+ up) and where, from the run's left end
	by     int     // the combination; -1 for none
	member int     // the member and its station (as shown) where it is
	i      int
}

// runSag is the deflection of a span or cantilever over the service
// combinations, measured across its line (see run).
type runSag struct {
	down, up sagAt   // the smallest (most downward) and the largest deflection
	big      sagAt   // the one of larger size
	ratio    float64 // ratioLength / |big.v|; +Inf when it is zero
	ok       bool    // false when the run has no deflections
}

// deflectionRoundOff is the fraction of a span's largest deflection at or
// below which a deflection the other way is taken as round-off.
const deflectionRoundOff = 1e-9

// runDeflection returns the deflection of a.runs[i], false when there are
// no service combinations. Each run's is found once.
func (a *analysis) runDeflection(i int) (runSag, bool) {
	if a.sags == nil {
		a.sags = make([]runSag, len(a.runs))
		for k := range a.runs {
			a.sags[k] = a.findRunDeflection(&a.runs[k])
		}
	}
	return a.sags[i], a.sags[i].ok
}

// findRunDeflection finds the deflection of r over its stations.
func (a *analysis) findRunDeflection(r *run) runSag {
	mo := a.job.Model
	s := runSag{down: sagAt{v: math.Inf(1), by: -1}, up: sagAt{v: math.Inf(-1), by: -1}, big: sagAt{by: -1}}
	offset := 0.0
	for _, m := range r.members {
		em := a.shown(m)
		if em.LineDeflection == nil {
			return runSag{}
		}
		for i, d := range em.LineDeflection {
			x := offset + em.Stations[i].X
			if d.Min < s.down.v {
				s.down = sagAt{d.Min, x, d.MinBy, m, i}
			}
			if d.Max > s.up.v {
				s.up = sagAt{d.Max, x, d.MaxBy, m, i}
			}
		}
		offset += mo.Length(m)
	}
	// Round-off is no movement: a span that does not rise has no upward
	// deflection to show.
	size := math.Max(-s.down.v, s.up.v)
	if s.up.v <= deflectionRoundOff*size {
		s.up = sagAt{by: -1}
	}
	if -s.down.v <= deflectionRoundOff*size {
		s.down = sagAt{by: -1}
	}
	s.big = s.up
	if -s.down.v >= s.up.v {
		s.big = s.down
	}
	s.ratio = r.ratioLength() / math.Abs(s.big.v)
	s.ok = true
	return s
}

// ratio formats a span/deflection ratio as "L/412".
func ratio(r float64) string {
	if math.IsInf(r, 0) || math.IsNaN(r) {
		return "-"
	}
	return "L/" + strconv.FormatFloat(math.Floor(r), 'f', 0, 64)
}

// sig4 formats a small length such as a deflection to four significant
// figures, without an exponent.
func sig4(v float64) string {
	v = clean(v)
	if v == 0 {
		return "0"
	}
	d := 3 - int(math.Floor(math.Log10(math.Abs(v))))
	d = max(0, min(d, 12))
	return strconv.FormatFloat(v, 'f', d, 64)
}

// runName names a span or cantilever by its end nodes, left to right.
func (a *analysis) runName(r *run) string {
	return a.job.Model.Nodes[r.left].Name + "–" + a.job.Model.Nodes[r.right].Name
}

// runMembers lists the members of a run: all of up to three, else the
// first and the last and how many.
func (a *analysis) runMembers(r *run) string {
	mo := a.job.Model
	if len(r.members) <= 3 {
		names := make([]string, len(r.members))
		for i, m := range r.members {
			names[i] = mo.Members[m].Name
		}
		return strings.Join(names, " ")
	}
	return fmt.Sprintf("%s … %s (%d)", mo.Members[r.members[0]].Name, mo.Members[r.members[len(r.members)-1]].Name, len(r.members))
}

// deflectionTable gives, span by span and cantilever by cantilever, the
// largest downward and upward deflection over the service combinations and
// span/deflection.
func (a *analysis) deflectionTable(tb tables) error {
	if len(a.env.Service) == 0 || len(a.runs) == 0 {
		return nil
	}
	mo := a.job.Model
	u := a.job.Units
	spans := patterns.Spans(mo)
	var rows [][]string
	for i := range a.runs {
		r := &a.runs[i]
		s, ok := a.runDeflection(i)
		if !ok {
			continue
		}
		kind, level := "span", "-"
		if r.cantilever {
			kind = "cantilever"
		}
		if r.beam {
			level = strconv.Itoa(spans[r.members[0]].Level)
		}
		row := []string{a.runName(r), kind, a.runMembers(r), level, fixed(r.length)}
		// A span that never moves one way has nothing to show for it.
		if s.down.v < 0 {
			row = append(row, sig4(s.down.v), fixed(s.down.x), a.comboName(s.down.by))
		} else {
			row = append(row, "0", "-", "-")
		}
		if s.up.v > 0 {
			row = append(row, sig4(s.up.v), fixed(s.up.x), a.comboName(s.up.by))
		} else {
			row = append(row, "0", "-", "-")
		}
		rows = append(rows, append(row, ratio(s.ratio)))
	}
	l := u.Length
	title := fmt.Sprintf("Deflection of spans and cantilevers, service combinations (+ up, in %s; x from the left end): spans from the chord between their displaced ends, cantilevers from their displaced root", l)
	return tb.table(title, []string{"span", "kind", "members", "level", "length (" + l + ")", "down (" + l + ")", "at x", "governing", "up (" + l + ")", "at x", "governing", "span/deflection (cantilever: 2 × length)"}, rows)
}

// jsonSpans writes the spans and cantilevers with their deflections.
func (a *analysis) jsonSpans(j *jsonWriter, combo [][]byte) {
	mo := a.job.Model
	j.raw(",\n \"spans\": [")
	n := 0
	for i := range a.runs {
		r := &a.runs[i]
		s, ok := a.runDeflection(i)
		if !ok {
			continue
		}
		kind := "span"
		if r.cantilever {
			kind = "cantilever"
		}
		j.sep(n, ",").raw("\n  {\"kind\": ").str(kind).raw(", \"left\": ").str(mo.Nodes[r.left].Name).raw(", \"right\": ").str(mo.Nodes[r.right].Name)
		if r.cantilever {
			j.raw(", \"root\": ").str(mo.Nodes[r.root].Name)
		}
		j.raw(", \"members\": [")
		for k, m := range r.members {
			j.sep(k, ", ").str(mo.Members[m].Name)
		}
		j.raw("], \"length\": ").num(r.length)
		j.raw(", \"deflection\": ").num(s.big.v).raw(", \"x\": ").num(s.big.x).raw(", \"by\": ").bytes(nameOf(combo, s.big.by))
		if !math.IsInf(s.ratio, 0) {
			j.raw(", \"ratio\": ").num(s.ratio)
		}
		j.raw(", \"ratio_length\": ").num(r.ratioLength()).raw("}")
		n++
	}
	j.raw("\n ]")
}

// deflectionLabel returns, for the deflection drawing, the station of
// member m (as shown) where the largest deflection of its span or
// cantilever is, with its value and text; false when it is not on m.
func (a *analysis) deflectionLabel(m int) (int, float64, string, bool) {
	i := a.runOf(m)
	if i < 0 {
		return 0, 0, "", false
	}
	s, ok := a.runDeflection(i)
	if !ok || s.big.by < 0 || s.big.v == 0 || s.big.member != m {
		return 0, 0, "", false
	}
	return s.big.i, s.big.v, sig4(s.big.v) + " (" + ratio(s.ratio) + ")", true
}

// runOf returns the index in a.runs of the span or cantilever member m is
// part of, -1 for none.
func (a *analysis) runOf(m int) int {
	if a.runIndex == nil {
		a.runIndex = make([]int, len(a.job.Model.Members))
		for i := range a.runIndex {
			a.runIndex[i] = -1
		}
		for i, r := range a.runs {
			for _, k := range r.members {
				a.runIndex[k] = i
			}
		}
	}
	return a.runIndex[m]
}
