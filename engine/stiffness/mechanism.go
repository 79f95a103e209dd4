package stiffness

import (
	"context"
	"fmt"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/sparse"
)

// maxNamed caps the freedoms and nodes named in an error message.
const maxNamed = 20

// Mechanism is the Detail of an Unstable error.
type Mechanism struct {
	// Freedoms lists the freedoms involved: those that move in the modes
	// when the modes come from the null space of the stiffness matrix,
	// otherwise those whose pivots vanished.
	Freedoms []FreedomRef
	// Modes are the mechanism's node motions, at most maxModes of them.
	Modes []Mode
	// FromNullSpace reports whether the modes span the null space of the
	// stiffness matrix (eigenvectors for small models, a basis from the
	// sparse factorisation above the stability limit) rather than unit
	// motions of the freedoms whose pivots vanished.
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

// maxModes caps the mechanism modes reported (each is as large as the
// model's displacements); further mechanisms are counted in the message and
// their freedoms named without a mode.
const maxModes = 16

// denseModes returns, as displacements, the eigenvectors of the scaled
// stiffness matrix s for its k smallest eigenvalues (gonum's EigenSym),
// mapped back by scale; nil if the decomposition fails.
func denseModes(s *mat.SymDense, scale []float64, k int) [][]float64 {
	var eig mat.EigenSym
	if !eig.Factorize(s, true) {
		return nil
	}
	var vectors mat.Dense
	eig.VectorsTo(&vectors)
	n, _ := s.Dims()
	var modes [][]float64
	for j := range min(k, n, maxModes) {
		y := make([]float64, n)
		for i := range y {
			y[i] = vectors.At(i, j) * scale[i]
		}
		modes = append(modes, y)
	}
	return modes
}

// sparseModes returns, as displacements, a basis of the null space of the
// scaled stiffness matrix K for a model too large for denseModes. The
// factorisation with deficient pivots replaced by 1 (their columns of L
// zeroed) is that of K_r = K + Σ_{d∈D} e_d·e_dᵀ over the deficient
// freedoms D, since K is positive semidefinite and its Schur complement
// vanishes on a column whose pivot vanishes. For v in the null space N of
// K, K_r·v = Σ v_d·e_d, and no nonzero v in N is zero on all of D (K_r
// would be singular), so K_r⁻¹·e_d lies in N for each d and these vectors
// span it (block elimination, derivable). They are orthonormalised by
// modified Gram–Schmidt in the scaled space, as the eigenvectors of the
// dense path are, then mapped back by the scaling. It returns nil when the
// factorisation fails (cancelled), and at most maxModes vectors.
func sparseModes(ctx context.Context, sys *system, opt Options) [][]float64 {
	k := sys.k
	c, err := sparse.Factorize(ctx, k, sparse.Options{Workers: opt.Workers, PivotTolerance: opt.PivotTolerance, Regularize: true})
	if err != nil {
		return nil
	}
	held := c.Deficient()
	n := k.N
	var basis [][]float64
	for _, d := range held[:min(len(held), maxModes)] {
		v := make([]float64, n)
		v[d] = 1
		c.Solve(v, v)
		for _, b := range basis {
			dot := 0.0
			for i := range v {
				dot += b[i] * v[i]
			}
			for i := range v {
				v[i] -= dot * b[i]
			}
		}
		norm := 0.0
		for _, x := range v {
			norm += x * x
		}
		norm = math.Sqrt(norm)
		if !(norm > 1e-8) {
			continue // dependent on the modes already found
		}
		for i := range v {
			v[i] /= norm
		}
		basis = append(basis, v)
	}
	modes := make([][]float64, len(basis))
	for j, b := range basis {
		modes[j] = make([]float64, n)
		for i, x := range b {
			modes[j][i] = x * sys.scale[i]
		}
	}
	return modes
}

// mechanismError builds the Unstable error for the deficient equations.
// modes, when not nil, are the mechanism's motions as displacements of the
// equations (from denseModes or sparseModes), scaled here to unit length
// with their largest entry positive; without them each deficient freedom
// gets a unit motion.
func mechanismError(m *model.Model, nb *numbering, deficient []int, modes [][]float64) *fault.Error {
	detail := &Mechanism{}
	involved := make(map[int]bool)
	if modes != nil {
		detail.FromNullSpace = true
		for _, y := range modes {
			var norm, big float64
			for _, v := range y {
				norm += v * v
				if math.Abs(v) > math.Abs(big) {
					big = v
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
			nb.turnMode(mode)
			detail.Modes = append(detail.Modes, mode)
		}
	} else {
		for _, eq := range deficient[:min(len(deficient), maxModes)] {
			mode := newMode(m, nb)
			mode.set(m, nb, nb.freedomOf[eq], 1)
			nb.turnMode(mode)
			detail.Modes = append(detail.Modes, mode)
		}
	}
	if len(involved) == 0 || len(deficient) > len(modes) {
		// No mode moved anything, or some mechanisms have no mode: the
		// freedoms whose pivots vanished are named as they are.
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
