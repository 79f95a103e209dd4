package layout

import (
	"fmt"
	"sort"

	"gusset/engine/fault"
)

// Layout is an optimal pin-jointed layout. Nodes, members and supports are
// numbered afresh: only the nodes that members reach are kept, and chains of
// collinear members through unloaded, unsupported nodes are merged into one
// member. Lengths are in the problem's length unit, forces in its force
// unit, areas in length², tension positive. Points have three
// coordinates; in the plane (Dim 2) the third is 0.
type Layout struct {
	Dim      int // 2 or 3
	Nodes    [][3]float64
	Members  []Member
	Supports []Support // Node is set; At repeats the node's position
	Cases    []CaseResult
	// DomainEdges and HoleEdges are the edges of the design domain's
	// boundary and of its holes (segments, for drawing); empty for the
	// caller's own nodes without a domain.
	DomainEdges, HoleEdges [][2][3]float64
	// Volume is Σ L_i a_i over the kept members; Objective adds the joint
	// cost, Σ (L_i + JointCost) a_i.
	Volume, Objective float64
	// TensionLimit and CompressionLimit are the stresses the areas were
	// sized for.
	TensionLimit, CompressionLimit float64
	Stats                          Stats
}

// Member is a member of a layout: its end nodes, length, area
// a = max over cases of (N/σ_t, −N/σ_c), and axial force per case.
type Member struct {
	Ends   [2]int
	Length float64
	Area   float64
	Forces []float64
}

// NodalForce is a force at a layout node.
type NodalForce struct {
	Node  int
	Force [3]float64
}

// CaseResult holds one load case's loads, reactions and load-path figures.
type CaseResult struct {
	ID        string
	Loads     []NodalForce
	Reactions []NodalForce
	// LoadPath is Σ|N_i|L_i; TensionPath (Z_T) and CompressionPath (Z_C) are
	// its parts over tension and compression members.
	LoadPath, TensionPath, CompressionPath float64
	// LoadPathConstant is M = Σ F·r over the loads and reactions, and
	// MaxwellResidual is Z_T − Z_C − M, zero to round-off by Maxwell's
	// theorem (Maxwell 1870).
	LoadPathConstant, MaxwellResidual float64
	// EquilibriumResidual is max |B N − f| over the free freedoms divided
	// by (max |N| + max |f|).
	EquilibriumResidual float64
}

// Stats describes the solution process.
type Stats struct {
	Nodes      int // nodes of the ground structure
	Candidates int // candidate members considered
	// Iterations counts the linear programs solved (member-adding
	// iterations); InteriorPointIterations sums their interior-point
	// iterations.
	Iterations, InteriorPointIterations int
	MembersInProgram                    int // members in the final program
	// WarmStarts counts the programs whose interior-point solve started
	// from the last program's central iterate.
	WarmStarts int
	Added      int // members added after the first program
	// OptimalityGap is the largest relative violation of the dual limits by
	// a candidate outside the final program, max(0, ratio − 1): the volume
	// found is within this fraction of the optimum over all candidates.
	OptimalityGap float64
	// AreaThreshold is the relative area below which members were dropped.
	AreaThreshold float64
}

type draftMember struct {
	a, b   int
	forces []float64
	alive  bool
}

// outcome is what finish needs of a solved problem besides the setting.
type outcome struct {
	members []candidate // the final program's members
	forces  [][]float64 // per case, per member
	fixed   [][3]bool   // per ground-structure node
	loads   [][]vec     // per case, per ground-structure node
	caseIDs []string
	stats   Stats
}

// finish filters the program's solution, merges collinear chains, restores
// equilibrium on what is kept and fills in the results. When equilibrium
// cannot be restored on the kept members, the area threshold is lowered
// and the filter tried again.
func (st *setting) finish(res outcome, opt Options) (*Layout, error) {
	threshold := opt.AreaThreshold
	for attempt := 0; attempt < 6; attempt++ {
		out, ok := st.tryFinish(res, threshold)
		if ok {
			return out, nil
		}
		threshold /= 100
	}
	return nil, fault.New(fault.NotInEquilibrium, "the optimal layout could not be brought into equilibrium after filtering its members")
}

func (st *setting) areaOf(q []float64) float64 {
	a := 0.0
	for _, f := range q {
		a = max(a, f/st.tension, -f/st.compr)
	}
	return a
}

// keep returns the members whose area is at least threshold times the
// largest, with chains of collinear members merged.
func (st *setting) keep(res outcome, threshold float64) []*draftMember {
	K := len(res.forces)
	largest := 0.0
	drafts := make([]*draftMember, 0, len(res.members))
	for i, c := range res.members {
		q := make([]float64, K)
		for k := range q {
			q[k] = res.forces[k][i]
		}
		drafts = append(drafts, &draftMember{a: int(c.a), b: int(c.b), forces: q, alive: true})
		largest = max(largest, st.areaOf(q))
	}
	var kept []*draftMember
	for _, d := range drafts {
		if a := st.areaOf(d.forces); a >= threshold*largest && a > 0 {
			kept = append(kept, d)
		}
	}
	return st.mergeChains(kept, res.fixed, res.loads)
}

// tryFinish builds the layout from the members kept at threshold; it fails
// when a load is left without a member or equilibrium cannot be restored.
func (st *setting) tryFinish(res outcome, threshold float64) (*Layout, bool) {
	kept := st.keep(res, threshold)
	// Number the nodes the kept members reach.
	newIndex := make(map[int]int)
	var oldOf []int
	out := &Layout{Dim: st.dim, TensionLimit: st.tension, CompressionLimit: st.compr, Stats: res.stats}
	out.Stats.AreaThreshold = threshold
	use := func(old int) int {
		if i, ok := newIndex[old]; ok {
			return i
		}
		newIndex[old] = len(out.Nodes)
		out.Nodes = append(out.Nodes, st.g.nodes[old])
		oldOf = append(oldOf, old)
		return len(out.Nodes) - 1
	}
	for _, d := range kept {
		m := Member{Ends: [2]int{use(d.a), use(d.b)}, Forces: d.forces, Length: st.g.length(candidate{int32(d.a), int32(d.b)})}
		out.Members = append(out.Members, m)
	}
	for k := range res.loads {
		for old, f := range res.loads[k] {
			if _, ok := newIndex[old]; f != (vec{}) && !ok {
				return nil, false // a load no kept member carries
			}
		}
	}
	nodeFixed := make([][3]bool, len(out.Nodes))
	for i, old := range oldOf {
		nodeFixed[i] = res.fixed[old]
		if res.fixed[old] != ([3]bool{}) {
			out.Supports = append(out.Supports, Support{Node: i, At: out.Nodes[i], Fix: res.fixed[old]})
		}
	}
	eq := newEquilibrium(st.dim, out.Nodes, out.Members, nodeFixed)
	for k := range res.loads {
		f := make([]vec, len(out.Nodes))
		for i, old := range oldOf {
			f[i] = res.loads[k][old]
		}
		cr, ok := st.balanceCase(eq, out, k, f, nodeFixed)
		if !ok {
			return nil, false
		}
		cr.ID = res.caseIDs[k]
		out.Cases = append(out.Cases, cr)
	}
	for i := range out.Members {
		m := &out.Members[i]
		m.Area = st.areaOf(m.Forces)
		out.Volume += m.Length * m.Area
		out.Objective += (m.Length + st.jointCost) * m.Area
	}
	return out, true
}

// balanceCase restores equilibrium of case k on the layout's members
// (overwriting their forces of that case) and returns the case's loads,
// reactions and load-path figures; it fails when the residual stays above
// 1e-10 or a figure is not finite.
func (st *setting) balanceCase(eq *equilibrium, out *Layout, k int, f []vec, fixed [][3]bool) (CaseResult, bool) {
	var cr CaseResult
	for i := range f {
		if f[i] != (vec{}) {
			cr.Loads = append(cr.Loads, NodalForce{Node: i, Force: f[i]})
		}
	}
	q := make([]float64, len(out.Members))
	for i := range q {
		q[i] = out.Members[i].Forces[k]
	}
	residual := eq.restore(q, f)
	if !(residual <= 1e-10) {
		return cr, false
	}
	for i := range q {
		out.Members[i].Forces[k] = q[i]
	}
	cr.EquilibriumResidual = residual
	loadPath(&cr, out.Nodes, out.Members, k, f, fixed)
	for _, v := range []float64{cr.LoadPath, cr.LoadPathConstant, cr.MaxwellResidual, cr.EquilibriumResidual} {
		if !finite(v) {
			return cr, false
		}
	}
	return cr, true
}

// mergeChains joins two collinear members that meet at an unloaded,
// unsupported node reached by no other member; equilibrium there makes
// their forces equal, so the joined member carries their mean.
func (st *setting) mergeChains(kept []*draftMember, fixed [][3]bool, loads [][]vec) []*draftMember {
	incident := make(map[int][]*draftMember)
	for _, d := range kept {
		incident[d.a] = append(incident[d.a], d)
		incident[d.b] = append(incident[d.b], d)
	}
	loaded := func(v int) bool {
		for k := range loads {
			if loads[k][v] != (vec{}) {
				return true
			}
		}
		return fixed[v] != [3]bool{}
	}
	alive := func(v int) []*draftMember {
		var list []*draftMember
		for _, d := range incident[v] {
			if d.alive {
				list = append(list, d)
			}
		}
		incident[v] = list
		return list
	}
	other := func(d *draftMember, v int) int {
		if d.a == v {
			return d.b
		}
		return d.a
	}
	work := make([]int, 0, len(incident))
	for v := range incident {
		work = append(work, v)
	}
	sort.Ints(work) // map order is random; results must not be
	for len(work) > 0 {
		v := work[len(work)-1]
		work = work[:len(work)-1]
		list := alive(v)
		if len(list) != 2 || loaded(v) {
			continue
		}
		x, y := other(list[0], v), other(list[1], v)
		d1 := sub(st.g.nodes[v], st.g.nodes[x])
		d2 := sub(st.g.nodes[y], st.g.nodes[v])
		if norm(cross(d1, d2)) > 1e-9*norm(d1)*norm(d2) || dot(d1, d2) <= 0 {
			continue
		}
		q := make([]float64, len(list[0].forces))
		for c := range q {
			q[c] = (list[0].forces[c] + list[1].forces[c]) / 2
		}
		list[0].alive, list[1].alive = false, false
		joined := &draftMember{a: min(x, y), b: max(x, y), forces: q, alive: true}
		kept = append(kept, joined)
		incident[x] = append(incident[x], joined)
		incident[y] = append(incident[y], joined)
		work = append(work, x, y)
	}
	var out []*draftMember
	for _, d := range kept {
		if d.alive {
			out = append(out, d)
		}
	}
	return out
}

// loadPath fills in the load path, reactions and Maxwell's residual of
// case k.
func loadPath(cr *CaseResult, nodes []vec, members []Member, k int, f []vec, fixed [][3]bool) {
	// Internal force sums per node: (B N)_j, the force the members need
	// from outside at node j.
	need := make([]vec, len(nodes))
	for _, m := range members {
		e := scaled(sub(nodes[m.Ends[1]], nodes[m.Ends[0]]), 1/m.Length)
		n := m.Forces[k]
		for c := 0; c < 3; c++ {
			need[m.Ends[0]][c] -= e[c] * n
			need[m.Ends[1]][c] += e[c] * n
		}
		if n > 0 {
			cr.TensionPath += n * m.Length
		} else {
			cr.CompressionPath -= n * m.Length
		}
	}
	cr.LoadPath = cr.TensionPath + cr.CompressionPath
	for j := range nodes {
		var r vec
		for c := 0; c < 3; c++ {
			if fixed[j][c] {
				r[c] = need[j][c] - f[j][c]
			}
		}
		if fixed[j] != [3]bool{} {
			cr.Reactions = append(cr.Reactions, NodalForce{Node: j, Force: r})
		}
		for c := 0; c < 3; c++ {
			cr.LoadPathConstant += (f[j][c] + r[c]) * nodes[j][c]
		}
	}
	cr.MaxwellResidual = cr.TensionPath - cr.CompressionPath - cr.LoadPathConstant
}

// String returns a one-line summary.
func (l *Layout) String() string {
	return fmt.Sprintf("layout: %d nodes, %d members, volume %.6g", len(l.Nodes), len(l.Members), l.Volume)
}
