package statics

import (
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// Released reports whether member force quantity q of mem is zero because
// of its end releases: a bending moment at an end released about that
// axis, and the torque of a 3D beam released in torsion at either end (a
// torque is constant along the member, so one released end frees it).
func Released(mem *model.Member, q Quantity) bool {
	switch q {
	case Torsion:
		return mem.Released(0, model.RX) || mem.Released(1, model.RX)
	case MomentZ1:
		return mem.Released(0, model.RZ)
	case MomentZ2:
		return mem.Released(1, model.RZ)
	case MomentY1:
		return mem.Released(0, model.RY)
	case MomentY2:
		return mem.Released(1, model.RY)
	}
	return false
}

// freeTolerance is the size of a member end's resisting directions,
// relative to one, below which a node rotation counts as resisted by none.
const freeTolerance = 1e-9

// FreeRotations returns, per node, the global rotation components (bit
// c − model.RX for component c) that no member end resists and no support
// fixes or springs: every beam at the node is released about them (a hinge joining released beams, or a
// released beam at a node only bars reach). No member takes a moment
// about such a rotation, so it is no freedom of the structure: the
// stiffness method holds it at zero without a reaction and the
// equilibrium matrix has no row for it. The slice is nil when no member
// has releases. err is an InvalidModel fault, pointing at a member's
// releases, when a node's unresisted rotations lie along no global axis
// (a skew 3D beam released in bending but not in torsion at a node no
// other beam reaches): release its torsion there too, or fix the node's
// rotations in a support.
func FreeRotations(m *model.Model) (free []uint8, err error) {
	if !m.HasReleases() {
		return nil, nil
	}
	resist, blame := memberResistance(m)
	inclined := supportResistance(m, resist)
	rot := RotationalNodes(m)
	free = make([]uint8, m.NodeCount())
	for n := range free {
		if !rot[n] || blame[n] < 0 {
			continue
		}
		if free[n], err = nodeFreeRotations(m, n, &resist[n], blame[n], inclined[n]); err != nil {
			return nil, err
		}
	}
	return free, nil
}

// memberResistance returns, per node, Σ d·dᵀ over the directions d (unit
// vectors, global axes) about which some beam end at the node resists
// rotation, and blame: a member with releases at each node (−1 where none
// ends), which an error about the node points at. Beams whose axes cannot
// be formed are skipped: the callers' orientation checks report them.
func memberResistance(m *model.Model) (resist [][3][3]float64, blame []int) {
	resist = make([][3][3]float64, m.NodeCount())
	blame = make([]int, m.NodeCount())
	for i := range blame {
		blame[i] = -1
	}
	for e := range m.Members {
		mem := &m.Members[e]
		if mem.Kind != model.Beam {
			continue
		}
		axes, ok := MemberAxes(m, e)
		if !ok {
			continue
		}
		for side, n := range mem.Ends {
			if mem.HasReleases() {
				blame[n] = e
			}
			for c := model.RX; c <= model.RZ; c++ {
				if m.Dim == 2 && c != model.RZ {
					continue
				}
				if mem.Released(side, c) || (c == model.RX && Released(mem, Torsion)) {
					continue
				}
				addOuter(&resist[n], axes[c-model.RX])
			}
		}
	}
	return resist, blame
}

// supportResistance adds to resist, per node, d·dᵀ for each rotation
// direction d a support fixes or springs (the support's own axes where it
// has directions, else the global ones), and returns which nodes have a
// support with directions of its own.
func supportResistance(m *model.Model, resist [][3][3]float64) (inclined []bool) {
	inclined = make([]bool, m.NodeCount())
	for _, sp := range m.Supports {
		inclined[sp.Node] = inclined[sp.Node] || sp.Inclined
		for c := model.RX; c <= model.RZ; c++ {
			if !sp.Fixed[c] && !(sp.Spring[c] > 0) {
				continue
			}
			var d [3]float64
			if sp.Inclined {
				d = sp.Axes[c-model.RX]
			} else {
				d[c-model.RX] = 1
			}
			addOuter(&resist[sp.Node], d)
		}
	}
	return inclined
}

// addOuter adds d·dᵀ to s.
func addOuter(s *[3][3]float64, d [3]float64) {
	for i := range 3 {
		for j := range 3 {
			s[i][j] += d[i] * d[j]
		}
	}
}

// nodeFreeRotations returns the free rotation bits of node n, a rotational
// node where member blame has releases, from its resisting directions s;
// inclined says the node has a support with directions of its own. It
// fails as FreeRotations documents.
func nodeFreeRotations(m *model.Model, n int, s *[3][3]float64, blame int, inclined bool) (uint8, error) {
	if m.Dim == 2 {
		if s[2][2] <= freeTolerance {
			return model.ReleaseBit(model.RZ), nil
		}
		return 0, nil
	}
	bits, aligned := freeAxes(s)
	if !aligned {
		return 0, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d/releases", blame),
			"member %q: the releases leave node %q free to rotate about an axis along no global axis, which no member resists; release the torsion (\"rx\") there too, or fix the node's rotations in a support",
			m.Members[blame].ID, m.NodeIDs[n])
	}
	if all := model.ReleaseBit(model.RX) | model.ReleaseBit(model.RY) | model.ReleaseBit(model.RZ); bits != 0 && bits != all && inclined {
		// The node's freedoms are in the support's axes, the free
		// rotations in global ones.
		return 0, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d/releases", blame),
			"member %q: the releases leave node %q free to rotate about some axes but not others, at a support with directions of its own; release all three rotations there, or fix the node's rotations in a support",
			m.Members[blame].ID, m.NodeIDs[n])
	}
	return bits, nil
}

// freeAxes returns the global rotation components along which the
// resisting directions s (Σ d·dᵀ) give no stiffness, and whether those
// components span every such direction: the unresisted directions are
// s's null space, of dimension 3 − rank(s).
func freeAxes(s *[3][3]float64) (bits uint8, aligned bool) {
	count := 0
	for c := range 3 {
		if s[c][c] <= freeTolerance { // e_cᵀ·s·e_c = Σ (d·e_c)², so every d ⊥ e_c
			bits |= model.ReleaseBit(model.RX + c)
			count++
		}
	}
	return bits, count == 3-rank3(s)
}

// rank3 returns the rank of the symmetric positive semidefinite 3×3
// matrix s, whose entries are sums of squares of unit vectors' entries
// (so of order one), by Gaussian elimination with full pivoting.
func rank3(s *[3][3]float64) int {
	a := *s
	rank := 0
	used := [3]bool{}
	usedCol := [3]bool{}
	for range 3 {
		bi, bj, best := -1, -1, freeTolerance
		for i := range 3 {
			for j := range 3 {
				if !used[i] && !usedCol[j] && math.Abs(a[i][j]) > best {
					bi, bj, best = i, j, math.Abs(a[i][j])
				}
			}
		}
		if bi < 0 {
			break
		}
		used[bi], usedCol[bj] = true, true
		rank++
		for i := range 3 {
			if i == bi {
				continue
			}
			f := a[i][bj] / a[bi][bj]
			for j := range 3 {
				a[i][j] -= f * a[bi][j]
			}
		}
	}
	return rank
}
