package main

import (
	"fmt"
	"math"
	"strings"
	"testing"
)

// beamBothWays returns a beam of 6 m between nodes L (x = 0) and R (x = 6),
// EI = 1e4, EA = 1e6, α = 1.2e-5, depth 0.5, drawn left to right (member
// L-R) or right to left (member R-L), with the member keys and one case
// of kind kind holding the loads; sel is replaced by the member's name.
func beamBothWays(rtl bool, supL, supR, member, kind string, loads ...string) string {
	name, start, end := "L-R", "L", "R"
	if rtl {
		name, start, end = "R-L", "R", "L"
	}
	src := tsection("S", 1e7, 0.1, 1e-3, 0) + "alpha = 1.2e-5\ndepth = 0.5\n" +
		tnode("L", 0, 0, "") + supL + tnode("R", 6, 0, "") + supR +
		tmember(start, end, "S") + member +
		fmt.Sprintf("[[case]]\nname = \"C\"\nkind = %q\n", kind)
	for _, l := range loads {
		src += strings.ReplaceAll(l, "SEL", name)
	}
	return src + "[[combination]]\nname = \"1.0C\"\nfactors = { C = 1.0 }\n"
}

// printed returns the cells of the beam's row of the beams table (+M, at
// x, -M, at x, |V|, at x, without the member's name and the governing
// combinations) and of the reactions table, as printed.
func printed(t *testing.T, src string) (beam []string, reactions [][]string) {
	t.Helper()
	r := summary(t, analyseModel(t, src))
	tb := r.one(t, "Beams at level")
	if len(tb.rows) != 1 {
		t.Fatalf("beam rows %q", tb.rows)
	}
	row := tb.rows[0]
	for i, h := range tb.header {
		if i > 0 && h != "governing" && !strings.HasPrefix(h, "with ") {
			beam = append(beam, row[i])
		}
	}
	for _, row := range r.one(t, "Reactions").rows {
		reactions = append(reactions, []string{row[0], row[1], row[2], row[4]})
	}
	return beam, reactions
}

// TestNewLoadsPrintTheSameWhicheverWayTheBeamIsDrawn: each new load on a
// beam, and each new joint, drawn left to right and right to left (with
// the load entered for the same physical load: a gradient given as the
// local +y face less the −y face changes sign with the member's
// direction), prints the same beam values and reactions, and those
// values are the closed forms (Hibbeler, Structural Analysis, inside back
// cover, fixed-end moments; slope-deflection; statics by hand for the
// reactions).
func TestNewLoadsPrintTheSameWhicheverWayTheBeamIsDrawn(t *testing.T) {
	fixed := "support = \"fixed\"\n"
	for _, tc := range []struct {
		name         string
		supL, supR   string
		member, kind string
		loads        func(rtl bool) []string
		beam         []string   // +M, at x, -M, at x, |V|, at x; "*" where the two ends tie (symmetric beams: round-off picks the end)
		reactions    [][]string // node, component, max, min: the left node's Fy and M
		source       string
	}{
		{
			name: "triangular load, heavy at the right", supL: fixed, supR: fixed, kind: "dead",
			loads: func(rtl bool) []string {
				w, w2 := 0, 10
				if rtl {
					w, w2 = 10, 0
				}
				return []string{fmt.Sprintf("  [[case.load]]\n  type = \"udl\"\n  on = \"SEL\"\n  w = %d\n  w2 = %d\n", w, w2)}
			},
			// wL²/30 = 12 at the zero end, wL²/20 = 18 at the heavy end;
			// reactions 3wL/20 = 9 and 7wL/20 = 21.
			beam:      []string{"7.50", "3.00", "-18.00", "6.00", "21.00", "6.00"},
			reactions: [][]string{{"", "Fy (kN)", "9.00", "9.00"}, {"", "M (kN·m)", "12.00", "12.00"}},
			source:    "FEM wL²/30 and wL²/20",
		},
		{
			name: "moment at midspan", supL: fixed, supR: fixed, kind: "dead",
			loads: func(bool) []string {
				return []string{"  [[case.load]]\n  type = \"moment\"\n  on = \"SEL\"\n  m = 12\n  at = 3\n"}
			},
			// M0/4 = 3 at each end, reactions 3M0/2L = 3; the moment
			// jumps from 6 to -6 at midspan.
			beam:      []string{"6.00", "3.00", "-6.00", "3.00", "3.00", "0.00"},
			reactions: [][]string{{"", "Fy (kN)", "3.00", "3.00"}, {"", "M (kN·m)", "3.00", "3.00"}},
			source:    "FEM M0/4",
		},
		{
			name: "settlement of the right end", supL: fixed, supR: fixed, kind: "settlement",
			loads: func(bool) []string {
				return []string{"  [[case.load]]\n  type = \"displacement\"\n  node = \"R\"\n  dy = -0.01\n"}
			},
			// 6EIΔ/L² = 16.67 hogging at the left end, sagging at the
			// right; V = 12EIΔ/L³ = 5.56, the left support pushing up.
			beam:      []string{"16.67", "6.00", "-16.67", "0.00", "5.56", "0.00"},
			reactions: [][]string{{"", "Fy (kN)", "5.56", "0.00"}, {"", "M (kN·m)", "16.67", "0.00"}},
			source:    "slope-deflection 6EIΔ/L², 12EIΔ/L³ (the settlement acts only where adverse: 0 is the other extreme)",
		},
		{
			name: "top hotter", supL: fixed, supR: fixed, kind: "temperature",
			loads: func(rtl bool) []string {
				g := 20
				if rtl {
					g = -20 // local +y is the bottom face
				}
				return []string{fmt.Sprintf("  [[case.load]]\n  type = \"temperature\"\n  on = \"SEL\"\n  dT_gradient = %d\n", g)}
			},
			// EIαΔT/h = 4.8 sagging everywhere, no shear.
			beam:      []string{"4.80", "0.00", "0.00", "0.00", "0.00", "0.00"},
			reactions: [][]string{{"", "Fy (kN)", "0.00", "0.00"}, {"", "M (kN·m)", "0.00", "-4.80"}},
			source:    "EI·α·ΔT/h",
		},
		{
			name: "rigid end zones", supL: fixed, supR: fixed, kind: "dead",
			member: "offset_start = 0.3\noffset_end = 0.3\n",
			loads: func(bool) []string {
				return []string{"  [[case.load]]\n  type = \"udl\"\n  on = \"SEL\"\n  w = 10\n"}
			},
			// The flexible 5.4 m as a fixed-ended beam: wl²/24 = 12.15 at
			// midspan; at the nodes wl²/12 + (wl/2)0.3 + w0.3²/2 = 32.85.
			beam:      []string{"12.15", "3.00", "-32.85", "*", "30.00", "*"},
			reactions: [][]string{{"", "Fy (kN)", "30.00", "30.00"}, {"", "M (kN·m)", "32.85", "32.85"}},
			source:    "FEM wl²/12 on the flexible length",
		},
		{
			name: "semi-rigid ends", supL: fixed, supR: fixed, kind: "dead",
			member: "spring_start = 6666.666666666667\nspring_end = 6666.666666666667\n",
			loads: func(bool) []string {
				return []string{"  [[case.load]]\n  type = \"udl\"\n  on = \"SEL\"\n  w = 10\n"}
			},
			// (wL²/12)/(1 + 2EI/kL) with EI = 1e4, k = 1e4/1.5: 30/(1 + 0.5)
			// = 20 at the ends, 45 − 20 = 25 at midspan.
			beam:      []string{"25.00", "3.00", "-20.00", "*", "30.00", "*"},
			reactions: [][]string{{"", "Fy (kN)", "30.00", "30.00"}, {"", "M (kN·m)", "20.00", "20.00"}},
			source:    "slope-deflection with end springs",
		},
		{
			name: "cantilever propped by a spring", supL: fixed, supR: "ky = 500\n", kind: "dead",
			loads: func(bool) []string {
				return []string{"  [[case.load]]\n  type = \"udl\"\n  on = \"SEL\"\n  w = 10\n"}
			},
			// R = (3wL⁴/8)/(L³ + 3EI/ky) = 17.61 at the spring, 60 − 17.61
			// = 42.39 at the fixed end with M = wL²/2 − 6R = 74.35; the
			// largest sagging 15.50 at the station 4.20 (V = 0 at 4.24).
			beam:      []string{"15.50", "4.20", "-74.35", "0.00", "42.39", "0.00"},
			reactions: [][]string{{"", "Fy (kN)", "42.39", "42.39"}, {"", "M (kN·m)", "74.35", "74.35"}},
			source:    "force method",
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var first []string
			for _, rtl := range []bool{false, true} {
				beam, reactions := printed(t, beamBothWays(rtl, tc.supL, tc.supR, tc.member, tc.kind, tc.loads(rtl)...))
				for i, w := range tc.beam {
					if w == "*" {
						beam[i] = "*"
					}
				}
				if strings.Join(beam, " ") != strings.Join(tc.beam, " ") {
					t.Errorf("drawn right to left %v: beam %q, want %q (%s)", rtl, beam, tc.beam, tc.source)
				}
				got := fmt.Sprint(reactions)
				if first == nil {
					first = []string{got}
				} else if got != first[0] {
					t.Errorf("reactions differ with the direction drawn:\n%s\n%s", first[0], got)
				}
				for _, want := range tc.reactions {
					if !strings.Contains(got, strings.Join(want, " ")) {
						t.Errorf("drawn right to left %v: reactions %s lack %q (%s)", rtl, got, want, tc.source)
					}
				}
			}
		})
	}
}

// TestRigidZonesLeaveTheFacesWhereTheyAre: with [analysis] rigid_zones the
// face stations of the beams stay half the column depth in from the
// nodes, where they were, and the beams' zones are that long (factor 1);
// a fixed-ended beam between very stiff columns, zones and all, carries
// wl²/12 at its faces over its clear span l (fixed-end moment table,
// Hibbeler, inside back cover): the column tops barely turn.
func TestRigidZonesLeaveTheFacesWhereTheyAre(t *testing.T) {
	const h, span, d, w = 3.0, 6.0, 0.6, 10.0
	model := func(zones string) string {
		return zones + tsection("C", 2e8, 10, 10, d) + tsection("B", 2e8, 0.01, 1e-4, 0.5) +
			tnode("A0", 0, 0, "fixed") + tnode("A1", 0, h, "") + tnode("B1", span, h, "") + tnode("B0", span, 0, "fixed") +
			tmember("A0", "A1", "C") + tmember("A1", "B1", "B") + tmember("B0", "B1", "C") + tdead(tudl("A1-B1", w))
	}
	plain := analyseModel(t, model(""))
	zoned := analyseModel(t, model("[analysis]\nrigid_zones = true\n"))
	if fmt.Sprint(plain.Faces) != fmt.Sprint(zoned.Faces) || zoned.Faces[1] != [2]float64{d / 2, span - d/2} {
		t.Errorf("faces %v with zones, %v without; want [%g %g] for the beam", zoned.Faces, plain.Faces, d/2, span-d/2)
	}
	if mem := zoned.Job.Model.Members[1]; mem.OffsetStart != d/2 || mem.OffsetEnd != d/2 {
		t.Errorf("beam zones %g, %g; want half the column depth, %g", mem.OffsetStart, mem.OffsetEnd, d/2)
	}
	l := span - d
	em := zoned.Envelope.Members[1]
	faces := 0
	for _, st := range em.Stations {
		if st.Extra {
			faces++
			if got, want := st.M.Min, -w*l*l/12; math.Abs(got-want) > 2e-3*math.Abs(want) {
				t.Errorf("face at x = %g: M %g, want -wl²/12 = %g", st.X, got, want)
			}
		}
	}
	if faces != 2 {
		t.Errorf("%d face stations on the beam, want 2", faces)
	}
}
