package modelfile

import (
	"fmt"
	"regexp"
	"strings"
	"unicode/utf8"

	"github.com/BurntSushi/toml"
)

// locator maps the tables and keys of a file to their lines. The parser has
// already checked the syntax, so a plain line scan is enough: it follows
// [table] and [[array]] headers, counting array elements, and records the
// line of each key in each block.
type locator struct {
	header map[string]int            // block path → header line
	keys   map[string]map[string]int // block path → key → line
	// inline maps the keys of inline tables, such as the case names in
	// factors = { D = 1.2, L = 1.6 }, to their line, by block path.
	inline map[string]map[string]int
}

// inlineKey finds the keys of an inline table: a bare or quoted key
// followed by '='.
var inlineKey = regexp.MustCompile(`([A-Za-z0-9_-]+|"[^"]*"|'[^']*')\s*=`)

// blockPath names the i-th element of an array of tables, as
// "case[2].load[0]"; a plain table is its name.
func blockPath(parts ...string) string { return strings.Join(parts, ".") }

func elem(name string, i int) string { return fmt.Sprintf("%s[%d]", name, i) }

func newLocator(src string) *locator {
	loc := &locator{header: map[string]int{"": 0}, keys: map[string]map[string]int{}, inline: map[string]map[string]int{}}
	counts := map[string]int{} // array path (with parent indices) → elements so far
	current := ""
	// arrays maps an array-of-tables name to the indexed path of its
	// latest element, so that [[case.load]] nests under the latest [[case]].
	latest := map[string]string{}
	for n, line := range strings.Split(src, "\n") {
		t := strings.TrimSpace(line)
		switch {
		case strings.HasPrefix(t, "[["):
			name := strings.TrimSpace(strings.TrimSuffix(strings.SplitN(t[2:], "]]", 2)[0], "]]"))
			parent, leaf := "", name
			if i := strings.LastIndex(name, "."); i >= 0 {
				parent, leaf = latest[name[:i]], name[i+1:]
				if parent == "" {
					parent = name[:i]
				}
			}
			key := blockPath(nonEmpty(parent, leaf)...)
			i := counts[key]
			counts[key]++
			current = blockPath(nonEmpty(parent, elem(leaf, i))...)
			latest[name] = current
			loc.header[current] = n + 1
		case strings.HasPrefix(t, "["):
			name := strings.TrimSpace(strings.SplitN(t[1:], "]", 2)[0])
			current = name
			loc.header[current] = n + 1
		default:
			eq := strings.Index(t, "=")
			if eq <= 0 || strings.HasPrefix(t, "#") {
				continue
			}
			k := strings.Trim(strings.TrimSpace(t[:eq]), `"'`)
			if i := strings.Index(k, "."); i >= 0 {
				k = k[:i]
			}
			if loc.keys[current] == nil {
				loc.keys[current] = map[string]int{}
			}
			if _, ok := loc.keys[current][k]; !ok {
				loc.keys[current][k] = n + 1
			}
			if b := strings.IndexByte(t[eq:], '{'); b >= 0 {
				if loc.inline[current] == nil {
					loc.inline[current] = map[string]int{}
				}
				for _, m := range inlineKey.FindAllStringSubmatch(t[eq+b:], -1) {
					ik := strings.Trim(m[1], `"'`)
					if _, ok := loc.inline[current][ik]; !ok {
						loc.inline[current][ik] = n + 1
					}
				}
			}
		}
	}
	return loc
}

func nonEmpty(s ...string) []string {
	out := s[:0:0]
	for _, v := range s {
		if v != "" {
			out = append(out, v)
		}
	}
	return out
}

// line returns the line of key in block, else of key in an inline table of
// block, else of the header of a table or array of tables named key in
// block, else the block's header line.
func (l *locator) line(block, key string) int {
	if key != "" {
		if n, ok := l.keys[block][key]; ok {
			return n
		}
		if n, ok := l.inline[block][key]; ok {
			return n
		}
		for _, sub := range []string{key, elem(key, 0)} {
			if n, ok := l.header[blockPath(nonEmpty(block, sub)...)]; ok {
				return n
			}
		}
	}
	return l.header[block]
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
// line n of src, and that line, indented, with a marker under the column.
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
	return col, fmt.Sprintf("\n    %s\n    %s^", shown.String(), pad.String())
}
