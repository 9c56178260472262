package report

import (
	"encoding/xml"
	"strings"
	"testing"
)

func TestEscapeForXML(t *testing.T) {
	for in, want := range map[string]string{
		`A<B & "C" 'D'>`:   `A&lt;B &amp; &#34;C&#34; &#39;D&#39;&gt;`,
		"bell\x07 and\tab": "bell and\tab",
		"plain":            "plain",
	} {
		if got := esc(in); got != want {
			t.Errorf("esc(%q) = %q, want %q", in, got, want)
		}
		d := xml.NewDecoder(strings.NewReader("<p>" + esc(in) + "</p>"))
		d.Strict = true
		for {
			if _, err := d.Token(); err != nil {
				if err.Error() != "EOF" {
					t.Errorf("esc(%q) is not well-formed XML: %v", in, err)
				}
				break
			}
		}
	}
}
