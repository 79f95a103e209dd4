package stiffness

import (
	"gusset/engine/model"
	"gusset/engine/statics"
)

// numbering maps node components to global freedoms and global freedoms to
// equations (the rows of the stiffness matrix of unconstrained freedoms).
type numbering struct {
	dim        int
	rotational []bool    // per node: has rotations
	first      []int     // per node: its first global freedom
	total      int       // global freedoms
	node       []int     // per freedom: its node
	component  []int     // per freedom: model.X .. model.RZ
	equation   []int     // per freedom: equation index, or -1 when fixed
	prescribed []float64 // per freedom: prescribed value (fixed freedoms)
	spring     []float64 // per freedom: spring stiffness (free freedoms)
	equations  int
	// freedomOf lists, per equation, its global freedom.
	freedomOf []int
	// supportOf gives, per freedom, the support that carries its reaction
	// (the first that fixes or springs it), or -1.
	supportOf     []int
	anyPrescribed bool
	// axes gives, per node, the axes of an inclined support there (its
	// freedoms are then components along them, see incline.go), or is nil
	// when no support is inclined.
	axes []*[3][3]float64
}

// componentOffset returns the position of component c within a node's
// freedoms in a model of dimension dim.
func componentOffset(dim, c int) int {
	if dim == 2 && c == model.RZ {
		return 2
	}
	return c
}

// hasComponent reports whether component c exists in a model of dimension
// dim at a node with (or without) rotations.
func hasComponent(dim, c int, rotational bool) bool {
	if c < dim {
		return true
	}
	if !rotational {
		return false
	}
	return c >= model.RX && (dim == 3 || c == model.RZ)
}

// newNumbering numbers m's freedoms node by node and its equations in
// freedom order. Its per-freedom arrays are counted first and allocated
// once (grown by append they cost several times their size).
func newNumbering(m *model.Model) *numbering {
	nb := &numbering{dim: m.Dim, rotational: statics.RotationalNodes(m)}
	nb.first = make([]int, m.NodeCount())
	for n := range m.NodeCount() {
		nb.first[n] = nb.total
		nb.total += len(statics.NodeComponents(m.Dim, nb.rotational[n]))
	}
	nb.node = make([]int, 0, nb.total)
	nb.component = make([]int, 0, nb.total)
	for n := range m.NodeCount() {
		for _, c := range statics.NodeComponents(m.Dim, nb.rotational[n]) {
			nb.node = append(nb.node, n)
			nb.component = append(nb.component, c)
		}
	}
	fixed := nb.setSupports(m)
	nb.equation = make([]int, nb.total)
	for f := range nb.total {
		if !fixed[f] {
			nb.equations++
		}
	}
	nb.freedomOf = make([]int, 0, nb.equations)
	for f := range nb.total {
		if fixed[f] {
			nb.equation[f] = -1
			continue
		}
		nb.equation[f] = len(nb.freedomOf)
		nb.freedomOf = append(nb.freedomOf, f)
	}
	return nb
}

// setSupports fills in the prescribed displacements, springs and reaction
// owners of m's supports over nb's freedoms (new slices, so that a copy of
// a numbering can take another model's values) and returns which freedoms
// are fixed.
func (nb *numbering) setSupports(m *model.Model) (fixed []bool) {
	nb.prescribed = make([]float64, nb.total)
	nb.spring = make([]float64, nb.total)
	nb.supportOf = make([]int, nb.total)
	nb.anyPrescribed = false
	nb.axes = model.NodeAxes(m)
	for i := range nb.supportOf {
		nb.supportOf[i] = -1
	}
	fixed = make([]bool, nb.total)
	nb.holdFreeRotations(m, fixed)
	for si, s := range m.Supports {
		for c := range 6 {
			if !hasComponent(m.Dim, c, nb.rotational[s.Node]) {
				continue
			}
			f := nb.first[s.Node] + componentOffset(m.Dim, c)
			switch {
			case s.Fixed[c]:
				if !fixed[f] {
					nb.prescribed[f] = s.Displacement[c]
					nb.anyPrescribed = nb.anyPrescribed || s.Displacement[c] != 0
				}
				fixed[f] = true
			case s.Spring[c] > 0:
				nb.spring[f] += s.Spring[c]
			default:
				continue
			}
			if nb.supportOf[f] < 0 {
				nb.supportOf[f] = si
			}
		}
	}
	for f := range nb.total {
		if fixed[f] {
			nb.spring[f] = 0
		}
	}
	return fixed
}

// freedom returns the global freedom of component c at node n, or -1.
func (nb *numbering) freedom(n, c int) int {
	if !hasComponent(nb.dim, c, nb.rotational[n]) {
		return -1
	}
	return nb.first[n] + componentOffset(nb.dim, c)
}
