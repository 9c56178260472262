package main

import (
	"encoding/csv"
	"encoding/json"
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

// jsonFormat names the layout of the JSON output; it changes when the layout does.
const jsonFormat = "govern.envelopes/1"

type jsonExtreme struct {
	Max      float64    `json:"max"`
	MaxBy    string     `json:"max_by"`
	MaxSpans []string   `json:"max_spans"`
	MaxWith  jsonForces `json:"max_with"`
	Min      float64    `json:"min"`
	MinBy    string     `json:"min_by"`
	MinSpans []string   `json:"min_spans"`
	MinWith  jsonForces `json:"min_with"`
}

// jsonForces are the forces acting together with an extreme: N, V, M at a
// member station, Fx, Fy, M at a support.
type jsonForces map[string]float64

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
		Stations      int      `json:"stations"`
		VariableLoads string   `json:"variable_loads"`
		Patterns      string   `json:"patterns"`
		Segments      int      `json:"segments"`
		Patterned     []string `json:"patterned_cases"`
	} `json:"settings"`
	Combinations []jsonCombination `json:"combinations"`
	Members      []jsonMember      `json:"members"`
	Reactions    []jsonReaction    `json:"reactions"`
	Caution      string            `json:"caution"`
}

var (
	memberForces   = [3]string{"N", "V", "M"}
	reactionForces = [3]string{"Fx", "Fy", "M"}
)

func (a *analysis) extreme(e envelope.Extreme, names [3]string) jsonExtreme {
	with := func(w [3]float64) jsonForces {
		return jsonForces{names[0]: clean(w[0]), names[1]: clean(w[1]), names[2]: clean(w[2])}
	}
	return jsonExtreme{
		Max: clean(e.Max), MaxBy: a.comboName(e.MaxBy), MaxSpans: a.spanNames(e.MaxSpans), MaxWith: with(e.MaxWith),
		Min: clean(e.Min), MinBy: a.comboName(e.MinBy), MinSpans: a.spanNames(e.MinSpans), MinWith: with(e.MinWith),
	}
}

// spanNames names the pattern pieces of an extreme; never nil, so that JSON
// shows an empty list rather than null.
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

// writeJSON writes the envelopes in the govern.envelopes/1 layout.
func (a *analysis) writeJSON(w io.Writer) error {
	mo := a.job.Model
	var out jsonOutput
	out.Format = jsonFormat
	out.Title = a.job.Title
	out.Units.Force, out.Units.Length = a.job.Units.Force, a.job.Units.Length
	out.Settings.Stations = a.env.Settings.Stations
	out.Settings.VariableLoads = variableLoads(a.env.Settings.AsWritten)
	out.Settings.Patterns, out.Settings.Segments = a.lay.Mode.String(), a.lay.Segments
	out.Settings.Patterned = []string{}
	for _, c := range a.job.Patterned {
		out.Settings.Patterned = append(out.Settings.Patterned, mo.Cases[c].Name)
	}
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
			jm.Stations[j] = jsonStation{X: st.X, N: a.extreme(st.N, memberForces), V: a.extreme(st.V, memberForces), M: a.extreme(st.M, memberForces)}
		}
		out.Members[i] = jm
	}
	out.Reactions = make([]jsonReaction, len(a.env.Reactions))
	for i, r := range a.env.Reactions {
		out.Reactions[i] = jsonReaction{Node: mo.Nodes[r.Node].Name, Fx: a.extreme(r.Fx, reactionForces), Fy: a.extreme(r.Fy, reactionForces), M: a.extreme(r.M, reactionForces)}
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	return enc.Encode(&out)
}

// writeCSV writes one row per member, station and effect.
func (a *analysis) writeCSV(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"member", "x (" + u.Length + ")", "effect", "max", "max_by", "min", "min_by", "unit",
		"max_spans", "min_spans", "max_with_N", "max_with_V", "max_with_M", "min_with_N", "min_with_V", "min_with_M"}); err != nil {
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
					strings.Join(a.spanNames(x.MaxSpans), " "), strings.Join(a.spanNames(x.MinSpans), " "),
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
	v, x  float64
	by    int
	spans []int
}

// shortSpans lists at most three pieces, then how many more.
func (a *analysis) shortSpans(idx []int) string {
	names := a.spanNames(idx)
	if len(names) == 0 {
		return "-"
	}
	if len(names) > 3 {
		names = append(names[:3], fmt.Sprintf("+%d", len(idx)-3))
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
					hi = peak{x.Max, st.X, x.MaxBy, x.MaxSpans}
				}
				if x.Min < lo.v {
					lo = peak{x.Min, st.X, x.MinBy, x.MinSpans}
				}
			}
			row := []string{name, e.label, fixed(hi.v), fixed(hi.x), a.comboName(hi.by), fixed(lo.v), fixed(lo.x), a.comboName(lo.by)}
			if patterned {
				row = slices.Insert(row, 5, a.shortSpans(hi.spans))
				row = append(row, a.shortSpans(lo.spans))
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
