package main

import (
	"encoding/json"
	"fmt"
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

// tnodeLoad is a node load, global: fy up.
func tnodeLoad(node string, fy float64) string {
	return fmt.Sprintf("  [[case.load]]\n  type = \"node\"\n  node = %q\n  fy = %g\n", node, fy)
}

// A member that hangs from a beam or stands on it and leads only to free
// ends is carried by the beam: it neither ends a span nor makes a
// cantilever's tip a held node.
func TestHangersAndPostsDoNotHold(t *testing.T) {
	t.Run("a hanger at midspan: one span", func(t *testing.T) {
		// The 8 m span of two 4 m members, EI = 4e4, w = 20, with a 2 m
		// member hanging from the middle node to a free node carrying
		// P = 0.001: 5wL⁴/384EI + PL³/48EI (AISC Steel Construction
		// Manual Table 3-23 cases 1 and 7, recalled from memory)
		// = 26.67 mm, L/299.997, shown L/299.
		const w, p, l, ei = 20.0, 0.001, 8.0, 4e4
		for _, side := range []struct {
			name string
			y    float64
		}{{"hanging below", -2}, {"standing above", 2}} {
			t.Run(side.name, func(t *testing.T) {
				src := tsection("S", 2e8, 0.01, ei/2e8, 0) +
					tnode("A", 0, 0, "pinned") + tnode("M", 4, 0, "") + tnode("B", 8, 0, "roller") + tnode("H", 4, side.y, "") +
					tmember("M", "H", "S") + tmember("M", "A", "S") + tmember("M", "B", "S") +
					tdead(tudl("M-A", w), tudl("M-B", w), tnodeLoad("H", -p))
				want := -(5*w*math.Pow(l, 4)/(384*ei) + p*l*l*l/(48*ei))
				doc := spansJSON(t, src)
				if len(doc.Spans) != 1 {
					t.Fatalf("spans %+v, want one", doc.Spans)
				}
				s := doc.Spans[0]
				if s.Kind != "span" || s.Left != "A" || s.Right != "B" || s.Length != l || s.X != 4 {
					t.Errorf("span %+v, want A to B, 8 m, largest at x = 4", s)
				}
				if math.Abs(s.Deflection-want) > relTol*-want {
					t.Errorf("deflection %g, want %g", s.Deflection, want)
				}
				tb := summary(t, analyseModel(t, src)).one(t, "Deflection of spans and cantilevers")
				if got := tb.cell(t, "span/deflection", 0, "A–B"); got != "L/299" {
					t.Errorf("span/deflection %s, want L/299 (8 m / %g)", got, -want)
				}
			})
		}
	})
	t.Run("a cantilever with a member at its tip or part way along", func(t *testing.T) {
		// Fixed cantilever, 3 m, w = 12, EI = 1.2e5, with a 1 m member
		// below or above the tip, or hanging 1 m from the root, free at
		// its other end and unloaded: the tip still drops wL⁴/8EI =
		// 1.0125 mm (AISC Table 3-23 case 19, recalled from memory),
		// span/deflection 2L/δ = L/5925.
		const w, l, ei = 12.0, 3.0, 1.2e5
		want := -w * math.Pow(l, 4) / (8 * ei)
		for _, c := range []struct {
			name, at string
			x, y     float64
		}{{"hanger at the tip", "T", 3, 2}, {"post on the tip", "T", 3, 4}, {"hanger part way along", "N", 1, 2}} {
			t.Run(c.name, func(t *testing.T) {
				src := tsection("S", 2e8, 0.01, ei/2e8, 0) +
					tnode("R", 0, 3, "fixed") + tnode("N", 1, 3, "") + tnode("T", l, 3, "") + tnode("H", c.x, c.y, "") +
					tmember("R", "N", "S") + tmember("N", "T", "S") + tmember(c.at, "H", "S") +
					tdead(tudl("R-N", w), tudl("N-T", w))
				doc := spansJSON(t, src)
				if len(doc.Spans) != 1 {
					t.Fatalf("spans %+v, want one cantilever", doc.Spans)
				}
				s := doc.Spans[0]
				if s.Kind != "cantilever" || s.Root != "R" || s.Length != l || s.RatioLength != 2*l || strings.Join(s.Members, " ") != "R-N N-T" {
					t.Errorf("span %+v, want the cantilever R-N N-T from R, 3 m", s)
				}
				if math.Abs(s.Deflection-want) > relTol*-want || s.X != l {
					t.Errorf("deflection %g at %g, want %g at the tip", s.Deflection, s.X, want)
				}
				tb := summary(t, analyseModel(t, src)).one(t, "Deflection of spans and cantilevers")
				if got := tb.cell(t, "span/deflection", 0, "R–T"); got != "L/5925" {
					t.Errorf("span/deflection %s, want L/5925", got)
				}
			})
		}
	})
}

// A run that changes slope between the nodes that hold it (a pitched
// roof) gives its rafters, each from its own chord, and its ridge, across
// the line between the eaves.
func TestRaftersAndRidge(t *testing.T) {
	// A pinned and a roller support 8 m apart, rafters rising 3 m to a
	// rigid ridge R at midspan (each 5 m long, cos θ = 0.8, sin θ = 0.6),
	// EI = 4e4, EA = 2e6, a load P = 10 at the ridge. Statically
	// determinate: vertical reactions P/2, M = (P/2)·x at a horizontal
	// distance x from a support. By virtual work (a unit load at R, any
	// structural analysis text), the ridge drops
	//   Pa³/(6 EI cos θ) + P sin²θ L/(2 EA), a = 4, L = 5,
	// across the line between the supports (vertical here); each rafter,
	// with M rising linearly from 0 to M0 = Pa/2 at the ridge, deflects
	// from its chord M0 s (L² − s²)/(6 L EI), s from its lower end
	// (a simple beam with one end moment; beam tables, recalled from
	// memory): the largest over the stations is checked.
	const p, ei, ea, a, rise = 10.0, 4e4, 2e6, 4.0, 3.0
	l := math.Hypot(a, rise)
	cos, sin := a/l, rise/l
	src := tsection("S", 2e8, ea/2e8, ei/2e8, 0) +
		tnode("A", 0, 0, "pinned") + tnode("R", a, rise, "") + tnode("B", 2*a, 0, "roller") +
		tmember("A", "R", "S") + tmember("B", "R", "S") + tdead(tnodeLoad("R", -p))
	doc := spansJSON(t, src)
	var kinds []string
	for _, s := range doc.Spans {
		kinds = append(kinds, s.Kind+" "+s.Left+"–"+s.Right)
	}
	if got := strings.Join(kinds, ", "); got != "rafter A–R, rafter R–B, ridge A–B" {
		t.Fatalf("spans: %s; want the rafters A–R and R–B, then the ridge", got)
	}
	ridge := -(p*a*a*a/(6*ei*cos) + p*sin*sin*l/(2*ea))
	if s := doc.Spans[2]; math.Abs(s.Deflection-ridge) > relTol*-ridge || s.X != a || s.Length != 2*a || s.RatioLength != 2*a {
		t.Errorf("ridge %+v, want %g at x = 4, over 8 m", s, ridge)
	}
	m0 := p * a / 2
	own := func(s float64) float64 { return -m0 * s * (l*l - s*s) / (6 * l * ei) } // s from the rafter's lower end
	for i, lowAtLeft := range []bool{true, false} {
		s := doc.Spans[i]
		from := s.X // from the lower end
		if !lowAtLeft {
			from = l - s.X
		}
		want := 0.0
		for k := range 11 {
			want = math.Min(want, own(float64(k)*l/10))
		}
		if math.Abs(s.Deflection-want) > relTol*-want || math.Abs(own(from)-want) > relTol*-want || s.Length != l {
			t.Errorf("rafter %+v: want %g from its chord (closed form at its x: %g)", s, want, own(from))
		}
	}
	// Equilibrium beside it: each support carries P/2.
	a2 := analyseModel(t, src)
	for _, r := range a2.Envelope.Reactions {
		if fy := r.Fy.Max; math.Abs(fy-p/2) > 1e-9*p {
			t.Errorf("reaction at %s: Fy %g, want P/2 = %g", a2.Job.Model.Nodes[r.Node].Name, fy, p/2)
		}
	}
	tb := summary(t, a2).one(t, "Deflection of spans and cantilevers")
	if got := tb.cell(t, "kind", 0, "R"); got != "ridge" {
		t.Errorf("the row of R is a %s", got)
	}
	if !strings.Contains(tb.title, "ridge or valley") {
		t.Errorf("title %q does not say how a ridge is measured", tb.title)
	}
}
