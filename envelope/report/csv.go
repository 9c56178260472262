package report

import (
	"encoding/csv"
	"io"
	"strconv"
	"strings"

	"govern/envelope"
	"govern/envelope/analysis"
)

// CSVUnitHeader is the header of the CSV's unit column. It also says, where
// a reader of the file sees it, that every value is in the member's own
// axes (docs/output.md), without a second header row or a comment line.
const CSVUnitHeader = "unit (member axes: x from the start node; N + in tension; M + with the local -y face in tension; V = dM/dx; deflection along local y from the chord)"

// WriteCSV writes one row per member, station and effect: N, V and M, and
// with service combinations the deflection, each in the member's own axes
// (docs/output.md). When the stiffness matrix is ill-conditioned the last
// row gives its estimated condition number. Cells that a spreadsheet would
// take for formulas are written as text (csvCell).
func (p *Report) WriteCSV(w io.Writer) error {
	mo := p.model()
	u := p.units()
	f, m, d := p.force, p.moment, p.defl
	cw := newCSVWriter(w)
	fu, mu := " ("+f.Label+")", " ("+m.Label+")"
	header := []string{"member", "x (" + u.Length + ")", "effect", "max", "max_by", "min", "min_by", CSVUnitHeader,
		"max_spans", "min_spans", "max_loaded", "min_loaded", "max_with_N" + fu, "max_with_V" + fu, "max_with_M" + mu, "min_with_N" + fu, "min_with_V" + fu, "min_with_M" + mu, "face"}
	// With live load reduction, two more columns: the factors of the
	// reduced cases on the row's effect, and how they were found.
	reduced := len(p.job().MemberFactors) > 0
	if reduced {
		header = append(header, "live_load_factor", "live_load_basis")
	}
	if err := cw.Write(header); err != nil {
		return err
	}
	for _, em := range p.res.Envelope.Members {
		name := mo.Members[em.Member].Name
		var factor [3]string // the row's extra cells for N, V, M
		var basis string
		if reduced {
			factor, basis = csvFactors(p.job(), em.Member)
		}
		for k, st := range em.Stations {
			face := ""
			if st.Extra {
				face = "true"
			}
			for _, e := range []struct {
				name string
				s    analysis.Shown
				x    envelope.Extreme
			}{{"N", f, st.N}, {"V", f, st.V}, {"M", m, st.M}} {
				x, s := e.x, e.s
				row := []string{name, position(st.X), e.name, num(s.Of(x.Max)), p.comboName(x.MaxBy), num(s.Of(x.Min)), p.comboName(x.MinBy), s.Label,
					strings.Join(p.spanNames(x.MaxSpans), " "), strings.Join(p.spanNames(x.MinSpans), " "), strconv.Itoa(x.MaxLoaded), strconv.Itoa(x.MinLoaded),
					num(f.Of(x.MaxWith[0])), num(f.Of(x.MaxWith[1])), num(m.Of(x.MaxWith[2])), num(f.Of(x.MinWith[0])), num(f.Of(x.MinWith[1])), num(m.Of(x.MinWith[2])), face}
				if reduced {
					row = append(row, factor[strings.Index("NVM", e.name)], basis)
				}
				if err := cw.Write(row); err != nil {
					return err
				}
			}
			if em.Deflection != nil {
				x := em.Deflection[k]
				row := []string{name, position(st.X), "deflection", num(d.Of(x.Max)), p.comboName(x.MaxBy), num(d.Of(x.Min)), p.comboName(x.MinBy), d.Label,
					strings.Join(p.spanNames(x.MaxSpans), " "), strings.Join(p.spanNames(x.MinSpans), " "), strconv.Itoa(x.MaxLoaded), strconv.Itoa(x.MinLoaded),
					"", "", "", "", "", "", face}
				if reduced {
					// Deflections are of the loads as given: never reduced.
					row = append(row, "", "")
				}
				if err := cw.Write(row); err != nil {
					return err
				}
			}
		}
	}
	write := cw.Write
	if reduced {
		// Displacements are of the loads as given: never reduced.
		write = func(row []string) error { return cw.Write(append(row, "", "")) }
	}
	if err := p.csvNodes(write); err != nil {
		return err
	}
	if s := p.src; s != nil {
		// The source, a row each for the whole model, as the condition
		// number below: member and x empty, the name in the effect
		// column, the value in the max column (docs/output.md).
		for _, f := range s.csvFields() {
			row := make([]string, len(header))
			row[2], row[3] = f[0], f[1]
			if err := cw.Write(row); err != nil {
				return err
			}
		}
	}
	if p.conditionNote() != "" {
		// One last row for the whole model; its columns are those of the
		// others (docs/output.md).
		row := make([]string, len(header))
		row[2], row[3] = "condition_number", num(p.res.Condition())
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// csvFactors returns, for member m, the cells of the live load factor
// column for its N, V and M rows, such as "L 0.4000" ("" where no case is
// reduced in it), and of the basis column.
func csvFactors(job *analysis.Job, m int) (cells [3]string, basis string) {
	var b []string
	for _, f := range memberFactors(job, m) {
		name := job.Model.Cases[f.Case].Name
		for j, v := range [3]float64{f.N, f.V, f.M} {
			c := name + " " + factorText(v)
			if j == 0 && f.HasAccompanying && f.Accompanying[0] != f.N {
				c += " (" + factorText(f.Accompanying[0]) + " where " + name + " accompanies)"
			}
			if cells[j] != "" {
				cells[j] += "; "
			}
			cells[j] += c
		}
		s := name + ": " + basisText(f.Basis, job.Units.Length)
		if f.Basis.Ends != "" {
			s += "; V and M by the " + f.Basis.Ends
		}
		b = append(b, s)
	}
	return cells, strings.Join(b, "; ")
}

// csvFields are the source's rows of a CSV: name and value.
func (s *Source) csvFields() [][2]string {
	return [][2]string{{"program", s.Build.String()}, {"model_file", s.File}, {"model_sha256", s.SHA256}, {"run_date", s.date()}}
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
// they are. A cell that begins with an apostrophe gets one more, so that
// the rule to read the file back is one and unambiguous: take one leading
// apostrophe off any cell that has one ("'=x" is written "”=x", "=x" is
// written "'=x"). The CSV writer then quotes the cell where RFC 4180
// requires (a comma, a double quote or a line break in it).
func csvCell(s string) string {
	if s == "" {
		return s
	}
	switch s[0] {
	case '=', '+', '-', '@', '\t', '\r':
		if !isDecimal(s) {
			return "'" + s
		}
	case '\'':
		return "'" + s
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
