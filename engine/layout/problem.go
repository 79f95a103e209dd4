package layout

import "gusset/engine/progress"

// Domain is a plane design domain: the region inside Outline and outside
// every hole. Outline and each hole are simple polygons given by their
// vertices in either orientation (the last vertex joins the first). Units are
// the model's length unit.
type Domain struct {
	Outline [][2]float64
	Holes   [][][2]float64
}

// Rectangle returns the domain [x0, x1] × [y0, y1].
func Rectangle(x0, y0, x1, y1 float64) Domain {
	return Domain{Outline: [][2]float64{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}}}
}

// Solid is a design domain in space: the convex hull of Vertices, less
// the convex hulls of each of Holes, which members may neither enter nor
// cross (they may touch a hole's faces). Units are the model's length unit.
type Solid struct {
	Vertices [][3]float64
	Holes    [][][3]float64
}

// Box returns the eight corners of the box [lo, hi], for a Solid's
// Vertices or one of its Holes.
func Box(lo, hi [3]float64) [][3]float64 {
	out := make([][3]float64, 0, 8)
	for k := 0; k < 8; k++ {
		var p [3]float64
		for a := 0; a < 3; a++ {
			p[a] = lo[a]
			if k>>a&1 == 1 {
				p[a] = hi[a]
			}
		}
		out = append(out, p)
	}
	return out
}

// Problem is a layout problem in the plane (Dim 2, the default) or in
// space (Dim 3). Nodes are either a grid over the domain (Domain in the
// plane, Solid in space; set Divisions or Spacing) or the caller's own
// Nodes (then the domain, if given, only excludes members that leave it).
// Points have three coordinates; in the plane the third is ignored and
// taken as 0.
type Problem struct {
	// Dim is 2 (a plane layout; 0 means 2) or 3 (a space layout).
	Dim    int
	Domain Domain
	Solid  Solid
	// Divisions is the number of grid steps across the domain's bounding
	// box in x, y (and z in space). When zero, Spacing is used.
	Divisions [3]int
	// Spacing is the grid step in every direction (length) when Divisions
	// is zero; the step count is rounded to the nearest whole number.
	Spacing float64
	// Nodes are the caller's own nodes, used instead of a grid when not
	// empty.
	Nodes [][3]float64
	// Level limits candidate members of a grid to at most Level grid steps
	// along each axis; 0 means full connectivity (every visible pair). It
	// is ignored for the caller's own nodes, which are always fully
	// connected.
	Level int
	// Supports and Cases locate loads and supports at nodes: by Node index
	// (into the caller's Nodes, or into the grid nodes inside the domain,
	// numbered layer by layer from the lowest z, row by row from the lowest
	// y within a layer, x increasing within a row) or,
	// when Node is negative, at the node nearest to At (within
	// Options.SnapTolerance, else an error).
	Supports []Support
	Cases    []Case
	// TensionLimit and CompressionLimit are the allowable stresses σ_t and
	// σ_c (force/length²), both positive.
	TensionLimit, CompressionLimit float64
	// JointCost is an optional length added to every member in the
	// objective, a simple cost of a joint (Parkes, "Joints in optimum
	// frameworks", Int. J. Solids Struct. 11, 1975; from memory). The
	// reported volume excludes it.
	JointCost float64
	// Mode says how several load cases combine; it is ignored for one case.
	Mode Mode
}

// Mode is how several load cases act.
type Mode int

const (
	// Alternatives: the cases act one at a time and the layout must carry
	// each (the multiple-load-case program).
	Alternatives Mode = iota
	// Together: the cases act at once; their loads are added into one case.
	Together
	// SingleEquivalent: two alternative cases with equal stress limits,
	// solved as the two single cases (f¹+f²)/2 and (f¹−f²)/2 and
	// superposed; same optimum as Alternatives.
	SingleEquivalent
)

// Support fixes the x, y and/or z freedom of a node (z only in space).
type Support struct {
	Node int // node index, or −1 to use At
	At   [3]float64
	Fix  [3]bool
}

// Case is a named set of nodal loads.
type Case struct {
	ID    string
	Loads []Load
}

// Load is a force at a node (force units, global axes; the z component
// only in space).
type Load struct {
	Node  int // node index, or −1 to use At
	At    [3]float64
	Force [3]float64
}

// Method chooses how the linear program is solved.
type Method int

const (
	// MemberAdding starts from short members and adds violating candidates
	// (Gilbert & Tyas 2003); interior-point solves.
	MemberAdding Method = iota
	// AllCandidates solves one interior-point program over every candidate.
	AllCandidates
	// DenseSimplex solves one program over every candidate with gonum's
	// dense simplex method; for small problems only (DenseSimplexLimit).
	DenseSimplex
)

// Options tune Optimise. The zero value is valid.
type Options struct {
	Method Method
	// MaxCandidates limits the number of candidate members; default
	// 5 000 000. More is an error of kind InvalidModel.
	MaxCandidates int
	// DenseSimplexLimit is the largest program (rows × columns) that
	// DenseSimplex accepts; default 4 000 000.
	DenseSimplexLimit int
	// AddPerIteration caps the members added per member-adding iteration,
	// the most violating first; default the larger of 200 and a fifth of
	// the members already in the program.
	AddPerIteration int
	// AddTolerance is the relative violation of the dual limits below which
	// a candidate is not added; the final optimality gap is below it.
	// Default 1e-4.
	AddTolerance float64
	// MaxIterations caps the member-adding iterations; default 100.
	MaxIterations int
	// Tolerance is the interior-point relative tolerance; default 1e-9.
	// Member adding solves its intermediate programs more loosely (1e-6
	// in the plane; in space the first to 1e-3 and the others to 1e-4)
	// and only the last to Tolerance.
	Tolerance float64
	// AreaThreshold keeps members whose area is at least this fraction of
	// the largest area; default 1e-4.
	AreaThreshold float64
	// SnapTolerance is the largest distance from a load's or support's At
	// to its node; default a hundredth of the smallest node spacing. A
	// point farther from every node is refused, never moved.
	SnapTolerance float64
	// StartNeighbours is how many of each node's shortest candidates make
	// up the first member-adding program; default 8 in the plane (on a
	// square grid, the members to the neighbouring nodes) and 26 in space
	// (on a cubic grid, the members to the 26 neighbouring nodes).
	// Measured in space (CPU time, rounds, interior-point iterations): on
	// the 16 × 8 × 8 BenchmarkSpaceBridge 26 neighbours 17.1 s, 4, 52; 18
	// (axes and face diagonals) 14.4 s, 5, 63; 6 32.5 s, 11, 155; on the
	// 20 × 10 × 10 one 26 neighbours 85 s, 5, 70 against 18 89 s, 7, 104.
	StartNeighbours int
	// Rounds, when not nil, receives "member adding" after each round of
	// member adding with the Round itself; otherwise the Reporter given to
	// Optimise receives the stage with the round's number alone.
	Rounds progress.Recorder[Round]
}

func (o Options) withDefaults(dim int) Options {
	if o.MaxCandidates <= 0 {
		o.MaxCandidates = 5_000_000
	}
	if o.DenseSimplexLimit <= 0 {
		o.DenseSimplexLimit = 4_000_000
	}
	if o.AddTolerance <= 0 {
		o.AddTolerance = 1e-4
	}
	if o.MaxIterations <= 0 {
		o.MaxIterations = 100
	}
	if o.Tolerance <= 0 {
		o.Tolerance = 1e-9
	}
	if o.AreaThreshold <= 0 {
		o.AreaThreshold = 1e-4
	}
	if o.StartNeighbours <= 0 {
		o.StartNeighbours = 8
		if dim == 3 {
			o.StartNeighbours = 26
		}
	}
	return o
}
