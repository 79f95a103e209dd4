package stiffness

import "gusset/engine/model"

// caseMembers holds a case's results along its members. Only the members
// whose results take work keep their own (beams, and bars with loads on
// them): a bar that no load touches has its axial force constant or linear
// and its displacement linear along it, so its results follow exactly
// from its end forces and its ends' displacements, and are worked out
// again when asked for. On a large pin-jointed model that keeps about
// 560 bytes per member out of memory (150 MB on the 270,600 bars of the
// reference benchmark's 2D grid), a page fault per 4 KiB on a fresh
// process.
type caseMembers struct {
	model *model.Model
	// kept holds the results of the members that keep their own.
	kept []MemberResult
	// keptAt gives per member its index in kept, or −1 for a bar whose
	// results are worked out; nil when the case has no results along the
	// members (Options.Recovery RecoverForces).
	keptAt []int32
}

// newCaseMembers lays out the members' results of a case of m whose loads
// are ls: a place in kept for each beam and each bar with member loads
// (its own weight included).
func newCaseMembers(m *model.Model, ls *loadSet) caseMembers {
	cm := caseMembers{model: m, keptAt: make([]int32, len(m.Members))}
	kept := 0
	for e, mem := range m.Members {
		cm.keptAt[e] = -1
		if mem.Kind == model.Beam || ls.memberLoads(e) {
			cm.keptAt[e] = int32(kept)
			kept++
		}
	}
	cm.kept = make([]MemberResult, kept)
	return cm
}

// MemberCount returns the number of members with results along them: the
// model's member count, or 0 when the case was recovered without them
// (Options.Recovery RecoverForces).
func (cr *CaseResult) MemberCount() int { return len(cr.members.keptAt) }

// Member returns member e's results along its length (0 ≤ e <
// MemberCount()). The results a member keeps are returned as they are
// (shared, not copied: do not modify them); those of a bar that no load
// touches are worked out from its end forces and end displacements into
// scratch, or into a new MemberResult when scratch is nil, the same values
// bit for bit as recovery found. Pass a scratch value when visiting many
// members.
func (cr *CaseResult) Member(e int, scratch *MemberResult) *MemberResult {
	if at := cr.members.keptAt[e]; at >= 0 {
		return &cr.members.kept[at]
	}
	if scratch == nil {
		scratch = new(MemberResult)
	}
	m := cr.members.model
	mem := &m.Members[e]
	el := element{length: m.Length(e), ea: m.Materials[mem.Material].ElasticModulus * m.Sections[mem.Section].Area, perNode: m.Dim}
	plainBar(m, e, &el, cr.EndForces[e], cr.Displacements[mem.Ends[0]], cr.Displacements[mem.Ends[1]], scratch)
	return scratch
}

// kept returns the results member e keeps, or nil for a bar whose results
// are worked out (or a case without results along the members).
func (cr *CaseResult) kept(e int) *MemberResult {
	if cr.members.keptAt == nil || cr.members.keptAt[e] < 0 {
		return nil
	}
	return &cr.members.kept[cr.members.keptAt[e]]
}

// plainBar sets r to the results of bar e that no load touches, from its
// element el (its length, EA and freedoms per node), its local end forces
// p and its ends' displacements d1 and d2, and returns its utilisation
// (see checkMember). Recovery and CaseResult.Member both call it, so that
// the results worked out again are those recovery found.
func plainBar(m *model.Model, e int, el *element, p, d1, d2 []float64, r *MemberResult) float64 {
	*r = MemberResult{}
	alongBar(r, el, p, d1, d2)
	return checkMember(m, e, r)
}
