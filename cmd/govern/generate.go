package main

import (
	"fmt"
	"io"
	"strings"
)

// frameSpec describes a regular frame for generateModel.
type frameSpec struct {
	Title   string
	Bays    []float64 // m
	Storeys []float64 // m, bottom to top
	Spacing float64   // m between parallel frames; 0 for none
}

// generateModel writes a starting model for a regular concrete frame in kN
// and m: typical sections, a dead case (self weight and floor and roof
// area loads), a patterned floor live case, a patterned roof live case and
// a reversible wind case at the floor levels, with the strength
// combinations of ASCE/SEI 7-16 section 2.3.1. The loads are typical values to be
// replaced, not recommendations.
func generateModel(w io.Writer, s frameSpec) error {
	f := func(v []float64) string {
		p := make([]string, len(v))
		for i, x := range v {
			p[i] = fmt.Sprintf("%g", x)
		}
		return "[" + strings.Join(p, ", ") + "]"
	}
	spacing := s.Spacing
	if spacing == 0 {
		spacing = 6.0
	}
	var b strings.Builder
	fmt.Fprintf(&b, "# Starting model written by govern. Every number is a placeholder to be\n# checked and replaced by the engineer responsible.\n")
	fmt.Fprintf(&b, "title = %q\n\n[units]\nforce = \"kN\"\nlength = \"m\"\n\n", s.Title)
	fmt.Fprintf(&b, "[analysis]\nstations = 11\nvariable_loads = \"adverse\"\npatterns = \"exact\"\nsegments = 1\n\n")
	fmt.Fprintf(&b, "[grid]\nbays = %s\nstoreys = %s\nbase = \"fixed\"\ncolumn = \"C500\"\nbeam = \"B400x700\"\nspacing = %g\n\n", f(s.Bays), f(s.Storeys), spacing)
	b.WriteString(`# Concrete, E = 30 GPa; weight = 24 kN/m^3 x area.
[[section]]
name = "C500"
E = 30.0e6
A = 0.25
I = 5.208e-3
weight = 6.0

[[section]]
name = "B400x700"
E = 30.0e6
A = 0.28
I = 1.143e-2
weight = 6.72

[[case]]
name = "D"
kind = "dead"
self_weight = true
  [[case.load]]
  type = "area"
  on = ["all beams"]
  q = 6.0

[[case]]
name = "L"
kind = "live"
pattern = true
`)
	n := len(s.Storeys)
	var floors []string
	for lv := 1; lv < n; lv++ {
		floors = append(floors, fmt.Sprintf("%q", fmt.Sprintf("level %d", lv)))
	}
	if len(floors) > 0 {
		fmt.Fprintf(&b, "  [[case.load]]\n  type = \"area\"\n  on = [%s]\n  q = 3.0\n", strings.Join(floors, ", "))
	} else {
		fmt.Fprintf(&b, "  [[case.load]]\n  type = \"area\"\n  on = [\"roof\"]\n  q = 3.0\n")
	}
	b.WriteString(`
[[case]]
name = "Lr"
kind = "roof-live"
pattern = true
  [[case.load]]
  type = "area"
  on = ["roof"]
  q = 1.0

[[case]]
name = "W"
kind = "wind"
reversible = true   # wind from either side
  # 1.0 kPa on the facade, lumped at each level on line A.
`)
	for lv := 1; lv <= n; lv++ {
		trib := s.Storeys[lv-1] / 2
		if lv < n {
			trib += s.Storeys[lv] / 2
		}
		fmt.Fprintf(&b, "  [[case.load]]\n  type = \"node\"\n  node = \"A%d\"\n  fx = %.4g\n", lv, 1.0*spacing*trib)
	}
	b.WriteString(`
# Strength combinations of ASCE/SEI 7-16 section 2.3.1, expanded against the
# cases above by their kind (govern combos lists them).
[combinations]
standard = "asce7-16-strength"
`)
	_, err := io.WriteString(w, b.String())
	return err
}

// regularSpec is a frame of n bays alternating 7.5 m and 6.0 m and m storeys
// of 4.2 m then 3.6 m: the shape the benchmarks grow.
func regularSpec(bays, storeys int) frameSpec {
	s := frameSpec{Title: fmt.Sprintf("regular frame, %d bays x %d storeys", bays, storeys), Spacing: 6}
	for i := range bays {
		s.Bays = append(s.Bays, []float64{7.5, 6.0}[i%2])
	}
	for i := range storeys {
		h := 3.6
		if i == 0 {
			h = 4.2
		}
		s.Storeys = append(s.Storeys, h)
	}
	return s
}
