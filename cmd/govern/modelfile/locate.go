package modelfile

import (
	"fmt"
	"strings"
)

// locator maps the tables and keys of a file to their lines. The parser has
// already checked the syntax, so a plain line scan is enough: it follows
// [table] and [[array]] headers, counting array elements, and records the
// line of each key in each block.
type locator struct {
	header map[string]int            // block path → header line
	keys   map[string]map[string]int // block path → key → line
}

// blockPath names the i-th element of an array of tables, as
// "case[2].load[0]"; a plain table is its name.
func blockPath(parts ...string) string { return strings.Join(parts, ".") }

func elem(name string, i int) string { return fmt.Sprintf("%s[%d]", name, i) }

func newLocator(src string) *locator {
	loc := &locator{header: map[string]int{"": 0}, keys: map[string]map[string]int{}}
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

// line returns the line of key in block, else the block's header line.
func (l *locator) line(block, key string) int {
	if key != "" {
		if n, ok := l.keys[block][key]; ok {
			return n
		}
	}
	return l.header[block]
}
