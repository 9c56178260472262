package combos

import (
	"fmt"
	"strconv"
	"strings"
)

// Term is one load case of a combination with its factor.
type Term struct {
	Case   int // index into the model's cases
	Factor float64
	// Favourable, when HasFavourable is set, is the factor of the case
	// where its effect is favourable, from the rule's favourable_factor:
	// the case takes Factor where its effect is adverse and Favourable
	// elsewhere, span by span when it is patterned ([Choice]).
	Favourable    float64
	HasFavourable bool
}

// Combination is a named set of factored load cases that act together.
type Combination struct {
	Name  string
	Rule  string // where the combination came from: "model", or a rule of a standard
	Terms []Term
	// Service marks a serviceability combination: it gives deflections,
	// and the envelopes of forces for design leave it out when the model
	// has strength combinations (see package envelope).
	Service bool
	// Lead lists the cases of the terms of its rule that lead (a rule
	// term marked lead, such as the leading variable action of EN 1990
	// 6.10); nil when not known, as for a combination written in a model.
	Lead []int
	// Limit is, for a service combination, the span/deflection its
	// deflections are checked against (360 for span/360): the largest
	// deflection of a span may be at most its length over Limit, of a
	// cantilever twice its length over Limit. 0 for no check.
	Limit float64
	// Allowable marks a combination of allowable stress design (ASCE/SEI
	// 7-16 section 2.4): its effects are compared with allowable
	// strengths, and outputs call it "allowable", not "strength". It
	// changes no number.
	Allowable bool
}

// EachCase returns one combination per case, the case alone with factor 1,
// named after it: what a model without combinations is analysed for.
func EachCase(cases []Case) []Combination {
	out := make([]Combination, len(cases))
	for i, c := range cases {
		out[i] = Combination{Name: c.Name, Rule: "case", Terms: []Term{{Case: i, Factor: 1}}}
	}
	return out
}

// Factor returns the factor of case c in the combination, 0 when absent.
func (cb *Combination) Factor(c int) float64 {
	f := 0.0
	for _, t := range cb.Terms {
		if t.Case == c {
			f += t.Factor
		}
	}
	return f
}

// Describe writes the combination as factors and case names, such as
// "1.2D + 1.6L - 0.5W", or "1.4/1.0G + 1.6Q" for a term with a favourable
// factor.
func (cb *Combination) Describe(cases []Case) string {
	var b strings.Builder
	for i, t := range cb.Terms {
		f := t.Factor
		switch {
		case i == 0 && f < 0:
			b.WriteString("-")
			f = -f
		case i > 0 && f < 0:
			b.WriteString(" - ")
			f = -f
		case i > 0:
			b.WriteString(" + ")
		}
		switch {
		case t.HasFavourable && t.Favourable != t.Factor:
			// The factor where adverse, and where favourable.
			b.WriteString(strconv.FormatFloat(f, 'g', -1, 64) + "/" + strconv.FormatFloat(t.Favourable, 'g', -1, 64))
		case f != 1:
			b.WriteString(strconv.FormatFloat(f, 'g', -1, 64))
		}
		fmt.Fprint(&b, cases[t.Case].Name)
	}
	return b.String()
}
