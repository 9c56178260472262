package modelfile

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// Starter describes a regular frame for WriteStarter.
type Starter struct {
	Title string
	// Units is the system the model is written in; Bays, Storeys and
	// Spacing are in its length unit (m, mm or ft).
	Units   StarterUnits
	Bays    []float64
	Storeys []float64 // bottom to top
	Spacing float64   // between parallel frames; 0 for the default (DefaultSpacing)
	// Faces gives the sections their depth, so that beams get stations at
	// the column faces; Service adds a service combination, for
	// deflections. govern new sets both; the benchmarks' frames have
	// neither unless they say so.
	Faces, Service bool
}

// StarterUnits is the system of units of a starting model.
type StarterUnits uint8

const (
	StarterKNm   StarterUnits = iota // kN and m, the default
	StarterNmm                       // N and mm
	StarterKipFt                     // kip and ft
)

var starterUnitNames = [...]string{"kN,m", "N,mm", "kip,ft"}

func (u StarterUnits) String() string {
	if int(u) < len(starterUnitNames) {
		return starterUnitNames[u]
	}
	return fmt.Sprintf("StarterUnits(%d)", u)
}

// ParseStarterUnits reads a system of units as govern new takes it:
// "kN,m", "N,mm" or "kip,ft" (spaces ignored).
func ParseStarterUnits(s string) (StarterUnits, bool) {
	s = strings.ReplaceAll(s, " ", "")
	for i, n := range starterUnitNames {
		if s == n {
			return StarterUnits(i), true
		}
	}
	return 0, false
}

// Length returns the symbol of the system's length unit.
func (u StarterUnits) Length() string { return [...]string{"m", "mm", "ft"}[u] }

// DefaultSpacing returns the distance between frames a starting model
// takes when none is given, in the system's length unit: 6 m, 6000 mm,
// 20 ft.
func (u StarterUnits) DefaultSpacing() float64 { return [...]float64{6, 6000, 20}[u] }

// DefaultSpacing is the default distance between frames, in m.
const DefaultSpacing = 6.0

// Placeholder values of a starting model, in kN and m and, for a model in
// kip and ft, in the units US practice gives them.
const (
	concreteE      = 30.0e6 // kN/m², about 30 GPa
	concreteWeight = 24.0   // kN/m³, reinforced concrete
	floorDead      = 6.0    // kPa: slab, finishes, services
	floorLive      = 3.0    // kPa: offices
	roofLive       = 1.0    // kPa
	windPressure   = 1.0    // kPa on the facade

	// For a model in kip and ft: f'c = 4000 psi, E = 57000√f'c psi
	// (ACI 318-19 19.2.2.1(b), recalled from memory) ≈ 3600 ksi; normal
	// weight reinforced concrete 150 pcf; floor dead 125 psf, office live
	// 50 psf with 15 psf of partitions, roof live 20 psf (ASCE/SEI 7-16
	// Table 4.3-1 and 4.3.2, recalled from memory), wind 20 psf: typical
	// values to be replaced.
	usConcreteE = 3600.0 // ksi
	usWeight    = 150.0  // pcf
	usDead      = 125.0  // psf
	usLive      = 65.0   // psf
	usRoofLive  = 20.0   // psf
	usWind      = 20.0   // psf
)

// rect is a rectangular concrete section b × h, in m or, for a model in
// kip and ft, in inches.
type rect struct {
	name string
	b, h float64
}

// starterSections sizes the sections of a starting model: a beam as deep as
// the longest bay over 12 (a usual first guess for continuous beams, common
// practice), rounded up to 50 mm and at least 400 mm, and square columns of
// 400 mm plus 50 mm for every three storeys they carry, at most 1200 mm;
// in m, from bays in m. They are placeholders for the engineer to size.
func starterSections(s Starter) (col, beam rect) {
	longest := 0.0
	for _, b := range s.Bays {
		longest = math.Max(longest, b)
	}
	// Whole millimetres, so that the file shows 0.6, not 0.6000000000000001.
	up := func(v float64) float64 { return math.Round(math.Ceil(v/0.05-1e-9)*50) / 1000 }
	h := math.Max(0.4, up(longest/12))
	b := 0.4
	if h > 0.8 {
		b = 0.5
	}
	side := math.Min(1.2, up(0.4+0.05*math.Ceil(float64(len(s.Storeys))/3)))
	mm := func(v float64) int { return int(math.Round(v * 1000)) }
	col = rect{name: fmt.Sprintf("C%d", mm(side)), b: side, h: side}
	beam = rect{name: fmt.Sprintf("B%dx%d", mm(b), mm(h)), b: b, h: h}
	return col, beam
}

// usSections sizes the sections of a starting model in kip and ft, in
// inches, from bays in ft, by the same rules in US sizes: a beam as deep
// as the longest bay over 12, rounded up to 2 in and at least 16 in, 16 in
// wide (20 in when deeper than 32 in); square columns of 16 in plus 2 in
// for every three storeys, at most 48 in.
func usSections(s Starter) (col, beam rect) {
	longest := 0.0
	for _, b := range s.Bays {
		longest = math.Max(longest, b)
	}
	h := math.Max(16, 2*math.Ceil(longest/2-1e-9)) // the span over 12, in inches, is the span in ft
	b := 16.0
	if h > 32 {
		b = 20
	}
	side := math.Min(48, 16+2*math.Ceil(float64(len(s.Storeys))/3))
	col = rect{name: fmt.Sprintf("C%d", int(side)), b: side, h: side}
	beam = rect{name: fmt.Sprintf("B%dx%d", int(b), int(h)), b: b, h: h}
	return col, beam
}

// starterText holds what differs between the systems of a starting model,
// written as it appears in the file.
type starterText struct {
	force, length  string
	concrete       string // the comment above the sections
	col, beam      rect
	sizes          func(r rect) string   // "500 × 500 mm"
	section        func(r rect) []string // E, A, I, weight, depth
	dead, live     string
	roof, windNote string
	wind           func(trib float64) string // the force at a level
}

// text returns the values of a starting model in s's system.
func (s Starter) text(spacing float64) starterText {
	switch s.Units {
	case StarterNmm:
		m := s
		m.Bays = scale(s.Bays, 1e-3)
		m.Storeys = scale(s.Storeys, 1e-3)
		col, beam := starterSections(m)
		return starterText{
			force: "N", length: "mm", col: col, beam: beam,
			concrete: fmt.Sprintf("# Concrete, E = 30 GPa = %s N/mm²; weight = %s kN/m³ × area, in N/mm (= kN/m).\n", g(concreteE/1e3), g(concreteWeight)),
			sizes:    func(r rect) string { return fmt.Sprintf("%d × %d mm", mmOf(r.b), mmOf(r.h)) },
			section: func(r rect) []string {
				a := r.b * r.h
				return []string{g(concreteE / 1e3), g4mm(a * 1e6), g4mm(r.b * r.h * r.h * r.h / 12 * 1e12), g4(concreteWeight * a), g(float64(mmOf(r.h)))}
			},
			dead: q(floorDead, "kPa"), live: q(floorLive, "kPa"), roof: q(roofLive, "kPa"),
			windNote: g(windPressure) + " kPa",
			// kPa × mm × mm = 1e-3 N.
			wind: func(trib float64) string { return g(math.Round(windPressure * 1e-3 * spacing * trib)) },
		}
	case StarterKipFt:
		col, beam := usSections(s)
		return starterText{
			force: "kip", length: "ft", col: col, beam: beam,
			concrete: fmt.Sprintf("# Concrete, f'c = 4000 psi: E = 57000√f'c psi ≈ %s ksi (ACI 318-19 19.2.2.1);\n# weight = %s pcf × area, in kip/ft. A value with a unit, such as \"%s ksi\",\n# is converted to kip and ft on reading.\n", g(usConcreteE), g(usWeight), g(usConcreteE)),
			sizes:    func(r rect) string { return fmt.Sprintf("%s × %s in", g(r.b), g(r.h)) },
			section: func(r rect) []string {
				a := r.b * r.h // in²
				return []string{q(usConcreteE, "ksi"), q(a, "in2"), q(math.Round(r.b*r.h*r.h*r.h/12), "in4"),
					g4(usWeight * a / 144 / 1000), q(r.h, "in")}
			},
			dead: q(usDead, "psf"), live: q(usLive, "psf"), roof: q(usRoofLive, "psf"),
			windNote: g(usWind) + " psf",
			// psf × ft × ft = 1e-3 kip.
			wind: func(trib float64) string { return g(math.Round(usWind*spacing*trib) / 1000) },
		}
	}
	col, beam := starterSections(s)
	return starterText{
		force: "kN", length: "m", col: col, beam: beam,
		concrete: fmt.Sprintf("# Concrete, E = 30 GPa = %s kN/m²; weight = %s kN/m³ × area.\n", eng(concreteE), g(concreteWeight)),
		sizes:    func(r rect) string { return fmt.Sprintf("%d × %d mm", mmOf(r.b), mmOf(r.h)) },
		section: func(r rect) []string {
			a := r.b * r.h
			return []string{eng(concreteE), g4(a), g4(r.b * r.h * r.h * r.h / 12), g4(concreteWeight * a), g(r.h)}
		},
		dead: g(floorDead), live: g(floorLive), roof: g(roofLive),
		windNote: g(windPressure) + " kPa",
		wind:     func(trib float64) string { return g(math.Round(windPressure*spacing*trib*1e6) / 1e6) },
	}
}

func scale(v []float64, k float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = x * k
	}
	return out
}

// mmOf returns a size in m as whole millimetres.
func mmOf(v float64) int { return int(math.Round(v * 1000)) }

// q writes a value with its unit, as a string of the model file.
func q(v float64, unit string) string { return strconv.Quote(g(v) + " " + unit) }

// WriteStarter writes a starting model for a regular concrete frame in the
// system s.Units (kN and m, N and mm, or kip and ft), commented for the
// engineer to edit: the grid, a typical column and beam section (with
// their depths when s.Faces, so that beams get stations at the column
// faces), a dead case (self weight and floor and roof area loads), a
// patterned floor live case, a patterned roof live case, a reversible wind
// case at the floor levels, the strength combinations of ASCE/SEI 7-16
// section 2.3.1 and, when s.Service, a service combination for
// deflections. The loads are typical values to be replaced, not
// recommendations; in kip and ft, the values US practice gives in other
// units (ksi, in², in⁴, psf) are written with their units.
func WriteStarter(w io.Writer, s Starter) error {
	list := func(v []float64) string {
		p := make([]string, len(v))
		for i, x := range v {
			p[i] = g(x)
		}
		return "[" + strings.Join(p, ", ") + "]"
	}
	spacing := s.Spacing
	if spacing == 0 {
		spacing = s.Units.DefaultSpacing()
	}
	tx := s.text(spacing)
	col, beam := tx.col, tx.beam
	n := len(s.Storeys)
	l := tx.length
	var b strings.Builder
	fmt.Fprintf(&b, `# Starting model written by govern new: %d bays, %d storeys.
# Every number here is a placeholder, to be checked and replaced by the
# engineer responsible: sections, loads and combinations alike. The keys
# are described in docs/model-format.md; 'govern check' reads the file,
# 'govern combos' lists its combinations, 'govern run' analyses it.
title = %q

[units]                      # plain numbers are in these; "12 kN" is converted
force = %q
length = %q

[analysis]
stations = 11                # equally spaced result stations per member
variable_loads = "adverse"   # variable loads act only where they make an effect worse
patterns = "exact"           # live load placed span by span where it is adverse
segments = 1                 # 2 or more also places part-span live load

[grid]
# Column spacing, left to right, and storey heights, bottom to top (%s).
bays = %s
storeys = %s
base = "fixed"               # or "pinned"
column = %q
beam = %q
%s# distance between parallel frames (%s); area loads use it

`, len(s.Bays), n, s.Title, tx.force, l, l, list(s.Bays), list(s.Storeys), col.name, beam.name, fmt.Sprintf("%-29s", "spacing = "+g(spacing)), l)
	b.WriteString(tx.concrete)
	if s.Faces {
		fmt.Fprintf(&b, "# depth is the size in the plane of the frame: beams get stations at the\n# column faces, half the column's depth in from each joint.\n")
	}
	for _, r := range []struct {
		rect
		what string
	}{{col, "column"}, {beam, "beam"}} {
		v := tx.section(r.rect)
		fmt.Fprintf(&b, "[[section]]\nname = %q   # %s %s\nE = %s\nA = %s\nI = %s\nweight = %s\n",
			r.name, r.what, tx.sizes(r.rect), v[0], v[1], v[2], v[3])
		if s.Faces {
			fmt.Fprintf(&b, "depth = %s\n", v[4])
		}
		b.WriteString("\n")
	}
	fmt.Fprintf(&b, `[[case]]
name = "D"
kind = "dead"
self_weight = true           # the sections' weight along every member
  [[case.load]]              # slab, finishes and services
  type = "area"
  on = ["all beams"]
  q = %s

[[case]]
name = "L"
kind = "live"
pattern = true               # placed span by span
# reduction = "asce7-16"     # live load reduction by tributary area (or "en1991")
`, tx.dead)
	var floors []string
	for lv := 1; lv < n; lv++ {
		floors = append(floors, fmt.Sprintf("%q", fmt.Sprintf("level %d", lv)))
	}
	if len(floors) == 0 {
		floors = []string{`"roof"`}
	}
	fmt.Fprintf(&b, "  [[case.load]]              # offices\n  type = \"area\"\n  on = [%s]\n  q = %s\n", strings.Join(floors, ", "), tx.live)
	fmt.Fprintf(&b, `
[[case]]
name = "Lr"
kind = "roof-live"
pattern = true
  [[case.load]]
  type = "area"
  on = ["roof"]
  q = %s

[[case]]
name = "W"
kind = "wind"
reversible = true            # wind from either side
  # %s on the facade over the frame spacing, lumped at each level on line A.
`, tx.roof, tx.windNote)
	for lv := 1; lv <= n; lv++ {
		trib := s.Storeys[lv-1] / 2
		if lv < n {
			trib += s.Storeys[lv] / 2
		}
		fmt.Fprintf(&b, "  [[case.load]]\n  type = \"node\"\n  node = \"A%d\"\n  fx = %s\n", lv, tx.wind(trib))
	}
	b.WriteString(`
# Strength combinations of ASCE/SEI 7-16 section 2.3.1, expanded against the
# cases above by their kind; 'govern combos' lists them. Another standard:
# "en1990-6.10" with a category on each variable case (docs/combinations.md).
[combinations]
standard = "asce7-16-strength"
`)
	if s.Service {
		b.WriteString(`
# A service combination: it gives the deflections, with span/deflection for
# the beams, and stays out of the design forces.
[[combination]]
name = "service D+L+Lr"
factors = { D = 1.0, L = 1.0, Lr = 1.0 }
service = true
`)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// g formats an input value as it would be typed.
func g(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// eng formats a large value as engineers type it, such as 30.0e6.
func eng(v float64) string {
	e := int(math.Floor(math.Log10(math.Abs(v))/3)) * 3
	return strconv.FormatFloat(v/math.Pow(10, float64(e)), 'f', 1, 64) + "e" + strconv.Itoa(e)
}

// g4 formats a derived value to four significant figures.
func g4(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }

// g4mm formats a derived value in mm² or mm⁴ to four significant figures
// as engineers type them: 250000, 5.208e9.
func g4mm(v float64) string {
	if v < 1e7 {
		return strconv.FormatFloat(math.Round(v), 'f', -1, 64)
	}
	m := strconv.FormatFloat(v, 'e', 3, 64) // such as 5.208e+09
	mant, exp, _ := strings.Cut(m, "e")
	mant = strings.TrimRight(strings.TrimRight(mant, "0"), ".")
	n, _ := strconv.Atoi(exp)
	return mant + "e" + strconv.Itoa(n)
}
