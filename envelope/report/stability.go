package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"govern/envelope"
	"govern/envelope/analysis"
	"govern/frame"
)

// secondOrder reports whether any combination was analysed in second order.
func (p *Report) secondOrder() bool {
	for _, cb := range p.res.Combinations {
		if cb.Method.SecondOrder {
			return true
		}
	}
	return false
}

// analysisText says how the combinations were analysed, for the heading.
func (p *Report) analysisText() string {
	n := 0
	for _, cb := range p.res.Combinations {
		if cb.Method.SecondOrder {
			n++
		}
	}
	switch {
	case n == 0:
		return "Analysis: first-order elastic (equilibrium on the undeformed geometry; no P-Δ or P-δ)."
	case n == len(p.res.Combinations):
		return fmt.Sprintf("Analysis: second-order elastic (P-Δ and P-δ, %d sub-elements per member), each combination on its own stiffness, iterated on its axial forces; no member bow imperfections.", frame.SubElements)
	}
	return fmt.Sprintf("Analysis: second-order elastic for %d of %d combinations (P-Δ and P-δ), first-order for the rest.", n, len(p.res.Combinations))
}

// critical formats a critical load factor: "none" where nothing is in
// compression.
func critical(a float64) string {
	if math.IsInf(a, 1) {
		return "none"
	}
	return sig4(a)
}

// methodText names how a combination was analysed.
func methodText(cb analysis.Combination) string {
	s := "first-order"
	if cb.Method.SecondOrder {
		s = "second-order"
		if cb.Method.Allowable {
			s += " at 1.6×, ÷1.6"
		}
	}
	if cb.Method.Stiffness != analysis.Nominal {
		s += ", " + cb.Method.Stiffness.String() + " stiffness"
	}
	return s
}

// notionalText describes the notional loads of a combination.
func (p *Report) notionalText(ns []analysis.Notional) string {
	if len(ns) == 0 {
		return "-"
	}
	var parts []string
	for _, n := range ns {
		dir := "+X"
		if n.Direction < 0 {
			dir = "-X"
		}
		parts = append(parts, fmt.Sprintf("%s %s × gravity = %s %s", dir, sig4(n.Ratio), fixed(p.force.Of(math.Abs(n.Total))), p.force.Label))
	}
	s := strings.Join(parts, "; ")
	if ns[0].Alternative {
		s += " (alternatives)"
	}
	return s
}

// stabilityTables returns the tables of the frame's stability: per
// combination its analysis, critical load factor and notional loads; the
// storeys; the reactions without the notional loads; and, in a
// second-order run, the columns' moments beside the first-order ones.
func (p *Report) stabilityTables() []Table {
	var out []Table
	rows := [][]string{}
	nominal := false
	for _, cb := range p.res.Combinations {
		nominal = nominal || cb.Method.Stiffness != analysis.Nominal
	}
	header := []string{"combination", "analysis", "αcr"}
	if nominal {
		header = append(header, "αcr, nominal stiffness")
	}
	header = append(header, "iterations", "notional loads")
	for _, cb := range p.res.Combinations {
		row := []string{cb.Name, methodText(cb), critical(cb.CriticalFactor)}
		if nominal {
			row = append(row, critical(cb.CriticalNominal))
		}
		it := "-"
		if cb.Iterations > 0 {
			it = strconv.Itoa(cb.Iterations)
		}
		row = append(row, it, p.notionalText(cb.Notional))
		rows = append(rows, row)
	}
	out = append(out, Table{"Frame stability by combination (αcr: elastic critical load factor, every case at its factor and every piece loaded)", header, rows})
	if t := p.storeyTable(); t != nil {
		out = append(out, *t)
	}
	if rs := p.res.BareReactions; rs != nil {
		t := p.reactionTableOf(rs, "Reactions without the notional loads (their base shear left out: AISC 360-16 C2.2b User Note)")
		out = append(out, *t)
	}
	if t := p.amplificationTable(); t != nil {
		out = append(out, *t)
	}
	return out
}

// storeyTable gives each storey's drift and stability indices: the drift
// envelope's largest size with its combination and Δ/h, and of the
// strength combinations the one with the largest stability index Q, with
// its B2 and critical load factor. Nil without storeys.
func (p *Report) storeyTable() *Table {
	sts := p.res.Storeys
	if len(sts) == 0 {
		return nil
	}
	mo := p.model()
	u := p.units()
	var rows [][]string
	for i := len(sts) - 1; i >= 0; i-- { // top storey first, as drawn
		s := &sts[i]
		d, by := s.Drift.Max, s.Drift.MaxBy
		if math.Abs(s.Drift.Min) > math.Abs(d) {
			d, by = s.Drift.Min, s.Drift.MinBy
		}
		if math.Abs(d) <= driftRoundOff*s.Height {
			d, by = 0, -1 // round-off: no combination governs it
		}
		gov := p.comboName(by)
		if by < 0 {
			gov = "-"
		}
		row := []string{s.Bottom.Name + " to " + s.Top.Name, fixed(s.Height), sig4(p.defl.Of(d)), mo.Members[s.DriftColumn].Name, gov, ratioOf(d, s.Height)}
		k := -1
		for j, st := range s.Stability {
			if st.RM != 0 && (k < 0 || st.Q > s.Stability[k].Q) {
				k = j
			}
		}
		if k < 0 {
			row = append(row, "-", "-", "-", "-")
		} else {
			st := s.Stability[k]
			b2 := "unstable"
			if !math.IsInf(st.B2, 1) {
				b2 = sig4(st.B2)
			}
			q := sig4(st.Q)
			if st.Unit {
				q += " (unit shear)"
			}
			row = append(row, q, b2, critical(p.res.Combinations[k].CriticalFactor), p.comboName(k))
		}
		rows = append(rows, row)
	}
	return &Table{"Storeys: drift and stability (Q = ΣPu Δo/(Vus lc), ACI 318-19 6.6.4.4.1; B2 = 1/(1 − αPstory/Pe,story), AISC 360-16 Appendix 8)",
		[]string{"storey", "h (" + u.Length + ")", "drift Δ (" + p.defl.Label + ")", "column", "governing", "Δ/h", "Q, largest", "B2", "αcr", "governing"}, rows}
}

// driftRoundOff is the drift ratio Δ/h at or below which a storey's drift
// is round-off (a symmetric frame under symmetric load): shown as 0.
const driftRoundOff = 1e-12

// ratioOf formats a drift ratio Δ/h as "h/412" (rounded down); "-" for
// no drift.
func ratioOf(d, h float64) string {
	if d == 0 {
		return "-"
	}
	return "h" + strings.TrimPrefix(ratio(h/math.Abs(d)), "L")
}

// amplificationTable lists each column's governing second-order moment
// beside the first-order one of the same state; nil in a first-order run.
func (p *Report) amplificationTable() *Table {
	if len(p.res.Amplifications) == 0 {
		return nil
	}
	mo := p.model()
	var rows [][]string
	for _, a := range p.res.Amplifications {
		flag := ""
		if a.Ratio > analysis.AmplificationLimit {
			flag = "above 1.4"
		}
		rows = append(rows, []string{mo.Members[a.Member].Name, fixed(a.X), p.comboName(a.By), fixed(p.moment.Of(a.Second)), fixed(p.moment.Of(a.First)), sig4(a.Ratio), flag})
	}
	m := p.moment.Label
	return &Table{"Columns: governing moment, second-order against first-order of the same state (ACI 318-19 6.2.5.3 asks a review above 1.4)",
		[]string{"column", "at x (" + p.units().Length + ")", "governing", "|M| second-order (" + m + ")", "|M| first-order (" + m + ")", "ratio", "flag"}, rows}
}

// jsonStability writes the stability results: the node displacements,
// the storeys, the reactions without notional loads and the columns'
// amplifications.
func (p *Report) jsonStability(j *jsonWriter, combo [][]byte) {
	mo := p.model()
	lin := func(e envelope.Extreme, s analysis.Shown) {
		j.raw("{\"max\": ").num(s.Of(e.Max)).raw(", \"max_by\": ").bytes(nameOf(combo, e.MaxBy))
		j.raw(", \"min\": ").num(s.Of(e.Min)).raw(", \"min_by\": ").bytes(nameOf(combo, e.MinBy)).raw("}")
	}
	rad := analysis.Shown{Label: "rad", Factor: 1}
	if len(p.res.Displacements) > 0 {
		j.raw(",\n \"nodes\": [")
		for i, d := range p.res.Displacements {
			j.sep(i, ",").raw("\n  {\"node\": ").str(mo.Nodes[d.Node].Name).raw(", \"ux\": ")
			lin(d.Ux, p.defl)
			j.raw(", \"uy\": ")
			lin(d.Uy, p.defl)
			if !d.RotationFree {
				j.raw(", \"rz\": ")
				lin(d.Rz, rad)
			}
			j.raw("}")
		}
		j.raw("\n ]")
	}
	if len(p.res.Storeys) > 0 {
		j.raw(",\n \"storeys\": [")
		for i, s := range p.res.Storeys {
			j.sep(i, ",").raw("\n  {\"bottom\": ").str(s.Bottom.Name).raw(", \"top\": ").str(s.Top.Name).raw(", \"height\": ").num(s.Height)
			j.raw(", \"drift\": ")
			lin(s.Drift, p.defl)
			j.raw(", \"drift_column\": ").str(mo.Members[s.DriftColumn].Name).raw(", \"combinations\": [")
			n := 0
			for k, st := range s.Stability {
				if st.RM == 0 {
					continue
				}
				j.sep(n, ", ").raw("{\"name\": ").bytes(combo[k]).raw(", \"P\": ").num(p.force.Of(st.P)).raw(", \"H\": ").num(p.force.Of(st.H))
				j.raw(", \"unit_shear\": ").boolean(st.Unit).raw(", \"drift_first_order\": ").num(p.defl.Of(st.DeltaH))
				j.raw(", \"Q\": ").num(st.Q).raw(", \"RM\": ").num(st.RM).raw(", \"B2\": ")
				if math.IsInf(st.B2, 1) {
					j.raw("null")
				} else {
					j.num(st.B2)
				}
				j.raw("}")
				n++
			}
			j.raw("]}")
		}
		j.raw("\n ]")
	}
	if rs := p.res.BareReactions; rs != nil {
		j.raw(",\n \"reactions_without_notional\": [")
		for i, r := range rs {
			j.sep(i, ",").raw("\n  {\"node\": ").str(mo.Nodes[r.Node].Name)
			for d, e := range [3]envelope.Extreme{r.Fx, r.Fy, r.M} {
				if mo.Nodes[r.Node].Reacts(d) {
					s := p.force
					if d == 2 {
						s = p.moment
					}
					j.raw(", \"").raw(reactionForces[d]).raw("\": ")
					lin(e, s)
				}
			}
			j.raw("}")
		}
		j.raw("\n ]")
	}
	if len(p.res.Amplifications) > 0 {
		j.raw(",\n \"column_amplification\": [")
		for i, a := range p.res.Amplifications {
			j.sep(i, ",").raw("\n  {\"member\": ").str(mo.Members[a.Member].Name).raw(", \"x\": ").num(a.X).raw(", \"by\": ").bytes(nameOf(combo, a.By))
			j.raw(", \"second_order\": ").num(p.moment.Of(a.Second)).raw(", \"first_order\": ").num(p.moment.Of(a.First)).raw(", \"ratio\": ").num(a.Ratio)
			j.raw(", \"above_1_4\": ").boolean(a.Ratio > analysis.AmplificationLimit).raw("}")
		}
		j.raw("\n ]")
	}
}

// jsonCombination writes what a combination's entry in the JSON says of
// its analysis: the method, the critical load factor (null where nothing
// is in compression), the iterations and the notional loads.
func (p *Report) jsonCombination(j *jsonWriter, k int) {
	cb := p.res.Combinations[k]
	a := "first-order"
	if cb.Method.SecondOrder {
		a = "second-order"
	}
	j.raw(", \"analysis\": ").str(a).raw(", \"stiffness\": ").str(cb.Method.Stiffness.String())
	j.raw(", \"critical_load_factor\": ")
	if math.IsInf(cb.CriticalFactor, 1) {
		j.raw("null")
	} else {
		j.num(cb.CriticalFactor)
	}
	if cb.Method.Stiffness != analysis.Nominal {
		j.raw(", \"critical_load_factor_nominal\": ")
		if math.IsInf(cb.CriticalNominal, 1) {
			j.raw("null")
		} else {
			j.num(cb.CriticalNominal)
		}
	}
	if cb.Iterations > 0 {
		j.raw(", \"iterations\": ").int(cb.Iterations)
	}
	if len(cb.Notional) > 0 {
		j.raw(", \"notional\": [")
		for i, n := range cb.Notional {
			j.sep(i, ", ").raw("{\"direction\": ").num(n.Direction).raw(", \"ratio\": ").num(n.Ratio).raw(", \"base_shear\": ").num(p.force.Of(n.Total))
			j.raw(", \"alternative\": ").boolean(n.Alternative).raw(", \"levels\": [")
			for q, lv := range n.Levels {
				j.sep(q, ", ").raw("{\"level\": ").str(lv.Level).raw(", \"gravity\": ").num(p.force.Of(lv.Gravity)).raw(", \"force\": ").num(p.force.Of(lv.Force)).raw("}")
			}
			j.raw("]}")
		}
		j.raw("]")
	}
}

// csvNodes writes the node displacement envelopes as rows of the CSV: the
// node's name in the member column, x 0, effect "node ux", "node uy" or
// "node rz" (none for a node whose rotation is free), no forces acting
// with them.
func (p *Report) csvNodes(write func([]string) error) error {
	mo := p.model()
	for _, d := range p.res.Displacements {
		for q, e := range []envelope.Extreme{d.Ux, d.Uy, d.Rz} {
			s := p.defl
			if q == 2 {
				if d.RotationFree {
					continue
				}
				s = analysis.Shown{Label: "rad", Factor: 1}
			}
			name := [3]string{"node ux", "node uy", "node rz"}[q]
			row := []string{mo.Nodes[d.Node].Name, "0", name, num(s.Of(e.Max)), p.comboName(e.MaxBy), num(s.Of(e.Min)), p.comboName(e.MinBy), s.Label,
				strings.Join(p.spanNames(e.MaxSpans), " "), strings.Join(p.spanNames(e.MinSpans), " "), strconv.Itoa(e.MaxLoaded), strconv.Itoa(e.MinLoaded),
				"", "", "", "", "", "", ""}
			if err := write(row); err != nil {
				return err
			}
		}
	}
	return nil
}
