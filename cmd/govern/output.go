package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/tw"

	"govern/envelope"
)

var (
	memberForces   = [3]string{"N", "V", "M"}
	reactionForces = [3]string{"Fx", "Fy", "M"}
)

// spanNames names the pattern pieces of an extreme; never nil.
func (a *analysis) spanNames(idx []int) []string {
	out := make([]string, len(idx))
	for i, p := range idx {
		out[i] = a.env.Pieces[p].Name
	}
	return out
}

func (a *analysis) comboName(k int) string {
	if k < 0 {
		return ""
	}
	return a.env.Combinations[k].Name
}

// clean turns negative zero into zero, so that output does not show "-0".
func clean(v float64) float64 {
	if v == 0 {
		return 0
	}
	return v
}

func variableLoads(asWritten bool) string {
	if asWritten {
		return "as-written"
	}
	return "adverse"
}

// writeCSV writes one row per member, station and effect.
func (a *analysis) writeCSV(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"member", "x (" + u.Length + ")", "effect", "max", "max_by", "min", "min_by", "unit",
		"max_spans", "min_spans", "max_loaded", "min_loaded", "max_with_N", "max_with_V", "max_with_M", "min_with_N", "min_with_V", "min_with_M"}); err != nil {
		return err
	}
	for _, em := range a.env.Members {
		name := mo.Members[em.Member].Name
		for _, st := range em.Stations {
			for _, e := range []struct {
				name, unit string
				x          envelope.Extreme
			}{{"N", u.Force, st.N}, {"V", u.Force, st.V}, {"M", u.Moment(), st.M}} {
				x := e.x
				if err := cw.Write([]string{name, strconv.FormatFloat(st.X, 'g', 12, 64), e.name, num(x.Max), a.comboName(x.MaxBy), num(x.Min), a.comboName(x.MinBy), e.unit,
					strings.Join(a.spanNames(x.MaxSpans), " "), strings.Join(a.spanNames(x.MinSpans), " "), strconv.Itoa(x.MaxLoaded), strconv.Itoa(x.MinLoaded),
					num(x.MaxWith[0]), num(x.MaxWith[1]), num(x.MaxWith[2]), num(x.MinWith[0]), num(x.MinWith[1]), num(x.MinWith[2])}); err != nil {
					return err
				}
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// num formats a value for CSV: shortest exact representation.
func num(v float64) string { return strconv.FormatFloat(clean(v), 'g', -1, 64) }

// fixed formats a value for a table with two decimals.
func fixed(v float64) string {
	s := strconv.FormatFloat(v, 'f', 2, 64)
	if s == "-0.00" {
		s = "0.00"
	}
	return s
}

func newTable(w io.Writer, header ...string) *tablewriter.Table {
	t := tablewriter.NewTable(w,
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithRowAlignment(tw.AlignRight),
		tablewriter.WithHeaderAlignment(tw.AlignCenter),
	)
	h := make([]any, len(header))
	for i, s := range header {
		h[i] = s
	}
	t.Header(h...)
	return t
}

// peak is the governing value of one effect over a member's stations.
type peak struct {
	v, x   float64
	by     int
	spans  []int
	loaded int
}

// shortSpans lists at most three of the pieces loaded, then how many
// more are loaded.
func (a *analysis) shortSpans(idx []int, loaded int) string {
	names := a.spanNames(idx)
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

// writeSummary prints, per member, the governing max and min of N, V and M
// with where they occur, then the reaction envelopes.
func (a *analysis) writeSummary(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	l := u.Length
	patterned := len(a.env.Pieces) > 0
	rows := [][]string{}
	for _, em := range a.env.Members {
		name := mo.Members[em.Member].Name
		for _, e := range []struct {
			label string
			get   func(envelope.Station) envelope.Extreme
		}{
			{"N (" + u.Force + ")", func(s envelope.Station) envelope.Extreme { return s.N }},
			{"V (" + u.Force + ")", func(s envelope.Station) envelope.Extreme { return s.V }},
			{"M (" + u.Moment() + ")", func(s envelope.Station) envelope.Extreme { return s.M }},
		} {
			hi, lo := peak{v: math.Inf(-1)}, peak{v: math.Inf(1)}
			for _, st := range em.Stations {
				x := e.get(st)
				if x.Max > hi.v {
					hi = peak{x.Max, st.X, x.MaxBy, x.MaxSpans, x.MaxLoaded}
				}
				if x.Min < lo.v {
					lo = peak{x.Min, st.X, x.MinBy, x.MinSpans, x.MinLoaded}
				}
			}
			row := []string{name, e.label, fixed(hi.v), fixed(hi.x), a.comboName(hi.by), fixed(lo.v), fixed(lo.x), a.comboName(lo.by)}
			if patterned {
				row = slices.Insert(row, 5, a.shortSpans(hi.spans, hi.loaded))
				row = append(row, a.shortSpans(lo.spans, lo.loaded))
			}
			rows = append(rows, row)
			name = ""
		}
	}
	fmt.Fprintf(w, "Member envelopes (x from the member's start, in %s)\n", l)
	header := []string{"member", "effect", "max", "at x", "governing", "min", "at x", "governing"}
	if patterned {
		header = []string{"member", "effect", "max", "at x", "governing", "spans loaded", "min", "at x", "governing", "spans loaded"}
	}
	t := newTable(w, header...)
	if err := t.Bulk(rows); err != nil {
		return err
	}
	if err := t.Render(); err != nil {
		return err
	}
	if len(a.env.Reactions) == 0 {
		return nil
	}
	rows = rows[:0]
	for _, r := range a.env.Reactions {
		node := mo.Nodes[r.Node]
		name := node.Name
		for d, e := range []struct {
			label string
			x     envelope.Extreme
		}{{"Fx (" + u.Force + ")", r.Fx}, {"Fy (" + u.Force + ")", r.Fy}, {"M (" + u.Moment() + ")", r.M}} {
			if !node.Support.Restrained(d) {
				continue
			}
			rows = append(rows, []string{name, e.label, fixed(e.x.Max), a.comboName(e.x.MaxBy), fixed(e.x.Min), a.comboName(e.x.MinBy)})
			name = ""
		}
	}
	fmt.Fprintf(w, "\nReactions (global: +X right, +Y up, M counter-clockwise)\n")
	t = newTable(w, "node", "component", "max", "governing", "min", "governing")
	if err := t.Bulk(rows); err != nil {
		return err
	}
	return t.Render()
}
