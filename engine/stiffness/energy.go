package stiffness

import (
	"fmt"

	"gusset/engine/model"
)

// BendingShare returns the share (0 to 1) of the case's strain energy held
// in bending and torsion, and the member holding the most of it (−1 when
// no member bends or twists). Maxwell's load path counts axial forces
// only, so this share is what it leaves out.
func (cr *CaseResult) BendingShare() (share float64, member int) {
	var axial, other, most float64
	member = -1
	var scratch MemberResult
	for e := range cr.MemberCount() {
		r := cr.Member(e, &scratch)
		axial += r.AxialEnergy
		u := r.BendingEnergy + r.TorsionEnergy
		other += u
		if u > most {
			most, member = u, e
		}
	}
	if other == 0 {
		return 0, -1
	}
	return other / (axial + other), member
}

// LoadPathCaveat returns the warning a load path of case cr needs when
// members bend or twist: the share of the strain energy the axial measure
// leaves out, where most of it is, and the largest bending utilisation
// (or how many members' bending went unchecked), and how many bars carry
// loads across them without a second moment of area, whose energy of
// bending is unknown. It is empty when no member bends.
func LoadPathCaveat(m *model.Model, cr *CaseResult) string {
	bars := LoadedBars(cr)
	share, member := cr.BendingShare()
	if member < 0 {
		if bars == 0 {
			return ""
		}
		return fmt.Sprintf("%s %q: the load path counts axial forces only, and %d bars carry loads across them (their own weight, member loads) and bend, with no second_moment to give the energy of their bending (see solve's unchecked list): the load path, and volumes sized from it, understate what these members need",
			caseWord(cr), cr.ID, bars)
	}
	worst, unchecked := -1, 0
	var scratch MemberResult
	for e := range cr.MemberCount() {
		r := cr.Member(e, &scratch)
		if !(r.BendingEnergy > 0 && m.Members[e].Kind == model.Beam || r.LoadedAcross) {
			continue
		}
		if r.BendingUtilisation < 0 {
			unchecked++
		} else if worst < 0 || r.BendingUtilisation > cr.Member(worst, nil).BendingUtilisation {
			worst = e
		}
	}
	s := fmt.Sprintf("%s %q: the load path counts axial forces only, but bending and torsion hold %.3g %% of the strain energy (most in member %q)",
		caseWord(cr), cr.ID, 100*share, m.Members[member].ID)
	if worst >= 0 {
		s += fmt.Sprintf("; the largest bending utilisation is %.3g (member %q)", cr.Member(worst, nil).BendingUtilisation, m.Members[worst].ID)
	}
	if unchecked > 0 {
		s += fmt.Sprintf("; the bending of %d members is not checked (no section modulus or limit; see solve's unchecked list)", unchecked)
	}
	if bars > 0 {
		s += fmt.Sprintf("; %d bars carry loads across them with no second_moment, whose energy of bending is not in that share", bars)
	}
	return s + ": the load path, and volumes sized from it, understate what these members need"
}

func caseWord(cr *CaseResult) string {
	if cr.Combination {
		return "combination"
	}
	return "case"
}
