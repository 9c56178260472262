package report

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/envelope/internal/cputime"
	"govern/frame"
	"govern/patterns"
)

// gridResult analyses a fixed-base frame of bays × storeys (6 m, 3.5 m)
// with dead load on the beams and wind at each floor: enough members for
// the JSON to be formatted in several chunks.
func gridResult(t testing.TB, bays, storeys int) *analysis.Result {
	t.Helper()
	mo := &frame.Model{Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}}}
	id := func(i, j int) int { return j*(bays+1) + i }
	for j := 0; j <= storeys; j++ {
		for i := 0; i <= bays; i++ {
			s := frame.Free
			if j == 0 {
				s = frame.Fixed
			}
			mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprintf("n%d-%d", i, j), X: 6 * float64(i), Y: 3.5 * float64(j), Support: s})
		}
	}
	d, w := frame.Case{Name: "D"}, frame.Case{Name: "W"}
	for j := 1; j <= storeys; j++ {
		for i := 0; i <= bays; i++ {
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("c%d-%d", i, j), Start: id(i, j-1), End: id(i, j)})
		}
		for i := 1; i <= bays; i++ {
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: len(mo.Members), To: 6, W: 20, WEnd: 20})
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("b%d-%d", i, j), Start: id(i-1, j), End: id(i, j)})
		}
		w.NodeLoads = append(w.NodeLoads, frame.NodeLoad{Node: id(0, j), Fx: 10})
	}
	mo.Cases = []frame.Case{d, w}
	job := &analysis.Job{
		Title: "grid",
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: mo,
		Cases: []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{
			{Name: "1.2D+1.0W", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1}}},
			{Name: "0.9D-1.0W", Terms: []combos.Term{{Case: 0, Factor: 0.9}, {Case: 1, Factor: -1}}},
		},
		Settings: analysis.Settings{Stations: 5},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// patternedResult is gridResult with a live load L on every beam, placed
// span by span (exact placement), in 1.2D + 1.6L + 0.5W and 0.9D − 1.0W:
// each extreme lists the spans loaded for it.
func patternedResult(t testing.TB, bays, storeys int) *analysis.Result {
	t.Helper()
	res := gridResult(t, bays, storeys)
	job := *res.Job
	mo := *job.Model
	l := frame.Case{Name: "L"}
	for _, ld := range mo.Cases[0].MemberLoads {
		ld.W, ld.WEnd = 12, 12
		l.MemberLoads = append(l.MemberLoads, ld)
	}
	mo.Cases = append(slices.Clone(mo.Cases), l)
	job.Model = &mo
	job.Cases = append(slices.Clone(job.Cases), combos.Case{Name: "L", Kind: combos.Live})
	job.Combinations = []combos.Combination{
		{Name: "1.2D+1.6L+0.5W", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 2, Factor: 1.6}, {Case: 1, Factor: 0.5}}},
		{Name: "0.9D-1.0W", Terms: []combos.Term{{Case: 0, Factor: 0.9}, {Case: 1, Factor: -1}}},
	}
	job.Patterned, job.Segments, job.Patterns = []int{2}, 1, patterns.Exact
	out, err := analysis.Run(context.Background(), &job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// The members are formatted in chunks on every processor and written in
// order: the same bytes on one processor as on two.
func TestJSONIsTheSameOnOneOrTwoProcessors(t *testing.T) {
	res := gridResult(t, 5, 9) // 99 members: 7 chunks
	if len(res.Envelope.Members) <= 2*jsonChunk {
		t.Fatalf("%d members: too few for several chunks", len(res.Envelope.Members))
	}
	var out [2]bytes.Buffer
	for i, procs := range []int{1, 2} {
		func() {
			defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
			if err := New(res).WriteJSON(&out[i]); err != nil {
				t.Fatal(err)
			}
		}()
	}
	if !bytes.Equal(out[0].Bytes(), out[1].Bytes()) {
		t.Error("the JSON differs on one processor and on two")
	}
	if !bytes.Contains(out[1].Bytes(), []byte(`"name": "b5-9"`)) {
		t.Error("the last member is missing")
	}
}

// failAfter accepts n bytes, then fails every write.
type failAfter struct{ n int }

var errFull = errors.New("disk full")

func (f *failAfter) Write(p []byte) (int, error) {
	if len(p) > f.n {
		k := f.n
		f.n = 0
		return k, errFull
	}
	f.n -= len(p)
	return len(p), nil
}

// A write that fails while the members are being formatted on two
// processors is reported, and nothing waits for ever.
func TestJSONWriteErrorWhileFormattingInParallel(t *testing.T) {
	res := gridResult(t, 5, 9)
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(2))
	if err := New(res).WriteJSON(&failAfter{n: 100_000}); !errors.Is(err, errFull) {
		t.Errorf("error %v, want %v", err, errFull)
	}
}

// BenchmarkWriteJSON measures the JSON file of a frame's envelopes (no
// patterns: 11 numbers and three names per effect at each station; with
// "-patterned", the spans loaded listed too); run with -cpu 1,2 to see
// the formatting shared between processors.
func BenchmarkWriteJSON(b *testing.B) {
	for _, size := range []struct {
		bays, storeys int
		patterned     bool
	}{{5, 9, false}, {30, 60, false}, {30, 60, true}} {
		res, name := gridResult(b, size.bays, size.storeys), fmt.Sprintf("%dx%d", size.bays, size.storeys)
		if size.patterned {
			res, name = patternedResult(b, size.bays, size.storeys), name+"-patterned"
		}
		p := New(res)
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			var out bytes.Buffer
			start := cputime.Now()
			for b.Loop() {
				out.Reset()
				if err := p.WriteJSON(&out); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cputime.Now()-start)/float64(b.N), "cpu-ns/op")
			b.SetBytes(int64(out.Len()))
		})
	}
}

// What follows the members is formatted on a goroutine of its own while
// they are written (later): the same bytes as the document written one
// part after the other, on one processor and on two, for frames with
// spans and a service combination (portal), storeys (storeyResult) and
// many members (gridResult).
func TestJSONPartFormattedMeanwhile(t *testing.T) {
	for _, tc := range []struct {
		name string
		res  *analysis.Result
	}{{"portal", portal(t, "A1-B1")}, {"storey", storeyResult(t, false)}, {"grid 5x9", gridResult(t, 5, 9)}} {
		t.Run(tc.name, func(t *testing.T) {
			var want bytes.Buffer
			laterInline = true
			err := New(tc.res).WriteJSON(&want)
			laterInline = false
			if err != nil {
				t.Fatal(err)
			}
			for _, k := range []string{`"spans"`, `"reactions"`, `"cases"`, `"statics"`, `"caution"`} {
				if tc.name == "portal" && !bytes.Contains(want.Bytes(), []byte(k)) {
					t.Fatalf("the document has no %s", k)
				}
			}
			for _, procs := range []int{1, 2} {
				func() {
					defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
					var got bytes.Buffer
					if err := New(tc.res).WriteJSON(&got); err != nil {
						t.Fatal(err)
					}
					if !bytes.Equal(got.Bytes(), want.Bytes()) {
						t.Errorf("GOMAXPROCS %d: %d bytes, differing from the %d written in order", procs, got.Len(), want.Len())
					}
				}()
			}
		})
	}
}

// A value that is not a finite number in the part formatted meanwhile is
// an error, and none of that part is written; one among the members, the
// first in the document, is the error reported when both have one.
func TestJSONPartFormattedMeanwhileErrors(t *testing.T) {
	res := portal(t, "A1-B1")
	res.Statics = slices.Clone(res.Statics)
	res.Statics[0].Applied.Fx = math.NaN()
	var out bytes.Buffer
	err := New(res).WriteJSON(&out)
	if err == nil || !strings.Contains(err.Error(), "NaN") {
		t.Fatalf("error %v, want one naming NaN", err)
	}
	if bytes.Contains(out.Bytes(), []byte(`"reactions"`)) {
		t.Error("part of what follows the members was written")
	}
	m := &res.Envelope.Members[0]
	m.Stations = slices.Clone(m.Stations)
	m.Stations[0].N.Max = math.Inf(1)
	if err := New(res).WriteJSON(&bytes.Buffer{}); err == nil || !strings.Contains(err.Error(), "+Inf") {
		t.Fatalf("error %v, want the members' one, naming +Inf", err)
	}
}

// str writes a name as encoding/json quotes it (quote): plain names as
// they are, and every other, escaped, through it.
func TestJSONStrIsQuote(t *testing.T) {
	names := []string{"", "B1-C1", "L/A1-B1", "2.3.1-2 1.2D+1.6L+0.5Lr", "a\"b", `a\b`, "<tag>", "a&b", "tab\there",
		"line\nbreak", "\x7f", "naïve", "\u2028", "\xff", " ", "~", "}{", "0.9D-1.0W"}
	rng := rand.New(rand.NewPCG(5, 8))
	for range 20000 {
		b := make([]byte, rng.IntN(12))
		for i := range b {
			b[i] = byte(rng.IntN(0x90))
		}
		names = append(names, string(b))
	}
	for _, s := range names {
		j := &jsonWriter{}
		j.str(s)
		if want := quote(s); string(j.out) != string(want) {
			t.Fatalf("%q: %s, encoding/json %s", s, j.out, want)
		}
	}
}

// forces writes an object of the keys held, in their order, each with its
// value in its shown unit: for every set of keys a reaction may hold,
// none to all three.
func TestJSONForcesKeys(t *testing.T) {
	shown := [3]analysis.Shown{{Label: "kN", Factor: 1}, {Label: "kN", Factor: 1}, {Label: "kNm", Factor: 2}}
	v := [3]float64{1.5, -2, 0.25}
	for mask := range 8 {
		var keys [3]string
		want := "{"
		for i, k := range reactionForces {
			if mask&(1<<i) != 0 {
				keys[i] = k
				if want != "{" {
					want += ", "
				}
				want += fmt.Sprintf("%q: %s", k, strconv.FormatFloat(v[i]*shown[i].Factor, 'g', 10, 64))
			}
		}
		want += "}"
		j := &jsonWriter{}
		f := newForceKeys(keys)
		j.forces(&f, v, shown, -1)
		if string(j.out) != want {
			t.Errorf("keys %q: %s, want %s", keys, j.out, want)
		}
		// Each value again after it was written as an extreme (numKept),
		// and a zero value with nothing kept.
		for d := range 3 {
			j := &jsonWriter{}
			j.numKept(v[d] * shown[d].Factor)
			n := len(j.out)
			j.forces(&f, v, shown, d)
			if string(j.out[n:]) != want {
				t.Errorf("keys %q, value %d kept: %s, want %s", keys, d, j.out[n:], want)
			}
		}
		j = &jsonWriter{}
		j.forces(&f, [3]float64{}, shown, 0)
		if w := strings.ReplaceAll(strings.ReplaceAll(strings.ReplaceAll(want, "1.5", "0"), "-2", "0"), "0.5", "0"); string(j.out) != w {
			t.Errorf("keys %q, zeros: %s, want %s", keys, j.out, w)
		}
	}
}

// listAt writes what list writes, list after list, whether a slot's list
// is the one written there before (its kept bytes written again) or not:
// random lists of few indices, so that many repeat, into two tables of
// names of the same length and over the writer's flushes, compared with
// the lists written by list alone.
func TestJSONListAtIsList(t *testing.T) {
	rng := rand.New(rand.NewPCG(18, 3))
	tables := [2][][]byte{}
	for k := range tables {
		for i := range 5 {
			tables[k] = append(tables[k], quote(fmt.Sprintf("T%d/P%d", k, i)))
		}
	}
	var got, want bytes.Buffer
	g, w := &jsonWriter{w: &got}, &jsonWriter{w: &want}
	kept := 0
	for range 20000 {
		names := tables[rng.IntN(2)]
		idx := make([]int, rng.IntN(3))
		for i := range idx {
			idx[i] = rng.IntN(2)
		}
		slot := rng.IntN(listSlots)
		k := g.lists[slot]
		if k.names == &names[0] && slices.Equal(k.idx, idx) && len(idx) > 0 {
			kept++
		}
		g.listAt(slot, names, idx).raw(", ")
		w.list(names, idx).raw(", ")
	}
	g.flush()
	w.flush()
	if !bytes.Equal(got.Bytes(), want.Bytes()) {
		t.Fatalf("listAt wrote %d bytes, list %d, not the same", got.Len(), want.Len())
	}
	if kept == 0 || got.Len() < 2*jsonFlush {
		t.Fatalf("%d lists written again from a slot, %d bytes: the case tests nothing", kept, got.Len())
	}
}
