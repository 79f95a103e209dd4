package formfind

import (
	"context"
	"errors"
	"fmt"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/sparse"
)

// network is the matrix D of the free nodes in a fixed sparse pattern, with
// its analysis kept across factorisations.
type network struct {
	m         *model.Model
	free      []int // node → free index, or −1 for a fixed node
	freeNodes []int // free index → node
	pattern   *sparse.Matrix
	// slots[e] holds the positions in pattern.Val of member e's entries
	// (i,i), (j,j), (i,j); −1 where an end is fixed.
	slots    [][3]int
	analysis *sparse.Analysis
	chol     *sparse.Cholesky
	sign     float64 // the factorised matrix is sign·D
	opt      sparse.Options
}

func newNetwork(m *model.Model, fixed []bool, opt sparse.Options) *network {
	nw := &network{m: m, free: make([]int, m.NodeCount()), opt: opt, slots: make([][3]int, len(m.Members))}
	for i, f := range fixed {
		nw.free[i] = -1
		if !f {
			nw.free[i] = len(nw.freeNodes)
			nw.freeNodes = append(nw.freeNodes, i)
		}
	}
	nw.pattern = sparse.NewPattern(len(nw.freeNodes), func(visit func(i, j int)) {
		for _, mem := range m.Members {
			a, b := nw.free[mem.Ends[0]], nw.free[mem.Ends[1]]
			if a >= 0 && b >= 0 {
				visit(a, b)
			}
		}
	})
	for e, mem := range m.Members {
		a, b := nw.free[mem.Ends[0]], nw.free[mem.Ends[1]]
		s := [3]int{-1, -1, -1}
		if a >= 0 {
			s[0] = nw.pattern.Find(a, a)
		}
		if b >= 0 {
			s[1] = nw.pattern.Find(b, b)
		}
		if a >= 0 && b >= 0 {
			s[2] = nw.pattern.Find(a, b)
		}
		nw.slots[e] = s
	}
	return nw
}

// assemble fills the pattern with sign·D(q).
func (nw *network) assemble(q []float64, sign float64) {
	val := nw.pattern.Val
	clear(val)
	for e, s := range nw.slots {
		v := sign * q[e]
		if s[0] >= 0 {
			val[s[0]] += v
		}
		if s[1] >= 0 {
			val[s[1]] += v
		}
		if s[2] >= 0 && s[2] != s[0] {
			val[s[2]] -= v
		}
	}
}

// factorise factorises D(q) (all q ≥ 0), −D(q) (all q ≤ 0) or, with mixed
// signs, whichever of the two is definite; it fails with the nodes whose
// pivots failed and, for mixed signs, the members in compression.
func (nw *network) factorise(ctx context.Context, q []float64) error {
	var pos, neg bool
	for _, v := range q {
		pos = pos || v > 0
		neg = neg || v < 0
	}
	signs := []float64{1}
	switch {
	case neg && !pos:
		signs = []float64{-1}
	case neg && pos:
		signs = []float64{1, -1}
	}
	var err error
	for _, s := range signs {
		nw.assemble(q, s)
		if nw.analysis == nil {
			// Minimum degree alone: force density networks are nets and
			// shells (surfaces), where it is close to nested dissection,
			// and trying both costs more than it saves. On a 225 × 225
			// net (50k free nodes) the analysis took 0.08 s of CPU against
			// 0.20 s for choosing between the two, for a factor 11%
			// larger and factorisations alike (0.07 s against 0.06 s).
			opt := nw.opt
			opt.Perm = sparse.Order(nw.pattern)
			nw.analysis = sparse.Analyse(nw.pattern, opt)
		}
		if nw.chol == nil {
			nw.chol, err = sparse.FactorizeWith(ctx, nw.pattern, nw.analysis, nw.opt)
		} else {
			err = nw.chol.Refactorize(ctx, nw.pattern)
		}
		if err == nil {
			nw.sign = s
			return nil
		}
		var pe *sparse.PivotError
		if !errors.As(err, &pe) {
			return err
		}
		nw.chol = nil
	}
	return nw.singular(err, q, pos && neg)
}

// singular turns a pivot failure into an error naming the nodes concerned.
func (nw *network) singular(err error, q []float64, mixed bool) error {
	var pe *sparse.PivotError
	errors.As(err, &pe)
	fe := &fault.Error{Kind: fault.Unstable}
	var names []string
	for k, col := range pe.Columns {
		node := nw.freeNodes[col]
		if k < 8 {
			names = append(names, fmt.Sprintf("%q", nw.m.NodeIDs[node]))
		}
		fe.Problems = append(fe.Problems, fault.Problem{Path: fmt.Sprintf("/model/nodes/%d", node),
			Message: fmt.Sprintf("node %q is not held: the force densities of its members give no stiffness against a move (pivot %.3g)", nw.m.NodeIDs[node], pe.Pivots[k])})
	}
	if !mixed {
		fe.Message = fmt.Sprintf("The force density matrix is singular at node(s) %s: join every free node to a support through members with non-zero force densities.", strings.Join(names, ", "))
		return fe
	}
	fe.Message = fmt.Sprintf("The force densities mix tension and compression and their matrix is indefinite or singular (first at node(s) %s): neither D nor −D is positive definite, so no unique form exists for them. Change the signs or sizes of the force densities listed.", strings.Join(names, ", "))
	for e, v := range q {
		if v < 0 && len(fe.Problems) < 64 {
			fe.Problems = append(fe.Problems, fault.Problem{Path: fmt.Sprintf("/force_densities/%d", e),
				Message: fmt.Sprintf("member %q has a negative (compression) force density %g among positive ones", nw.m.Members[e].ID, v)})
		}
	}
	return fe
}

// rightHandSides writes, per axis k, sign·(tLoad·p + D_f(q)·x_f) restricted
// to the free nodes into rhs[k]: the fixed ends' pull with tLoad = 0 for
// the part the through scaling leaves alone.
func (nw *network) rightHandSides(rhs [][]float64, q, loads, coords []float64, tLoad float64, withFixed bool) {
	d := nw.m.Dim
	for k := range rhs {
		clear(rhs[k])
	}
	if tLoad != 0 {
		for f, node := range nw.freeNodes {
			for k := 0; k < d; k++ {
				rhs[k][f] = nw.sign * tLoad * loads[node*d+k]
			}
		}
	}
	if !withFixed {
		return
	}
	for e, mem := range nw.m.Members {
		a, b := nw.free[mem.Ends[0]], nw.free[mem.Ends[1]]
		if (a >= 0) == (b >= 0) {
			continue
		}
		f, fixedNode := a, mem.Ends[1]
		if a < 0 {
			f, fixedNode = b, mem.Ends[0]
		}
		for k := 0; k < d; k++ {
			rhs[k][f] += nw.sign * q[e] * coords[fixedNode*d+k]
		}
	}
}
