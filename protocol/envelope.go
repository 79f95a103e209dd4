package protocol

// EnvelopeParams asks solve for the envelope of a set of load cases and
// combinations: per node, support and member the largest and smallest
// value of each result, with the governing case of each.
type EnvelopeParams struct {
	// Cases lists the ids of the load cases, combinations and generated
	// pattern combinations to envelope; the id of a pattern stands for
	// every combination it generates. Default: every case the result
	// reports. Ids that the result does not report are solved for the
	// envelope alone.
	Cases []string `json:"cases,omitempty"`
	// OmitCases leaves the per-case results out of the result's cases
	// (an empty array), which keeps the answer small when only the
	// envelope is wanted; the envelope, stability, warnings and unchecked
	// list stay (a picture, which draws a reported case, is not drawn).
	// The cases are then folded into the envelope as each is recovered
	// and dropped, so a large model holds one case per worker at a time.
	OmitCases bool `json:"omit_cases,omitempty"`
}

// Envelope is the envelope of the enveloped cases. Arrays are aligned
// with the model's nodes, supports and members. Units and sign
// conventions are those of each case's results (tension positive).
type Envelope struct {
	// Cases lists the ids of the enveloped cases, in the order solved.
	Cases []string `json:"cases"`
	// Nodes holds per node its displacements' and rotations' ranges.
	Nodes []NodeEnvelope `json:"nodes"`
	// Reactions holds per support its reaction's ranges (global axes).
	Reactions []ReactionEnvelope `json:"reactions"`
	// Members holds per member its results' ranges.
	Members []MemberEnvelope `json:"members"`
	// MaxUtilisation is the largest utilisation over the members checked
	// in every enveloped case, with its member (at) and governing case
	// (value 0 and no member when none is); unchecked_members counts the
	// others, whose utilisation is null.
	MaxUtilisation EnvelopeExtreme `json:"max_utilisation"`
	// UncheckedMembers counts the members with a null utilisation.
	UncheckedMembers int `json:"unchecked_members"`
}

// EnvelopeExtreme is a largest value over the enveloped cases, its member
// and governing case.
type EnvelopeExtreme struct {
	// Value is the value.
	Value float64 `json:"value"`
	// At is the member's id, empty when there is none.
	At string `json:"at"`
	// Case is the id of the governing case, empty when there is none.
	Case string `json:"case"`
}

// EnvelopeValue is an extreme over the enveloped cases.
type EnvelopeValue struct {
	// Value is the extreme value.
	Value float64 `json:"value"`
	// Case is the id of the governing case: the first enveloped case
	// (in the order of the envelope's cases) that reaches the value.
	Case string `json:"case"`
	// At is, for a value along a member, its distance from the member's
	// first end (length units).
	At *float64 `json:"at,omitempty"`
}

// EnvelopeRange is the largest and the smallest value of one result over
// the enveloped cases.
type EnvelopeRange struct {
	// Max is the largest (most positive) value.
	Max EnvelopeValue `json:"max"`
	// Min is the smallest (most negative) value.
	Min EnvelopeValue `json:"min"`
}

// NodeEnvelope is the envelope of one node's displacements.
type NodeEnvelope struct {
	// Node is the node's id.
	Node string `json:"node"`
	// Displacements holds per translation (dimension entries, global
	// axes, length units) its range.
	Displacements []EnvelopeRange `json:"displacements"`
	// Rotations holds per rotation (radians; one about z in 2D, three in
	// 3D) its range; empty for a node no beam touches.
	Rotations []EnvelopeRange `json:"rotations"`
}

// ReactionEnvelope is the envelope of one support's reaction.
type ReactionEnvelope struct {
	// Node is the supported node's id.
	Node string `json:"node"`
	// Force holds per component (dimension entries, global axes) its
	// range.
	Force []EnvelopeRange `json:"force"`
	// Moment holds per component (one about z in 2D, three in 3D) its
	// range.
	Moment []EnvelopeRange `json:"moment"`
}

// MemberEnvelope is the envelope of one member's results. The internal
// forces along a beam (local axes, on the face whose outward normal is
// local +x: tension positive, moments as right-handed vectors, so a
// sagging 2D beam has a positive moment_z) are the exact extremes along
// it that solve finds in each case, with their distances.
type MemberEnvelope struct {
	// ID is the member's id.
	ID string `json:"id"`
	// Axial is the range of the axial force along the member (for a bar,
	// its end values).
	Axial EnvelopeRange `json:"axial"`
	// EndForces holds per entry of the cases' end_forces (the forces the
	// nodes exert on the member, local axes) its range.
	EndForces []EnvelopeRange `json:"end_forces"`
	// Utilisation is the range of the member's utilisation; null when
	// its checks could not all be made in some enveloped case (see
	// utilisation_note and the result's unchecked list), never a value
	// that leaves that case out.
	Utilisation *EnvelopeRange `json:"utilisation"`
	// UtilisationNote says why utilisation is null: the first enveloped
	// case that did not check the member.
	UtilisationNote string `json:"utilisation_note,omitempty"`
	// ShearY and MomentZ are the ranges of V_y and M_z along a beam
	// (absent for a bar).
	ShearY  *EnvelopeRange `json:"shear_y,omitempty"`
	MomentZ *EnvelopeRange `json:"moment_z,omitempty"`
	// ShearZ, Torsion and MomentY are the ranges of V_z, T and M_y along
	// a 3D beam.
	ShearZ  *EnvelopeRange `json:"shear_z,omitempty"`
	Torsion *EnvelopeRange `json:"torsion,omitempty"`
	MomentY *EnvelopeRange `json:"moment_y,omitempty"`
}
