// Package envelope finds, at stations along every member and at every
// support, the largest and smallest value of each force that any load
// combination produces, and the combination that produces it.
//
// # Units
//
// The package keeps the model's units (see package frame): station
// positions and deflections are in its length unit, N, V and the reaction
// components Fx and Fy in its force unit, M in force × length. Factors of
// combinations are pure numbers.
//
// # Stations and sign conventions
//
// Stations are equally spaced along each member, both ends included, and
// measured from the member's start node; a caller may add stations of its
// own on any member ([Settings.Extra]), such as the faces of columns.
// Forces follow the sign conventions of package frame: N positive in
// tension, M positive when the local −y face is in tension, V = dM/dx;
// reactions are global, the forces the supports exert on the frame. At the
// two end stations N and V are the values inside the member (past a point
// load at its start, before one at its end, [frame.Solution.StartLoadsTo]);
// at an interior station where a point load acts, the value before it. At
// an interior station where a concentrated moment acts, M is taken on both
// sides of it ([frame.Solution.MomentJumpsTo]): the extremes there are the
// larger and the smaller of the two sides, whichever way the member was
// drawn.
//
// Combinations marked as service combinations give the envelope of each
// member's deflection relative to its chord (along local y), and for
// members on a [Line] of [Settings.Lines] (the span of a beam built of
// several members, a cantilever) the deflection across that line from its
// reference; the forces and reactions are enveloped over the other,
// strength, combinations, or over all of them when every one is a service
// one.
//
// Member factors ([Settings.Factors], live load reduction) scale a load
// case's N, V and M in a member before the combinations are formed, in
// every combination (or by which case leads, [Leads]) and every pattern
// piece of the case; reactions are then formed from the members' scaled
// end forces. Deflections are never scaled.
//
// # Variable loads and patterns
//
// Within a combination a dead case always acts with its factor
// ([combos.Kind.AlwaysActs]). Any other case (variable, or settlement) acts
// in full by default only where its factored effect makes
// the extreme being sought worse, and is left off where it would relieve it
// (the design standards' requirement to investigate the effects of loads not
// acting; with EN 1990 this is γQ = 0 for favourable variable actions).
// Cases joined into one load ([Settings.Groups]: a wall pressure and the
// roof suction of one wind direction entered as two cases) act as a
// whole instead: all at their factors or none, as the sum of their
// factored effects decides; cases in no group, such as the live cases of
// several floors, act each on its own where adverse (partial loading).
// [Settings.AsWritten] makes every case always act instead.
//
// Cases patterned by package patterns are placed piece by piece as the
// layout's mode says: "exact" loads every piece whose effect is adverse,
// "code" the worst of the standards' arrangements, "exhaustive" the worst
// of every subset (to check "exact" against); with "full" nothing is
// patterned and the case acts as a whole. Every extreme records the
// pieces loaded to produce it and the other forces acting with it in that
// same loading (see docs/patterns.md). A piece whose effect is round-off
// (at most 1e-9 of the largest size of that effect in the member, or at
// the support, over every case and piece) is not loaded.
//
// # Failures
//
// A result that is not a finite number (a factor so large that a sum
// overflows) is an error naming the combination, or the load case whose own
// value is not finite, and where; no envelope is returned. So are fewer
// than two stations, extra stations off their member, lines that name no
// node and combination terms that name no load case; an empty list of
// combinations is [ErrNoCombinations]. Settings.Kinds that does not give
// one kind per load case, Settings.Groups that does not give one group
// per case or joins a permanent case, and a solution that is not of the
// layout's model, are programmer errors: Compute panics.
//
// # Mutation
//
// Combination indices in results refer to the slice given to [Compute];
// -1 means no combination. Compute never mutates the solution, the
// combinations, the settings or the layout it is given; it only adds to
// the counter [Settings.Progress] points to. The [Envelope] shares their
// slices (Combinations, Settings.Extra, Kinds, Groups and Lines, the
// layout's Pieces) with the caller, who must not change them while it is
// in use.
package envelope
