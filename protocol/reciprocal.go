package protocol

// ReciprocateResult is the result of reciprocate: the reciprocal force
// diagram in Bow's notation, its closure, the polyhedral Airy stress
// function, and (with edit) the redrawn form.
type ReciprocateResult struct {
	// Case is the case or combination drawn ("given" for given forces,
	// "self-stress k" for a state of self-stress).
	Case string `json:"case"`
	// Perpendicular is true when segments are perpendicular to members.
	Perpendicular bool `json:"perpendicular"`
	// Spaces lists the faces of the form: lettered spaces between the
	// external forces (clockwise round the boundary from the external force
	// at the leftmost loaded node), then numbered inner faces; each with
	// its point in the force diagram (force units).
	Spaces []DiagramSpace `json:"spaces"`
	// Members holds per member (aligned with model.members) its segment
	// of the force diagram.
	Members []DiagramSegment `json:"members"`
	// ExternalForces holds the loads and reactions in clockwise order
	// round the network; the k-th runs from space k−1 to space k.
	ExternalForces []DiagramSegment `json:"external_forces"`
	// LoadLine lists the space labels of the load line, the closed
	// polygon of the external forces in boundary order.
	LoadLine []string `json:"load_line"`
	// Closure reports how well the forces close at the nodes.
	Closure Closure `json:"closure"`
	// Disagreements lists members whose sense read from the diagram (the
	// clockwise reading round each joint) differs from their force's sign.
	Disagreements []string `json:"disagreements"`
	// Airy is the polyhedral Airy stress function of the form.
	Airy AiryFunction `json:"airy"`
	// Form is the form redrawn to an edited force diagram (only with edit).
	Form *RedrawnForm `json:"form,omitempty"`
	// Picture is an SVG drawing of the form and force diagrams side by
	// side (only when asked for).
	Picture string `json:"picture,omitempty"`
	// Caution: results are for preliminary design.
	Caution string `json:"caution"`
}

// DiagramSpace is a face of the form diagram and its point in the force
// diagram.
type DiagramSpace struct {
	// Label is "A", "B", ... for spaces, "1", "2", ... for inner faces.
	Label string `json:"label"`
	// Outer is true for the lettered spaces.
	Outer bool `json:"outer"`
	// Point is the face's point in the force diagram (force units).
	Point []float64 `json:"point"`
	// Anchor is a point inside the face in the form diagram, where its
	// label may be drawn (length units).
	Anchor []float64 `json:"anchor"`
}

// DiagramSegment is one line of the force diagram.
type DiagramSegment struct {
	// Label names the segment by the two spaces it separates (Bow's
	// notation), e.g. "B-2".
	Label string `json:"label"`
	// Member is the member's id (empty for an external force).
	Member string `json:"member,omitempty"`
	// Node is the id of the node an external force acts on (empty for a
	// member).
	Node string `json:"node,omitempty"`
	// Spaces are the labels of the spaces on its left and right.
	Spaces []string `json:"spaces"`
	// From and To are its ends in the force diagram: To − From is the
	// force on the node (the member's first node for a member).
	From []float64 `json:"from"`
	To   []float64 `json:"to"`
	// Force is the axial force (tension positive) of a member, or the
	// magnitude of an external force.
	Force float64 `json:"force"`
	// Sense is "tension", "compression" or "zero", read from the diagram
	// (members only).
	Sense string `json:"sense,omitempty" jsonschema:"enum=tension,enum=compression,enum=zero"`
	// Misfit is how far the placed segment is from the exact force.
	Misfit float64 `json:"misfit"`
}

// Closure reports the equilibrium error of the forces drawn.
type Closure struct {
	// Nodes holds per node ‖Σ forces‖ (force units).
	Nodes []float64 `json:"nodes"`
	// Total is the root sum of squares of the node errors.
	Total float64 `json:"total"`
	// Max is the largest node error.
	Max float64 `json:"max"`
	// MaxMisfit is the largest segment misfit after the least-squares
	// placement.
	MaxMisfit float64 `json:"max_misfit"`
}

// AiryFunction is the polyhedral Airy stress function: one plane per face,
// z = a·x + b·y + c, whose gradient is the face's force-diagram point
// turned a quarter turn clockwise; the slope jump across each member equals
// its axial force, so tension members are valleys and compression members
// ridges.
type AiryFunction struct {
	// Heights holds the stress function at each node (force × length).
	Heights []float64 `json:"heights"`
	// Planes holds [a, b, c] per space, in the order of spaces.
	Planes [][]float64 `json:"planes"`
	// Jumps holds per member the slope jump across it (equal to its axial
	// force).
	Jumps []float64 `json:"jumps"`
	// Folds holds per member "valley" (tension), "ridge" (compression) or
	// "flat" (zero force).
	Folds []string `json:"folds"`
	// Mismatch is the largest spread of the planes' heights at a node:
	// zero up to round-off when the diagram closes.
	Mismatch float64 `json:"mismatch"`
	// PolarVertices holds per space the vertex (a, b, −c) of the polar
	// reciprocal with respect to the paraboloid z = (x² + y²)/2: the force
	// diagram lifted.
	PolarVertices [][]float64 `json:"polar_vertices"`
	// PolarPlanes holds per node the plane z = x·X + y·Y − z of the polar,
	// as [x, y, −z].
	PolarPlanes [][]float64 `json:"polar_planes"`
}

// RedrawnForm is the form found from an edited force diagram.
type RedrawnForm struct {
	// Nodes holds the new node positions, aligned with model.nodes.
	Nodes []RedrawnNode `json:"nodes"`
	// Residual is the largest offset of a member's far end from the line
	// parallel to its segment (length units): zero up to round-off when
	// the form fits exactly.
	Residual float64 `json:"residual"`
}

// RedrawnNode is one node of a redrawn form.
type RedrawnNode struct {
	// ID is the node's id.
	ID string `json:"id"`
	// At is its new position.
	At []float64 `json:"at"`
	// Moved is how far it moved.
	Moved float64 `json:"moved"`
}
