package main

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"govern/envelope"
	"govern/patterns"
)

// sag is the largest deflection of a member, relative to its chord, over
// its stations and the service combinations.
type sag struct {
	v, x  float64 // the deflection of larger magnitude (along local y) and where
	by    int     // the combination
	ratio float64 // length / |v|; +Inf when v is zero
}

// largestDeflection returns the member's deflection of largest magnitude,
// false when there are no deflections.
func largestDeflection(em envelope.Member, length float64) (sag, bool) {
	if em.Deflection == nil {
		return sag{}, false
	}
	s := sag{by: -1}
	for i, d := range em.Deflection {
		x := em.Stations[i].X
		if math.Abs(d.Min) > math.Abs(s.v) {
			s.v, s.x, s.by = d.Min, x, d.MinBy
		}
		if math.Abs(d.Max) > math.Abs(s.v) {
			s.v, s.x, s.by = d.Max, x, d.MaxBy
		}
	}
	if s.by < 0 && len(em.Deflection) > 0 {
		s.by = em.Deflection[0].MinBy
	}
	s.ratio = length / math.Abs(s.v)
	return s, true
}

// spanDeflection is largestDeflection for beams: the deflection whose ratio
// to the span is checked against the limits of the standards.
func (a *analysis) spanDeflection(m int) (sag, bool) {
	mo := a.job.Model
	if !mo.IsBeam(m) {
		return sag{}, false
	}
	return largestDeflection(a.env.Members[m], mo.Length(m))
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

// deflectionTable gives, level by level, each beam's largest downward and
// upward deflection relative to its chord over the service combinations,
// and its span/deflection ratio.
func (a *analysis) deflectionTable(tb tables) error {
	if len(a.env.Service) == 0 {
		return nil
	}
	mo := a.job.Model
	u := a.job.Units
	spans := patterns.Spans(mo)
	var beams []int
	for m := range mo.Members {
		if mo.IsBeam(m) {
			beams = append(beams, m)
		}
	}
	if len(beams) == 0 {
		return nil
	}
	sort.SliceStable(beams, func(i, j int) bool {
		si, sj := spans[beams[i]], spans[beams[j]]
		if si.Level != sj.Level {
			return si.Level < sj.Level
		}
		return si.Number < sj.Number
	})
	var rows [][]string
	for _, m := range beams {
		em := a.env.Members[m]
		lo, hi := envelope.Extreme{Min: math.Inf(1), MinBy: -1}, envelope.Extreme{Max: math.Inf(-1), MaxBy: -1}
		var xlo, xhi float64
		for i, d := range em.Deflection {
			if d.Min < lo.Min {
				lo, xlo = d, em.Stations[i].X
			}
			if d.Max > hi.Max {
				hi, xhi = d, em.Stations[i].X
			}
		}
		s, _ := largestDeflection(em, mo.Length(m))
		row := []string{mo.Members[m].Name, strconv.Itoa(spans[m].Level), fixed(mo.Length(m))}
		// A beam that never moves one way has nothing to show for it.
		if lo.Min < 0 {
			row = append(row, sig4(lo.Min), fixed(xlo), a.comboName(lo.MinBy))
		} else {
			row = append(row, "0", "-", "-")
		}
		if hi.Max > 0 {
			row = append(row, sig4(hi.Max), fixed(xhi), a.comboName(hi.MaxBy))
		} else {
			row = append(row, "0", "-", "-")
		}
		rows = append(rows, append(row, ratio(s.ratio)))
	}
	l := u.Length
	title := fmt.Sprintf("Deflection of beams relative to their chords, service combinations (+ up, in %s; x from the start)", l)
	return tb.table(title, []string{"beam", "level", "span (" + l + ")", "down (" + l + ")", "at x", "governing", "up (" + l + ")", "at x", "governing", "span/deflection"}, rows)
}
