package layout

import (
	"fmt"
	"math"
	"sort"

	"gusset/engine/fault"
)

// Layout is an optimal pin-jointed layout. Nodes, members and supports are
// numbered afresh: only the nodes that members reach are kept, and chains of
// collinear members through unloaded, unsupported nodes are merged into one
// member. Lengths are in the problem's length unit, forces in its force
// unit, areas in length², tension positive.
type Layout struct {
	Nodes    [][2]float64
	Members  []Member
	Supports []Support // Node is set; At repeats the node's position
	Cases    []CaseResult
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
	Force [2]float64
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
	Added                               int // members added after the first program
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

// finish filters the program's solution, merges collinear chains, restores
// equilibrium on what is kept and fills in the results.
func (st *setting) finish(members []int, forces [][]float64, fixed [][2]bool, loads [][][2]float64, caseIDs []string, opt Options, stats Stats) (*Layout, error) {
	threshold := opt.AreaThreshold
	for attempt := 0; attempt < 6; attempt++ {
		out, ok := st.tryFinish(members, forces, fixed, loads, caseIDs, threshold, stats)
		if ok {
			return out, nil
		}
		threshold /= 100
	}
	return nil, fault.New(fault.NotInEquilibrium, "the optimal layout could not be brought into equilibrium after filtering its members")
}

func (st *setting) tryFinish(members []int, forces [][]float64, fixed [][2]bool, loads [][][2]float64, caseIDs []string, threshold float64, stats Stats) (*Layout, bool) {
	K := len(forces)
	areaOf := func(q []float64) float64 {
		a := 0.0
		for _, f := range q {
			a = max(a, f/st.tension, -f/st.compr)
		}
		return a
	}
	largest := 0.0
	var drafts []*draftMember
	for i, k := range members {
		q := make([]float64, K)
		for c := range q {
			q[c] = forces[c][i]
		}
		cand := st.g.candidates[k]
		drafts = append(drafts, &draftMember{a: int(cand.a), b: int(cand.b), forces: q, alive: true})
		largest = max(largest, areaOf(q))
	}
	var kept []*draftMember
	for _, d := range drafts {
		if areaOf(d.forces) >= threshold*largest && areaOf(d.forces) > 0 {
			kept = append(kept, d)
		}
	}
	kept = st.mergeChains(kept, fixed, loads)

	// Number the nodes the kept members reach.
	newIndex := make(map[int]int)
	var nodes [][2]float64
	var oldOf []int
	use := func(old int) int {
		if i, ok := newIndex[old]; ok {
			return i
		}
		newIndex[old] = len(nodes)
		nodes = append(nodes, st.g.nodes[old])
		oldOf = append(oldOf, old)
		return len(nodes) - 1
	}
	out := &Layout{TensionLimit: st.tension, CompressionLimit: st.compr, Stats: stats}
	out.Stats.AreaThreshold = threshold
	for _, d := range kept {
		out.Members = append(out.Members, Member{Ends: [2]int{use(d.a), use(d.b)}, Forces: d.forces})
	}
	for k := range loads {
		for old, f := range loads[k] {
			if f != [2]float64{} {
				if _, ok := newIndex[old]; !ok {
					return nil, false // a load no kept member carries
				}
			}
		}
	}
	out.Nodes = nodes
	for i := range out.Members {
		m := &out.Members[i]
		p, q := nodes[m.Ends[0]], nodes[m.Ends[1]]
		m.Length = math.Hypot(q[0]-p[0], q[1]-p[1])
	}
	nodeFixed := make([][2]bool, len(nodes))
	for i, old := range oldOf {
		nodeFixed[i] = fixed[old]
		if fixed[old][0] || fixed[old][1] {
			out.Supports = append(out.Supports, Support{Node: i, At: nodes[i], Fix: fixed[old]})
		}
	}
	eq := newEquilibrium(nodes, out.Members, nodeFixed)
	for k := range loads {
		f := make([][2]float64, len(nodes))
		cr := CaseResult{ID: caseIDs[k]}
		for i, old := range oldOf {
			f[i] = loads[k][old]
			if f[i] != [2]float64{} {
				cr.Loads = append(cr.Loads, NodalForce{Node: i, Force: f[i]})
			}
		}
		q := make([]float64, len(out.Members))
		for i := range q {
			q[i] = out.Members[i].Forces[k]
		}
		residual := eq.restore(q, f)
		if !(residual <= 1e-10) {
			return nil, false
		}
		for i := range q {
			out.Members[i].Forces[k] = q[i]
		}
		cr.EquilibriumResidual = residual
		st.loadPath(&cr, nodes, out.Members, k, f, nodeFixed)
		out.Cases = append(out.Cases, cr)
	}
	for i := range out.Members {
		m := &out.Members[i]
		m.Area = areaOf(m.Forces)
		out.Volume += m.Length * m.Area
		out.Objective += (m.Length + st.jointCost) * m.Area
	}
	for _, c := range out.Cases {
		for _, v := range []float64{c.LoadPath, c.LoadPathConstant, c.MaxwellResidual, c.EquilibriumResidual} {
			if !finite(v) {
				return nil, false
			}
		}
	}
	return out, true
}

// mergeChains joins two collinear members that meet at an unloaded,
// unsupported node reached by no other member; equilibrium there makes
// their forces equal, so the joined member carries their mean.
func (st *setting) mergeChains(kept []*draftMember, fixed [][2]bool, loads [][][2]float64) []*draftMember {
	incident := make(map[int][]*draftMember)
	for _, d := range kept {
		incident[d.a] = append(incident[d.a], d)
		incident[d.b] = append(incident[d.b], d)
	}
	loaded := func(v int) bool {
		for k := range loads {
			if loads[k][v] != [2]float64{} {
				return true
			}
		}
		return fixed[v][0] || fixed[v][1]
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
		px, pv, py := st.g.nodes[x], st.g.nodes[v], st.g.nodes[y]
		d1 := [2]float64{pv[0] - px[0], pv[1] - px[1]}
		d2 := [2]float64{py[0] - pv[0], py[1] - pv[1]}
		l1, l2 := math.Hypot(d1[0], d1[1]), math.Hypot(d2[0], d2[1])
		if math.Abs(d1[0]*d2[1]-d1[1]*d2[0]) > 1e-9*l1*l2 || d1[0]*d2[0]+d1[1]*d2[1] <= 0 {
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
func (st *setting) loadPath(cr *CaseResult, nodes [][2]float64, members []Member, k int, f [][2]float64, fixed [][2]bool) {
	// Internal force sums per node: (B N)_j, the force the members need
	// from outside at node j.
	need := make([][2]float64, len(nodes))
	for _, m := range members {
		p, q := nodes[m.Ends[0]], nodes[m.Ends[1]]
		e := [2]float64{(q[0] - p[0]) / m.Length, (q[1] - p[1]) / m.Length}
		n := m.Forces[k]
		for c := 0; c < 2; c++ {
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
		var r [2]float64
		for c := 0; c < 2; c++ {
			if fixed[j][c] {
				r[c] = need[j][c] - f[j][c]
			}
		}
		if fixed[j][0] || fixed[j][1] {
			cr.Reactions = append(cr.Reactions, NodalForce{Node: j, Force: r})
		}
		for c := 0; c < 2; c++ {
			cr.LoadPathConstant += (f[j][c] + r[c]) * nodes[j][c]
		}
	}
	cr.MaxwellResidual = cr.TensionPath - cr.CompressionPath - cr.LoadPathConstant
}

// String returns a one-line summary.
func (l *Layout) String() string {
	return fmt.Sprintf("layout: %d nodes, %d members, volume %.6g", len(l.Nodes), len(l.Members), l.Volume)
}
