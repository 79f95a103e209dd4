package stiffness

import (
	"math"

	"gusset/engine/model"
)

// recoverCase turns the displacements u (every global freedom) into the
// case's results, sharing the members of a large model among up to workers
// goroutines. Its phases: lay out the result, recover the members (their
// forces on the freedoms gathered in member order), the reactions, the
// external forces and balance, and the equilibrium residual. along says
// how much to work out along each member (Options.Recovery).
func recoverCase(m *model.Model, nb *numbering, sys *system, ls *loadSet, u []float64, workers int, along recovery) (*CaseResult, error) {
	nb.fromAxes(u) // u arrives with inclined nodes in their supports' axes
	cr := newCaseResult(m, nb, ls, u, along)
	nodeForce, equivalent := recoverMembers(m, nb, ls, u, cr, workers)
	reactions(m, nb, ls, u, cr, nodeForce)
	externalForces(m, nb, ls, cr, equivalent)
	cr.Residual = residual(nb, sys, nb.inAxes(ls.nodal), nb.inAxes(u), nb.inAxes(nodeForce), nb.inAxes(equivalent))
	summarise(m, cr, along.forcesOnly)
	if !cr.finite() {
		return nil, overflowError(m)
	}
	return cr, nil
}

// newCaseResult allocates a case's result, whose loads are ls, with its
// displacements copied from u. The rows of the per-node and per-member
// arrays share one backing array each: one allocation instead of one per
// node or member. The members' results along their length and checks are
// left out (nil) when along.forcesOnly.
func newCaseResult(m *model.Model, nb *numbering, ls *loadSet, u []float64, along recovery) *CaseResult {
	_, rotational := m.DOFsPerNode()
	cr := &CaseResult{
		Displacements: make([][]float64, m.NodeCount()),
		Rotations:     make([][]float64, m.NodeCount()),
		AxialForce:    make([]float64, len(m.Members)),
		EndForces:     make([][]float64, len(m.Members)),
		Reactions:     make([]Reaction, len(m.Supports)),
		Stress:        make([]float64, len(m.Members)),
		LoadSum:       make([]float64, m.Dim),
		ReactionSum:   make([]float64, m.Dim),
	}
	if !along.forcesOnly {
		cr.Utilisation = make([]float64, len(m.Members))
		cr.members = newCaseMembers(m, ls)
	}
	nodal := make([]float64, 0, nb.total)
	for n := range cr.Displacements {
		first := nb.first[n]
		cr.Displacements[n] = rowOf(&nodal, u[first:first+m.Dim])
		if nb.rotational[n] {
			cr.Rotations[n] = rowOf(&nodal, u[first+m.Dim:first+m.Dim+rotational])
		}
	}
	endOff := make([]int, len(m.Members)+1)
	for e, mem := range m.Members {
		endOff[e+1] = endOff[e] + 2*memberFreedomsPerNode(m, mem)
	}
	ends := make([]float64, endOff[len(m.Members)])
	for e := range m.Members {
		cr.EndForces[e] = ends[endOff[e]:endOff[e+1]:endOff[e+1]]
	}
	layoutStations(m, cr, along.stations)
	return cr
}

// recoverMembers recovers every member into cr and returns nodeForce, the
// sum over members of the forces they receive from each freedom (global
// axes), and equivalent, the equivalent nodal loads of the member loads.
// Both are summed in member order whatever the workers, so the result does
// not depend on them.
func recoverMembers(m *model.Model, nb *numbering, ls *loadSet, u []float64, cr *CaseResult, workers int) (nodeForce, equivalent []float64) {
	nodeForce = make([]float64, nb.total)
	equivalent = make([]float64, nb.total)
	if workers <= 1 || len(m.Members) < recoverParallel {
		var el element
		var sc memberScratch
		var fg, fe [12]float64
		for e := range m.Members {
			loaded := recoverMember(m, nb, ls, u, cr, e, &el, &sc, fg[:], fe[:])
			for i := range el.size {
				nodeForce[el.dofs[i]] += fg[i]
				if loaded {
					equivalent[el.dofs[i]] += fe[i]
				}
			}
		}
		return nodeForce, equivalent
	}
	// Members in chunks over the workers, their nodal forces kept per
	// member and gathered afterwards in member order. They are packed
	// like the end forces (as many as the member has freedoms, not 12),
	// and those of member loads are kept only when the case has some.
	const chunk = 2048
	off := make([]int, len(m.Members)+1)
	for e := range m.Members {
		off[e+1] = off[e] + len(cr.EndForces[e])
	}
	fg := make([]float64, off[len(m.Members)])
	var fe []float64
	if ls.hasMember {
		fe = make([]float64, off[len(m.Members)])
	}
	loaded := make([]bool, len(m.Members))
	chunks := (len(m.Members) + chunk - 1) / chunk
	_ = parallel(workers, chunks, func(c int) error {
		var el element
		var sc memberScratch
		var unused [12]float64
		for e := c * chunk; e < min((c+1)*chunk, len(m.Members)); e++ {
			fee := unused[:]
			if fe != nil {
				fee = fe[off[e]:off[e+1]]
			}
			loaded[e] = recoverMember(m, nb, ls, u, cr, e, &el, &sc, fg[off[e]:off[e+1]], fee)
		}
		return nil
	}, nil)
	var dofs [12]int
	for e, mem := range m.Members {
		for i, f := range memberFreedoms(m, nb, mem, &dofs) {
			nodeForce[f] += fg[off[e]+i]
			if loaded[e] {
				equivalent[f] += fe[off[e]+i]
			}
		}
	}
	return nodeForce, equivalent
}

// reactions sets each support's reaction: a support holds a fixed freedom
// with whatever the members ask beyond the load applied there; a spring
// pulls back with −k·u.
func reactions(m *model.Model, nb *numbering, ls *loadSet, u []float64, cr *CaseResult, nodeForce []float64) {
	_, rotational := m.DOFsPerNode()
	for f := range nb.total {
		si := nb.supportOf[f]
		if si < 0 || nb.inclined(nb.node[f]) {
			continue
		}
		var r float64
		if nb.equation[f] < 0 {
			r = nodeForce[f] - ls.nodal[f]
		} else {
			r = -nb.spring[f] * u[f]
		}
		c := nb.component[f]
		if c < m.Dim {
			if cr.Reactions[si].Force == nil {
				cr.Reactions[si].Force = make([]float64, m.Dim)
			}
			cr.Reactions[si].Force[c] += r
			continue
		}
		if cr.Reactions[si].Moment == nil {
			cr.Reactions[si].Moment = make([]float64, rotational)
		}
		if m.Dim == 2 {
			cr.Reactions[si].Moment[0] += r
		} else {
			cr.Reactions[si].Moment[c-model.RX] += r
		}
	}
	inclinedReactions(m, nb, ls, u, cr, nodeForce)
	for si := range cr.Reactions {
		if cr.Reactions[si].Force == nil {
			cr.Reactions[si].Force = make([]float64, m.Dim)
		}
		if cr.Reactions[si].Moment == nil {
			cr.Reactions[si].Moment = make([]float64, rotational)
		}
		for c := range m.Dim {
			cr.ReactionSum[c] += cr.Reactions[si].Force[c]
		}
	}
}

// externalForces sets the external force at each node (loads, equivalent
// member loads and reactions), the load and reaction sums and the balance
// error.
func externalForces(m *model.Model, nb *numbering, ls *loadSet, cr *CaseResult, equivalent []float64) {
	cr.External = make([][]float64, m.NodeCount())
	external := make([]float64, m.Dim*m.NodeCount())
	for n := range cr.External {
		cr.External[n] = external[n*m.Dim : (n+1)*m.Dim : (n+1)*m.Dim]
	}
	for f := range nb.total {
		if c := nb.component[f]; c < m.Dim {
			cr.LoadSum[c] += ls.nodal[f] + equivalent[f]
			cr.External[nb.node[f]][c] += ls.nodal[f] + equivalent[f]
		}
	}
	for si, r := range cr.Reactions {
		for c := range m.Dim {
			cr.External[m.Supports[si].Node][c] += r.Force[c]
		}
	}
	// The scale is the larger of the resultant load and the sum of the
	// reactions' magnitudes, so that self-equilibrated reactions (a
	// settlement with no load) are measured against their own size.
	var balance, loadNorm, reactionScale float64
	for c := range m.Dim {
		balance += sq(cr.LoadSum[c] + cr.ReactionSum[c])
		loadNorm += sq(cr.LoadSum[c])
	}
	for _, r := range cr.Reactions {
		var rr float64
		for _, v := range r.Force {
			rr += v * v
		}
		reactionScale += math.Sqrt(rr)
	}
	if den := max(math.Sqrt(loadNorm), reactionScale); den > 0 {
		cr.BalanceError = math.Sqrt(balance) / den
	}
}

// residual returns the scaled equilibrium residual of the unconstrained
// freedoms: what the members take (their fixed-end forces included) plus
// the springs equals the nodal loads; the scale is the right-hand side
// K·u = f of the solve.
func residual(nb *numbering, sys *system, nodal, u, nodeForce, equivalent []float64) float64 {
	var resid, rhs float64
	for eq, f := range nb.freedomOf {
		resid += sq(nodeForce[f] + nb.spring[f]*u[f] - nodal[f])
		rhs += sq(nodal[f] + equivalent[f] + sys.settle[eq])
	}
	if rhs > 0 {
		return math.Sqrt(resid / rhs)
	}
	return math.Sqrt(resid)
}

// recoverParallel is the member count from which recoverCase shares the
// members among the workers.
const recoverParallel = 8192

// recoverMember computes member e's end forces (into cr.EndForces[e],
// which has its length), axial force and stress into cr and, unless
// cr has no results along the members (RecoverForces), its results along its length and its
// utilisation; the forces it exerts on its freedoms (global axes)
// into fg and, when it carries member loads (the result), their equivalent
// nodal loads into fe; el is scratch space.
func recoverMember(m *model.Model, nb *numbering, ls *loadSet, u []float64, cr *CaseResult, e int, el *element, sc *memberScratch, fg, fe []float64) bool {
	var ul, p, fl [12]float64
	el.build(m, nb, e)
	n := el.localDisplacements(ul[:], u)
	el.localForces(p[:], ul[:])
	ls.state.adjust(m, el, e, ul[:n], p[:])
	loaded := ls.memberLoads(e)
	if loaded {
		ls.equivalent(fl[:], m, el, e)
		for i := range n {
			p[i] -= fl[i]
		}
		el.toGlobal(fe, fl[:])
	}
	copy(cr.EndForces[e], p[:n])
	cr.AxialForce[e] = -p[0]
	el.toGlobal(fg, p[:])
	sec := &m.Sections[m.Members[e].Section]
	cr.Stress[e] = cr.AxialForce[e] / sec.Area
	if cr.MemberCount() == 0 {
		return loaded // RecoverForces: nothing along the member
	}
	r := cr.kept(e)
	if r == nil {
		// A bar no load touches: its results are worked out again when
		// asked for (caseMembers).
		var scratch MemberResult
		mem := &m.Members[e]
		cr.Utilisation[e] = plainBar(m, e, el, p[:n], cr.Displacements[mem.Ends[0]], cr.Displacements[mem.Ends[1]], &scratch)
		return loaded
	}
	sc.loading.gather(ls, m, el, e, loaded)
	if el.beam {
		el.restoreReleased(ul[:n]) // end releases (release.go)
		alongBeam(r, el, sec, &m.Materials[m.Members[e].Material], p[:n], ul[:n], &sc.loading, &sc.field)
	} else {
		alongBar(r, el, p[:n], cr.Displacements[m.Members[e].Ends[0]], cr.Displacements[m.Members[e].Ends[1]])
		if sc.loading.transverse() {
			alongLoadedBar(r, el, sec, &m.Materials[m.Members[e].Material], p[:n], ul[:n], &sc.loading, &sc.field)
		}
	}
	cr.Utilisation[e] = checkMember(m, e, r)
	return loaded
}

// rowOf appends x to *buf, which has the capacity for it, and returns the
// appended part, capped so that appending to it cannot reach the next row.
func rowOf(buf *[]float64, x []float64) []float64 {
	start := len(*buf)
	*buf = append(*buf, x...)
	return (*buf)[start:len(*buf):len(*buf)]
}

// memberFreedomsPerNode returns the local freedoms of a member at each end.
func memberFreedomsPerNode(m *model.Model, mem model.Member) int {
	if mem.Kind == model.Beam {
		return 3 * (m.Dim - 1)
	}
	return m.Dim
}

// memberFreedoms returns the global freedoms of a member in the order of
// its element's local freedoms (as element.build numbers them), in dofs.
func memberFreedoms(m *model.Model, nb *numbering, mem model.Member, dofs *[12]int) []int {
	perNode := memberFreedomsPerNode(m, mem)
	for side, n := range mem.Ends {
		for c := range perNode {
			comp := c
			if m.Dim == 2 && c == 2 {
				comp = model.RZ
			}
			dofs[side*perNode+c] = nb.freedom(n, comp)
		}
	}
	return dofs[:2*perNode]
}

func sq(x float64) float64 { return x * x }

// finite reports whether every number in the result is finite.
func (cr *CaseResult) finite() bool {
	for _, v := range cr.Displacements {
		if !finite(v) {
			return false
		}
	}
	for _, v := range cr.Rotations {
		if !finite(v) {
			return false
		}
	}
	for _, v := range cr.EndForces {
		if !finite(v) {
			return false
		}
	}
	for _, r := range cr.Reactions {
		if !finite(r.Force) || !finite(r.Moment) {
			return false
		}
	}
	var scratch MemberResult
	for e := range cr.MemberCount() {
		if !cr.Member(e, &scratch).finite() {
			return false
		}
	}
	return finite(cr.AxialForce) && finite(cr.Stress) && finite(cr.Utilisation) &&
		finite([]float64{cr.Residual, cr.BalanceError})
}
