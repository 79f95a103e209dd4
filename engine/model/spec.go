package model

// Value is a number as written in the input: either a plain number or an
// expression string over the model's parameters.
type Value struct {
	Num    float64
	Expr   string // when non-empty, the value is this expression
	IsExpr bool
}

// Num returns a plain-number Value.
func Num(x float64) Value { return Value{Num: x} }

// Expr returns an expression Value.
func Expr(s string) Value { return Value{Expr: s, IsExpr: true} }

// Spec is a model as the host wrote it, before compilation. Optional numeric
// fields are pointers (nil when absent). Slices keep the host's order, and
// results are aligned with them.
type Spec struct {
	Dimension  int
	Units      UnitsSpec
	Parameters []ParameterSpec // in the host's order; names unique
	Materials  []MaterialSpec
	Sections   []SectionSpec
	Nodes      []NodeSpec
	Members    []MemberSpec
	Supports   []SupportSpec
	LoadCases  []LoadCaseSpec
	Combos     []CombinationSpec
	// Patterns generate combinations for pattern loading (patterns.go).
	Patterns []PatternSpec
}

// UnitsSpec names the length and force units (length: m, cm, mm, ft, in;
// force: N, kN, MN, lbf, kip). Empty means m and kN.
type UnitsSpec struct {
	Length string
	Force  string
}

// ParameterSpec is one named parameter and its value.
type ParameterSpec struct {
	Name  string
	Value float64
}

// MaterialSpec is a material. ElasticModulus is required; the rest are
// optional.
type MaterialSpec struct {
	ID               string
	ElasticModulus   Value
	ShearModulus     *Value // default E / (2 (1 + 0.3))
	WeightDensity    *Value // force per length³; default 0
	TensionLimit     *Value // stress; absent means not given
	CompressionLimit *Value // stress; absent means not given
	CarbonFactor     *Value // kg CO2e per kg; absent means not given
	ThermalExpansion *Value // strain per degree; default 0
	// MassDensity is mass per length³ in the mass unit of the model's
	// force and length (force·s²/length: tonnes with kN and m) for
	// vibration; absent means not given.
	MassDensity *Value
}

// SectionSpec is a cross-section. Area is required; SecondMoment is
// required for beams (about local z: in-plane bending in 2D); in 3D,
// SecondMomentY and TorsionConstant default to SecondMoment and
// 2·SecondMoment (a round section) when absent.
type SectionSpec struct {
	ID              string
	Area            Value
	SecondMoment    *Value
	SecondMomentY   *Value
	TorsionConstant *Value
	// SectionModulus and SectionModulusY are the elastic section moduli
	// about local z and y (length³); absent means derived from Shape, or
	// not given.
	SectionModulus  *Value
	SectionModulusY *Value
	// Shape, when given, supplies every property not given above; Area
	// may then be left zero (a plain 0, not an expression) to take the
	// shape's.
	Shape *ShapeSpec
}

// NodeSpec is a node; At has Dimension entries.
type NodeSpec struct {
	ID string
	At []Value
	// Mass is a lumped mass at the node (force·s²/length) acting in every
	// translation, for vibration; nil means none.
	Mass *float64
}

// MemberSpec is a member between two nodes.
type MemberSpec struct {
	ID       string
	Ends     [2]string
	Material string
	Section  string
	Type     string // "bar" (default) or "beam"
	// Orientation is a vector (3D beams only) that, with the member axis,
	// fixes the local y axis: local y is the part of Orientation normal to
	// the axis. Nil means the default (global z, or global y for a vertical
	// member).
	Orientation []float64
	// BucklingFactor is the effective-length factor k for Euler buckling;
	// nil means 1.
	BucklingFactor *float64
	// BucklingCurve is the EN 1993-1-1 buckling curve, "a0", "a", "b",
	// "c" or "d"; empty means not given.
	BucklingCurve string
	// Releases lists, per end (first, second), the rotation components
	// released there in the member's local axes: "rx" (torsion), "ry",
	// "rz" (bending); a 2D beam has "rz" only. Nil lists mean none.
	Releases [2][]string
	// Behaviour is "tension-only" or "compression-only" for a bar that
	// takes force in one sense only; empty means both senses (a cable is
	// tension-only whatever it says).
	Behaviour string
	// Pretension is an initial axial force (tension positive, force
	// units) of a bar or cable; nil means none.
	Pretension *float64
}

// SupportSpec fixes a subset of a node's freedoms, with optional springs
// and prescribed displacements. Component names: "x", "y", "z", "rx", "ry",
// "rz".
type SupportSpec struct {
	Node         string
	Fix          []string
	Springs      map[string]float64 // component -> stiffness (force/length or moment/radian)
	Displacement map[string]float64 // component -> prescribed value (must also be fixed)
	// Directions, when given, are one or two vectors (Dimension entries
	// each) fixing the support's own axes (see Support.Axes); Fix,
	// Springs and Displacement then name components along those axes.
	// Nil means the global axes.
	Directions [][]float64
}

// LoadCaseSpec is one load case.
type LoadCaseSpec struct {
	ID          string
	SelfWeight  bool
	Loads       []NodalLoadSpec
	MemberLoads []MemberLoadSpec
	AreaLoads   []AreaLoadSpec
}

// NodalLoadSpec is a force (Dimension entries) and optional moment (one
// entry, about z, in 2D; three in 3D) at a node.
type NodalLoadSpec struct {
	Node   string
	Force  []Value
	Moment []Value
}

// MemberLoadSpec is a load along a member. Kind is "uniform", "linear",
// "point" or "thermal".
type MemberLoadSpec struct {
	Member string
	Kind   string
	// Axes is "global" (default) or "local".
	Axes string
	// Value is the intensity (force per length) for uniform, the start
	// intensity for linear, the force for point (Dimension entries).
	Value []Value
	// EndValue is the end intensity for linear.
	EndValue []Value
	// Distance is where a point load acts, from the member's first end.
	Distance *Value
	// Strain is the free thermal strain (thermal); TemperatureChange times
	// the material's ThermalExpansion is used when Strain is nil.
	Strain            *Value
	TemperatureChange *Value
}

// CombinationSpec is a factored sum of load cases.
type CombinationSpec struct {
	ID      string
	Factors map[string]float64 // case id -> factor
}
