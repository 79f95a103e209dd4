package stiffness

import (
	"context"

	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// Matrices is the stiffness matrix of a model's unconstrained freedoms,
// scaled to unit diagonal, with the numbering that maps its equations to
// node components and the means to assemble further matrices of the same
// structure (a geometric stiffness, a mass matrix) member by member. It is
// what an eigenvalue analysis needs from the stiffness method.
//
// The scaling is S = D·K·D with D = diag(K)^(−1/2) (Scale), so that pivots
// do not depend on the mix of force and moment units; a freedom without
// stiffness keeps D = 1. Every matrix assembled with AddMember is scaled
// the same way, which leaves the eigenvalues of a pencil (S, D·B·D) those of
// (K, B); an eigenvector y of the scaled pencil is x = D·y.
type Matrices struct {
	// K is the scaled stiffness S (lower triangle), springs included.
	K *sparse.Matrix
	// Scale holds D per equation.
	Scale []float64
	// Node and Component give, per equation, its node and its component
	// (model.X .. model.RZ).
	Node, Component []int
	// Symbolic is the ordering and symbolic factorisation of K's
	// structure, for sparse.FactorizeWith on any matrix of that structure
	// (nil when there are no equations).
	Symbolic *sparse.Analysis
	// Unrestrained lists the equations with no stiffness at all (a node
	// that no member or spring holds in that component).
	Unrestrained []int

	nb  *numbering
	pat *pattern
}

// Assemble builds the scaled stiffness matrix of m's unconstrained
// freedoms (supports fixed, prescribed displacements ignored) and its
// symbolic analysis. It returns the errors of Solve for data the analysis
// cannot use (a *fault.Error of kind InvalidModel) and ctx.Err() when ctx
// is cancelled; a mechanism is not an error here (the matrix is singular
// and a factorisation reports it). opt's Workers and Reporter are used.
func Assemble(ctx context.Context, m *model.Model, opt Options) (*Matrices, error) {
	opt = opt.withDefaults()
	nb := newNumbering(m)
	if err := validate(m, nb); err != nil {
		return nil, err
	}
	pat := newPattern(m, nb)
	sys, err := assemble(ctx, m, nb, pat, opt.Workers, progress.Or(opt.Reporter))
	if err != nil {
		return nil, err
	}
	mx := &Matrices{K: sys.k, Scale: sys.scale, Unrestrained: sys.zero, nb: nb, pat: pat}
	mx.Node = make([]int, nb.equations)
	mx.Component = make([]int, nb.equations)
	for eq, f := range nb.freedomOf {
		mx.Node[eq], mx.Component[eq] = nb.node[f], nb.component[f]
	}
	if nb.equations > 0 {
		mx.Symbolic = sparse.Analyse(sys.k, sparse.Options{Workers: opt.Workers})
	}
	return mx, nil
}

// Equation returns the equation of component c (model.X .. model.RZ) at
// node n, or −1 when that freedom is fixed or does not exist.
func (mx *Matrices) Equation(n, c int) int {
	f := mx.nb.freedom(n, c)
	if f < 0 {
		return -1
	}
	return mx.nb.equation[f]
}

// NewMatrix returns a matrix with K's structure and all values zero.
func (mx *Matrices) NewMatrix() *sparse.Matrix {
	k := mx.K
	return &sparse.Matrix{N: k.N, ColPtr: k.ColPtr, RowIdx: k.RowIdx, Val: make([]float64, len(k.Val))}
}

// MemberFreedoms returns the number of freedoms per end of member e in its
// local matrix: Dim translations for a bar; u, v, θz for a 2D beam; u, v,
// w, θx, θy, θz for a 3D beam (local axes, x from the first end to the
// second, y and z as Solve's end forces use them).
func MemberFreedoms(m *model.Model, e int) int {
	switch {
	case m.Members[e].Kind != model.Beam:
		return m.Dim
	case m.Dim == 2:
		return 3
	}
	return 6
}

// AddMember adds to dst, a matrix of K's structure, member e's matrix
// local (row-major, 2·MemberFreedoms(m, e) square, symmetric) given in
// the member's local axes: it is turned to global axes (Tᵀ·local·T),
// scaled by Scale, and its entries at unconstrained freedoms are added.
// For a beam with end releases, local is first reduced as its stiffness
// is condensed (the released rotations following the unreleased
// freedoms; see condenseMatrix in release.go); local is not modified.
// m must be the model given to Assemble.
func (mx *Matrices) AddMember(dst *sparse.Matrix, m *model.Model, e int, local []float64) {
	var el element
	el.build(m, mx.nb, e)
	n := el.size
	if len(local) != n*n {
		panic("stiffness: AddMember with a local matrix of the wrong size")
	}
	var reduced [144]float64
	if el.rel.n > 0 || el.rel.twist != [2]bool{} {
		copy(reduced[:n*n], local)
		el.condenseMatrix(reduced[:n*n])
		local = reduced[:n*n]
	}
	// g = tᵀ·local·t
	var lt, g [144]float64
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += local[i*n+l] * el.t[l*n+j]
			}
			lt[i*n+j] = s
		}
	}
	for i := range n {
		for j := range n {
			var s float64
			for l := range n {
				s += el.t[l*n+i] * lt[l*n+j]
			}
			g[i*n+j] = s
		}
	}
	mx.nb.turnElement(&el, g[:])
	mem := m.Members[e]
	k := -1
	if mem.Ends[0] != mem.Ends[1] {
		k = mx.pat.neighbour(min(mem.Ends[0], mem.Ends[1]), max(mem.Ends[0], mem.Ends[1]))
	}
	for i := range n {
		ei := mx.nb.equation[el.dofs[i]]
		if ei < 0 {
			continue
		}
		for j := range n {
			ej := mx.nb.equation[el.dofs[j]]
			if ej < 0 || ej > ei {
				continue
			}
			ni, nj := mem.Ends[i/el.perNode], mem.Ends[j/el.perNode]
			dst.Val[mx.pat.position(ei, ej, nj, ni, k)] += g[i*n+j] * mx.Scale[ei] * mx.Scale[ej]
		}
	}
}
