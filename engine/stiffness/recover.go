package stiffness

import (
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// recoverCase turns the displacements u (every global freedom) into the
// case's results.
func recoverCase(m *model.Model, nb *numbering, sys *system, ls *loadSet, u []float64) (*CaseResult, error) {
	_, rotational := m.DOFsPerNode()
	cr := &CaseResult{
		Displacements: make([][]float64, m.NodeCount()),
		Rotations:     make([][]float64, m.NodeCount()),
		AxialForce:    make([]float64, len(m.Members)),
		EndForces:     make([][]float64, len(m.Members)),
		Reactions:     make([]Reaction, len(m.Supports)),
		Stress:        make([]float64, len(m.Members)),
		Utilisation:   make([]float64, len(m.Members)),
		LoadSum:       make([]float64, m.Dim),
		ReactionSum:   make([]float64, m.Dim),
	}
	for n := range cr.Displacements {
		first := nb.first[n]
		cr.Displacements[n] = append([]float64(nil), u[first:first+m.Dim]...)
		if nb.rotational[n] {
			cr.Rotations[n] = append([]float64(nil), u[first+m.Dim:first+m.Dim+rotational]...)
		}
	}
	// nodeForce gathers Σ over members of the forces the members receive
	// from each freedom (global axes); equivalent gathers the equivalent
	// nodal loads of the member loads.
	nodeForce := make([]float64, nb.total)
	equivalent := make([]float64, nb.total)
	var el element
	var ug, ul, p, fl, fg [12]float64
	for e := range m.Members {
		el.build(m, nb, e)
		n := el.size
		for i := range n {
			ug[i] = u[el.dofs[i]]
		}
		el.toLocal(ul[:], ug[:])
		el.localForces(p[:], ul[:])
		if ls.memberLoads(e) {
			ls.equivalent(fl[:], m, &el, e)
			for i := range n {
				p[i] -= fl[i]
			}
			el.toGlobal(fg[:], fl[:])
			for i := range n {
				equivalent[el.dofs[i]] += fg[i]
			}
		}
		cr.EndForces[e] = append([]float64(nil), p[:n]...)
		cr.AxialForce[e] = -p[0]
		el.toGlobal(fg[:], p[:])
		for i := range n {
			nodeForce[el.dofs[i]] += fg[i]
		}
		sec := m.Sections[m.Members[e].Section]
		cr.Stress[e] = cr.AxialForce[e] / sec.Area
		cr.Utilisation[e] = utilisation(m, e, cr.AxialForce[e])
	}
	// A support holds a fixed freedom with whatever the members ask beyond
	// the load applied there; a spring pulls back with −k·u.
	for f := range nb.total {
		si := nb.supportOf[f]
		if si < 0 {
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
	cr.External = make([][]float64, m.NodeCount())
	for n := range cr.External {
		cr.External[n] = make([]float64, m.Dim)
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
	// Equilibrium of the unconstrained freedoms: what the members take
	// (their fixed-end forces included) plus the springs equals the nodal
	// loads; the scale is the right-hand side K·u = f of the solve.
	var resid, rhs float64
	for eq, f := range nb.freedomOf {
		resid += sq(nodeForce[f] + nb.spring[f]*u[f] - ls.nodal[f])
		rhs += sq(ls.nodal[f] + equivalent[f] + sys.settle[eq])
	}
	if rhs > 0 {
		cr.Residual = math.Sqrt(resid / rhs)
	} else if resid > 0 {
		cr.Residual = math.Sqrt(resid)
	}
	if !cr.finite() {
		return nil, fault.New(fault.Unstable, "the solution is not finite: the stiffness matrix is numerically singular")
	}
	return cr, nil
}

func sq(x float64) float64 { return x * x }

// utilisation returns member e's utilisation under axial force n, or −1
// when no limit applies.
func utilisation(m *model.Model, e int, n float64) float64 {
	mem := m.Members[e]
	mat := m.Materials[mem.Material]
	sec := m.Sections[mem.Section]
	if n >= 0 {
		if mat.TensionLimit > 0 {
			return n / (sec.Area * mat.TensionLimit)
		}
		if n == 0 && mat.CompressionLimit > 0 {
			return 0
		}
		return -1
	}
	capacity := math.Inf(1)
	if mat.CompressionLimit > 0 {
		capacity = sec.Area * mat.CompressionLimit
	}
	i := sec.SecondMoment
	if m.Dim == 3 && sec.SecondMomentY > 0 && (i == 0 || sec.SecondMomentY < i) {
		i = sec.SecondMomentY
	}
	if i > 0 {
		k := mem.BucklingFactor
		if !(k > 0) {
			k = 1
		}
		kl := k * m.Length(e)
		capacity = min(capacity, math.Pi*math.Pi*mat.ElasticModulus*i/(kl*kl))
	}
	if math.IsInf(capacity, 1) {
		return -1
	}
	return -n / capacity
}

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
	return finite(cr.AxialForce) && finite(cr.Stress) && finite(cr.Utilisation) &&
		finite([]float64{cr.Residual, cr.BalanceError})
}
