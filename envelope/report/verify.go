package report

import (
	"fmt"
	"io"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"

	"govern/frame/verification"
)

// WriteVerification writes the results of the verification suite
// (package frame/verification) as a text table for the terminal, or as
// Markdown, as kept in docs/verification.md: a row per check with the
// published and computed values, their relative difference and pass or
// FAIL, then the sources and the statics of every case.
func WriteVerification(w io.Writer, results []verification.Result, markdown bool) error {
	cases, passed := 0, 0
	worst, worstCase := 0.0, ""
	rows := make([][]string, 0, len(results))
	prev := ""
	for _, r := range results {
		name := r.Case
		if name == prev {
			name = ""
		} else {
			cases++
			if r.Statics > worst || worstCase == "" {
				worst, worstCase = r.Statics, r.Case
			}
		}
		prev = r.Case
		res := "pass"
		if r.Pass() {
			passed++
		} else {
			res = "FAIL"
		}
		quantity := r.Quantity
		if r.Method == verification.Distribution {
			quantity += ", by moment distribution"
		}
		src := r.Source.Key
		if r.Source.Recalled {
			src += " (recalled)"
		}
		if markdown {
			rows = append(rows, []string{name, quantity, sig6(r.Published), sig6(r.Computed), relDiff(r.RelDiff()), res, src})
			continue
		}
		// On the terminal the case is a row of its own above its checks,
		// so that the table fits 120 characters.
		if name != "" {
			rows = append(rows, []string{name, "", "", "", "", ""})
		}
		rows = append(rows, []string{"- " + quantity, sig6(r.Published), sig6(r.Computed), relDiff(r.RelDiff()), res, src})
	}
	header := []string{"case", "quantity", "published", "computed", "relative difference", "result", "source"}
	if !markdown {
		header = []string{"case and quantity", "published", "computed", "rel. diff.", "result", "source"}
	}
	var t *tablewriter.Table
	if markdown {
		t = tablewriter.NewTable(w, tablewriter.WithRenderer(renderer.NewMarkdown()), tablewriter.WithHeaderAutoFormat(tw.Off),
			tablewriter.WithRowAutoWrap(tw.WrapNone))
		t.Header(toAny(header)...)
		fmt.Fprintf(w, "%d cases, %d checks: %d pass, %d fail. Units kN and m unless the case says otherwise; moments sagging positive, reactions up and right positive, deflections downward positive.\n\n", cases, len(results), passed, len(results)-passed)
	} else {
		fmt.Fprintf(w, "Verification against published results: %d cases, %d checks, %d pass, %d fail\n", cases, len(results), passed, len(results)-passed)
		fmt.Fprintln(w, wrap("Units kN and m unless the case says otherwise; moments sagging positive, reactions up and right positive, deflections downward positive.", 100, ""))
		t = newTable(w, header...)
		t.Configure(func(c *tablewriter.Config) {
			c.Row.Alignment.PerColumn = []tw.Align{tw.AlignLeft, tw.AlignRight, tw.AlignRight, tw.AlignRight, tw.AlignCenter, tw.AlignLeft}
			c.Row.Formatting.AutoWrap = tw.WrapNormal
			c.Row.ColMaxWidths.PerColumn = tw.Mapper[int, int]{0: 46, 5: 22}
		})
	}
	if err := t.Bulk(rows); err != nil {
		return err
	}
	if err := t.Render(); err != nil {
		return err
	}
	bullet := ""
	if markdown {
		bullet = "- "
	}
	fmt.Fprintf(w, "\nSources (\"recalled\": values recalled from memory, not read from the source for this work):\n")
	if markdown {
		fmt.Fprintln(w)
	}
	for _, s := range verification.Sources() {
		line := fmt.Sprintf("%s%s: %s.", bullet, s.Key, s.Citation)
		if s.Recalled {
			line += " Recalled from memory: " + s.Check + "."
		} else if s.Check != "" {
			line += " " + s.Check + "."
		}
		if !markdown {
			line = wrap(line, 100, "  ")
		}
		fmt.Fprintln(w, line)
	}
	st := fmt.Sprintf("Statics: in every case the reactions balance the loads and the joints are in equilibrium to better than %s of the load (the largest, %s; limit %g).",
		bound(worst), worstCase, verification.StaticsTol)
	if !markdown {
		st = wrap(st, 100, "")
	}
	fmt.Fprintf(w, "\n%s\n", st)
	caution := Caution
	if !markdown {
		caution = wrap(caution, 100, "")
	}
	fmt.Fprintf(w, "\n%s\n", caution)
	return nil
}

// wrap breaks text into lines of at most width characters at spaces,
// indenting the continuation lines.
func wrap(text string, width int, indent string) string {
	var b strings.Builder
	n := 0
	for i, word := range strings.Fields(text) {
		if i > 0 {
			if n+1+len([]rune(word)) > width {
				b.WriteString("\n" + indent)
				n = len(indent)
			} else {
				b.WriteByte(' ')
				n++
			}
		}
		b.WriteString(word)
		n += len([]rune(word))
	}
	return b.String()
}
