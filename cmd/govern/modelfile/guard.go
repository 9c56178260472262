package modelfile

import "strings"

// Limits on the shape of a file, checked before it is parsed. The TOML
// parser's time and memory grow with the square of the depth of nested
// inline tables and of dotted keys (a file of a few hundred kilobytes of
// "{b={b={…" can take many minutes and gigabytes), and the model format
// needs a depth of two, so anything deeper is refused at once.
const (
	// MaxFileSize is the largest model file read, in bytes.
	MaxFileSize = 128 << 20
	// MaxNesting is the deepest nesting of arrays and inline tables, and
	// the most parts a dotted key or table name may have.
	MaxNesting = 16
	// MaxEntries is the most entries a file may have: keys and table
	// headers count one each, an inline table three (besides its keys).
	// Reading takes about 270 bytes an entry at its peak, whatever the
	// kind of entry (docs/errors.md).
	MaxEntries = 6_000_000
)

// inlineEntries is what an inline table counts: the decoder spends on one
// about three times what it spends on a key.
const inlineEntries = 3

// Entries returns how many entries src has, as MaxEntries counts them
// (keys and table headers one each, an inline table three), outside
// strings and comments: what reading it costs memory for, about 270 bytes
// an entry at its peak. It counts as far as the first nesting deeper than
// MaxNesting, or a string left open, where the reader refuses the file or
// leaves it to the parser to report.
func Entries(src []byte) int {
	_, _, _, n := guard(string(src))
	return n
}

// guard scans src for nesting deeper than MaxNesting, outside strings and
// comments, and returns the line and byte offset of the first excess, or
// line 0. It understands just enough TOML to skip strings and comments;
// anything else wrong is left to the parser.
//
// It also counts the file's entries (keys and table headers one each, an
// inline table inlineEntries), which is what decoding costs memory for:
// see MaxEntries.
func guard(src string) (line, off int, msg string, entries int) {
	depth := 0
	dots := 0       // dots in the current run of key parts
	dotted := false // the last significant character was a dot
	blank := true   // nothing but spaces so far on this line
	line = 1
	for i := 0; i < len(src); i++ {
		c := src[i]
		switch c {
		case '\n':
			line++
			dots, dotted = 0, false
			blank = true
		case '#':
			j := strings.IndexByte(src[i:], '\n')
			if j < 0 {
				return 0, 0, "", entries
			}
			i += j - 1
		case '"', '\'':
			end := stringEnd(src, i)
			if end < 0 {
				return 0, 0, "", entries // unterminated: the parser says where
			}
			line += strings.Count(src[i:end], "\n")
			i = end - 1
			dotted, blank = false, false
		case '[', '{':
			switch {
			case c == '{':
				entries += inlineEntries
			case depth == 0 && blank: // a table header
				entries++
			}
			depth++
			dots, dotted, blank = 0, false, false
			if depth > MaxNesting {
				return line, i, "arrays, inline tables or table names nested deeper than the format allows", entries
			}
		case ']', '}':
			depth = max(depth-1, 0)
			dots, dotted, blank = 0, false, false
		case ',', '=':
			if c == '=' {
				entries++
			}
			dots, dotted, blank = 0, false, false
		case '.':
			dots++
			dotted, blank = true, false
			if dots >= MaxNesting {
				return line, i, "a dotted key or table name of more parts than the format allows", entries
			}
		case ' ', '\t', '\r':
			// Whitespace may separate the parts of a dotted key.
		default:
			blank = false
			if dotted {
				dotted = false
			} else if i > 0 && (src[i-1] == ' ' || src[i-1] == '\t') {
				dots = 0 // a new run after whitespace that no dot joined
			}
		}
	}
	return 0, 0, "", entries
}

// stringEnd returns the offset just past the string that starts at src[i]
// (basic, literal, or either multi-line form), or -1 when it does not end.
func stringEnd(src string, i int) int {
	q := src[i]
	if strings.HasPrefix(src[i:], strings.Repeat(string(q), 3)) {
		j := strings.Index(src[i+3:], strings.Repeat(string(q), 3))
		for q == '"' && j >= 0 && escaped(src, i+3+j) {
			k := strings.Index(src[i+3+j+1:], `"""`)
			if k < 0 {
				return -1
			}
			j += 1 + k
		}
		if j < 0 {
			return -1
		}
		end := i + 3 + j + 3
		for end < len(src) && src[end] == q { // up to two quotes may close it
			end++
		}
		return end
	}
	for j := i + 1; j < len(src); j++ {
		switch src[j] {
		case '\n':
			return -1
		case '\\':
			if q == '"' {
				j++
			}
		case q:
			return j + 1
		}
	}
	return -1
}

// escaped reports whether src[j] is preceded by an odd number of backslashes.
func escaped(src string, j int) bool {
	n := 0
	for k := j - 1; k >= 0 && src[k] == '\\'; k-- {
		n++
	}
	return n%2 == 1
}
