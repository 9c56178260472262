package combos

import "fmt"

// Kind classifies a load case by its origin, as the design standards do:
// what the combination rules take a case as.
type Kind uint8

const (
	Dead     Kind = iota // permanent: self weight, finishes, services (D, G)
	Live                 // imposed floor load (L, Q)
	RoofLive             // roof live load (Lr)
	Snow                 // snow (S)
	Rain                 // rain (R)
	Wind                 // wind (W)
	Seismic              // earthquake (E)
	Other                // any other variable action
	// Settlement is the permanent action of imposed displacements of
	// supports: EN 1990's uneven settlements (γG,set where unfavourable,
	// not taken where favourable), part of ASCE/SEI 7's self-straining
	// load T. It acts only where its effect is adverse.
	Settlement
	// Temperature is the variable action of changes of temperature:
	// EN 1990 Table A1.1's temperature row, part of ASCE/SEI 7's T.
	Temperature
)

var kindNames = [...]string{"dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature"}

// Kinds lists every kind in order.
func Kinds() []Kind {
	return []Kind{Dead, Live, RoofLive, Snow, Rain, Wind, Seismic, Other, Settlement, Temperature}
}

func (k Kind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return fmt.Sprintf("Kind(%d)", uint8(k))
}

// ParseKind returns the kind named s ("dead", "live", "roof-live", …).
func ParseKind(s string) (Kind, bool) {
	for i, n := range kindNames {
		if n == s {
			return Kind(i), true
		}
	}
	return 0, false
}

// Permanent reports whether loads of this kind are permanent actions (dead
// load, settlement): they have no ψ factors and do not reverse. Every other
// kind is variable.
func (k Kind) Permanent() bool { return k == Dead || k == Settlement }

// AlwaysActs reports whether loads of this kind act in every combination
// that names them, wherever their effect is favourable too: dead load,
// whose favourable part is a factor of the rule (γG,inf). Every other kind,
// settlement included, acts only where its factored effect is adverse
// (under the envelopes' "adverse" rule for variable loads).
func (k Kind) AlwaysActs() bool { return k == Dead }

// Case is what the combination rules need of a load case: its name, used
// in the names of combinations and in messages, and its kind.
type Case struct {
	Name string
	Kind Kind
}
