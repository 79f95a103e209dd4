package model

// Freedom components.
const (
	X  = 0
	Y  = 1
	Z  = 2
	RX = 3
	RY = 4
	RZ = 5
)

// ComponentNames are the wire names of the freedom components, by index.
var ComponentNames = [6]string{"x", "y", "z", "rx", "ry", "rz"}

// MemberKind tells bars from beams.
type MemberKind uint8

// Member kinds.
const (
	Bar  MemberKind = iota // pin-jointed, axial force only
	Beam                   // rigid-jointed: axial, shear, bending (and torsion in 3D)
)

// Model is a compiled model: indices and numbers only. Slices are aligned
// with the Spec's arrays. A Model is read-only once compiled; WithParameters
// returns a new one.
type Model struct {
	Dim   int // 2 or 3
	Units UnitsSpec

	ParamNames  []string
	ParamValues []float64

	NodeIDs []string
	// Coords holds node i's coordinates at Coords[i*Dim : (i+1)*Dim].
	Coords []float64
	// NodeMasses holds per node a lumped translational mass
	// (force·s²/length), or is nil when no node has one.
	NodeMasses []float64

	Members      []Member
	Materials    []Material
	Sections     []Section
	Supports     []Support
	Cases        []LoadCase
	Combinations []Combination

	bindings  []binding
	paramUsed []bool // by parameter: some expression reads it
}

// Member is a compiled member.
type Member struct {
	ID             string
	Ends           [2]int
	Material       int
	Section        int
	Kind           MemberKind
	Orientation    [3]float64 // unit-free reference vector; zero means the default
	BucklingFactor float64    // effective-length factor k, 1 by default
	// BucklingCurve is the EN 1993-1-1 buckling curve ("a0", "a", "b",
	// "c" or "d") for the compression check; empty when not given.
	BucklingCurve string
	// Releases holds, per end (first, second), the rotation components
	// released at that end of a beam, in the member's local axes: bit 0
	// torsion (rx), bit 1 bending about local y (ry), bit 2 bending about
	// local z (rz); see ReleaseBit. Zero for a member without releases.
	Releases [2]uint8
	// Behaviour is the sense of axial force a bar can take: Both, or
	// TensionOnly (cables) or CompressionOnly, which make the analysis
	// iterate on the set of active members.
	Behaviour Behaviour
	// Cable marks a member given as type "cable": a tension-only bar.
	Cable bool
	// Pretension is the initial axial force of a bar or cable (force
	// units, tension positive, never negative), applied as the
	// equivalent initial strain −Pretension/(E·A); 0 when none.
	Pretension float64
}

// Behaviour is the sense of axial force a member can take.
type Behaviour uint8

// Member behaviours.
const (
	Both            Behaviour = iota // tension and compression
	TensionOnly                      // slack (no stiffness, no force) when it would be compressed
	CompressionOnly                  // inactive when it would be stretched
)

// Material is a compiled material. Optional limits are 0 when not given
// (a given limit is always positive).
type Material struct {
	ID               string
	ElasticModulus   float64
	ShearModulus     float64
	WeightDensity    float64
	TensionLimit     float64
	CompressionLimit float64
	CarbonFactor     float64
	HasCarbonFactor  bool
	ThermalExpansion float64
	// MassDensity is mass per volume (force·s²/length⁴); 0 when not given
	// (HasMassDensity false).
	MassDensity    float64
	HasMassDensity bool
}

// Section is a compiled section. SecondMoment is 0 when not given (bars).
type Section struct {
	ID              string
	Area            float64
	SecondMoment    float64 // about local z (in-plane bending in 2D)
	SecondMomentY   float64 // about local y (3D)
	TorsionConstant float64 // 3D
	// SectionModulus and SectionModulusY are the elastic section moduli
	// (length³) about local z and local y for the bending checks; 0 when
	// neither given nor derived from a shape.
	SectionModulus  float64
	SectionModulusY float64
}

// Support is a compiled support. Arrays are indexed by component (X..RZ).
type Support struct {
	Node         int
	Fixed        [6]bool
	Spring       [6]float64 // stiffness, 0 when none
	Displacement [6]float64 // prescribed value of a fixed component
	// Inclined reports a support with directions of its own; Axes then
	// holds its local x, y and z axes (unit vectors in global
	// components) as rows, and Fixed, Spring and Displacement refer to
	// them: rotations too, about the local axes. See supportAxes.
	Inclined bool
	Axes     [3][3]float64
}

// LoadCase is a compiled load case.
type LoadCase struct {
	ID          string
	SelfWeight  bool
	Nodal       []NodalLoad
	MemberLoads []MemberLoad
	// Areas are the case's area loads. Their shares are appended to Nodal
	// (from AreaNodal on) and MemberLoads (from AreaMemberLoads on), and
	// recomputed when the geometry changes (see area.go).
	Areas                      []AreaLoad
	AreaNodal, AreaMemberLoads int
}

// NodalLoad is a force and moment at a node, in global axes. Entries beyond
// the model's dimension are zero; in 2D only Moment[2] (about z) is used.
type NodalLoad struct {
	Node   int
	Force  [3]float64
	Moment [3]float64
}

// MemberLoadKind tells the kinds of member load apart.
type MemberLoadKind uint8

// Member load kinds.
const (
	Uniform MemberLoadKind = iota // constant intensity over the whole length
	Linear                        // intensity varying linearly from Value to EndValue
	Point                         // force Value at Distance from the first end
	Thermal                       // free axial strain Strain
)

// MemberLoad is a compiled member load. Vectors have Dim meaningful
// entries; Local means they are in the member's local axes (x along the
// member from its first end).
type MemberLoad struct {
	Member   int
	Kind     MemberLoadKind
	Local    bool
	Value    [3]float64
	EndValue [3]float64
	Distance float64
	Strain   float64
	// Partial, for a uniform or linear load, bounds it to the stretch
	// from Start to End (distances from the first end, Start < End):
	// Value is the intensity at Start, EndValue at End. Area loads
	// spread to members make such loads; the wire has none.
	Partial    bool
	Start, End float64
}

// Combination is a compiled factored sum of cases.
type Combination struct {
	ID    string
	Terms []Term
	// Pattern is the id of the pattern that generated the combination
	// (after the given combinations in Model.Combinations); empty for a
	// given one.
	Pattern string
}

// Term is one case of a combination with its factor.
type Term struct {
	Case   int
	Factor float64
}

// AllBars reports whether every member of m is a bar (pin-ended: its
// displacement is linear along it unless loads cross it).
func (m *Model) AllBars() bool {
	for _, mem := range m.Members {
		if mem.Kind != Bar {
			return false
		}
	}
	return true
}

// LinearBetweenEnds reports whether every member's displacement is linear
// between its ends in every case, so that the nodes hold the largest
// displacement: every member is a bar and no load may cross one (no case
// has its own weight or a member load other than a thermal one; a load
// along a bar's axis is counted too, which errs on the safe side).
func (m *Model) LinearBetweenEnds() bool {
	if !m.AllBars() {
		return false
	}
	for _, c := range m.Cases {
		if c.SelfWeight {
			return false
		}
		for _, ml := range c.MemberLoads {
			if ml.Kind != Thermal {
				return false
			}
		}
	}
	return true
}

// DOFsPerNode returns the translational freedom count (Dim) and the
// rotational count (1 in 2D, 3 in 3D) of the model.
func (m *Model) DOFsPerNode() (translational, rotational int) {
	if m.Dim == 2 {
		return 2, 1
	}
	return 3, 3
}

// NodeCount returns the number of nodes.
func (m *Model) NodeCount() int { return len(m.NodeIDs) }

// Node returns node i's coordinates as a 3-vector (z = 0 in 2D).
func (m *Model) Node(i int) [3]float64 {
	var p [3]float64
	copy(p[:], m.Coords[i*m.Dim:(i+1)*m.Dim])
	return p
}

// Length returns the length of member e.
func (m *Model) Length(e int) float64 {
	a, b := m.Node(m.Members[e].Ends[0]), m.Node(m.Members[e].Ends[1])
	dx, dy, dz := b[0]-a[0], b[1]-a[1], b[2]-a[2]
	return sqrt(dx*dx + dy*dy + dz*dz)
}

// CaseIndex returns the index of the load case with the given id, or -1.
func (m *Model) CaseIndex(id string) int {
	for i := range m.Cases {
		if m.Cases[i].ID == id {
			return i
		}
	}
	return -1
}

// CombinationIndex returns the index of the combination with the given id,
// or -1.
func (m *Model) CombinationIndex(id string) int {
	for i := range m.Combinations {
		if m.Combinations[i].ID == id {
			return i
		}
	}
	return -1
}
