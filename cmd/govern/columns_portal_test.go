package main

import (
	"cmp"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// The portal of testdata/tables/portal.toml: fixed bases A0 and B0, beam
// A1-B1 at h = 4 m spanning L = 8 m, Ib = 3Ic so k = (Ib/L)/(Ic/h) = 1.5,
// every member axially stiff. Case D: w = 12 kN/m on the beam and the
// columns' self weight g = 6 kN/m; case W: H = 62 kN at A1, to the right.
// Combinations 1.4D, 1.2D+1.0W, 0.9D+1.0W (as written) and the service
// combination D.
//
// Closed forms, each combination being fD × D + fW × W:
//   - the rigid frame formulas (docs/verification.md) for the uniform load
//     on the beam, corner moment Mc = wL²/(6(k+2)), base moment Mb =
//     wL²/(12(k+2)), base Fx = wL²/(4h(k+2)); and for H at the beam, base
//     moment (Hh/2)(3k+1)/(6k+1), top moment (Hh/2)(3k)/(6k+1), base Fx =
//     −H/2;
//   - statics for the rest: the moment is linear along a column (no load
//     across it), V = dM/dx, each column carries half the beam's load (by
//     symmetry) and its own weight above the station, the beam's end shears
//     under H carry 2Mt/L of tension into the windward column and as much
//     compression into the leeward one, the reactions are the column end
//     forces;
//   - deflections from the chord by integrating M/EI twice.
//
// TestColumnsPortalClosedForms checks these forms against each other by
// statics.
const (
	portalL, portalH, portalW, portalG, portalWind = 8.0, 4.0, 12.0, 6.0, 62.0
	portalIb, portalIc, portalE                    = 3e-3, 1e-3, 30e6
)

var portalK = (portalIb / portalL) / (portalIc / portalH)

// portalCombo is a combination of the portal: its name and factors.
type portalCombo struct {
	name   string
	fD, fW float64
}

var (
	portalStrength = []portalCombo{{"1.4D", 1.4, 0}, {"1.2D+1.0W", 1.2, 1}, {"0.9D+1.0W", 0.9, 1}}
	portalService  = []portalCombo{{"D", 1, 0}}
	portalNumbered = []string{"1.4D", "1.2D+1.0W", "0.9D+1.0W", "D"}
)

// The rigid frame formulas.
var (
	portalMc  = portalW * portalL * portalL / (6 * (portalK + 2))            // corner moment, hogging
	portalMb  = portalW * portalL * portalL / (12 * (portalK + 2))           // base moment
	portalHx  = portalW * portalL * portalL / (4 * portalH * (portalK + 2))  // base thrust
	portalMbw = portalWind * portalH / 2 * (3*portalK + 1) / (6*portalK + 1) // base moment under H
	portalMtw = portalWind * portalH / 2 * (3 * portalK) / (6*portalK + 1)   // top moment under H
)

// portalForces is N, V, M at a station.
type portalForces struct{ n, v, m float64 }

// portalColumn returns the forces in column A0-A1 (a) or B0-B1 (!a), both
// drawn from their base up, at x from the base: M positive with the +X face
// in tension (conventions.md).
func portalColumn(c portalCombo, a bool, x float64) portalForces {
	h := portalH
	// Gravity: the inner face of a column is in tension at its base, the
	// outer face at its top: the +X face for A, the −X face for B.
	mg := c.fD * (portalMb - (portalMb+portalMc)*x/h)
	vg := -c.fD * (portalMb + portalMc) / h
	// H to the right: both columns lean the same way, the −X face in
	// tension at the base and the +X face at the top.
	mw := c.fW * (-portalMbw + (portalMbw+portalMtw)*x/h)
	vw := c.fW * (portalMbw + portalMtw) / h
	n := -c.fD * (portalW*portalL/2 + portalG*(h-x))
	t := c.fW * 2 * portalMtw / portalL // tension in the windward column
	if a {
		return portalForces{n + t, vg + vw, mg + mw}
	}
	return portalForces{n - t, -vg + vw, -mg + mw}
}

// portalBeam returns the forces in the beam A1-B1 at x from A1: M sagging
// positive.
func portalBeam(c portalCombo, x float64) portalForces {
	l := portalL
	return portalForces{
		n: -c.fD*portalHx - c.fW*portalWind/2,
		v: c.fD*portalW*(l/2-x) - c.fW*2*portalMtw/l,
		m: c.fD*(-portalMc+portalW*x*(l-x)/2) + c.fW*portalMtw*(1-2*x/l),
	}
}

// portalReaction returns Fx, Fy, M at A0 (a) or B0: the forces of the
// supports on the columns, from the columns' forces at their bases (local
// y is −X for a column drawn upwards, so Fx = −V; Fy = −N; M = −M(0)).
func portalReaction(c portalCombo, a bool) [3]float64 {
	f := portalColumn(c, a, 0)
	return [3]float64{-f.v, -f.n, -f.m}
}

// portalDeflection returns the deflection of a member from its chord
// under the combination, along its local y: δ” = M/EI, δ = 0 at both
// ends. For the beam, the uniform load's w x (L³ − 2Lx² + x³)/24EI (down)
// and the constant hogging end moments' M x(L − x)/2EI (up); for a column,
// the linear moment from Mb at its base to Mt at its top.
func portalDeflection(c portalCombo, member string, x float64) float64 {
	switch member {
	case "A1-B1":
		l, ei := portalL, portalE*portalIb
		return c.fD * (-portalW*x*(l*l*l-2*l*x*x+x*x*x)/(24*ei) + portalMc*x*(l-x)/(2*ei))
	default:
		h, ei := portalH, portalE*portalIc
		a := member == "A0-A1"
		mb, mt := portalColumn(c, a, 0).m, portalColumn(c, a, h).m
		return (mb*(x*x/2-h*x/2) + (mt-mb)*(x*x*x/(6*h)-h*x/6)) / ei
	}
}

// portalForcesAt returns the forces of a member at x.
func portalForcesAt(c portalCombo, member string, x float64) portalForces {
	switch member {
	case "A1-B1":
		return portalBeam(c, x)
	case "A0-A1":
		return portalColumn(c, true, x)
	}
	return portalColumn(c, false, x)
}

// TestColumnsPortalClosedForms checks the closed forms the portal's tests use
// against statics: each column's shear is the slope of its moment, the
// moments meet at the corners, and the reactions balance the loads.
func TestColumnsPortalClosedForms(t *testing.T) {
	const tol = 1e-9 * columnsScale
	for _, c := range append(slices.Clone(portalStrength), portalService...) {
		t.Run(c.name, func(t *testing.T) {
			for _, a := range []bool{true, false} {
				bottom, top := portalColumn(c, a, 0), portalColumn(c, a, portalH)
				if d := (top.m-bottom.m)/portalH - bottom.v; math.Abs(d) > tol {
					t.Errorf("column (A %v): V is not dM/dx: off by %g", a, d)
				}
			}
			// At A1 the windward column's inner (+X) face continues into the
			// beam's lower face; at B1 the leeward column's outer (+X) face
			// into the beam's upper face.
			if d := portalColumn(c, true, portalH).m - portalBeam(c, 0).m; math.Abs(d) > tol {
				t.Errorf("moments at A1 differ by %g", d)
			}
			if d := portalColumn(c, false, portalH).m + portalBeam(c, portalL).m; math.Abs(d) > tol {
				t.Errorf("moments at B1 differ by %g", d)
			}
			// The beam's end shears are the columns' loads at their tops.
			if d := portalColumn(c, true, portalH).n + portalBeam(c, 0).v; math.Abs(d) > tol {
				t.Errorf("column A's top load and the beam's shear differ by %g", d)
			}
			if d := portalColumn(c, false, portalH).n - portalBeam(c, portalL).v; math.Abs(d) > tol {
				t.Errorf("column B's top load and the beam's shear differ by %g", d)
			}
			ra, rb := portalReaction(c, true), portalReaction(c, false)
			if d := ra[0] + rb[0] + c.fW*portalWind; math.Abs(d) > tol {
				t.Errorf("ΣFx off by %g", d)
			}
			load := c.fD * (portalW*portalL + 2*portalG*portalH)
			if d := ra[1] + rb[1] - load; math.Abs(d) > tol {
				t.Errorf("ΣFy off by %g", d)
			}
			// Moments about A0, counter-clockwise: the beam's load at L/2,
			// column B's weight at L, H at height h.
			applied := -c.fD*(portalW*portalL*portalL/2+portalG*portalH*portalL) - c.fW*portalWind*portalH
			if d := ra[2] + rb[2] + rb[1]*portalL + applied; math.Abs(d) > tol {
				t.Errorf("ΣM about A0 off by %g", d)
			}
		})
	}
}

// portalPeak is the extreme of a quantity over the combinations and the
// stations of a member, with where it is and the forces there.
type portalPeak struct {
	c portalCombo
	x float64
	f portalForces
	v float64
}

// portalExtreme returns the largest value of q over the combinations and
// the stations xs (the first station where a combination
// gives its largest), failing when another combination comes within
// columnsTieTol of it: the portal is made so that none does, and every
// governing combination the tables name is then the only right one.
func portalExtreme(t *testing.T, combos []portalCombo, member string, xs []float64, q func(portalForces) float64) portalPeak {
	t.Helper()
	var per []portalPeak // the largest of each combination
	for _, c := range combos {
		var best portalPeak
		for i, x := range xs {
			f := portalForcesAt(c, member, x)
			if v := q(f); i == 0 || v > best.v {
				best = portalPeak{c, x, f, v}
			}
		}
		per = append(per, best)
	}
	slices.SortStableFunc(per, func(a, b portalPeak) int { return cmp.Compare(b.v, a.v) })
	if per[0].v-per[1].v < columnsTieTol {
		t.Fatalf("%s: %s and %s tie at %g: the model no longer tells the columns apart", member, per[0].c.name, per[1].c.name, per[0].v)
	}
	return per[0]
}

var (
	portalColumnX = []float64{0, 1, 2, 3, 4}           // 5 stations
	portalBeamX   = []float64{0, 0.2, 2, 4, 6, 7.8, 8} // 5 stations and the column faces
)

// TestColumnsPortal: every table of the portal against the closed forms
// above: the columns (N with the moment acting with it, |M|, |V|), the beam,
// its values at the column faces, its deflection, the reactions, the
// statics check, and in the report the station tables and the tables of
// the model (load cases, combinations, sections).
func TestColumnsPortal(t *testing.T) {
	fx := func(x float64) string { return strconv.FormatFloat(x, 'f', 2, 64) }
	for _, v := range columnsViews(t, "portal") {
		t.Run(v.name, func(t *testing.T) {
			// Columns: N max is the largest tension (the least compression
			// here), "with M" the moment at the same station in the same
			// combination; N min the largest compression; |M| and |V| the
			// largest in size.
			for _, c := range []struct {
				member             string
				nMax, nMin, mm, vv string // the governing combinations the model is made for
			}{
				// The windward column: N max with the least dead load and the
				// wind lifting it, at its top; N min under the full dead load
				// at its foot; |M| at its foot where the wind's moment
				// outweighs the dead load's; |V| the dead load's thrust.
				{"A0-A1", "0.9D+1.0W", "1.4D", "0.9D+1.0W", "1.4D"},
				// The leeward column: |M| and |V| where the wind adds to the
				// dead load; N min still under the full dead load, by 0.45 kN.
				{"B0-B1", "0.9D+1.0W", "1.4D", "1.2D+1.0W", "1.2D+1.0W"},
			} {
				t.Run(c.member, func(t *testing.T) {
					nMax := portalExtreme(t, portalStrength, c.member, portalColumnX, func(f portalForces) float64 { return f.n })
					nMin := portalExtreme(t, portalStrength, c.member, portalColumnX, func(f portalForces) float64 { return -f.n })
					mm := portalExtreme(t, portalStrength, c.member, portalColumnX, func(f portalForces) float64 { return math.Abs(f.m) })
					vv := portalExtreme(t, portalStrength, c.member, portalColumnX, func(f portalForces) float64 { return math.Abs(f.v) })
					for _, p := range []struct {
						got  portalPeak
						want string
					}{{nMax, c.nMax}, {nMin, c.nMin}, {mm, c.mm}, {vv, c.vv}} {
						if p.got.c.name != p.want {
							t.Fatalf("the closed forms give %s, not %s: the model no longer tells the columns apart", p.got.c.name, p.want)
						}
					}
					tb, row := v.row(t, isColumnTable, c.member)
					checkRowCells(t, tb, row, []cellWant{
						wantApprox(nMax.f.n, "N max: −(wL/2 + g(h − x))·fD ± 2Mt/L·fW, the largest over stations and combinations", "N max (kN)"),
						wantApprox(nMax.f.m, "the moment at N max's station, in N max's combination (not V there: "+fx(nMax.f.v)+")", "N max (kN)", "with M"),
						wantText("the combination of N max", hdr("N max (kN)", "governing"), nMax.c.name),
						wantApprox(nMin.f.n, "N min: the largest compression, at the foot", "N min (kN)"),
						wantApprox(nMin.f.m, "the base moment with it, wL²/(12(k+2))·fD ∓ base moment of H (not V there: "+fx(nMin.f.v)+")", "N min (kN)", "with M"),
						wantText("the combination of N min", hdr("N min (kN)", "governing"), nMin.c.name),
						wantApprox(mm.v, "|M|: the largest in size, corner or base moment", "|M| (kN·m)"),
						wantText("where |M| is", hdr("|M| (kN·m)", "at x"), fx(mm.x)),
						wantText("the combination of |M|", hdr("|M| (kN·m)", "governing"), mm.c.name),
						wantApprox(vv.v, "|V|: the base thrust wL²/(4h(k+2))·fD ± H/2·fW", "|V| (kN)"),
						wantText("the combination of |V|", hdr("|V| (kN)", "governing"), vv.c.name),
					})
				})
			}
			t.Run("beam", func(t *testing.T) {
				sag := portalExtreme(t, portalStrength, "A1-B1", portalBeamX, func(f portalForces) float64 { return f.m })
				hog := portalExtreme(t, portalStrength, "A1-B1", portalBeamX, func(f portalForces) float64 { return -f.m })
				vv := portalExtreme(t, portalStrength, "A1-B1", portalBeamX, func(f portalForces) float64 { return math.Abs(f.v) })
				if sag.c.name != "1.4D" || sag.x != 4 || hog.c.name != "1.2D+1.0W" || hog.x != 8 || vv.x != 8 {
					t.Fatalf("the closed forms moved: +M by %s at %g, −M by %s at %g, |V| at %g", sag.c.name, sag.x, hog.c.name, hog.x, vv.x)
				}
				tb, row := v.row(t, isBeamTable, "A1-B1")
				checkRowCells(t, tb, row, []cellWant{
					wantApprox(sag.v, "+M = 1.4(wL²/8 − Mc) at midspan", "+M (kN·m)"),
					wantText("midspan", hdr("+M (kN·m)", "at x"), "4.00"),
					wantText("the heaviest dead load", hdr("+M (kN·m)", "governing"), "1.4D"),
					wantApprox(-hog.v, "−M = −1.2Mc − Mt(H) at the leeward end", "-M (kN·m)"),
					wantText("the leeward end", hdr("-M (kN·m)", "at x"), "8.00"),
					wantText("dead load with wind", hdr("-M (kN·m)", "governing"), "1.2D+1.0W"),
					wantApprox(vv.v, "|V| = 1.2wL/2 + 2Mt/L at the leeward end (V there is negative)", "|V| (kN)"),
					wantText("the leeward end", hdr("|V| (kN)", "at x"), "8.00"),
					wantText("dead load with wind", hdr("|V| (kN)", "governing"), vv.c.name),
				})
			})
			t.Run("column faces", func(t *testing.T) {
				checkPortalFaces(t, v, portalStrength, nil)
			})
			t.Run("deflection", func(t *testing.T) {
				tb, row := v.row(t, isDeflectionTable, "A1–B1")
				d := portalDeflection(portalService[0], "A1-B1", portalL/2)
				checkRowCells(t, tb, row, []cellWant{
					wantText("the beam spans between the columns", hdr("kind"), "span"),
					wantText("the beams of the model's level 1, the node height y = 4", hdr("level"), "1"),
					wantNum(portalL, "the span", "length (m)"),
					{col: hdr("down (m)"), v: d, tol: columnsFormulaTol * 0.01, why: "5wL⁴/384EI − Mc L²/8EI at midspan"},
					wantText("midspan", hdr("down (m)", "at x"), "4.00"),
					wantText("the service combination", hdr("down (m)", "governing"), "D"),
				})
				r := printedRatio(t, row[columnIndex(t, tb, "span/deflection (cantilever: 2 × length)")].text)
				if want := math.Floor(portalL / -d); r != want {
					t.Errorf("span/deflection L/%g, want L/%g", r, want)
				}
			})
			t.Run("reactions", func(t *testing.T) {
				tb, rs := reactionsByNode(t, v)
				for _, node := range []struct {
					name string
					a    bool
				}{{"A0", true}, {"B0", false}} {
					if len(rs[node.name]) != 3 {
						t.Errorf("fixed base %s lists %d components, want 3", node.name, len(rs[node.name]))
					}
					for k, comp := range []string{"Fx (kN)", "Fy (kN)", "M (kN·m)"} {
						var cs []combValue
						for _, c := range portalStrength {
							cs = append(cs, combValue{c.name, portalReaction(c, node.a)[k]})
						}
						hi, lo := largestOf(cs), smallestOf(cs)
						checkRowCells(t, tb, rs[node.name][comp], []cellWant{
							wantApprox(hi.v, "the largest: Fx = wL²/(4h(k+2))·fD ∓ H/2·fW, Fy = wL/2 + gh ± 2Mt/L, M = −(column base moment)", "max"),
							wantText("its combination", hdr("max", "governing"), hi.by...),
							wantApprox(lo.v, "the smallest", "min"),
							wantText("its combination", hdr("min", "governing"), lo.by...),
						})
					}
				}
			})
			t.Run("statics", func(t *testing.T) {
				ts := v.tablesOf(isStaticsTable)
				if len(ts) != 1 {
					t.Fatalf("%d statics tables", len(ts))
				}
				load := portalW*portalL + 2*portalG*portalH
				moment := portalW*portalL*portalL/2 + portalG*portalH*portalL
				_, d := v.row(t, isStaticsTable, "D")
				checkRowCells(t, ts[0], d, []cellWant{
					wantNum(0, "gravity only", "loads ΣFx"),
					wantNum(-load, "ΣFy = −(wL + 2gh)", "loads ΣFy"),
					wantNum(load, "the reactions balance the loads", "reactions ΣFy"),
					wantNum(-moment, "ΣM about the origin: −(wL·L/2 + gh·L), clockwise", "loads ΣM"),
					wantNum(moment, "the reactions balance the loads", "reactions ΣM"),
				})
				_, w := v.row(t, isStaticsTable, "W")
				checkRowCells(t, ts[0], w, []cellWant{
					wantNum(portalWind, "ΣFx = H", "loads ΣFx"),
					wantNum(-portalWind, "the bases take H", "reactions ΣFx"),
					wantNum(0, "no vertical load", "loads ΣFy"),
					wantNum(-portalWind*portalH, "ΣM = −Hh, H to the right at height h", "loads ΣM"),
					wantNum(portalWind*portalH, "the reactions balance the load", "reactions ΣM"),
					wantText("in balance", hdr("check"), "ok"),
				})
			})
			if v.name != "report" {
				return
			}
			t.Run("stations", func(t *testing.T) {
				for _, m := range []string{"A0-A1", "B0-B1", "A1-B1"} {
					tb, rows := reportStationRows(t, v, m)
					for _, r := range rows {
						x, err := strconv.ParseFloat(r[0].text, 64)
						if err != nil {
							t.Fatalf("%s: station %q", m, r[0].text)
						}
						face := m == "A1-B1" && (x == 0.2 || x == portalL-0.2)
						if got := r[1].text == "face"; got != face {
							t.Errorf("%s x = %s: marked face %v, want %v (the faces are at 0.200 and 7.800)", m, r[0].text, got, face)
						}
						effects := []struct {
							name, unit string
							q          func(portalForces) float64
						}{
							{"N", "kN", func(f portalForces) float64 { return f.n }},
							{"V", "kN", func(f portalForces) float64 { return f.v }},
							{"M", "kN·m", func(f portalForces) float64 { return f.m }},
						}
						for _, e := range effects {
							var cs []combValue
							for _, c := range portalStrength {
								cs = append(cs, combValue{c.name, e.q(portalForcesAt(c, m, x))})
							}
							checkStationRow(t, tb, m+" "+r[0].text, r, stationWant{e.name, e.unit, largestOf(cs), smallestOf(cs),
								columnsFormulaTol * columnsScale, "closed forms above", portalNumbered})
						}
						d := []combValue{{"D", portalDeflection(portalService[0], m, x)}}
						checkStationRow(t, tb, m+" "+r[0].text, r, stationWant{"δ", "m", largestOf(d), smallestOf(d),
							columnsFormulaTol * 0.01, "from the chord, δ'' = M/EI", portalNumbered})
					}
				}
			})
			t.Run("model tables", func(t *testing.T) {
				find := func(title string) renderedTable {
					for _, tb := range v.tables {
						if strings.HasSuffix(tb.title, title) {
							return tb
						}
					}
					t.Fatalf("no table %q", title)
					return renderedTable{}
				}
				lc := find("Load cases")
				for _, r := range lc.rows {
					switch r.cells[0].text {
					case "D":
						checkRowCells(t, lc, r.cells, []cellWant{
							wantText("", hdr("kind"), "dead"),
							wantNum(0, "", "ΣFx (kN)"),
							wantNum(-(portalW*portalL + 2*portalG*portalH), "wL + 2gh down", "ΣFy (kN)"),
							wantText("the beam's load and the two columns' weight", hdr("member loads"), "3"),
						})
					case "W":
						checkRowCells(t, lc, r.cells, []cellWant{
							wantText("", hdr("kind"), "wind"),
							wantNum(portalWind, "H", "ΣFx (kN)"),
							wantNum(0, "", "ΣFy (kN)"),
							wantText("H at A1", hdr("node loads"), "1"),
						})
					default:
						t.Errorf("load case %q", r.cells[0].text)
					}
				}
				cb := find("Load combinations")
				if len(cb.rows) != len(portalNumbered) {
					t.Fatalf("%d combinations listed, want %d", len(cb.rows), len(portalNumbered))
				}
				for i, r := range cb.rows {
					c := append(slices.Clone(portalStrength), portalService...)[i]
					use := "strength"
					if i >= len(portalStrength) {
						use = "service"
					}
					fw := ""
					if c.fW != 0 {
						fw = strconv.FormatFloat(c.fW, 'g', -1, 64)
					}
					checkRowCells(t, cb, r.cells, []cellWant{
						wantText("numbered in the model's order", hdr("#"), strconv.Itoa(i+1)),
						wantText("", hdr("combination"), c.name),
						wantText("listed in the model file", hdr("rule"), "model"),
						wantText("", hdr("use"), use),
						wantText("the factor on D", hdr("D"), strconv.FormatFloat(c.fD, 'g', -1, 64)),
						wantText("the factor on W, blank without it", hdr("W"), fw),
					})
				}
				sec := find("Sections")
				for _, r := range sec.rows {
					want := map[string]string{"COL": "2", "BEAM": "1"}[r.cells[0].text]
					checkRowCells(t, sec, r.cells, []cellWant{wantText("the members of the section", hdr("members"), want)})
				}
			})
		})
	}
}

// checkPortalFaces checks the table of the beam at the supports, at the
// centreline of each column and at its face, half the column's depth
// (0.4/2 m) in from the node: the values at the face by statics along the
// beam, M(a) = M(0) + V(0)a − wa²/2. designed, when given, names the
// governing combinations the model is made for at B1: centreline M, face M
// and face |V|.
func checkPortalFaces(t *testing.T, v columnsView, combos []portalCombo, designed []string) {
	t.Helper()
	fx := func(x float64) string { return strconv.FormatFloat(x, 'f', 2, 64) }
	for _, end := range []struct {
		node   string
		cl, fc float64
	}{{"A1", 0, 0.2}, {"B1", portalL, portalL - 0.2}} {
		least := func(x float64) portalPeak {
			return portalExtreme(t, combos, "A1-B1", []float64{x}, func(f portalForces) float64 { return -f.m })
		}
		most := func(x float64) portalPeak {
			return portalExtreme(t, combos, "A1-B1", []float64{x}, func(f portalForces) float64 { return math.Abs(f.v) })
		}
		mCl, mFc, vCl, vFc := least(end.cl), least(end.fc), most(end.cl), most(end.fc)
		if designed != nil && end.node == "B1" {
			if got := []string{mCl.c.name, mFc.c.name, vFc.c.name}; !slices.Equal(got, designed) {
				t.Fatalf("the closed forms give %q at B1, not %q: the model no longer tells the columns apart", got, designed)
			}
		}
		tb, row := v.row(t, isFaceTable, "A1-B1", end.node)
		checkRowCells(t, tb, row, []cellWant{
			wantApprox(-mCl.v, "the least M at the node", "M min, centreline (kN·m)"),
			wantText("its combination", hdr("M min, centreline (kN·m)", "governing"), mCl.c.name),
			wantApprox(-mFc.v, "M(a) = M(0) + V(0)a − wa²/2 at the face", "M min, face (kN·m)"),
			wantText("depth/2 from the node", hdr("M min, face (kN·m)", "face at x"), fx(end.fc)),
			wantText("its combination", hdr("M min, face (kN·m)", "governing"), mFc.c.name),
			wantApprox(vCl.v, "the largest |V| at the node", "|V| centreline (kN)"),
			wantText("the combination of |V| at the node", hdr("|V| centreline (kN)", "governing"), vCl.c.name),
			wantApprox(vFc.v, "|V(a)| = |V(0) − wa| at the face", "|V| face (kN)"),
			wantText("the combination of |V| at the face", hdr("|V| face (kN)", "governing"), vFc.c.name),
		})
	}
}

// TestColumnsPortalFaces: the portal of testdata/tables/portal-faces.toml,
// the portal above with H = 7.25 kN (the wind case's factor 7.25/62 of the
// portal's), under 1.4D and 1.2D+1.0W. At B1 the wind's hogging moment
// (Hh/2)(3k)/(6k+1) makes 1.2D+1.0W the worse at the column's face but
// not at its centreline: the face moment falls by |V|a, and the wind adds
// little shear. The table names each combination where it governs.
func TestColumnsPortalFaces(t *testing.T) {
	combos := []portalCombo{{"1.4D", 1.4, 0}, {"1.2D+1.0W", 1.2, 7.25 / portalWind}}
	for _, v := range columnsViews(t, "portal-faces") {
		t.Run(v.name, func(t *testing.T) {
			checkPortalFaces(t, v, combos, []string{"1.4D", "1.2D+1.0W", "1.4D"})
		})
	}
}
