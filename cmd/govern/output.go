package main

import (
	"encoding/csv"
	"io"
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

// writeCSV writes one row per member, station and effect: N, V and M, and
// with service combinations the deflection.
func (a *analysis) writeCSV(w io.Writer) error {
	mo := a.job.Model
	u := a.job.Units
	cw := newCSVWriter(w)
	if err := cw.Write([]string{"member", "x (" + u.Length + ")", "effect", "max", "max_by", "min", "min_by", "unit",
		"max_spans", "min_spans", "max_loaded", "min_loaded", "max_with_N", "max_with_V", "max_with_M", "min_with_N", "min_with_V", "min_with_M", "face"}); err != nil {
		return err
	}
	for _, em := range a.env.Members {
		name := mo.Members[em.Member].Name
		for k, st := range em.Stations {
			face := ""
			if st.Extra {
				face = "true"
			}
			for _, e := range []struct {
				name, unit string
				x          envelope.Extreme
			}{{"N", u.Force, st.N}, {"V", u.Force, st.V}, {"M", u.Moment(), st.M}} {
				x := e.x
				if err := cw.Write([]string{name, strconv.FormatFloat(st.X, 'g', 12, 64), e.name, num(x.Max), a.comboName(x.MaxBy), num(x.Min), a.comboName(x.MinBy), e.unit,
					strings.Join(a.spanNames(x.MaxSpans), " "), strings.Join(a.spanNames(x.MinSpans), " "), strconv.Itoa(x.MaxLoaded), strconv.Itoa(x.MinLoaded),
					num(x.MaxWith[0]), num(x.MaxWith[1]), num(x.MaxWith[2]), num(x.MinWith[0]), num(x.MinWith[1]), num(x.MinWith[2]), face}); err != nil {
					return err
				}
			}
			if em.Deflection != nil {
				x := em.Deflection[k]
				if err := cw.Write([]string{name, strconv.FormatFloat(st.X, 'g', 12, 64), "deflection", num(x.Max), a.comboName(x.MaxBy), num(x.Min), a.comboName(x.MinBy), u.Length,
					strings.Join(a.spanNames(x.MaxSpans), " "), strings.Join(a.spanNames(x.MinSpans), " "), strconv.Itoa(x.MaxLoaded), strconv.Itoa(x.MinLoaded),
					"", "", "", "", "", "", face}); err != nil {
					return err
				}
			}
		}
	}
	if a.conditionNote() != "" {
		// One last row for the whole model; its columns are those of the
		// others (docs/output.md).
		row := make([]string, 19)
		row[2], row[3] = "condition_number", num(a.sol.Cond())
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// csvWriter writes CSV records (RFC 4180, through encoding/csv) whose cells
// cannot be taken for formulas by a spreadsheet: see csvCell.
type csvWriter struct {
	*csv.Writer
	row []string
}

func newCSVWriter(w io.Writer) *csvWriter { return &csvWriter{Writer: csv.NewWriter(w)} }

// Write writes one record, each cell through csvCell.
func (c *csvWriter) Write(record []string) error {
	c.row = c.row[:0]
	for _, s := range record {
		c.row = append(c.row, csvCell(s))
	}
	return c.Writer.Write(c.row)
}

// csvCell returns a CSV cell as it is written. A cell that begins with =,
// +, -, @, a tab or a carriage return and is not a number would be read as
// a formula by a spreadsheet that opens the file (a name such as
// "=HYPERLINK(...)" could run or fetch something), and quoting does not
// stop that: it gets a leading apostrophe, which spreadsheets take as
// "text" and do not show. Numbers such as -12.5 or -1.2e-05 are kept as
// they are. The CSV writer then quotes the cell where RFC 4180 requires (a
// comma, a double quote or a line break in it).
func csvCell(s string) string {
	if s == "" {
		return s
	}
	switch s[0] {
	case '=', '+', '-', '@', '\t', '\r':
		if !isDecimal(s) {
			return "'" + s
		}
	}
	return s
}

// isDecimal reports whether s is a decimal number as a spreadsheet reads
// one: an optional sign, digits with an optional point, an optional
// exponent. "Inf" and "NaN" are not.
func isDecimal(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		exp := 0
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			exp++
		}
		if exp == 0 {
			return false
		}
	}
	return i == len(s)
}

// num formats a value for CSV: shortest exact representation.
func num(v float64) string { return string(appendNum(nil, v)) }

// fixed formats a value for a table with two decimals.
func fixed(v float64) string {
	s := strconv.FormatFloat(v, 'f', 2, 64)
	if s == "-0.00" {
		s = "0.00"
	}
	return s
}

// newTable starts a text table for the terminal. Every cell of its header
// and rows is escaped (escape), whoever fills it.
func newTable(w io.Writer, header ...string) *tablewriter.Table {
	cells := tw.CellFilter{Global: escapeCells}
	t := tablewriter.NewTable(w,
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithRowAlignment(tw.AlignRight),
		tablewriter.WithHeaderAlignment(tw.AlignCenter),
		tablewriter.WithHeaderFilter(cells),
		tablewriter.WithRowFilter(cells),
	)
	h := make([]any, len(header))
	for i, s := range header {
		h[i] = s
	}
	t.Header(h...)
	return t
}

// escapeCells escapes every cell of a table row, for newTable.
func escapeCells(cells []string) []string {
	for i, c := range cells {
		cells[i] = escape(c)
	}
	return cells
}
