package stiffness

import (
	"gusset/engine/model"
)

// memberState is what an iterated solve changes in the members from one
// solve to the next: which members are active (a slack tension-only
// member, or a stretched compression-only one, has neither stiffness nor
// force, and its pretension is gone), and the axial forces that give the
// second-order (P-Δ) geometric stiffness.
type memberState struct {
	// inactive marks per member one that is out of the structure; nil
	// when every member is active.
	inactive []bool
	// axial holds per member the axial force N (tension positive) whose
	// geometric stiffness is added; nil for a first-order solve.
	axial []float64
}

// active reports whether member e takes part.
func (st *memberState) active(e int) bool { return st.inactive == nil || !st.inactive[e] }

// pretension returns member e's pretension while it is active, else 0.
func (st *memberState) pretension(m *model.Model, e int) float64 {
	if st == nil || st.active(e) {
		return m.Members[e].Pretension
	}
	return 0
}

// modify changes the global stiffness kg (el.size×el.size, row-major) of
// member e as the state says: zero for an inactive member, plus the
// geometric stiffness of its axial force. A nil state changes nothing.
func (st *memberState) modify(el *element, e int, kg []float64) {
	if st == nil {
		return
	}
	n := el.size
	if !st.active(e) {
		clear(kg[:n*n])
		return
	}
	if st.axial == nil || st.axial[e] == 0 {
		return
	}
	var local, global [144]float64
	el.geometric(local[:], st.axial[e])
	el.toGlobalMatrix(global[:], local[:])
	for i := range n * n {
		kg[i] += global[i]
	}
}

// adjust changes the local end forces p = k·ul of member e (before its
// member loads are taken off) as the state says: zero for an inactive
// member; for an active one, minus the pretension T at the first end and
// plus it at the second (the member pulls its ends together with T), and
// plus the geometric stiffness times ul. A nil state changes nothing.
func (st *memberState) adjust(m *model.Model, el *element, e int, ul, p []float64) {
	if st == nil {
		return
	}
	n := el.size
	if !st.active(e) {
		clear(p[:n])
		return
	}
	t := m.Members[e].Pretension
	p[0] -= t
	p[el.perNode] += t
	if st.axial == nil || st.axial[e] == 0 {
		return
	}
	var local [144]float64
	var extra [12]float64
	el.geometric(local[:], st.axial[e])
	mulSquare(extra[:], local[:], ul, n)
	for i := range n {
		p[i] += extra[i]
	}
}

// geometric writes into dst (zeroed first, el.size×el.size, row-major)
// the P-Δ geometric stiffness of the element under the axial force N
// (tension positive), in local axes: the string term (N/L)·[1, −1; −1, 1]
// on each transverse translation pair (local y, and z in 3D), which
// rotates the chord and nothing else. The consistent beam term (the P-δ
// effect of curvature between the ends) is left out: a beam meshed finely
// enough reaches it through its chords (W. McGuire, R. H. Gallagher and
// R. D. Ziemian, "Matrix Structural Analysis", 2nd ed., Wiley 2000, §9.3
// and §17, from memory). For a bar this is the same term as the bar's
// geometric stiffness in engine/modes.
func (el *element) geometric(dst []float64, N float64) {
	n, p := el.size, el.perNode
	clear(dst[:n*n])
	g := N / el.length
	dim := 2
	if p == 3 && !el.beam || p == 6 {
		dim = 3
	}
	for c := 1; c < dim; c++ {
		dst[c*n+c] += g
		dst[(p+c)*n+p+c] += g
		dst[c*n+p+c] -= g
		dst[(p+c)*n+c] -= g
	}
}

// toGlobalMatrix writes tᵀ·a·t into dst for the local matrix a
// (el.size×el.size, row-major).
func (el *element) toGlobalMatrix(dst, a []float64) {
	n := el.size
	var at [144]float64
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += a[i*n+l] * el.t[l*n+j]
			}
			at[i*n+j] = s
		}
	}
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += el.t[l*n+i] * at[l*n+j]
			}
			dst[i*n+j] = s
		}
	}
}

// pretensionLoads adds to rhs (the loads on the equations) the nodal
// forces by which the active pretensioned members of st pull their ends
// together: T along the member at its first end toward the second, and
// the opposite at the second.
func pretensionLoads(m *model.Model, nb *numbering, st *memberState, rhs []float64) {
	var el element
	var fl, fg [12]float64
	for e := range m.Members {
		t := st.pretension(m, e)
		if t == 0 {
			continue
		}
		el.build(m, nb, e)
		clear(fl[:el.size])
		fl[0], fl[el.perNode] = t, -t
		el.toGlobal(fg[:], fl[:])
		nb.turnForces(&el, fg[:])
		for i := range el.size {
			if eq := nb.equation[el.dofs[i]]; eq >= 0 {
				rhs[eq] += fg[i]
			}
		}
	}
}

// forState returns the load set as st sees it: an inactive member keeps
// the loads that act on it (they reach its ends as on a simple span) but
// loses its thermal strains, which like its pretension only act through
// its stiffness. It returns ls itself when no inactive member has one.
func (ls *loadSet) forState(st *memberState) *loadSet {
	if st == nil || st.inactive == nil || ls.byMember == nil {
		return ls
	}
	var out *loadSet
	for e, off := range st.inactive {
		if !off || len(ls.byMember[e]) == 0 {
			continue
		}
		var kept []weightedLoad
		for _, wl := range ls.byMember[e] {
			if wl.load.Kind != model.Thermal {
				kept = append(kept, wl)
			}
		}
		if len(kept) == len(ls.byMember[e]) {
			continue
		}
		if out == nil {
			copied := *ls
			copied.byMember = append([][]weightedLoad(nil), ls.byMember...)
			out = &copied
		}
		out.byMember[e] = kept
	}
	if out == nil {
		return ls
	}
	return out
}
