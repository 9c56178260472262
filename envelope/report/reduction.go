package report

import (
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"

	"govern/envelope/analysis"
)

// factorText formats a live load reduction factor: four decimals, as the
// standards' worked values are given.
func factorText(v float64) string { return strconv.FormatFloat(v, 'f', 4, 64) }

// memberFactors returns the job's member factors of member m, in case
// order.
func memberFactors(job *analysis.Job, m int) []analysis.MemberFactor {
	var out []analysis.MemberFactor
	for c := range job.Model.Cases {
		for _, f := range job.MemberFactors {
			if f.Member == m && f.Case == c {
				out = append(out, f)
			}
		}
	}
	return out
}

// factorsCell writes the factors of a member's cases: "L 0.6091" where
// N, V and M take one factor; "L N 0.4000, V M 0.5039" where they do not;
// with "(1.0000 where L accompanies)" for a factor on N that depends on
// the combination.
func factorsCell(job *analysis.Job, fs []analysis.MemberFactor) string {
	var parts []string
	for _, f := range fs {
		name := job.Model.Cases[f.Case].Name
		var s string
		switch {
		case f.N == f.V && f.V == f.M:
			s = name + " " + factorText(f.N)
		case f.V == f.M:
			s = name + " N " + factorText(f.N) + ", V M " + factorText(f.V)
		default:
			s = name + " N " + factorText(f.N) + ", V " + factorText(f.V) + ", M " + factorText(f.M)
		}
		if f.HasAccompanying && f.Accompanying[0] != f.N {
			s += " (N " + factorText(f.Accompanying[0]) + " where " + name + " accompanies)"
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

// basisText says how a factor was found: the clause, A_T (in the
// model's length²), K_LL, the floors supported and the limit that
// governed.
func basisText(b analysis.FactorBasis, length string) string {
	s := b.Rule + ", A_T " + sig4(b.Area) + " " + length + "²"
	if b.KLL != 0 {
		s += ", K_LL " + shortest(b.KLL)
	}
	s += ", " + floorsText(b.Floors)
	if b.Limit != "" {
		s += ", " + b.Limit
	}
	return s
}

func floorsText(n int) string {
	if n == 1 {
		return "1 floor"
	}
	return strconv.Itoa(n) + " floors"
}

// reducedCases names the cases a member factor reduces, in case order,
// with the clauses they are reduced by, such as "L by ASCE/SEI 7-16
// 4.7.2".
func reducedCases(job *analysis.Job) string {
	var out []string
	for c, cs := range job.Model.Cases {
		var rules []string
		for _, f := range job.MemberFactors {
			if f.Case == c && f.Basis.Rule != "" && !slices.Contains(rules, f.Basis.Rule) {
				rules = append(rules, f.Basis.Rule)
			}
		}
		has := false
		for _, f := range job.MemberFactors {
			has = has || f.Case == c
		}
		if !has {
			continue
		}
		s := cs.Name
		if len(rules) > 0 {
			s += " by " + strings.Join(rules, ", ")
		}
		out = append(out, s)
	}
	return strings.Join(out, ", ")
}

// reductionHeader is the header of the table of member factors.
func reductionHeader(length string) []string {
	return []string{"case", "member", "N", "V", "M", "N where accompanying", "rule", "A_T (" + length + "²)", "K_LL", "floors", "limit", "V and M"}
}

// reductionRows gives one row per member factor, in case then member
// order: the factors on N, V and M, on N where the case accompanies
// ("-" when the same), and how they were found.
func reductionRows(job *analysis.Job) [][]string {
	var rows [][]string
	for c := range job.Model.Cases {
		for _, f := range job.MemberFactors {
			if f.Case != c {
				continue
			}
			acc := "-"
			if f.HasAccompanying {
				acc = factorText(f.Accompanying[0])
			}
			kll := "-"
			if f.Basis.KLL != 0 {
				kll = shortest(f.Basis.KLL)
			}
			limit, ends := f.Basis.Limit, f.Basis.Ends
			if limit == "" {
				limit = "-"
			}
			if ends == "" {
				ends = "-"
			}
			rows = append(rows, []string{job.Model.Cases[c].Name, job.Model.Members[f.Member].Name, factorText(f.N), factorText(f.V), factorText(f.M), acc,
				f.Basis.Rule, sig4(f.Basis.Area), kll, strconv.Itoa(f.Basis.Floors), limit, ends})
		}
	}
	return rows
}

// reductionTable is the table of every member factor; nil without any.
func (p *Report) reductionTable() *Table {
	job := p.job()
	if len(job.MemberFactors) == 0 {
		return nil
	}
	return &Table{Title: "Live load reduction: factors on each member's effects of the reduced cases, and how they were found", Header: reductionHeader(job.Units.Length), Rows: reductionRows(job)}
}

// withReduction adds to t, a table with one row per member of members in
// order, a column giving each member's live load reduction factors, and
// a note to its title; t unchanged when none of them has any.
func (p *Report) withReduction(t Table, members []int) Table {
	job := p.job()
	some := false
	cells := make([]string, len(members))
	for i, m := range members {
		if fs := memberFactors(job, m); len(fs) > 0 {
			cells[i], some = factorsCell(job, fs), true
		} else {
			cells[i] = "-"
		}
	}
	if !some || len(t.Rows) != len(members) {
		return t
	}
	t.Title = t.Title + reductionNote(job)
	t.Header = append(append([]string(nil), t.Header...), "live load factor")
	rows := make([][]string, len(t.Rows))
	for i, r := range t.Rows {
		rows[i] = append(append([]string(nil), r...), cells[i])
	}
	t.Rows = rows
	return t
}

// reductionNote is the note a design table's title carries when a
// reduction applies.
func reductionNote(job *analysis.Job) string {
	if len(job.MemberFactors) == 0 {
		return ""
	}
	return " (live load reduced: " + reducedCases(job) + ")"
}

// writeReductionCheck lists, for govern check, every member factor with
// how it was found, in case then member order; a column's V and M by the
// one-floor rule (FactorBasis.Ends) in short.
func writeReductionCheck(w io.Writer, job *analysis.Job) {
	if len(job.MemberFactors) == 0 {
		return
	}
	fmt.Fprintf(w, "live load reduction: %d member factors (%s)\n", len(job.MemberFactors), Escape(reducedCases(job)))
	for c := range job.Model.Cases {
		for _, f := range job.MemberFactors {
			if f.Case != c {
				continue
			}
			line := factorsCell(job, []analysis.MemberFactor{f}) + "; " + basisText(f.Basis, job.Units.Length)
			if f.Basis.Ends != "" {
				line += "; V, M by the one-floor rule"
			}
			fmt.Fprintf(w, "  %-12s %s\n", Escape(job.Model.Members[f.Member].Name), Escape(line))
		}
	}
}

// reducedReactionTable gives, for each case with member factors, the
// reaction of the case alone at every support, as solved (unreduced) and
// formed from the members' end forces times their factors (reduced;
// analysis.Result.ReducedReactions); nil without member factors or
// supports.
func (p *Report) reducedReactionTable() *Table {
	job, mo := p.job(), p.model()
	if len(job.MemberFactors) == 0 || len(p.res.Envelope.Reactions) == 0 {
		return nil
	}
	var rows [][]string
	for c := range mo.Cases {
		reduced := false
		for _, f := range job.MemberFactors {
			reduced = reduced || f.Case == c
		}
		if !reduced {
			continue
		}
		name := mo.Cases[c].Name
		for _, r := range p.res.ReducedReactions(c) {
			node := mo.Nodes[r.Node]
			nodeName := node.Name
			for d, e := range []struct {
				label string
				s     analysis.Shown
			}{{"Fx (" + p.force.Label + ")", p.force}, {"Fy (" + p.force.Label + ")", p.force}, {"M (" + p.moment.Label + ")", p.moment}} {
				if !node.Reacts(d) {
					continue
				}
				rows = append(rows, []string{name, nodeName, e.label, fixed(e.s.Of(r.Unreduced[d])), fixed(e.s.Of(r.Reduced[d]))})
				name, nodeName = "", ""
			}
		}
	}
	return &Table{Title: "Reactions of the reduced cases alone (global: +X right, +Y up, M counter-clockwise): as solved, and from each member's end force times its factor",
		Header: []string{"case", "node", "component", "unreduced", "reduced"}, Rows: rows}
}
