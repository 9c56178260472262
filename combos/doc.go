// Package combos builds the factored load combinations of a model from its
// load cases.
//
// A [Combination] is a named list of terms, each a load case (by its index in
// the model) and the factor that multiplies it. Factors are dimensionless.
// A case's kind ([Kind]) says whether it is permanent (always acts) or
// variable (may be absent where its presence would help); the envelope
// package uses that to investigate "loads not acting".
//
// A [Set] is a list of combination rules, such as ASCE/SEI 7-16 section
// 2.3.1 or EN 1990 expression 6.10, that [Set.Generate] expands against the
// kinds of a model's cases. [Standard] returns the built-in ones; a program
// may build its own and check it with [Set.Validate] (Generate does too).
// This package reads no files and no TOML: the built-in sets are Go values
// (builtin_sets.go) generated from their rule files in the sets folder
// (the readable source) by a test of the command's model file reader,
// which also reads an office's own rule file (docs/combinations.md).
// The ψ factors of EN 1990 Table A1.1 are in [Categories]; a case's own
// values, its reversibility, its category and its action keys travel in
// [CaseInfo].
//
// Rules combine actions, not cases: [GroupActions] groups the cases into
// [Action]s (what leads, accompanies and takes ψ) and, within each, into
// alternatives, of which one at a time acts: wind from the left or from
// the right. The cases of one alternative act together and change sign
// together. No generated combination holds two alternatives of one action;
// [Actions.Clash] finds such a pair in a combination written by hand.
//
// A set marked as a serviceability set (EN 1990's characteristic, frequent
// and quasi-permanent combinations) gives combinations marked Service: they
// give deflections rather than design forces.
//
// Generated combinations are named after their rule and factors, such as
// "2.3.1-3 1.2D+1.6S+0.5W", and their Rule field names the set and rule.
// Factors are rounded to 12 significant digits, so that 1.5 × 0.7 is 1.05.
//
// Nothing in this package mutates the cases, case information or sets it is
// given.
package combos
