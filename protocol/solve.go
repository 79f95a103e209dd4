package protocol

// SolveResult is the result of solve. Arrays are aligned with the model's
// arrays. Units are the model's; tension is positive.
type SolveResult struct {
	// Cases holds one result per requested case or combination, in the
	// requested order.
	Cases []CaseResult `json:"cases"`
	// Stability is the counting report: Maxwell's rule in its extended
	// form, b − d·j + k = s − m for pin-jointed models.
	Stability Stability `json:"stability"`
	// Warnings are sentences about ill-conditioning, extreme stiffness
	// ratios or disconnected parts, and what the member checks leave out.
	Warnings []string `json:"warnings"`
	// Unchecked lists the member checks that could not be made (a missing
	// limit, section modulus or second moment; a bar loaded across its
	// length) or were made on an assumption (buckling curve d), each with
	// the pointer of the data that would allow it. A member with a check
	// missing has a null utilisation, never 0.
	Unchecked []Problem `json:"unchecked"`
	// Stats describes the system solved.
	Stats SolveStats `json:"stats"`
	// Picture is the SVG drawing of the first reported case, when asked
	// for.
	Picture string `json:"picture,omitempty"`
	// Envelope is the envelope of the cases params.envelope names, when
	// asked for.
	Envelope *Envelope `json:"envelope,omitempty"`
	// Caution: results are for preliminary design.
	Caution string `json:"caution"`
}

// CaseResult is the response to one load case or combination.
type CaseResult struct {
	// ID is the case's or combination's id.
	ID string `json:"id"`
	// Kind is "case" or "combination".
	Kind string `json:"kind" jsonschema:"enum=case,enum=combination"`
	// Displacements holds per node its translations (dimension entries,
	// length units).
	Displacements [][]float64 `json:"displacements"`
	// Rotations holds per node its rotations in radians (one about z in
	// 2D, three in 3D), empty for nodes no beam touches.
	Rotations [][]float64 `json:"rotations"`
	// AxialForces holds per member its axial force, tension positive (for
	// a member with loads along it, the value at its first end).
	AxialForces []float64 `json:"axial_forces"`
	// EndForces holds per member the forces the nodes exert on it, in its
	// local axes: bars [Fx1, Fy1, (Fz1,) Fx2, Fy2, (Fz2)]; 2D beams
	// [N1, V1, M1, N2, V2, M2]; 3D beams [Fx, Fy, Fz, Mx, My, Mz] at the
	// first end, then the second.
	EndForces [][]float64 `json:"end_forces"`
	// Reactions holds per support what it exerts on its node.
	Reactions []Reaction `json:"reactions"`
	// Stresses holds per member the axial stress N/A.
	Stresses []float64 `json:"stresses"`
	// Utilisation holds per member the largest of its checks along its
	// length (see members): N/(A·tension_limit) in tension,
	// |N|/(χ·A·compression_limit) in compression with χ from the EN
	// 1993-1-1 buckling curve, and for beams (and bars loaded across their
	// length) |M|/(W·f) and the linear
	// interaction; null when a check the member needs could not be made
	// (see unchecked).
	Utilisation []*float64 `json:"utilisation"`
	// MaxDisplacement is the largest translation magnitude anywhere: at a
	// node, or inside a member (at is then the member's id and distance
	// is set).
	MaxDisplacement Extreme `json:"max_displacement"`
	// MaxMoment is the bending moment of largest magnitude in any beam,
	// or in any bar loaded across its length (which bends as a simple
	// span), signed (force·length), with its member and distance; value 0
	// and no member when no member bends.
	MaxMoment Extreme `json:"max_moment"`
	// Members holds per member (aligned with model.members) its results
	// along its length; null for a bar that no load crosses, whose axial
	// force is constant along it (axial_forces) and whose check is in
	// utilisation. A bar loaded across its length has its simple span's
	// extremes and checks here, without stations.
	Members []*MemberResult `json:"members"`
	// MaxUtilisation is the largest utilisation and its member, over the
	// members whose checks were all made (value 0 and no member when
	// none); unchecked_members counts the others.
	MaxUtilisation Extreme `json:"max_utilisation"`
	// UncheckedMembers counts the members with a null utilisation.
	UncheckedMembers int `json:"unchecked_members"`
	// AxialUtilisation holds per member its axial check alone, as in
	// utilisation (N/(A·tension_limit) in tension,
	// |N|/(χ·A·compression_limit) in compression), null where that check
	// was not made. It is given only when some member's utilisation is
	// null although its axial check was made (a member whose bending
	// could not be checked), so that the part checked is known; it is a part of the
	// check, never the member's utilisation (unchecked says what is
	// missing).
	AxialUtilisation []*float64 `json:"axial_utilisation,omitempty"`
	// Iteration reports how the case converged when it was solved on its
	// own by iteration (one-sided members or second order); absent for a
	// case solved by superposition.
	Iteration *CaseIteration `json:"iteration,omitempty"`
	// Residual is the scaled equilibrium residual ‖K·u − f‖/‖f‖.
	Residual float64 `json:"residual"`
	// BalanceError is ‖Σloads + Σreactions‖ relative to the larger of the
	// two.
	BalanceError float64 `json:"balance_error"`
}

// Reaction is what one support exerts on its node.
type Reaction struct {
	// Node is the supported node's id.
	Node string `json:"node"`
	// Force has dimension entries.
	Force []float64 `json:"force"`
	// Moment has one entry (about z) in 2D and three in 3D.
	Moment []float64 `json:"moment"`
	// LocalForce and LocalMoment are the same reaction along the axes of
	// a support with directions (local x, y and z), present only for
	// such supports.
	LocalForce  []float64 `json:"local_force,omitempty"`
	LocalMoment []float64 `json:"local_moment,omitempty"`
}

// Extreme is a largest value and where it occurs.
type Extreme struct {
	// Value is the value.
	Value float64 `json:"value"`
	// At is the node or member id, empty when there is none.
	At string `json:"at"`
	// Distance is, for a value inside a member, its distance from the
	// member's first end (length units).
	Distance *float64 `json:"distance,omitempty"`
}

// Stability is the counting report of the equilibrium matrix.
type Stability struct {
	// Rule is Maxwell's rule with the model's numbers filled in.
	Rule string `json:"rule"`
	// Joints is j, the number of nodes.
	Joints int `json:"joints"`
	// Bars is b, the number of bars.
	Bars int `json:"bars"`
	// Beams is the number of beams.
	Beams int `json:"beams"`
	// Constraints is k, the fixed support components.
	Constraints int `json:"constraints"`
	// MaxwellNumber is b − d·j + k (generalised for beams), which equals
	// s − m.
	MaxwellNumber int `json:"maxwell_number"`
	// Computed is false when the model is too large for the rank to be
	// found; rank, self_stress and mechanisms are then 0.
	Computed bool `json:"computed"`
	// Rank is the rank of the equilibrium matrix.
	Rank int `json:"rank"`
	// SelfStress is s, the number of independent states of self-stress.
	SelfStress int `json:"self_stress"`
	// Mechanisms is m, the number of independent inextensional motions.
	Mechanisms int `json:"mechanisms"`
}

// SolveStats describes the system solved.
type SolveStats struct {
	// Solver is "dense" or "sparse".
	Solver string `json:"solver"`
	// Freedoms counts all nodal freedoms.
	Freedoms int `json:"freedoms"`
	// Equations counts the unconstrained freedoms.
	Equations int `json:"equations"`
	// NonzerosStiffness counts stored entries of the stiffness matrix.
	NonzerosStiffness int `json:"nonzeros_stiffness"`
	// NonzerosFactor counts stored entries of its Cholesky factor.
	NonzerosFactor int `json:"nonzeros_factor"`
}

// Mechanism is the detail of an unstable-structure error.
type Mechanism struct {
	// Freedoms lists the freedoms involved.
	Freedoms []Freedom `json:"freedoms"`
	// Modes are the mechanism's node motions: a basis of the mechanisms,
	// each scaled to unit length with its largest entry positive, at most
	// 16 of them (the error message counts them all).
	Modes []Mode `json:"modes"`
}

// Freedom names one nodal freedom.
type Freedom struct {
	// Node is the node's id.
	Node string `json:"node"`
	// Component is x, y, z, rx, ry or rz.
	Component string `json:"component"`
}

// Mode is a motion of the nodes.
type Mode struct {
	// Translations holds per node dimension entries.
	Translations [][]float64 `json:"translations"`
	// Rotations holds per node its rotations, empty where none.
	Rotations [][]float64 `json:"rotations"`
}
