// Package patterns places variable load span by span: it splits a load
// case marked for patterning into independent pieces, one per loaded beam
// (or per segment of a beam), and lists the arrangements of those pieces
// that the concrete design standards describe.
//
// A piece is the part of the case's member loads that lies on one beam, or
// on one of k equal segments of it. Node loads and loads on members that are
// not beams (columns, inclined members) are not patterned: they stay
// together as the case's rest, which acts as a whole like any variable case.
//
// Distances and intensities keep the model's units. Spans are numbered from
// 1, left to right, along each level (beams at one height joined end to end);
// levels are numbered from 1 at the lowest beam height. Segments are numbered
// from 1 at the member's start.
//
// Nothing here mutates the model it is given; [Expand] returns a new model
// that shares the original's nodes, sections and members.
package patterns
