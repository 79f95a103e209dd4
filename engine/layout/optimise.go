package layout

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/progress"
)

// Round is the progress partial sent after each member-adding iteration.
type Round struct {
	Iteration    int     // 1 for the first program
	Members      int     // members in the program just solved
	Added        int     // members added for the next program (0 at the end)
	Volume       float64 // objective of the program just solved
	MaxViolation float64 // largest virtual strain over its limit, as a ratio (≤ 1 means none)
}

// Optimise finds the least-volume pin-jointed layout that carries the
// problem's load cases to its supports within the stress limits, over the
// candidate members of the problem's ground structure.
//
// Progress is reported per member-adding iteration (stage "member adding",
// partial a Round) and per interior-point iteration (stage "interior
// point"); ctx cancels the work between iterations. Bad input is a
// *fault.Error of kind InvalidModel (no interior, no supports, a load or
// support away from every node, too many candidates, with the counts) or
// MissingData (no stress limits); loads that cannot reach a support through
// the candidates give kind Infeasible.
func Optimise(ctx context.Context, p Problem, opt Options, rep progress.Reporter) (*Layout, error) {
	opt = opt.withDefaults()
	rep = progress.Or(rep)
	if !(p.TensionLimit > 0) || !(p.CompressionLimit > 0) || !finite(p.TensionLimit) || !finite(p.CompressionLimit) {
		return nil, fault.At(fault.MissingData, "/tension_limit", "positive, finite tension and compression limits are needed (got %g and %g)", p.TensionLimit, p.CompressionLimit)
	}
	if !(p.JointCost >= 0) || !finite(p.JointCost) {
		return nil, fault.At(fault.InvalidModel, "/joint_cost", "the joint cost must be a finite length ≥ 0, got %g", p.JointCost)
	}
	if len(p.Cases) == 0 {
		return nil, fault.At(fault.InvalidModel, "/cases", "at least one load case is needed")
	}
	if len(p.Supports) == 0 {
		return nil, fault.At(fault.InvalidModel, "/supports", "at least one support is needed")
	}
	var reg *region
	if len(p.Nodes) == 0 || len(p.Domain.Outline) > 0 {
		var err error
		if reg, err = newRegion(p.Domain); err != nil {
			return nil, err
		}
	}
	g, err := buildGround(ctx, &p, reg, opt)
	if err != nil {
		return nil, err
	}
	if len(g.candidates) == 0 {
		return nil, fault.At(fault.Infeasible, "/domain", "the ground structure has no candidate members")
	}
	snap := opt.SnapTolerance
	if snap <= 0 {
		snap = 0.01 * g.spacing
	}
	locate := func(node int, at [2]float64, path string) (int, error) {
		if node >= 0 {
			if node >= len(g.nodes) {
				return 0, fault.At(fault.InvalidModel, path+"/node", "node %d does not exist (%d nodes)", node, len(g.nodes))
			}
			return node, nil
		}
		best, bestDist := -1, math.Inf(1)
		for i, q := range g.nodes {
			if d := math.Hypot(q[0]-at[0], q[1]-at[1]); d < bestDist {
				best, bestDist = i, d
			}
		}
		if bestDist > snap {
			return 0, fault.At(fault.InvalidModel, path+"/at", "no node within %g of (%g, %g): the nearest is %g away", snap, at[0], at[1], bestDist)
		}
		return best, nil
	}

	n := len(g.nodes)
	fixed := make([][2]bool, n)
	anyFixed := false
	for s, sup := range p.Supports {
		node, err := locate(sup.Node, sup.At, pointer("/supports", s))
		if err != nil {
			return nil, err
		}
		for c := 0; c < 2; c++ {
			fixed[node][c] = fixed[node][c] || sup.Fix[c]
			anyFixed = anyFixed || sup.Fix[c]
		}
	}
	if !anyFixed {
		return nil, fault.At(fault.InvalidModel, "/supports", "no support fixes any freedom")
	}
	caseIDs := make([]string, len(p.Cases))
	nodalLoads := make([][][2]float64, len(p.Cases))
	for k, cs := range p.Cases {
		caseIDs[k] = cs.ID
		nodalLoads[k] = make([][2]float64, n)
		for l, ld := range cs.Loads {
			path := fmt.Sprintf("/cases/%d/loads/%d", k, l)
			if !finite(ld.Force[0]) || !finite(ld.Force[1]) {
				return nil, fault.At(fault.InvalidModel, path+"/force", "the force is not a finite number")
			}
			node, err := locate(ld.Node, ld.At, path)
			if err != nil {
				return nil, err
			}
			nodalLoads[k][node][0] += ld.Force[0]
			nodalLoads[k][node][1] += ld.Force[1]
		}
	}
	if err := checkReach(g, fixed, nodalLoads); err != nil {
		return nil, err
	}

	st := &setting{g: g, tension: p.TensionLimit, compr: p.CompressionLimit, jointCost: p.JointCost}
	st.rowOf = make([][2]int, n)
	for i := range st.rowOf {
		for c := 0; c < 2; c++ {
			st.rowOf[i][c] = -1
			if !fixed[i][c] {
				st.rowOf[i][c] = st.freeRows
				st.rowNode = append(st.rowNode, i)
				st.freeRows++
			}
		}
	}
	lo, hi := g.nodes[0], g.nodes[0]
	for _, q := range g.nodes {
		for a := 0; a < 2; a++ {
			lo[a], hi[a] = min(lo[a], q[a]), max(hi[a], q[a])
		}
	}
	diameter := math.Hypot(hi[0]-lo[0], hi[1]-lo[1])
	// The artificial force costs far more than any member path could, but
	// not so much that it spoils the conditioning.
	st.penalty = 1e3 * (diameter + p.JointCost) / min(p.TensionLimit, p.CompressionLimit)

	rowLoads := func(f [][2]float64) []float64 {
		out := make([]float64, st.freeRows)
		for r, node := range st.rowNode {
			comp := 0
			if st.rowOf[node][1] == r {
				comp = 1
			}
			out[r] = f[node][comp]
		}
		return out
	}
	stats := Stats{Candidates: len(g.candidates), Nodes: n}

	var memberSet []int
	var forces [][]float64
	switch {
	case len(p.Cases) == 1 || p.Mode == Alternatives:
		for _, f := range nodalLoads {
			st.loads = append(st.loads, rowLoads(f))
		}
		memberSet, forces, err = st.solve(ctx, opt, &stats, rep)
	case p.Mode == Together:
		total := make([][2]float64, n)
		for _, f := range nodalLoads {
			for i := range f {
				total[i][0] += f[i][0]
				total[i][1] += f[i][1]
			}
		}
		nodalLoads = [][][2]float64{total}
		caseIDs = []string{strings.Join(caseIDs, "+")}
		st.loads = [][]float64{rowLoads(total)}
		memberSet, forces, err = st.solve(ctx, opt, &stats, rep)
	case p.Mode == SingleEquivalent:
		if len(p.Cases) != 2 || p.TensionLimit != p.CompressionLimit {
			return nil, fault.At(fault.InvalidModel, "/mode", "the single-case equivalent needs exactly 2 cases and equal stress limits (got %d cases, limits %g and %g)", len(p.Cases), p.TensionLimit, p.CompressionLimit)
		}
		memberSet, forces, err = st.solveEquivalent(ctx, opt, &stats, rep, rowLoads(nodalLoads[0]), rowLoads(nodalLoads[1]))
	default:
		panic("layout: unknown Mode")
	}
	if err != nil {
		return nil, err
	}
	return st.finish(memberSet, forces, fixed, nodalLoads, caseIDs, opt, stats)
}

// checkReach reports a loaded node with no path of candidates to a
// supported node.
func checkReach(g *groundStructure, fixed [][2]bool, loads [][][2]float64) error {
	n := len(g.nodes)
	start := make([]int, n+1)
	for _, c := range g.candidates {
		start[c.a+1]++
		start[c.b+1]++
	}
	for i := 0; i < n; i++ {
		start[i+1] += start[i]
	}
	next := append([]int(nil), start[:n]...)
	neighbours := make([]int32, start[n])
	for _, c := range g.candidates {
		neighbours[next[c.a]] = c.b
		next[c.a]++
		neighbours[next[c.b]] = c.a
		next[c.b]++
	}
	reached := make([]bool, n)
	var queue []int32
	for i := range fixed {
		if fixed[i][0] || fixed[i][1] {
			reached[i] = true
			queue = append(queue, int32(i))
		}
	}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		for _, w := range neighbours[start[v]:start[v+1]] {
			if !reached[w] {
				reached[w] = true
				queue = append(queue, w)
			}
		}
	}
	for k, f := range loads {
		for i := range f {
			if (f[i][0] != 0 || f[i][1] != 0) && !reached[i] {
				return fault.At(fault.Infeasible, fmt.Sprintf("/cases/%d", k), "the load at node %d (%g, %g) cannot reach any support through the candidate members", i, g.nodes[i][0], g.nodes[i][1])
			}
		}
	}
	return nil
}

// solve runs the chosen method on the setting's load cases and returns the
// members of the final program (candidate indices) and their forces per
// case.
func (st *setting) solve(ctx context.Context, opt Options, stats *Stats, rep progress.Reporter) ([]int, [][]float64, error) {
	all := make([]int, len(st.g.candidates))
	for i := range all {
		all[i] = i
	}
	switch opt.Method {
	case AllCandidates:
		prog := st.build(all)
		res, err := st.run(ctx, prog, opt, stats, rep)
		if err != nil {
			return nil, nil, err
		}
		stats.Iterations = 1
		stats.MembersInProgram = len(all)
		return st.accept(prog, res.x)
	case DenseSimplex:
		prog := st.build(all)
		if prog.a.rows*prog.a.cols > opt.DenseSimplexLimit {
			return nil, nil, fault.At(fault.InvalidModel, "/method", "the dense simplex method is for small problems: %d rows × %d columns exceeds the limit of %d entries", prog.a.rows, prog.a.cols, opt.DenseSimplexLimit)
		}
		x, err := denseSimplex(prog)
		if err != nil {
			return nil, nil, fault.New(fault.Infeasible, "the simplex method found no layout: %v", err)
		}
		stats.Iterations = 1
		stats.MembersInProgram = len(all)
		return st.accept(prog, x)
	}
	return st.addMembers(ctx, opt, stats, rep)
}

// run solves one program by the interior-point method.
func (st *setting) run(ctx context.Context, prog *program, opt Options, stats *Stats, rep progress.Reporter) (*lpResult, error) {
	res, err := interiorPoint(ctx, prog.a, prog.b, prog.c, prog.rowCoord, opt.Tolerance, rep)
	if errors.Is(err, errNoConvergence) {
		return nil, fault.New(fault.Infeasible, "the layout program did not converge over %d members; the loads may not be carried to the supports", len(prog.members))
	}
	if err != nil {
		return nil, err
	}
	stats.InteriorPointIterations += res.iterations
	return res, nil
}

// accept checks the artificial forces of a solution and returns its forces.
func (st *setting) accept(prog *program, x []float64) ([]int, [][]float64, error) {
	forces, artificial := prog.forces(x)
	for k, f := range st.loads {
		scale := 0.0
		for _, v := range f {
			scale += math.Abs(v)
		}
		if scale == 0 {
			// An unloaded case needs no members; the solver's round-off
			// must not become members.
			clear(forces[k])
			continue
		}
		if artificial[k] > 1e-6*scale {
			return nil, nil, fault.At(fault.Infeasible, fmt.Sprintf("/cases/%d", k), "the loads cannot be carried to the supports through the candidate members: %.3g of %.3g force units stay unbalanced", artificial[k], scale)
		}
	}
	return prog.members, forces, nil
}

// addMembers is the member-adding scheme of Gilbert & Tyas (2003).
func (st *setting) addMembers(ctx context.Context, opt Options, stats *Stats, rep progress.Reporter) ([]int, [][]float64, error) {
	g := st.g
	inProgram := make([]bool, len(g.candidates))
	members := append([]int(nil), g.start...)
	for _, k := range members {
		inProgram[k] = true
	}
	capAdd := opt.AddPerIteration
	violation := make([]float64, len(g.candidates))
	// Intermediate programs only choose members to add, so they are solved
	// to a looser tolerance; once no candidate violates, the last program is
	// solved again at full accuracy and checked once more.
	loose := opt
	loose.Tolerance = max(opt.Tolerance, 1e-6)
	accurate := loose.Tolerance == opt.Tolerance
	for iteration := 1; ; iteration++ {
		if err := ctx.Err(); err != nil {
			return nil, nil, err
		}
		prog := st.build(members)
		solveWith := loose
		if accurate {
			solveWith = opt
		}
		res, err := st.run(ctx, prog, solveWith, stats, rep)
		if err != nil {
			return nil, nil, err
		}
		stats.Iterations = iteration
		stats.MembersInProgram = len(members)
		u := prog.displacements(st, res.y)
		worst := 0.0
		var violators []int
		for k, c := range g.candidates {
			if inProgram[k] {
				continue
			}
			e := st.unit(k)
			ratio := 0.0
			for _, uc := range u {
				ua, ub := uc[c.a], uc[c.b]
				elongation := e[0]*(ub[0]-ua[0]) + e[1]*(ub[1]-ua[1])
				ratio += max(st.tension*elongation, -st.compr*elongation, 0)
			}
			ratio /= st.cost(k)
			violation[k] = ratio
			worst = max(worst, ratio)
			if ratio > 1+opt.AddTolerance {
				violators = append(violators, k)
			}
		}
		stats.OptimalityGap = max(0, worst-1)
		limit := capAdd
		if limit <= 0 {
			limit = max(200, len(members)/5)
		}
		added := min(limit, len(violators))
		rep.Progress("member adding", iteration, 0, Round{Iteration: iteration, Members: len(members), Added: added, Volume: res.objective, MaxViolation: worst})
		if len(violators) == 0 || iteration >= opt.MaxIterations {
			if !accurate {
				accurate = true
				continue
			}
			return st.accept(prog, res.x)
		}
		sort.Slice(violators, func(i, j int) bool { return violation[violators[i]] > violation[violators[j]] })
		for _, k := range violators[:added] {
			inProgram[k] = true
			members = append(members, k)
		}
		stats.Added += added
	}
}

// solveEquivalent solves two alternative cases as the single cases
// (f¹+f²)/2 and (f¹−f²)/2 and superposes them (Hemp 1973; from memory).
func (st *setting) solveEquivalent(ctx context.Context, opt Options, stats *Stats, rep progress.Reporter, f1, f2 []float64) ([]int, [][]float64, error) {
	plus, minus := make([]float64, len(f1)), make([]float64, len(f1))
	for i := range f1 {
		plus[i] = (f1[i] + f2[i]) / 2
		minus[i] = (f1[i] - f2[i]) / 2
	}
	union := make(map[int][2]float64)
	for part, f := range [][]float64{plus, minus} {
		if maxAbs(f) == 0 {
			continue
		}
		st.loads = [][]float64{f}
		var partStats Stats
		members, forces, err := st.solve(ctx, opt, &partStats, rep)
		if err != nil {
			return nil, nil, err
		}
		stats.Iterations += partStats.Iterations
		stats.InteriorPointIterations += partStats.InteriorPointIterations
		stats.MembersInProgram += partStats.MembersInProgram
		stats.Added += partStats.Added
		stats.OptimalityGap = max(stats.OptimalityGap, partStats.OptimalityGap)
		for i, k := range members {
			q := union[k]
			q[part] = forces[0][i]
			union[k] = q
		}
	}
	st.loads = [][]float64{f1, f2}
	members := make([]int, 0, len(union))
	for k := range union {
		members = append(members, k)
	}
	sort.Ints(members)
	forces := [][]float64{make([]float64, len(members)), make([]float64, len(members))}
	for i, k := range members {
		q := union[k]
		forces[0][i] = q[0] + q[1]
		forces[1][i] = q[0] - q[1]
	}
	return members, forces, nil
}
