package report

import (
	"bytes"
	"context"
	"strings"
	"sync"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/frame"
)

// portal analyses a fixed-base portal frame 6 m wide and 4 m high, its
// beam named beam, with dead load 10 kN/m on the beam, wind 5 kN at the
// top of the left column and a service combination.
func portal(t *testing.T, beam string) *analysis.Result {
	t.Helper()
	job := &analysis.Job{
		Title: "portal",
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "C", E: 30e6, A: 0.16, I: 2.1e-3, Depth: 0.4}, {Name: "B", E: 30e6, A: 0.24, I: 7.2e-3, Depth: 0.6}},
			Nodes:    []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: 4}, {Name: "B0", X: 6, Support: frame.Fixed}, {Name: "B1", X: 6, Y: 4}},
			Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "B0-B1", Start: 2, End: 3},
				{Name: beam, Start: 1, End: 3, Section: 1}},
			Cases: []frame.Case{
				{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 2, To: 6, W: 10, WEnd: 10}}},
				{Name: "W", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 5}}},
			},
		},
		Cases: []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{
			{Name: "1.2D+1.0W", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1}}},
			{Name: "D+W", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}},
		},
		Settings: analysis.Settings{Stations: 11},
		Lines:    []analysis.GridLine{{Name: "A", X: 0}, {Name: "B", X: 6}},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// TestWritersShareTheTables: the terminal and the report render the same
// rows of design values, each by its own rules, and the writers may run at
// once (run with -race): the terminal's escaping must not reach the
// report's cells.
func TestWritersShareTheTables(t *testing.T) {
	res := portal(t, "beam \x1b[2J")
	one := func(p *Report) [4]string {
		var out [4]bytes.Buffer
		var wg sync.WaitGroup
		for i, write := range []func(*bytes.Buffer) error{
			func(b *bytes.Buffer) error { return p.WriteText(b, true) },
			func(b *bytes.Buffer) error { return p.WriteHTML(b) },
			func(b *bytes.Buffer) error { return p.WriteJSON(b) },
			func(b *bytes.Buffer) error { return p.WriteCSV(b) },
		} {
			wg.Add(1)
			go func() {
				defer wg.Done()
				if err := write(&out[i]); err != nil {
					t.Error(err)
				}
			}()
		}
		wg.Wait()
		return [4]string{out[0].String(), out[1].String(), out[2].String(), out[3].String()}
	}
	got := one(New(res))
	if again := one(New(res)); again != got {
		t.Error("two reports of one result differ")
	}
	text, html := got[0], got[1]
	if !strings.Contains(text, `beam \x1b[2J`) || strings.Contains(text, "\x1b") {
		t.Errorf("the terminal shows the name raw or not at all")
	}
	// XML allows no ESC: the report drops it, and never shows the
	// terminal's escape of it.
	if !strings.Contains(html, "<td>beam [2J</td>") || strings.Contains(html, `\x1b`) {
		t.Errorf("the report's design table does not hold the name as the report writes it")
	}
	for _, want := range []string{"Beams at level 1 (y = 4.00 m)", "Columns on line A (x = 0.00 m)", "at the supports, centreline and column face",
		"Deflection of spans and cantilevers", "Reactions", "Statics check of each load case", "Cross-check by moment distribution", Caution} {
		// Prose is wrapped to the terminal's width: read it with line
		// breaks as spaces.
		if !strings.Contains(strings.Join(strings.Fields(text), " "), want) {
			t.Errorf("the terminal lacks %q", want)
		}
	}
}
