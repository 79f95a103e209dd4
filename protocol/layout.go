package protocol

// LayoutResult is the result of optimise-layout: the least-volume
// pin-jointed layout found by the ground-structure method (Dorn, Gomory &
// Greenberg 1964) with member adding (Gilbert & Tyas 2003).
type LayoutResult struct {
	// Volume is Σ L·A over the kept members (length³).
	Volume float64 `json:"volume"`
	// Objective is the minimised Σ (L + joint_cost)·A; it equals volume
	// when joint_cost is 0.
	Objective float64 `json:"objective"`
	// Members holds the kept members: ends (node ids of model), length,
	// area and force per case (tension positive).
	Members []LayoutMember `json:"members"`
	// Cases holds per load case the load path, its tension and
	// compression parts, M = ΣF·r and the residual of Maxwell's theorem
	// Z_T − Z_C = M, and the equilibrium residual.
	Cases []LayoutCaseResult `json:"cases"`
	// Model is the layout as a model, with one section per member sized
	// by the optimisation, ready for solve, reciprocate and load-path.
	Model Model `json:"model"`
	// Stats describes the optimisation.
	Stats LayoutStats `json:"stats"`
	// Picture is an SVG drawing of the layout (only when asked for).
	Picture string `json:"picture,omitempty"`
	// Caution: results are for preliminary design.
	Caution string `json:"caution"`
}

// LayoutMember is one member of an optimal layout.
type LayoutMember struct {
	// ID is the member's id in model.
	ID string `json:"id"`
	// Ends are the ids of its nodes in model.
	Ends []string `json:"ends" jsonschema:"minItems=2,maxItems=2"`
	// Length is its length.
	Length float64 `json:"length"`
	// Area is the area it needs.
	Area float64 `json:"area"`
	// Forces holds its axial force in each case, tension positive.
	Forces []float64 `json:"forces"`
}

// LayoutCaseResult holds the load-path quantities of one case of a layout.
type LayoutCaseResult struct {
	// ID is the case's id.
	ID string `json:"id"`
	// LoadPath is Z = Σ|N|·L.
	LoadPath float64 `json:"load_path"`
	// TensionLoadPath is Z_T.
	TensionLoadPath float64 `json:"tension_load_path"`
	// CompressionLoadPath is Z_C.
	CompressionLoadPath float64 `json:"compression_load_path"`
	// Constant is M = ΣF·r over loads and reactions.
	Constant float64 `json:"constant"`
	// MaxwellResidual is Z_T − Z_C − M.
	MaxwellResidual float64 `json:"maxwell_residual"`
	// EquilibriumResidual is the largest force imbalance at a node,
	// relative to the loads.
	EquilibriumResidual float64 `json:"equilibrium_residual"`
}

// LayoutStats describes a layout optimisation.
type LayoutStats struct {
	// Nodes counts the ground structure's nodes.
	Nodes int `json:"nodes"`
	// Candidates counts its candidate members.
	Candidates int `json:"candidates"`
	// Iterations counts the member-adding rounds.
	Iterations int `json:"iterations"`
	// InteriorPointIterations counts the linear-program iterations.
	InteriorPointIterations int `json:"interior_point_iterations"`
	// MembersInProgram counts the members in the final linear program.
	MembersInProgram int `json:"members_in_program"`
	// OptimalityGap is the largest remaining violation of the dual limits
	// among the candidates left out (relative).
	OptimalityGap float64 `json:"optimality_gap"`
}
