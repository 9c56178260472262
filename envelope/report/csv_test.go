package report

import "testing"

// TestCSVCell: a cell that a spreadsheet would take for a formula (it
// begins with =, +, -, @, a tab or a carriage return and is not a number)
// gets a leading apostrophe; numbers and other text are kept.
func TestCSVCell(t *testing.T) {
	for in, want := range map[string]string{
		"=1+1":              "'=1+1",
		`=HYPERLINK("x")`:   `'=HYPERLINK("x")`,
		"+A1":               "'+A1",
		"-B":                "'-B",
		"@SUM(A1:A9)":       "'@SUM(A1:A9)",
		"\tx":               "'\tx",
		"\rx":               "'\rx",
		"-":                 "'-",
		"-Inf":              "'-Inf",
		"+NaN":              "'+NaN",
		"-1e":               "'-1e",
		"--1":               "'--1",
		"-2":                "-2",
		"+3":                "+3",
		"-12.5":             "-12.5",
		"-.5":               "-.5",
		"-1.2e-05":          "-1.2e-05",
		"-4.7E+11":          "-4.7E+11",
		"1.2D+1.6L":         "1.2D+1.6L",
		"2.3.1-5 0.9D-1.0W": "2.3.1-5 0.9D-1.0W",
		"kN·m":              "kN·m",
		"":                  "",
		// A cell that begins with an apostrophe gets one more, so that
		// taking one off gives back every cell: '= and = differ.
		"'=x": "''=x",
		"'":   "''",
		"'a":  "''a",
		"a'":  "a'",
	} {
		if got := csvCell(in); got != want {
			t.Errorf("csvCell(%q) = %q, want %q", in, got, want)
		}
	}
	// The rule to read: one leading apostrophe off any cell that has one.
	read := func(s string) string {
		if len(s) > 0 && s[0] == '\'' {
			return s[1:]
		}
		return s
	}
	for _, s := range []string{"=x", "'=x", "''=x", "'", "-B", "-12.5", "a'b", "'plain"} {
		if got := read(csvCell(s)); got != s {
			t.Errorf("%q written %q reads back %q", s, csvCell(s), got)
		}
	}
}
