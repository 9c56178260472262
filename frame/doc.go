// Package frame models a plane frame of beams and columns and solves it by
// the direct stiffness method.
//
// # Units
//
// The package is unit-agnostic: every number must belong to one consistent
// set (for example kN and m, so that E is in kN/m², A in m², I in m⁴,
// distributed loads in kN/m and moments in kN·m).
//
// # Sign conventions
//
// Global X points right, Y points up and rotations are counter-clockwise.
// A member's local x axis runs from its start node to its end node and its
// local y axis is local x turned +90°. Internal forces at a station are:
//
//   - N, axial force, positive in tension;
//   - M, bending moment, positive when the local −y face is in tension
//     (sagging for a beam drawn left to right);
//   - V, shear force, V = dM/dx.
//
// Member end forces ([Solution.EndForces]) are the forces the nodes exert on
// the member, in local axes, in the order start (axial, transverse, moment),
// end (axial, transverse, moment), moments counter-clockwise positive.
// Reactions are global (Fx, Fy, M): the forces the supports exert on the frame.
// Gravity loads are entered positive downward.
//
// The deflection of a member ([Solution.Deflection]) is its transverse
// displacement relative to its chord, the straight line between its
// displaced ends, along local y: a beam drawn left to right sags
// negatively. [Section.Depth] is carried for design (faces of columns) and
// for the rigid end zones [RigidZones] gives; the solver uses it only for
// the curvature of a temperature gradient.
//
// # Supports, joints and imposed deformations
//
// A [Support] holds any set of the three directions of its node (Fixed,
// Pinned and Roller are named sets; HoldX alone is a floor held
// laterally). [Node.Springs] are elastic supports in the directions the
// support leaves free, with reactions −k u. A member end is rigid,
// released ([Release]) or semi-rigid (a rotational spring in series with
// the member, [Member.SpringStart]); rigid end zones
// ([Member.OffsetStart]) make the member rigid near its nodes, its
// flexible part between them carrying the releases and springs. Loads,
// stations and results are still measured from the start node.
//
// A case may impose displacements on held directions of supported nodes
// ([NodeDisplacement]: a settlement is a negative Uy) and changes of
// temperature on members ([MemberLoad] Thermal: uniform DT and DTGrad =
// T(local +y face) − T(local −y face), with the section's Alpha and
// Depth). A concentrated moment on a member ([MemberLoad] Moment) is
// counter-clockwise positive, as a node moment is; the bending moment
// drops by it past the load. Imposed deformations have no resultant: the
// statics check of such a case compares its imbalance with the largest of
// its load, its largest reaction and the forces the deformations cause at
// held member ends ([Balance.Scale]).
//
// # Degrees of freedom
//
// Each node has three degrees of freedom, ux, uy and rz, in that order. The
// solver numbers the free ones node by node in reverse Cuthill–McKee order so
// that the banded stiffness matrix stays narrow; restrained ones are removed.
// Callers never see that numbering: results are indexed by node, member and
// case in the order of the [Model].
//
// The rotation of a node where every member end is released, and that no
// support holds, carries nothing: it is left out of the equations, and
// [Solution.Displacement] gives NaN for it ([Solution.RotationFree]). A
// moment applied at such a node is a mechanism for its case.
//
// # Second order
//
// [SolveWith] with [Options.Axial] adds to each member the geometric
// stiffness of a given axial force N (tension positive): its flexible part
// is divided into [SubElements] sub-elements with the consistent geometric
// stiffness, their inner nodes condensed out (P-Δ and P-δ; geometric.go).
// Every case is then solved with that one stiffness; station moments add
// N·(v(x) − v(0)), v the displacement across the member's undeformed axis
// from its start node, and [Solution.Balance] takes moments on the deformed
// geometry. Iterating on N is the caller's. [CriticalFactor] gives αcr, the
// smallest λ with K + λ·Kg singular, by Lanczos iteration on one factor of
// K, certified by one band Cholesky factorization just below it, with
// band Cholesky trials and Newton steps where that check fails
// (buckling.go, critical.go; the members' pencils, the solves and the
// check in pencil.go, bucklingsolve.go, bucklingband.go, bandchol.go and
// certify.go); [NewBuckling] shares the factor of K among many sets of
// axial forces, the later sets' iterations started from the first set's
// (bucklingstart.go). It is a pure number.
//
// # Failures
//
// [Solve] returns an error, never numbers, for a model that is invalid
// ([Model.Validate]), past the size limits ([ErrTooLarge]: [MaxEquations],
// [MaxMemory]), a mechanism ([*MechanismError], naming each part joined to
// no support and each free node and direction), or so ill-conditioned that
// fewer than three digits of the results would be right
// ([*IllConditionedError], wrapping [ErrIllConditioned]; above [RefuseCond],
// solved anyway by [SolveWith] with [Options.AcceptIllConditioned], up to
// [MaxCond]), or, in second order, a stiffness that is not positive
// definite under the axial forces ([ErrUnstable]). A stiffness matrix ill-conditioned enough to cost most of the
// digits (above [WarnCond]) is solved with a warning in [Solution.Warnings];
// [Solution.Cond] is the estimated condition number of the stiffness matrix
// scaled to unit diagonal, the same in any consistent units. (Numbers that
// look like a slip of units, such as a radius of gyration no buildable
// member has, are looked for by package envelope/analysis, which knows the
// model's units.)
//
// [Options.SkipCondition] leaves the estimate out, for solutions whose
// results are not reported (the steps of an iteration before its last):
// such a solve refuses only a stiffness that cannot be factored at all, and
// neither refuses nor warns of one merely ill-conditioned; its Cond is NaN.
//
// The statics check ([Solution.Balance]) takes moments about the lower left
// corner of the frame, so that its position does not cost digits.
//
// # Mutation
//
// [Solve] never mutates the [Model]; a [Solution] keeps a pointer to it, so the
// model must not be changed while the solution is in use. A Solution is
// never changed once made: [Solution.SolveCases] solves more cases on its
// factor into a new one that shares its nodes, sections, members and
// factor, and both may be read at once. The one exception is the spent
// solution given to [Solution.SolveCasesReusing]: the new one takes its
// displacements' memory, and it is emptied (reading it then panics).
package frame
