package stiffness

import (
	"gusset/engine/model"
)

// weightedLoad is a member load with the factor it carries in a case or
// combination.
type weightedLoad struct {
	load   *model.MemberLoad
	factor float64
}

// loadSet is the factored sum of some load cases: the nodal loads per
// freedom and the member loads grouped by member.
type loadSet struct {
	nodal      []float64        // per global freedom: applied nodal force or moment
	byMember   [][]weightedLoad // per member: its loads (nil when none)
	selfWeight float64          // factor on the self-weight of every member
	hasMember  bool
	// state, when not nil, is the iterated solve's member state that
	// recovery applies (inactive members, pretension, P-Δ).
	state *memberState
}

func newLoadSet(m *model.Model, nb *numbering, terms []model.Term) *loadSet {
	ls := &loadSet{nodal: make([]float64, nb.total)}
	for _, t := range terms {
		lc := &m.Cases[t.Case]
		if lc.SelfWeight {
			ls.selfWeight += t.Factor
			ls.hasMember = true
		}
		for _, nl := range lc.Nodal {
			for c := range m.Dim {
				ls.nodal[nb.freedom(nl.Node, c)] += t.Factor * nl.Force[c]
			}
			for c := model.RX; c <= model.RZ; c++ {
				if f := nb.freedom(nl.Node, c); f >= 0 {
					ls.nodal[f] += t.Factor * nl.Moment[c-model.RX]
				}
			}
		}
		for i := range lc.MemberLoads {
			ml := &lc.MemberLoads[i]
			if ls.byMember == nil {
				ls.byMember = make([][]weightedLoad, len(m.Members))
			}
			ls.byMember[ml.Member] = append(ls.byMember[ml.Member], weightedLoad{ml, t.Factor})
			ls.hasMember = true
		}
	}
	return ls
}

// memberLoads reports whether member e carries loads in the set.
func (ls *loadSet) memberLoads(e int) bool {
	return ls.selfWeight != 0 || (ls.byMember != nil && len(ls.byMember[e]) > 0)
}

// equivalent writes into f (local axes, el.size entries) the equivalent
// nodal loads of member e's loads in the set.
func (ls *loadSet) equivalent(f []float64, m *model.Model, el *element, e int) {
	clear(f[:el.size])
	if ls.selfWeight != 0 {
		el.addSelfWeight(f, m, e, ls.selfWeight)
	}
	if ls.byMember != nil {
		for _, wl := range ls.byMember[e] {
			el.addMemberLoad(f, wl.load, wl.factor)
		}
	}
	el.condenseLoads(f) // end releases (release.go)
}

// rightHandSide returns the loads on the unconstrained freedoms (nodal plus
// equivalent member loads), without the settlement terms.
func (ls *loadSet) rightHandSide(m *model.Model, nb *numbering) []float64 {
	rhs := make([]float64, nb.equations)
	nodal := nb.inAxes(ls.nodal)
	for eq, f := range nb.freedomOf {
		rhs[eq] = nodal[f]
	}
	if !ls.hasMember {
		return rhs
	}
	var el element
	var fl, fg [12]float64
	for e := range m.Members {
		if !ls.memberLoads(e) {
			continue
		}
		el.build(m, nb, e)
		ls.equivalent(fl[:], m, &el, e)
		el.toGlobal(fg[:], fl[:])
		nb.turnForces(&el, fg[:])
		for i := range el.size {
			if eq := nb.equation[el.dofs[i]]; eq >= 0 {
				rhs[eq] += fg[i]
			}
		}
	}
	return rhs
}
