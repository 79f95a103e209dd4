package stiffness

import (
	"time"

	"gusset/engine/fault"
	"gusset/engine/statics"
)

// Result is the outcome of Solve.
type Result struct {
	// Cases holds one result per requested case or combination, in the
	// order of Options.Cases (or the default order).
	Cases []CaseResult
	// Stability is the counting report of the equilibrium matrix (see
	// package statics); its Computed field is false above
	// Options.StabilityLimit.
	Stability *statics.Report
	// Warnings are sentences about an ill-conditioned system, extreme
	// stiffness ratios or disconnected parts; nil when there are none.
	Warnings []string
	// Stats describes the work done; its times vary from run to run.
	Stats Stats
	// Unchecked lists the member checks that could not be made, or were
	// made on an assumption, in any case (a missing limit, section
	// modulus or second moment, a buckling curve assumed, a bar loaded
	// across its length), each with the pointer (into the model) of the
	// data that would allow it; nil when every check was made.
	Unchecked []fault.Problem
}

// Reaction is what one support exerts on its node: Force has Dim entries,
// Moment one (about z) in 2D and three in 3D. Components the support
// neither fixes nor springs are zero; a component fixed by several supports
// is carried by the first.
type Reaction struct {
	Force  []float64
	Moment []float64
	// LocalForce and LocalMoment are the same reaction along the axes of
	// an inclined support (model.Support.Axes; Dim and 1 or 3 entries),
	// nil for a support in global axes.
	LocalForce  []float64
	LocalMoment []float64
}

// CaseResult is the response of the structure to one load case or
// combination. Slices are aligned with the model's arrays.
type CaseResult struct {
	ID          string
	Combination bool
	// Displacements holds Dim translations per node (length units).
	Displacements [][]float64
	// Rotations holds per node the rotation (radians; one about z in 2D,
	// three in 3D), nil for a node without rotational freedom.
	Rotations [][]float64
	// AxialForce is the axial force of each member, tension positive; for
	// a member with loads along it, the value at end 1.
	AxialForce []float64
	// EndForces holds per member the forces the nodes exert on it, in its
	// local axes: bars [Fx1, Fy1, (Fz1,) Fx2, Fy2, (Fz2)]; 2D beams
	// [N1, V1, M1, N2, V2, M2]; 3D beams [Fx, Fy, Fz, Mx, My, Mz] at end 1
	// then end 2.
	EndForces [][]float64
	// Reactions holds one entry per support.
	Reactions []Reaction
	// Stress is AxialForce / Area for each member (force per length²).
	Stress []float64
	// Utilisation is, per member, the largest of the checks made along it
	// (MemberResult's axial, bending and combined utilisation: tension
	// N/(A·ft); compression |N|/(χ·A·fc) with χ from the EN 1993-1-1
	// buckling curves; bending and the linear interaction for beams). It
	// is −1 when no check could be made (never NaN); Result.Unchecked says
	// which checks were not made and why.
	Utilisation []float64
	// Residual is the scaled equilibrium residual ‖K·u − f‖ / ‖f‖ over
	// the unconstrained freedoms (0 when f = 0).
	Residual float64
	// External holds per node the external force (Dim entries): the
	// applied nodal loads, the member loads and self-weight carried to the
	// node (equivalent nodal loads), and the reactions of its supports.
	// These are the forces Maxwell's load-path theorem sums over.
	External [][]float64
	// LoadSum and ReactionSum are the resultant applied force (nodal and
	// member loads, self-weight) and the resultant reaction force, Dim
	// entries each; BalanceError is ‖LoadSum + ReactionSum‖ divided by
	// the larger of ‖LoadSum‖ and Σ‖reaction force‖ (0 when both vanish).
	LoadSum      []float64
	ReactionSum  []float64
	BalanceError float64
	// members holds per member its results along its length: internal
	// forces and displacements at the stations, and exact extremes (see
	// Member and MemberCount).
	members caseMembers
	// MaxDisplacement is the largest translation magnitude anywhere, at
	// the nodes and inside the members (length units).
	MaxDisplacement Peak
	// MaxMoment is the bending moment of largest magnitude in any member
	// (signed; about local z, or local y in 3D where that is larger), with
	// Node −1; Member is −1 when no member is a beam.
	MaxMoment Peak
	// Iteration reports the iteration of a case solved on its own (a
	// model with one-sided members, or a second-order analysis); nil for
	// a case solved by superposition.
	Iteration *Iteration
}

// Stats describes a solve.
type Stats struct {
	Path            Path // the solver used
	Freedoms        int  // all nodal freedoms
	Equations       int  // unconstrained freedoms (order of K)
	NonzerosK       int  // stored entries of K (lower triangle with diagonal)
	NonzerosFactor  int  // stored entries of the Cholesky factor
	ConditionNumber float64
	Assemble        time.Duration
	Order           time.Duration
	Factor          time.Duration
	Solve           time.Duration
	Recover         time.Duration
	Stability       time.Duration
}
