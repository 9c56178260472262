package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/tw"

	"govern/envelope"
)

// jsonFormat names the layout of the JSON output; it changes when the layout does.
const jsonFormat = "govern.envelopes/1"

type jsonExtreme struct {
	Max   float64 `json:"max"`
	MaxBy string  `json:"max_by"`
	Min   float64 `json:"min"`
	MinBy string  `json:"min_by"`
}

type jsonStation struct {
	X float64     `json:"x"`
	N jsonExtreme `json:"N"`
	V jsonExtreme `json:"V"`
	M jsonExtreme `json:"M"`
}

type jsonMember struct {
	Name     string        `json:"name"`
	Start    string        `json:"start"`
	End      string        `json:"end"`
	Length   float64       `json:"length"`
	Stations []jsonStation `json:"stations"`
}

type jsonReaction struct {
	Node string      `json:"node"`
	Fx   jsonExtreme `json:"Fx"`
	Fy   jsonExtreme `json:"Fy"`
	M    jsonExtreme `json:"M"`
}

type jsonCombination struct {
	Name    string             `json:"name"`
	Factors map[string]float64 `json:"factors"`
}

type jsonOutput struct {
	Format string `json:"format"`
	Title  string `json:"title"`
	Units  struct {
		Force  string `json:"force"`
		Length string `json:"length"`
	} `json:"units"`
	Settings struct {
		Stations      int    `json:"stations"`
		VariableLoads string `json:"variable_loads"`
	} `json:"settings"`
	Combinations []jsonCombination `json:"combinations"`
	Members      []jsonMember      `json:"members"`
	Reactions    []jsonReaction    `json:"reactions"`
	Statics      []jsonStatics     `json:"statics"`
	Caution      string            `json:"caution"`
}

func (a *analysis) extreme(e envelope.Extreme) jsonExtreme {
	return jsonExtreme{Max: clean(e.Max), MaxBy: a.comboName(e.MaxBy), Min: clean(e.Min), MinBy: a.comboName(e.MinBy)}
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

// writeJSON writes the envelopes in the govern.envelopes/1 layout.
func (a *analysis) writeJSON(w io.Writer) error {
	mo := a.job.Model
	var out jsonOutput
	out.Format = jsonFormat
	out.Title = a.job.Title
	out.Units.Force, out.Units.Length = a.job.Units.Force, a.job.Units.Length
	out.Settings.Stations = a.env.Settings.Stations
	out.Settings.VariableLoads = variableLoads(a.env.Settings.AsWritten)
	out.Caution = caution
	out.Combinations = make([]jsonCombination, len(a.env.Combinations))
	for i, cb := range a.env.Combinations {
		f := map[string]float64{}
		for _, t := range cb.Terms {
			f[mo.Cases[t.Case].Name] += t.Factor
		}
		out.Combinations[i] = jsonCombination{Name: cb.Name, Factors: f}
	}
	out.Members = make([]jsonMember, len(a.env.Members))
	for i, em := range a.env.Members {
		m := mo.Members[em.Member]
		jm := jsonMember{Name: m.Name, Start: mo.Nodes[m.Start].Name, End: mo.Nodes[m.End].Name, Length: mo.Length(em.Member)}
		jm.Stations = make([]jsonStation, len(em.Stations))
		for j, st := range em.Stations {
			jm.Stations[j] = jsonStation{X: st.X, N: a.extreme(st.N), V: a.extreme(st.V), M: a.extreme(st.M)}
		}
		out.Members[i] = jm
	}
	out.Reactions = make([]jsonReaction, len(a.env.Reactions))
	for i, r := range a.env.Reactions {
		out.Reactions[i] = jsonReaction{Node: mo.Nodes[r.Node].Name, Fx: a.extreme(r.Fx), Fy: a.extreme(r.Fy), M: a.extreme(r.M)}
	}
	out.Statics = staticsJSON(a.balances())
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	return enc.Encode(&out)
}

// writeCSV writes one row per member, station and effect.
func (a *analysis) writeCSV(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"member", "x (" + u.Length + ")", "effect", "max", "max_by", "min", "min_by", "unit"}); err != nil {
		return err
	}
	for _, em := range a.env.Members {
		name := mo.Members[em.Member].Name
		for _, st := range em.Stations {
			for _, e := range []struct {
				name, unit string
				x          envelope.Extreme
			}{{"N", u.Force, st.N}, {"V", u.Force, st.V}, {"M", u.Moment(), st.M}} {
				if err := cw.Write([]string{name, strconv.FormatFloat(st.X, 'g', 12, 64), e.name, num(e.x.Max), a.comboName(e.x.MaxBy), num(e.x.Min), a.comboName(e.x.MinBy), e.unit}); err != nil {
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
	v, x float64
	by   int
}

// writeSummary prints, per member, the governing max and min of N, V and M
// with where they occur, then the reaction envelopes.
func (a *analysis) writeSummary(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	l := u.Length
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
					hi = peak{x.Max, st.X, x.MaxBy}
				}
				if x.Min < lo.v {
					lo = peak{x.Min, st.X, x.MinBy}
				}
			}
			rows = append(rows, []string{name, e.label, fixed(hi.v), fixed(hi.x), a.comboName(hi.by), fixed(lo.v), fixed(lo.x), a.comboName(lo.by)})
			name = ""
		}
	}
	fmt.Fprintf(w, "Member envelopes (x from the member's start, in %s)\n", l)
	t := newTable(w, "member", "effect", "max", "at x", "governing", "min", "at x", "governing")
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
