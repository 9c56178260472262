package main

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// spanDoc is the part of the JSON output about spans.
type spanDoc struct {
	Spans []struct {
		Kind        string
		Left, Right string
		Root        string
		Members     []string
		Length      float64
		Deflection  float64
		X           float64
		By          string
		Ratio       *float64
		RatioLength float64 `json:"ratio_length"`
	}
	Members []map[string]any
}

func spansJSON(t *testing.T, src string) spanDoc {
	t.Helper()
	code, out, stderr := exec("run", writeModel(t, src), "--json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var doc spanDoc
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	for _, m := range doc.Members {
		if _, ok := m["span_deflection"]; ok {
			t.Errorf("member %v reports a deflection of its own", m["name"])
		}
	}
	return doc
}

// relTol is the agreement asked of a deflection with its closed form: the
// solution is exact to round-off.
const relTol = 1e-9

func TestCantileverDeflection(t *testing.T) {
	// Fixed cantilever, 3 m, w = 12, EI = 1.2e5: the tip deflects
	// wL⁴/8EI = 1.0125 mm (AISC Steel Construction Manual Table 3-23
	// case 19, recalled from memory), checked against 2 × 3 m: L/5925.
	const w, l, ei = 12.0, 3.0, 1.2e5
	want := -w * math.Pow(l, 4) / (8 * ei)
	for _, drawn := range []struct{ name, start, end string }{{"root to tip", "R", "T"}, {"tip to root", "T", "R"}} {
		t.Run(drawn.name, func(t *testing.T) {
			src := tsection("S", 2e8, 0.01, ei/2e8, 0) + tnode("R", 0, 0, "fixed") + tnode("T", l, 0, "") +
				tmember(drawn.start, drawn.end, "S") + tdead(tudl(drawn.start+"-"+drawn.end, w))
			doc := spansJSON(t, src)
			if len(doc.Spans) != 1 {
				t.Fatalf("%d spans, want 1", len(doc.Spans))
			}
			s := doc.Spans[0]
			if s.Kind != "cantilever" || s.Root != "R" || s.Length != l || s.RatioLength != 2*l {
				t.Errorf("span %+v, want a cantilever from R, length 3, span/deflection over 6", s)
			}
			if math.Abs(s.Deflection-want) > relTol*math.Abs(want) || s.X != l {
				t.Errorf("deflection %g at x %g, want wL⁴/8EI = %g at the tip", s.Deflection, s.X, want)
			}
			r := summary(t, analyseModel(t, src))
			tb := r.one(t, "Deflection of spans and cantilevers")
			if got := tb.cell(t, "span/deflection", 0, "R–T"); got != "L/5925" {
				t.Errorf("span/deflection %s, want 2L/δ = L/5925", got)
			}
			if got := tb.cell(t, "kind", 0, "R–T"); got != "cantilever" {
				t.Errorf("kind %s", got)
			}
			if !strings.Contains(strings.Join(tb.header, " "), "cantilever: 2 × length") {
				t.Errorf("header %q does not say a cantilever counts twice its length", tb.header)
			}
		})
	}
}

func TestOverhangDeflection(t *testing.T) {
	// An overhang c = 2 m beyond a simply supported back span a = 6 m,
	// EI = 4e4, w = 10 on the overhang only: the tip, relative to the
	// displaced root including its rotation, deflects
	// wc⁴/8EI + wc³a/6EI = 2.500 mm (the cantilever's own bending plus
	// the root's rotation wc²/2 · a/3EI times c; beam tables, recalled
	// from memory). The back span rises under the end moment
	// M = wc²/2: δ(x) = M x (a² − x²)/(6 a EI) (same tables).
	const w, a, c, ei = 10.0, 6.0, 2.0, 4e4
	src := tsection("S", 2e8, 0.01, ei/2e8, 0) +
		tnode("A", 0, 0, "pinned") + tnode("B", a, 0, "roller") + tnode("C", a+c, 0, "") +
		tmember("A", "B", "S") + tmember("C", "B", "S") + tdead(tudl("C-B", w))
	doc := spansJSON(t, src)
	if len(doc.Spans) != 2 {
		t.Fatalf("%d spans, want the back span and the overhang", len(doc.Spans))
	}
	tip := -(w*math.Pow(c, 4)/(8*ei) + w*c*c*c*a/(6*ei))
	s := doc.Spans[1]
	if s.Kind != "cantilever" || s.Root != "B" || s.Left != "B" || s.Right != "C" {
		t.Fatalf("second span %+v, want the cantilever B to C", s)
	}
	if math.Abs(s.Deflection-tip) > relTol*math.Abs(tip) || s.X != c {
		t.Errorf("tip %g at x %g, want %g at %g", s.Deflection, s.X, tip, c)
	}
	back := doc.Spans[0]
	m := w * c * c / 2
	x := back.X
	if up := m * x * (a*a - x*x) / (6 * a * ei); back.Kind != "span" || math.Abs(back.Deflection-up) > relTol*up {
		t.Errorf("back span %+v, want %g up at x %g", back, up, x)
	}
}

// twoMemberSpan is a simply supported span of 8 m built of two members
// meeting at a node that carries nothing, the second drawn right to left.
func twoMemberSpan(w float64) string {
	return tsection("S", 2e8, 0.01, 2e-4, 0) +
		tnode("A", 0, 0, "pinned") + tnode("M", 4, 0, "") + tnode("B", 8, 0, "roller") +
		tmember("A", "M", "S") + tmember("B", "M", "S") + tdead(tudl("A-M", w), tudl("B-M", w))
}

func TestSpanOfTwoMembers(t *testing.T) {
	// 5wL⁴/384EI = 13.33 mm for L = 8 m, w = 10, EI = 4e4: L/600; at
	// twice the load L/300 (AISC Steel Construction Manual Table 3-23
	// case 1, recalled from memory).
	const l, ei = 8.0, 4e4
	for _, c := range []struct {
		w     float64
		ratio string
	}{{10, "L/600"}, {20, "L/300"}} {
		want := -5 * c.w * math.Pow(l, 4) / (384 * ei)
		doc := spansJSON(t, twoMemberSpan(c.w))
		if len(doc.Spans) != 1 {
			t.Fatalf("%d spans, want one", len(doc.Spans))
		}
		s := doc.Spans[0]
		if s.Kind != "span" || s.Length != l || strings.Join(s.Members, " ") != "A-M B-M" || s.X != 4 {
			t.Errorf("span %+v, want A-M and B-M, 8 m, largest at x = 4", s)
		}
		if math.Abs(s.Deflection-want) > relTol*math.Abs(want) || s.Ratio == nil || math.Abs(*s.Ratio-l/-want) > relTol*l/-want {
			t.Errorf("deflection %g, ratio %v; want %g, %g", s.Deflection, s.Ratio, want, l/-want)
		}
		r := summary(t, analyseModel(t, twoMemberSpan(c.w)))
		tb := r.one(t, "Deflection of spans and cantilevers")
		if len(tb.rows) != 1 {
			t.Errorf("rows %q: a member inside a span is reported on its own", tb.rows)
		}
		if got := tb.cell(t, "span/deflection", 0, "A–B"); got != c.ratio {
			t.Errorf("w = %g: %s, want %s", c.w, got, c.ratio)
		}
		if got := tb.cell(t, "length", 0, "A–B"); got != "8.00" {
			t.Errorf("length %s, want 8.00", got)
		}
	}
}
