package envelope

import (
	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// Bound is an extreme value over the enveloped cases and the case that
// governs it.
type Bound struct {
	// Value is the extreme value, in the units and with the sign
	// convention of the result it bounds (tension positive).
	Value float64
	// Case is the index in Envelope.Cases of the governing case: the
	// first case in that order that reaches Value (whatever the order in
	// which the cases were added); −1 before any case is added.
	Case int
	// At is, for a value along a member, its distance from the member's
	// first end (length units); 0 otherwise.
	At float64
}

// Interval is the largest and smallest value of one result.
type Interval struct {
	Max, Min Bound
}

// unset is an interval no case has reached yet.
var unset = Interval{Max: Bound{Case: -1}, Min: Bound{Case: -1}}

// see folds value v of case c (at distance at) into iv. A value beyond a
// bound replaces it, and so does an equal one of an earlier case, so the
// envelope does not depend on the order in which cases are added.
func (iv *Interval) see(v float64, c int, at float64) {
	if b := &iv.Max; b.Case < 0 || v > b.Value || v == b.Value && c < b.Case {
		*b = Bound{Value: v, Case: c, At: at}
	}
	if b := &iv.Min; b.Case < 0 || v < b.Value || v == b.Value && c < b.Case {
		*b = Bound{Value: v, Case: c, At: at}
	}
}

// rows returns n unset intervals.
func rows(n int) []Interval {
	out := make([]Interval, n)
	for i := range out {
		out[i] = unset
	}
	return out
}

// Node is the envelope of one node's displacements.
type Node struct {
	// Displacement holds per translation (Dim entries, global axes,
	// length units) its range.
	Displacement []Interval
	// Rotation holds per rotation (radians; one about z in 2D, three in
	// 3D) its range; nil for a node without rotational freedom.
	Rotation []Interval
}

// Support is the envelope of one support's reaction (what it exerts on
// its node, global axes).
type Support struct {
	// Force has Dim entries and Moment one in 2D and three in 3D, like
	// stiffness.Reaction.
	Force, Moment []Interval
}

// Member is the envelope of one member's results.
type Member struct {
	// Axial is the range of the axial force along the member (tension
	// positive): for a beam the exact extremes along it, for a bar the
	// larger and smaller of its end values.
	Axial Interval
	// EndForces holds per entry of stiffness.CaseResult.EndForces (the
	// forces the nodes exert on the member, local axes) its range.
	EndForces []Interval
	// Utilisation is the range of the member's utilisation over the
	// cases in which it was checked. It is not a result to build from
	// when Unchecked ≥ 0.
	Utilisation Interval
	// Unchecked is the index of the first case (in the order of
	// Envelope.Cases) in which the member's checks could not all be made
	// (stiffness.CaseResult.Utilisation −1), or −1 when every case checked
	// it.
	Unchecked int
	// Along holds, for a beam, the range of each internal force along the
	// member, indexed by stiffness.RangeAxial … RangeMomentZ (the 3D ones
	// zero in 2D), exact as stiffness finds them; nil for a bar.
	Along []Interval
}

// Envelope is the running envelope of the cases added so far. Its slices
// are aligned with the model's nodes, supports and members. It is not
// safe for concurrent use.
type Envelope struct {
	// Cases holds the ids of the cases to envelope; a Bound's Case
	// indexes it.
	Cases    []string
	Nodes    []Node
	Supports []Support
	Members  []Member

	laidOut bool // the rows whose length comes from a case are made
}

// New returns an empty envelope for the results of m in the cases called
// cases (ids, kept as given).
func New(m *model.Model, cases []string) *Envelope {
	_, rotational := m.DOFsPerNode()
	env := &Envelope{Cases: cases, Nodes: make([]Node, m.NodeCount()), Supports: make([]Support, len(m.Supports)), Members: make([]Member, len(m.Members))}
	// One backing array per kind of row keeps the allocations few on a
	// large model.
	nodal := rows(m.NodeCount() * m.Dim)
	for n := range env.Nodes {
		env.Nodes[n].Displacement, nodal = nodal[:m.Dim:m.Dim], nodal[m.Dim:]
	}
	reaction := rows(len(m.Supports) * (m.Dim + rotational))
	for s := range env.Supports {
		env.Supports[s].Force, reaction = reaction[:m.Dim:m.Dim], reaction[m.Dim:]
		env.Supports[s].Moment, reaction = reaction[:rotational:rotational], reaction[rotational:]
	}
	beams := 0
	for _, mem := range m.Members {
		if mem.Kind == model.Beam {
			beams++
		}
	}
	along := rows(beams * stiffness.RangeCount)
	for e, mem := range m.Members {
		env.Members[e].Axial, env.Members[e].Utilisation, env.Members[e].Unchecked = unset, unset, -1
		if mem.Kind == model.Beam {
			env.Members[e].Along, along = along[:stiffness.RangeCount:stiffness.RangeCount], along[stiffness.RangeCount:]
		}
	}
	return env
}

// rotationRows gives the nodes with rotational freedom in c (every case
// of a model has the same) their rotation rows, in one backing array.
func (env *Envelope) rotationRows(c *stiffness.CaseResult) {
	total := 0
	for _, r := range c.Rotations {
		total += len(r)
	}
	spare := rows(total)
	for n, r := range c.Rotations {
		if len(r) > 0 {
			env.Nodes[n].Rotation, spare = spare[:len(r):len(r)], spare[len(r):]
		}
	}
}

// Add folds the results of case k (an index into Cases) into the
// envelope. Every case added must come from a solve of the model the
// envelope was made for; the cases may come in any order, each once.
func (env *Envelope) Add(k int, c *stiffness.CaseResult) {
	if !env.laidOut {
		env.rotationRows(c)
		env.endForceRows(c)
		env.laidOut = true
	}
	for n := range env.Nodes {
		node := &env.Nodes[n]
		for i, v := range c.Displacements[n] {
			node.Displacement[i].see(v, k, 0)
		}
		for i, v := range c.Rotations[n] {
			node.Rotation[i].see(v, k, 0)
		}
	}
	for s := range env.Supports {
		sup, re := &env.Supports[s], &c.Reactions[s]
		for i, v := range re.Force {
			sup.Force[i].see(v, k, 0)
		}
		for i, v := range re.Moment {
			sup.Moment[i].see(v, k, 0)
		}
	}
	for e := range env.Members {
		env.addMember(&env.Members[e], c, e, k)
	}
}

// addMember folds member e of case k into mem.
func (env *Envelope) addMember(mem *Member, c *stiffness.CaseResult, e, k int) {
	var scratch stiffness.MemberResult
	r := c.Member(e, &scratch)
	axial := r.Ranges[stiffness.RangeAxial]
	mem.Axial.see(axial.Max.Value, k, axial.Max.At)
	mem.Axial.see(axial.Min.Value, k, axial.Min.At)
	for i, v := range c.EndForces[e] {
		mem.EndForces[i].see(v, k, 0)
	}
	if u := c.Utilisation[e]; u < 0 {
		if mem.Unchecked < 0 || k < mem.Unchecked {
			mem.Unchecked = k
		}
	} else {
		mem.Utilisation.see(u, k, 0)
	}
	for q := range mem.Along {
		rg := r.Ranges[q]
		mem.Along[q].see(rg.Max.Value, k, rg.Max.At)
		mem.Along[q].see(rg.Min.Value, k, rg.Min.At)
	}
}

// endForceRows lays out every member's end-force rows, as long as the
// first case's, in one backing array.
func (env *Envelope) endForceRows(c *stiffness.CaseResult) {
	total := 0
	for e := range env.Members {
		total += len(c.EndForces[e])
	}
	spare := rows(total)
	for e := range env.Members {
		n := len(c.EndForces[e])
		env.Members[e].EndForces, spare = spare[:n:n], spare[n:]
	}
}
