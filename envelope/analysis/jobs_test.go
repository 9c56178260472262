package analysis

import (
	"fmt"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// regularJob builds, in code, a reinforced concrete frame of n bays
// alternating 7.5 m and 6.0 m and m storeys of 4.2 m then 3.6 m, fixed at
// the base, in kN and m: dead load 36 kN/m on every beam (6 kPa over 6 m
// of slab), floor live load 18 kN/m and roof live load 6 kN/m, both
// patterned span by span ("exact"), a reversible wind case of 6 kN/m of
// height lumped at the floors of line A, and the strength combinations of
// ASCE/SEI 7-16 2.3.1. With starter, the sections give their depths (so
// that beams get stations at the column faces) and a service combination
// D + L + Lr gives deflections. The loads are for tests only.
func regularJob(bays, storeys int, starter bool) *Job {
	mo := &frame.Model{Sections: []frame.Section{
		{Name: "C500", E: 30e6, A: 0.25, I: 0.25 * 0.25 / 12, Weight: 6},
		{Name: "B400x600", E: 30e6, A: 0.24, I: 0.4 * 0.6 * 0.6 * 0.6 / 12, Weight: 5.76},
	}}
	if starter {
		mo.Sections[0].Depth, mo.Sections[1].Depth = 0.5, 0.6
	}
	xs, ys := []float64{0}, []float64{0}
	for i := range bays {
		xs = append(xs, xs[i]+[]float64{7.5, 6.0}[i%2])
	}
	for i := range storeys {
		h := 3.6
		if i == 0 {
			h = 4.2
		}
		ys = append(ys, ys[i]+h)
	}
	node := func(line, level int) int { return level*len(xs) + line }
	for lv, y := range ys {
		for ln, x := range xs {
			sup := frame.Free
			if lv == 0 {
				sup = frame.Fixed
			}
			mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprintf("%c%d", 'A'+ln, lv), X: x, Y: y, Support: sup})
		}
	}
	for lv := 1; lv < len(ys); lv++ {
		for ln := range xs {
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("C%c%d", 'A'+ln, lv), Start: node(ln, lv-1), End: node(ln, lv), Section: 0})
		}
	}
	d, l, lr, w := frame.Case{Name: "D"}, frame.Case{Name: "L"}, frame.Case{Name: "Lr"}, frame.Case{Name: "W"}
	for lv := 1; lv < len(ys); lv++ {
		for ln := 1; ln < len(xs); ln++ {
			m := len(mo.Members)
			span := xs[ln] - xs[ln-1]
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("B%d-%d", lv, ln), Start: node(ln-1, lv), End: node(ln, lv), Section: 1})
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, To: span, W: 36, WEnd: 36})
			live := &l
			q := 18.0
			if lv == len(ys)-1 {
				live, q = &lr, 6
			}
			live.MemberLoads = append(live.MemberLoads, frame.MemberLoad{Member: m, To: span, W: q, WEnd: q})
		}
		h := ys[lv] - ys[lv-1]
		if lv < len(ys)-1 {
			h = (ys[lv+1] - ys[lv-1]) / 2
		} else {
			h /= 2
		}
		w.NodeLoads = append(w.NodeLoads, frame.NodeLoad{Node: node(0, lv), Fx: 6 * h})
	}
	mo.Cases = []frame.Case{d, l, lr, w}
	cases := []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}, {Name: "Lr", Kind: combos.RoofLive}, {Name: "W", Kind: combos.Wind}}
	info := []combos.CaseInfo{3: {Reversible: true}}
	set, err := combos.Standard("asce7-16-strength")
	if err != nil {
		panic(err)
	}
	cs, err := set.Generate(cases, info, combos.Params{})
	if err != nil {
		panic(err)
	}
	if starter {
		cs = append(cs, combos.Combination{Name: "service D+L+Lr", Rule: "model", Service: true,
			Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}, {Case: 2, Factor: 1}}})
	}
	acts, err := combos.GroupActions(cases, info)
	if err != nil {
		panic(err)
	}
	job := &Job{
		Title: fmt.Sprintf("regular frame, %d bays x %d storeys", bays, storeys),
		Units: Units{Force: "kN", Length: "m"}, Model: mo, Cases: cases, CaseInfo: info, Actions: acts,
		Combinations: cs, Set: set, Patterned: []int{1, 2}, Segments: 1, Patterns: patterns.Exact,
		Settings: Settings{Stations: 11},
	}
	for i, x := range xs {
		job.Lines = append(job.Lines, GridLine{Name: string(rune('A' + i)), X: x})
	}
	for i, y := range ys {
		job.Levels = append(job.Levels, Level{Name: fmt.Sprintf("level %d", i), Y: y})
	}
	return job
}

// secondOrderJob is regularJob with every combination analysed in second
// order.
func secondOrderJob(bays, storeys int, starter bool) *Job {
	job := regularJob(bays, storeys, starter)
	job.Methods = make([]Method, len(job.Combinations))
	for k := range job.Methods {
		job.Methods[k] = Method{SecondOrder: true}
	}
	return job
}
