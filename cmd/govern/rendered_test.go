package main

import (
	"bytes"
	"encoding/xml"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// The tables engineers read, as the command prints them and as the report
// shows them, under test from the outside: every test here runs the
// command through govern(args, stdout, stderr) and reads what it wrote,
// the terminal text and the report's HTML tables, without touching the
// code that formed them. Golden files keep the whole of both for the
// models of testdata/tables; columns_test.go states what each column
// means on models with a known answer.

// renderedUpdate reports whether -update was given: the same flag that
// rewrites the other golden files of this package. It is looked up by
// name, and defined here when no other test file defines it, so that the
// tables' tests do not depend on where that file keeps it.
func renderedUpdate() bool {
	f := flag.Lookup("update")
	if f == nil {
		return false
	}
	g, ok := f.Value.(flag.Getter)
	if !ok {
		return false
	}
	b, _ := g.Get().(bool)
	return b
}

func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite the golden files")
	}
}

// renderedDir holds the models of the tables' tests and their golden files.
var renderedDir = filepath.Join("..", "..", "testdata", "tables")

// renderedModels are the models whose tables are kept as golden files:
// every model of testdata/tables, and the model of the JSON and CSV golden
// files (patterned live load, column faces, a hinge, wind, service
// combinations), under the name "small".
func renderedModels(t *testing.T) map[string]string {
	t.Helper()
	paths, err := filepath.Glob(filepath.Join(renderedDir, "*.toml"))
	if err != nil || len(paths) == 0 {
		t.Fatalf("no models in %s: %v", renderedDir, err)
	}
	out := map[string]string{"small": filepath.Join("..", "..", "testdata", "output", "small.toml")}
	for _, p := range paths {
		out[strings.TrimSuffix(filepath.Base(p), ".toml")] = p
	}
	return out
}

// renderedOutput is what one run of "govern run --report" shows: the
// terminal text and the report.
type renderedOutput struct {
	text   string
	report []byte
}

// renderedRun runs "govern run --report" on the model at path.
func renderedRun(t *testing.T, path string) renderedOutput {
	t.Helper()
	rep := filepath.Join(t.TempDir(), "report.html")
	var stdout, stderr bytes.Buffer
	if code := govern([]string{"run", "--report", rep, path}, &stdout, &stderr); code != 0 {
		t.Fatalf("govern run %s: exit %d: %s", path, code, stderr.String())
	}
	src, err := os.ReadFile(rep)
	if err != nil {
		t.Fatal(err)
	}
	return renderedOutput{text: stdout.String(), report: src}
}

// renderedCell is one cell of a table. A cell of the report's station
// tables holds a combination's number as its text, the combination's name
// as its title and, under it, the pattern pieces loaded.
type renderedCell struct {
	text, title, pieces string
}

// renderedRow is a row of a table; class is the report's class of the row
// ("mh" for a member's heading row in the station tables, "face" for a
// station at a column face), empty on the terminal.
type renderedRow struct {
	class string
	cells []renderedCell
}

// renderedTable is a table as shown: its title (the line above it on the
// terminal, the headings above it in the report), its header and rows,
// and for the report its class and its markup as written.
type renderedTable struct {
	title  string
	class  string
	header []string
	rows   []renderedRow
	markup []byte
}

// renderedTextTables reads the tables of the terminal output: each is a
// box of rules, its header above the first horizontal rule inside it, and
// its title the line just above it.
func renderedTextTables(t *testing.T, out string) []renderedTable {
	t.Helper()
	lines := strings.Split(out, "\n")
	cells := func(line string) []renderedCell {
		parts := strings.Split(line, "│")
		if len(parts) < 3 {
			t.Fatalf("not a table row: %q", line)
		}
		var cs []renderedCell
		for _, p := range parts[1 : len(parts)-1] {
			cs = append(cs, renderedCell{text: strings.TrimSpace(p)})
		}
		return cs
	}
	var tables []renderedTable
	for i := 0; i < len(lines); i++ {
		if !strings.HasPrefix(lines[i], "┌") {
			continue
		}
		tb := renderedTable{}
		if i > 0 {
			tb.title = lines[i-1]
		}
		i++
		for ; i < len(lines) && strings.HasPrefix(lines[i], "│"); i++ {
			for _, c := range cells(lines[i]) {
				tb.header = append(tb.header, c.text)
			}
		}
		if i == len(lines) || !strings.HasPrefix(lines[i], "├") {
			t.Fatalf("table %q: no rule under its header", tb.title)
		}
		for i++; i < len(lines) && !strings.HasPrefix(lines[i], "└"); i++ {
			if strings.HasPrefix(lines[i], "├") {
				continue
			}
			tb.rows = append(tb.rows, renderedRow{cells: cells(lines[i])})
		}
		if i == len(lines) {
			t.Fatalf("table %q is not closed", tb.title)
		}
		// A table split to fit the terminal: its later parts repeat the
		// columns that name the rows, and are read back into one.
		if strings.HasSuffix(tb.title, "(continued)") && len(tables) > 0 {
			prev := &tables[len(tables)-1]
			k := 0
			for k < 2 && k < len(tb.header) && k < len(prev.header) && tb.header[k] == prev.header[k] {
				k++
			}
			if k == 0 || len(tb.rows) != len(prev.rows) {
				t.Fatalf("table %q does not continue %q: header %q, %d rows against %d", tb.title, prev.title, tb.header, len(tb.rows), len(prev.rows))
			}
			prev.header = append(prev.header, tb.header[k:]...)
			for r := range tb.rows {
				if !slices.Equal(renderedTexts(tb.rows[r].cells[:k]), renderedTexts(prev.rows[r].cells[:k])) {
					t.Fatalf("table %q, row %d: %q does not continue %q", tb.title, r, renderedTexts(tb.rows[r].cells[:k]), renderedTexts(prev.rows[r].cells[:k]))
				}
				prev.rows[r].cells = append(prev.rows[r].cells, tb.rows[r].cells[k:]...)
			}
			continue
		}
		tables = append(tables, tb)
	}
	return tables
}

// renderedReportTables reads every <table> of the report, strictly as XML,
// with the headings (h2, h3, h4) it stands under and its markup exactly as
// written. The drawings are not read.
func renderedReportTables(t *testing.T, src []byte) []renderedTable {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(src))
	d.Strict = true
	var (
		tables   []renderedTable
		headings [3]string // h2, h3, h4
		heading  = -1      // the heading being read, or -1
		tb       *renderedTable
		start    int64
		inHead   bool
		row      *renderedRow
		cell     *renderedCell
		inPieces bool
	)
	for {
		offset := d.InputOffset()
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			line, col := d.InputPos()
			t.Fatalf("report not well-formed at line %d, column %d: %v", line, col, err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			attr := func(name string) string {
				for _, a := range tok.Attr {
					if a.Name.Local == name {
						return a.Value
					}
				}
				return ""
			}
			switch name := tok.Name.Local; {
			case tb == nil && (name == "h2" || name == "h3" || name == "h4"):
				heading = int(name[1] - '2')
				for k := heading; k < len(headings); k++ {
					headings[k] = ""
				}
			case name == "table":
				if tb != nil {
					t.Fatal("a table inside a table")
				}
				var ts []string
				for _, h := range headings {
					if h != "" {
						ts = append(ts, h)
					}
				}
				tb, start = &renderedTable{title: strings.Join(ts, " / "), class: attr("class")}, offset
			case tb != nil && name == "thead":
				inHead = true
			case tb != nil && name == "tr":
				row = &renderedRow{class: attr("class")}
			case row != nil && (name == "td" || name == "th"):
				cell = &renderedCell{title: attr("title")}
			case cell != nil && name == "span" && attr("class") == "sp":
				inPieces = true
			}
		case xml.EndElement:
			switch name := tok.Name.Local; {
			case heading >= 0 && name == "h"+string(rune('2'+heading)):
				heading = -1
			case tb != nil && name == "table":
				tb.markup = append([]byte(nil), src[start:d.InputOffset()]...)
				tables = append(tables, *tb)
				tb = nil
			case tb != nil && name == "thead":
				inHead = false
			case row != nil && name == "tr":
				if inHead {
					for _, c := range row.cells {
						tb.header = append(tb.header, c.text)
					}
				} else {
					tb.rows = append(tb.rows, *row)
				}
				row = nil
			case cell != nil && (name == "td" || name == "th"):
				cell.text = strings.TrimSpace(cell.text)
				row.cells = append(row.cells, *cell)
				cell = nil
			case inPieces && name == "span":
				inPieces = false
			}
		case xml.CharData:
			switch {
			case heading >= 0:
				headings[heading] += string(tok)
			case inPieces:
				cell.pieces += string(tok)
			case cell != nil:
				cell.text += string(tok)
			}
		}
	}
	return tables
}

// renderedReportGolden is the golden text of the report's tables: each
// table's markup as written, under a line naming the headings it stands
// under.
func renderedReportGolden(tables []renderedTable) []byte {
	var b bytes.Buffer
	for _, tb := range tables {
		fmt.Fprintf(&b, "=== %s\n", tb.title)
		b.Write(tb.markup)
		b.WriteString("\n")
	}
	return b.Bytes()
}

// TestRenderedTablesGolden compares the terminal output of "govern run" and
// the tables of its report (not the drawings) for every model of
// testdata/tables, and the model of the JSON and CSV golden files, with the
// golden files testdata/tables/NAME.terminal.golden and NAME.report.golden;
// -update rewrites them:
//
//	go test ./cmd/govern -run TestRenderedTablesGolden -update
//
// Look at the difference before rewriting them. Every run is made twice
// and must give the same bytes both times: a golden file that changed from
// one run to the next would be no check at all (go/printer's golden tests
// check the same of theirs). columns_test.go checks what the values mean;
// this test guards every cell, and the layout, against unintended change.
func TestRenderedTablesGolden(t *testing.T) {
	for name, path := range renderedModels(t) {
		t.Run(name, func(t *testing.T) {
			first, second := renderedRun(t, path), renderedRun(t, path)
			got := map[string][2][]byte{
				"terminal": {[]byte(first.text), []byte(second.text)},
				"report": {renderedReportGolden(renderedReportTables(t, first.report)),
					renderedReportGolden(renderedReportTables(t, second.report))},
			}
			for _, kind := range []string{"terminal", "report"} {
				t.Run(kind, func(t *testing.T) {
					g := got[kind]
					if !bytes.Equal(g[0], g[1]) {
						t.Fatalf("two runs of %s differ:\n%s", path, renderedDiff(g[0], g[1]))
					}
					golden := filepath.Join(renderedDir, name+"."+kind+".golden")
					if renderedUpdate() {
						if err := os.WriteFile(golden, g[0], 0o644); err != nil {
							t.Fatal(err)
						}
					}
					want, err := os.ReadFile(golden)
					if err != nil {
						t.Fatalf("%v (run with -update to write it)", err)
					}
					if bytes.Equal(g[0], want) {
						return
					}
					if err := renderedSame(g[0], want); err != nil {
						t.Errorf("%s differs from the golden file: %v\n%s\n(run go test ./cmd/govern -run TestRenderedTablesGolden -update after checking the change)",
							golden, err, renderedDiff(g[0], want))
					}
				})
			}
		})
	}
}

// renderedNumber matches a number as the tables print one.
var renderedNumber = regexp.MustCompile(`-?[0-9]+(\.[0-9]+)?(e[-+][0-9]+)?`)

// renderedRoundOff is the size below which a number printed in exponent
// form (a joint residual, an imbalance) is round-off, whatever its digits.
const renderedRoundOff = 1e-6

// renderedSame compares two renderings that are not the same bytes, for
// processors whose fused multiply-adds change the last digits of a result:
// line by line, the text between numbers the same but for the widths of
// padding and rules, the numbers the same but for one unit in the last
// printed decimal place, numbers in exponent form below renderedRoundOff
// alike, and whole numbers (counts, combination numbers, L/n) exact.
func renderedSame(got, want []byte) error {
	g, w := strings.Split(string(got), "\n"), strings.Split(string(want), "\n")
	if len(g) != len(w) {
		return fmt.Errorf("%d lines, want %d", len(g), len(w))
	}
	squeeze := strings.NewReplacer(" ", "", "─", "", "┼", "+", "┬", "+", "┴", "+")
	for i := range w {
		if g[i] == w[i] {
			continue
		}
		gn, wn := renderedNumber.FindAllString(g[i], -1), renderedNumber.FindAllString(w[i], -1)
		gt, wt := renderedNumber.Split(g[i], -1), renderedNumber.Split(w[i], -1)
		if len(gn) != len(wn) || len(gt) != len(wt) {
			return fmt.Errorf("line %d: %q, want %q", i+1, g[i], w[i])
		}
		for k := range wt {
			if squeeze.Replace(gt[k]) != squeeze.Replace(wt[k]) {
				return fmt.Errorf("line %d: %q, want %q", i+1, g[i], w[i])
			}
		}
		for k := range wn {
			if !renderedAlike(gn[k], wn[k]) {
				return fmt.Errorf("line %d: %s, want %s in %q", i+1, gn[k], wn[k], w[i])
			}
		}
	}
	return nil
}

func renderedAlike(a, b string) bool {
	if a == b {
		return true
	}
	x, errX := strconv.ParseFloat(a, 64)
	y, errY := strconv.ParseFloat(b, 64)
	if errX != nil || errY != nil {
		return false
	}
	if strings.Contains(a, "e") && strings.Contains(b, "e") {
		return math.Abs(x) < renderedRoundOff && math.Abs(y) < renderedRoundOff
	}
	da, db := renderedDecimals(a), renderedDecimals(b)
	if da == 0 || da != db {
		return false
	}
	return math.Abs(x-y) <= math.Pow(10, -float64(da))*(1+1e-9)
}

// renderedDecimals is the number of digits after the decimal point of a
// printed number.
func renderedDecimals(s string) int {
	if i := strings.IndexByte(s, '.'); i >= 0 {
		j := i + 1
		for j < len(s) && s[j] >= '0' && s[j] <= '9' {
			j++
		}
		return j - i - 1
	}
	return 0
}

// renderedDiff shows the first lines where two renderings differ.
func renderedDiff(got, want []byte) string {
	g, w := strings.Split(string(got), "\n"), strings.Split(string(want), "\n")
	var b strings.Builder
	shown := 0
	for i := 0; i < max(len(g), len(w)) && shown < 6; i++ {
		var gl, wl string
		if i < len(g) {
			gl = g[i]
		}
		if i < len(w) {
			wl = w[i]
		}
		if gl != wl {
			fmt.Fprintf(&b, "line %d:\n  got:  %s\n  want: %s\n", i+1, gl, wl)
			shown++
		}
	}
	return b.String()
}

// TestRenderedSame: the comparison used when the bytes differ lets through
// only what fused multiply-adds can change.
func TestRenderedSame(t *testing.T) {
	for _, tc := range []struct {
		name      string
		got, want string
		same      bool
	}{
		{"last digit", "│ 90.01 │", "│ 90.00 │", true},
		{"two units", "│ 90.02 │", "│ 90.00 │", false},
		{"round-off residuals", "│ 1.7e-13 / 2.1e-14 │", "│ 2.5e-13 / 3.0e-15 │", true},
		{"a residual that is not round-off", "│ 1.7e-3 │", "│ 1.7e-13 │", false},
		{"a combination number", `<td class="c">2</td>`, `<td class="c">3</td>`, false},
		{"a ratio", "│ L/474 │", "│ L/475 │", false},
		{"a name", "│ 1.2D+1.6L │", "│ 0.9D+1.0W │", false},
		{"a sign", "│ -49.50 │", "│ 49.50 │", false},
		{"wider cell", "│ 10.00 │\n└───────┘", "│ 9.99 │\n└──────┘", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			err := renderedSame([]byte(tc.got), []byte(tc.want))
			if (err == nil) != tc.same {
				t.Errorf("renderedSame(%q, %q) = %v, want same %v", tc.got, tc.want, err, tc.same)
			}
		})
	}
}
