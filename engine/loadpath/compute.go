package loadpath

import (
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// Case is one set of member axial forces together with the external forces
// they balance.
type Case struct {
	// ID names the case (a load case or combination id) in results.
	ID string
	// AxialForce[e] is member e's axial force, tension positive, in the
	// model's force unit; one entry per member. For a beam only its axial
	// force counts.
	AxialForce []float64
	// External[i] is the external force at node i, applied loads and
	// reactions together (member loads lumped to the nodes), with Dim
	// entries; a nil entry means no force. External may be empty (no
	// external force at all: a state of self-stress) or have one entry per
	// node.
	External [][]float64
}

// Result is the load path of each case and, when sizing, the members'
// areas and the material quantities. Per-member slices are aligned with
// the model's Members.
type Result struct {
	// Cases holds the load-path quantities of each case, in input order.
	Cases []CaseResult

	// Length[e] is member e's length.
	Length []float64
	// Force[e] is member e's axial force in its governing case, tension
	// positive.
	Force []float64
	// Governing[e] is the index in the input cases of the case that governs
	// member e: the one needing the largest area when sizing, otherwise the
	// one with the largest |N|. Ties go to the earliest case.
	Governing []int
	// GoverningCase[e] is the id of that case.
	GoverningCase []string

	// Sized reports whether the sizing fields below are filled.
	Sized bool
	// Area[e] is the cross-section area member e needs (length²).
	Area []float64
	// Volume[e] is Area[e]·Length[e] (length³).
	Volume []float64
	// Mass[e] is member e's mass in kilograms.
	Mass []float64
	// Criterion[e] is what fixed Area[e].
	Criterion []Criterion

	// Totals sums the members by the sign of their governing force.
	Totals Totals
}

// Totals holds quantities summed over the members, split by the sign of
// each member's governing axial force.
type Totals struct {
	Tension     Quantity // members with N > 0 in their governing case
	Compression Quantity // members with N < 0 in their governing case
	Unloaded    Quantity // members with no force worth sizing for (see Options.ZeroForce)
	All         Quantity // every member
	// PerFloorArea is All divided by Options.FloorArea; nil when no floor
	// area was given or when not sizing.
	PerFloorArea *Quantity
	// CarbonMissing lists the ids of materials that carry volume but have no
	// carbon factor; their members add nothing to Carbon.
	CarbonMissing []string
}

// Quantity is a set of summed quantities.
type Quantity struct {
	// LoadPath is Σ|N|·L with each member's governing force (force × length).
	LoadPath float64
	// Volume is in length³ of the model's unit (0 when not sizing).
	Volume float64
	// Mass is in kilograms (0 when not sizing).
	Mass float64
	// Carbon is the embodied carbon in kg CO2e: mass × the material's carbon
	// factor (0 when not sizing).
	Carbon float64
}

// Compute returns the load path of every case and, when opt.Size is set,
// the member areas and material quantities enveloped over the cases.
//
// It returns an *InputError (errors.Is ErrInvalidInput) when there are no
// cases, when a case's arrays do not match the model or hold non-finite
// numbers, or when an option is out of range; a *fault.Error of kind
// InvalidModel for a member of non-positive length or an unknown force
// unit; and, when sizing, a *fault.Error of kind MissingData naming every
// material that lacks a limit (or, for buckling, an elastic modulus) some
// member needs, with JSON pointers such as /materials/0/tension_limit.
// Compute panics if m is nil.
func Compute(m *model.Model, cases []Case, opt Options) (*Result, error) {
	if m == nil {
		panic("loadpath: nil model")
	}
	if err := checkCases(m, cases); err != nil {
		return nil, err
	}
	if err := opt.check(); err != nil {
		return nil, err
	}
	lengths, err := memberLengths(m)
	if err != nil {
		return nil, err
	}

	res := &Result{
		Cases:         make([]CaseResult, len(cases)),
		Length:        lengths,
		Force:         make([]float64, len(m.Members)),
		Governing:     make([]int, len(m.Members)),
		GoverningCase: make([]string, len(m.Members)),
	}
	for k := range cases {
		res.Cases[k] = caseTheorem(m, &cases[k], lengths)
	}
	zero := zeroThresholds(cases, opt)
	if opt.Size {
		if err := size(m, cases, opt, zero, res); err != nil {
			return nil, err
		}
	} else {
		for e := range m.Members {
			res.Governing[e] = largestForceCase(cases, e)
		}
	}
	addTotals(m, cases, opt, zero, res)
	return res, nil
}

// memberLengths returns each member's length in the model's length unit, or
// an error pointing at the first member whose length is not positive and
// finite.
func memberLengths(m *model.Model) ([]float64, error) {
	lengths := make([]float64, len(m.Members))
	d := m.Dim
	for e := range m.Members {
		// m.Length would copy both ends into 3-vectors; this loop runs
		// for every member of models with 10⁵ of them.
		i, j := m.Members[e].Ends[0]*d, m.Members[e].Ends[1]*d
		var ll float64
		for k := 0; k < d; k++ {
			dx := m.Coords[j+k] - m.Coords[i+k]
			ll += dx * dx
		}
		l := math.Sqrt(ll)
		if !(l > 0) || math.IsInf(l, 1) {
			return nil, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d", e),
				"member %q has length %g; a load path needs positive lengths", m.Members[e].ID, l)
		}
		lengths[e] = l
	}
	return lengths, nil
}

// addTotals fills res.Force, res.GoverningCase and res.Totals from each
// member's governing case: load path |N|·L (force × length units), and with
// sizing the volume, mass and carbon, split by tension, compression and
// unloaded, and per floor area when opt.FloorArea is set.
func addTotals(m *model.Model, cases []Case, opt Options, zero []float64, res *Result) {
	lengths := res.Length
	for e := range m.Members {
		gov := res.Governing[e]
		n := cases[gov].AxialForce[e]
		res.Force[e] = n
		res.GoverningCase[e] = cases[gov].ID
		q := Quantity{LoadPath: math.Abs(n) * lengths[e]}
		if res.Sized {
			q.Volume = res.Volume[e]
			q.Mass = res.Mass[e]
			if mat := m.Materials[m.Members[e].Material]; mat.HasCarbonFactor {
				q.Carbon = q.Mass * mat.CarbonFactor
			}
		}
		switch {
		case math.Abs(n) <= zero[gov]:
			res.Totals.Unloaded.add(q)
		case n > 0:
			res.Totals.Tension.add(q)
		default:
			res.Totals.Compression.add(q)
		}
		res.Totals.All.add(q)
	}
	if res.Sized {
		res.Totals.CarbonMissing = carbonMissing(m, res.Volume)
		if opt.FloorArea > 0 {
			a := res.Totals.All
			res.Totals.PerFloorArea = &Quantity{
				LoadPath: a.LoadPath / opt.FloorArea,
				Volume:   a.Volume / opt.FloorArea,
				Mass:     a.Mass / opt.FloorArea,
				Carbon:   a.Carbon / opt.FloorArea,
			}
		}
	}
}

func (q *Quantity) add(o Quantity) {
	q.LoadPath += o.LoadPath
	q.Volume += o.Volume
	q.Mass += o.Mass
	q.Carbon += o.Carbon
}

func checkCases(m *model.Model, cases []Case) error {
	if len(cases) == 0 {
		return &InputError{Path: "/cases", Message: "no case to compute the load path of"}
	}
	for k := range cases {
		c := &cases[k]
		if len(c.AxialForce) != len(m.Members) {
			return &InputError{Path: fmt.Sprintf("/cases/%d/axial_force", k),
				Message: fmt.Sprintf("case %q has %d axial forces for %d members", c.ID, len(c.AxialForce), len(m.Members))}
		}
		for e, n := range c.AxialForce {
			if math.IsNaN(n) || math.IsInf(n, 0) {
				return &InputError{Path: fmt.Sprintf("/cases/%d/axial_force/%d", k, e),
					Message: fmt.Sprintf("axial force of member %q in case %q is not finite", m.Members[e].ID, c.ID)}
			}
		}
		if len(c.External) != 0 && len(c.External) != m.NodeCount() {
			return &InputError{Path: fmt.Sprintf("/cases/%d/external", k),
				Message: fmt.Sprintf("case %q has external forces for %d nodes; the model has %d", c.ID, len(c.External), m.NodeCount())}
		}
		for i, f := range c.External {
			if f == nil {
				continue
			}
			if len(f) != m.Dim {
				return &InputError{Path: fmt.Sprintf("/cases/%d/external/%d", k, i),
					Message: fmt.Sprintf("external force at node %q has %d components; the model is %dD", m.NodeIDs[i], len(f), m.Dim)}
			}
			for _, v := range f {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return &InputError{Path: fmt.Sprintf("/cases/%d/external/%d", k, i),
						Message: fmt.Sprintf("external force at node %q in case %q is not finite", m.NodeIDs[i], c.ID)}
				}
			}
		}
	}
	return nil
}

// zeroThresholds returns, per case, the force magnitude at or below which a
// member counts as unloaded.
func zeroThresholds(cases []Case, opt Options) []float64 {
	rel := opt.ZeroForce
	if rel == 0 {
		rel = DefaultZeroForce
	}
	out := make([]float64, len(cases))
	for k := range cases {
		var big float64
		for _, n := range cases[k].AxialForce {
			big = math.Max(big, math.Abs(n))
		}
		out[k] = rel * big
	}
	return out
}

func carbonMissing(m *model.Model, volume []float64) []string {
	seen := make([]bool, len(m.Materials))
	var out []string
	for e, v := range volume {
		i := m.Members[e].Material
		if v > 0 && !m.Materials[i].HasCarbonFactor && !seen[i] {
			seen[i] = true
			out = append(out, m.Materials[i].ID)
		}
	}
	return out
}
