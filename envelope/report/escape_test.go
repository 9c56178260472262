package report

import "testing"

func TestEscape(t *testing.T) {
	for _, tc := range []struct{ name, in, want string }{
		{"plain text is kept", "A1-B1 1.2D+1.6L kN·m ψ0 \\ \"x\"", "A1-B1 1.2D+1.6L kN·m ψ0 \\ \"x\""},
		{"clear the screen", "a\x1b[2Jb", `a\x1b[2Jb`},
		{"set the window title", "\x1b]0;owned\x07", `\x1b]0;owned\x07`},
		{"tab, newline, carriage return", "a\tb\nc\rd", `a\tb\nc\rd`},
		{"NUL and DEL", "\x00\x7f", `\x00\x7f`},
		{"C1 controls", "\u009b31m\u0085", `\u009b31m\u0085`},
		{"right-to-left override and isolates", "\u202eevil\u2066\u2069\u200f\u061c", `\u202eevil\u2066\u2069\u200f\u061c`},
		{"line and paragraph separators", "a\u2028b\u2029", `a\u2028b\u2029`},
		{"bytes that are not UTF-8", "a\xff\xc3", `a\xff\xc3`},
		{"a real replacement character is text", "\ufffd", "\ufffd"},
		{"empty", "", ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := Escape(tc.in); got != tc.want {
				t.Errorf("Escape(%q) = %q, want %q", tc.in, got, tc.want)
			}
		})
	}
	t.Run("lines keep their breaks and tabs", func(t *testing.T) {
		in, want := "x.toml:1:9: bad\x1b[2J\n    a\t= 1\n    \t^", "x.toml:1:9: bad\\x1b[2J\n    a\t= 1\n    \t^"
		if got := EscapeLines(in); got != want {
			t.Errorf("EscapeLines(%q) = %q, want %q", in, got, want)
		}
	})
}
