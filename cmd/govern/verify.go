package main

import (
	"flag"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"

	"govern/frame/verification"
)

type verifyFlags struct {
	markdown bool
}

var cmdVerify = &command{
	name:  "verify",
	usage: "[--markdown]",
	short: "run the built-in verification suite against published results",
	long: `
Verify solves a built-in suite of published cases with the same solver that
'govern run' uses and compares each result with its published value: beam
table cases of a steel design manual, continuous beams of two to four equal
spans under full and patterned load, rigid frame formulas for single-bay
portals, the fixed-end moment table, deflections, the inflection point of a
fixed-fixed beam, and a textbook example of moment distribution (solved both
by the direct stiffness method and by moment distribution).

Each row gives the case, the quantity, the published value, the computed
value, their relative difference, pass or FAIL against the row's tolerance,
and the source. Sources whose values were recalled from memory are marked so,
and the list under the table says how each was confirmed. Every case also
checks statics: the reactions must balance the loads and every joint must be
in equilibrium. The exit status is 1 if anything fails.

With --markdown the report is written as Markdown, as kept in
docs/verification.md.`,
	flags: func(fs *flag.FlagSet) any {
		f := &verifyFlags{}
		fs.BoolVar(&f.markdown, "markdown", false, "write the report as Markdown")
		return f
	},
	run: func(env *environ, opts any, args []string) error {
		if len(args) != 0 {
			return usagef("verify takes no arguments")
		}
		results := verification.Run(verification.Cases())
		if err := writeVerification(env.stdout, results, opts.(*verifyFlags).markdown); err != nil {
			return err
		}
		failed := 0
		for _, r := range results {
			if !r.Pass() {
				failed++
			}
		}
		if failed > 0 {
			return fmt.Errorf("%d of %d checks failed", failed, len(results))
		}
		return nil
	},
}

// relDiff formats a relative difference; below 1e-12 it is round-off and
// shown as a bound, so that the report does not depend on the last bits of
// the arithmetic.
func relDiff(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	if v < 1e-12 {
		return "< 1e-12"
	}
	return strconv.FormatFloat(v, 'e', 1, 64)
}

// sig formats a value to six significant digits.
func sig(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	return strconv.FormatFloat(clean(v), 'g', 6, 64)
}

// writeVerification prints the verification report as a table or Markdown.
func writeVerification(w io.Writer, results []verification.Result, markdown bool) error {
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
		rows = append(rows, []string{name, quantity, sig(r.Published), sig(r.Computed), relDiff(r.RelDiff()), res, src})
	}
	header := []string{"case", "quantity", "published", "computed", "relative difference", "result", "source"}
	var t *tablewriter.Table
	if markdown {
		t = tablewriter.NewTable(w, tablewriter.WithRenderer(renderer.NewMarkdown()), tablewriter.WithHeaderAutoFormat(tw.Off),
			tablewriter.WithRowAutoWrap(tw.WrapNone))
		t.Header(toAny(header)...)
		fmt.Fprintf(w, "%d cases, %d checks: %d pass, %d fail. Units kN and m unless the case says otherwise; moments sagging positive, reactions up and right positive, deflections downward positive.\n\n", cases, len(results), passed, len(results)-passed)
	} else {
		fmt.Fprintf(w, "Verification against published results: %d cases, %d checks, %d pass, %d fail\n", cases, len(results), passed, len(results)-passed)
		fmt.Fprintf(w, "Units kN and m unless the case says otherwise; moments sagging positive, reactions up and right positive, deflections downward positive.\n")
		t = newTable(w, header...)
		t.Configure(func(c *tablewriter.Config) {
			c.Row.Alignment.PerColumn = []tw.Align{tw.AlignLeft, tw.AlignLeft, tw.AlignRight, tw.AlignRight, tw.AlignRight, tw.AlignCenter, tw.AlignLeft}
			c.Row.Formatting.AutoWrap = tw.WrapNormal
			c.Row.ColMaxWidths.PerColumn = tw.Mapper[int, int]{0: 40, 1: 40, 6: 28}
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

// bound returns the smallest power of ten not below v (at least 1e-16), so
// that a round-off figure is reported without its platform-dependent digits.
func bound(v float64) string {
	return strconv.FormatFloat(math.Pow(10, math.Ceil(math.Log10(math.Max(v, 1e-16)))), 'e', 0, 64)
}

func toAny(s []string) []any {
	out := make([]any, len(s))
	for i, v := range s {
		out[i] = v
	}
	return out
}
