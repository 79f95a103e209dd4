package stiffness

import (
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// BucklingReduction returns the reduction factor χ for flexural buckling
// of EN 1993-1-1:2005 §6.3.1.2, eq. (6.49): Φ = 0.5[1 + α(λ̄ − 0.2) + λ̄²],
// χ = 1/(Φ + √(Φ² − λ̄²)) ≤ 1, for the non-dimensional slenderness λ̄ and
// the imperfection factor α of the buckling curve (Table 6.1: a0 0.13,
// a 0.21, b 0.34, c 0.49, d 0.76). χ = 1 for λ̄ ≤ 0.2 (§6.3.1.2(4)).
func BucklingReduction(slenderness, alpha float64) float64 {
	if slenderness <= 0.2 {
		return 1
	}
	phi := 0.5 * (1 + alpha*(slenderness-0.2) + slenderness*slenderness)
	return min(1, 1/(phi+math.Sqrt(phi*phi-slenderness*slenderness)))
}

// defaultCurve is the buckling curve used when a member names none: the
// lowest of EN 1993-1-1 Table 6.1, so that the check never flatters.
const defaultCurve = "d"

// Checks not made (or made on an assumption) for a member, as bits of
// MemberResult.Unchecked; Result.Unchecked says each in words with its
// pointer.
const (
	noTensionLimit     uint16 = 1 << iota // tension, no tension_limit
	noCompressionLimit                    // compression, no compression_limit
	noBucklingInertia                     // compression, no second moment: buckling not checked
	curveAssumed                          // compression, no buckling_curve: curve d used
	noModulusZ                            // bending about z, no section_modulus
	noModulusY                            // bending about y (3D), no section_modulus_y
	noBendingLimit                        // bending, no stress limit at all
	noSpanInertia                         // a bar loaded across, no second moment: its deflection between the ends not known
)

// notStrength are the flags that leave the member's strength checks whole:
// an assumed curve is on the safe side, and a loaded bar's unknown
// deflection is a serviceability matter.
const notStrength = curveAssumed | noSpanInertia

// checkMember sets r's axial, bending and combined utilisation for member
// e and returns the governing one: the largest of them, or −1 when a check
// the member needs could not be made (a missing limit, section modulus or
// second moment), so that a partial check never passes for a whole one.
// r's axial extremes and peak moments (and LoadedAcross) must be set. A
// bar loaded across its length is checked like a beam, with its simple
// span's moments.
//
// Axial: N/(A·ft) in tension; |N|/(χ·A·fc) in compression with χ from the
// member's buckling curve at λ̄ = √(A·fc/Ncr), Ncr = π²EI/(kL)² with the
// lesser second moment (about local y too in 2D when the section gives
// it) and the buckling length factor k. Bending:
// |M|/(W·f) about each axis with f the lesser of the limits given.
// Combined: the linear interaction N/N_Rd + |My|/My,Rd + |Mz|/Mz,Rd with
// each term at its own largest value along the member, which is never
// below the largest sum at one section (conservative; not the k-factor
// method of EN 1993-1-1 §6.3.3). Lateral–torsional buckling is not
// checked.
func checkMember(m *model.Model, e int, r *MemberResult) float64 {
	governing := memberChecks(m, e, r)
	if r.Unchecked&^notStrength != 0 {
		return -1
	}
	return governing
}

// memberChecks makes the checks of checkMember and returns the largest.
func memberChecks(m *model.Model, e int, r *MemberResult) float64 {
	mem := m.Members[e]
	mat := &m.Materials[mem.Material]
	sec := &m.Sections[mem.Section]
	r.AxialUtilisation, r.BendingUtilisation, r.CombinedUtilisation = -1, -1, -1
	tension, compression := max(0, r.MaxAxial.Value), max(0, -r.MinAxial.Value)
	axialT, axialC := axialCapacities(m, e, r)
	switch {
	case tension > 0 && axialT == 0, compression > 0 && axialC == 0:
		// A force without its limit: the axial check is not made.
	case tension == 0 && compression == 0:
		if axialT > 0 || axialC > 0 {
			r.AxialUtilisation = 0
		}
	default:
		r.AxialUtilisation = 0
		if tension > 0 {
			r.AxialUtilisation = tension / axialT
		}
		if compression > 0 {
			r.AxialUtilisation = max(r.AxialUtilisation, compression/axialC)
		}
	}
	governing := r.AxialUtilisation
	if mem.Kind != model.Beam && !r.LoadedAcross {
		return governing
	}
	bending, ok := bendingUtilisation(m, sec, mat, r)
	if !ok {
		return governing
	}
	r.BendingUtilisation = bending
	governing = max(governing, bending)
	if r.AxialUtilisation < 0 {
		return governing
	}
	var axial float64
	if tension > 0 {
		axial = tension / axialT
	}
	if compression > 0 {
		axial = max(axial, compression/axialC)
	}
	r.CombinedUtilisation = axial + bending
	return max(governing, r.CombinedUtilisation)
}

// axialCapacities returns the tension and compression resistances of
// member e (0 when a limit is missing) and flags what is missing in r.
func axialCapacities(m *model.Model, e int, r *MemberResult) (tension, compression float64) {
	mem := m.Members[e]
	mat := &m.Materials[mem.Material]
	sec := &m.Sections[mem.Section]
	if mat.TensionLimit > 0 {
		tension = sec.Area * mat.TensionLimit
	} else if r.MaxAxial.Value > 0 {
		r.Unchecked |= noTensionLimit
	}
	if !(r.MinAxial.Value < 0) {
		return tension, mat.CompressionLimit * sec.Area
	}
	if !(mat.CompressionLimit > 0) {
		r.Unchecked |= noCompressionLimit
		return tension, 0
	}
	squash := sec.Area * mat.CompressionLimit
	// The lesser second moment: in 2D too when the section gives one about
	// local y (a shape does), since a plane model's column still buckles
	// out of its plane.
	i := sec.SecondMoment
	if sec.SecondMomentY > 0 && (i == 0 || sec.SecondMomentY < i) {
		i = sec.SecondMomentY
	}
	if !(i > 0) {
		r.Unchecked |= noBucklingInertia
		r.BucklingReduction = 1
		return tension, squash
	}
	curve := mem.BucklingCurve
	if curve == "" {
		curve = defaultCurve
		r.Unchecked |= curveAssumed
	}
	kl := mem.BucklingFactor * m.Length(e)
	if !(kl > 0) {
		kl = m.Length(e)
	}
	critical := math.Pi * math.Pi * mat.ElasticModulus * i / (kl * kl)
	r.BucklingReduction = BucklingReduction(math.Sqrt(squash/critical), model.BucklingCurves[curve])
	return tension, r.BucklingReduction * squash
}

// bendingUtilisation returns Σ |M|/(W·f) over the bending axes, or false
// (with r flagged) when a section modulus or a limit is missing.
func bendingUtilisation(m *model.Model, sec *model.Section, mat *model.Material, r *MemberResult) (float64, bool) {
	f := 0.0
	for _, limit := range [2]float64{mat.TensionLimit, mat.CompressionLimit} {
		if limit > 0 && (f == 0 || limit < f) {
			f = limit
		}
	}
	ok := true
	if f == 0 {
		r.Unchecked |= noBendingLimit
		ok = false
	}
	if !(sec.SectionModulus > 0) {
		r.Unchecked |= noModulusZ
		ok = false
	}
	if m.Dim == 3 && !(sec.SectionModulusY > 0) {
		r.Unchecked |= noModulusY
		ok = false
	}
	if !ok {
		return 0, false
	}
	if m.Dim == 3 && r.LoadedAcross {
		return turnedSection(r, sec) / f, true
	}
	u := math.Abs(r.PeakMomentZ.Value) / (sec.SectionModulus * f)
	if m.Dim == 3 {
		u += math.Abs(r.PeakMomentY.Value) / (sec.SectionModulusY * f)
	}
	return u, true
}

// turnedSection returns the largest bending stress of a 3D bar's span
// whichever way its section is turned about its axis (a bar names no
// orientation, so its local y and z are not its section's): at any
// section the moment |M| ≤ √(My,max² + Mz,max²), and with the principal
// axes at any angle φ to it the stress |M|(|cos φ|/Wy + |sin φ|/Wz) is at
// most |M|·√(1/Wy² + 1/Wz²) (Cauchy–Schwarz), which is therefore safe.
func turnedSection(r *MemberResult, sec *model.Section) float64 {
	moment := math.Hypot(r.PeakMomentY.Value, r.PeakMomentZ.Value)
	return moment * math.Hypot(1/sec.SectionModulus, 1/sec.SectionModulusY)
}

// LoadedBars returns how many bars of case cr carry loads across their
// length (their own weight, member loads) and have no second moment of
// area: their bending moments are known from statics, but not the energy
// of their bending nor their deflection between the ends.
func LoadedBars(cr *CaseResult) int {
	n := 0
	for e := range cr.MemberCount() {
		if r := cr.kept(e); r != nil && r.Unchecked&noSpanInertia != 0 { // a bar no load touches has no span
			n++
		}
	}
	return n
}

// uncheckedNotes lists, member by member, the checks not made (or made on
// an assumption) in any of the cases, each with the pointer of the data
// that would allow it, at most limit of them and then a count.
func uncheckedNotes(m *model.Model, cases []CaseResult, limit int) []fault.Problem {
	return uncheckedNotesOf(m, memberUncheckedFlags(m, cases), limit)
}

// memberUncheckedFlags returns per member the union of its unchecked
// flags over the cases.
func memberUncheckedFlags(m *model.Model, cases []CaseResult) []uint16 {
	out := make([]uint16, len(m.Members))
	var scratch MemberResult
	for e := range out {
		for c := range cases {
			if cases[c].MemberCount() > e {
				out[e] |= cases[c].Member(e, &scratch).Unchecked
			}
		}
	}
	return out
}

// uncheckedNotesOf is uncheckedNotes from each member's union of flags.
func uncheckedNotesOf(m *model.Model, memberFlags []uint16, limit int) []fault.Problem {
	var notes []fault.Problem
	more := 0
	for e := range m.Members {
		flags := memberFlags[e]
		for bit := uint16(1); bit != 0 && bit <= noSpanInertia; bit <<= 1 {
			if flags&bit == 0 {
				continue
			}
			if len(notes) >= limit {
				more++
				continue
			}
			notes = append(notes, uncheckedNote(m, e, bit))
		}
	}
	if more > 0 {
		notes = append(notes, fault.Problem{Path: "/members", Message: fmt.Sprintf("and %d more checks not made or assumed, of the same kinds", more)})
	}
	return notes
}

// uncheckedNote says in words what flag bit of member e means.
func uncheckedNote(m *model.Model, e int, bit uint16) fault.Problem {
	mem := m.Members[e]
	id := mem.ID
	mat, sec := m.Materials[mem.Material].ID, m.Sections[mem.Section].ID
	switch bit {
	case noTensionLimit:
		return fault.Problem{Path: fmt.Sprintf("/materials/%d/tension_limit", mem.Material),
			Message: fmt.Sprintf("member %q is in tension but material %q has no tension_limit: its tension is not checked", id, mat)}
	case noCompressionLimit:
		return fault.Problem{Path: fmt.Sprintf("/materials/%d/compression_limit", mem.Material),
			Message: fmt.Sprintf("member %q is in compression but material %q has no compression_limit: its compression and buckling are not checked", id, mat)}
	case noBucklingInertia:
		return fault.Problem{Path: fmt.Sprintf("/sections/%d/second_moment", mem.Section),
			Message: fmt.Sprintf("member %q is in compression but section %q has no second_moment: it is checked against its squash load only, and buckling is not checked", id, sec)}
	case curveAssumed:
		return fault.Problem{Path: fmt.Sprintf("/members/%d/buckling_curve", e),
			Message: fmt.Sprintf("member %q is in compression and names no buckling_curve: the lowest curve, d (α = 0.76), was used", id)}
	case noModulusZ:
		return fault.Problem{Path: fmt.Sprintf("/sections/%d/section_modulus", mem.Section),
			Message: fmt.Sprintf("member %q bends but section %q has no section_modulus (nor a shape): its bending and combined checks are not made", id, sec)}
	case noModulusY:
		return fault.Problem{Path: fmt.Sprintf("/sections/%d/section_modulus_y", mem.Section),
			Message: fmt.Sprintf("member %q bends about local y but section %q has no section_modulus_y (nor a shape): its bending and combined checks are not made", id, sec)}
	case noBendingLimit:
		return fault.Problem{Path: fmt.Sprintf("/materials/%d", mem.Material),
			Message: fmt.Sprintf("member %q bends but material %q has neither a tension_limit nor a compression_limit: its bending and combined checks are not made", id, mat)}
	default:
		return fault.Problem{Path: fmt.Sprintf("/sections/%d/second_moment", mem.Section),
			Message: fmt.Sprintf("bar %q carries loads across it and bends as a simple span, but section %q has no second_moment: its moments are known from statics, its deflection between its ends is not (max_displacement counts its ends only)", id, sec)}
	}
}

// maxUncheckedNotes bounds Result.Unchecked; the rest are counted.
const maxUncheckedNotes = 50

// bendingCaveat says once what the bending checks leave out, when any
// beam's bending was checked.
func bendingCaveat(m *model.Model, cases []CaseResult) []string {
	for c := range cases {
		for e := range cases[c].MemberCount() {
			// A bar no load touches is not checked in bending.
			if r := cases[c].kept(e); r != nil && r.BendingUtilisation >= 0 {
				return []string{bendingCaveatText}
			}
		}
	}
	return nil
}

// bendingCaveatText is the warning of bendingCaveat.
const bendingCaveatText = "bending utilisation is |M|/(W·f) with the elastic section modulus: lateral–torsional buckling, shear and local buckling of thin plates are not checked; the combined check adds each term's largest value along the member (conservative)"
