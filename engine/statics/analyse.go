package statics

import (
	"context"
	"math"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// DefaultDenseLimit is the default Options.DenseLimit. A full SVD of a
// 1000×1000 equilibrium matrix takes a few seconds on one core.
const DefaultDenseLimit = 1000

// DefaultRankTolerance is the default Options.RankTolerance.
const DefaultRankTolerance = 1e-10

// Options configures Analyse. The zero value is ready to use.
type Options struct {
	// DenseLimit is the largest number of rows or columns of the
	// equilibrium matrix for which the rank, self-stress states and
	// mechanisms are computed by dense SVD (O(n³) time, O(n²) memory).
	// Above it the report has Computed false. Zero means DefaultDenseLimit;
	// a negative value computes the count alone.
	DenseLimit int
	// RankTolerance is the singular value, relative to the largest, at or
	// below which a singular value counts as zero. Zero means
	// DefaultRankTolerance.
	RankTolerance float64
}

// Report is the result of Analyse: Maxwell's extended counting rule
// c − n + k = s − m, where for a pin-jointed model c = b (bars) and
// n = d·j, so that it reads b − d·j + k = s − m.
type Report struct {
	Dimension   int // d
	Joints      int // j, all nodes
	Bars        int // members of kind bar
	Beams       int // members of kind beam
	Columns     int // c, independent member forces (b for a pin-jointed model)
	Freedoms    int // n − k, the unconstrained freedoms (rows of A)
	Constraints int // k, fixed components at nodes where they exist
	// MaxwellNumber is c − n + k (b − d·j + k for bars), which equals
	// SelfStress − Mechanisms. It is known even when Computed is false.
	MaxwellNumber int

	// Computed reports whether Rank, SelfStress and Mechanisms are known;
	// when false they are zero. CountedBy says how: "svd" (the equilibrium
	// matrix was small enough, Options.DenseLimit, and the states and
	// modes are filled in) or "stiffness" (set by the stiffness solver from
	// a successful factorisation of a model without springs, where a
	// positive definite K = A·D·Aᵀ means rank A = Freedoms; states and
	// modes are then nil).
	Computed   bool
	CountedBy  string
	Rank       int // r, rank of the equilibrium matrix
	SelfStress int // s = c − r
	// Mechanisms is m = (n − k) − r, every independent inextensional
	// motion including rigid-body motions the supports do not prevent.
	Mechanisms int

	// Layout names the rows and columns of the equilibrium matrix.
	Layout *Layout
	// SelfStressStates is an orthonormal basis of the states of self-
	// stress; entry i of a state is the force of Layout.Columns[i] (for a
	// pin-jointed model, the axial force of member i, tension positive).
	// With beams, orthonormality holds with moments divided by the mean
	// member length. Each state's largest entry (first on ties) is
	// positive, so the basis is reproducible.
	SelfStressStates [][]float64
	// MechanismModes holds, per mechanism, the node translations: Dim
	// entries per node, fixed components zero. Modes are orthonormal over
	// the unconstrained freedoms (rotations multiplied by the mean member
	// length), with the largest entry positive.
	MechanismModes [][]float64
	// MechanismRotations holds, per mechanism, the node rotations: one
	// entry (about z) per node in 2D, three in 3D; nil when the model has
	// no beams.
	MechanismRotations [][]float64
}

// Analyse counts the states of self-stress and the mechanisms of m from
// the rank of its equilibrium matrix. It fails only when ctx is done
// (returning ctx.Err()) or a 3D beam has no local axes (InvalidModel).
func Analyse(ctx context.Context, m *model.Model, opt Options) (*Report, error) {
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if opt.DenseLimit == 0 {
		opt.DenseLimit = DefaultDenseLimit
	}
	if opt.RankTolerance <= 0 {
		opt.RankTolerance = DefaultRankTolerance
	}
	if err := checkOrientations(m); err != nil {
		return nil, err
	}
	if _, err := FreeRotations(m); err != nil {
		return nil, err
	}
	l := NewLayout(m)
	r := newReport(m, l)
	if r.Freedoms > opt.DenseLimit || r.Columns > opt.DenseLimit {
		return r, nil
	}
	lc := meanLength(m)
	var u, v *mat.Dense
	if a := equilibrium(m, l, lc); a != nil {
		var ok bool
		if r.Rank, u, v, ok = rankBySVD(a, opt.RankTolerance); !ok {
			// Dgesvd failed to converge: leave the count uncomputed
			// rather than guess.
			return r, nil
		}
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	r.Computed = true
	r.CountedBy = "svd"
	r.SelfStress = r.Columns - r.Rank
	r.Mechanisms = r.Freedoms - r.Rank
	r.selfStressStates(l, v, lc)
	r.mechanismModes(m, l, u, lc)
	r.turnModes(m)
	return r, nil
}

// checkOrientations reports a 3D beam whose orientation vector is parallel
// to it, which leaves its local axes undefined.
func checkOrientations(m *model.Model) error {
	for e := range m.Members {
		if m.Members[e].Kind != model.Beam || m.Dim != 3 {
			continue
		}
		if _, ok := MemberAxes(m, e); !ok {
			return fault.At(fault.InvalidModel, memberPointer(e)+"/orientation",
				"member %q: the orientation vector is parallel to the member", m.Members[e].ID)
		}
	}
	return nil
}

// newReport returns the counts that need no factorisation: joints, bars
// and beams, columns, freedoms, constraints and Maxwell's number.
func newReport(m *model.Model, l *Layout) *Report {
	r := &Report{
		Dimension:   m.Dim,
		Joints:      m.NodeCount(),
		Columns:     len(l.Columns),
		Freedoms:    len(l.Rows),
		Constraints: l.Constraints,
		Layout:      l,
	}
	for _, mem := range m.Members {
		if mem.Kind == model.Beam {
			r.Beams++
		} else {
			r.Bars++
		}
	}
	r.MaxwellNumber = r.Columns - (r.Freedoms + r.Constraints) + r.Constraints
	return r
}

// rankBySVD returns the rank of a (singular values above tolerance times
// the largest) and its full left and right singular vectors; ok is false
// when the decomposition does not converge.
func rankBySVD(a *mat.Dense, tolerance float64) (rank int, u, v *mat.Dense, ok bool) {
	var svd mat.SVD
	if !svd.Factorize(a, mat.SVDFull) {
		return 0, nil, nil, false
	}
	sigma := svd.Values(nil)
	tol := tolerance * sigma[0]
	for _, sv := range sigma {
		if sv > tol {
			rank++
		}
	}
	u, v = new(mat.Dense), new(mat.Dense)
	svd.UTo(u)
	svd.VTo(v)
	return rank, u, v, true
}

// selfStressStates fills r.SelfStressStates from the right singular
// vectors beyond the rank (unit vectors when v is nil: no equilibrium
// matrix), moments scaled back by the mean length lc.
func (r *Report) selfStressStates(l *Layout, v *mat.Dense, lc float64) {
	for k := r.Rank; k < r.Columns; k++ {
		state := make([]float64, r.Columns)
		for i := range state {
			if v == nil {
				state[i] = b2f(i == k)
			} else {
				state[i] = v.At(i, k)
			}
			if l.Columns[i].Quantity != Axial {
				state[i] *= lc
			}
		}
		fixSign(state)
		r.SelfStressStates = append(r.SelfStressStates, state)
	}
}

// mechanismModes fills r.MechanismModes (and MechanismRotations with
// beams) from the left singular vectors beyond the rank (unit vectors
// when u is nil), rotations scaled back by the mean length lc.
func (r *Report) mechanismModes(m *model.Model, l *Layout, u *mat.Dense, lc float64) {
	_, rotational := m.DOFsPerNode()
	for k := r.Rank; k < r.Freedoms; k++ {
		mode := make([]float64, m.Dim*m.NodeCount())
		var rot []float64
		if l.HasBeams {
			rot = make([]float64, rotational*m.NodeCount())
		}
		col := make([]float64, r.Freedoms)
		for i := range col {
			if u == nil {
				col[i] = b2f(i == k)
			} else {
				col[i] = u.At(i, k)
			}
		}
		fixSign(col)
		for i, f := range l.Rows {
			switch {
			case f.Component < model.RX:
				mode[f.Node*m.Dim+f.Component] = col[i]
			case m.Dim == 2:
				rot[f.Node] = col[i] / lc
			default:
				rot[f.Node*3+f.Component-model.RX] = col[i] / lc
			}
		}
		r.MechanismModes = append(r.MechanismModes, mode)
		if rot != nil {
			r.MechanismRotations = append(r.MechanismRotations, rot)
		}
	}
}

// meanLength returns the mean member length, or 1 for a model without
// members.
func meanLength(m *model.Model) float64 {
	if len(m.Members) == 0 {
		return 1
	}
	var sum float64
	for e := range m.Members {
		sum += m.Length(e)
	}
	return sum / float64(len(m.Members))
}

// fixSign flips v so that its entry of largest magnitude (the first one on
// ties) is positive.
func fixSign(v []float64) {
	best := 0
	for i := range v {
		if math.Abs(v[i]) > math.Abs(v[best]) {
			best = i
		}
	}
	if len(v) > 0 && v[best] < 0 {
		for i := range v {
			v[i] = -v[i]
		}
	}
}

func b2f(b bool) float64 {
	if b {
		return 1
	}
	return 0
}
