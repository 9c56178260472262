// Package distribution is a second, independent solver for plane frames: the
// moment distribution method of Hardy Cross. It exists to check the direct
// stiffness solver of package frame by a different method, and shares nothing
// with it but the model types.
//
// # Method
//
// Every joint free to rotate is first locked, giving the fixed-end moments of
// the member loads (closed-form integrals of the load against the fixed-end
// influence functions). Joints are then released one at a time: the
// unbalanced moment is shared among the member ends at the joint in
// proportion to their stiffness, 4EI/L, or 3EI/L where the far end is a
// pinned end (a hinge, or a joint that only that member holds), and half of
// each share is carried over to the far end (carry-over factor 1/2; 0 towards
// a pinned end). Sweeps over the joints are repeated until the largest
// unbalanced moment is below a tolerance. A cantilever is statically
// determinate: its end moments come from statics and it takes no share.
//
// Members are taken as axially rigid and shear deformation is neglected, so
// the joints of a beam line move together horizontally and the joints of a
// column line move together vertically.
//
// # Where it applies
//
// Every member must be horizontal or vertical, and every joint that is not a
// cantilever tip must be held vertically (by a support, or through a line of
// columns down to one). A frame whose joints are all held horizontally (by a
// beam line ending at a fixed or pinned support) is analysed without sway.
// Each beam line free to move horizontally (a storey) gets a sway
// correction: the frame is first held against sway by a prop at every such
// line and distributed; then each line in turn is given a unit sway, the
// others held, and distributed again; the amplitudes of the corrections
// come from the storey shear equations, one per line, which say that no
// prop force remains (the shear of the storey below a line balances the
// shear of the storey above and the loads on the line), solved by Gaussian
// elimination. A single storey is the case of one line. Supports are free,
// fixed, pinned or rollers, without springs; member ends rigid or released,
// without rotational springs or rigid end zones; loads are distributed and
// point loads on members and loads at nodes (no concentrated moments on
// members, changes of temperature or imposed displacements). Anything else
// is reported by a [*NotApplicableError] that says why.
//
// # Axial strain
//
// With [Options.AxialStrain], Solve also estimates what the axial strain it
// neglects changes ([Result.AxialStrain]): the axial forces follow by
// statics from the end moments, the members' elongations under them move
// the joints (along the columns from the supports up, along each beam line
// from the support that holds it), and the chord rotations this gives the
// members are distributed like those of a sway, with the sway corrections.
// That is the first term of a series; the second term is the same for the
// axial forces the first causes, and says how much the first leaves out.
//
// # Units and signs
//
// Units are those of the model, never converted. End moments are those the
// joints exert on the member ends, counter-clockwise positive, as the end
// moments of package frame: for a beam drawn left to right under gravity load
// the fixed-end moment is +wL²/12 at the start and −wL²/12 at the end.
//
// # Mutation
//
// [Solve] never mutates the model and keeps no reference to it.
package distribution
