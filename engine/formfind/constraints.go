package formfind

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
)

// throughTarget is a resolved Through.
type throughTarget struct {
	node  int
	at    []float64
	scale float64 // the factor s of the force densities found
}

// target is a resolved Target.
type target struct {
	member int
	length bool // a length target; else a force target
	value  float64
}

// prepareConstraints resolves Through and Targets to indices and checks
// them. fixed tells the fixed nodes.
func (f *finder) prepareConstraints(fixed []bool) error {
	p, m := f.p, f.m
	if p.Through != nil && len(p.Targets) > 0 {
		return fault.At(fault.InvalidModel, "/targets", "through and targets cannot be combined: through scales every force density by one factor, which would undo the targets")
	}
	if t := p.Through; t != nil {
		node := -1
		for i, id := range m.NodeIDs {
			if id == t.Node {
				node = i
			}
		}
		switch {
		case node < 0:
			return fault.At(fault.InvalidModel, "/through/node", "no node is called %q", t.Node)
		case fixed[node]:
			return fault.At(fault.InvalidModel, "/through/node", "node %q is fixed by a support; through needs a free node", t.Node)
		case len(t.At) != m.Dim:
			return fault.At(fault.InvalidModel, "/through/at", "the point has %d coordinates; the model is %dD", len(t.At), m.Dim)
		}
		for k, x := range t.At {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return fault.At(fault.InvalidModel, fmt.Sprintf("/through/at/%d", k), "coordinate must be finite")
			}
		}
		f.through = &throughTarget{node: node, at: t.At, scale: 1}
	}
	index := make(map[string]int, len(m.Members))
	for e, mem := range m.Members {
		index[mem.ID] = e
	}
	seen := map[int]bool{}
	for k, t := range p.Targets {
		path := fmt.Sprintf("/targets/%d", k)
		e, ok := index[t.Member]
		switch {
		case !ok:
			return fault.At(fault.InvalidModel, path+"/member", "no member is called %q", t.Member)
		case seen[e]:
			return fault.At(fault.InvalidModel, path+"/member", "member %q has two targets", t.Member)
		case (t.Length == nil) == (t.Force == nil):
			return fault.At(fault.InvalidModel, path, "give either a length or a force for member %q", t.Member)
		case t.Length != nil && !(*t.Length > 0 && !math.IsInf(*t.Length, 1)):
			return fault.At(fault.InvalidModel, path+"/length", "target length must be positive and finite, not %g", *t.Length)
		case t.Force != nil && (*t.Force == 0 || math.IsNaN(*t.Force) || math.IsInf(*t.Force, 0)):
			return fault.At(fault.InvalidModel, path+"/force", "target force must be non-zero and finite, not %g", *t.Force)
		case f.q[e] == 0:
			return fault.At(fault.InvalidModel, fmt.Sprintf("/force_densities/%d", e), "member %q has a target but a zero force density, which the update cannot change; start it from a non-zero value", t.Member)
		}
		seen[e] = true
		if t.Length != nil {
			f.targets = append(f.targets, target{member: e, length: true, value: *t.Length})
		} else {
			f.targets = append(f.targets, target{member: e, value: *t.Force})
		}
	}
	return nil
}

// achieved returns the current value of target t: the member's length or
// its axial force q·L.
func (f *finder) achieved(t target) float64 {
	if t.length {
		return f.lengths[t.member]
	}
	return f.q[t.member] * f.lengths[t.member]
}

// targetMisfit returns the largest |achieved − target| / |target|.
func (f *finder) targetMisfit() float64 {
	var worst float64
	for _, t := range f.targets {
		worst = max(worst, math.Abs(f.achieved(t)-t.value)/math.Abs(t.value))
	}
	return worst
}

// newtonLimit is the most targets solved by Newton's method; above it the
// Jacobian (up to two solves per target and a dense square system of
// their number) costs more than the slower fixed-point steps it saves.
const newtonLimit = 64

// updateTargets applies one step of the force density update for targets
// and reports whether a force density changed. Up to newtonLimit targets it
// takes a Newton step on the additional conditions gₖ(q) = Lₖ − L*ₖ or
// Nₖ − N*ₖ in the unknowns ln|qₑ| of the targeted members, the nonlinear
// force density method of Schek (1974, §4, additional conditions solved by
// linearisation; from memory), with the Jacobian from ∂x/∂qₑ = −D⁻¹·Cₑᵀuₑ
// (uₑ the member's vector) and the step at most ln 10 in any ln|qₑ| so no
// force density changes sign. Loads that follow the form are held fixed in
// the Jacobian (newtonStep says how it is formed). When the Jacobian is
// singular, or above newtonLimit, it takes the fixed-point step of the iterative force density method: for a
// target force N*, q ← N*/L; for a target length L*, q ← q·L/L* (K.
// Linkwitz, "Force density method", in S. Adriaenssens et al. (eds.), Shell
// Structures for Architecture, Routledge 2014, ch. 6; L. Veenendaal and P.
// Block, International Journal of Solids and Structures 49(26), 2012; both
// from memory), which converges linearly.
func (f *finder) updateTargets() bool {
	if len(f.targets) == 0 {
		return false
	}
	if len(f.targets) <= newtonLimit && f.newtonStep() {
		return true
	}
	for _, t := range f.targets {
		if L := f.lengths[t.member]; L > 0 {
			if t.length {
				f.q[t.member] *= L / t.value
			} else {
				f.q[t.member] = t.value / L
			}
		}
	}
	return true
}

// newtonStep takes the Newton step described at updateTargets and reports
// whether it could. The Jacobian needs D⁻¹ only between the free ends of
// the targeted members: with uₑ = x_a − x_b the member's vector, D·∂x/∂q_c
// = −C_cᵀu_c has two entries, so ∂x/∂q_c = −u_c ⊗ (D⁻¹e_a − D⁻¹e_b) on every
// axis, and ∂L_r/∂q_c = −(u_r·u_c)/L_r · (Z_aa − Z_ab − Z_ba + Z_bb) with
// Z = D⁻¹ at (end of r, end of c). One solve per distinct end node serves
// all axes and all targets.
func (f *finder) newtonStep() bool {
	m, nw, d := f.m, f.nw, f.m.Dim
	T, nf := len(f.targets), len(nw.freeNodes)
	slot := map[int]int{} // free index → column of D⁻¹ held
	var cols [][]float64
	for _, t := range f.targets {
		for _, end := range m.Members[t.member].Ends {
			if fi := nw.free[end]; fi >= 0 {
				if _, ok := slot[fi]; !ok {
					slot[fi] = len(cols)
					col := make([]float64, nf)
					col[fi] = nw.sign // (sign·D)⁻¹·sign·e = D⁻¹·e
					cols = append(cols, col)
				}
			}
		}
	}
	nw.chol.SolveMany(cols, cols)
	z := func(i, j int) float64 { // D⁻¹ between nodes i and j; 0 at a fixed one
		fi, fj := nw.free[i], nw.free[j]
		if fi < 0 || fj < 0 {
			return 0
		}
		return cols[slot[fi]][fj]
	}
	jac := mat.NewDense(T, T, nil)
	g := mat.NewVecDense(T, nil)
	for r, t := range f.targets {
		ar, br := m.Members[t.member].Ends[0], m.Members[t.member].Ends[1]
		L := f.lengths[t.member]
		g.SetVec(r, f.achieved(t)-t.value)
		for c, tc := range f.targets {
			ac, bc := m.Members[tc.member].Ends[0], m.Members[tc.member].Ends[1]
			var dot float64
			for k := 0; k < d; k++ {
				dot += (f.coords[ar*d+k] - f.coords[br*d+k]) * (f.coords[ac*d+k] - f.coords[bc*d+k])
			}
			dL := -dot / L * (z(ar, ac) - z(ar, bc) - z(br, ac) + z(br, bc)) // ∂L_r/∂q_c
			dg := dL
			if !t.length {
				dg = f.q[t.member] * dL
				if c == r {
					dg += L
				}
			}
			jac.Set(r, c, dg*f.q[tc.member])
		}
	}
	return f.applyNewton(jac, g)
}

// applyNewton solves J·Δ = g for the step in ln|q| of the targeted members
// and applies −Δ, shortened so no entry exceeds ln 10.
func (f *finder) applyNewton(jac *mat.Dense, g *mat.VecDense) bool {
	var step mat.VecDense
	if err := step.SolveVec(jac, g); err != nil {
		return false
	}
	largest := mat.Norm(&step, math.Inf(1))
	if math.IsNaN(largest) || math.IsInf(largest, 0) {
		return false
	}
	shrink := min(1, math.Ln10/largest)
	for c, t := range f.targets {
		f.q[t.member] *= math.Exp(-shrink * step.AtVec(c))
	}
	return true
}
