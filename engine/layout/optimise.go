package layout

import (
	"context"
	"errors"
	"fmt"
	"math"
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
	// Violators counts the candidates outside the program whose ratio
	// exceeds 1 + Options.AddTolerance.
	Violators int
}

// Optimise finds the least-volume pin-jointed layout that carries the
// problem's load cases to its supports within the stress limits, over the
// candidate members of the problem's ground structure, in the plane or in
// space.
//
// Progress is reported per member-adding iteration (stage "member adding",
// partial a Round) and per interior-point iteration (stage "interior
// point"); ctx cancels the work between iterations and inside the search
// for violating candidates. Bad input is a *fault.Error of kind
// InvalidModel (no interior, no supports, a load or support away from
// every node or inside a hole, too many candidates, with the counts) or
// MissingData (no stress limits); loads that cannot reach a support
// through the candidates give kind Infeasible.
func Optimise(ctx context.Context, p Problem, opt Options, rep progress.Reporter) (*Layout, error) {
	dim, err := checkProblem(&p)
	if err != nil {
		return nil, err
	}
	opt = opt.withDefaults(dim)
	rep = progress.Or(rep)
	dom, err := newDomain(&p, dim)
	if err != nil {
		return nil, err
	}
	g, err := buildGround(ctx, &p, dim, dom, opt)
	if err != nil {
		return nil, err
	}
	if g.count == 0 {
		return nil, fault.At(fault.Infeasible, "/domain", "the ground structure has no candidate members")
	}
	fixed, loads, err := placeForces(&p, g, opt)
	if err != nil {
		return nil, err
	}
	if err := checkReach(ctx, g, fixed, loads); err != nil {
		return nil, err
	}
	st := newSetting(g, &p, fixed)
	res, err := st.solveCases(ctx, &p, opt, loads, rep)
	if err != nil {
		return nil, err
	}
	out, err := st.finish(res, opt)
	if err != nil {
		return nil, err
	}
	if dom != nil {
		outline, holes := dom.edges()
		for _, e := range outline {
			out.DomainEdges = append(out.DomainEdges, [2][3]float64(e))
		}
		for _, e := range holes {
			out.HoleEdges = append(out.HoleEdges, [2][3]float64(e))
		}
	}
	return out, nil
}

// checkProblem checks the problem's scalars and counts and returns its
// dimension.
func checkProblem(p *Problem) (int, error) {
	dim := p.Dim
	if dim == 0 {
		dim = 2
	}
	if dim != 2 && dim != 3 {
		return 0, fault.At(fault.InvalidModel, "/dimension", "the dimension must be 2 (a plane layout) or 3 (a space layout), got %d", p.Dim)
	}
	if !(p.TensionLimit > 0) || !(p.CompressionLimit > 0) || !finite(p.TensionLimit) || !finite(p.CompressionLimit) {
		return 0, fault.At(fault.MissingData, "/tension_limit", "positive, finite tension and compression limits are needed (got %g and %g)", p.TensionLimit, p.CompressionLimit)
	}
	if err := checkLimitScale(p); err != nil {
		return 0, err
	}
	if !(p.JointCost >= 0) || !finite(p.JointCost) {
		return 0, fault.At(fault.InvalidModel, "/joint_cost", "the joint cost must be a finite length ≥ 0, got %g", p.JointCost)
	}
	if len(p.Cases) == 0 {
		return 0, fault.At(fault.InvalidModel, "/cases", "at least one load case is needed")
	}
	if len(p.Supports) == 0 {
		return 0, fault.At(fault.InvalidModel, "/supports", "at least one support is needed")
	}
	if p.Mode == SingleEquivalent && len(p.Cases) > 1 && (len(p.Cases) != 2 || p.TensionLimit != p.CompressionLimit) {
		return 0, fault.At(fault.InvalidModel, "/mode", "the single-case equivalent needs exactly 2 cases and equal stress limits (got %d cases, limits %g and %g)", len(p.Cases), p.TensionLimit, p.CompressionLimit)
	}
	return dim, nil
}

// newDomain checks the design domain; it is nil for the caller's own nodes
// without one.
func newDomain(p *Problem, dim int) (space, error) {
	if dim == 3 {
		if len(p.Nodes) > 0 && len(p.Solid.Vertices) == 0 {
			return nil, nil
		}
		return newSolid(p.Solid)
	}
	if len(p.Nodes) > 0 && len(p.Domain.Outline) == 0 {
		return nil, nil
	}
	return newRegion(p.Domain)
}

// placeForces finds the nodes of the supports and loads and returns the
// fixed freedoms per node and the nodal loads per case.
func placeForces(p *Problem, g *groundStructure, opt Options) (fixed [][3]bool, loads [][]vec, err error) {
	snap := opt.SnapTolerance
	if snap <= 0 {
		snap = 0.01 * g.spacing
	}
	fixed = make([][3]bool, len(g.nodes))
	anyFixed := false
	for s, sup := range p.Supports {
		node, err := g.locate(sup.Node, sup.At, pointer("/supports", s), snap)
		if err != nil {
			return nil, nil, err
		}
		for c := 0; c < g.dim; c++ {
			fixed[node][c] = fixed[node][c] || sup.Fix[c]
			anyFixed = anyFixed || sup.Fix[c]
		}
	}
	if !anyFixed {
		return nil, nil, fault.At(fault.InvalidModel, "/supports", "no support fixes any freedom")
	}
	loads = make([][]vec, len(p.Cases))
	for k, cs := range p.Cases {
		loads[k] = make([]vec, len(g.nodes))
		for l, ld := range cs.Loads {
			path := fmt.Sprintf("/cases/%d/loads/%d", k, l)
			for c := 0; c < g.dim; c++ {
				if !finite(ld.Force[c]) {
					return nil, nil, fault.At(fault.InvalidModel, path+"/force", "the force is not a finite number")
				}
			}
			node, err := g.locate(ld.Node, ld.At, path, snap)
			if err != nil {
				return nil, nil, err
			}
			for c := 0; c < g.dim; c++ {
				loads[k][node][c] += ld.Force[c]
			}
		}
	}
	return fixed, loads, nil
}

// locate returns the node a load or support names, or the node within snap
// of its point; a point inside a hole, outside the domain or away from
// every node is refused with the reason.
func (g *groundStructure) locate(node int, at vec, path string, snap float64) (int, error) {
	if node >= 0 {
		if node >= len(g.nodes) {
			return 0, fault.At(fault.InvalidModel, path+"/node", "node %d does not exist (%d nodes)", node, len(g.nodes))
		}
		return node, nil
	}
	if g.dim == 2 {
		at[2] = 0
	}
	where := formatPoint(at, g.dim)
	if g.dom != nil {
		if h := g.dom.holeAt(at); h >= 0 {
			return 0, fault.At(fault.InvalidModel, path+"/at", "the point %s lies inside hole %d of the design domain, where no member may go; move it to the hole's edge or outside it", where, h)
		}
		if !g.dom.contains(at) {
			return 0, fault.At(fault.InvalidModel, path+"/at", "the point %s lies outside the design domain", where)
		}
	}
	best, bestDist := -1, math.Inf(1)
	for i, q := range g.nodes {
		if d := norm(sub(q, at)); d < bestDist {
			best, bestDist = i, d
		}
	}
	if bestDist > snap {
		return 0, fault.At(fault.InvalidModel, path+"/at", "no node within %g of %s: the nearest node, at %s, is %g away; loads and supports must sit at nodes (within a hundredth of the node spacing), so move the point or change the divisions", snap, where, formatPoint(g.nodes[best], g.dim), bestDist)
	}
	return best, nil
}

func formatPoint(p vec, dim int) string {
	parts := make([]string, dim)
	for a := range parts {
		parts[a] = fmt.Sprintf("%g", p[a])
	}
	return "(" + strings.Join(parts, ", ") + ")"
}

// checkReach reports a loaded node with no path of candidates to a
// supported node, by a breadth-first search that generates each node's
// candidates once.
func checkReach(ctx context.Context, g *groundStructure, fixed [][3]bool, loads [][]vec) error {
	n := len(g.nodes)
	reached := make([]bool, n)
	var queue []int32
	for i := range fixed {
		if fixed[i] != [3]bool{} {
			reached[i] = true
			queue = append(queue, int32(i))
		}
	}
	var buf []int32
	for head := 0; head < len(queue); head++ {
		if head%64 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		buf = g.neighbours(int(queue[head]), false, buf)
		for _, w := range buf {
			if !reached[w] {
				reached[w] = true
				queue = append(queue, w)
			}
		}
	}
	for k, f := range loads {
		for i := range f {
			if f[i] != (vec{}) && !reached[i] {
				return fault.At(fault.Infeasible, fmt.Sprintf("/cases/%d", k), "the load at node %d %s cannot reach any support through the candidate members", i, formatPoint(g.nodes[i], g.dim))
			}
		}
	}
	return nil
}

// newSetting numbers the equilibrium rows (the free freedoms) and sets
// the penalty of the artificial forces.
func newSetting(g *groundStructure, p *Problem, fixed [][3]bool) *setting {
	st := &setting{g: g, dim: g.dim, tension: p.TensionLimit, compr: p.CompressionLimit, jointCost: p.JointCost, nearBand: 1}
	if g.dim == 3 {
		st.nearBand = nearBandSpace
	}
	st.rowOf = make([][3]int, len(g.nodes))
	for i := range st.rowOf {
		for c := 0; c < 3; c++ {
			st.rowOf[i][c] = -1
			if c < g.dim && !fixed[i][c] {
				st.rowOf[i][c] = st.freeRows
				st.rowNode = append(st.rowNode, i)
				st.rowComp = append(st.rowComp, int8(c))
				st.freeRows++
			}
		}
	}
	lo, hi := g.nodes[0], g.nodes[0]
	for _, q := range g.nodes {
		for a := 0; a < 3; a++ {
			lo[a], hi[a] = min(lo[a], q[a]), max(hi[a], q[a])
		}
	}
	// The artificial force costs far more than any member path could, but
	// not so much that it spoils the conditioning.
	st.penalty = 1e3 * (norm(sub(hi, lo)) + p.JointCost) / min(p.TensionLimit, p.CompressionLimit)
	return st
}

// nearBandSpace is setting.nearBand in space, where every program solved
// costs far more than in the plane, so adding candidates close to
// violating saves rounds that would add only a few members each. Measured
// on the 16 × 8 × 8 BenchmarkSpaceBridge (CPU time, interior-point
// iterations, rounds): 1 (violators only) 22.6 s, 74, 6; 0.97 16.7 s, 52,
// 4; 0.9 20.3 s, 54, 4 (more members make each factorisation dearer).
const nearBandSpace = 0.97

// rowLoads returns a case's nodal loads on the equilibrium rows.
func (st *setting) rowLoads(f []vec) []float64 {
	out := make([]float64, st.freeRows)
	for r, node := range st.rowNode {
		out[r] = f[node][st.rowComp[r]]
	}
	return out
}

// solveCases solves the problem's cases in its mode.
func (st *setting) solveCases(ctx context.Context, p *Problem, opt Options, loads [][]vec, rep progress.Reporter) (outcome, error) {
	res := outcome{fixed: make([][3]bool, len(st.g.nodes)), loads: loads, stats: Stats{Candidates: st.g.count, Nodes: len(st.g.nodes)}}
	for i := range res.fixed {
		for c := 0; c < 3; c++ {
			res.fixed[i][c] = st.rowOf[i][c] < 0 && c < st.dim
		}
	}
	for _, cs := range p.Cases {
		res.caseIDs = append(res.caseIDs, cs.ID)
	}
	var err error
	switch {
	case len(p.Cases) == 1 || p.Mode == Alternatives:
		for _, f := range loads {
			st.loads = append(st.loads, st.rowLoads(f))
		}
		res.members, res.forces, err = st.solve(ctx, opt, &res.stats, rep)
	case p.Mode == Together:
		total := make([]vec, len(st.g.nodes))
		for _, f := range loads {
			for i := range f {
				for c := 0; c < 3; c++ {
					total[i][c] += f[i][c]
				}
			}
		}
		res.loads = [][]vec{total}
		res.caseIDs = []string{strings.Join(res.caseIDs, "+")}
		st.loads = [][]float64{st.rowLoads(total)}
		res.members, res.forces, err = st.solve(ctx, opt, &res.stats, rep)
	case p.Mode == SingleEquivalent:
		res.members, res.forces, err = st.solveEquivalent(ctx, opt, &res.stats, rep, st.rowLoads(loads[0]), st.rowLoads(loads[1]))
	default:
		panic("layout: unknown Mode")
	}
	return res, err
}

// allCandidates lists every candidate, for the methods that solve one
// program over all of them.
func (g *groundStructure) allCandidates() []candidate {
	out := make([]candidate, 0, g.count)
	var buf []int32
	for a := range g.nodes {
		buf = g.neighbours(a, true, buf)
		for _, b := range buf {
			out = append(out, candidate{int32(a), b})
		}
	}
	return out
}

// solve runs the chosen method on the setting's load cases and returns the
// members of the final program and their forces per case.
func (st *setting) solve(ctx context.Context, opt Options, stats *Stats, rep progress.Reporter) ([]candidate, [][]float64, error) {
	switch opt.Method {
	case AllCandidates:
		prog := st.build(st.useful(st.g.allCandidates()))
		res, err := st.run(ctx, prog, opt, nil, stats, rep)
		if err != nil {
			return nil, nil, err
		}
		stats.Iterations = 1
		stats.MembersInProgram = len(prog.members)
		return st.accept(prog, res.x)
	case DenseSimplex:
		prog := st.build(st.useful(st.g.allCandidates()))
		if prog.a.rows*prog.a.cols > opt.DenseSimplexLimit {
			return nil, nil, fault.At(fault.InvalidModel, "/method", "the dense simplex method is for small problems: %d rows × %d columns exceeds the limit of %d entries", prog.a.rows, prog.a.cols, opt.DenseSimplexLimit)
		}
		x, err := denseSimplex(prog)
		if err != nil {
			return nil, nil, fault.New(fault.Infeasible, "the simplex method found no layout: %v", err)
		}
		stats.Iterations = 1
		stats.MembersInProgram = len(prog.members)
		return st.accept(prog, x)
	}
	return st.addMembers(ctx, opt, stats, rep)
}

// useful drops the candidates between two fully fixed nodes, whose
// columns in the program are empty (gonum's simplex method refuses an
// empty column).
func (st *setting) useful(list []candidate) []candidate {
	out := list[:0]
	for _, c := range list {
		rows, _ := st.column(c)
		if len(rows) > 0 {
			out = append(out, c)
		}
	}
	return out
}

// run solves one program by the interior-point method, from warm (nil
// for Mehrotra's starting point; a warm start that fails to converge is
// retried from Mehrotra's point).
func (st *setting) run(ctx context.Context, prog *program, opt Options, warm *warmPoint, stats *Stats, rep progress.Reporter) (*lpResult, error) {
	res, err := interiorPoint(ctx, prog.a, prog.b, prog.c, prog.rowCoord, opt.Tolerance, warm, rep)
	if warm != nil && errors.Is(err, errNoConvergence) {
		stats.InteriorPointIterations += res.iterations
		res, err = interiorPoint(ctx, prog.a, prog.b, prog.c, prog.rowCoord, opt.Tolerance, nil, rep)
	}
	if err != nil {
		return nil, st.runError(err, prog)
	}
	stats.InteriorPointIterations += res.iterations
	return res, nil
}

// runError words an interior-point failure.
func (st *setting) runError(err error, prog *program) error {
	if errors.Is(err, errNoConvergence) {
		return fault.New(fault.Infeasible, "the layout program did not converge over %d members; the loads may not be carried to the supports", len(prog.members))
	}
	return err
}

// accept checks the artificial forces of a solution and returns its forces.
func (st *setting) accept(prog *program, x []float64) ([]candidate, [][]float64, error) {
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
