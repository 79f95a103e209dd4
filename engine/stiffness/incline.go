package stiffness

import "gusset/engine/model"

// Inclined supports.
//
// A support with directions of its own (model.Support.Inclined) fixes,
// springs or moves its node along its own axes A (rows: local x, y, z in
// global components). The method is a change of basis at that node only:
// its freedoms in the linear system are the components along A (u_l = A·u_g),
// so each element block touching it becomes A·k·Aᵀ (k·Aᵀ for the columns,
// A· for the rows) and its loads A·f. A fixed local component is then
// simply a fixed freedom, eliminated exactly as a global one is, with no
// penalty number and no multiplier (which would spoil the positive
// definite system and its Cholesky factorisation); a spring or a
// prescribed displacement acts along its local axis for the same reason.
// The turn is orthogonal, so K stays symmetric positive definite with the
// same sparsity (it mixes only the components of one node).
//
// Everything outside the linear system stays in global axes: the
// displacements are turned back (u_g = Aᵀ·u_l) before recovery, so member
// forces, reported displacements, external forces and the balance are
// global as before, and a reaction is found in the support's axes from the
// node's unbalanced force and turned back for the global report.

// inclined reports whether node n's freedoms are in a support's axes.
func (nb *numbering) inclined(n int) bool {
	return nb.axes != nil && nb.axes[n] != nil
}

// blocks returns node n's freedom blocks that turn with its axes: the
// translations at nb.first[n] (dim of them) and, in 3D at a node with
// rotations, the three rotations after them (a plane model's rotation
// about z is the same in any axes turned about z).
func (nb *numbering) blocks(n int) (offsets [2]int, count int) {
	offsets[0] = nb.first[n]
	if nb.dim == 3 && nb.rotational[n] {
		return [2]int{nb.first[n], nb.first[n] + 3}, 2
	}
	return offsets, 1
}

// turnElement turns el's global stiffness kg (el.size square, row-major) to
// the supports' axes at its inclined ends: kg ← Q·kg·Qᵀ, Q block-diagonal
// with A at each inclined end's translations (and 3D rotations).
func (nb *numbering) turnElement(el *element, kg []float64) {
	if nb.axes == nil {
		return
	}
	n := el.size
	var col [3]float64
	for _, o := range nb.elementBlocks(el) {
		axes := nb.axes[nb.node[el.dofs[o]]]
		d := nb.dim
		for j := range n { // rows of the block: A·kg[o:o+d, j]
			for i := range d {
				col[i] = kg[(o+i)*n+j]
			}
			model.ToAxes(axes, col[:d])
			for i := range d {
				kg[(o+i)*n+j] = col[i]
			}
		}
		for i := range n { // columns of the block: kg[i, o:o+d]·Aᵀ
			model.ToAxes(axes, kg[i*n+o:i*n+o+d])
		}
	}
}

// turnForces turns an element's global end forces f (el.size entries) to
// the supports' axes at its inclined ends.
func (nb *numbering) turnForces(el *element, f []float64) {
	if nb.axes == nil {
		return
	}
	for _, o := range nb.elementBlocks(el) {
		model.ToAxes(nb.axes[nb.node[el.dofs[o]]], f[o:o+nb.dim])
	}
}

// elementBlocks lists the local offsets of el's blocks that lie at an
// inclined end: each end's translations and, for a 3D beam, its rotations.
func (nb *numbering) elementBlocks(el *element) []int {
	var out []int
	for side := range 2 {
		o := side * el.perNode
		if !nb.inclined(nb.node[el.dofs[o]]) {
			continue
		}
		out = append(out, o)
		if el.beam && nb.dim == 3 {
			out = append(out, o+3)
		}
	}
	return out
}

// inAxes returns v (one entry per freedom, global axes) with the freedoms
// of inclined nodes in their supports' axes: v itself when no support is
// inclined, a turned copy otherwise.
func (nb *numbering) inAxes(v []float64) []float64 {
	if nb.axes == nil {
		return v
	}
	w := append([]float64(nil), v...)
	for n, axes := range nb.axes {
		if axes == nil {
			continue
		}
		offsets, count := nb.blocks(n)
		for _, o := range offsets[:count] {
			model.ToAxes(axes, w[o:o+nb.dim])
		}
	}
	return w
}

// fromAxes turns v (one entry per freedom, inclined nodes in their
// supports' axes) to global axes in place.
func (nb *numbering) fromAxes(v []float64) {
	for n, axes := range nb.axes {
		if axes == nil {
			continue
		}
		offsets, count := nb.blocks(n)
		for _, o := range offsets[:count] {
			model.FromAxes(axes, v[o:o+nb.dim])
		}
	}
}

// inclinedReactions sets the reactions of the supports at inclined nodes.
// The node's unbalanced force r = Σ member forces − loads (global, u
// global) is turned to the support's axes; a fixed local component reacts
// with it, a sprung one with −k·u_l (equal to it at equilibrium), a free
// one with nothing. Force and Moment are the global reaction Aᵀ·r_l;
// an inclined support also reports LocalForce and LocalMoment, r_l.
func inclinedReactions(m *model.Model, nb *numbering, ls *loadSet, u []float64, cr *CaseResult, nodeForce []float64) {
	if nb.axes == nil {
		return
	}
	_, rotational := m.DOFsPerNode()
	unbalanced := make([]float64, nb.total)
	for f := range unbalanced {
		unbalanced[f] = nodeForce[f] - ls.nodal[f]
	}
	r, ul := nb.inAxes(unbalanced), nb.inAxes(u)
	touched := make(map[int]bool)
	for f := range nb.total {
		si := nb.supportOf[f]
		if si < 0 || !nb.inclined(nb.node[f]) {
			continue
		}
		re := &cr.Reactions[si]
		if re.LocalForce == nil {
			re.LocalForce, re.LocalMoment = make([]float64, m.Dim), make([]float64, rotational)
		}
		v := r[f]
		if nb.equation[f] >= 0 {
			v = -nb.spring[f] * ul[f]
		}
		if c := nb.component[f]; c < m.Dim {
			re.LocalForce[c] = v
		} else if m.Dim == 2 {
			re.LocalMoment[0] = v
		} else {
			re.LocalMoment[c-model.RX] = v
		}
		touched[si] = true
	}
	for si := range cr.Reactions {
		if !touched[si] {
			continue
		}
		re, axes := &cr.Reactions[si], nb.axes[m.Supports[si].Node]
		re.Force = append([]float64(nil), re.LocalForce...)
		re.Moment = append([]float64(nil), re.LocalMoment...)
		model.FromAxes(axes, re.Force)
		if m.Dim == 3 {
			model.FromAxes(axes, re.Moment)
		}
		if !m.Supports[si].Inclined {
			re.LocalForce, re.LocalMoment = nil, nil
		}
	}
}

// turnMode turns a mechanism mode's motions at inclined nodes (set per
// freedom, so in the supports' axes) to global axes.
func (nb *numbering) turnMode(mode Mode) {
	for n, axes := range nb.axes {
		if axes == nil {
			continue
		}
		model.FromAxes(axes, mode.Translations[n])
		if nb.dim == 3 && mode.Rotations[n] != nil {
			model.FromAxes(axes, mode.Rotations[n])
		}
	}
}
