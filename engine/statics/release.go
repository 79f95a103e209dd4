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
	rot := RotationalNodes(m)
	// resist[n] is Σ d·dᵀ over the directions d (unit vectors, global
	// axes) about which some member end at node n resists rotation.
	resist := make([][3][3]float64, m.NodeCount())
	blame := make([]int, m.NodeCount()) // a released member at the node
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
			continue // reported by the callers' orientation checks
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
				d := axes[c-model.RX]
				for i := range 3 {
					for j := range 3 {
						resist[n][i][j] += d[i] * d[j]
					}
				}
			}
		}
	}
	inclined := make([]bool, m.NodeCount())
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
			for i := range 3 {
				for j := range 3 {
					resist[sp.Node][i][j] += d[i] * d[j]
				}
			}
		}
	}
	free = make([]uint8, m.NodeCount())
	for n := range free {
		if !rot[n] || blame[n] < 0 {
			continue
		}
		if m.Dim == 2 {
			if resist[n][2][2] <= freeTolerance {
				free[n] = model.ReleaseBit(model.RZ)
			}
			continue
		}
		bits, aligned := freeAxes(&resist[n])
		if !aligned {
			e := blame[n]
			return nil, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d/releases", e),
				"member %q: the releases leave node %q free to rotate about an axis along no global axis, which no member resists; release the torsion (\"rx\") there too, or fix the node's rotations in a support",
				m.Members[e].ID, m.NodeIDs[n])
		}
		if all := model.ReleaseBit(model.RX) | model.ReleaseBit(model.RY) | model.ReleaseBit(model.RZ); bits != 0 && bits != all && inclined[n] {
			// The node's freedoms are in the support's axes, the free
			// rotations in global ones.
			e := blame[n]
			return nil, fault.At(fault.InvalidModel, fmt.Sprintf("/members/%d/releases", e),
				"member %q: the releases leave node %q free to rotate about some axes but not others, at a support with directions of its own; release all three rotations there, or fix the node's rotations in the support",
				m.Members[e].ID, m.NodeIDs[n])
		}
		free[n] = bits
	}
	return free, nil
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
