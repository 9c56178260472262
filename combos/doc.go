// Package combos builds the factored load combinations of a model from its
// load cases.
//
// A [Combination] is a named list of terms, each a load case (by its index in
// the model) and the factor that multiplies it. Factors are dimensionless.
// A case's kind ([frame.Kind]) says whether it is permanent (always acts) or
// variable (may be absent where its presence would help); the envelope
// package uses that to investigate "loads not acting".
//
// Nothing in this package mutates the cases it is given.
package combos
