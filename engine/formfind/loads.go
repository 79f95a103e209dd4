package formfind

import (
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// loading is the load of the chosen case in the form form finding uses:
// fixed nodal forces, and per member a load per unit length varying
// linearly from start to end (self-weight and global member loads), which
// is lumped to the member's ends on the current geometry.
type loading struct {
	caseID string
	nodal  []float64 // Dim entries per node
	// perLength[e] is nil for a member without load along it, else
	// 2·Dim entries: the intensity at the first end, then at the second.
	perLength [][]float64
	follows   bool // some member carries load per length
}

// caseTerms resolves the case id to load cases and factors.
func caseTerms(m *model.Model, id string) (string, []model.Term, error) {
	if id == "" {
		if len(m.Cases) == 0 {
			return "", nil, nil
		}
		return m.Cases[0].ID, []model.Term{{Case: 0, Factor: 1}}, nil
	}
	if c := m.CaseIndex(id); c >= 0 {
		return id, []model.Term{{Case: c, Factor: 1}}, nil
	}
	if c := m.CombinationIndex(id); c >= 0 {
		return id, m.Combinations[c].Terms, nil
	}
	known := make([]string, 0, len(m.Cases)+len(m.Combinations))
	for _, c := range m.Cases {
		known = append(known, c.ID)
	}
	for _, c := range m.Combinations {
		known = append(known, c.ID)
	}
	return "", nil, fault.At(fault.UnknownCase, "/case", "no load case or combination is called %q; the model has %q", id, known)
}

// newLoading gathers the loads of the case. Moments are reported as unused;
// point, thermal and local member loads are errors, as their lumping would
// depend on a geometry form finding has yet to find.
func newLoading(m *model.Model, id string, warn func(path, format string, args ...any)) (*loading, error) {
	caseID, terms, err := caseTerms(m, id)
	if err != nil {
		return nil, err
	}
	d := m.Dim
	l := &loading{caseID: caseID, nodal: make([]float64, m.NodeCount()*d), perLength: make([][]float64, len(m.Members))}
	var problems []fault.Problem
	for _, t := range terms {
		lc := &m.Cases[t.Case]
		if len(lc.Areas) > 0 {
			problems = append(problems, fault.Problem{Path: fmt.Sprintf("/model/load_cases/%d/area_loads", t.Case),
				Message: "form finding takes no area loads: a panel's shares depend on a geometry not yet found; give the loads at the nodes"})
			continue
		}
		for j, nl := range lc.Nodal {
			for k := 0; k < d; k++ {
				l.nodal[nl.Node*d+k] += t.Factor * nl.Force[k]
			}
			if nl.Moment != [3]float64{} {
				warn(fmt.Sprintf("/model/load_cases/%d/loads/%d/moment", t.Case, j), "moments are not used by form finding: a pin-jointed network carries none")
			}
		}
		if lc.SelfWeight {
			l.addSelfWeight(m, t.Factor)
		}
		for j, ml := range lc.MemberLoads {
			path := fmt.Sprintf("/model/load_cases/%d/member_loads/%d", t.Case, j)
			if ml.Local || (ml.Kind != model.Uniform && ml.Kind != model.Linear) {
				problems = append(problems, fault.Problem{Path: path,
					Message: "form finding takes uniform and linear member loads in global axes only (point, thermal and local loads depend on a geometry not yet found)"})
				continue
			}
			end := ml.Value
			if ml.Kind == model.Linear {
				end = ml.EndValue
			}
			w := l.member(ml.Member, d)
			for k := 0; k < d; k++ {
				w[k] += t.Factor * ml.Value[k]
				w[d+k] += t.Factor * end[k]
			}
		}
	}
	if problems != nil {
		return nil, &fault.Error{Kind: fault.InvalidModel, Message: problems[0].Message, Problems: problems}
	}
	return l, nil
}

// addSelfWeight adds factor times each member's weight per length,
// weight density × area, along −y (2D) or −z (3D).
func (l *loading) addSelfWeight(m *model.Model, factor float64) {
	d := m.Dim
	for e, mem := range m.Members {
		w := m.Materials[mem.Material].WeightDensity * m.Sections[mem.Section].Area
		if w == 0 {
			continue
		}
		v := l.member(e, d)
		v[d-1] -= factor * w
		v[2*d-1] -= factor * w
	}
}

func (l *loading) member(e, d int) []float64 {
	if l.perLength[e] == nil {
		l.perLength[e] = make([]float64, 2*d)
		l.follows = true
	}
	return l.perLength[e]
}

// lump writes into dst (Dim entries per node) the nodal loads plus every
// load per length lumped to its member's ends for the given lengths: a
// linearly varying intensity w₁ → w₂ over L gives L(2w₁ + w₂)/6 to the first
// end and L(w₁ + 2w₂)/6 to the second, the end reactions of a simply
// supported member (statics; common practice).
func (l *loading) lump(dst []float64, m *model.Model, lengths []float64) {
	copy(dst, l.nodal)
	d := m.Dim
	for e, w := range l.perLength {
		if w == nil {
			continue
		}
		a, b := m.Members[e].Ends[0]*d, m.Members[e].Ends[1]*d
		L := lengths[e]
		for k := 0; k < d; k++ {
			dst[a+k] += L * (2*w[k] + w[d+k]) / 6
			dst[b+k] += L * (w[k] + 2*w[d+k]) / 6
		}
	}
}
