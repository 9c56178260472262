package main

import (
	"strings"
	"testing"
	"unicode/utf8"

	"govern/envelope/report"
)

func TestVerifyCommand(t *testing.T) {
	code, out, stderr := exec("verify")
	if code != 0 {
		t.Fatalf("exit %d: %s\n%s", code, stderr, out)
	}
	// Prose is wrapped to the terminal's width: compare it with its
	// spaces and line breaks made single spaces.
	flat := strings.Join(strings.Fields(out), " ")
	for _, want := range []string{" 0 fail", "AISC 3-23 (recalled)", "Pytel & Singer", "by moment distribution", "Statics: in every case", report.Caution} {
		if !strings.Contains(flat, want) {
			t.Errorf("verify output lacks %q", want)
		}
	}
	if code, _, stderr := exec("verify", "extra"); code != 2 || !strings.Contains(stderr, "verify takes no arguments") {
		t.Errorf("extra argument: exit %d, %q", code, stderr)
	}
}

// TestVerifyFitsTheTerminal: every line of govern verify, table and prose,
// fits report.TextWidth characters (terminal tables fit 120
// columns), and each case heads its own checks.
func TestVerifyFitsTheTerminal(t *testing.T) {
	code, out, stderr := exec("verify")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for i, l := range strings.Split(out, "\n") {
		if n := utf8.RuneCountInString(l); n > report.TextWidth {
			t.Errorf("line %d is %d characters wide, more than %d: %q", i+1, n, report.TextWidth, l)
		}
	}
	if !strings.Contains(out, "│ Simple beam, uniform load (L = 6, w = 10)") || !strings.Contains(out, "│ - M at centre = wL²/8") {
		t.Errorf("a case does not head its checks:\n%s", out)
	}
}
