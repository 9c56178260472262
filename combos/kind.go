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
)

var kindNames = [...]string{"dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other"}

// Kinds lists every kind in order.
func Kinds() []Kind { return []Kind{Dead, Live, RoofLive, Snow, Rain, Wind, Seismic, Other} }

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

// Permanent reports whether loads of this kind always act (dead load).
// Every other kind is variable.
func (k Kind) Permanent() bool { return k == Dead }

// Case is what the combination rules need of a load case: its name, used
// in the names of combinations and in messages, and its kind.
type Case struct {
	Name string
	Kind Kind
}
