package report

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
)

// TextWidth is the width, in characters, the terminal's tables and notes
// are fitted to unless the report is Wide: a table wider than this is
// split into narrower ones, each repeating the columns that name its rows.
const TextWidth = 120

// glued lists the starts of the headers of columns that belong with the
// column before them, and are never split from it: where a value is and
// what governs it, the forces acting with it, the pair of end moments.
var glued = []string{"at x", "governing", "spans loaded", "face at x", "with V", "with Fy", "with M", "M2", "M1/M2", "curvature"}

// keyColumns are second columns that name rows together with the first
// (a member's several rows, a node's components).
var keyColumns = []string{"value", "support", "extreme", "component", "effect"}

// cellWidth is the width a cell takes on the terminal, as escaped. Every
// character counts one: the tables' own text has no wide characters.
func cellWidth(s string) int { return utf8.RuneCountInString(Escape(s)) }

// tableParts returns the columns of each of the narrower tables a table
// is split into to fit width (the whole table when it fits or width is
// not positive): the key columns, then as many whole groups of columns
// as fit. A group wider than the width on its own stands alone.
func tableParts(header []string, rows [][]string, width int) [][]int {
	n := len(header)
	w := make([]int, n)
	for i, h := range header {
		w[i] = cellWidth(h)
	}
	for _, r := range rows {
		for i := range min(len(r), n) {
			w[i] = max(w[i], cellWidth(r[i]))
		}
	}
	all := make([]int, n)
	for i := range all {
		all[i] = i
	}
	span := func(cols []int) int { // the rendered width: padding and rules
		s := 1
		for _, c := range cols {
			s += w[c] + 3
		}
		return s
	}
	if width <= 0 || n < 2 || span(all) <= width {
		return [][]int{all}
	}
	keys := 1
	for _, k := range keyColumns {
		if n > 2 && header[1] == k {
			keys = 2
		}
	}
	var groups [][]int
	for i := keys; i < n; i++ {
		if len(groups) > 0 && isGlued(header[i]) {
			groups[len(groups)-1] = append(groups[len(groups)-1], i)
			continue
		}
		groups = append(groups, []int{i})
	}
	var parts [][]int
	cur := append([]int(nil), all[:keys]...)
	for _, g := range groups {
		next := append(append([]int(nil), cur...), g...)
		if len(cur) > keys && span(next) > width {
			parts = append(parts, cur)
			next = append(append([]int(nil), all[:keys]...), g...)
		}
		cur = next
	}
	return append(parts, cur)
}

func isGlued(h string) bool {
	for _, g := range glued {
		if h == g || strings.HasPrefix(h, g+" ") {
			return true
		}
	}
	return false
}

// pick returns the cells of row at the columns cols ("" past its end).
func pick(row []string, cols []int) []string {
	out := make([]string, len(cols))
	for i, c := range cols {
		if c < len(row) {
			out[i] = row[c]
		}
	}
	return out
}

// renderFitted writes a table fitted to width (see tableParts), under its
// title when it has one: the parts after the first under the title's
// first words and "(continued)". Titles, prose, are wrapped at spaces
// to width as notes are (wrapLines).
func renderFitted(w io.Writer, title string, header []string, rows [][]string, width int) error {
	parts := tableParts(header, rows, width)
	for k, cols := range parts {
		t := title
		if k > 0 {
			t = continued(title)
		}
		if t != "" {
			if _, err := fmt.Fprintf(w, "\n%s\n", wrapLines(EscapeLines(t), width)); err != nil {
				return err
			}
		}
		sub := make([][]string, len(rows))
		for i, r := range rows {
			sub[i] = pick(r, cols)
		}
		if err := renderTable(w, pick(header, cols), sub); err != nil {
			return err
		}
	}
	return nil
}

// continued names the second and later parts of a split table: its
// title up to the first parenthesis or colon, and "(continued)".
func continued(title string) string {
	if i := strings.IndexAny(title, "(:"); i > 0 {
		title = strings.TrimSpace(title[:i])
	}
	if title == "" {
		return "(continued)"
	}
	return title + " (continued)"
}

// wrapLines breaks each line of text longer than width characters at
// spaces, its continuation lines indented as the line itself is; a
// width not positive leaves text as it is (--wide).
func wrapLines(text string, width int) string {
	if width <= 0 {
		return text
	}
	lines := strings.Split(text, "\n")
	for i, l := range lines {
		if utf8.RuneCountInString(l) <= width {
			continue
		}
		indent := l[:len(l)-len(strings.TrimLeft(l, " "))]
		lines[i] = indent + wrap(l, width-len(indent), indent)
	}
	return strings.Join(lines, "\n")
}
