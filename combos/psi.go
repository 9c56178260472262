package combos

import (
	"fmt"
	"slices"
)

// Psi selects one of the EN 1990 factors that turn the characteristic value
// of a variable action into a representative value.
type Psi uint8

const (
	NoPsi Psi = iota // the factor is used as written
	Psi0             // ψ0, combination value
	Psi1             // ψ1, frequent value
	Psi2             // ψ2, quasi-permanent value
)

var psiNames = [...]string{"", "psi0", "psi1", "psi2"}

func (p Psi) String() string {
	if int(p) < len(psiNames) {
		return psiNames[p]
	}
	return fmt.Sprintf("Psi(%d)", uint8(p))
}

// Category is a row of EN 1990 Annex A1, Table A1.1: the recommended ψ
// factors of one sort of variable action in buildings.
type Category struct {
	Name  string     // as written in a model, such as "B" or "snow-up-to-1000m"
	Row   string     // the row of Table A1.1
	Kinds []Kind     // the load kinds the row applies to
	Psi   [3]float64 // ψ0, ψ1, ψ2
}

// Fits reports whether the row applies to loads of kind k.
func (c *Category) Fits(k Kind) bool { return slices.Contains(c.Kinds, k) }

var imposed = []Kind{Live, RoofLive}

// categories is EN 1990:2002 Annex A1, Table A1.1, recommended values
// (recalled from memory; the ψ0 values of wind, 0.6, and of snow at sites up
// to 1000 m, 0.5, and ψ0 = 0 for category H agree with the worked example of
// "Steel Buildings in Europe", Part 3: Actions, section 3.2). A National
// Annex may give other values; a model then gives psi0, psi1, psi2 itself.
var categories = []Category{
	{"A", "Category A: domestic, residential areas", imposed, [3]float64{0.7, 0.5, 0.3}},
	{"B", "Category B: office areas", imposed, [3]float64{0.7, 0.5, 0.3}},
	{"C", "Category C: congregation areas", imposed, [3]float64{0.7, 0.7, 0.6}},
	{"D", "Category D: shopping areas", imposed, [3]float64{0.7, 0.7, 0.6}},
	{"E", "Category E: storage areas", imposed, [3]float64{1.0, 0.9, 0.8}},
	{"F", "Category F: traffic area, vehicle weight up to 30 kN", imposed, [3]float64{0.7, 0.7, 0.6}},
	{"G", "Category G: traffic area, vehicle weight over 30 kN up to 160 kN", imposed, [3]float64{0.7, 0.5, 0.3}},
	{"H", "Category H: roofs", imposed, [3]float64{0, 0, 0}},
	{"snow-nordic", "Snow loads on buildings: Finland, Iceland, Norway, Sweden", []Kind{Snow}, [3]float64{0.7, 0.5, 0.2}},
	{"snow-above-1000m", "Snow loads on buildings: other CEN member states, site altitude above 1000 m", []Kind{Snow}, [3]float64{0.7, 0.5, 0.2}},
	{"snow-up-to-1000m", "Snow loads on buildings: other CEN member states, site altitude up to 1000 m", []Kind{Snow}, [3]float64{0.5, 0.2, 0}},
	{"wind", "Wind loads on buildings", []Kind{Wind}, [3]float64{0.6, 0.2, 0}},
	{"temperature", "Temperature (non-fire) in buildings", []Kind{Other, Temperature}, [3]float64{0.6, 0.5, 0}},
}

// Categories returns the rows of EN 1990 Table A1.1 that a case's category
// may name, in the order of the table.
func Categories() []Category {
	out := make([]Category, len(categories))
	copy(out, categories)
	return out
}

// LookupCategory returns the row named name.
func LookupCategory(name string) (Category, bool) {
	for _, c := range categories {
		if c.Name == name {
			return c, true
		}
	}
	return Category{}, false
}

// CaseInfo is what the combination rules need to know about a load case
// besides its kind. The zero value is a case that acts one way only and has
// no ψ factors of its own.
type CaseInfo struct {
	// Reversible makes the case enter every combination once with its
	// factor and once with the factor negated (wind or earthquake from
	// the other side).
	Reversible bool
	// Category names a row of EN 1990 Table A1.1 (see [Categories]); "" when
	// not given. A wind case without one takes the wind row, a temperature
	// case the temperature row.
	Category string
	// Psi holds ψ0, ψ1, ψ2 given for this case; they take precedence over
	// the category's. PsiGiven says which were given.
	Psi      [3]float64
	PsiGiven [3]bool
	// Action names the action the case belongs to, and Alternative the
	// alternative within it; With names a case whose action and
	// alternative this case shares. "" when not given: the case is then
	// grouped by the rule of its kind (see [GroupActions]).
	Action, Alternative, With string
}

// Row returns the name of the row of Table A1.1 a case of kind k takes
// its ψ from when it gives none of its own: its Category, else "wind" for
// a wind case and "temperature" for a temperature case, else "".
func (ci *CaseInfo) Row(k Kind) string {
	switch {
	case ci.Category != "":
		return ci.Category
	case k == Wind:
		return "wind"
	case k == Temperature:
		return "temperature"
	}
	return ""
}

// PsiFactor returns ψ p (Psi0, Psi1 or Psi2) of a case of kind k: the
// value given for the case, else its category's, else, for wind, the wind
// row of Table A1.1. ok is false when none of these gives it.
func (ci *CaseInfo) PsiFactor(p Psi, k Kind) (v float64, ok bool) {
	if p < Psi0 || p > Psi2 {
		panic("combos: PsiFactor of " + p.String())
	}
	i := int(p - Psi0)
	if ci.PsiGiven[i] {
		return ci.Psi[i], true
	}
	c, ok := LookupCategory(ci.Row(k))
	if !ok {
		return 0, false
	}
	return c.Psi[i], true
}
