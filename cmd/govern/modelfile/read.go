package modelfile

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/envelope/reduction"
	"govern/frame"
	"govern/frame/units"
	"govern/patterns"
)

// Units are the labels a model declares for its numbers.
type Units = analysis.Units

// Job is everything a model file asks for: the analysis job (the frame,
// its cases, combinations and settings), with what the file adds.
type Job struct {
	analysis.Job
	Grid *Grid // nil when the file has no [grid]
	// System is the model's units: its force, length and temperature
	// units, to which every value given with a unit was converted.
	System units.System
	// Assignments are the [[assign]] tables, in file order, and Overlaps
	// the sections and releases they give members that another table
	// gives too (govern check lists them).
	Assignments []Assignment
	Overlaps    []Overlap
	// Project is the optional [project] table: who and what the model is
	// for, shown in the report's header.
	Project Project
	// SHA256 is the SHA-256 of the model file's bytes, in lowercase hex:
	// which file the results are of.
	SHA256 string
	// Entered lists, per load case, its loads as the file gives them
	// (the input echo of the report).
	Entered [][]EnteredLoad

	file      string      // the model's name, for messages
	caseLines map[int]int // the line of each case no combination uses
	// moments holds, for a moment applied at a node where every member
	// end is released, by case and node index, the line of the first load
	// that applies one and how messages name it (MomentLoad).
	moments map[[2]int]loadLine
}

// loadLine is where a load is in the model file.
type loadLine struct {
	line  int
	where string // such as `case "M", load 1`
}

// MomentLoad returns the line of the load at fault, and how messages name
// it, when err is a mechanism for a moment applied at a node where every
// member end is released (a frame.MechanismError naming the node and the
// case); ok is false otherwise.
func (j *Job) MomentLoad(err error) (line int, where string, ok bool) {
	var me *frame.MechanismError
	if !errors.As(err, &me) || j.moments == nil {
		return 0, "", false
	}
	for _, f := range me.Free {
		if f.Case == "" {
			continue
		}
		for key, at := range j.moments {
			if j.Model.Cases[key[0]].Name == f.Case && j.Model.Nodes[key[1]].Name == f.Node {
				return at.line, at.where, true
			}
		}
	}
	return 0, "", false
}

// Read parses and validates a model file. name is used in messages only.
// All problems found are returned together as an [ErrorList]: a syntax
// error alone, since the rest of the file cannot be understood, else every
// problem the reader finds (at most [MaxProblems], then a count of the
// rest), in file order.
func Read(name string, src []byte) (*Job, error) { return ReadAt("", name, src) }

// ReadAt is [Read] for a model in folder dir: a rule file that
// [combinations] names is read relative to dir ("" is the current folder).
func ReadAt(dir, name string, src []byte) (*Job, error) {
	if len(src) > MaxFileSize {
		var l ErrorList
		l.Add(Pos{File: name}, "", ErrTooLarge, fmt.Sprintf("the file is %d bytes; the limit is %d (%d MiB)", len(src), MaxFileSize, MaxFileSize>>20))
		return nil, l
	}
	d, raw, err := decode(name, src)
	if err != nil {
		return nil, err
	}
	r := &reader{doc: d, dir: dir}
	job := r.read(raw)
	if err := r.finish(); err != nil {
		return nil, err
	}
	sum := sha256.Sum256(src)
	job.SHA256 = hex.EncodeToString(sum[:])
	// The reader has made every check Validate makes, with the line at
	// fault; this is a safeguard.
	if err := job.Model.Validate(); err != nil {
		var ve frame.ValidationErrors
		if errors.As(err, &ve) {
			for _, e := range ve {
				r.errs.Add(Pos{File: name}, "", ErrValue, e.Error())
			}
			return nil, r.errs
		}
		var l ErrorList
		l.Add(Pos{File: name}, "", ErrValue, err.Error())
		return nil, l
	}
	r.lineUnused(job)
	return job, nil
}

type reader struct {
	*doc        // the model file: its positions and problems
	dir  string // folder of the model, for rule files

	job      *Job
	sections map[string]int
	nodes    map[string]int
	members  map[string]int
	hasW     []bool            // section gives a weight
	thermal  [][2]bool         // section gives alpha, depth (valid or not: a wrong one is reported there)
	broken   map[string]bool   // members named in the file that could not be built
	memLine  []int             // line defining each member (0 for grid members)
	caseInfo []combos.CaseInfo // per case, for the combination rules
	setTable *table            // the [combinations] table, nil without one
	setLimit float64           // [combinations] limit: span/deflection of the generated service combinations without their own

	caseTables []*table // per case, its table, for messages (combinations.go)
	released   []bool   // nodes whose rotation carries nothing, once found (load.go)

	sway       swaySettings    // [analysis] second_order and its keys
	zones      bool            // [analysis] rigid_zones
	zoneFactor float64         // [analysis] rigid_zone_factor
	ownZone    map[[2]int]bool // member and side (0 start, 1 end) that gives its own rigid zone
	permPat    []int           // permanent cases with pattern = true, checked against the combinations

	// Live load reduction (reduction.go): each member's own values, the
	// reduced cases, and [analysis] en1991_rule.
	redMembers    []reduction.Member
	reduce        []reduced
	en1991Smaller bool

	checks // model-wide checks and limits (checks.go)
}

func (r *reader) read(raw map[string]any) *Job {
	top := r.table(raw, "", "")
	r.job = &Job{Job: analysis.Job{Model: &frame.Model{}}}
	job := r.job
	job.Title = top.str("title", "")
	if p := top.sub("project", "[project]"); p != nil {
		job.Project = Project{Name: p.str("name", ""), Number: p.str("number", ""), Engineer: p.str("engineer", ""), Checker: p.str("checker", "")}
		p.done()
	}
	r.readUnits(top)
	job.Settings = analysis.Settings{Stations: 11}
	job.Segments, job.Patterns = 1, patterns.Exact
	if a := top.sub("analysis", "[analysis]"); a != nil {
		job.Settings.Stations = a.integer("stations", 11)
		if job.Settings.Stations < 2 {
			a.fail("stations", problem(ErrValue, "stations = %d: need at least 2 (both ends of each member)", job.Settings.Stations))
		}
		if a.has("stations") && job.Settings.Stations > maxStations {
			a.fail("stations", problem(ErrValue, "stations = %d: at most %d", job.Settings.Stations, maxStations))
		}
		vl := a.str("variable_loads", "adverse")
		if a.oneOf("variable_loads", vl, "adverse", "as-written") {
			job.Settings.AsWritten = vl == "as-written"
		}
		job.Segments = a.integer("segments", 1)
		if job.Segments < 1 || job.Segments > maxSegments {
			a.fail("segments", problem(ErrValue, "segments = %d: must be 1 to %d", job.Segments, maxSegments))
			job.Segments = 1
		}
		pm := a.str("patterns", "exact")
		if a.oneOf("patterns", pm, "exact", "code", "full", "exhaustive") {
			job.Patterns, _ = patterns.ParseMode(pm)
		}
		r.en1991Smaller = readEN1991Rule(a, false)
		r.zones = a.boolean("rigid_zones", false)
		r.zoneFactor = 1
		if f, ok := a.numOK("rigid_zone_factor", 1); ok { // a factor, no unit
			switch {
			case !a.has("rigid_zones") || !r.zones:
				a.fail("rigid_zone_factor", problem(ErrValue, "rigid_zone_factor = %g without rigid_zones = true: the factor scales the rigid end zones that rigid_zones gives", f))
			case f < 0 || f > 1:
				a.fail("rigid_zone_factor", problem(ErrValue, "rigid_zone_factor = %g: must be from 0 to 1", f))
			default:
				r.zoneFactor = f
			}
		}
		r.readSway(a)
		a.done()
	}
	r.readSections(top.array("section", func(i int, m map[string]any) string { return named("section", i, m) }))
	if g := top.sub("grid", "[grid]"); g != nil {
		r.readGrid(g)
	}
	r.readNodes(top.array("node", func(i int, m map[string]any) string { return named("node", i, m) }))
	r.readMembers(top.array("member", func(i int, m map[string]any) string { return named("member", i, m) }))
	r.readAssigns(top.array("assign", func(i int, _ map[string]any) string { return fmt.Sprintf("assign %d", i+1) }))
	if r.zones { // after [[assign]], which may change sections and so depths
		r.rigidZones(r.zoneFactor)
	}
	r.readCases(top.array("case", func(i int, m map[string]any) string { return named("case", i, m) }))
	r.readCombinations(top.array("combination", func(i int, m map[string]any) string { return named("combination", i, m) }))
	r.readCombinationSet(top.sub("combinations", "[combinations]"))
	top.done()
	r.checkModel(top)
	r.generate()
	if len(job.Combinations) == 0 {
		job.Combinations = combos.EachCase(job.Cases)
	}
	r.checkPermanentPatterns()
	r.methods()
	r.reduceCases()
	for i, x := range r.lines() {
		job.Lines = append(job.Lines, analysis.GridLine{Name: LineName(i), X: x})
	}
	for i, y := range r.levels() {
		job.Levels = append(job.Levels, analysis.Level{Name: fmt.Sprintf("level %d", i), Y: y})
	}
	return job
}

// maxStations bounds the stations per member, maxSegments the pattern
// pieces per beam.
const (
	maxStations = 1001
	maxSegments = 20
)

// named describes element i of an array of tables by its name when it has
// one, such as `case "L"`, else by its position, such as "case 3".
func named(kind string, i int, m map[string]any) string {
	if s, ok := m["name"].(string); ok && s != "" {
		return fmt.Sprintf("%s %q", kind, s)
	}
	return fmt.Sprintf("%s %d", kind, i+1)
}

func (r *reader) readSections(ts []*table) {
	r.sections = map[string]int{}
	for _, t := range ts {
		name := t.str("name", "")
		if !t.need("name") {
			t.done()
			continue
		}
		r.nonEmptyName(t, name, "")
		if _, dup := r.sections[name]; dup {
			t.fail("name", problem(ErrDuplicate, "section %q is defined twice", name))
		}
		s := frame.Section{Name: name}
		for _, p := range []struct {
			key string
			q   units.Quantity
			dst *float64
		}{{"E", units.Stress, &s.E}, {"A", units.Area, &s.A}, {"I", units.Inertia, &s.I}} {
			if t.need(p.key) {
				var ok bool
				*p.dst, ok = t.qtyOK(p.key, p.q, 0)
				if ok && *p.dst <= 0 {
					t.fail(p.key, problem(ErrValue, "%s = %g: must be greater than zero", p.key, *p.dst))
				}
			}
		}
		s.Weight = t.qty("weight", units.LineLoad, 0)
		if s.Weight < 0 {
			t.fail("weight", problem(ErrValue, "weight = %g: must not be negative", s.Weight))
		}
		if d, ok := t.qtyOK("depth", units.Length, 0); ok {
			if d <= 0 {
				t.fail("depth", problem(ErrValue, "depth = %g: must be greater than zero", d))
			} else {
				s.Depth = d
			}
		}
		r.sectionSway(t)
		effective := 0.0
		if d, ok := t.qtyOK("d", units.Length, 0); ok {
			switch {
			case !(d > 0):
				t.fail("d", problem(ErrValue, "d = %g: the effective depth must be greater than zero", d))
			case s.Depth > 0 && d > s.Depth:
				t.fail("d", problem(ErrValue, "d = %g: the effective depth is more than the section's depth %g", d, s.Depth))
			default:
				effective = d
			}
		}
		if a, ok := t.qtyOK("alpha", units.Expansion, 0); ok {
			if a <= 0 {
				t.fail("alpha", problem(ErrValue, "alpha = %g: must be greater than zero", a))
			} else {
				s.Alpha = a
			}
		}
		r.sections[name] = len(r.job.Model.Sections)
		r.job.Model.Sections = append(r.job.Model.Sections, s)
		r.job.EffectiveDepths = append(r.job.EffectiveDepths, effective)
		r.hasW = append(r.hasW, t.has("weight"))
		r.thermal = append(r.thermal, [2]bool{t.has("alpha"), t.has("depth")})
		t.done()
	}
}

var releases = map[string]frame.Release{"none": frame.ReleaseNone, "start": frame.ReleaseStart, "end": frame.ReleaseEnd, "both": frame.ReleaseBoth}

func (r *reader) section(t *table, key string) (int, bool) {
	name := t.str(key, "")
	i, ok := r.sections[name]
	if _, isString := t.m[key].(string); !ok && isString {
		msg := fmt.Sprintf("%s = %q: no such section", key, name)
		if s := r.suggest(name, r.sections); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		t.fail(key, problem(ErrReference, "%s", msg))
	}
	return i, ok
}

// suggest returns the name in m that s is likely a misspelling of, or "";
// only while problems are still listed, since it looks at every name.
func (r *reader) suggest(s string, m map[string]int) string {
	if len(r.errs) >= MaxProblems {
		return ""
	}
	return closest(s, keys(m))
}

// nonEmptyName reports an empty name; def, when not "", is the name the
// table takes when it gives none.
func (r *reader) nonEmptyName(t *table, name, def string) {
	switch {
	case name != "" || !t.has("name"):
	case def != "":
		t.fail("name", problem(ErrValue, "name is empty: give a name, or leave name out for %q", def))
	default:
		t.fail("name", problem(ErrValue, "name is empty"))
	}
}

func keys(m map[string]int) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

func (r *reader) readNodes(ts []*table) {
	if r.nodes == nil {
		r.nodes = map[string]int{}
	}
	mo := r.job.Model
	mo.Nodes = slices.Grow(mo.Nodes, len(ts))
	for _, t := range ts {
		r.readNode(t)
		t.release()
	}
}

// readNode reads one [[node]] table.
func (r *reader) readNode(t *table) {
	mo := r.job.Model
	name := t.str("name", "")
	if !t.need("name") {
		t.done()
		return
	}
	r.nonEmptyName(t, name, "")
	if r.gridFailed && !t.has("x") && !t.has("y") {
		// Most likely a change to a node of the grid, which was not
		// generated: nothing to check it against.
		t.skipRest()
		return
	}
	if i, ok := r.nodes[name]; ok && r.job.Grid != nil && r.job.Grid.isGridNode(i) {
		// A grid node named again: it may change the support; its
		// position is the grid's.
		if prev := r.nodeAt.at(i); prev != nil {
			t.fail("name", problem(ErrDuplicate, "grid node %q is already changed at line %d; give each grid node one [[node]] table", name, prev.line("name")))
		}
		nd := &mo.Nodes[i]
		x, y := t.qty("x", units.Length, nd.X), t.qty("y", units.Length, nd.Y)
		if math.Abs(x-nd.X) > coordTol || math.Abs(y-nd.Y) > coordTol {
			t.fail("x", problem(ErrValue, "grid node %q is at (%g, %g), not (%g, %g); a [[node]] may only change a grid node's support", name, nd.X, nd.Y, x, y))
		}
		nd.Support = r.support(t, nd.Support)
		nd.Springs = r.springs(t, nd.Support, nd.Springs)
		r.nodeAt.set(i, t)
		t.done()
		return
	} else if ok {
		t.fail("name", problem(ErrDuplicate, "node %q is defined twice", name))
	}
	has := t.need("x")
	has = t.need("y") && has
	// An invalid coordinate is NaN, so that no check compares with it.
	nd := frame.Node{Name: name, X: t.qty("x", units.Length, math.NaN()), Y: t.qty("y", units.Length, math.NaN()), Support: r.support(t, frame.Free)}
	nd.Springs = r.springs(t, nd.Support, [3]float64{})
	if has {
		r.nodes[name] = len(mo.Nodes)
		r.nodeAt.set(len(mo.Nodes), t)
		mo.Nodes = append(mo.Nodes, nd)
	}
	t.done()
}

// coordTol is the distance under which two coordinates are the same.
const coordTol = 1e-9

func (r *reader) node(t *table, key string) (int, bool) {
	if !t.need(key) {
		return 0, false
	}
	name := t.str(key, "")
	if _, isString := t.m[key].(string); !isString {
		return 0, false // its type is reported
	}
	i, ok := r.nodes[name]
	if !ok && r.gridFailed {
		return i, false // perhaps a node of the grid, which was not generated
	}
	if !ok {
		msg := fmt.Sprintf("%s = %q: no such node", key, name)
		if s := r.suggest(name, r.nodes); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		t.fail(key, problem(ErrReference, "%s", msg))
	}
	return i, ok
}

func (r *reader) readMembers(ts []*table) {
	if r.members == nil {
		r.members = map[string]int{}
	}
	r.broken = map[string]bool{}
	r.passes = passesBy{}
	r.ends = make([][2]int, 0, len(ts))
	mo := r.job.Model
	mo.Members = slices.Grow(mo.Members, len(ts))
	for _, t := range ts {
		r.readMember(t)
		t.release()
	}
}

// readMember reads one [[member]] table.
func (r *reader) readMember(t *table) {
	mo := r.job.Model
	r.ends = append(r.ends, [2]int{r.nodeIndex(t.m["start"]), r.nodeIndex(t.m["end"])})
	name := t.str("name", "")
	if i, ok := r.members[name]; ok && r.job.Grid != nil && r.job.Grid.isGridMember(i) {
		// A grid member named again: section and release may change.
		if prev := r.memberAt.at(i); prev != nil {
			t.fail("name", problem(ErrDuplicate, "grid member %q is already changed at line %d; give each grid member one [[member]] table", name, prev.line("name")))
		}
		m := &mo.Members[i]
		for _, k := range []string{"start", "end"} {
			if t.has(k) {
				if n, ok := r.node(t, k); ok && n != [2]int{m.Start, m.End}[map[string]int{"start": 0, "end": 1}[k]] {
					t.fail(k, problem(ErrValue, "grid member %q: %s cannot be changed", name, k))
				}
			}
		}
		if t.has("section") {
			if s, ok := r.section(t, "section"); ok {
				m.Section = s
			}
		}
		m.Release = r.release(t, m.Release)
		if red, ok := readMemberReduction(t); ok {
			r.setMemberReduction(i, red)
		}
		own := r.memberEnds(t, m, mo.Length(i))
		r.ownZones(i, own)
		r.readPasses(t, i)
		r.memberAt.set(i, t)
		r.sets.set(i, t.has("section"), t.has("release"))
		t.done()
		return
	}
	if r.gridFailed && !t.has("start") && !t.has("end") {
		// Most likely a change to a member of the grid, which was not
		// generated: nothing to check it against.
		t.skipRest()
		r.broken[name] = true
		return
	}
	a, okA := r.node(t, "start")
	b, okB := r.node(t, "end")
	s, okS := 0, false
	if t.need("section") {
		s, okS = r.section(t, "section")
	}
	rel := r.release(t, frame.ReleaseNone)
	i := len(mo.Members)
	passes := r.readPasses(t, i)
	start, okStart := t.m["start"].(string) // already read and checked
	end, okEnd := t.m["end"].(string)
	def := start + "-" + end
	ends := frame.Member{Name: name, Release: rel}
	if ends.Name == "" {
		ends.Name = def
	}
	l := 0.0
	if okA && okB {
		l = math.Hypot(mo.Nodes[b].X-mo.Nodes[a].X, mo.Nodes[b].Y-mo.Nodes[a].Y)
	}
	own := r.memberEnds(t, &ends, l)
	red, hasRed := readMemberReduction(t)
	t.done()
	if okStart && okEnd {
		r.nonEmptyName(t, name, def)
	} else {
		r.nonEmptyName(t, name, "")
	}
	if name == "" {
		name = def
	}
	if isSelector(name) {
		t.fail("name", problem(ErrValue, "the name %q reads as a member selector (%s): choose another name", name, selectorWords))
	}
	if !okA || !okB || !okS {
		r.broken[name] = true
		r.dropPasses(passes, i)
		return
	}
	if _, dup := r.members[name]; dup {
		t.fail("name", problem(ErrDuplicate, "member %q is defined twice", name))
		r.dropPasses(passes, i)
		return
	}
	if a == b || math.Hypot(mo.Nodes[b].X-mo.Nodes[a].X, mo.Nodes[b].Y-mo.Nodes[a].Y) <= coordTol {
		t.fail("end", problem(ErrValue, "member %q has zero length", name))
		r.broken[name] = true
		r.dropPasses(passes, i)
		return
	}
	r.members[name] = i
	if hasRed {
		r.setMemberReduction(i, red)
	}
	r.memberAt.set(i, t)
	r.ownZones(i, own)
	r.sets.set(i, true, t.has("release"))
	mo.Members = append(mo.Members, frame.Member{Name: name, Start: a, End: b, Section: s, Release: rel,
		SpringStart: ends.SpringStart, SpringEnd: ends.SpringEnd, OffsetStart: ends.OffsetStart, OffsetEnd: ends.OffsetEnd})
}

// nodeIndex returns the node named v, or -1.
func (r *reader) nodeIndex(v any) int {
	if s, ok := v.(string); ok {
		if n, ok := r.nodes[s]; ok {
			return n
		}
	}
	return -1
}

// readPasses reads the nodes member i may pass by without being joined to
// them, and reports whether it has any.
func (r *reader) readPasses(t *table, i int) bool {
	if !t.has("passes") {
		return false
	}
	names := t.strs("passes")
	if names != nil && len(names) == 0 {
		t.fail("passes", problem(ErrValue, "passes is empty: name the nodes the member passes by, or leave passes out"))
	}
	for _, s := range names {
		n, ok := r.nodes[s]
		switch {
		case ok:
			r.passes[i] = append(r.passes[i], int32(n))
		case !r.gridFailed:
			msg := fmt.Sprintf("passes: no node named %q", s)
			if c := r.suggest(s, r.nodes); c != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", c)
			}
			t.fail("passes", problem(ErrReference, "%s", msg))
		}
	}
	return len(r.passes[i]) > 0
}

// dropPasses forgets the passes of member i, which could not be built.
func (r *reader) dropPasses(had bool, i int) {
	if had {
		delete(r.passes, i)
	}
}

func (r *reader) release(t *table, def frame.Release) frame.Release {
	s := t.str("release", def.String())
	if !t.oneOf("release", s, "none", "start", "end", "both") {
		return def
	}
	return releases[s]
}

var kindWords = []string{"dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature"}

func (r *reader) readCases(ts []*table) {
	mo := r.job.Model
	seen := map[string]bool{}
	for _, t := range ts {
		problems := len(r.errs) + r.more
		name := t.str("name", "")
		if !t.need("name") {
			t.done()
			continue
		}
		r.nonEmptyName(t, name, "")
		if seen[name] {
			t.fail("name", problem(ErrDuplicate, "case %q is defined twice", name))
		}
		seen[name] = true
		c := frame.Case{Name: name}
		cc := combos.Case{Name: name}
		kindOK := false // what depends on the kind is checked only when it is known
		if t.need("kind") {
			k := t.str("kind", "")
			if t.oneOf("kind", k, kindWords...) {
				cc.Kind, kindOK = combos.ParseKind(k)
			}
		}
		if t.boolean("self_weight", false) && r.budget(t, "self_weight", len(mo.Members)) {
			for m := range mo.Members {
				sec := mo.Members[m].Section
				if !r.hasW[sec] {
					t.fail("self_weight", problem(ErrMissing, "self_weight: section %q has no weight (member %q)", mo.Sections[sec].Name, mo.Members[m].Name))
					break
				}
				if w := mo.Sections[sec].Weight; w != 0 {
					c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, To: mo.Length(m), W: w, WEnd: w})
				}
			}
		}
		pattern := t.boolean("pattern", false) && kindOK
		loads := t.array("load", func(i int, _ map[string]any) string { return fmt.Sprintf("case %q, load %d", name, i+1) })
		read := len(r.errs)+r.more == problems // every load read, with no problem reported
		var ranges []loadRange
		var entered []EnteredLoad
		if c.MemberLoads != nil {
			entered = append(entered, EnteredLoad{Line: t.line("self_weight"), Text: "self_weight = true", Members: len(c.MemberLoads)})
		}
		for _, lt := range loads {
			n, e := len(c.MemberLoads)+len(c.NodeLoads)+len(c.Displacements), len(r.errs)+r.more
			typ, _ := lt.m["type"].(string)
			lr := loadRange{t: lt, typ: typ, from: len(c.MemberLoads), nodesFrom: len(c.NodeLoads)}
			el := EnteredLoad{Line: lt.line(""), Text: entryText(lt.m), FirstMember: len(c.MemberLoads), FirstNode: len(c.NodeLoads), FirstDisplacement: len(c.Displacements)}
			r.readLoad(lt, &c)
			lr.to, lr.nodesTo = len(c.MemberLoads), len(c.NodeLoads)
			ranges = append(ranges, lr)
			el.Members, el.Nodes, el.Displacements = len(c.MemberLoads)-el.FirstMember, len(c.NodeLoads)-el.FirstNode, len(c.Displacements)-el.FirstDisplacement
			entered = append(entered, el)
			if len(c.MemberLoads)+len(c.NodeLoads)+len(c.Displacements) == n || len(r.errs)+r.more != e {
				read = false
			}
		}
		if read && !r.gridFailed && carriesNothing(c) {
			// A case with nothing in it would be named governing where it
			// is only a tie at zero: an error, not a silent extra.
			what := "it has no loads"
			if len(loads) > 0 {
				what = "every load of it is zero"
			}
			t.fail("", problem(ErrMissing, "%s: give it a [[case.load]] (or self_weight = true), or remove the case", what))
		}
		switch {
		case !pattern:
		case c.Imposed():
			t.fail("pattern", problem(ErrValue, "pattern = true: the case imposes deformations (a displacement of a support or a change of temperature), which are not placed span by span"))
		case cc.Kind == combos.Settlement:
			t.fail("pattern", problem(ErrValue, "pattern = true: a settlement case imposes displacements, which are not placed span by span"))
		case cc.Kind.Permanent():
			// Patterned where a rule gives a favourable factor
			// (checkPermanentPatterns, once the combinations are known).
			r.permPat = append(r.permPat, len(mo.Cases))
			r.job.Patterned = append(r.job.Patterned, len(mo.Cases))
		default:
			r.job.Patterned = append(r.job.Patterned, len(mo.Cases))
		}
		info := r.readCaseInfo(t)
		r.readCaseReduction(t, len(mo.Cases), &c, cc.Kind, kindOK, ranges)
		t.done()
		mo.Cases = append(mo.Cases, c)
		r.job.Cases = append(r.job.Cases, cc)
		r.job.Entered = append(r.job.Entered, entered)
		r.caseInfo = append(r.caseInfo, info)
	}
}

// carriesNothing reports whether a case has no load, or only loads of
// zero.
func carriesNothing(c frame.Case) bool {
	for _, l := range c.MemberLoads {
		if l.W != 0 || l.WEnd != 0 || l.P != 0 || l.M != 0 || l.DT != 0 || l.DTGrad != 0 {
			return false
		}
	}
	for _, l := range c.NodeLoads {
		if l.Fx != 0 || l.Fy != 0 || l.M != 0 {
			return false
		}
	}
	for _, d := range c.Displacements {
		if d.Ux != 0 || d.Uy != 0 || d.Rz != 0 {
			return false
		}
	}
	return true
}

func (r *reader) readCombinations(ts []*table) {
	cases := map[string]int{}
	for i, c := range r.job.Model.Cases {
		cases[c.Name] = i
	}
	seen := map[string]bool{}
	for _, t := range ts {
		name := t.str("name", "")
		t.need("name")
		r.nonEmptyName(t, name, "")
		if seen[name] && name != "" {
			t.fail("name", problem(ErrDuplicate, "combination %q is defined twice", name))
		}
		seen[name] = true
		cb := combos.Combination{Name: name, Rule: "model", Service: t.boolean("service", false), Allowable: t.boolean("allowable", false)}
		if cb.Service && cb.Allowable {
			t.fail("allowable", problem(ErrValue, "allowable = true with service = true: a combination is for strength, allowable stress or service, one of them"))
		}
		if v, ok := t.numOK("limit", 0); ok {
			switch {
			case !cb.Service:
				t.fail("limit", problem(ErrValue, "limit = %g: only a service combination has a deflection limit; add service = true", v))
			case !(v > 0):
				t.fail("limit", problem(ErrValue, "limit = %g: span/deflection must be positive, such as 360 for span/360", v))
			default:
				cb.Limit = v
			}
		}
		if t.need("factors") {
			v, _ := t.get("factors")
			f, ok := v.(map[string]any)
			if !ok {
				t.wrongType("factors", "a table of case = factor", v)
			} else if len(f) == 0 {
				t.fail("factors", problem(ErrValue, "factors is empty: a combination needs at least one case"))
			}
			ft := t.inline("factors", f)
			for _, k := range sortedKeys(f) {
				ci, ok := cases[k]
				if !ok {
					msg := fmt.Sprintf("factors: no case named %q", k)
					if s := closest(k, keys(cases)); s != "" {
						msg += fmt.Sprintf(" (did you mean %q?)", s)
					}
					t.fail("factors", problem(ErrReference, "%s", msg))
					continue
				}
				cb.Terms = append(cb.Terms, combos.Term{Case: ci, Factor: ft.num(k, 0)})
			}
			sort.SliceStable(cb.Terms, func(i, j int) bool { return cb.Terms[i].Case < cb.Terms[j].Case })
		}
		t.done()
		r.job.Combinations = append(r.job.Combinations, cb)
	}
}

func sortedKeys(m map[string]any) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}
