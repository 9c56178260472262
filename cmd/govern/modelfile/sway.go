package modelfile

import (
	"math"

	"govern/envelope/analysis"
	"govern/frame/units"
)

// swaySettings are the [analysis] keys of second-order analysis, notional
// loads and stiffness reduction, and the sections' own.
type swaySettings struct {
	secondOrder bool
	allowable   *bool // nil: from the combination set
	strengthI   []float64
	fy          []float64
	anySection  bool // some section gives strength_I
}

// readSway reads second_order, allowable, notional, tau_b,
// stiffness_EI, stiffness_EA and tolerance of [analysis].
func (r *reader) readSway(a *table) {
	st := &r.job.Sway
	r.sway.secondOrder = a.boolean("second_order", false)
	if a.has("allowable") {
		v := a.boolean("allowable", false)
		r.sway.allowable = &v
	}
	if v, ok := a.get("notional"); ok {
		switch x := v.(type) {
		case string:
			if a.oneOf("notional", x, "aisc360", "en1993", "none") {
				st.Notional = map[string]analysis.NotionalRule{"aisc360": analysis.NotionalAISC360, "en1993": analysis.NotionalEN1993, "none": analysis.NoNotional}[x]
			}
		default:
			if f, ok := a.numOK("notional", 0); ok {
				if !(f > 0 && f < 0.1) {
					a.fail("notional", problem(ErrValue, "notional = %g: a ratio of notional load to gravity load must be above 0 and below 0.1 (0.002 is AISC 360-16's, 1/200 EN 1993-1-1's φ0)", f))
				} else {
					st.Notional, st.NotionalRatio = analysis.NotionalRatio, f
				}
			}
		}
	}
	tb := a.str("tau_b", "none")
	if a.oneOf("tau_b", tb, "none", "fy", "notional") {
		st.TauB = map[string]analysis.TauB{"none": analysis.TauBNone, "fy": analysis.TauBFy, "notional": analysis.TauBNotional}[tb]
	}
	for _, k := range []struct {
		key string
		dst *float64
	}{{"stiffness_EI", &st.StrengthEI}, {"stiffness_EA", &st.StrengthEA}} {
		if f, ok := a.numOK(k.key, 1); ok {
			if !(f > 0 && f <= 1) {
				a.fail(k.key, problem(ErrValue, "%s = %g: a factor on the stiffness must be above 0 and at most 1 (AISC 360-16 C2.3(a): 0.8)", k.key, f))
			} else {
				*k.dst = f
			}
		}
	}
	if f, ok := a.numOK("tolerance", analysis.DefaultTolerance); ok {
		if !(f > 0 && f < 0.01) || math.IsInf(f, 0) {
			a.fail("tolerance", problem(ErrValue, "tolerance = %g: the relative change of the axial forces that ends the iteration must be above 0 and below 0.01", f))
		} else {
			st.Tolerance = f
		}
	}
}

// sectionSway reads a section's strength_I (a factor on I for strength
// combinations, ACI 318-19 6.6.3.1.1) and Fy (yield stress, for τb).
func (r *reader) sectionSway(t *table) {
	f := 0.0
	if v, ok := t.numOK("strength_I", 0); ok {
		if !(v > 0 && v <= 1) {
			t.fail("strength_I", problem(ErrValue, "strength_I = %g: a factor on I must be above 0 and at most 1 (ACI 318-19 6.6.3.1.1: 0.35 beams, 0.70 columns)", v))
		} else {
			f = v
			r.sway.anySection = true
		}
	}
	r.sway.strengthI = append(r.sway.strengthI, f)
	fy := 0.0
	if v, ok := t.qtyOK("Fy", units.Stress, 0); ok {
		if !(v > 0) {
			t.fail("Fy", problem(ErrValue, "Fy = %g: must be greater than zero", v))
		} else {
			fy = v
		}
	}
	r.sway.fy = append(r.sway.fy, fy)
}

// methods sets how each combination is analysed: second order for all
// with second_order = true; Strength stiffness for strength combinations
// and Service stiffness for service ones where a stiffness factor is
// given; allowable for those of the allowable stress set (or as the key
// says).
func (r *reader) methods() {
	job := r.job
	st := &job.Sway
	if r.sway.anySection {
		st.SectionI = r.sway.strengthI
	}
	if st.TauB == analysis.TauBFy {
		st.Fy = r.sway.fy
	}
	allowable := job.Set != nil && job.Set.Name == "asce7-16-allowable"
	if r.sway.allowable != nil {
		allowable = *r.sway.allowable
	}
	reduced := st.StrengthEI > 0 || st.StrengthEA > 0 || st.SectionI != nil || st.TauB == analysis.TauBFy
	if !r.sway.secondOrder && !reduced && !allowable {
		return
	}
	job.Methods = make([]analysis.Method, len(job.Combinations))
	for k, cb := range job.Combinations {
		m := &job.Methods[k]
		m.SecondOrder = r.sway.secondOrder
		m.Allowable = allowable && !cb.Service
		switch {
		case !reduced:
		case !cb.Service:
			m.Stiffness = analysis.Strength
		case st.SectionI != nil:
			m.Stiffness = analysis.Service
		}
	}
}
