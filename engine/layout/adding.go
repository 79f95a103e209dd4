package layout

import (
	"container/heap"
	"context"
	"runtime"
	"sort"
	"sync"

	"gusset/engine/progress"
)

// addMembers is the member-adding scheme of Gilbert & Tyas (2003): solve
// over the start members, price every candidate outside the program by
// its virtual strain under the dual displacements, add the most violating
// ones, and repeat until none violates.
//
// Every program keeps the start members of every node, so each node's
// dual displacement is held by a rigid lattice. Node activation (rows only
// for the nodes the members reach, the others' duals interpolated for
// pricing, exact by weak duality) was measured on BenchmarkSpaceBridge and
// did not pay: started from the short members along the lines from the
// load to the supports, the first programs need 2.6 times the optimal
// volume, and a node reached by one or a few members (or a group of such
// nodes, a mechanism) has a dual the program leaves free, which the
// interior-point method returns far from its neighbours', so pricing adds
// members everywhere (12 × 6 × 6: 14 rounds and 155 interior-point
// iterations against 3 and 34, every node active at the end). Keeping
// after the second round only the nodes within a lattice step of a member
// strained to 0.9 of its limit kept 1,262 of the 16 × 8 × 8 grid's 1,373:
// at its optimum the candidates within 10 % of their limit touch 766
// nodes.
func (st *setting) addMembers(ctx context.Context, opt Options, stats *Stats, rep progress.Reporter) ([]candidate, [][]float64, error) {
	members := st.useful(append([]candidate(nil), st.g.start...))
	inProgram := make(map[uint64]struct{}, 2*len(members))
	for _, c := range members {
		inProgram[c.key()] = struct{}{}
	}
	// Intermediate programs only choose members to add, so they are solved
	// to a looser tolerance; once no candidate violates, the last program's
	// solve is continued to full accuracy and its candidates priced again.
	loose := opt
	loose.Tolerance = max(opt.Tolerance, intermediateTolerance(st.dim))
	accurate := loose.Tolerance == opt.Tolerance
	var last *program      // the program of the last round
	var centred *warmPoint // its solve's central iterate
	for iteration := 1; ; iteration++ {
		if err := ctx.Err(); err != nil {
			return nil, nil, err
		}
		prog := st.build(members)
		solveWith := loose
		if iteration == 1 && !accurate {
			solveWith.Tolerance = max(loose.Tolerance, firstTolerance(st.dim))
		}
		if accurate {
			solveWith = opt
		}
		var warm *warmPoint
		if last != nil && len(members)-len(last.members) <= int(warmFraction*float64(len(members))) {
			warm = last.warmFor(prog, centred)
		}
		if warm != nil {
			stats.WarmStarts++
		}
		res, err := st.run(ctx, prog, solveWith, warm, stats, rep)
		if err != nil {
			return nil, nil, err
		}
		last, centred = prog, res.centred
		stats.Iterations = iteration
		stats.MembersInProgram = len(members)
		limit := opt.AddPerIteration
		if limit <= 0 {
			limit = max(200, len(members)/5)
		}
		pr, err := st.price(ctx, prog.displacements(st, res.y), inProgram, limit, 1+opt.AddTolerance)
		if err == nil && pr.violators == 0 && !accurate {
			accurate = true
			before := res.iterations
			if res, err = res.refine(ctx, opt.Tolerance); err != nil {
				return nil, nil, st.runError(err, prog)
			}
			stats.InteriorPointIterations += res.iterations - before
			pr, err = st.price(ctx, prog.displacements(st, res.y), inProgram, limit, 1+opt.AddTolerance)
		}
		if err != nil {
			return nil, nil, err
		}
		stats.OptimalityGap = max(0, pr.worst-1)
		if pr.violators == 0 || iteration >= opt.MaxIterations {
			pr.top = nil // near-violators alone are no reason to go on
		}
		round := Round{Iteration: iteration, Members: len(members), Added: len(pr.top),
			Volume: res.objective, MaxViolation: pr.worst, Violators: pr.violators}
		if opt.Rounds != nil {
			opt.Rounds.Record("member adding", iteration, 0, round)
		} else {
			rep.Progress("member adding", iteration, 0, nil)
		}
		if pr.violators == 0 || iteration >= opt.MaxIterations {
			return st.accept(prog, res.x)
		}
		for _, v := range pr.top {
			inProgram[v.c.key()] = struct{}{}
			members = append(members, v.c)
		}
		stats.Added += len(pr.top)
	}
}

// warmFraction is the largest share of new members in a program that is
// started from the last program's central iterate rather than from
// Mehrotra's point. Measured (interior-point iterations in all, 16 × 8 ×
// 8 BenchmarkSpaceBridge): with every program warm-started 80, with those
// of at most 5 % new members 44, 10 % 43, none 52: a point from a program
// without a fifth of the members is far from the new central path.
const warmFraction = 0.1

// firstTolerance is the interior-point tolerance of the first program of
// member adding, over the start members only, whose duals are a coarse
// guess anyway. Measured in space (interior-point iterations in all,
// with warm starts; 16 × 8 × 8 and 20 × 10 × 10 BenchmarkSpaceBridge):
// 1e-3 35 and 50, 1e-4 (the intermediate tolerance) 43 and 59; 3e-3 43
// and 3e-4 42 on the 16 × 8 × 8. In the plane it is the intermediate
// tolerance.
func firstTolerance(dim int) float64 {
	if dim == 3 {
		return 1e-3
	}
	return intermediateTolerance(dim)
}

// intermediateTolerance is the interior-point tolerance of the programs
// that only choose members to add. Measured (interior-point iterations in
// all, BenchmarkThreePoint and the 12 × 6 × 6 BenchmarkSpaceBridge): in the
// plane 1e-6 needs fewer (94 against 152 at 40 × 20: looser duals add
// poorer members and cost rounds); in space, where each factorisation
// costs far more, 1e-4 needs fewer (44 against 53).
func intermediateTolerance(dim int) float64 {
	if dim == 3 {
		return 1e-4
	}
	return 1e-6
}

// violator is a candidate with its ratio of virtual strain to the limit.
type violator struct {
	c     candidate
	ratio float64
}

// less orders violators from the least to the most violating, ties by
// candidate (the higher key counts as less), a total order so that the
// members added do not depend on the order of the search.
func (v violator) less(w violator) bool {
	if v.ratio != w.ratio {
		return v.ratio < w.ratio
	}
	return v.c.key() > w.c.key()
}

// worstFirst is a bounded min-heap of the most violating candidates.
type worstFirst []violator

func (h worstFirst) Len() int           { return len(h) }
func (h worstFirst) Less(i, j int) bool { return h[i].less(h[j]) }
func (h worstFirst) Swap(i, j int)      { h[i], h[j] = h[j], h[i] }
func (h *worstFirst) Push(x any)        { *h = append(*h, x.(violator)) }
func (h *worstFirst) Pop() any {
	old := *h
	v := old[len(old)-1]
	*h = old[:len(old)-1]
	return v
}

// offer keeps v if it is among the limit most violating seen.
func (h *worstFirst) offer(v violator, limit int) {
	if len(*h) < limit {
		heap.Push(h, v)
	} else if (*h)[0].less(v) {
		(*h)[0] = v
		heap.Fix(h, 0)
	}
}

// pricing is the outcome of one search for violating candidates.
type pricing struct {
	worst     float64    // largest ratio among candidates outside the program
	violators int        // candidates with ratio above the threshold
	top       []violator // the most violating, most violating first
}

// price generates every candidate outside the program, node by node,
// and measures its virtual strain under the dual displacements u against
// the dual limits: ratio = Σ over cases of max(σ_t ε, −σ_c ε) · L / cost,
// with ε the elongation per unit length. It returns the limit most
// violating among those with ratio above threshold. The nodes are shared
// among GOMAXPROCS workers; the result does not depend on their number.
func (st *setting) price(ctx context.Context, u [][]vec, inProgram map[uint64]struct{}, limit int, threshold float64) (pricing, error) {
	workers := min(runtime.GOMAXPROCS(0), 8)
	parts := make([]pricing, workers)
	heaps := make([]worstFirst, workers)
	var next int64
	var mu sync.Mutex
	const chunk = 32
	n := len(st.g.nodes)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			var buf []int32
			for ctx.Err() == nil {
				mu.Lock()
				from := int(next)
				next += chunk
				mu.Unlock()
				if from >= n {
					return
				}
				for a := from; a < min(from+chunk, n); a++ {
					buf = st.g.neighbours(a, true, buf)
					st.priceNode(a, buf, u, inProgram, limit, threshold, &parts[w], &heaps[w])
				}
			}
		}(w)
	}
	wg.Wait()
	if err := ctx.Err(); err != nil {
		return pricing{}, err
	}
	var out pricing
	var all []violator
	for w := range parts {
		out.worst = max(out.worst, parts[w].worst)
		out.violators += parts[w].violators
		all = append(all, heaps[w]...)
	}
	sort.Slice(all, func(i, j int) bool { return all[j].less(all[i]) })
	out.top = all[:min(limit, len(all))]
	return out, nil
}

// priceNode prices node a's candidates to the partners in buf. It is the
// innermost loop of member adding (millions of candidates per round in
// space) and stays whole: the membership test runs only for candidates
// that could matter.
func (st *setting) priceNode(a int, buf []int32, u [][]vec, inProgram map[uint64]struct{}, limit int, threshold float64, part *pricing, h *worstFirst) {
	pa := st.g.nodes[a]
	for _, b := range buf {
		d := sub(st.g.nodes[b], pa)
		length := norm(d)
		ratio := 0.0
		for _, uc := range u {
			du := sub(uc[b], uc[a])
			elongation := dot(d, du) / length
			ratio += max(st.tension*elongation, -st.compr*elongation, 0)
		}
		ratio /= length + st.jointCost
		if ratio <= part.worst && ratio <= st.nearBand*threshold {
			continue
		}
		c := candidate{int32(a), b}
		if _, ok := inProgram[c.key()]; ok {
			continue
		}
		part.worst = max(part.worst, ratio)
		if ratio > threshold {
			part.violators++
		}
		if ratio > st.nearBand*threshold {
			h.offer(violator{c, ratio}, limit)
		}
	}
}

// solveEquivalent solves two alternative cases as the single cases
// (f¹+f²)/2 and (f¹−f²)/2 and superposes them (Hemp 1973; from memory).
func (st *setting) solveEquivalent(ctx context.Context, opt Options, stats *Stats, rep progress.Reporter, f1, f2 []float64) ([]candidate, [][]float64, error) {
	plus, minus := make([]float64, len(f1)), make([]float64, len(f1))
	for i := range f1 {
		plus[i] = (f1[i] + f2[i]) / 2
		minus[i] = (f1[i] - f2[i]) / 2
	}
	union := make(map[candidate][2]float64)
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
		for i, c := range members {
			q := union[c]
			q[part] = forces[0][i]
			union[c] = q
		}
	}
	st.loads = [][]float64{f1, f2}
	members := make([]candidate, 0, len(union))
	for c := range union {
		members = append(members, c)
	}
	sort.Slice(members, func(i, j int) bool { return members[i].key() < members[j].key() })
	forces := [][]float64{make([]float64, len(members)), make([]float64, len(members))}
	for i, c := range members {
		q := union[c]
		forces[0][i] = q[0] + q[1]
		forces[1][i] = q[0] - q[1]
	}
	return members, forces, nil
}
