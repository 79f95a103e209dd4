package stiffness

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
)

// Low-rank passes of the active-set iteration.
//
// After the first passes only a few one-sided members switch. Each is a
// bar, whose stiffness (E·A/L)·w·wᵀ (w = [−c, c] over its end
// translations, c its unit axis) is of rank one, so the scaled matrix of
// the new set is S + G·C·Gᵀ, with S the last one factorised, G's columns
// g = √(E·A/L)·D^(-1/2)·w of the switched members and C = diag(±1): +1 for
// a member back in, −1 for one out. The Sherman–Morrison–Woodbury
// identity (G. H. Golub and C. F. Van Loan, "Matrix Computations", 4th
// ed., 2013, §2.1.4, from memory) solves it with S's factor:
// y = t − Z·M⁻¹·Gᵀ·t, t = S⁻¹·b, Z = S⁻¹·G, M = C⁻¹ + Gᵀ·Z (r×r), at the
// cost of one solve per switched member (kept while S stays) instead of an
// assembly and a numeric factorisation. One step of iterative refinement
// on the updated matrix follows. It is used without second order (whose
// geometric stiffness changes every member) and without prescribed
// displacements (whose load terms depend on the set), for at most
// maxLowRank members, while one solve per member costs less than an
// assembly and a factorisation; an ill-conditioned M (the new set is, or nears, a
// mechanism) falls back to a factorisation, which then reports it.
type lowRank struct {
	base []bool              // the inactive flags of the factorised S (nil: all active)
	sys  *system             // S, scaled, and its factor
	z    map[int][]float64   // S⁻¹·g per switched member, for this S
	g    map[int]sparseEntry // g per switched member
}

// sparseEntry is a short vector over equations.
type sparseEntry struct {
	eq  []int
	val []float64
}

// maxLowRank bounds the switched members of a low-rank pass.
const maxLowRank = 64

// reset records a fresh factorisation of the state st.
func (lr *lowRank) reset(sys *system, st *memberState) {
	lr.base = append([]bool(nil), st.inactive...)
	lr.sys = sys
	lr.z = map[int][]float64{}
	lr.g = map[int]sparseEntry{}
}

// switched returns the members whose activity in st differs from the
// factorised state's, or ok false when a low-rank pass does not apply.
func (lr *lowRank) switched(it *iteration, st *memberState) (members []int, ok bool) {
	r := it.r
	if lr.sys == nil || it.so != nil || r.nb.anyPrescribed || lr.sys.fac == nil {
		return nil, false
	}
	limit := maxLowRank
	if sf, isSparse := lr.sys.fac.(sparseFactor); isSparse {
		// One solve costs about 4·nnz(L) flops at about half the rate
		// of a factorisation (it is memory-bound), which costs Flops,
		// plus an assembly of about a quarter of it: measured on the
		// braced roof of BenchmarkTensionOnlyRoof (0.4 ms against 6 ms),
		// a solve is worth Flops/(6·nnz(L)) of a pass. The rule depends
		// on the structure alone, never on timings, so that identical
		// requests stay byte-identical.
		st := sf.c.Stats()
		limit = min(limit, int(st.Flops/(6*float64(max(1, st.NonzerosL)))))
	} else {
		limit = min(limit, lr.sys.k.N/6) // n³/3 against 2n² per solve
	}
	base := &memberState{inactive: lr.base}
	for e := range r.m.Members {
		if base.active(e) != st.active(e) {
			if r.m.Members[e].Kind != model.Bar || len(members) == limit {
				return nil, false
			}
			members = append(members, e)
		}
	}
	return members, true
}

// column returns g for bar e (see lowRank), building it once.
func (lr *lowRank) column(it *iteration, e int) sparseEntry {
	if g, ok := lr.g[e]; ok {
		return g
	}
	m, nb := it.r.m, it.r.nb
	var el element
	el.build(m, nb, e)
	var w [12]float64
	p := el.perNode
	for c := range p {
		w[c], w[p+c] = -el.axes[0][c], el.axes[0][c]
	}
	nb.turnForces(&el, w[:])
	root := math.Sqrt(el.ea / el.length)
	var g sparseEntry
	for i := range el.size {
		if eq := nb.equation[el.dofs[i]]; eq >= 0 && w[i] != 0 {
			g.eq = append(g.eq, eq)
			g.val = append(g.val, root*w[i]*lr.sys.scale[eq])
		}
	}
	lr.g[e] = g
	return g
}

// solve solves the updated system for the loads f (unscaled, equations)
// into u, returning false when M is too ill-conditioned to trust.
func (lr *lowRank) solve(it *iteration, st *memberState, members []int, f, u []float64) bool {
	sys := lr.sys
	n, r := len(f), len(members)
	gs := make([]sparseEntry, r)
	zs := make([][]float64, r)
	for k, e := range members {
		gs[k] = lr.column(it, e)
		if lr.z[e] == nil {
			dense := make([]float64, n)
			for i, eq := range gs[k].eq {
				dense[eq] = gs[k].val[i]
			}
			z := make([]float64, n)
			sys.fac.solve(z, dense)
			lr.z[e] = z
		}
		zs[k] = lr.z[e]
	}
	mm := mat.NewDense(r, r, nil)
	for a := range r {
		sign := 1.0
		if !st.active(members[a]) {
			sign = -1
		}
		for b := range r {
			v := dotSparse(gs[a], zs[b])
			if a == b {
				v += sign // C⁻¹ = C for entries ±1
			}
			mm.Set(a, b, v)
		}
	}
	var lu mat.LU
	lu.Factorize(mm)
	if c := lu.Cond(); !(c < 1e10) {
		return false
	}
	b := make([]float64, n)
	for i := range b {
		b[i] = f[i] * sys.scale[i]
	}
	y := lr.apply(sys, gs, zs, &lu, b)
	// One step of refinement on S + G·C·Gᵀ.
	res := make([]float64, n)
	sys.k.MulVec(res, y)
	for k, g := range gs {
		sign := 1.0
		if !st.active(members[k]) {
			sign = -1
		}
		d := sign * dotSparse(g, y)
		for i, eq := range g.eq {
			res[eq] += d * g.val[i]
		}
	}
	for i := range res {
		res[i] = b[i] - res[i]
	}
	dy := lr.apply(sys, gs, zs, &lu, res)
	for i := range u {
		u[i] = (y[i] + dy[i]) * sys.scale[i]
	}
	return true
}

// apply returns (S + G·C·Gᵀ)⁻¹·b by the Woodbury identity.
func (lr *lowRank) apply(sys *system, gs []sparseEntry, zs [][]float64, lu *mat.LU, b []float64) []float64 {
	t := make([]float64, len(b))
	sys.fac.solve(t, b)
	rhs := mat.NewVecDense(len(gs), nil)
	for k, g := range gs {
		rhs.SetVec(k, dotSparse(g, t))
	}
	var x mat.VecDense
	if err := lu.SolveVecTo(&x, false, rhs); err != nil {
		// The condition was checked; a failure here leaves t, which the
		// refinement step then corrects as far as it can.
		return t
	}
	for k, z := range zs {
		xk := x.AtVec(k)
		for i := range t {
			t[i] -= z[i] * xk
		}
	}
	return t
}

func dotSparse(g sparseEntry, x []float64) float64 {
	var s float64
	for i, eq := range g.eq {
		s += g.val[i] * x[eq]
	}
	return s
}
