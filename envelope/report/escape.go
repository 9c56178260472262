package report

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// Escape returns s as it may be shown on a terminal. A model file's names,
// title and units are the engineer's text, and could carry characters that
// act on the terminal instead of being shown: clear the screen, set the
// window title, move the cursor, reverse the order of what follows. Each
// such character is replaced by a visible escape:
//
//   - tab, newline and carriage return by \t, \n and \r;
//   - the other C0 controls (U+0000 to U+001F), DEL and every byte that is
//     not part of valid UTF-8 by \xHH, such as \x1b for ESC;
//   - the C1 controls (U+0080 to U+009F), the bidirectional formatting
//     characters (U+061C, U+200E, U+200F, U+202A to U+202E, U+2066 to
//     U+2069) and the line and paragraph separators (U+2028, U+2029) by
//     \uHHHH.
//
// Everything else, backslashes included, is kept, and text with nothing to
// escape is returned as it is. Every text written for the terminal passes
// through it: table cells and titles, headings, messages and the progress
// line (docs/output.md). JSON, CSV and HTML keep names as written, by their
// own rules.
func Escape(s string) string {
	i := 0
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		if unsafeRune(r, n) {
			break
		}
		i += n
	}
	if i == len(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 8)
	b.WriteString(s[:i])
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case !unsafeRune(r, n):
			b.WriteString(s[i : i+n])
		case r == '\t':
			b.WriteString(`\t`)
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\r':
			b.WriteString(`\r`)
		case r == utf8.RuneError || r < 0x80:
			b.WriteString(`\x`)
			b.WriteString(hex2(s[i]))
		default:
			b.WriteString(`\u`)
			h := strconv.FormatUint(uint64(r), 16)
			b.WriteString(strings.Repeat("0", 4-len(h)) + h)
		}
		i += n
	}
	return b.String()
}

// unsafeRune reports whether the rune r, decoded from n bytes, is one that
// escape replaces.
func unsafeRune(r rune, n int) bool {
	switch {
	case r == utf8.RuneError && n <= 1: // not valid UTF-8 (a real U+FFFD is 3 bytes)
		return true
	case r < 0x20, r == 0x7f, r >= 0x80 && r <= 0x9f:
		return true
	case r == 0x061c, r == 0x200e, r == 0x200f, r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069:
		return true
	case r == 0x2028, r == 0x2029:
		return true
	}
	return false
}

func hex2(c byte) string {
	const digits = "0123456789abcdef"
	return string([]byte{digits[c>>4], digits[c&15]})
}

// EscapeLines escapes text that is meant to run over several lines, such
// as a message: each line on its own, the line breaks kept, and tabs kept
// too, so that the marker under a quoted line of the model file lines up.
func EscapeLines(text string) string {
	lines := strings.Split(text, "\n")
	for i, line := range lines {
		parts := strings.Split(line, "\t")
		for j, p := range parts {
			parts[j] = Escape(p)
		}
		lines[i] = strings.Join(parts, "\t")
	}
	return strings.Join(lines, "\n")
}
