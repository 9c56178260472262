package report_test

import (
	"context"
	"fmt"
	"os"
	"strings"
	"time"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/envelope/report"
	"govern/frame"
)

// The design values of a propped cantilever, as the terminal and the
// report show them: span 6 m, fixed at a, on a roller at b, dead load
// 10 kN/m, 1.4D. By the beam tables (common practice), with w = 14 kN/m:
// −wL²/8 = −63 kN·m and the largest shear 5wL/8 = 52.5 kN at the fixed
// end, the roller's reaction 3wL/8 = 31.5 kN, and in the span
// M = 31.5s − 7s² at s from b: 35.28 kN·m at the station x = 3.6 m
// (9wL²/128 = 35.44 kN·m at x = 3.75 m, between stations), where the
// shear acting with it is 14·(3.75 − 3.6) = 2.1 kN; the shear at the
// fixed end acts with −63 kN·m and the hogging moment with 52.5 kN.
func ExampleReport_Tables() {
	const l = 6.0
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.24, I: 7.2e-3}},
			Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l, Support: frame.Roller}},
			Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
			Cases:    []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 0, To: l, W: 10, WEnd: 10}}}},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}},
		Combinations: []combos.Combination{{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}}},
		Settings:     analysis.Settings{Stations: 11},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, t := range report.New(res).Tables()[:2] {
		fmt.Println(t.Title)
		fmt.Println(strings.Join(t.Header, " | "))
		for _, row := range t.Rows {
			fmt.Println(strings.Join(row, " | "))
		}
	}
	// Output:
	// Beams at level 0 (y = 0.00 m)
	// beam | +M (kN·m) | at x (m) | governing | with V (kN) | -M (kN·m) | at x (m) | governing | with V (kN) | |V| (kN) | at x (m) | governing | with M (kN·m)
	// a-b | 35.28 | 3.60 | 1.4D | 2.10 | -63.00 | 0.00 | 1.4D | 52.50 | 52.50 | 0.00 | 1.4D | -63.00
	// Reactions (global: +X right, +Y up, M counter-clockwise)
	// node | component | max | governing | min | governing
	// a | Fx (kN) | 0.00 | - | 0.00 | -
	//  | Fy (kN) | 52.50 | 1.4D | 52.50 | 1.4D
	//  | M (kN·m) | 63.00 | 1.4D | 63.00 | 1.4D
	// b | Fy (kN) | 31.50 | 1.4D | 31.50 | 1.4D
}

// The combinations of a model as CSV, one column per load case: the
// strength combinations of ASCE/SEI 7-16 section 2.3.1 for dead, live and
// wind from either side.
func ExampleWriteCombinationsCSV() {
	set, err := combos.Standard("asce7-16-strength")
	if err != nil {
		fmt.Println(err)
		return
	}
	cases := []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}, {Name: "W", Kind: combos.Wind}}
	info := []combos.CaseInfo{2: {Reversible: true}}
	cs, err := set.Generate(cases, info, combos.Params{})
	if err != nil {
		fmt.Println(err)
		return
	}
	job := &analysis.Job{
		Model:        &frame.Model{Cases: []frame.Case{{Name: "D"}, {Name: "L"}, {Name: "W"}}},
		Cases:        cases,
		CaseInfo:     info,
		Combinations: cs,
		Set:          set,
	}
	if err := report.WriteCombinationsCSV(os.Stdout, job); err != nil {
		fmt.Println(err)
	}
	// Output:
	// combination,rule,D,L,W
	// 2.3.1-1 1.4D,asce7-16-strength 2.3.1-1,1.4,,
	// 2.3.1-2 1.2D+1.6L,asce7-16-strength 2.3.1-2,1.2,1.6,
	// 2.3.1-4 1.2D+1.0W+1.0L,asce7-16-strength 2.3.1-4,1.2,1,1
	// 2.3.1-4 1.2D-1.0W+1.0L,asce7-16-strength 2.3.1-4,1.2,1,-1
	// 2.3.1-5 0.9D+1.0W,asce7-16-strength 2.3.1-5,0.9,,1
	// 2.3.1-5 0.9D-1.0W,asce7-16-strength 2.3.1-5,0.9,,-1
}

// The unfactored results of each load case as CSV, with the source of the
// results: a cantilever of 3 m fixed at a with a point load of 20 kN at
// its free end b. By statics the root's reactions are Fy = 20 kN and
// M = 60 kN·m counter-clockwise, its moment −60 kN·m (hogging); the tip
// deflects PL³/3EI = 20 × 27 / (3 × 40 000) = 0.0045 m (beam tables,
// common practice).
func ExampleReport_WriteCasesCSV() {
	const l = 3.0
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 200e6, A: 1e-2, I: 2e-4}},
			Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l}},
			Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
			Cases:    []frame.Case{{Name: "P", MemberLoads: []frame.MemberLoad{{Member: 0, Point: true, At: l, P: 20}}}},
		},
		Cases:        []combos.Case{{Name: "P", Kind: combos.Dead}},
		Combinations: []combos.Combination{{Name: "P", Terms: []combos.Term{{Case: 0, Factor: 1}}}},
		Settings:     analysis.Settings{Stations: 3},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	src := &report.Source{Build: report.Build{Version: "v1.0.0"}, File: "cantilever.toml", SHA256: "0123abcd", Date: time.Date(2026, 12, 2, 0, 0, 0, 0, time.UTC)}
	var b strings.Builder
	if err := report.New(res).From(src).WriteCasesCSV(&b); err != nil {
		fmt.Println(err)
	}
	for _, line := range strings.Split(strings.TrimSpace(b.String()), "\n") {
		// The free end's forces are zero to round-off (about 1e-14),
		// whose last bits vary from one processor to another: left out.
		if !strings.Contains(line, ",a-b,end,") {
			fmt.Println(line)
		}
	}
	// Output:
	// case,result,name,end,quantity,value,unit
	// P,reaction,a,,Fx,0,kN
	// P,reaction,a,,Fy,20,kN
	// P,reaction,a,,M,60,kN·m
	// P,member,a-b,start,N,0,kN
	// P,member,a-b,start,V,20,kN
	// P,member,a-b,start,M,-60,kN·m
	// P,displacement,a,,ux,0,m
	// P,displacement,a,,uy,0,m
	// P,displacement,a,,rz,0,rad
	// P,displacement,b,,ux,0,m
	// P,displacement,b,,uy,-0.0045,m
	// P,displacement,b,,rz,-0.00225,rad
	// ,source,program,,,govern v1.0.0,
	// ,source,model_file,,,cantilever.toml,
	// ,source,model_sha256,,,0123abcd,
	// ,source,run_date,,,2026-12-02T00:00:00Z,
}
