package main

import (
	"bufio"
	"fmt"
	"html"
	"io"
	"strconv"
	"strings"
)

// htmlOut writes markup to a buffered writer, keeping the first error.
// The markup is written well-formed (every element closed, attributes
// quoted, only the XML entities), so that it also reads as XML.
type htmlOut struct {
	w   *bufio.Writer
	err error
}

func newHTMLOut(w io.Writer) *htmlOut { return &htmlOut{w: bufio.NewWriterSize(w, 1<<16)} }

// raw writes s as it is: markup.
func (h *htmlOut) raw(s string) *htmlOut {
	if h.err == nil {
		_, h.err = h.w.WriteString(s)
	}
	return h
}

// text writes s escaped, as text or an attribute value.
func (h *htmlOut) text(s string) *htmlOut { return h.raw(esc(s)) }

// printf writes formatted markup; string arguments must be escaped first
// with esc.
func (h *htmlOut) printf(format string, args ...any) *htmlOut {
	if h.err == nil {
		_, h.err = fmt.Fprintf(h.w, format, args...)
	}
	return h
}

func (h *htmlOut) flush() error {
	if h.err != nil {
		return h.err
	}
	return h.w.Flush()
}

// esc escapes s for text or an attribute value, and drops the control
// characters that XML does not allow (a name in a model may hold them).
func esc(s string) string {
	if strings.IndexFunc(s, badXML) >= 0 {
		s = strings.Map(func(r rune) rune {
			if badXML(r) {
				return -1
			}
			return r
		}, s)
	}
	return html.EscapeString(s)
}

func badXML(r rune) bool {
	return (r < 0x20 && r != '\t' && r != '\n' && r != '\r') || r == 0xFFFE || r == 0xFFFF
}

// svgNum formats a drawing coordinate: two decimals are plenty.
func svgNum(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

// isNumber reports whether a table cell holds a number, to align it right.
func isNumber(s string) bool {
	_, err := strconv.ParseFloat(s, 64)
	return err == nil
}

// htmlTables renders tables as HTML, each with a heading.
type htmlTables struct {
	h       *htmlOut
	heading string // "h3", "h4"
}

func (t htmlTables) note(text string) error {
	t.h.raw("<p>")
	for i, line := range strings.Split(strings.TrimSpace(text), "\n") {
		if i > 0 {
			t.h.raw("<br/>")
		}
		t.h.text(line)
	}
	t.h.raw("</p>\n")
	return t.h.err
}

func (t htmlTables) table(title string, header []string, rows [][]string) error {
	h := t.h
	if title != "" {
		h.printf("<%s>%s</%s>\n", t.heading, esc(title), t.heading)
	}
	h.raw("<table>\n")
	if len(header) > 0 {
		h.raw("<thead><tr>")
		for _, c := range header {
			h.raw("<th>").text(c).raw("</th>")
		}
		h.raw("</tr></thead>\n")
	}
	h.raw("<tbody>\n")
	for _, r := range rows {
		h.raw("<tr>")
		for _, c := range r {
			if isNumber(c) {
				h.raw(`<td class="n">`)
			} else {
				h.raw("<td>")
			}
			h.text(c).raw("</td>")
		}
		h.raw("</tr>\n")
	}
	h.raw("</tbody>\n</table>\n")
	return h.err
}
