package modelfile

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"govern/frame"
)

const gridModel = `
title = "two bays, two storeys"
[units]
force = "kN"
length = "m"
[analysis]
stations = 5
[grid]
bays = [6.0, 4.0]
storeys = [4.0, 3.0]
base = "pinned"
column = "C"
beam = "B"
spacing = 5.0
[[section]]
name = "C"
E = 30e6
A = 0.16
I = 2.1e-3
weight = 3.8
[[section]]
name = "B"
E = 30e6
A = 0.2
I = 4e-3
weight = 5
[[member]]
name = "A2-B2"
release = "start"
[[case]]
name = "D"
kind = "dead"
self_weight = true
  [[case.load]]
  type = "area"
  on = ["all beams"]
  q = 2.0
[[case]]
name = "L"
kind = "live"
pattern = true
  [[case.load]]
  type = "udl"
  on = ["level 1"]
  w = 10
  from = 1.0
  to = 3.0
  [[case.load]]
  type = "point"
  on = "roof"
  P = 20
  at = 2
[[case]]
name = "W"
kind = "wind"
  [[case.load]]
  type = "udl"
  on = ["line A"]
  direction = "x"
  w = 3
  [[case.load]]
  type = "node"
  node = "A2"
  fx = 5
[[combination]]
name = "1.2D+1.6L"
factors = { D = 1.2, L = 1.6 }
`

func TestReadGridModel(t *testing.T) {
	job, err := Read("grid.toml", []byte(gridModel))
	if err != nil {
		t.Fatal(err)
	}
	mo := job.Model
	t.Run("grid nodes and members are named by line and level", func(t *testing.T) {
		if len(mo.Nodes) != 9 || len(mo.Members) != 10 {
			t.Fatalf("%d nodes, %d members; want 9 and 10", len(mo.Nodes), len(mo.Members))
		}
		var names []string
		for _, m := range mo.Members {
			names = append(names, m.Name)
		}
		want := "A0-A1 B0-B1 C0-C1 A1-B1 B1-C1 A1-A2 B1-B2 C1-C2 A2-B2 B2-C2"
		if got := strings.Join(names, " "); got != want {
			t.Errorf("members %s, want %s", got, want)
		}
		if n := mo.Nodes[7]; n.Name != "B2" || n.X != 6 || n.Y != 7 || n.Support != frame.Free {
			t.Errorf("node 7 = %+v", n)
		}
		if n := mo.Nodes[2]; n.Name != "C0" || n.Support != frame.Pinned {
			t.Errorf("node 2 = %+v", n)
		}
		if mo.Members[8].Release != frame.ReleaseStart {
			t.Errorf("A2-B2 release = %v, want start", mo.Members[8].Release)
		}
	})
	t.Run("loads follow their selectors", func(t *testing.T) {
		d := mo.Cases[0]
		// self weight on 10 members plus area load q·spacing on 4 beams
		if len(d.MemberLoads) != 14 {
			t.Fatalf("D has %d member loads, want 14", len(d.MemberLoads))
		}
		if ld := d.MemberLoads[13]; ld.W != 10 || ld.Member != 9 || ld.To != 4 {
			t.Errorf("area load = %+v, want w = 2.0 × 5.0 on B2-C2", ld)
		}
		l := mo.Cases[1]
		if len(l.MemberLoads) != 4 || l.MemberLoads[0].From != 1 || l.MemberLoads[0].To != 3 || !l.MemberLoads[2].Point {
			t.Errorf("L loads = %+v", l.MemberLoads)
		}
		w := mo.Cases[2]
		if len(w.MemberLoads) != 2 || w.MemberLoads[0].Direction != frame.GlobalX || len(w.NodeLoads) != 1 {
			t.Errorf("W loads = %+v", w)
		}
	})
	t.Run("settings and combinations", func(t *testing.T) {
		if job.Settings.Stations != 5 || job.Settings.AsWritten {
			t.Errorf("settings = %+v", job.Settings)
		}
		if len(job.Combinations) != 1 || job.Combinations[0].Factor(1) != 1.6 {
			t.Errorf("combinations = %+v", job.Combinations)
		}
		if len(job.Patterned) != 1 || job.Patterned[0] != 1 || job.Segments != 1 || job.Patterns.String() != "exact" {
			t.Errorf("patterns: cases %v, segments %d, mode %v", job.Patterned, job.Segments, job.Patterns)
		}
	})
}

func TestReadExplicitModelDefaults(t *testing.T) {
	src := `
[[section]]
name = "S"
E = 200e6
A = 0.01
I = 1e-4
[[node]]
name = "a"
x = 0
y = 0
support = "fixed"
[[node]]
name = "b"
x = 5
y = 0
support = "roller"
[[member]]
start = "a"
end = "b"
section = "S"
[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "udl"
  on = "a-b"
  w = 2
`
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if job.Model.Members[0].Name != "a-b" || job.Settings.Stations != 11 || job.Units.Force != "kN" {
		t.Errorf("defaults: member %q, stations %d, units %+v", job.Model.Members[0].Name, job.Settings.Stations, job.Units)
	}
	if len(job.Combinations) != 1 || job.Combinations[0].Name != "G" {
		t.Errorf("without [[combination]] each case is a combination: %+v", job.Combinations)
	}
}

// beamAB is a beam a-b of span 5, fixed at both ends: the first 19 lines of
// the small models the tests edit.
const beamAB = `[[section]]
name = "S"
E = 200e6
A = 0.01
I = 1e-4
[[node]]
name = "a"
x = 0
y = 0
support = "fixed"
[[node]]
name = "b"
x = 5
y = 0
support = "fixed"
[[member]]
start = "a"
end = "b"
section = "S"
`

// base is a small valid model: beamAB with a point load. Each bad input in
// the tests is an edit of it; the line numbers in the expected messages
// count its lines:
//
//	 1 [[section]]    6 [[node]]   11 [[node]]   16 [[member]]   20 [[case]]
//	23 [[case.load]] 28 [[combination]]
const base = beamAB + `[[case]]
name = "G"
kind = "dead"
  [[case.load]]
  type = "point"
  on = "a-b"
  P = 2
  at = 1
[[combination]]
name = "1.4G"
factors = { G = 1.4 }
`

func TestReadErrors(t *testing.T) {
	for _, tc := range []struct {
		name, old, new string
		want           string
		sentinel       error
	}{
		{"syntax error gives line, column and the line", `x = 5`, `x = `, "m.toml:13:5: expected value but found '\\n' instead\n    x = \n        ^", ErrSyntax},
		{"unknown key with a likely misspelling", "support = \"fixed\"\n[[member]]", "suport = \"fixed\"\n[[member]]", `m.toml:15: node "b": unknown key "suport" (did you mean "support"?)`, ErrUnknownKey},
		{"unknown top-level key", `[[section]]`, "titel = \"x\"\n[[section]]", `m.toml:1: unknown key "titel" (did you mean "title"?) at the top level`, ErrUnknownKey},
		{"type error names key and type", `E = 200e6`, `E = false`, `m.toml:3: section "S": E must be a number, or a string of a number and a unit such as "12 kN", not a boolean`, ErrType},
		{"a word where a value is due", `E = 200e6`, `E = "steel"`, `m.toml:3: section "S": E = "steel": "steel" is not a number followed by a unit, such as "12 MPa"`, ErrValue},
		{"non-positive section property", `I = 1e-4`, `I = 0.0`, `m.toml:5: section "S": I = 0: must be greater than zero`, ErrValue},
		{"infinite number", `A = 0.01`, `A = inf`, `m.toml:4: section "S": A must be a finite number, not +Inf`, ErrValue},
		{"unknown section", `section = "S"`, `section = "T"`, `m.toml:19: member 1: section = "T": no such section`, ErrReference},
		{"unknown node", `end = "b"`, `end = "c"`, `m.toml:18: member 1: end = "c": no such node`, ErrReference},
		{"duplicate node", "[[member]]", "[[node]]\nname = \"a\"\nx = 1\ny = 1\n[[member]]", `m.toml:17: node "a": node "a" is defined twice`, ErrDuplicate},
		{"zero-length member", "x = 5\n", "x = 0\n", `m.toml:18: member 1: member "a-b" has zero length`, ErrValue},
		{"point load outside its member", `at = 1`, `at = 7.5`, `m.toml:27: case "G", load 1: member "a-b": at = 7.5 is outside the member (length 5)`, ErrValue},
		{"selector that matches nothing", `on = "a-b"`, `on = "level 3"`, `m.toml:25: case "G", load 1: selector "level 3": levels are numbered 0 to 0`, ErrReference},
		{"unknown member name", `on = "a-b"`, `on = "a-c"`, `m.toml:25: case "G", load 1: selector "a-c": no member of that name, and not one of "level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & " (did you mean "a-b"?)`, ErrReference},
		{"unknown support word", `support = "fixed"` + "\n[[node]]", `support = "clamped"` + "\n[[node]]", `m.toml:10: node "a": support = "clamped": must be one of "fixed", "pinned", "roller", "free"`, ErrValue},
		{"unknown kind", `kind = "dead"`, `kind = "permanent"`, `m.toml:22: case "G": kind = "permanent": must be one of "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature"`, ErrValue},
		{"combination naming a missing case", `factors = { G = 1.4 }`, `factors = { G = 1.4, Q = 1.5 }`, `m.toml:30: combination "1.4G": factors: no case named "Q"`, ErrReference},
		{"combination with no factors", `factors = { G = 1.4 }`, `factors = {}`, `m.toml:30: combination "1.4G": factors is empty: a combination needs at least one case`, ErrValue},
		{"missing required key", "  P = 2\n", "", `m.toml:23: case "G", load 1: P is required`, ErrMissing},
		{"area load without spacing", "type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"area\"\n  on = \"a-b\"\n  q = 1", `m.toml:26: case "G", load 1: an area load needs [grid] spacing, the distance between parallel frames`, ErrMissing},
		{"dead load cannot be patterned", `kind = "dead"`, "kind = \"dead\"\npattern = true", `m.toml:23: case "G": pattern = true: combination "1.4G" takes dead case "G" with one factor; permanent load is placed span by span only by a rule that gives its term a favourable_factor (in a rule file of [combinations])`, ErrValue},
		{"unknown pattern mode", `[[section]]`, "[analysis]\npatterns = \"checkerboard\"\n[[section]]", `m.toml:2: [analysis]: patterns = "checkerboard": must be one of "exact", "code", "full", "exhaustive"`, ErrValue},
		{"segments out of range", `[[section]]`, "[analysis]\nsegments = 0\n[[section]]", `m.toml:2: [analysis]: segments = 0: must be 1 to 20`, ErrValue},
		{"effective depth not positive", `I = 1e-4`, "I = 1e-4\nd = -0.1", `m.toml:6: section "S": d = -0.1: the effective depth must be greater than zero`, ErrValue},
		{"effective depth past the depth", `I = 1e-4`, "I = 1e-4\ndepth = 0.5\nd = 0.6", `m.toml:7: section "S": d = 0.6: the effective depth is more than the section's depth 0.5`, ErrValue},
		{"deflection limit on a strength combination", `factors = { G = 1.4 }`, "factors = { G = 1.4 }\nlimit = 360", `m.toml:31: combination "1.4G": limit = 360: only a service combination has a deflection limit; add service = true`, ErrValue},
		{"deflection limit not positive", `factors = { G = 1.4 }`, "factors = { G = 1.4 }\nservice = true\nlimit = 0", `m.toml:32: combination "1.4G": limit = 0: span/deflection must be positive, such as 360 for span/360`, ErrValue},
		{"deflection limit of a strength set", `[[combination]]`, "[combinations]\nstandard = \"asce7-16-strength\"\nlimit = 240\n[[combination]]", `m.toml:30: [combinations]: limit: asce7-16-strength is not a set of service combinations; only those have a deflection limit`, ErrValue},
		{"fewer than two stations", `[[section]]`, "[analysis]\nstations = 1\n[[section]]", `m.toml:2: [analysis]: stations = 1: need at least 2 (both ends of each member)`, ErrValue},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := strings.Replace(base, tc.old, tc.new, 1)
			if src == base {
				t.Fatalf("edit %q not applied", tc.old)
			}
			_, err := Read("m.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got := err.Error(); got != tc.want {
				t.Errorf("error\n got: %s\nwant: %s", got, tc.want)
			}
			if !errors.Is(err, tc.sentinel) {
				t.Errorf("error does not wrap %v", tc.sentinel)
			}
		})
	}
}

func TestReadReportsEveryProblem(t *testing.T) {
	src := strings.Replace(base, `E = 200e6`, `E = -1.0`, 1)
	src = strings.Replace(src, `at = 1`, `at = 9`, 1)
	src = strings.Replace(src, `[[case]]`, "[[case]]\ncolour = 1", 1)
	_, err := Read("m.toml", []byte(src))
	var es ErrorList
	if !errors.As(err, &es) || len(es) != 3 {
		t.Fatalf("err = %v, want 3 problems", err)
	}
	for i, line := range []int{3, 21, 28} {
		if es[i].Pos.Line != line {
			t.Errorf("problem %d at line %d, want %d: %v", i+1, es[i].Pos.Line, line, es[i])
		}
	}
}

func TestReadDepthAndService(t *testing.T) {
	src := strings.Replace(base, `I = 1e-4`, "I = 1e-4\ndepth = 0.45", 1)
	src = strings.Replace(src, `factors = { G = 1.4 }`, "factors = { G = 1.4 }\n[[combination]]\nname = \"G\"\nfactors = { G = 1.0 }\nservice = true", 1)
	job, err := Read("m.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if d := job.Model.Sections[0].Depth; d != 0.45 {
		t.Errorf("depth = %g, want 0.45", d)
	}
	if cs := job.Combinations; len(cs) != 2 || cs[0].Service || !cs[1].Service {
		t.Errorf("combinations %+v: want the second only marked service", cs)
	}
	job, err = Read("m.toml", []byte(base))
	if err != nil || job.Model.Sections[0].Depth != 0 {
		t.Errorf("without depth: %v, %v", job.Model.Sections[0].Depth, err)
	}
}

var memoryModels = flag.String("memory-models", "", "write the model files whose memory docs/errors.md gives to this folder")

// TestWriteMemoryModels writes, with -memory-models DIR, the files of the
// table of reading memory in docs/errors.md, to be measured with
// /usr/bin/time -v govern check FILE, and checks their entries and sizes.
func TestWriteMemoryModels(t *testing.T) {
	if *memoryModels == "" {
		t.Skip("a tool: give -memory-models DIR to write the files")
	}
	nodes := func(w io.Writer, n int) {
		io.WriteString(w, "[[section]]\nname = \"S\"\nE = 200e6\nA = 0.01\nI = 1e-4\n")
		for i := range n {
			fmt.Fprintf(w, "[[node]]\nname = \"N%d\"\nx = %d.5\ny = %d.25\n", i, i%1000, i/1000)
		}
		io.WriteString(w, "[[case]]\nname = \"G\"\nkind = \"dead\"\n")
	}
	frame := func(w io.Writer, bays, storeys int, comments int) {
		name := func(ln, lv int) string { return fmt.Sprintf("%s%d", LineName(ln), lv) }
		io.WriteString(w, "title = \"explicit frame\"\n\n[[section]]\nname = \"C450\"\nE = 30.0e6\nA = 0.2025\nI = 3.42e-3\n\n[[section]]\nname = \"B350x650\"\nE = 30.0e6\nA = 0.2275\nI = 8.01e-3\n\n")
		for lv := range storeys + 1 {
			for ln := range bays + 1 {
				fmt.Fprintf(w, "[[node]]\nname = %q\nx = %.6g\ny = %.6g\n", name(ln, lv), 7.2*float64(ln), 3.6*float64(lv))
				if lv == 0 {
					io.WriteString(w, "support = \"fixed\"\n")
				}
				io.WriteString(w, "\n")
			}
		}
		member := func(a, b, sec string) {
			fmt.Fprintf(w, "[[member]]\nname = \"%s-%s\"\nstart = %q\nend = %q\nsection = %q\n\n", a, b, a, b, sec)
		}
		for lv := 1; lv <= storeys; lv++ {
			for ln := range bays + 1 {
				member(name(ln, lv-1), name(ln, lv), "C450")
			}
			for ln := 1; ln <= bays; ln++ {
				member(name(ln-1, lv), name(ln, lv), "B350x650")
			}
		}
		for _, c := range []struct {
			name, kind string
			w          float64
		}{{"D", "dead", 20}, {"L", "live", 12}} {
			fmt.Fprintf(w, "[[case]]\nname = %q\nkind = %q\n", c.name, c.kind)
			for lv := 1; lv <= storeys; lv++ {
				for ln := 1; ln <= bays; ln++ {
					fmt.Fprintf(w, "  [[case.load]]\n  type = \"udl\"\n  on = \"%s-%s\"\n  w = %g\n\n", name(ln-1, lv), name(ln, lv), c.w)
				}
			}
		}
		io.WriteString(w, "[analysis]\nstations = 2\n")
		for range comments {
			io.WriteString(w, "# "+strings.Repeat("x", 97)+"\n")
		}
	}
	for _, m := range []struct {
		file    string
		write   func(io.Writer)
		entries int // of the full-size file
		// reads, for the frames: "yes" when the reader accepts the file,
		// "members" when it refuses it for its members alone.
		reads string
	}{
		{"nodes-50MB.toml", func(w io.Writer) { nodes(w, 1_068_137) }, 4_272_556, ""},
		{"nodes-limit.toml", func(w io.Writer) { nodes(w, 1_499_990) }, 5_999_968, ""},
		{"inline-limit.toml", func(w io.Writer) {
			io.WriteString(w, "x = [")
			for range 1_499_990 {
				io.WriteString(w, "{a=1},")
			}
			io.WriteString(w, "{a=1}]\n")
		}, 5_999_965, ""},
		// The frame that fills the entry limit has more members than the
		// envelopes admit: it is read, then refused.
		{"frame-entries.toml", func(w io.Writer) { frame(w, 59, 4585, 0) }, 5_992_914, "members"},
		{"frame-comments-limit.toml", func(w io.Writer) { frame(w, 59, 4585, 423_342) }, 5_992_914, ""},
		// A frame of as many members as the envelopes admit (499,956 of
		// 500,000), narrow enough for the solver's memory limit.
		{"frame-limit.toml", func(w io.Writer) { frame(w, 30, 8196, 0) }, 5_483_298, "yes"},
		{"comments-limit.toml", func(w io.Writer) {
			for range 1_342_176 {
				io.WriteString(w, "# "+strings.Repeat("x", 97)+"\n")
			}
		}, 0, ""},
	} {
		var b bytes.Buffer
		m.write(&b)
		_, _, _, entries := guard(b.String())
		if entries != m.entries || entries > MaxEntries || b.Len() > MaxFileSize {
			t.Errorf("%s: %d entries (want %d, at most %d), %d bytes (at most %d)", m.file, entries, m.entries, MaxEntries, b.Len(), MaxFileSize)
		}
		if err := os.WriteFile(filepath.Join(*memoryModels, m.file), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		if m.reads == "" {
			continue
		}
		_, err := Read(m.file, b.Bytes())
		var es ErrorList
		switch {
		case m.reads == "yes" && err != nil:
			t.Errorf("%s: %v", m.file, err)
		case m.reads == "members" && (!errors.As(err, &es) || len(es) != 1 || !errors.Is(err, ErrTooLarge) || !strings.HasSuffix(err.Error(), "use fewer members")):
			t.Errorf("%s: %v, want the one problem of too many members", m.file, err)
		}
	}
}
