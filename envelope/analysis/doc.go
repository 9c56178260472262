// Package analysis runs the whole analysis of a plane frame: from a [Job]
// (the frame, its load cases with their kinds and actions, the load
// combinations, which cases are patterned and how, the settings) to the
// envelopes of N, V and M at stations along every member, of the
// deflections of spans and cantilevers, and of the reactions, each
// extreme with its governing combination ([Run] and [Result]).
//
// The model file reader (cmd/govern/modelfile) produces a Job; another
// program may build one in code. Around the envelopes, the package gives
// what design and checking need of them: the statics check of every load
// case that Run applies ([Balance], [StaticsError]), the cross-check of end
// moments by moment distribution ([Result.CrossCheck]), the comparison of
// the standards' pattern arrangements with exact placement
// ([ComparePatterns]), the faces of columns where beams may be designed
// ([ColumnFaces]), the spans, cantilevers, rafters and ridges of beams and
// rafters ([Span]), the grouping of members into floors (named by the
// model's levels) and column lines ([Groups]), and every
// beam seen from its left end ([Result.Shown]). It prints nothing; the
// outputs are package envelope/report's.
//
// # Units and signs
//
// Every number is in the job's units (Job.Units; the analysis converts
// nothing): distances and deflections in its length unit, forces in its
// force unit, moments in force × length. Job.Units.Output names the units
// the outputs show forces, moments and deflections in ([Units.Shown]);
// the Result is in the model's units whatever they are. Forces follow package frame:
// N positive in tension, M positive with the member's local −y face in
// tension, V = dM/dx; x is measured from a member's start node; reactions
// are global (+X right, +Y up, M counter-clockwise). Result.Shown gives a
// beam or rafter as if drawn from its left end, so that +M is sagging and a
// positive deflection is up; a span's or cantilever's deflection is
// positive up, across its line. Combinations are referred to by their
// index in Job.Combinations; -1 means none.
//
// # Per combination
//
// A Result is organised per combination: each [Combination] carries how
// it was analysed ([Method]: first or second order, nominal, strength or
// service stiffness, allowable), the condition of its stiffness, its
// critical load factor αcr and its notional loads. Combinations analysed
// alike (first order, one stiffness) are formed from one solution of
// every load case and pattern piece, superposed; each second-order
// combination is solved on its own stiffness, iterated on its axial
// forces, its pieces superposed on it; the envelopes are merged
// combination by combination. The per-case solutions are an optimisation,
// not part of what a Result promises, and are not exposed. What a
// designer asks of each load case alone, unfactored (its reactions,
// member end forces and node displacements, a patterned case fully
// loaded), is formed on request by [Result.Cases], first-order; with live
// load reduction its reduced reactions stand beside the unreduced ones
// ([CaseResult].Reduced). Job.MemberFactors (live load reduction) scale
// the effects of a case in a member in the envelopes and the reactions
// formed from them ([Result.ReducedReactions] for one case), with any
// method: a second-order combination's geometric stiffness is of its
// unreduced loads, and each case and piece solved on it is scaled as in
// a first-order run (its second-order station moment with it);
// deflections, the statics check and the notional loads are of the loads
// as given.
//
// Second-order results: moments include N·(v − v(0)) along each member
// (package frame); αcr is for the combination as written; storeys give
// drift, Q and B2 (storeys.go). Units are the model's throughout; αcr, Q,
// B2 and ratios are pure numbers.
//
// # What is never mutated
//
// Run, ComparePatterns and CheckStability never modify the Job or
// anything it points to (the model, cases, combinations); a Result is not
// modified after Run returns, so any number of readers may use it at once.
package analysis
