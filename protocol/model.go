package protocol

// Model is a structure in consistent units. Results are arrays aligned with
// the input arrays: the i-th axial force is that of members[i].
type Model struct {
	// Dimension is 2 (plane, gravity along −y) or 3 (space, gravity along −z).
	Dimension int `json:"dimension" jsonschema:"enum=2,enum=3"`
	// Units declares the length and force units; stress is force/length²,
	// weight density force/length³. Results come back in the same units.
	Units *Units `json:"units,omitempty"`
	// Parameters are named numbers that expression strings elsewhere in the
	// model may use, and that sweeps vary.
	Parameters map[string]float64 `json:"parameters,omitempty"`
	// Materials lists the materials members refer to by id.
	Materials []Material `json:"materials"`
	// Sections lists the cross-sections members refer to by id.
	Sections []Section `json:"sections"`
	// Nodes lists the joints.
	Nodes []Node `json:"nodes"`
	// Members lists the bars and beams.
	Members []Member `json:"members"`
	// Supports fix freedoms of nodes.
	Supports []Support `json:"supports,omitempty"`
	// LoadCases lists the load cases.
	LoadCases []LoadCase `json:"load_cases,omitempty"`
	// Combinations are factored sums of load cases.
	Combinations []Combination `json:"combinations,omitempty"`
	// Patterns generate combinations for pattern loading (every on/off
	// pattern of variable cases), which solve reports and envelopes.
	Patterns []Pattern `json:"patterns,omitempty"`
	// Decoded is not part of the wire format: when the server decoded
	// the model's nodes and members straight into a form of its own (see
	// DecodeStrictEach), leaving Nodes and Members empty, it holds them;
	// nil otherwise.
	Decoded any `json:"-"`
}

// Units names the unit of length and of force. Both default to m and kN.
type Units struct {
	// Length is one of m, cm, mm, ft, in.
	Length string `json:"length,omitempty" jsonschema:"enum=m,enum=cm,enum=mm,enum=ft,enum=in"`
	// Force is one of N, kN, MN, lbf, kip.
	Force string `json:"force,omitempty" jsonschema:"enum=N,enum=kN,enum=MN,enum=lbf,enum=kip"`
}

// Material is a member material. Stresses are force/length².
type Material struct {
	// ID names the material; unique among materials.
	ID string `json:"id" jsonschema:"minLength=1"`
	// ElasticModulus is Young's modulus E (stress), positive.
	ElasticModulus Number `json:"elastic_modulus"`
	// ShearModulus is G (stress) for torsion of 3D beams; default E/2.6
	// (Poisson's ratio 0.3).
	ShearModulus *Number `json:"shear_modulus,omitempty"`
	// WeightDensity is weight per volume (force/length³) for self-weight,
	// mass and carbon; default 0.
	WeightDensity *Number `json:"weight_density,omitempty"`
	// TensionLimit is the design stress in tension, positive; needed for
	// utilisation and sizing.
	TensionLimit *Number `json:"tension_limit,omitempty"`
	// CompressionLimit is the design stress in compression (a positive
	// magnitude); needed for utilisation and sizing.
	CompressionLimit *Number `json:"compression_limit,omitempty"`
	// CarbonFactor is embodied carbon in kg CO2e per kg of material.
	CarbonFactor *Number `json:"carbon_factor,omitempty"`
	// ThermalExpansion is the coefficient of thermal expansion (strain per
	// degree) for thermal loads given as a temperature change.
	ThermalExpansion *Number `json:"thermal_expansion,omitempty"`
	// MassDensity is mass per volume for vibration (modes), in the mass
	// unit of the model's force and length units (force·s²/length: tonnes
	// per m³ with kN and m, 7.85 for steel); not derived from
	// weight_density.
	MassDensity *Number `json:"mass_density,omitempty"`
}

// Section is a member cross-section.
type Section struct {
	// ID names the section; unique among sections.
	ID string `json:"id" jsonschema:"minLength=1"`
	// Area is the cross-section area (length²), positive; required unless
	// a shape gives it.
	Area *Number `json:"area,omitempty"`
	// SecondMoment is the second moment of area about the local z axis
	// (length⁴): in-plane bending in 2D. Needed by beams and for Euler
	// buckling.
	SecondMoment *Number `json:"second_moment,omitempty"`
	// SecondMomentY is the second moment about the local y axis (3D
	// beams); default second_moment.
	SecondMomentY *Number `json:"second_moment_y,omitempty"`
	// TorsionConstant is St Venant's torsion constant J (3D beams);
	// default the shape's, else 2 × second_moment (a round section).
	TorsionConstant *Number `json:"torsion_constant,omitempty"`
	// SectionModulus is the elastic section modulus about local z
	// (length³) for the bending check; default the shape's.
	SectionModulus *Number `json:"section_modulus,omitempty"`
	// SectionModulusY is the elastic section modulus about local y (3D
	// beams); default the shape's.
	SectionModulusY *Number `json:"section_modulus_y,omitempty"`
	// Shape gives the section by its shape and dimensions; every property
	// above that is not given follows from it (given values win; one more
	// than 10 % from the shape's is an error).
	Shape *SectionShape `json:"shape,omitempty"`
}

// SectionShape is a cross-section by shape, its dimensions in the model's
// length unit. Depth runs along the member's local y axis and width along
// local z, so second_moment is the major-axis value of an I section. The
// properties follow EN 10365 (I and H sections, root fillets included in
// area and second moments, ignored in the torsion constant) and EN
// 10210-2 (hollow sections, hot-finished corner radii 1.5t outside and t
// inside).
type SectionShape struct {
	// Kind is "i" (I or H section: depth, width, web_thickness,
	// flange_thickness, root_radius), "rhs" (rectangular or square hollow:
	// depth, width, thickness), "chs" (circular hollow: diameter,
	// thickness), "rectangle" (solid: depth, width) or "round" (solid:
	// diameter).
	Kind string `json:"kind" jsonschema:"enum=i,enum=rhs,enum=chs,enum=rectangle,enum=round"`
	// Depth is the overall depth along local y.
	Depth float64 `json:"depth,omitempty" jsonschema:"minimum=0"`
	// Width is the overall width along local z.
	Width float64 `json:"width,omitempty" jsonschema:"minimum=0"`
	// WebThickness is an I section's web thickness.
	WebThickness float64 `json:"web_thickness,omitempty" jsonschema:"minimum=0"`
	// FlangeThickness is an I section's flange thickness.
	FlangeThickness float64 `json:"flange_thickness,omitempty" jsonschema:"minimum=0"`
	// RootRadius is an I section's root fillet radius; default 0.
	RootRadius float64 `json:"root_radius,omitempty" jsonschema:"minimum=0"`
	// Thickness is a hollow section's wall thickness.
	Thickness float64 `json:"thickness,omitempty" jsonschema:"minimum=0"`
	// Diameter is a round or circular hollow section's outer diameter.
	Diameter float64 `json:"diameter,omitempty" jsonschema:"minimum=0"`
}

// Node is a joint.
type Node struct {
	// ID names the node; unique among nodes.
	ID string `json:"id" jsonschema:"minLength=1"`
	// At is the position: dimension coordinates.
	At []Number `json:"at" jsonschema:"minItems=2,maxItems=3"`
	// Mass is a lumped mass at the node for vibration (modes), acting in
	// every translation, in the mass unit of the model's units
	// (force·s²/length: tonnes with kN and m); non-negative.
	Mass *float64 `json:"mass,omitempty" jsonschema:"minimum=0"`
}

// Member is a bar or a beam between two nodes.
type Member struct {
	// ID names the member; unique among members.
	ID string `json:"id" jsonschema:"minLength=1"`
	// Ends are the ids of the first and second node. The member's local x
	// axis runs from the first to the second.
	Ends []string `json:"ends" jsonschema:"minItems=2,maxItems=2"`
	// Material is a material id.
	Material string `json:"material"`
	// Section is a section id.
	Section string `json:"section"`
	// Type is "bar" (pin-jointed, axial force only; the default), "beam"
	// (rigid-jointed: axial, shear, bending, and torsion in 3D) or
	// "cable" (a tension-only bar: slack, with neither stiffness nor
	// force, when the loads would compress it).
	Type string `json:"type,omitempty" jsonschema:"enum=bar,enum=beam,enum=cable"`
	// Orientation (3D beams) is a vector that fixes the local y axis: the
	// part of it normal to the member. Default global z, or global y for a
	// vertical member.
	Orientation []float64 `json:"orientation,omitempty" jsonschema:"minItems=3,maxItems=3"`
	// Releases (beams only) lists the rotations released at each end: a
	// hinge that carries no moment about those axes there.
	Releases *MemberReleases `json:"releases,omitempty"`
	// BucklingFactor is the effective-length factor k for Euler buckling,
	// π²EI/(kL)²; default 1.
	BucklingFactor *float64 `json:"buckling_factor,omitempty"`
	// BucklingCurve is the EN 1993-1-1 flexural buckling curve of the
	// compression check: "a0", "a", "b", "c" or "d" (Table 6.1); default
	// "d", the lowest, with a note in the result's unchecked list.
	BucklingCurve string `json:"buckling_curve,omitempty" jsonschema:"enum=a0,enum=a,enum=b,enum=c,enum=d"`
	// Behaviour makes a bar one-sided: "tension-only" (slack when the
	// loads would compress it) or "compression-only" (out when they would
	// stretch it); absent means both. A model with one-sided members is
	// solved case by case by an active-set iteration (see the case's
	// iteration report). Bars and cables only: a beam is refused.
	Behaviour string `json:"behaviour,omitempty" jsonschema:"enum=tension-only,enum=compression-only"`
	// Pretension is an initial axial force of a bar or cable (force
	// units, tension positive, at least 0), applied as the equivalent
	// initial strain −pretension/(E·A): a member between fixed ends
	// carries exactly it. A slack member loses it.
	Pretension *float64 `json:"pretension,omitempty" jsonschema:"minimum=0"`
}

// Support fixes freedoms of a node, with optional springs and prescribed
// displacements. Components: x, y, rz in 2D; x, y, z, rx, ry, rz in 3D.
type Support struct {
	// Node is the supported node's id.
	Node string `json:"node"`
	// Fix lists the fixed components.
	Fix []string `json:"fix" jsonschema:"uniqueItems=true"`
	// Springs maps components to elastic spring stiffness (force/length or
	// moment/radian), positive.
	Springs map[string]float64 `json:"springs,omitempty"`
	// Displacement maps fixed components to a prescribed displacement
	// (settlement), in length units or radians.
	Displacement map[string]float64 `json:"displacement,omitempty"`
	// Directions (an inclined support) gives the support axes of its own:
	// one or two vectors of dimension entries each. The first is the
	// local x axis. In 2D local y is x turned a quarter turn
	// anticlockwise. In 3D a second vector fixes local y (its part normal
	// to x); with one, local y is global z × x, or global y when x is
	// vertical; local z = x × y. Fix, springs and displacement then name
	// components along these axes (rotations about them in 3D), and the
	// reaction is reported in both axes. Absent means the global axes.
	Directions [][]float64 `json:"directions,omitempty" jsonschema:"minItems=1,maxItems=2"`
}

// LoadCase is one load case.
type LoadCase struct {
	// ID names the case; unique among cases and combinations.
	ID string `json:"id" jsonschema:"minLength=1"`
	// SelfWeight adds the members' weight (weight density × area × length)
	// along gravity.
	SelfWeight bool `json:"self_weight,omitempty"`
	// Loads are forces (and moments) at nodes, in global axes.
	Loads []NodalLoad `json:"loads,omitempty"`
	// MemberLoads are loads along members.
	MemberLoads []MemberLoad `json:"member_loads,omitempty"`
	// AreaLoads are loads spread over panels of a 3D model (see
	// AreaLoad).
	AreaLoads []AreaLoad `json:"area_loads,omitempty"`
}

// NodalLoad is a force and optional moment at a node.
type NodalLoad struct {
	// Node is the loaded node's id.
	Node string `json:"node"`
	// Force has dimension components (force units), global axes.
	Force []Number `json:"force,omitempty" jsonschema:"minItems=2,maxItems=3"`
	// Moment has one component (about z) in 2D and three in 3D; only at
	// nodes that a beam touches.
	Moment []Number `json:"moment,omitempty" jsonschema:"minItems=1,maxItems=3"`
}

// MemberLoad is a load along a member.
type MemberLoad struct {
	// Member is the loaded member's id.
	Member string `json:"member"`
	// Kind is "uniform" (constant intensity over the member), "linear"
	// (intensity from value at the first end to end_value at the second),
	// "point" (force value at distance from the first end) or "thermal"
	// (free axial strain). On a bar (pin-jointed) the part of a load
	// across the member goes to its two ends as the reactions of a simple
	// span, and the bar bends between them as that span: solve reports its
	// moments, its checks and (given its section's second_moment) its
	// deflection.
	Kind string `json:"kind" jsonschema:"enum=uniform,enum=linear,enum=point,enum=thermal"`
	// Axes is "global" (the default) or "local" (x along the member).
	Axes string `json:"axes,omitempty" jsonschema:"enum=global,enum=local"`
	// Value is the intensity (force/length) for uniform and linear, the
	// force for point: dimension components.
	Value []Number `json:"value,omitempty" jsonschema:"minItems=2,maxItems=3"`
	// EndValue is the intensity at the second end for linear.
	EndValue []Number `json:"end_value,omitempty" jsonschema:"minItems=2,maxItems=3"`
	// Distance is where a point load acts, from the first end (length).
	Distance *Number `json:"distance,omitempty"`
	// Strain is the free thermal strain (positive lengthens).
	Strain *Number `json:"strain,omitempty"`
	// TemperatureChange times the material's thermal_expansion gives the
	// strain when strain is absent.
	TemperatureChange *Number `json:"temperature_change,omitempty"`
}

// Combination is a factored sum of load cases.
type Combination struct {
	// ID names the combination; unique among cases and combinations.
	ID string `json:"id" jsonschema:"minLength=1"`
	// Factors maps load-case ids to their factors.
	Factors map[string]float64 `json:"factors"`
}
