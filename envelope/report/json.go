package report

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"runtime"
	"slices"
	"strconv"
	"sync"

	"govern/envelope"
	"govern/envelope/analysis"
	"govern/frame"
)

// JSONFormat names the layout of the JSON output; it changes when the layout does.
const JSONFormat = "govern.envelopes/2"

// jsonSigns says, in the JSON itself, what its signs are: the members' own.
const jsonSigns = "member-local: x from each member's start node; N positive in tension; M positive with the member's local -y face in tension; V = dM/dx; deflection along the member's local y, from its chord. Spans: deflection positive up, x from the left end. Reactions: global."

// WriteJSON writes the envelopes in the govern.envelopes/2 layout (see
// docs/output.md). It streams: a large frame's envelopes are written as
// they are formatted, one station to a line, without building the document
// in memory; what follows them (reactions, nodes, storeys, load cases,
// statics: a part the size of a few stations per node and member) is
// formatted meanwhile and held until they are written. Names are encoded
// once and reused. The same result always gives the same bytes.
func (p *Report) WriteJSON(w io.Writer) error {
	job, mo, env := p.job(), p.model(), p.res.Envelope
	bw := bufio.NewWriterSize(w, 1<<16)
	j := &jsonWriter{w: bw}
	combo := make([][]byte, len(env.Combinations))
	for i, cb := range env.Combinations {
		combo[i] = quote(cb.Name)
	}
	piece := make([][]byte, len(env.Pieces))
	for i, pc := range env.Pieces {
		piece[i] = quote(pc.Name)
	}
	j.raw("{\n \"format\": ").str(JSONFormat)
	j.raw(",\n \"title\": ").str(job.Title)
	if s := p.src; s != nil {
		b := s.Build
		j.raw(",\n \"source\": {\"program\": \"govern\", \"version\": ").str(b.Version).raw(", \"revision\": ").str(b.Revision).raw(", \"modified\": ").boolean(b.Modified)
		j.raw(", \"model_file\": ").str(s.File).raw(", \"sha256\": ").str(s.SHA256).raw(", \"date\": ").str(s.date())
		pr := s.Project
		j.raw(", \"project\": {\"name\": ").str(pr.Name).raw(", \"number\": ").str(pr.Number).raw(", \"engineer\": ").str(pr.Engineer).raw(", \"checker\": ").str(pr.Checker).raw("}}")
	}
	// The units of the numbers in the file: forces, moments and
	// deflections in the output units, lengths and positions in the model's.
	j.raw(",\n \"units\": {\"force\": ").str(p.force.Label).raw(", \"length\": ").str(job.Units.Length)
	j.raw(", \"moment\": ").str(p.moment.Label).raw(", \"deflection\": ").str(p.defl.Label).raw("}")
	j.raw(",\n \"signs\": ").str(jsonSigns)
	j.raw(",\n \"settings\": {\"stations\": ").int(env.Settings.Stations)
	j.raw(", \"variable_loads\": ").str(variableLoads(env.Settings.AsWritten))
	j.raw(", \"patterns\": ").str(p.res.Patterns.String()).raw(", \"segments\": ").int(p.res.Segments)
	j.raw(", \"patterned_cases\": [")
	for i, c := range job.Patterned {
		j.sep(i, ", ").str(mo.Cases[c].Name)
	}
	j.raw("]}")
	if p.conditionNote() != "" {
		c := p.res.Condition()
		j.raw(",\n \"condition\": {\"estimate\": ").num(c).raw(", \"digits_lost\": ").num(math.Round(math.Log10(c)))
		j.raw(", \"accepted\": ").boolean(c > frame.RefuseCond).raw("}")
	}
	j.raw(",\n \"combinations\": [")
	for i, cb := range env.Combinations {
		j.sep(i, ",").raw("\n  {\"name\": ").bytes(combo[i]).raw(", \"factors\": {")
		// Factors by case, in case order, summed where a case repeats.
		n := 0
		for c := range mo.Cases {
			f, has := 0.0, false
			for _, t := range cb.Terms {
				if t.Case == c {
					f, has = f+t.Factor, true
				}
			}
			if has {
				j.sep(n, ", ").str(mo.Cases[c].Name).raw(": ").num(f)
				n++
			}
		}
		j.raw("}, \"service\": ").boolean(cb.Service).raw(", \"use\": ").str(use(cb))
		p.jsonCombination(j, i)
		j.raw("}")
	}
	j.raw("\n ],\n \"members\": [")
	// Each effect in its output unit: N, V and Fx, Fy forces, M moments.
	shown := [3]analysis.Shown{p.force, p.force, p.moment}
	// The extreme e of effect d, x its fixed parts (its key and those of
	// the values acting with it), formed once.
	ext := func(j *jsonWriter, x *extKeys, d int, e envelope.Extreme) {
		s := shown[d]
		// The extreme is among the values acting with it, its own effect's
		// (numKept): formatted once.
		j.raw(x.head).numKept(s.Of(e.Max)).raw(", \"max_by\": ").bytes(nameOf(combo, e.MaxBy))
		j.raw(", \"max_spans\": ").listAt(2*d, piece, e.MaxSpans).raw(", \"max_loaded\": ").int(e.MaxLoaded).raw(", \"max_with\": ").forces(&x.with, e.MaxWith, shown, d)
		j.raw(", \"min\": ").numKept(s.Of(e.Min)).raw(", \"min_by\": ").bytes(nameOf(combo, e.MinBy))
		j.raw(", \"min_spans\": ").listAt(2*d+1, piece, e.MinSpans).raw(", \"min_loaded\": ").int(e.MinLoaded).raw(", \"min_with\": ").forces(&x.with, e.MinWith, shown, d).raw("}")
	}
	memberExt := [3]extKeys{newExtKeys("N", memberForces), newExtKeys("V", memberForces), newExtKeys("M", memberForces)}
	defl := func(j *jsonWriter, e envelope.Extreme) {
		d := p.defl
		j.raw("\"deflection\": {\"max\": ").num(d.Of(e.Max)).raw(", \"max_by\": ").bytes(nameOf(combo, e.MaxBy))
		j.raw(", \"max_spans\": ").list(piece, e.MaxSpans).raw(", \"max_loaded\": ").int(e.MaxLoaded)
		j.raw(", \"min\": ").num(d.Of(e.Min)).raw(", \"min_by\": ").bytes(nameOf(combo, e.MinBy))
		j.raw(", \"min_spans\": ").list(piece, e.MinSpans).raw(", \"min_loaded\": ").int(e.MinLoaded).raw("}")
	}
	member := func(j *jsonWriter, i int) {
		em := env.Members[i]
		m := mo.Members[em.Member]
		j.sep(i, ",").raw("\n  {\"name\": ").str(m.Name).raw(", \"start\": ").str(mo.Nodes[m.Start].Name)
		j.raw(", \"end\": ").str(mo.Nodes[m.End].Name).raw(", \"length\": ").num(mo.Length(em.Member))
		if fs := memberFactors(job, em.Member); len(fs) > 0 {
			p.jsonFactors(j, fs)
		}
		j.raw(", \"stations\": [")
		for k, st := range em.Stations {
			j.sep(k, ",").raw("\n   {\"x\": ").num(st.X).raw(", ")
			if st.Extra {
				j.raw("\"face\": true, ")
			}
			ext(j, &memberExt[0], 0, st.N)
			j.raw(", ")
			ext(j, &memberExt[1], 1, st.V)
			j.raw(", ")
			ext(j, &memberExt[2], 2, st.M)
			if em.Deflection != nil {
				j.raw(", ")
				defl(j, em.Deflection[k])
			}
			j.raw("}")
		}
		j.raw("\n  ]}")
	}
	// What follows the members (spans, reactions, nodes and storeys, the
	// load cases, the statics) is formatted meanwhile on another processor,
	// the load cases' results formed there too, into a buffer of its own
	// that is written after them: the same bytes as one after the other.
	rest := later(func(t *jsonWriter) {
		t.raw("\n ]")
		if len(env.Service) > 0 {
			p.jsonSpans(t, combo)
		}
		t.raw(",\n \"reactions\": [")
		for i, r := range env.Reactions {
			// Only the components the support or a spring holds, in "with" too.
			nd := &mo.Nodes[r.Node]
			var keys [3]string
			for d, k := range reactionForces {
				if nd.Reacts(d) {
					keys[d] = k
				}
			}
			t.sep(i, ",").raw("\n  {\"node\": ").str(mo.Nodes[r.Node].Name)
			for d, e := range [3]envelope.Extreme{r.Fx, r.Fy, r.M} {
				if keys[d] != "" {
					t.raw(", ")
					x := newExtKeys(keys[d], keys)
					ext(t, &x, d, e)
				}
			}
			t.raw("}")
		}
		t.raw("\n ]")
		p.jsonStability(t, combo)
		p.jsonCases(t)
		t.raw(",\n \"statics\": [")
		for i, b := range p.res.Statics {
			res := func(r frame.Resultant) {
				t.raw("{\"Fx\": ").num(p.force.Of(r.Fx)).raw(", \"Fy\": ").num(p.force.Of(r.Fy)).raw(", \"M\": ").num(p.moment.Of(r.M)).raw("}")
			}
			t.sep(i, ",").raw("\n  {\"case\": ").str(b.Case).raw(", \"loads\": ")
			res(b.Applied)
			t.raw(", \"reactions\": ")
			res(b.Reactions)
			t.raw(", \"joint_residual\": {\"force\": ").num(p.force.Of(b.JointForce)).raw(", \"moment\": ").num(p.moment.Of(b.JointMoment)).raw("}")
			t.raw(", \"relative\": ").num(b.Relative()).raw(", \"limit\": ").num(b.Limit())
			if b.OK() {
				t.raw(", \"ok\": true}")
			} else {
				t.raw(", \"ok\": false}")
			}
		}
		t.raw("\n ]")
	})
	inOrder(j, len(env.Members), member)
	rest.writeTo(j)
	j.raw(",\n \"caution\": ").str(Caution).raw("\n}\n")
	j.flush()
	if j.err != nil {
		return j.err
	}
	return bw.Flush()
}

// jsonFactors writes a member's live load reduction factors and how each
// was found (docs/output.md); the area in the model's length².
func (p *Report) jsonFactors(j *jsonWriter, fs []analysis.MemberFactor) {
	mo := p.model()
	j.raw(", \"live_load_reduction\": [")
	for i, f := range fs {
		j.sep(i, ", ").raw("{\"case\": ").str(mo.Cases[f.Case].Name).raw(", \"N\": ").num(f.N).raw(", \"V\": ").num(f.V).raw(", \"M\": ").num(f.M)
		if f.HasAccompanying {
			a := f.Accompanying
			j.raw(", \"accompanying\": {\"N\": ").num(a[0]).raw(", \"V\": ").num(a[1]).raw(", \"M\": ").num(a[2]).raw("}")
		}
		b := f.Basis
		j.raw(", \"rule\": ").str(b.Rule).raw(", \"tributary_area\": ").num(b.Area)
		if b.KLL != 0 {
			j.raw(", \"kll\": ").num(b.KLL)
		}
		j.raw(", \"floors\": ").int(b.Floors).raw(", \"limit\": ").str(b.Limit).raw(", \"ends\": ").str(b.Ends).raw("}")
	}
	j.raw("]")
}

// jsonSpans writes the spans and cantilevers with their deflections.
func (p *Report) jsonSpans(j *jsonWriter, combo [][]byte) {
	mo := p.model()
	j.raw(",\n \"spans\": [")
	n := 0
	for i := range p.res.Spans {
		r := &p.res.Spans[i]
		s := r.Deflection
		if !s.Found {
			continue
		}
		j.sep(n, ",").raw("\n  {\"kind\": ").str(r.Kind.String()).raw(", \"left\": ").str(mo.Nodes[r.Left].Name).raw(", \"right\": ").str(mo.Nodes[r.Right].Name)
		switch r.Kind {
		case analysis.KindCantilever:
			j.raw(", \"root\": ").str(mo.Nodes[r.Root].Name)
		case analysis.KindRidge, analysis.KindValley:
			j.raw(", \"node\": ").str(mo.Nodes[r.Node].Name)
		}
		j.raw(", \"members\": [")
		for k, m := range r.Members {
			j.sep(k, ", ").str(mo.Members[m].Name)
		}
		j.raw("], \"length\": ").num(r.Length)
		j.raw(", \"deflection\": ").num(p.defl.Of(s.Largest.V)).raw(", \"x\": ").num(s.Largest.X).raw(", \"by\": ").bytes(nameOf(combo, s.Largest.By))
		if !math.IsInf(s.Ratio, 0) {
			j.raw(", \"ratio\": ").num(s.Ratio)
		}
		j.raw(", \"ratio_length\": ").num(r.RatioLength())
		if len(r.Limits) > 0 {
			// Each limited service combination on its own.
			j.raw(", \"limits\": [")
			for k, c := range r.Limits {
				d := c.Deflection.Largest
				j.sep(k, ", ").raw("{\"by\": ").bytes(nameOf(combo, c.Combination)).raw(", \"limit\": ").num(c.Limit).raw(", \"deflection\": ").num(p.defl.Of(d.V)).raw(", \"x\": ").num(d.X)
				if !math.IsInf(c.Deflection.Ratio, 0) {
					j.raw(", \"ratio\": ").num(c.Deflection.Ratio)
				}
				j.raw(", \"pass\": ").raw(strconv.FormatBool(c.Pass())).raw("}")
			}
			j.raw("]")
		}
		j.raw("}")
		n++
	}
	j.raw("\n ]")
}

func nameOf(names [][]byte, k int) []byte {
	if k < 0 {
		return []byte(`""`)
	}
	return names[k]
}

// quote returns s as a JSON string.
func quote(s string) []byte {
	b, _ := json.Marshal(s) // a string always marshals
	return b
}

// jsonWriter appends JSON pieces to a buffered writer, keeping the first error.
type jsonWriter struct {
	w   sink
	err error
	// out holds what is written until it reaches jsonFlush bytes (flush):
	// the many short pieces of a document are appended, not each passed
	// to w.
	out []byte
	// kept holds the bytes of the number numKept wrote last, keptN long
	// (0 for none), of the value keptV.
	kept  [24]byte
	keptN int
	keptV float64
	// lists holds, per slot of listAt, the indices and bytes of the list
	// it wrote there last: a station's lists of spans are often those of
	// the station before.
	lists [listSlots]keptList
}

// listSlots is the number of slots listAt keeps a list for: the largest
// and smallest of a station's three effects.
const listSlots = 6

// keptList is a list listAt wrote: the names it was of (their first
// element and their number), its indices and its bytes.
type keptList struct {
	names *[]byte
	n     int
	idx   []int
	bytes []byte
}

// jsonFlush is how many bytes a jsonWriter holds before it passes them on.
const jsonFlush = 1 << 15

// flush passes on what j holds; j's writes end with it.
func (j *jsonWriter) flush() {
	if j.err == nil && len(j.out) > 0 {
		_, j.err = j.w.Write(j.out)
	}
	j.out = j.out[:0]
}

// sink is what a jsonWriter writes to: the file's buffered writer, or a
// buffer for a part formatted on another processor (inOrder).
type sink interface {
	io.Writer
	io.StringWriter
}

// deferred is a part of a document formatted on a goroutine of its own
// (later), into a buffer, while the writer goes on with what comes before it.
type deferred struct {
	buf   blocks
	err   error
	panic any // a panic of the formatting, raised again by writeTo
	done  chan struct{}
	part  func(t *jsonWriter) // laterInline: formatted by writeTo
}

// laterInline has later leave its part to writeTo, which formats it in
// place, one part after the other: the tests compare the two.
var laterInline = false

// later starts formatting part into a buffer on a goroutine of its own.
func later(part func(t *jsonWriter)) *deferred {
	if laterInline {
		return &deferred{part: part}
	}
	d := &deferred{done: make(chan struct{})}
	go func() {
		defer close(d.done)
		defer func() { d.panic = recover() }()
		t := &jsonWriter{w: &d.buf}
		part(t)
		t.flush()
		d.err = t.err
	}()
	return d
}

// writeTo waits for the part and writes it to j, as if it had been
// formatted there: j's error, if it has one, stays first; else the part's
// own, and then none of it is written. A panic of the formatting is raised
// again here, in the writer's goroutine.
func (d *deferred) writeTo(j *jsonWriter) {
	if d.part != nil {
		d.part(j)
		return
	}
	<-d.done
	if d.panic != nil {
		panic(d.panic)
	}
	if j.err == nil && d.err != nil {
		j.err = d.err
	}
	for _, b := range d.buf {
		j.bytes(b)
	}
}

// blocks is a sink that keeps what is written to it, each write a block
// of its own: it never copies what it holds to grow.
type blocks [][]byte

func (b *blocks) Write(p []byte) (int, error) {
	*b = append(*b, bytes.Clone(p))
	return len(p), nil
}

func (b *blocks) WriteString(s string) (int, error) {
	*b = append(*b, []byte(s))
	return len(s), nil
}

// jsonChunk is the number of members one processor formats at a time.
const jsonChunk = 16

// inOrder writes item(j, i) for i from 0 to n−1 to j, the items formatted
// by jsonChunk on every processor, each chunk into a buffer of its own,
// and written in order as they are done: the same bytes as one after the
// other. At most two chunks per processor are held at once.
func inOrder(j *jsonWriter, n int, item func(j *jsonWriter, i int)) {
	chunks := (n + jsonChunk - 1) / jsonChunk
	workers := min(runtime.GOMAXPROCS(0), chunks)
	if workers <= 1 {
		for i := range n {
			item(j, i)
		}
		return
	}
	type part struct {
		buf  *bytes.Buffer
		err  error
		done chan struct{}
	}
	parts := make([]part, chunks)
	for k := range parts {
		parts[k].done = make(chan struct{})
	}
	todo := make(chan int)
	room := make(chan struct{}, 2*workers) // chunks formatted and not yet written
	// Their buffers, reused: one per chunk that may be held at once.
	free := make(chan *bytes.Buffer, 2*workers)
	for range 2 * workers {
		free <- new(bytes.Buffer)
	}
	go func() {
		for k := range chunks {
			room <- struct{}{}
			todo <- k
		}
		close(todo)
	}()
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := &jsonWriter{} // its held bytes reused from chunk to chunk
			for k := range todo {
				pt := &parts[k]
				pt.buf = <-free
				pt.buf.Reset()
				w.w, w.err = pt.buf, nil
				for i := k * jsonChunk; i < min(n, (k+1)*jsonChunk); i++ {
					item(w, i)
				}
				w.flush()
				pt.err = w.err
				close(pt.done)
			}
		}()
	}
	for k := range parts {
		pt := &parts[k]
		<-pt.done
		if j.err == nil {
			j.err = pt.err
		}
		j.bytes(pt.buf.Bytes())
		free <- pt.buf
		pt.buf = nil
		<-room
	}
	wg.Wait()
}

func (j *jsonWriter) raw(s string) *jsonWriter {
	if j.err == nil {
		j.out = append(j.out, s...)
		if len(j.out) >= jsonFlush {
			j.flush()
		}
	}
	return j
}

func (j *jsonWriter) bytes(b []byte) *jsonWriter {
	if len(b) >= jsonFlush { // a part formatted elsewhere (inOrder): passed on as it is
		j.flush()
		if j.err == nil {
			_, j.err = j.w.Write(b)
		}
		return j
	}
	if j.err == nil {
		j.out = append(j.out, b...)
		if len(j.out) >= jsonFlush {
			j.flush()
		}
	}
	return j
}

// str writes s as a JSON string, as quote gives it: a name of printable
// ASCII that needs no escape appended as it is, between quotes.
func (j *jsonWriter) str(s string) *jsonWriter {
	if !plainName(s) {
		return j.bytes(quote(s))
	}
	if j.err == nil {
		j.out = append(j.out, '"')
		j.out = append(j.out, s...)
		j.out = append(j.out, '"')
		if len(j.out) >= jsonFlush {
			j.flush()
		}
	}
	return j
}

// plainName reports whether s is printable ASCII that encoding/json writes as
// it is: no quote or backslash, and none of <, > and & (which it escapes).
func plainName(s string) bool {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c < 0x20 || c > 0x7e || c == '"' || c == '\\' || c == '<' || c == '>' || c == '&' {
			return false
		}
	}
	return true
}

func (j *jsonWriter) boolean(b bool) *jsonWriter {
	if b {
		return j.raw("true")
	}
	return j.raw("false")
}

func (j *jsonWriter) int(n int) *jsonWriter {
	if j.err == nil {
		j.out = strconv.AppendInt(j.out, int64(n), 10)
		if len(j.out) >= jsonFlush {
			j.flush()
		}
	}
	return j
}

// sep writes s before every element but the first.
func (j *jsonWriter) sep(i int, s string) *jsonWriter {
	if i > 0 {
		j.raw(s)
	}
	return j
}

// num writes a number to outputDigits significant digits (see appendNum).
// A value that is not a finite number is never written: the analysis
// refuses such results (envelope.Compute), and one reaching here is an
// error, so that no file holds a null in its place.
func (j *jsonWriter) num(v float64) *jsonWriter {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		if j.err == nil {
			j.err = fmt.Errorf("a value to write is %v, not a finite number", v)
		}
		return j
	}
	if j.err == nil {
		j.out = appendNum(j.out, v)
		if len(j.out) >= jsonFlush {
			j.flush()
		}
	}
	return j
}

// numKept is num, the bytes of v kept as well, for forces to write again
// where v comes again.
func (j *jsonWriter) numKept(v float64) *jsonWriter {
	j.keptN = 0
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return j.num(v)
	}
	b := appendNum(j.kept[:0], v)
	if len(b) <= len(j.kept) {
		j.keptN, j.keptV = len(b), v
	}
	return j.bytes(b)
}

// list writes the names of idx as a JSON array, appended at once (a
// station has six lists of up to 16 names).
func (j *jsonWriter) list(names [][]byte, idx []int) *jsonWriter {
	if j.err != nil {
		return j
	}
	j.out = appendList(j.out, names, idx)
	if len(j.out) >= jsonFlush {
		j.flush()
	}
	return j
}

// appendList appends the names of idx as a JSON array to dst.
func appendList(dst []byte, names [][]byte, idx []int) []byte {
	dst = append(dst, '[')
	for i, p := range idx {
		if i > 0 {
			dst = append(dst, ", "...)
		}
		dst = append(dst, names[p]...)
	}
	return append(dst, ']')
}

// listAt is list, the list's indices and bytes kept in slot (below
// listSlots): where the list written last in that slot had the same
// indices into the same names, its bytes are written again, not formed
// name by name. The same bytes as list.
func (j *jsonWriter) listAt(slot int, names [][]byte, idx []int) *jsonWriter {
	if j.err != nil || len(idx) == 0 || len(names) == 0 {
		return j.list(names, idx)
	}
	k := &j.lists[slot]
	if k.names == &names[0] && k.n == len(names) && slices.Equal(k.idx, idx) {
		return j.bytes(k.bytes)
	}
	k.names, k.n = &names[0], len(names)
	k.idx = append(k.idx[:0], idx...)
	k.bytes = appendList(k.bytes[:0], names, idx)
	return j.bytes(k.bytes)
}

// extKeys are the fixed parts of an extreme's object in the JSON: its
// start, with the effect's name, and the keys of the values acting with
// it (forceKeys).
type extKeys struct {
	head string
	with forceKeys
}

func newExtKeys(name string, with [3]string) extKeys {
	return extKeys{head: "\"" + name + "\": {\"max\": ", with: newForceKeys(with)}
}

// forceKeys are what forces writes before each value of an object with
// keys: its opening brace and the key, or a comma and the key, "" for a
// value left out; and last the closing brace (both braces when every
// value is left out).
type forceKeys [4]string

// newForceKeys returns the forceKeys of keys; an empty key leaves its
// value out.
func newForceKeys(keys [3]string) forceKeys {
	var f forceKeys
	open := "{"
	for i, k := range keys {
		if k != "" {
			f[i] = open + "\"" + k + "\": "
			open = ", "
		}
	}
	f[3] = "}"
	if open == "{" {
		f[3] = "{}"
	}
	return f
}

// forces writes v as an object with the keys of f, each value in its
// shown unit; value d, where it equals the number numKept wrote last
// (the same bytes: appendNum writes −0 as 0), as the bytes kept.
func (j *jsonWriter) forces(f *forceKeys, v [3]float64, shown [3]analysis.Shown, d int) *jsonWriter {
	for i := range 3 {
		if f[i] == "" {
			continue
		}
		j.raw(f[i])
		if sv := shown[i].Of(v[i]); i == d && j.keptN > 0 && sv == j.keptV {
			j.bytes(j.kept[:j.keptN])
		} else {
			j.num(sv)
		}
	}
	return j.raw(f[3])
}
