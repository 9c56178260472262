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
	Title   string
	Bays    []float64 // m
	Storeys []float64 // m, bottom to top
	Spacing float64   // m between parallel frames; 0 for the default, 6 m
	// Faces gives the sections their depth, so that beams get stations at
	// the column faces; Service adds a service combination, for
	// deflections. govern new sets both; the benchmarks' frames have
	// neither unless they say so.
	Faces, Service bool
}

// Placeholder values of a starting model, in kN and m.
const (
	concreteE      = 30.0e6 // kN/m², about 30 GPa
	concreteWeight = 24.0   // kN/m³, reinforced concrete
	floorDead      = 6.0    // kPa: slab, finishes, services
	floorLive      = 3.0    // kPa: offices
	roofLive       = 1.0    // kPa
	windPressure   = 1.0    // kPa on the facade
	DefaultSpacing = 6.0    // m
)

// rect is a rectangular concrete section b × h (m).
type rect struct {
	name string
	b, h float64
}

// starterSections sizes the sections of a starting model: a beam as deep as
// the longest bay over 12 (a usual first guess for continuous beams, common
// practice), rounded up to 50 mm and at least 400 mm, and square columns of
// 400 mm plus 50 mm for every three storeys they carry, at most 1200 mm.
// They are placeholders for the engineer to size.
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

// WriteStarter writes a starting model for a regular concrete frame in kN
// and m, commented for the engineer to edit: the grid, a typical column and
// beam section (with their depths when s.Faces, so that beams get stations
// at the column faces), a dead case (self weight and floor and roof area
// loads), a patterned floor live case, a patterned roof live case, a
// reversible wind case at the floor levels, the strength combinations of
// ASCE/SEI 7-16 section 2.3.1 and, when s.Service, a service combination
// for deflections. The loads are typical values to be replaced, not
// recommendations.
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
		spacing = DefaultSpacing
	}
	col, beam := starterSections(s)
	n := len(s.Storeys)
	var b strings.Builder
	fmt.Fprintf(&b, `# Starting model written by govern new: %d bays, %d storeys.
# Every number here is a placeholder, to be checked and replaced by the
# engineer responsible: sections, loads and combinations alike. The keys
# are described in docs/model-format.md; 'govern check' reads the file,
# 'govern combos' lists its combinations, 'govern run' analyses it.
title = %q

[units]                      # labels only: numbers are never converted
force = "kN"
length = "m"

[analysis]
stations = 11                # equally spaced result stations per member
variable_loads = "adverse"   # variable loads act only where they make an effect worse
patterns = "exact"           # live load placed span by span where it is adverse
segments = 1                 # 2 or more also places part-span live load

[grid]
# Column spacing, left to right, and storey heights, bottom to top (m).
bays = %s
storeys = %s
base = "fixed"               # or "pinned"
column = %q
beam = %q
spacing = %s                 # distance between parallel frames (m); area loads use it

`, len(s.Bays), n, s.Title, list(s.Bays), list(s.Storeys), col.name, beam.name, g(spacing))
	fmt.Fprintf(&b, "# Concrete, E = 30 GPa = %s kN/m²; weight = %s kN/m³ × area.\n", eng(concreteE), g(concreteWeight))
	if s.Faces {
		fmt.Fprintf(&b, "# depth is the size in the plane of the frame: beams get stations at the\n# column faces, half the column's depth in from each joint.\n")
	}
	for _, r := range []struct {
		rect
		what string
	}{{col, "column"}, {beam, "beam"}} {
		a := r.b * r.h
		fmt.Fprintf(&b, "[[section]]\nname = %q   # %s %d × %d mm\nE = %s\nA = %s\nI = %s\nweight = %s\n",
			r.name, r.what, int(math.Round(r.b*1000)), int(math.Round(r.h*1000)), eng(concreteE), g4(a), g4(r.b*r.h*r.h*r.h/12), g4(concreteWeight*a))
		if s.Faces {
			fmt.Fprintf(&b, "depth = %s\n", g(r.h))
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
`, g(floorDead))
	var floors []string
	for lv := 1; lv < n; lv++ {
		floors = append(floors, fmt.Sprintf("%q", fmt.Sprintf("level %d", lv)))
	}
	if len(floors) == 0 {
		floors = []string{`"roof"`}
	}
	fmt.Fprintf(&b, "  [[case.load]]              # offices\n  type = \"area\"\n  on = [%s]\n  q = %s\n", strings.Join(floors, ", "), g(floorLive))
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
  # %s kPa on the facade over the frame spacing, lumped at each level on line A.
`, g(roofLive), g(windPressure))
	for lv := 1; lv <= n; lv++ {
		trib := s.Storeys[lv-1] / 2
		if lv < n {
			trib += s.Storeys[lv] / 2
		}
		fmt.Fprintf(&b, "  [[case.load]]\n  type = \"node\"\n  node = \"A%d\"\n  fx = %s\n", lv, g(math.Round(windPressure*spacing*trib*1e6)/1e6))
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
