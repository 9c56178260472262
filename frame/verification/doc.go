// Package verification is a catalogue of published results for plane frames
// and beams, run through the direct stiffness solver of package frame to show
// that it reproduces them: beam tables of a steel design manual, continuous
// beam coefficients under full and patterned load, rigid frame formulas for
// single-bay portals, the fixed-end moment table, deflections, the
// inflection point of a fixed-fixed beam and a textbook example of moment
// distribution (also solved by package frame/distribution).
//
// Each [Case] builds a small model, solves it, and compares each of its
// quantities with the published value, giving the relative difference and a
// pass or fail against a tolerance that says how exact the comparison is:
// round-off for exact theory, 1e-5 where the published formula neglects the
// axial strain the solver includes, half a unit of the last printed digit
// for a value printed to a few decimals. Every case also checks statics: the
// reactions must balance the loads and every joint must be in equilibrium.
//
// Each case names its [Source]. Values recalled from memory, rather than read
// from the source for this work, are marked so; where they are, the value is
// also re-derived by a closed form (the three-moment equation,
// slope-deflection) and the case says which.
//
// # Units and signs
//
// Cases use kN and m unless they say otherwise (the textbook example is in
// lb and ft). Signs follow package frame: bending moments positive sagging,
// reactions positive up (Fy) and right (Fx); deflections are reported as
// downward movements, positive down.
//
// # Mutation
//
// Nothing here keeps state: every call of [Run] builds and solves fresh models.
package verification
