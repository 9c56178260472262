package report

import (
	"fmt"
	"io"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/tw"
)

// tables receives notes and titled tables: the terminal renders them as
// text, the report as HTML.
type tables interface {
	note(text string) error
	table(t Table) error
}

// textTables renders tables as text with box-drawing rules, fitted to
// width (none when not positive; see renderFitted).
type textTables struct {
	w     io.Writer
	width int
}

func (t textTables) note(text string) error {
	_, err := fmt.Fprintf(t.w, "%s\n", wrapLines(EscapeLines(text), t.width))
	return err
}

func (t textTables) table(tb Table) error {
	return renderFitted(t.w, tb.Title, tb.Header, tb.Rows, t.width)
}

// newTable starts a text table for the terminal. Every cell of its header
// and rows is escaped (Escape), whoever fills it.
func newTable(w io.Writer, header ...string) *tablewriter.Table {
	cells := tw.CellFilter{Global: escapeCells}
	t := tablewriter.NewTable(w,
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithRowAlignment(tw.AlignRight),
		tablewriter.WithHeaderAlignment(tw.AlignCenter),
		tablewriter.WithHeaderFilter(cells),
		tablewriter.WithRowFilter(cells),
	)
	t.Header(toAny(header)...)
	return t
}

// renderTable writes a text table of the header and rows.
func renderTable(w io.Writer, header []string, rows [][]string) error {
	t := newTable(w, header...)
	if err := t.Bulk(rows); err != nil {
		return err
	}
	return t.Render()
}

// escapeCells returns the cells of a table row escaped, for newTable. The
// row itself is left as it is: the report renders the same rows.
func escapeCells(cells []string) []string {
	out := make([]string, len(cells))
	for i, c := range cells {
		out[i] = Escape(c)
	}
	return out
}

func toAny(s []string) []any {
	out := make([]any, len(s))
	for i, v := range s {
		out[i] = v
	}
	return out
}

// WriteText writes what the terminal shows of a run, its tables and
// notes fitted to TextWidth unless p.Wide: what was analysed,
// the design values floor by floor and column line by column line, the
// deflections of spans and cantilevers, the reactions, the statics check,
// with crossCheck the cross-check by moment distribution, and the caution.
// Text from the model is escaped (Escape).
func (p *Report) WriteText(w io.Writer, crossCheck bool) error {
	width := TextWidth
	if p.Wide {
		width = 0
	}
	var heading strings.Builder
	p.writeHeading(&heading)
	if _, err := io.WriteString(w, wrapLines(heading.String(), width)); err != nil {
		return err
	}
	tb := textTables{w, width}
	d := p.tables()
	if err := tb.note(d.governing); err != nil {
		return err
	}
	for _, g := range d.groups {
		for _, t := range g.tables {
			if err := tb.table(t); err != nil {
				return err
			}
		}
	}
	for _, t := range []*Table{d.deflection, d.limits, d.reactions, d.withReactions, d.reduction, d.reducedReactions} {
		if t != nil {
			if err := tb.table(*t); err != nil {
				return err
			}
		}
	}
	for _, t := range d.stability {
		if err := tb.table(t); err != nil {
			return err
		}
	}
	if err := tb.note(d.staticsTop); err != nil {
		return err
	}
	if err := tb.table(d.statics); err != nil {
		return err
	}
	if crossCheck {
		if err := p.writeCrossCheck(w); err != nil {
			return err
		}
	}
	_, err := fmt.Fprintf(w, "\n%s\n", wrapLines(Caution, width))
	return err
}

// writeHeading prints what was analysed.
func (p *Report) writeHeading(w io.Writer) {
	job, mo, env := p.job(), p.model(), p.res.Envelope
	if job.Title != "" {
		fmt.Fprintf(w, "%s\n", Escape(job.Title))
	}
	fmt.Fprintf(w, "%d nodes, %d members, %d equations; %d load cases, %s; %d stations per member; variable loads %s\n",
		len(mo.Nodes), len(mo.Members), p.res.Info.Equations, len(mo.Cases), p.combinationCount(), env.Settings.Stations, variableLoads(env.Settings.AsWritten))
	if n := p.res.FaceCount(); n > 0 {
		fmt.Fprintf(w, "Column faces: %d beam ends get a station at the face of the column they frame into (section depth)\n", n)
	}
	if names := p.patternedNames(); len(names) > 0 {
		for i := range names {
			names[i] = Escape(names[i])
		}
		fmt.Fprintf(w, "Patterned cases %s: %s\n", strings.Join(names, ", "), p.placement())
	}
	if note := p.conditionNote(); note != "" {
		fmt.Fprintf(w, "%s\n", note)
	}
	fmt.Fprintf(w, "%s\n", p.analysisText())
	fmt.Fprintf(w, "Units: %s. N tension positive; %s: x from the left end, M sagging positive (lower face in tension); columns: local -y face in tension; V = dM/dx.\n\n", Escape(p.unitsText()), p.shownFromLeft())
}
