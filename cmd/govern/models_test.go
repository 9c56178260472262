package main

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
	"govern/envelope/report"
)

// Small models written as model files, for the tests of what the tables,
// the report and the files show.

// tnode is a [[node]] table.
func tnode(name string, x, y float64, support string) string {
	s := fmt.Sprintf("[[node]]\nname = %q\nx = %g\ny = %g\n", name, x, y)
	if support != "" {
		s += fmt.Sprintf("support = %q\n", support)
	}
	return s
}

// tmember is a [[member]] table named <start>-<end>.
func tmember(start, end, section string) string {
	return fmt.Sprintf("[[member]]\nstart = %q\nend = %q\nsection = %q\n", start, end, section)
}

// tsection is a [[section]] table; depth 0 gives none.
func tsection(name string, e, a, i, depth float64) string {
	s := fmt.Sprintf("[[section]]\nname = %q\nE = %g\nA = %g\nI = %g\n", name, e, a, i)
	if depth > 0 {
		s += fmt.Sprintf("depth = %g\n", depth)
	}
	return s
}

// tudl is a uniform gravity load on the members sel picks, as a case load.
func tudl(sel string, w float64) string {
	return fmt.Sprintf("  [[case.load]]\n  type = \"udl\"\n  on = %q\n  w = %g\n", sel, w)
}

// tpoint is a gravity point load at a distance at from the member's start.
func tpoint(on string, p, at float64) string {
	return fmt.Sprintf("  [[case.load]]\n  type = \"point\"\n  on = %q\n  P = %g\n  at = %g\n", on, p, at)
}

// tdead is a dead load case D holding loads, with a strength combination
// "1.0D" and a service combination "D service", both of factor 1.
func tdead(loads ...string) string {
	return "[[case]]\nname = \"D\"\nkind = \"dead\"\n" + strings.Join(loads, "") +
		"[[combination]]\nname = \"1.0D\"\nfactors = { D = 1.0 }\n" +
		"[[combination]]\nname = \"D service\"\nfactors = { D = 1.0 }\nservice = true\n"
}

// writeModel writes src to a model file in a fresh folder and returns its path.
func writeModel(t *testing.T, src string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "model.toml")
	if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// analyseJob analyses job as govern run does.
func analyseJob(job *modelfile.Job) (*analysis.Result, error) {
	return analysis.Run(context.Background(), &job.Job, analysis.Options{})
}

// analyseModel reads and analyses the model src.
func analyseModel(t *testing.T, src string) *analysis.Result {
	t.Helper()
	job, err := loadModel(writeModel(t, src))
	if err != nil {
		t.Fatal(err)
	}
	a, err := analyseJob(job)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// recorded is one table of design values as the terminal and the report
// show it.
type recorded struct {
	title  string
	header []string
	rows   [][]string
}

// recTables holds the tables of design values of a result.
type recTables struct {
	tables []recorded
}

// summary returns the tables of design values of a.
func summary(t *testing.T, a *analysis.Result) *recTables {
	t.Helper()
	var r recTables
	for _, tb := range report.New(a).Tables() {
		r.tables = append(r.tables, recorded{tb.Title, tb.Header, tb.Rows})
	}
	return &r
}

// find returns the tables whose title starts with prefix.
func (r *recTables) find(prefix string) []recorded {
	var out []recorded
	for _, tb := range r.tables {
		if strings.HasPrefix(tb.title, prefix) {
			out = append(out, tb)
		}
	}
	return out
}

// one returns the table titled prefix, or else the only table whose title
// starts with prefix.
func (r *recTables) one(t *testing.T, prefix string) recorded {
	t.Helper()
	for _, tb := range r.tables {
		if tb.title == prefix {
			return tb
		}
	}
	tbs := r.find(prefix)
	if len(tbs) != 1 {
		var titles []string
		for _, tb := range r.tables {
			titles = append(titles, tb.title)
		}
		t.Fatalf("%d tables titled %q...; the tables are:\n%s", len(tbs), prefix, strings.Join(titles, "\n"))
	}
	return tbs[0]
}

// cell returns the cell of column col (the nth header starting with col,
// n from 0) in the row whose first cells are key.
func (tb recorded) cell(t *testing.T, col string, n int, key ...string) string {
	t.Helper()
	c := -1
	for i, h := range tb.header {
		if strings.HasPrefix(h, col) {
			if n == 0 {
				c = i
				break
			}
			n--
		}
	}
	if c < 0 {
		t.Fatalf("table %q has no column %q: %q", tb.title, col, tb.header)
	}
	for _, row := range tb.rows {
		if len(row) >= len(key) && strings.Join(row[:len(key)], "\x00") == strings.Join(key, "\x00") {
			return row[c]
		}
	}
	t.Fatalf("table %q has no row %q: %q", tb.title, key, tb.rows)
	return ""
}
