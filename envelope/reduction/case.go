package reduction

import "fmt"

// Rule is the standard a case is reduced by.
type Rule uint8

const (
	ASCE716 Rule = iota + 1 // ASCE/SEI 7-16 4.7 (floors) or 4.8.2 (roofs)
	EN1991                  // EN 1991-1-1 6.3.1.2
)

// Rules names the rules a case may give, in Rule order from ASCE716.
var Rules = []string{"asce7-16", "en1991"}

func (r Rule) String() string {
	if r >= ASCE716 && int(r) <= len(Rules) {
		return Rules[r-1]
	}
	return fmt.Sprintf("Rule(%d)", r)
}

// Case is a live (or roof live) load case to reduce, in the model's
// units.
type Case struct {
	Case int // index into the model's cases
	Rule Rule
	// Roof applies ASCE/SEI 7-16 4.8.2 (a roof live case) instead of 4.7.
	Roof bool
	Use  Use     // ASCE/SEI 7-16 4.7.3-4.7.5
	Lo   float64 // the unreduced load per area, the model's force/length²
	Rise float64 // roof slope, rise on 12 (4.8.2 R2); 0 flat
	// Width is the tributary width of the beams (the distance between
	// parallel frames) where a member gives none.
	Width float64
	// Loaded says which members the case loads with its distributed
	// load (area loads, or loads standing for Lo): one entry per member.
	Loaded []bool
	// NodeArea, when not nil, gives for each node the area of floor that
	// loads applied at the node stand for (a node load divided by Lo):
	// counted for the columns under the node as the case's load there.
	NodeArea []float64
	// Category and Psi0 are the case's category of EN 1991-1-1 Table 6.1
	// (EN 1990 Table A1.1: "A" to "H") and its ψ0 (EN1991).
	Category string
	Psi0     float64
	// Smaller takes for columns the smaller of αA and αn (EN 1991-1-1
	// 6.3.1.2(11), where the National Annex allows), instead of αn.
	Smaller bool
}

// Member is what a member gives of its own; zero values for none.
type Member struct {
	Area  float64 // tributary area, overriding the one found from the frame
	Width float64 // tributary width of a beam, overriding the case's
	KLL   float64 // K_LL, overriding Table 4.7-1's default
}
