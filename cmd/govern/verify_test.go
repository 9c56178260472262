package main

import (
	"strings"
	"testing"

	"govern/envelope/report"
)

func TestVerifyCommand(t *testing.T) {
	code, out, stderr := exec("verify")
	if code != 0 {
		t.Fatalf("exit %d: %s\n%s", code, stderr, out)
	}
	for _, want := range []string{" 0 fail", "AISC 3-23 (recalled)", "Pytel & Singer", "by moment distribution", "Statics: in every case", report.Caution} {
		if !strings.Contains(out, want) {
			t.Errorf("verify output lacks %q", want)
		}
	}
	if code, _, stderr := exec("verify", "extra"); code != 2 || !strings.Contains(stderr, "verify takes no arguments") {
		t.Errorf("extra argument: exit %d, %q", code, stderr)
	}
}
