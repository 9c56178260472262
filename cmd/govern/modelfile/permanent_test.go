package modelfile

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestPatternedPermanentLoad: pattern = true on a dead case is accepted
// only where the rules that take it give a favourable_factor (BS 8110-1
// clause 3.2.1.2.2: 1.4Gk on the loaded spans and 1.0Gk elsewhere); the
// built-in sets give none, and the refusal under EN 1990 names Table
// A1.2(B) Note 3 (permanent actions from one source take one factor).
func TestPatternedPermanentLoad(t *testing.T) {
	model := func(comb string) string {
		return strings.Replace(base, "kind = \"dead\"", "kind = \"dead\"\npattern = true", 1) + comb
	}
	const rules = `name = "bs8110"
[[rule]]
id = "T2.1"
text = "1.4Gk (1.0Gk where beneficial)"
terms = [ { kind = "dead", factor = 1.4, favourable_factor = 1.0, lead = true } ]
`
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "bs.toml"), []byte(rules), 0o644); err != nil {
		t.Fatal(err)
	}
	drop := "[[combination]]\nname = \"1.4G\"\nfactors = { G = 1.4 }\n"
	for _, tc := range []struct {
		name, src, want string
	}{
		{"EN 1990", strings.Replace(model("[combinations]\nstandard = \"en1990-6.10\"\n"), drop, "", 1),
			`m.toml:23: case "G": pattern = true: combination "6.10 1.35G" (en1990-6.10 6.10) takes dead case "G" with one factor: EN 1990 takes the permanent actions from one source with one factor, γG,sup where their total effect is unfavourable or γG,inf where favourable, not span by span (Table A1.2(B) Note 3)`},
		{"ASCE/SEI 7", strings.Replace(model("[combinations]\nstandard = \"asce7-16-strength\"\n"), drop, "", 1),
			`m.toml:23: case "G": pattern = true: combination "2.3.1-1 1.4G" (asce7-16-strength 2.3.1-1) takes dead case "G" with one factor: its rule gives no favourable_factor`},
		{"a rule file with favourable_factor", strings.Replace(model("[combinations]\nfile = \"bs.toml\"\n"), drop, "", 1), ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job, err := ReadAt(dir, "m.toml", []byte(tc.src))
			if tc.want == "" {
				if err != nil {
					t.Fatal(err)
				}
				cb := job.Combinations[0]
				if cb.Name != "T2.1 1.4/1.0G" || !cb.Terms[0].HasFavourable || cb.Terms[0].Favourable != 1 || len(job.Patterned) != 1 {
					t.Errorf("combination %+v, patterned %v", cb, job.Patterned)
				}
				return
			}
			if err == nil || !strings.HasPrefix(err.Error(), tc.want) {
				t.Errorf("error\n got: %v\nwant: %s", err, tc.want)
			}
		})
	}
}
