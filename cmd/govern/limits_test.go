package main

import (
	"bytes"
	"encoding/json"

	"govern/envelope/report"
	"math"
	"strconv"
	"testing"
)

// TestDeflectionLimits: the table of deflection limits lists every
// service combination with a limit on every span and cantilever, with the
// deflection under it alone, span/deflection and pass or exceed.
//
// Simple span, L = 6 m, EI = 2e8 × 1e-4 = 20 000 kN·m²: midspan
// deflection 5wL⁴/384EI (AISC Manual Table 3-23, case 1). Dead load 10
// kN/m, live load 12 kN/m: under D+L (22 kN/m) 0.0185625 m, L/323, against
// a limit of 400: exceeds; under L alone 0.010125 m, L/592, against 360:
// passes.
//
// Cantilever, L = 3 m, same EI, 10 kN/m: tip deflection wL⁴/8EI (AISC
// Table 3-23, case 22) = 0.0050625 m; span/deflection over twice the
// length, 6/0.0050625 = 1185: exceeds a limit of 1200, passes 1000.
func TestDeflectionLimits(t *testing.T) {
	const ei = 20000.0
	beam := tsection("S", 2e8, 0.01, 1e-4, 0)
	for _, c := range []struct {
		name string
		src  string
		rows [][4]string // combination, limit, span/deflection, check
		defl []float64   // the largest deflection of each row, + up
		at   []string
	}{
		{"simple span", beam + tnode("A", 0, 0, "pinned") + tnode("B", 6, 0, "roller") + tmember("A", "B", "S") +
			"[[case]]\nname = \"D\"\nkind = \"dead\"\n" + tudl("A-B", 10) +
			"[[case]]\nname = \"L\"\nkind = \"live\"\n" + tudl("A-B", 12) +
			"[[combination]]\nname = \"1.2D+1.6L\"\nfactors = { D = 1.2, L = 1.6 }\n" +
			"[[combination]]\nname = \"D+L\"\nfactors = { D = 1.0, L = 1.0 }\nservice = true\nlimit = 400\n" +
			"[[combination]]\nname = \"L\"\nfactors = { L = 1.0 }\nservice = true\nlimit = 360\n" +
			"[[combination]]\nname = \"D\"\nfactors = { D = 1.0 }\nservice = true\n",
			[][4]string{{"D+L", "L/400", "L/323", "EXCEEDS"}, {"L", "L/360", "L/592", "pass"}},
			[]float64{-5 * 22 * 1296 / (384 * ei), -5 * 12 * 1296 / (384 * ei)}, []string{"3.00", "3.00"}},
		{"cantilever", beam + tnode("A", 0, 0, "fixed") + tnode("B", 3, 0, "") + tmember("A", "B", "S") +
			"[[case]]\nname = \"D\"\nkind = \"dead\"\n" + tudl("A-B", 10) +
			"[[combination]]\nname = \"1.4D\"\nfactors = { D = 1.4 }\n" +
			"[[combination]]\nname = \"D tight\"\nfactors = { D = 1.0 }\nservice = true\nlimit = 1200\n" +
			"[[combination]]\nname = \"D loose\"\nfactors = { D = 1.0 }\nservice = true\nlimit = 1000\n",
			[][4]string{{"D tight", "L/1200", "L/1185", "EXCEEDS"}, {"D loose", "L/1000", "L/1185", "pass"}},
			[]float64{-10 * 81 / (8 * ei), -10 * 81 / (8 * ei)}, []string{"3.00", "3.00"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			a := analyseModel(t, c.src)
			tb := summary(t, a).one(t, "Deflection limits")
			if len(tb.rows) != len(c.rows) {
				t.Fatalf("%d rows, want %d (one per limited combination): %q", len(tb.rows), len(c.rows), tb.rows)
			}
			for i, want := range c.rows {
				row := tb.rows[i]
				for k, col := range []string{"combination", "limit", "span/deflection", "check"} {
					if got := stateCell(t, tb.header, row, col); got != want[k] {
						t.Errorf("row %d %s: %q, want %q", i, col, got, want[k])
					}
				}
				got := stateCell(t, tb.header, row, "largest")
				v, err := strconv.ParseFloat(got, 64)
				if err != nil || !within(v, c.defl[i], 1e-3) {
					t.Errorf("row %d largest deflection %s, want %.6g", i, got, c.defl[i])
				}
				if got := stateCell(t, tb.header, row, "at x"); got != c.at[i] {
					t.Errorf("row %d at x %s, want %s", i, got, c.at[i])
				}
			}
			// The JSON carries the same checks with the span.
			var buf bytes.Buffer
			if err := report.New(a).WriteJSON(&buf); err != nil {
				t.Fatal(err)
			}
			var doc struct {
				Spans []struct {
					Limits []struct {
						By         string  `json:"by"`
						Limit      float64 `json:"limit"`
						Deflection float64 `json:"deflection"`
						Pass       bool    `json:"pass"`
					} `json:"limits"`
				} `json:"spans"`
			}
			if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
				t.Fatal(err)
			}
			if len(doc.Spans) != 1 || len(doc.Spans[0].Limits) != len(c.rows) {
				t.Fatalf("JSON spans %+v: want one span with %d limits", doc.Spans, len(c.rows))
			}
			for i, l := range doc.Spans[0].Limits {
				if l.By != c.rows[i][0] || "L/"+strconv.FormatFloat(l.Limit, 'g', -1, 64) != c.rows[i][1] || l.Pass != (c.rows[i][3] == "pass") || !within(l.Deflection, c.defl[i], 1e-9) {
					t.Errorf("JSON limit %d: %+v, want %v and %.9g", i, l, c.rows[i], c.defl[i])
				}
			}
		})
	}
}

// within reports whether a printed value of four significant figures is
// v to rel of its size.
func within(got, v, rel float64) bool {
	return math.Abs(got-v) <= rel*math.Abs(v)
}
