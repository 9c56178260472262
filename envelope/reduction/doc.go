// Package reduction gives the factors by which live load effects in a
// member may be reduced for the area it supports: ASCE/SEI 7-16 4.7
// (floors, with K_LL of Table 4.7-1 and the limits of 4.7.2 to 4.7.5) and
// 4.8.2 (roofs), and EN 1991-1-1 6.3.1.2(10) and (11) (αA and αn). It
// also finds, from a plane frame, each member's tributary area for one
// load case and the number of floors it supports (Tributary).
//
// # Units
//
// The rules work in SI: areas in m², loads in kN/m² (the standards' SI
// forms of their equations, ASCE/SEI 7-16 giving them in parentheses).
// Tributary works in the model's units and Areas converts them with the
// model's units.System, so that a model gives the same factors whatever
// units it is written in. The US customary forms (ft², psf) are given by
// the functions with a Form argument, for checking against the standard's
// own examples.
//
// # What it never does
//
// It mutates nothing it is given; a factor is never above 1 and never
// below the standard's limit.
package reduction
