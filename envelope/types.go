package envelope

import (
	"errors"
	"math"
	"sync/atomic"
	"unsafe"

	"govern/combos"
	"govern/patterns"
)

// Extreme is the largest and smallest value of one force over all
// combinations (and, for patterned cases, arrangements), with the index of
// the combination that gives each, the forces acting at the same place in
// that same loading, and the pattern pieces it loads.
type Extreme struct {
	Max       float64
	MaxBy     int
	MaxWith   [3]float64 // N, V, M (Fx, Fy, M for a reaction) acting with Max
	MaxSpans  []int      // the most influential pattern pieces loaded for Max, indices into Envelope.Pieces
	MaxLoaded int        // how many pattern pieces are loaded for Max, listed or not
	Min       float64
	MinBy     int
	MinWith   [3]float64
	MinSpans  []int
	MinLoaded int
}

// empty returns an Extreme that any value replaces.
func empty() Extreme {
	return Extreme{Max: math.Inf(-1), MaxBy: -1, Min: math.Inf(1), MinBy: -1}
}

// Station holds the envelopes at one point of a member.
type Station struct {
	X       float64 // distance from the start node
	Extra   bool    // the station was asked for by Settings.Extra
	N, V, M Extreme
}

// Member holds the stations of one member, sorted by X.
type Member struct {
	Member   int // index into the model's members
	Stations []Station
	// Deflection holds, station by station, the envelope of the member's
	// deflection relative to its chord (along local y, see
	// frame.Solution.Deflection) over the service combinations; nil when
	// there are none. MaxWith and MinWith are zero.
	Deflection []Extreme
	// LineDeflection is Deflection measured across the member's line of
	// Settings.Lines from its reference (see [Line]); nil when the member
	// has none or there are no service combinations.
	LineDeflection []Extreme
}

// Reaction holds the envelopes of the reaction at one supported node.
// Components the support does not restrain are zero, and so are their
// entries in MaxWith and MinWith.
type Reaction struct {
	Node      int // index into the model's nodes
	Fx, Fy, M Extreme
}

// Settings control how envelopes are formed.
type Settings struct {
	// Stations is the number of equally spaced stations per member, both
	// ends included; at least 2.
	Stations int
	// Extra, when not nil, lists for member m the distances from its start
	// of stations to add to the equally spaced ones, such as the faces of
	// the columns a beam frames into. One that falls on an equally spaced
	// station (within 1e-9 of the length) marks it instead. Members past
	// the end of Extra get none.
	Extra [][]float64
	// Kinds gives the kind of each load case of the model before its
	// patterned cases are placed, in model order (the cases combination
	// terms refer to). A case of a permanent kind acts in every
	// combination with its factor; a variable one only where adverse,
	// unless AsWritten. Compute panics when it does not give one kind per
	// case.
	Kinds []combos.Kind
	// Groups, when not nil, gives for each load case of Kinds the group of
	// cases it is joined to, -1 for none: cases joined explicitly into one
	// alternative of an action, parts of one load (see
	// combos.Actions.Groups). Where variable cases act only where adverse,
	// the terms of one group in a combination act as a whole, all at their
	// factors or none, as the sum of their factored effects makes the
	// extreme sought worse or not; a patterned case's rest follows its
	// group, its pieces are still placed one by one. Cases in no group
	// (the live cases of several floors, which the standards load part by
	// part) act each on its own where adverse. Compute panics when Groups
	// does not give one group per case of Kinds, gives a group below -1,
	// or puts a permanent case in a group.
	Groups []int
	// AsWritten makes every case of a combination act with its factor
	// everywhere, instead of variable cases acting only where adverse.
	// Pieces of a case patterned "exact" or "exhaustive" are still placed
	// where adverse: that is what patterning asks for.
	AsWritten bool
	// Lines, when not nil, gives for member m the line its deflections are
	// also measured across (Member.LineDeflection), such as the span of a
	// beam it is part of. Members past the end of Lines, or with the zero
	// Line, get none.
	Lines []Line
	// AllSpans lists every loaded piece in MaxSpans and MinSpans, not only
	// those with at least spanShare of the largest piece's effect.
	AllSpans bool
	// Factors, when not nil, scale the effects of load cases in members
	// (live load reduction): see [Factors].
	Factors *Factors
	// Progress, when not nil, counts the stations enveloped so far, for a
	// caller that reports progress from another goroutine.
	Progress *atomic.Int64
}

// Envelope is the result of [Compute].
type Envelope struct {
	Settings     Settings
	Combinations []combos.Combination
	Pieces       []patterns.Piece // the pattern pieces spans refer to; nil without patterns
	Members      []Member
	Reactions    []Reaction
	// Strength lists the combinations the envelopes of forces and
	// reactions are taken over, Service those of the deflections (indices
	// into Combinations). See [Compute].
	Strength, Service []int
}

// ErrNoCombinations is returned when there is nothing to envelope.
var ErrNoCombinations = errors.New("envelope: no load combinations")

// StationBytes is the most memory, in bytes, one station's envelope holds:
// its forces' extremes, with their lists of pattern pieces when the
// layout has pieces (at most maxSpans a list, unless every piece is
// listed), and with service combinations its deflection and its deflection
// across a line. For the memory estimate of a run (frame.Options.PerMember).
func StationBytes(pieces int, service, allSpans bool) float64 {
	listed := min(pieces, maxSpans)
	if allSpans {
		listed = pieces
	}
	b := float64(unsafe.Sizeof(Station{})) + 6*8*float64(listed)
	if service {
		b += 2 * (float64(unsafe.Sizeof(Extreme{})) + 2*8*float64(listed))
	}
	return b
}
