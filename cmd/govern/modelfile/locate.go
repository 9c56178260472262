package modelfile

import (
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/BurntSushi/toml"
)

// locator gives the lines of the tables and keys of a TOML document (a
// model file or a rule file), from the positions of the keys its decoder
// read (keypos.go).
type locator struct {
	kp *keyPositions
}

func newLocator(src string, keys []toml.Key) *locator {
	return &locator{kp: newKeyPositions(src, keys)}
}

// blockPath names the i-th element of an array of tables, as
// "case[2].load[0]"; a plain table is its name.
func blockPath(parts ...string) string { return strings.Join(parts, ".") }

func elem(name string, i int) string { return fmt.Sprintf("%s[%d]", name, i) }

// place returns the place of the table a block path names.
func blockPlace(block string) *place {
	p := &place{}
	if block == "" {
		return p
	}
	for _, s := range strings.Split(block, ".") {
		q := p.subPlace(s)
		if i := strings.IndexByte(s, '['); i > 0 && strings.HasSuffix(s, "]") {
			if n, err := strconv.Atoi(s[i+1 : len(s)-1]); err == nil {
				q = p.elemPlace(s[:i], n)
			}
		}
		p = &q
	}
	return p
}

// line returns the line of key in the table at block (a block path), else
// of the table or array of tables named key in it, else of the table
// itself; 0 when unknown.
func (l *locator) line(block, key string) int {
	return l.at(blockPlace(block), key)
}

// at is line for a table given by its place.
func (l *locator) at(p *place, key string) int {
	if l == nil {
		return 0
	}
	return l.kp.line(p, key)
}

// lineBounds returns the byte offsets of the start and end (before the
// newline) of line n (1-based) of src, or ok false when there is no such line.
func lineBounds(src string, n int) (start, end int, ok bool) {
	if n < 1 {
		return 0, 0, false
	}
	for i := 1; i < n; i++ {
		j := strings.IndexByte(src[start:], '\n')
		if j < 0 {
			return 0, 0, false
		}
		start += j + 1
	}
	end = len(src)
	if j := strings.IndexByte(src[start:], '\n'); j >= 0 {
		end = start + j
	}
	return start, end, true
}

// syntaxPosition returns the line and byte offset of a parse error. The
// parser's byte offset is trusted over its line count, which goes wrong in
// files with CRLF line ends; an error at the very end of a file that ends
// in a newline is placed at the end of its last line.
func syntaxPosition(src string, p toml.Position) (line, off int) {
	if s := p.Start; s >= 0 && s <= len(src) {
		if s == len(src) && s > 0 && src[s-1] == '\n' {
			s--
		}
		return 1 + strings.Count(src[:s], "\n"), s
	}
	start, end, ok := lineBounds(src, p.Line)
	if !ok {
		return p.Line, 0
	}
	return p.Line, min(start+max(p.Col-1, 0), end)
}

// excerptWidth is the most characters of a line an excerpt shows.
const excerptWidth = 100

// excerpt returns the column (in characters, 1-based) of byte offset off on
// line n of src, and that line, indented, with a marker under the column
// on the next line (an [Error]'s Excerpt).
// Control characters show as '?', and a long line is cut to the part around
// the column. It returns 0 and "" when there is no line n.
func excerpt(src string, n, off int) (col int, text string) {
	start, end, ok := lineBounds(src, n)
	if !ok {
		return 0, ""
	}
	line := strings.TrimSuffix(src[start:end], "\r")
	off = min(max(off-start, 0), len(line))
	col = utf8.RuneCountInString(line[:off]) + 1
	rs := []rune(line)
	for i, r := range rs {
		if r != '\t' && (r < 0x20 || r == 0x7f || r == utf8.RuneError) {
			rs[i] = '?'
		}
	}
	from, to := 0, len(rs)
	if len(rs) > excerptWidth {
		from = max(0, min(col-1-excerptWidth/2, len(rs)-excerptWidth))
		to = from + excerptWidth
	}
	var shown, pad strings.Builder
	if from > 0 {
		shown.WriteString("…")
		pad.WriteByte(' ')
	}
	shown.WriteString(string(rs[from:to]))
	if to < len(rs) {
		shown.WriteString("…")
	}
	for _, r := range rs[from:min(col-1, to)] {
		if r == '\t' {
			pad.WriteByte('\t')
		} else {
			pad.WriteByte(' ')
		}
	}
	return col, fmt.Sprintf("    %s\n    %s^", shown.String(), pad.String())
}
