package modelfile

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"

	"govern/combos"
	"govern/envelope"
	"govern/envelope/analysis"
	"govern/frame"
	"govern/patterns"
)

// sentinels are the errors every reported problem wraps.
var sentinels = []error{ErrSyntax, ErrUnknownKey, ErrType, ErrMissing, ErrValue, ErrReference, ErrDuplicate, ErrTooLarge, ErrTooMany}

// fuzzSolveLimit bounds the models the fuzz target goes on to solve, so
// that each input stays fast.
const fuzzSolveLimit = 300

// seedFiles lists the model files the fuzz target starts from: the
// demonstration model and the models of testdata, good and bad, and those
// with values written with units (testdata/units), but for the large
// generated grids, which add nothing but time.
func seedFiles(t testing.TB) []string {
	t.Helper()
	seeds := []string{filepath.Join("..", "demo.toml")}
	for _, pattern := range []string{"*.toml", filepath.Join("bad", "*.toml"), filepath.Join("units", "*.toml")} {
		m, err := filepath.Glob(filepath.Join("..", "..", "..", "testdata", pattern))
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range m {
			if st, err := os.Stat(p); err == nil && st.Size() < 1<<16 {
				seeds = append(seeds, p)
			}
		}
	}
	return seeds
}

// checkProblems fails the test unless err is a list of problems of the
// file called name, each at a line within src and wrapping a sentinel.
func checkProblems(t *testing.T, err error, name string, src []byte) {
	t.Helper()
	var es ErrorList
	if !errors.As(err, &es) || len(es) == 0 {
		t.Fatalf("error is not a list of problems: %v", err)
	}
	lines := bytes.Count(src, []byte("\n")) + 1
	for _, e := range es {
		if e.Pos.File != name || e.Pos.Line < 0 || e.Pos.Line > lines {
			t.Fatalf("problem at %s of a file of %d lines: %v", e.Pos, lines, e)
		}
		known := false
		for _, s := range sentinels {
			known = known || errors.Is(e, s)
		}
		if !known {
			t.Fatalf("problem wraps no sentinel: %v", e)
		}
	}
}

func readSeed(t testing.TB, path string) string {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(src)
}

// FuzzRead feeds the reader and validator arbitrary files, seeded with the
// models of the test suite (patterned cases, a combination rule set), the
// demonstration model and the models of testdata. No input may panic or hang. A rejected file must come back as
// a list of problems, each with the file name, a line within the file and
// one of the sentinels; an accepted one must pass frame.Model.Validate, and
// a small one is analysed (analysis.Run), where the only errors allowed are
// those that describe the model (a mechanism, a size limit, conditioning).
func FuzzRead(f *testing.F) {
	f.Add([]byte(base))
	f.Add([]byte(gridModel))
	f.Add([]byte(portal)) // with a [combinations] rule set
	for _, p := range seedFiles(f) {
		f.Add([]byte(readSeed(f, p)))
	}
	// Hostile edits of the small model (the bad models of testdata are
	// seeds already): strings with lines that look like tables and keys,
	// names and selectors that collide or are empty, a node on a member,
	// nodes within the tolerance with another between them.
	for _, e := range [][2]string{
		{"[[section]]", "title = \"\"\"\n[[node]]\nname = \"z\"\n\"\"\"\n[[section]]"},
		{"[[section]]", "title = '''\n[grid]\nbays = [1]\n'''\n[[section]]"},
		{`on = "a-b"`, `on = ["a-b", "all beams", "level 0", "a-b", ""]`},
		{`on = "a-b"`, `on = []`},
		{`start = "a"`, "name = \"roof\"\nstart = \"a\""},
		{`start = "a"`, "name = \"\"\nstart = \"a\""},
		{"section = \"S\"\n[[case]]", "section = \"S\"\npasses = [\"c\", \"b\"]\n[[node]]\nname = \"c\"\nx = 2.5\ny = 0\n[[node]]\nname = \"e\"\nx = 5.00000000005\ny = 1\n[[member]]\nstart = \"c\"\nend = \"e\"\nsection = \"S\"\n[[case]]"},
		{`kind = "dead"`, "kind = \"Live\"\npattern = true\nreversible = true"},
		{"factors = { G = 1.4 }", "factors = {\n  G = 1.4, # [[case]]\n}"},
	} {
		f.Add([]byte(strings.Replace(base, e[0], e[1], 1)))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		// Lines come from the lexer of keypos.go only where it finds
		// exactly the keys the decoder read.
		var raw map[string]any
		if md, err := toml.Decode(string(src), &raw); err == nil && len(src) <= MaxFileSize {
			if _, _, msg, _ := guard(string(src)); msg == "" && !newKeyPositions(string(src), md.Keys()).agrees {
				t.Fatalf("the key lexer does not find the decoder's keys %v", md.Keys())
			}
		}
		job, err := Read("f.toml", src)
		if err != nil {
			checkProblems(t, err, "f.toml", src)
			return
		}
		mo := job.Model
		if err := mo.Validate(); err != nil {
			t.Fatalf("accepted a model that Validate rejects: %v", err)
		}
		if job.Actions == nil || len(job.Actions.Of) != len(mo.Cases) {
			t.Fatalf("accepted a model without its actions")
		}
		for _, cb := range job.Combinations {
			if c1, c2, clash := job.Actions.Clash(&cb); clash {
				t.Fatalf("combination %q holds cases %d and %d, alternatives of one action", cb.Name, c1, c2)
			}
		}
		if err := job.CheckUnused(); err != nil {
			var es ErrorList
			if !errors.As(err, &es) || len(es) == 0 || !errors.Is(err, ErrUnused) {
				t.Fatalf("unused cases: not a list of problems: %v", err)
			}
		}
		if len(mo.Nodes) > fuzzSolveLimit || len(mo.Members) > fuzzSolveLimit || len(mo.Cases) > 20 || len(job.Combinations) > 50 {
			return
		}
		lay, err := patterns.Expand(mo, job.Patterned, job.Segments, job.Patterns)
		if err != nil || len(lay.Model.Cases) > 100 {
			return // pattern limits are patterns' to test
		}
		// The whole analysis, column faces and spans included.
		if _, err := analysis.Run(context.Background(), &job.Job, analysis.Options{}); err != nil {
			var me *frame.MechanismError
			if !errors.As(err, &me) && !errors.Is(err, frame.ErrTooLarge) && !errors.Is(err, frame.ErrIllConditioned) && !errors.Is(err, frame.ErrNotFinite) &&
				!errors.Is(err, envelope.ErrNotFinite) && !errors.Is(err, analysis.ErrUnused) &&
				!errors.Is(err, analysis.ErrBuckles) && !errors.Is(err, frame.ErrUnstable) {
				t.Fatalf("the analysis failed on an accepted model: %v", err)
			}
		}
	})
}

// FuzzRuleFile feeds the rule file reader arbitrary files, seeded with the
// built-in sets' rule files and the test's own, and hostile edits of it.
// No input may panic or hang. A rejected file must come back as a list of
// problems, each with the file name, a line within the file and a
// sentinel; an accepted set must pass combos.Set.Validate, and expanding
// it against cases of every kind must give combinations or the problems
// of the cases, never a panic.
func FuzzRuleFile(f *testing.F) {
	f.Add([]byte(officeCode))
	seeds, err := filepath.Glob(filepath.Join(setSources, "*.toml"))
	if err != nil {
		f.Fatal(err)
	}
	for _, p := range seeds {
		f.Add([]byte(readSeed(f, p)))
	}
	for _, e := range [][2]string{
		{`text = "1.3G + 1.5(Q or S)"`, "text = \"\"\"\n[[rule]]\nid = \"X\"\n\"\"\""},
		{`kind = ["live", "snow"]`, `kind = []`},
		{`or = [`, `or = [{ or = [] }, `},
		{"  [[rule.terms]]\n  kind", "  [[rule.terms.or]]\n  kind"},
		{`factor = 1.3 }`, `factor = 1e308, sds_factor = 1e308 }`},
	} {
		f.Add([]byte(strings.Replace(officeCode, e[0], e[1], 1)))
	}
	cs := []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}, {Name: "Lr", Kind: combos.RoofLive},
		{Name: "S", Kind: combos.Snow}, {Name: "R", Kind: combos.Rain}, {Name: "W", Kind: combos.Wind},
		{Name: "E", Kind: combos.Seismic}, {Name: "T", Kind: combos.Other}}
	info := []combos.CaseInfo{1: {Category: "B"}, 2: {Category: "H"}, 3: {Category: "snow-nordic"},
		4: {Psi: [3]float64{0.6, 0.5, 0.3}, PsiGiven: [3]bool{true, true, true}}, 5: {Reversible: true},
		6: {Reversible: true}, 7: {Category: "temperature"}}
	f.Fuzz(func(t *testing.T, src []byte) {
		s, err := ReadSet("r.toml", src)
		if err != nil {
			checkProblems(t, err, "r.toml", src)
			return
		}
		if err := s.Validate(); err != nil {
			t.Fatalf("accepted a set that Validate rejects: %v", err)
		}
		_, err = s.Generate(cs, info, combos.Params{SDS: 1, ReducedLive: true})
		var ce combos.CaseErrors
		if err != nil && !errors.As(err, &ce) && !strings.Contains(err.Error(), "more than") {
			t.Fatalf("Generate failed on an accepted set: %v", err)
		}
	})
}
