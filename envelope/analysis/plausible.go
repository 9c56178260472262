package analysis

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"govern/frame/units"
)

// Numbers that cannot be right. A slip of units (I in in⁴ in a model in
// ft, I in cm⁴ in one in mm, E in MPa in one in kN and m) gives a frame
// that solves, balances and is wrong by a factor of a thousand or more.
// These checks look for what no building frame has, and each warning
// names the section or member and the slip that would explain it:
//
//   - E outside 1 to 250 GPa (145 to 36,000 ksi): from soft timber and
//     masonry to steel, common practice;
//   - where a section gives its depth, a radius of gyration r = √(I/A)
//     outside 0.15 to 0.6 times the depth: a solid rectangle has 0.29, a
//     solid circle 0.25, I-sections and tubes about 0.35 to 0.45 (section
//     property tables, common practice);
//   - a member's L/r below 4 (shorter than it is deep) or above 1000
//     (slenderer than any member of a frame);
//   - under the service combinations, a span of beams whose
//     span/deflection is above 20,000 (far stiffer than a floor) or below
//     50 (far more flexible).
//
// A section whose I/A² (a pure number: about 0.01 for a wide plank, 0.08
// for a square, 1 to 20 for I-sections) is below 1e-6 has an area far
// larger than any section of its I: a member made axially rigid on
// purpose, as verification models and links are. A radius of gyration too
// small for its depth or length is then the area's doing, and is not
// reported; an area entered in too small a unit (mm² in a model in m)
// looks the same and, making members only axially stiffer, changes little.
//
// The ratios have no units, so consistent units never trip them; only E
// needs the model's units to be known (package units reads them from
// Job.Units). A likely slip is one that brings the number back among
// those of real frames: a length unit of the same system first (in for
// ft, mm or cm for m), then of the other.
const (
	minE, maxE               = 1e9, 250e9 // Pa
	minRDepth, maxRDepth     = 0.15, 0.6
	minSlender, maxSlender   = 4.0, 1000.0
	minSpanDefl, maxSpanDefl = 50.0, 20000.0
	rigidArea                = 1e-6 // I/A² below: axially rigid on purpose
)

// axiallyRigid reports whether a section's area is far larger than any
// section of its I has (see rigidArea).
func axiallyRigid(a, i float64) bool { return i/(a*a) < rigidArea }

// Typical values a likely slip is judged by, and the ranges it must bring
// a number into (common practice).
var (
	typicalRDepth  = band{0.2, 0.5, 0.35}
	typicalSlender = band{10, 500, 40}
	typicalDefl    = band{150, 10000, 1000}
)

type band struct{ lo, hi, typical float64 }

// score is how far v is from the band's typical value, in decades; false
// when v is outside the band.
func (b band) score(v float64) (float64, bool) {
	if !(v >= b.lo && v <= b.hi) {
		return 0, false
	}
	return math.Abs(math.Log10(v / b.typical)), true
}

// slipLengths and slipStresses are the units a number is likely to have
// been written in by mistake, each system's in order of use.
var (
	slipLengths  = []string{"mm", "cm", "m", "in", "ft"}
	slipStresses = []string{"MPa", "GPa", "kPa", "Pa", "ksi", "psi", "ksf", "psf"}
)

// usSystem reports whether a length unit is an inch-pound one.
func usSystem(u units.Unit) bool { return u.Symbol == "in" || u.Symbol == "ft" }

// plausibility is what the checks know of the job's units.
type plausibility struct {
	job   *Job
	sys   units.System
	known bool // the job's units are units package units reads
}

func newPlausibility(job *Job) *plausibility {
	p := &plausibility{job: job}
	if s, err := units.NewSystem(job.Units.Force, job.Units.Length, ""); err == nil {
		p.sys, p.known = s, true
	}
	return p
}

// Plausibility returns a warning for every section or member of job's
// model whose numbers no building frame has, each with the unit slip
// that would explain it where one does: E (when the job's units are
// known), r = √(I/A) against the section's depth, and L/r. Run adds the
// check of span/deflection under the service combinations.
func Plausibility(job *Job) []string {
	p := newPlausibility(job)
	var out []string
	mo := job.Model
	for i := range mo.Sections {
		out = append(out, p.modulus(i)...)
		out = append(out, p.gyration(i)...)
	}
	out = append(out, p.slenderness()...)
	return out
}

// modulus checks E of section i.
func (p *plausibility) modulus(i int) []string {
	if !p.known {
		return nil
	}
	s := p.job.Model.Sections[i]
	stress := p.sys.SI(units.Stress.Dim)
	e := s.E * stress
	if e >= minE && e <= maxE {
		return nil
	}
	msg := fmt.Sprintf("section %q: E = %s %s is %s GPa, outside the 1 to 250 GPa (145 to 36,000 ksi; %s to %s %s in this model's units) of building materials",
		s.Name, g(s.E), p.sys.Symbol(units.Stress.Dim), g(e/1e9), g(minE/stress), g(maxE/stress), p.sys.Symbol(units.Stress.Dim))
	// The first stress unit, this system's first, that E read in
	// brings among the materials' moduli.
	best := ""
	for _, pass := range []bool{true, false} {
		for _, sym := range slipStresses {
			u := units.MustParse(sym)
			if sameSystem(sym, p.sys.Length) != pass || math.Abs(u.SI/stress-1) < 1e-9 {
				continue
			}
			if v := s.E * u.SI; v >= minE && v <= maxE && best == "" {
				best = sym
			}
		}
	}
	if best != "" {
		return []string{fmt.Sprintf("%s: E looks like %s in a %s, %s model", msg, best, p.sys.Force.Symbol, p.sys.Length.Symbol)}
	}
	return []string{msg + ": check the units of E"}
}

// sameSystem reports whether the unit symbol belongs with a model in the
// length unit l: inch-pound with in or ft, SI otherwise.
func sameSystem(sym string, l units.Unit) bool {
	switch sym {
	case "in", "ft", "psi", "ksi", "psf", "ksf":
		return usSystem(l)
	}
	return !usSystem(l)
}

// hypothesis is a slip of length units in some of a section's numbers:
// A, I or the depth written in unit u instead of the model's.
type hypothesis struct {
	inA, inI, inDepth bool
	u                 string
	f                 float64 // u in the model's length unit
}

// hypotheses lists the slips worth considering, with a cost added to
// their score: the fewer keys and the more usual the slip, the less.
func (p *plausibility) hypotheses(depth bool) []struct {
	h    hypothesis
	cost float64
} {
	var out []struct {
		h    hypothesis
		cost float64
	}
	for _, sym := range slipLengths {
		u := units.MustParse(sym)
		f := u.SI / p.sys.Length.SI
		if math.Abs(f-1) < 1e-9 {
			continue
		}
		cross := 0.0
		if !sameSystem(sym, p.sys.Length) {
			cross = 0.5
		}
		for _, h := range []struct {
			h    hypothesis
			cost float64
		}{
			{hypothesis{inA: true, inI: true}, 0}, // copied from a table in other units
			{hypothesis{inI: true}, 0},
			{hypothesis{inDepth: true}, 0.1},
			{hypothesis{inA: true}, 0.2},
		} {
			if h.h.inDepth && !depth {
				continue
			}
			h.h.u, h.h.f = sym, f
			h.cost += cross
			out = append(out, h)
		}
	}
	return out
}

// corrected returns A, I and the depth as they would be under h.
func (h hypothesis) corrected(a, i, d float64) (float64, float64, float64) {
	if h.inA {
		a *= h.f * h.f
	}
	if h.inI {
		i *= h.f * h.f * h.f * h.f
	}
	if h.inDepth {
		d *= h.f
	}
	return a, i, d
}

// String says the slip, as in "I looks like in⁴".
func (h hypothesis) String() string {
	switch {
	case h.inA && h.inI:
		return fmt.Sprintf("I and A look like %s⁴ and %s²", h.u, h.u)
	case h.inI:
		return fmt.Sprintf("I looks like %s⁴", h.u)
	case h.inA:
		return fmt.Sprintf("A looks like %s²", h.u)
	}
	return fmt.Sprintf("depth looks like %s", h.u)
}

// likely returns the slip that best brings judge (of the corrected A, I
// and depth) into its band, in words such as "I looks like in⁴ in a ft
// model"; "" when the units are not known or none does.
func (p *plausibility) likely(depth bool, a, i, d float64, b band, judge func(a, i, d float64) float64) string {
	if !p.known {
		return ""
	}
	best, bestScore := "", math.Inf(1)
	for _, c := range p.hypotheses(depth) {
		s, ok := b.score(judge(c.h.corrected(a, i, d)))
		if ok && s+c.cost < bestScore {
			best, bestScore = c.h.String(), s+c.cost
		}
	}
	if best == "" {
		return ""
	}
	return fmt.Sprintf("%s in a %s model", best, p.sys.Length.Symbol)
}

// gyration checks r = √(I/A) of section i against its depth.
func (p *plausibility) gyration(i int) []string {
	s := p.job.Model.Sections[i]
	if s.Depth <= 0 {
		return nil
	}
	ratio := math.Sqrt(s.I/s.A) / s.Depth
	if ratio >= minRDepth && ratio <= maxRDepth || ratio < minRDepth && axiallyRigid(s.A, s.I) {
		return nil
	}
	l := p.job.Units.Length
	msg := fmt.Sprintf("section %q: its radius of gyration r = √(I/A) = %s %s is %s times its depth %s %s, where sections have 0.15 to 0.6 (a solid rectangle 0.29, an I-section about 0.4)",
		s.Name, g(math.Sqrt(s.I/s.A)), l, g(ratio), g(s.Depth), l)
	slip := p.likely(true, s.A, s.I, s.Depth, typicalRDepth, func(a, i, d float64) float64 { return math.Sqrt(i/a) / d })
	return []string{withSlip(msg, slip, "check the units of A, I and depth")}
}

// withSlip ends a warning with the likely slip, or else what to check.
func withSlip(msg, slip, otherwise string) string {
	if slip != "" {
		return msg + ": " + slip
	}
	return msg + ": " + otherwise
}

// slenderness checks L/r of every member, one warning per section and
// way: the member furthest out, and how many more.
func (p *plausibility) slenderness() []string {
	mo := p.job.Model
	type worst struct {
		m, n int
		v    float64
	}
	low := make([]worst, len(mo.Sections))
	high := make([]worst, len(mo.Sections))
	for i := range low {
		low[i], high[i] = worst{m: -1, v: math.Inf(1)}, worst{m: -1}
	}
	for m, mem := range mo.Members {
		s := mo.Sections[mem.Section]
		v := mo.Length(m) / math.Sqrt(s.I/s.A)
		if v < minSlender {
			w := &low[mem.Section]
			w.n++
			if v < w.v {
				w.m, w.v = m, v
			}
		}
		if v > maxSlender && !axiallyRigid(s.A, s.I) {
			w := &high[mem.Section]
			w.n++
			if v > w.v {
				w.m, w.v = m, v
			}
		}
	}
	var out []string
	l := p.job.Units.Length
	for i, s := range mo.Sections {
		for k, w := range [2]worst{low[i], high[i]} {
			if w.m < 0 {
				continue
			}
			who := fmt.Sprintf("member %q", mo.Members[w.m].Name)
			if w.n > 1 {
				who = fmt.Sprintf("member %q (and %d more of section %q)", mo.Members[w.m].Name, w.n-1, s.Name)
			} else {
				who += fmt.Sprintf(" (section %q)", s.Name)
			}
			what := "below 4: shorter than any member is deep"
			if k == 1 {
				what = "above 1000: more slender than any member of a frame"
			}
			length := mo.Length(w.m)
			msg := fmt.Sprintf("%s: L/r = %s (L = %s %s, r = √(I/A) = %s %s), %s", who, g(w.v), g(length), l, g(math.Sqrt(s.I/s.A)), l, what)
			slip := p.likely(false, s.A, s.I, s.Depth, typicalSlender, func(a, i, _ float64) float64 { return length / math.Sqrt(i/a) })
			out = append(out, withSlip(msg, slip, "check the units of A and I"))
		}
	}
	return out
}

// spanWarnings checks span/deflection of the spans of beams under the
// service combinations: one warning for those far too stiff and one for
// those far too flexible, each naming the span furthest out.
func (p *plausibility) spanWarnings(r *Result) []string {
	mo := p.job.Model
	type worst struct {
		i, n int
		v    float64
	}
	stiff, soft := worst{i: -1}, worst{i: -1, v: math.Inf(1)}
	for i := range r.Spans {
		s := &r.Spans[i]
		d := s.Deflection
		if !s.Beam || !d.Found || math.IsInf(d.Ratio, 0) || math.IsNaN(d.Ratio) {
			continue
		}
		if d.Ratio > maxSpanDefl {
			stiff.n++
			if d.Ratio > stiff.v {
				stiff.i, stiff.v = i, d.Ratio
			}
		}
		if d.Ratio < minSpanDefl {
			soft.n++
			if d.Ratio < soft.v {
				soft.i, soft.v = i, d.Ratio
			}
		}
	}
	var out []string
	for k, w := range [2]worst{stiff, soft} {
		if w.i < 0 {
			continue
		}
		s := &r.Spans[w.i]
		who := fmt.Sprintf("%s %s–%s", s.Kind, mo.Nodes[s.Left].Name, mo.Nodes[s.Right].Name)
		if w.n > 1 {
			who += fmt.Sprintf(" (and %d more spans and cantilevers of beams)", w.n-1)
		}
		what := "above 20,000: far stiffer than any floor"
		if k == 1 {
			what = "below 50: far more flexible than any floor"
		}
		msg := fmt.Sprintf("%s: span/deflection L/%s under the service combinations, %s", who, ratioText(w.v), what)
		out = append(out, withSlip(msg, p.deflectionSlip(s, w.v), "check the units of E, I and the loads"))
	}
	return out
}

// deflectionSlip returns the slip of E or I (of the span's first member's
// section) that brings span/deflection among a floor's, in words; "" when
// none does.
func (p *plausibility) deflectionSlip(s *Span, ratio float64) string {
	if !p.known {
		return ""
	}
	sec := p.job.Model.Sections[p.job.Model.Members[s.Members[0]].Section]
	best, bestScore := "", math.Inf(1)
	try := func(k float64, cost float64, what string) {
		// The stiffness read is k times the true one; the true
		// deflection is k times the one found, span/deflection 1/k.
		if sc, ok := typicalDefl.score(ratio / k); ok && sc+cost < bestScore {
			best, bestScore = what, sc+cost
		}
	}
	stress := p.sys.SI(units.Stress.Dim)
	for _, sym := range slipStresses {
		u := units.MustParse(sym)
		if math.Abs(u.SI/stress-1) < 1e-9 {
			continue
		}
		cost := 0.0
		if !sameSystem(sym, p.sys.Length) {
			cost = 0.5
		}
		// E written in u: its true value is E·u/stress.
		if e := sec.E * u.SI; e >= minE && e <= maxE {
			try(stress/u.SI, cost, fmt.Sprintf("E of section %q looks like %s in a %s, %s model", sec.Name, sym, p.sys.Force.Symbol, p.sys.Length.Symbol))
		}
	}
	for _, sym := range slipLengths {
		u := units.MustParse(sym)
		f := u.SI / p.sys.Length.SI
		if math.Abs(f-1) < 1e-9 {
			continue
		}
		cost := 0.0
		if !sameSystem(sym, p.sys.Length) {
			cost = 0.5
		}
		try(1/(f*f*f*f), cost, fmt.Sprintf("I of section %q looks like %s⁴ in a %s model", sec.Name, sym, p.sys.Length.Symbol))
	}
	return best
}

// g formats a number in a warning: four significant figures, without an
// exponent from 0.001 to a million.
func g(v float64) string {
	a := math.Abs(v)
	if a == 0 || a < 1e-3 || a >= 1e6 || math.IsInf(a, 0) || math.IsNaN(a) {
		return strconv.FormatFloat(v, 'g', 4, 64)
	}
	s := strconv.FormatFloat(v, 'f', max(0, 3-int(math.Floor(math.Log10(a)))), 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
}

// ratioText writes span/deflection as a whole number with commas.
func ratioText(v float64) string {
	if v >= 1e15 || v < 100 {
		return g(v)
	}
	return thousands(int(math.Floor(v)))
}
