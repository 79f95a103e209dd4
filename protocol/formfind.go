package protocol

// FindFormParams are the params of find-form: the equilibrium form of a
// pin-jointed network from force densities (Schek's force density method),
// in 2D or 3D. The model's supports that hold every translation are the
// fixed nodes; every other node is free and moves to its found position.
type FindFormParams struct {
	// Model is the network: its nodes (free nodes' coordinates are only a
	// start), members, fixed supports, and the load case whose nodal loads,
	// self-weight and global uniform or linear member loads load it.
	Model Model `json:"model"`
	// Case is the load case or combination that loads the network;
	// default the model's first load case (none: no loads).
	Case string `json:"case,omitempty"`
	// ForceDensity is one force density q = N/L for every member (force per
	// length, tension positive: a hanging net; negative: a compression
	// vault). Give it or force_densities.
	ForceDensity *Number `json:"force_density,omitempty"`
	// ForceDensities gives one force density per member, aligned with
	// model.members: numbers or expressions over model.parameters.
	ForceDensities []Number `json:"force_densities,omitempty"`
	// Through scales every force density by one factor so that a node
	// passes through a point (the thrust line through three points).
	Through *FormPoint `json:"through,omitempty"`
	// Targets are lengths or axial forces of chosen members, met by
	// iterating their force densities; not with through.
	Targets []FormTarget `json:"targets,omitempty"`
	// MaxIterations bounds the iterations of targets and of loads that
	// follow the form (self-weight, member loads); default 100.
	MaxIterations int `json:"max_iterations,omitempty" jsonschema:"minimum=1,maximum=100000"`
	// Tolerance ends the iterations: the largest move of a node relative to
	// the model's size and the largest relative target misfit; default 1e-9.
	Tolerance float64 `json:"tolerance,omitempty" jsonschema:"exclusiveMinimum=0,maximum=0.1"`
	// Picture asks for an SVG drawing of the found form (plan and
	// elevation for 3D) in the result.
	Picture bool `json:"picture,omitempty"`
}

// FormPoint asks that a node pass through a point.
type FormPoint struct {
	// Node is the id of a free node.
	Node string `json:"node"`
	// At is the point (dimension coordinates). With vertical loads only
	// its height can be reached; the rest is reported as through_misfit.
	At []float64 `json:"at" jsonschema:"minItems=2,maxItems=3"`
}

// FormTarget is a target length or axial force of one member; give exactly
// one of length and force.
type FormTarget struct {
	// Member is the member's id.
	Member string `json:"member"`
	// Length is the member's target length.
	Length *float64 `json:"length,omitempty" jsonschema:"exclusiveMinimum=0"`
	// Force is the member's target axial force, tension positive.
	Force *float64 `json:"force,omitempty"`
}

// FindFormResult is the result of find-form. Per-node and per-member
// arrays are aligned with the model's nodes and members.
type FindFormResult struct {
	// Case is the id of the load case or combination used ("" for none).
	Case string `json:"case"`
	// Coordinates holds each node's found position; fixed nodes keep
	// theirs.
	Coordinates [][]float64 `json:"coordinates"`
	// ForceDensities holds each member's force density in the found form
	// (after the through scaling and target iterations).
	ForceDensities []float64 `json:"force_densities"`
	// Forces holds each member's axial force q·L, tension positive.
	Forces []float64 `json:"forces"`
	// Lengths holds each member's found length.
	Lengths []float64 `json:"lengths"`
	// Reactions holds what the supports exert on the fixed nodes.
	Reactions []FormReaction `json:"reactions"`
	// Network is "tension" when the force density matrix was positive
	// definite, "compression" when negative definite.
	Network string `json:"network"`
	// Residual is the largest equilibrium residual of a free node relative
	// to the forces meeting there (round-off: about 1e-15).
	Residual float64 `json:"residual"`
	// Scale is the factor the through constraint applied to the given
	// force densities (1 without through).
	Scale float64 `json:"scale"`
	// ThroughMisfit is the distance left between the node and the through
	// point (0 without through).
	ThroughMisfit float64 `json:"through_misfit"`
	// Targets reports each target with the value reached.
	Targets []FormTargetResult `json:"targets"`
	// Iterations counts the linear solves (1 without targets and loads
	// that follow the form); Change is the largest node move in the last
	// one (length), Converged whether the tolerance was met.
	Iterations int     `json:"iterations"`
	Change     float64 `json:"change"`
	Converged  bool    `json:"converged"`
	// LoadPath is Maxwell's load path of the found form: Σ|N|·L, its
	// tension and compression parts, M = ΣF·r over loads and reactions and
	// the theorem's relative residual.
	LoadPath FormLoadPath `json:"load_path"`
	// Model is the found form as a model for solve, reciprocate (2D),
	// load-path and sweep-parameter: the given model with the free nodes at
	// their found coordinates and each member whose material has the limit
	// its force needs on its own section of area |N|/limit.
	Model Model `json:"model"`
	// ModelCase is the id of the load case of model that carries exactly
	// the loads the form balances.
	ModelCase string `json:"model_case"`
	// RiseParameter, when through was given and the loads do not follow
	// the form, names the parameter added to model: the through node's
	// height (along gravity), set to the height found, in which the free
	// nodes' coordinates are written, so that sweep-parameter over it
	// studies the family of funicular forms through other heights.
	RiseParameter string `json:"rise_parameter,omitempty"`
	// Sized counts the members of model given a section sized from their
	// force (stress only; buckling not checked).
	Sized int `json:"sized"`
	// Warnings locate what form finding did not use, could not meet or did
	// not check.
	Warnings []Problem `json:"warnings"`
	// Stats sizes the work.
	Stats FormStats `json:"stats"`
	// Picture is an SVG drawing of the found form (only when asked for).
	Picture string `json:"picture,omitempty"`
	// Caution: results are for preliminary design.
	Caution string `json:"caution"`
}

// FormReaction is what the supports exert on one fixed node.
type FormReaction struct {
	// Node is the node's id.
	Node string `json:"node"`
	// Force has dimension entries.
	Force []float64 `json:"force"`
}

// FormTargetResult is one target with the value reached.
type FormTargetResult struct {
	// Member is the member's id.
	Member string `json:"member"`
	// Kind is "length" or "force".
	Kind string `json:"kind"`
	// Target is the value asked for, Achieved the value reached.
	Target   float64 `json:"target"`
	Achieved float64 `json:"achieved"`
	// Misfit is |achieved − target| / |target|.
	Misfit float64 `json:"misfit"`
}

// FormLoadPath holds Maxwell's load-path quantities of a found form.
type FormLoadPath struct {
	LoadPath            float64 `json:"load_path"`
	TensionLoadPath     float64 `json:"tension_load_path"`
	CompressionLoadPath float64 `json:"compression_load_path"`
	Constant            float64 `json:"constant"`
	RelativeResidual    float64 `json:"relative_residual"`
}

// FormStats sizes a form finding.
type FormStats struct {
	// FreeNodes is the order of the force density matrix.
	FreeNodes int `json:"free_nodes"`
	// Nonzeros counts its stored entries (lower triangle).
	Nonzeros int `json:"nonzeros"`
}
