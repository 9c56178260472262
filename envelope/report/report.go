package report

import (
	"fmt"
	"math"
	"strings"
	"sync"

	"govern/envelope"
	"govern/envelope/analysis"
	"govern/frame"
)

// Caution is printed with every result: in the terminal tables, the JSON
// and the report, and in the command's help.
const Caution = "Results are for checking by a qualified engineer. They do not replace the governing local code or licensed professional practice."

// Report renders the results of one analysis in each output format:
// terminal tables (WriteText), JSON (WriteJSON), CSV (WriteCSV) and one
// HTML page with drawings (WriteHTML). The tables of design values that
// the terminal and the page both show are formed once, on first use. Its
// writers may run at once, and never modify the result.
type Report struct {
	// Wide leaves the terminal's tables as wide as their columns make
	// them, instead of fitting them to TextWidth. Set it before writing.
	Wide bool

	res *analysis.Result

	// How forces, moments and deflections are shown: the unit of each,
	// and the factor from the model's (analysis.Units.Shown). Every value
	// of those quantities an output writes goes through its Of.
	force, moment, defl analysis.Shown

	once   sync.Once
	design *design
	// states holds the governing states of each column and other member
	// (columnStates), formed with the design tables: written only while
	// they are formed, read after tables() returns.
	states map[int][]columnState

	src *Source // nil when the results' source is not known (From)

	casesOnce   sync.Once
	caseResults []analysis.CaseResult
}

// New returns the report of res.
func New(res *analysis.Result) *Report {
	p := &Report{res: res}
	p.force, p.moment, p.defl = mustShown(res.Job.Units)
	return p
}

// mustShown returns how u shows forces, moments and deflections; analysis.Run
// refuses a job whose output units cannot be converted to, so a failure
// here is a programmer's error.
func mustShown(u analysis.Units) (force, moment, defl analysis.Shown) {
	force, moment, defl, err := u.Shown()
	if err != nil {
		panic("report: " + err.Error())
	}
	return force, moment, defl
}

// job and env are shorthands.
func (p *Report) job() *analysis.Job          { return p.res.Job }
func (p *Report) model() *frame.Model         { return p.res.Job.Model }
func (p *Report) units() analysis.Units       { return p.res.Job.Units }
func (p *Report) pieces() int                 { return len(p.res.Envelope.Pieces) }
func (p *Report) service() int                { return len(p.res.Envelope.Service) }
func (p *Report) combinations() int           { return len(p.res.Envelope.Combinations) }
func (p *Report) shown(m int) envelope.Member { return p.res.Shown(m) }

// tables returns the design-value tables, formed on first use.
func (p *Report) tables() *design {
	p.once.Do(func() { p.design = newDesign(p) })
	return p.design
}

// comboName names combination k; "" for none (-1).
func (p *Report) comboName(k int) string {
	if k < 0 {
		return ""
	}
	return p.res.Envelope.Combinations[k].Name
}

// spanNames names the pattern pieces of an extreme; never nil.
func (p *Report) spanNames(idx []int) []string {
	out := make([]string, len(idx))
	for i, k := range idx {
		out[i] = p.res.Envelope.Pieces[k].Name
	}
	return out
}

// shortSpans lists at most three of the pieces loaded, then how many
// more are loaded.
func (p *Report) shortSpans(idx []int, loaded int) string {
	names := p.spanNames(idx)
	if len(names) == 0 {
		return "-"
	}
	if len(names) > 3 {
		names = names[:3]
	}
	if more := loaded - len(names); more > 0 {
		names = append(names, fmt.Sprintf("+%d", more))
	}
	return strings.Join(names, " ")
}

// combinationCount says how many combinations there are, and how many are
// strength, allowable stress and service ones when there are several
// uses.
func (p *Report) combinationCount() string {
	n := p.combinations()
	count := map[string]int{}
	for _, cb := range p.res.Envelope.Combinations {
		count[use(cb)]++
	}
	if len(count) < 2 {
		return fmt.Sprintf("%d combinations", n)
	}
	var parts []string
	for _, u := range []string{"strength", "allowable", "service"} {
		if count[u] > 0 {
			parts = append(parts, fmt.Sprintf("%d %s", count[u], u))
		}
	}
	return fmt.Sprintf("%d combinations (%s)", n, strings.Join(parts, ", "))
}

// designCombinations names the combinations the envelopes of forces are
// over when the model has service combinations besides: "the strength
// combinations", "the allowable stress combinations", or both.
func (p *Report) designCombinations() string {
	strength, allowable := false, false
	for _, cb := range p.res.Envelope.Combinations {
		strength = strength || (!cb.Service && !cb.Allowable)
		allowable = allowable || (!cb.Service && cb.Allowable)
	}
	switch {
	case strength && allowable:
		return "the strength and allowable stress combinations"
	case allowable:
		return "the allowable stress combinations"
	}
	return "the strength combinations"
}

// overStrength is " over the strength combinations" (or the allowable
// stress ones) when the model has both those and service combinations,
// else "".
func (p *Report) overStrength() string {
	if s := p.service(); s > 0 && s < p.combinations() {
		return " over " + p.designCombinations()
	}
	return ""
}

// patternedNames lists the names of the patterned cases.
func (p *Report) patternedNames() []string {
	var names []string
	for _, c := range p.job().Patterned {
		names = append(names, p.model().Cases[c].Name)
	}
	return names
}

// placement describes how the patterned cases were placed, such as
// "exact placement, 15 pieces (1 per beam)".
func (p *Report) placement() string {
	return fmt.Sprintf("%s placement, %d pieces (%d per beam)", p.res.Patterns, p.pieces(), p.res.Segments)
}

// conditionNote says, when the stiffness matrix is ill-conditioned enough
// to warn about, its estimated condition number and what it costs; every
// output carries it then. It is "" otherwise.
func (p *Report) conditionNote() string {
	c := p.res.Condition()
	if !(c > frame.WarnCond) {
		return ""
	}
	accepted := ""
	if c > frame.RefuseCond {
		accepted = fmt.Sprintf(", above the limit %.0e: solved only because --accept-ill-conditioned was given", frame.RefuseCond)
	}
	return fmt.Sprintf("Ill-conditioned stiffness matrix: estimated condition number %.2g%s; results may have lost about %.0f of their 16 significant digits.", c, accepted, math.Log10(c))
}

func variableLoads(asWritten bool) string {
	if asWritten {
		return "as-written"
	}
	return "adverse"
}

var (
	memberForces   = [3]string{"N", "V", "M"}
	reactionForces = [3]string{"Fx", "Fy", "M"}
)

// shownFromLeft names what the tables show from its left end, for their
// headings: "beams", and "beams and other members" when some members are
// neither beams nor columns (rafters, braces), shown the same way.
func (p *Report) shownFromLeft() string {
	mo := p.model()
	for m := range mo.Members {
		if !mo.IsBeam(m) && !mo.IsColumn(m) {
			return "beams and other members"
		}
	}
	return "beams"
}

// census counts the supported nodes, the beams and the columns of mo.
func census(mo *frame.Model) (supported, beams, columns int) {
	for _, n := range mo.Nodes {
		if n.Supported() {
			supported++
		}
	}
	for m := range mo.Members {
		switch {
		case mo.IsBeam(m):
			beams++
		case mo.IsColumn(m):
			columns++
		}
	}
	return supported, beams, columns
}

// unitsText says what units the outputs show: forces, moments, lengths
// (positions, lengths, coordinates) and deflections, and the model's own
// where they differ.
func (p *Report) unitsText() string {
	return unitsText(p.units(), p.force, p.moment, p.defl)
}

func unitsText(u analysis.Units, force, moment, defl analysis.Shown) string {
	s := fmt.Sprintf("force %s, moment %s, length %s, deflection %s", force.Label, moment.Label, u.Length, defl.Label)
	if force.Label != u.Force || moment.Label != u.Moment() || defl.Label != u.Length {
		s += fmt.Sprintf(" (the model's values are in %s and %s)", u.Force, u.Length)
	}
	return s
}
