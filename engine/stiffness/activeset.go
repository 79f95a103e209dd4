package stiffness

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// request solves one case or combination by iteration. Each pass
// assembles K of the active members (plus, for second order, the
// geometric stiffness of the last axial forces), refactorises it on the
// same symbolic analysis, solves, and computes every member's trial axial
// force: the force it would carry if active (E·A/L times its elongation,
// plus its pretension, less its own loads' share). The one-sided members
// whose trial force has the wrong sense drop out, those whose trial force
// has the right sense come back (with a dead band of 1e-9 of the largest
// force, so that a member at zero force does not flip), and the passes
// stop when the active set is stable and, for second order, the
// displacements have settled. Both nonlinearities share the one loop: a
// change of the set is one more pass, as a change of the forces is. last
// marks the final request, whose factorisation's condition estimate
// starts before its recovery.
func (it *iteration) request(rq request, last bool) (*CaseResult, error) {
	r := it.r
	m, nb := r.m, r.nb
	ls := newLoadSet(m, nb, rq.terms)
	report := &Iteration{SecondOrder: it.so != nil}
	startFactor, startLowRank := it.factorisations, it.lowRankSolves
	p, err := it.converge(rq, ls, report)
	if err != nil {
		return nil, err
	}
	if last {
		// r.sys holds the final factorisation, which recovery leaves
		// alone: its condition estimate runs beside the recovery.
		it.condition = r.startCondition()
	}
	report.Factorisations = it.factorisations - startFactor
	report.LowRankSolves = it.lowRankSolves - startLowRank
	report.Slack = p.st.slack()
	if it.so != nil {
		if p0 := it.peakTranslation(p.first); p0 > 0 {
			a := it.peakTranslation(p.u) / p0
			report.Amplification, report.HasAmplification = a, !math.IsInf(a, 0) && !math.IsNaN(a)
		}
		// u − first is the first order's response carried one inverse
		// iteration toward the buckling mode, without the axial
		// shortening that u and first share (which would inflate the
		// quotient with strain energy that does no geometric work).
		diff := make([]float64, len(p.u))
		for i := range p.u {
			diff[i] = p.u[i] - p.first[i]
		}
		report.CriticalFactor = it.rayleigh(p.st, diff)
	}
	final := ls.forState(p.st) // ls or a copy: this request's own
	final.state = p.st
	cr, err := recoverCase(m, nb, p.sys, final, p.u, r.opt.Workers, r.opt.recovery())
	if err != nil {
		return nil, err
	}
	cr.ID, cr.Combination = rq.id, rq.combination
	for _, e := range report.Slack {
		if cr.AxialForce[e] == 0 {
			cr.AxialForce[e], cr.Stress[e] = 0, 0 // −0 from −p[0] reads oddly on the wire
		}
	}
	cr.Iteration = report
	return cr, nil
}

// converged is where the passes of one request end: the member state of
// the last solve, its displacements (and the first solve's), and the
// system solved.
type converged struct {
	st       *memberState
	u, first []float64
	sys      *system
}

// converge makes the passes of request (see request), counting them in
// report.Iterations.
func (it *iteration) converge(rq request, ls *loadSet, report *Iteration) (*converged, error) {
	r := it.r
	m, nb := r.m, r.nb
	base := ls.rightHandSide(m, nb)
	st := &memberState{}
	limit, tol := DefaultMaxIterations, 0.0
	if it.so != nil {
		limit, tol = it.so.MaxIterations, it.so.Tolerance
		st.axial = make([]float64, len(m.Members))
		for e := range m.Members {
			st.axial[e] = m.Members[e].Pretension
		}
	}
	seen := setHistory{}
	seen.add(st)
	var u, prev, first []float64
	var sys *system
	for {
		if err := r.ctx.Err(); err != nil {
			return nil, err
		}
		if report.Iterations == limit {
			return nil, it.notConverged(rq, st, limit)
		}
		report.Iterations++
		loads := base
		if own := ls.forState(st); own != ls {
			loads = own.rightHandSide(m, nb)
		}
		var err error
		if u, sys, err = it.pass(st, loads); err != nil {
			return nil, it.failure(rq, st, sys, first, err)
		}
		if first == nil {
			first = u
		}
		forces := it.trialForces(ls, u, it.so == nil)
		next, changed := nextActive(m, st, forces)
		settled := it.so == nil || prev != nil && change(u, prev) <= tol*it.peakTranslation(u)
		if !changed && settled {
			return &converged{st: st, u: u, first: first, sys: sys}, nil
		}
		following := &memberState{inactive: next}
		if it.so != nil {
			following.axial = forces
			for e := range forces {
				if !following.active(e) {
					forces[e] = 0
				}
			}
		}
		if changed && seen.add(following) {
			return nil, it.cycle(rq, st, following)
		}
		st, prev = following, u
	}
}

// trialForces returns per member the axial force it would carry with the
// displacements u if it were active: the mean of its two ends' axial
// forces from E·A/L times its elongation, less its own loads' share,
// plus its pretension. With oneSided it computes only the one-sided
// members' (the others are left 0).
func (it *iteration) trialForces(ls *loadSet, u []float64, oneSided bool) []float64 {
	m, nb := it.r.m, it.r.nb
	u = global(nb, u)
	out := make([]float64, len(m.Members))
	var el element
	var ul, p, fl [12]float64
	for e := range m.Members {
		if oneSided && m.Members[e].Behaviour == model.Both {
			continue
		}
		el.build(m, nb, e)
		n := el.localDisplacements(ul[:], u)
		el.localForces(p[:], ul[:])
		if ls.memberLoads(e) {
			ls.equivalent(fl[:], m, &el, e)
			for i := range n {
				p[i] -= fl[i]
			}
		}
		out[e] = (p[el.perNode]-p[0])/2 + m.Members[e].Pretension
	}
	return out
}

// nextActive returns the inactive flags after the trial forces (nil when
// every member is active) and whether they differ from st's.
func nextActive(m *model.Model, st *memberState, forces []float64) ([]bool, bool) {
	var band float64
	for _, f := range forces {
		band = max(band, math.Abs(f))
	}
	band *= 1e-9
	var next []bool
	changed := false
	for e := range m.Members {
		b := m.Members[e].Behaviour
		if b == model.Both {
			continue
		}
		f, active := forces[e], st.active(e)
		if b == model.CompressionOnly {
			f = -f
		}
		// f > 0 is now the allowed sense.
		now := active && f >= -band || !active && f > band
		if now != active {
			changed = true
		}
		if !now {
			if next == nil {
				next = make([]bool, len(m.Members))
			}
			next[e] = true
		}
	}
	return next, changed
}

// key names the active set: an FNV-1a hash of the inactive members'
// indices (the sets are compared whole where two keys meet, see
// setHistory).
func (st *memberState) key() uint64 {
	h := uint64(14695981039346656037)
	for e, off := range st.inactive {
		if off {
			h ^= uint64(e)
			h *= 1099511628211
		}
	}
	return h
}

// setHistory holds the active sets met so far in one request.
type setHistory map[uint64][][]bool

// add records st's set and reports whether it was met before.
func (h setHistory) add(st *memberState) bool {
	k := st.key()
	for _, old := range h[k] {
		if sameSet(old, st.inactive) {
			return true
		}
	}
	h[k] = append(h[k], st.inactive)
	return false
}

// sameSet compares two inactive flag slices (nil: none inactive).
func sameSet(a, b []bool) bool {
	for e := range max(len(a), len(b)) {
		if (e < len(a) && a[e]) != (e < len(b) && b[e]) {
			return false
		}
	}
	return true
}

// slack lists the inactive members in ascending order.
func (st *memberState) slack() []int {
	var out []int
	for e, off := range st.inactive {
		if off {
			out = append(out, e)
		}
	}
	return out
}

// change returns the largest difference between a and b.
func change(a, b []float64) float64 {
	var d float64
	for i := range a {
		d = max(d, math.Abs(a[i]-b[i]))
	}
	return d
}

// rayleigh returns Rayleigh's quotient uᵀK·u / (−uᵀK_G·u) over the
// active members of st for the displacements u, an upper bound of the
// critical factor on st's axial forces (every u is a trial mode of the
// pencil K + λ·K_G), or 0 when −uᵀK_G·u is not positive.
func (it *iteration) rayleigh(st *memberState, u []float64) float64 {
	m, nb := it.r.m, it.r.nb
	if st.axial == nil {
		return 0
	}
	u = global(nb, u)
	var el element
	var ul, ku [12]float64
	var kg [144]float64
	var elastic, geometric float64
	for e := range m.Members {
		if !st.active(e) {
			continue
		}
		el.build(m, nb, e)
		n := el.localDisplacements(ul[:], u)
		el.localForces(ku[:], ul[:])
		elastic += dot(ul[:n], ku[:n])
		el.geometric(kg[:], st.axial[e])
		mulSquare(ku[:], kg[:], ul[:], n)
		geometric += dot(ul[:n], ku[:n])
	}
	if !(geometric < 0) || !(elastic > 0) {
		return 0
	}
	if q := elastic / -geometric; !math.IsInf(q, 0) {
		return q
	}
	return 0
}

// inverseStep returns K⁻¹·(K_G·u) over every freedom (zero at the fixed
// ones), with the factor of K left by the last factorise and the
// geometric stiffness of st's axial forces: one step of inverse iteration
// from u toward the buckling mode.
func (it *iteration) inverseStep(st *memberState, u []float64) []float64 {
	m, nb := it.r.m, it.r.nb
	u = global(nb, u)
	w := make([]float64, nb.equations)
	var el element
	var ul, gl, gg [12]float64
	var kg [144]float64
	for e := range m.Members {
		if !st.active(e) || st.axial[e] == 0 {
			continue
		}
		el.build(m, nb, e)
		n := el.localDisplacements(ul[:], u)
		el.geometric(kg[:], st.axial[e])
		mulSquare(gl[:], kg[:], ul[:], n)
		el.toGlobal(gg[:], gl[:])
		nb.turnForces(&el, gg[:])
		for i := range n {
			if eq := nb.equation[el.dofs[i]]; eq >= 0 {
				w[eq] += gg[i]
			}
		}
	}
	y := make([]float64, nb.equations)
	it.r.sys.solve(y, w)
	v := make([]float64, nb.total)
	for f, eq := range nb.equation {
		if eq >= 0 {
			v[f] = y[eq]
		}
	}
	return v
}

// global returns u (one entry per freedom, an inclined support's node in
// its axes, as the system solves for it) in global axes: u itself when no
// support is inclined, a turned copy otherwise.
func global(nb *numbering, u []float64) []float64 {
	if nb.axes == nil {
		return u
	}
	g := append([]float64(nil), u...)
	nb.fromAxes(g)
	return g
}

func dot(a, b []float64) float64 {
	var s float64
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

// memberList names up to maxNamed members of the list and returns their
// pointers.
func memberList(m *model.Model, members []int, why string) (string, []fault.Problem) {
	var names []string
	var problems []fault.Problem
	for _, e := range members[:min(len(members), maxNamed)] {
		names = append(names, fmt.Sprintf("%q", m.Members[e].ID))
		problems = append(problems, fault.Problem{Path: fmt.Sprintf("/members/%d", e),
			Message: fmt.Sprintf("member %q %s", m.Members[e].ID, why)})
	}
	s := strings.Join(names, ", ")
	if len(members) > len(names) {
		s += fmt.Sprintf(" and %d more", len(members)-len(names))
	}
	return s, problems
}

// failure turns a failed factorisation of the pass with state st into
// the case's error: with second order, a K that factorises without the
// geometric stiffness means the loads are at or beyond the critical load
// (with the estimate from the first solve when there is one); otherwise
// the structure, with the slack members out, is a mechanism.
func (it *iteration) failure(rq request, st *memberState, sys *system, first []float64, err error) error {
	var d *errDeficient
	if !errors.As(err, &d) {
		return err
	}
	r := it.r
	if st.axial != nil {
		if _, plain := it.factorise(&memberState{inactive: st.inactive}); plain == nil {
			msg := fmt.Sprintf("case %q is at or beyond its critical load: the second-order stiffness K + K_G is not positive definite under its axial forces", rq.id)
			if first != nil {
				if lambda := it.rayleigh(st, it.inverseStep(st, first)); lambda > 0 {
					msg += fmt.Sprintf(" (the first-order deflection gives the critical factor on these forces at most %.4g)", lambda)
				}
			}
			return fault.New(fault.Unstable, "%s; reduce the loads or stiffen the structure", msg)
		}
	}
	var modes [][]float64
	if r.nb.equations <= r.opt.StabilityLimit {
		modes = denseModes(sys.dense(), sys.scale, len(d.equations))
	} else {
		modes = sparseModes(r.ctx, sys, r.opt)
	}
	if err := r.ctx.Err(); err != nil {
		return err
	}
	fe := mechanismError(r.m, r.nb, d.equations, modes)
	fe.Message = fmt.Sprintf("case %q: %s", rq.id, fe.Message)
	if slack := st.slack(); len(slack) > 0 {
		names, problems := memberList(r.m, slack, "is slack (out of the structure) in the mechanism")
		fe.Message += fmt.Sprintf("; the one-sided members %s are out of the structure under this case's loads, and without them it cannot carry them", names)
		fe.Problems = append(problems, fe.Problems...)
	}
	if it.so == nil && hasPretension(r.m) {
		fe.Message += "; a cable or pretensioned bar has transverse stiffness from its tension only in a second-order analysis (ask for second_order)"
	}
	return fe
}

func hasPretension(m *model.Model) bool {
	for e := range m.Members {
		if m.Members[e].Pretension > 0 || m.Members[e].Cable {
			return true
		}
	}
	return false
}

// cycle is the error for an active set that comes back: the members that
// switch between the last two sets are named.
func (it *iteration) cycle(rq request, st, next *memberState) error {
	m := it.r.m
	var flipping []int
	for e := range m.Members {
		if st.active(e) != next.active(e) {
			flipping = append(flipping, e)
		}
	}
	names, problems := memberList(m, flipping, "switches between active and slack without settling")
	return &fault.Error{Kind: fault.NoSolution, Problems: problems, Message: fmt.Sprintf(
		"case %q: the set of active one-sided members cycles (members %s switch back and forth), so no stable set was found; make one of them a two-way bar or add bracing", rq.id, names)}
}

// notConverged is the error for a case still changing after limit solves.
func (it *iteration) notConverged(rq request, st *memberState, limit int) error {
	what := "the set of active one-sided members"
	if it.so != nil {
		what = "the second-order displacements (or the set of active one-sided members)"
	}
	return fault.New(fault.NoSolution, "case %q: %s did not settle in %d solves; the loads may be near the critical load, or raise second_order.max_iterations", rq.id, what, limit)
}
