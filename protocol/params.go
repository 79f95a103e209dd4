package protocol

// DescribeParams are the (empty) params of describe.
type DescribeParams struct{}

// SolveParams are the params of solve: a linear-elastic stiffness analysis.
type SolveParams struct {
	// Model is the structure to analyse.
	Model Model `json:"model"`
	// Cases lists the load cases and combinations to report, by id;
	// default every case and then every combination.
	Cases []string `json:"cases,omitempty"`
	// Stations is the number of evenly spaced stations (both ends
	// included) along each beam at which the internal forces and
	// displacements are reported; default 11, 0 for none (the exact
	// extremes along each member are reported whatever the stations).
	Stations *int `json:"stations,omitempty" jsonschema:"minimum=0,maximum=1001"`
	// Picture asks for an SVG drawing of the first reported case in the
	// result: the deflected shape over the undeformed model, members
	// styled by the sense of their axial force; a 3D model in an
	// isometric view, a plan and an elevation.
	Picture bool `json:"picture,omitempty"`
	// Envelope, when given, adds the envelope of the chosen cases to the
	// result: per node, support and member the largest and smallest value
	// of each result and the case that governs it.
	Envelope *EnvelopeParams `json:"envelope,omitempty"`
	// SecondOrder, when present, turns on the second-order (P-Δ)
	// analysis: the geometric stiffness of the axial forces is added and
	// each case is solved on its own, iterated to convergence.
	SecondOrder *SecondOrder `json:"second_order,omitempty"`
}

// ReciprocateParams are the params of reciprocate: the reciprocal force
// diagram of a planar (2D) network and its Airy stress function, or, with
// edit, the form that fits an edited force diagram.
type ReciprocateParams struct {
	// Model is the planar network (dimension 2).
	Model Model `json:"model"`
	// Case is the load case or combination whose forces are drawn; default
	// the first case. Ignored when forces are given.
	Case string `json:"case,omitempty"`
	// Forces gives the member axial forces (tension positive) instead of
	// solving the model: one per member, aligned with model.members.
	Forces []float64 `json:"forces,omitempty"`
	// SelfStress picks a state of self-stress (0-based) to draw for a
	// network without loads; the states come from the equilibrium matrix's
	// null space.
	SelfStress *int `json:"self_stress,omitempty" jsonschema:"minimum=0"`
	// Perpendicular draws each force-diagram segment perpendicular to its
	// member instead of parallel.
	Perpendicular bool `json:"perpendicular,omitempty"`
	// Picture asks for an SVG drawing of the form and force diagrams in
	// the result.
	Picture bool `json:"picture,omitempty"`
	// Edit, when given, runs the reverse direction: the form whose members
	// are parallel to an edited force diagram.
	Edit *DiagramEdit `json:"edit,omitempty"`
}

// DiagramEdit is an edited force diagram for design by forces.
type DiagramEdit struct {
	// Points maps space labels (Bow's notation, as returned by a previous
	// reciprocate) to their new positions in the force diagram.
	Points map[string][]float64 `json:"points"`
	// Fixed lists node ids to keep in place besides the supported nodes.
	Fixed []string `json:"fixed,omitempty"`
}

// LoadPathParams are the params of load-path: Maxwell's load path, member
// sizing and material quantities.
type LoadPathParams struct {
	// Model is the structure.
	Model Model `json:"model"`
	// Cases lists the load cases and combinations to evaluate and to size
	// for (the envelope); default every case and combination.
	Cases []string `json:"cases,omitempty"`
	// Forces gives the member axial forces of one case (tension positive)
	// instead of solving; reactions then come from the loads by least
	// squares over the supports.
	Forces []float64 `json:"forces,omitempty"`
	// Sizing, when given, sizes every member from the material limits and
	// reports areas, volume, mass and carbon.
	Sizing *Sizing `json:"sizing,omitempty"`
	// FloorArea, when positive, adds quantities per unit of floor or deck
	// area (length²).
	FloorArea float64 `json:"floor_area,omitempty" jsonschema:"minimum=0"`
}

// Sizing declares how members are sized.
type Sizing struct {
	// Shape is the section family for Euler buckling of compression
	// members, geometrically similar sections with I = c·A²: "tube" (needs
	// diameter_to_thickness), "solid-round", "solid-square", or "custom"
	// (needs coefficient). "none" ignores buckling.
	Shape string `json:"shape" jsonschema:"enum=tube,enum=solid-round,enum=solid-square,enum=custom,enum=none"`
	// DiameterToThickness is D/t of a tube family.
	DiameterToThickness float64 `json:"diameter_to_thickness,omitempty" jsonschema:"exclusiveMinimum=2"`
	// Coefficient is c in I = c·A² for a custom family.
	Coefficient float64 `json:"coefficient,omitempty" jsonschema:"minimum=0"`
	// MinimumArea is the least area any member gets (length²).
	MinimumArea float64 `json:"minimum_area,omitempty" jsonschema:"minimum=0"`
}

// SweepParams are the params of sweep-parameter.
type SweepParams struct {
	// Model is the structure; the swept parameters must be among its
	// parameters.
	Model Model `json:"model"`
	// Parameters are the swept parameters: one axis object (a line), or
	// an array of one or two (a grid, the second varying fastest).
	Parameters SweepAxes `json:"parameters"`
	// Metrics lists what to evaluate at each step: load_path, volume,
	// mass, carbon, max_displacement, max_utilisation,
	// critical_load_factor (the least positive linear buckling factor over
	// the cases, by modes), first_frequency (the lowest natural frequency
	// in Hz, by modes; needs mass). Default load_path and volume when the
	// materials have limits, load_path otherwise.
	Metrics []string `json:"metrics,omitempty" jsonschema:"uniqueItems=true"`
	// Cases lists the load cases and combinations evaluated at each step
	// (metrics take the envelope); default every one.
	Cases []string `json:"cases,omitempty"`
	// Sizing is used for volume, mass and carbon; default shape "none".
	Sizing *Sizing `json:"sizing,omitempty"`
	// Objective, when given, refines the best step to an optimum.
	Objective *Objective `json:"objective,omitempty"`
	// Constraints bound metrics during refinement: it starts from the
	// best step that meets them all and optimises the objective over the
	// points that do, reporting the constraints active at the optimum.
	// Their metrics are evaluated at every step.
	Constraints []SweepConstraint `json:"constraints,omitempty"`
	// Shard computes only one shard of the steps, with global indices.
	Shard *Shard `json:"shard,omitempty"`
	// Steps is "full" (the default: the final result lists every step) or
	// "summary" (the final result omits the steps, which have streamed).
	Steps string `json:"steps,omitempty" jsonschema:"enum=full,enum=summary"`
}

// SweepAxis is one swept parameter: explicit values, or a range.
type SweepAxis struct {
	// Name is a model parameter.
	Name string `json:"name" jsonschema:"minLength=1"`
	// Values lists the values to take, in order.
	Values []float64 `json:"values,omitempty" jsonschema:"minItems=1"`
	// From is the first value of a range.
	From *float64 `json:"from,omitempty"`
	// To is the last value of a range.
	To *float64 `json:"to,omitempty"`
	// Count is the number of evenly spaced values of a range (at least 2,
	// or 1 for from alone).
	Count int `json:"count,omitempty" jsonschema:"minimum=1"`
}

// Objective asks for the optimum of one metric.
type Objective struct {
	// Metric is the metric to optimise.
	Metric string `json:"metric" jsonschema:"enum=load_path,enum=volume,enum=mass,enum=carbon,enum=max_displacement,enum=max_utilisation,enum=critical_load_factor,enum=first_frequency"`
	// Goal is "minimise" (the default) or "maximise".
	Goal string `json:"goal,omitempty" jsonschema:"enum=minimise,enum=maximise"`
	// Tolerance is the relative tolerance on the parameter; default 1e-6.
	Tolerance float64 `json:"tolerance,omitempty" jsonschema:"exclusiveMinimum=0"`
}

// SweepConstraint bounds one metric: a point is feasible when min ≤
// metric ≤ max; give min, max or both.
type SweepConstraint struct {
	// Metric is a metric name, as in metrics.
	Metric string `json:"metric" jsonschema:"enum=load_path,enum=volume,enum=mass,enum=carbon,enum=max_displacement,enum=max_utilisation,enum=critical_load_factor,enum=first_frequency"`
	// Min is the least allowed value.
	Min *float64 `json:"min,omitempty"`
	// Max is the greatest allowed value.
	Max *float64 `json:"max,omitempty"`
}

// Shard selects one of count interleaved shards: steps whose global index
// modulo count equals index.
type Shard struct {
	// Index is this shard's number, 0 ≤ index < count.
	Index int `json:"index" jsonschema:"minimum=0"`
	// Count is the number of shards.
	Count int `json:"count" jsonschema:"minimum=1"`
}

// LayoutParams are the params of optimise-layout: the least-volume
// pin-jointed layout by the ground-structure method.
type LayoutParams struct {
	// Dimension is 2 (the default: a plane layout, points [x, y]) or 3 (a
	// space layout, points [x, y, z]); every point, the divisions and the
	// force vectors have this many entries.
	Dimension int `json:"dimension,omitempty" jsonschema:"enum=2,enum=3"`
	// Units declares the length and force units.
	Units *Units `json:"units,omitempty"`
	// Domain is the region the layout may occupy: in the plane a polygon
	// with polygonal holes, in space a convex polyhedron with holes that
	// are boxes or convex polyhedra. With nodes it only excludes members
	// that leave it.
	Domain *Domain `json:"domain,omitempty"`
	// Divisions is the number of grid divisions along x and y (and z in
	// space) over the domain's bounding box.
	Divisions []int `json:"divisions,omitempty" jsonschema:"minItems=2,maxItems=3"`
	// Nodes are the host's own candidate node positions instead of a grid;
	// every pair that sees each other inside the domain is a candidate.
	Nodes [][]float64 `json:"nodes,omitempty"`
	// Connectivity limits candidate members to grid steps of at most this
	// many divisions along each axis; 0 connects every pair.
	Connectivity int `json:"connectivity,omitempty" jsonschema:"minimum=0"`
	// Supports are points with fixed components x, y (and z in space).
	// Each must lie at a node: within a hundredth of the node spacing of
	// one, or the request is refused with the nearest node and its
	// distance (a support is never moved to a node farther away).
	Supports []LayoutSupport `json:"supports" jsonschema:"minItems=1"`
	// Cases are load cases of point loads.
	Cases []LayoutCase `json:"cases" jsonschema:"minItems=1"`
	// TensionLimit is the design stress in tension.
	TensionLimit float64 `json:"tension_limit" jsonschema:"exclusiveMinimum=0"`
	// CompressionLimit is the design stress in compression (a magnitude).
	CompressionLimit float64 `json:"compression_limit" jsonschema:"exclusiveMinimum=0"`
	// JointCost is a length added to every member's length in the
	// objective, Σ (L + joint_cost)·A, so that layouts with fewer members
	// and joints win when the saving outweighs the extra volume (a simple
	// cost of a joint, after Parkes 1975); default 0, the plain least
	// volume. With a joint cost, long members that pass through grid
	// nodes stay among the candidates.
	JointCost float64 `json:"joint_cost,omitempty" jsonschema:"minimum=0"`
	// ElasticModulus is the Young's modulus put in the returned model, so
	// that solve can analyse it, in the request's units (force/length²);
	// default steel's 210 GPa (EN 1993-1-1) in those units: 2.1e8 in kN
	// and m, 210 000 in N and mm, about 30 458 in kip and in.
	ElasticModulus float64 `json:"elastic_modulus,omitempty" jsonschema:"exclusiveMinimum=0"`
	// Mode is "alternatives" (the default: the layout carries each case on
	// its own, by the multiple-load-case formulation), "together" (the
	// cases' loads act at once), or "single-equivalent" (two alternative
	// cases with equal limits solved as one equivalent case).
	Mode string `json:"mode,omitempty" jsonschema:"enum=alternatives,enum=together,enum=single-equivalent"`
	// Picture asks for an SVG drawing of the layout in the result.
	Picture bool `json:"picture,omitempty"`
}

// Domain is a layout's design domain: in the plane a polygon with optional
// polygonal holes, in space a convex polyhedron with optional holes that
// are convex polyhedra or boxes. Give outline or box.
type Domain struct {
	// Outline lists, in the plane, the polygon's corners in order; in
	// space, the vertices of a convex polyhedron (the domain is their
	// convex hull; at most 64 vertices).
	Outline [][]float64 `json:"outline,omitempty" jsonschema:"minItems=3"`
	// Box is the domain as a box (a rectangle in the plane), instead of
	// outline.
	Box *LayoutBox `json:"box,omitempty"`
	// Holes lists regions inside the domain that members may not enter or
	// cross (they may touch their edges and faces): in the plane polygons
	// given by their corners in order, in space convex polyhedra given by
	// their vertices (at most 64 each). A load or support inside a hole is
	// refused.
	Holes [][][]float64 `json:"holes,omitempty"`
	// BoxHoles lists holes given as boxes (rectangles in the plane).
	BoxHoles []LayoutBox `json:"box_holes,omitempty"`
}

// LayoutBox is an axis-aligned box (a rectangle in the plane) from its
// lowest corner to its highest.
type LayoutBox struct {
	// Min is the corner with the smallest coordinates.
	Min []float64 `json:"min" jsonschema:"minItems=2,maxItems=3"`
	// Max is the corner with the largest coordinates.
	Max []float64 `json:"max" jsonschema:"minItems=2,maxItems=3"`
}

// LayoutSupport is a support of a layout problem.
type LayoutSupport struct {
	// At is the support's position, at a node.
	At []float64 `json:"at" jsonschema:"minItems=2,maxItems=3"`
	// Fix lists the fixed components: x, y (and z in space).
	Fix []string `json:"fix" jsonschema:"minItems=1,maxItems=3,uniqueItems=true,enum=x,enum=y,enum=z"`
}

// LayoutCase is a load case of a layout problem.
type LayoutCase struct {
	// ID names the case.
	ID string `json:"id" jsonschema:"minLength=1"`
	// Loads are point loads.
	Loads []LayoutLoad `json:"loads" jsonschema:"minItems=1"`
}

// LayoutLoad is a point load.
type LayoutLoad struct {
	// At is the load's position, at a node (within a hundredth of the node
	// spacing of one; a point inside a hole or away from every node is
	// refused).
	At []float64 `json:"at" jsonschema:"minItems=2,maxItems=3"`
	// Force is the force vector, with as many components as the dimension.
	Force []float64 `json:"force" jsonschema:"minItems=2,maxItems=3"`
}
