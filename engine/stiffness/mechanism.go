package stiffness

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// maxNamed caps the freedoms and nodes named in an error message.
const maxNamed = 20

// Mechanism is the Detail of an Unstable error.
type Mechanism struct {
	// Freedoms lists the freedoms involved: those that move in the modes
	// when the modes come from the null space of the stiffness matrix,
	// otherwise those whose pivots vanished.
	Freedoms []FreedomRef
	// Modes are the mechanism's node motions.
	Modes []Mode
	// FromNullSpace reports whether the modes are the null space of the
	// stiffness matrix (small models) rather than unit motions of the
	// freedoms whose pivots vanished.
	FromNullSpace bool
}

// FreedomRef names one nodal freedom.
type FreedomRef struct {
	Node      string
	NodeIndex int
	Component string // "x", "y", "z", "rx", "ry", "rz"
}

// Mode is a motion of the nodes: Dim translations per node and the
// rotations (nil for nodes without rotational freedom). Modes from the null
// space are scaled to unit length with their largest entry positive.
type Mode struct {
	Translations [][]float64
	Rotations    [][]float64
}

func freedomRef(m *model.Model, n, c int) FreedomRef {
	return FreedomRef{Node: m.NodeIDs[n], NodeIndex: n, Component: model.ComponentNames[c]}
}

func newMode(m *model.Model, nb *numbering) Mode {
	_, rot := m.DOFsPerNode()
	mode := Mode{Translations: make([][]float64, m.NodeCount()), Rotations: make([][]float64, m.NodeCount())}
	for n := range mode.Translations {
		mode.Translations[n] = make([]float64, m.Dim)
		if nb.rotational[n] {
			mode.Rotations[n] = make([]float64, rot)
		}
	}
	return mode
}

// set writes value at global freedom f of the mode.
func (mode Mode) set(m *model.Model, nb *numbering, f int, value float64) {
	n, c := nb.node[f], nb.component[f]
	if c < m.Dim {
		mode.Translations[n][c] = value
		return
	}
	if m.Dim == 2 {
		mode.Rotations[n][0] = value
		return
	}
	mode.Rotations[n][c-model.RX] = value
}

// mechanismError builds the Unstable error for the deficient equations.
// When the system is small enough, the modes are the eigenvectors of the
// scaled stiffness matrix s (nil otherwise) for its len(deficient)
// smallest eigenvalues, mapped back to displacements by scale.
func mechanismError(m *model.Model, nb *numbering, deficient []int, s *mat.SymDense, scale []float64) *fault.Error {
	detail := &Mechanism{}
	involved := make(map[int]bool)
	var eig mat.EigenSym
	if s != nil && eig.Factorize(s, true) {
		var vectors mat.Dense
		eig.VectorsTo(&vectors)
		detail.FromNullSpace = true
		for k := range min(len(deficient), nb.equations) {
			y := make([]float64, nb.equations)
			var norm, big float64
			for i := range y {
				y[i] = vectors.At(i, k) * scale[i]
				norm += y[i] * y[i]
				if math.Abs(y[i]) > math.Abs(big) {
					big = y[i]
				}
			}
			norm = math.Copysign(math.Sqrt(norm), big)
			mode := newMode(m, nb)
			for i, v := range y {
				v /= norm
				mode.set(m, nb, nb.freedomOf[i], v)
				if math.Abs(v) > 1e-6 {
					involved[nb.freedomOf[i]] = true
				}
			}
			detail.Modes = append(detail.Modes, mode)
		}
	} else {
		for _, eq := range deficient {
			mode := newMode(m, nb)
			mode.set(m, nb, nb.freedomOf[eq], 1)
			detail.Modes = append(detail.Modes, mode)
		}
	}
	if len(involved) == 0 {
		for _, eq := range deficient {
			involved[nb.freedomOf[eq]] = true
		}
	}
	freedoms := make([]int, 0, len(involved))
	for f := range involved {
		freedoms = append(freedoms, f)
	}
	slices.Sort(freedoms)
	var names []string
	var problems []fault.Problem
	seen := make(map[int]bool)
	for _, f := range freedoms {
		n, c := nb.node[f], nb.component[f]
		detail.Freedoms = append(detail.Freedoms, freedomRef(m, n, c))
		if len(names) < maxNamed {
			names = append(names, fmt.Sprintf("node %q %s", m.NodeIDs[n], model.ComponentNames[c]))
		}
		if !seen[n] && len(problems) < maxNamed {
			seen[n] = true
			problems = append(problems, fault.Problem{Path: fmt.Sprintf("/nodes/%d", n),
				Message: fmt.Sprintf("node %q moves in a mechanism", m.NodeIDs[n])})
		}
	}
	msg := fmt.Sprintf("the structure is unstable: %d mechanism(s) involving %s", len(deficient), strings.Join(names, ", "))
	if len(freedoms) > len(names) {
		msg += fmt.Sprintf(" and %d more freedoms", len(freedoms)-len(names))
	}
	msg += "; add members or supports to restrain them"
	return &fault.Error{Kind: fault.Unstable, Message: msg, Problems: problems, Detail: detail}
}
