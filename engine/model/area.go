package model

import (
	"fmt"
	"math"
	"strconv"

	"gusset/engine/fault"
)

// AreaLoadSpec is a load spread over a panel of a space model (see
// AreaLoad for the rules).
type AreaLoadSpec struct {
	// Nodes are three or more node ids in order around the panel.
	Nodes []string
	// Pressure is a force per area normal to the panel: positive presses
	// on the face the normal points out of (the normal by the right-hand
	// rule of the node order), so it acts along −normal.
	Pressure *float64
	// Value is a force per area as a global vector (3 entries).
	Value []float64
	// Projected (with Value only) measures the area on the plane normal
	// to Value, as snow on a pitched roof is given per plan area.
	Projected bool
	// To is "nodes" (default) or "members".
	To string
	// Span is "one-way" or "two-way" (To "members" only).
	Span string
	// SpanDirection is the direction a one-way panel spans in (3
	// entries): the load travels along it to the two bounding members
	// that run across it.
	SpanDirection []float64
}

// AreaLoad is a compiled area load on a planar, convex panel.
//
// The total is w·A, w the force per area of the panel's true area A (for
// a pressure p, w = −p·n̂; for a projected value v, w = v·|n̂·v̂|, so the
// total is v times the area projected on the plane normal to v). It is
// conserved exactly, and so is its moment about any point, whichever way
// it is spread:
//
//   - To the nodes: the panel is split into triangles by a fan from the
//     mean g of its nodes, (g, p_i, p_{i+1}). A triangle's share goes to
//     its three corners in equal thirds, which is the consistent load
//     vector of the linear shape functions (∫N_i dA = A/3 for each
//     corner): exact for a uniform load on a flat triangle, with the
//     resultant at the triangle's centroid. The thirds at g add up to
//     w·A/3 and are shared equally among the k nodes, whose mean is g, so
//     the moment is unchanged. The fan from g (rather than from a node)
//     treats every node alike: a rectangle's nodes take a quarter each,
//     whichever node is listed first, and every share is positive on a
//     convex panel (refused otherwise).
//   - To the members (rectangular panels whose edges are members): one
//     way, each of the two members across the span direction takes a
//     uniform line load w·s/2 (s the span); two way, the 45° lines from
//     the corners give each short edge (length a) a triangle rising to
//     w·a/2 at its middle and each long edge (length b) a trapezoid with
//     ramps of a/2 (areas a²/4 and a(2b − a)/4, summing to a·b): the
//     tributary rule of common practice for slabs on four sides, as
//     partial linear member loads.
type AreaLoad struct {
	Nodes       []int
	Pressure    float64
	HasPressure bool
	Value       [3]float64
	Projected   bool
	ToMembers   bool
	OneWay      bool
	// SpanDirection is the one-way span direction as given.
	SpanDirection [3]float64
	// Edges holds, to members, the member along edge i (nodes i, i+1).
	Edges []int
}

// Tolerances of the panel checks, relative to the panel's largest extent
// D (the largest distance between two of its nodes).
const (
	// planarTolerance: every node lies within 1e-3·D of the panel's mean
	// plane.
	planarTolerance = 1e-3
	// degenerateTolerance: the panel's area exceeds 1e-9·D².
	degenerateTolerance = 1e-9
	// squareTolerance: the cosine of a rectangle's corner angles, and one
	// minus that of the span direction with its edges, are below 1e-6.
	squareTolerance = 1e-6
)

// areaLoads compiles load case ci's area loads and spreads them.
func (c *compiler) areaLoads(ci int, memberIndex func() map[[2]int]int) {
	ls, lc := &c.spec.LoadCases[ci], &c.m.Cases[ci]
	if len(ls.AreaLoads) == 0 {
		return
	}
	base := "load_cases/" + strconv.Itoa(ci) + "/area_loads"
	if c.dim == 2 {
		c.problem(base, "a plane model has no panels: area loads need a space (3D) model; in a plane model give the load as member loads along the members")
		return
	}
	if c.dim == 0 {
		return
	}
	lc.Areas = make([]AreaLoad, len(ls.AreaLoads))
	ok := true
	for j := range ls.AreaLoads {
		ok = c.areaLoad(ci, j, base+"/"+strconv.Itoa(j), memberIndex) && ok
	}
	if !ok {
		return
	}
	lc.AreaNodal, lc.AreaMemberLoads = len(lc.Nodal), len(lc.MemberLoads)
	for _, p := range c.m.spreadAreas(ci) {
		c.problem(p.Path, "%s", p.Message)
	}
}

// areaLoad checks and compiles one area load's fields (not its geometry,
// which spreadArea checks); it reports whether they are valid.
func (c *compiler) areaLoad(ci, j int, base string, memberIndex func() map[[2]int]int) bool {
	as, a := &c.spec.LoadCases[ci].AreaLoads[j], &c.m.Cases[ci].Areas[j]
	before := len(c.problems) + c.dropped
	if len(as.Nodes) < 3 {
		c.problem(base+"/nodes", "an area load needs at least 3 nodes in order around its panel, got %d", len(as.Nodes))
	}
	seen := make(map[int]int)
	for k, id := range as.Nodes {
		n, found := c.nodeIndex.find(id)
		switch {
		case !found:
			c.problem(base+"/nodes/"+strconv.Itoa(k), "area load names node %q, which does not exist", id)
		case seen[n] > 0:
			c.problem(base+"/nodes/"+strconv.Itoa(k), "node %q is listed twice; list each corner of the panel once", id)
		}
		seen[n]++
		a.Nodes = append(a.Nodes, n)
	}
	c.areaIntensity(as, a, base)
	switch as.To {
	case "", "nodes":
		if as.Span != "" || as.SpanDirection != nil {
			c.problem(base+"/span", "span and span_direction apply to an area load spread to members (\"to\": \"members\")")
		}
	case "members":
		a.ToMembers = true
		c.areaSpan(as, a, base)
		if len(c.problems)+c.dropped == before {
			c.areaEdges(a, base, memberIndex())
		}
	default:
		c.problem(base+"/to", "to %q is not \"nodes\" or \"members\"", as.To)
	}
	return len(c.problems)+c.dropped == before
}

// areaIntensity compiles the pressure or the value.
func (c *compiler) areaIntensity(as *AreaLoadSpec, a *AreaLoad, base string) {
	switch {
	case (as.Pressure == nil) == (as.Value == nil):
		c.problem(base, "an area load needs exactly one of pressure (normal to the panel) and value (a global vector per area)")
	case as.Pressure != nil:
		a.HasPressure, a.Pressure = true, *as.Pressure
		if !finite(a.Pressure) {
			c.problem(base+"/pressure", "must be a finite number, got %v", a.Pressure)
		}
		if as.Projected {
			c.problem(base+"/projected", "projected applies to a value (a force per area along a global direction), not to a pressure")
		}
	default:
		c.vector3(as.Value, &a.Value, base+"/value", false)
		a.Projected = as.Projected
	}
}

// areaSpan compiles span and span_direction.
func (c *compiler) areaSpan(as *AreaLoadSpec, a *AreaLoad, base string) {
	switch as.Span {
	case "two-way":
		if as.SpanDirection != nil {
			c.problem(base+"/span_direction", "a two-way panel spans both ways; span_direction applies to one-way panels")
		}
	case "one-way":
		a.OneWay = true
		if as.SpanDirection == nil {
			c.problem(base+"/span_direction", "a one-way panel needs span_direction, the direction it spans in")
			return
		}
		c.vector3(as.SpanDirection, &a.SpanDirection, base+"/span_direction", true)
	case "":
		c.problem(base+"/span", "an area load spread to members needs span: \"one-way\" or \"two-way\"")
	default:
		c.problem(base+"/span", "span %q is not \"one-way\" or \"two-way\"", as.Span)
	}
	if len(a.Nodes) != 4 {
		c.problem(base+"/nodes", "an area load spread to members needs a rectangular panel of 4 nodes, got %d; spread it to the nodes instead", len(a.Nodes))
	}
}

// vector3 copies a 3-entry vector, reporting a wrong length, a non-finite
// entry and (when nonzero is set) the zero vector.
func (c *compiler) vector3(v []float64, dst *[3]float64, path string, nonzero bool) {
	if len(v) != 3 {
		c.problem(path, "has %d entries; a 3D model needs 3", len(v))
		return
	}
	for k, x := range v {
		if !finite(x) {
			c.problem(path+"/"+strconv.Itoa(k), "must be a finite number, got %v", x)
			return
		}
		dst[k] = x
	}
	if nonzero && *dst == ([3]float64{}) {
		c.problem(path, "must not be the zero vector")
	}
}

// areaEdges finds the member along each edge of a panel spread to members.
func (c *compiler) areaEdges(a *AreaLoad, base string, byEnds map[[2]int]int) {
	k := len(a.Nodes)
	a.Edges = make([]int, k)
	for i := range k {
		p, q := a.Nodes[i], a.Nodes[(i+1)%k]
		e, ok := byEnds[[2]int{min(p, q), max(p, q)}]
		if !ok {
			c.problem(base+"/nodes/"+strconv.Itoa(i), "no member joins nodes %q and %q, an edge of the panel; an area load spread to members needs a member along every edge",
				c.m.NodeIDs[p], c.m.NodeIDs[q])
			continue
		}
		a.Edges[i] = e
	}
}

// spreadAreas replaces load case ci's area shares (Nodal from AreaNodal
// on, MemberLoads from AreaMemberLoads on) by new slices spread over the
// present geometry, and returns the problems of panels that are no longer
// planar, convex or rectangular. The user's loads before the shares are
// copied, not changed in place.
func (m *Model) spreadAreas(ci int) []fault.Problem {
	lc := &m.Cases[ci]
	nodal := append([]NodalLoad(nil), lc.Nodal[:lc.AreaNodal]...)
	loads := append([]MemberLoad(nil), lc.MemberLoads[:lc.AreaMemberLoads]...)
	var problems []fault.Problem
	for j := range lc.Areas {
		if p := m.spreadArea(&lc.Areas[j], &nodal, &loads); p != nil {
			p.Path = "load_cases/" + strconv.Itoa(ci) + "/area_loads/" + strconv.Itoa(j) + p.Path
			problems = append(problems, *p)
		}
	}
	lc.Nodal, lc.MemberLoads = nodal, loads
	return problems
}

// respreadAreas spreads every case's area loads again after a change of
// geometry, on copies of the cases.
func (m *Model) respreadAreas() []fault.Problem {
	var problems []fault.Problem
	cloned := false
	for ci := range m.Cases {
		if len(m.Cases[ci].Areas) == 0 {
			continue
		}
		if !cloned {
			m.Cases = append([]LoadCase(nil), m.Cases...)
			cloned = true
		}
		problems = append(problems, m.spreadAreas(ci)...)
	}
	return problems
}

// panel is an area load's geometry: its corners, their mean, its unit
// normal (right-hand rule of the node order), area and largest extent.
type panel struct {
	p          [][3]float64
	g, normal  [3]float64
	area, size float64
}

// spreadArea appends the shares of one area load, or returns the problem
// of its geometry (Path relative to the area load).
func (m *Model) spreadArea(a *AreaLoad, nodal *[]NodalLoad, loads *[]MemberLoad) *fault.Problem {
	pn, prob := m.newPanel(a)
	if prob != nil {
		return prob
	}
	w := a.Value
	switch {
	case a.HasPressure:
		for d := range 3 {
			w[d] = -a.Pressure * pn.normal[d]
		}
	case a.Projected:
		if s := norm3(w); s > 0 {
			f := math.Abs(dot3(pn.normal, w)) / s
			for d := range 3 {
				w[d] *= f
			}
		}
	}
	if !a.ToMembers {
		spreadToNodes(a, pn, w, nodal)
		return nil
	}
	return m.spreadToMembers(a, pn, w, loads)
}

// newPanel measures a panel and checks that it is not degenerate, planar
// within planarTolerance and convex.
func (m *Model) newPanel(a *AreaLoad) (*panel, *fault.Problem) {
	k := len(a.Nodes)
	pn := &panel{p: make([][3]float64, k)}
	for i, n := range a.Nodes {
		pn.p[i] = m.Node(n)
		for d := range 3 {
			pn.g[d] += pn.p[i][d] / float64(k)
		}
	}
	var v [3]float64 // twice the vector area
	for i := range k {
		c := cross3(sub3(pn.p[i], pn.g), sub3(pn.p[(i+1)%k], pn.g))
		for d := range 3 {
			v[d] += c[d]
		}
		for j := range i {
			pn.size = max(pn.size, norm3(sub3(pn.p[i], pn.p[j])))
		}
	}
	pn.area = norm3(v) / 2
	if !(pn.area > degenerateTolerance*pn.size*pn.size) {
		return nil, &fault.Problem{Path: "/nodes", Message: fmt.Sprintf("the panel is degenerate: its nodes lie on a line or coincide (area %g)", pn.area)}
	}
	pn.normal = unit(v)
	worst, off := 0, 0.0
	for i := range k {
		if d := math.Abs(dot3(sub3(pn.p[i], pn.g), pn.normal)); d > off {
			worst, off = i, d
		}
	}
	if off > planarTolerance*pn.size {
		return nil, &fault.Problem{Path: "/nodes/" + strconv.Itoa(worst), Message: fmt.Sprintf(
			"the panel is not planar: node %q lies %.3g off its mean plane, beyond the tolerance of 1e-3 times its largest extent %.3g; split it into flat panels (triangles are always flat)",
			m.NodeIDs[a.Nodes[worst]], off, pn.size)}
	}
	for i := range k {
		e1, e2 := sub3(pn.p[(i+1)%k], pn.p[i]), sub3(pn.p[(i+2)%k], pn.p[(i+1)%k])
		if dot3(cross3(e1, e2), pn.normal) < -degenerateTolerance*pn.size*pn.size {
			return nil, &fault.Problem{Path: "/nodes/" + strconv.Itoa((i+1)%k), Message: fmt.Sprintf(
				"the panel is not convex at node %q (or its nodes are not in order around it); split it into convex panels", m.NodeIDs[a.Nodes[(i+1)%k]])}
		}
	}
	return pn, nil
}

// spreadToNodes appends the nodal shares of the fan from the panel's mean
// (see AreaLoad).
func spreadToNodes(a *AreaLoad, pn *panel, w [3]float64, nodal *[]NodalLoad) {
	k := len(a.Nodes)
	shares := make([]float64, k) // area per node
	for i := range k {
		t := dot3(cross3(sub3(pn.p[i], pn.g), sub3(pn.p[(i+1)%k], pn.g)), pn.normal) / 2
		shares[i] += t / 3
		shares[(i+1)%k] += t / 3
	}
	for i, n := range a.Nodes {
		s := shares[i] + pn.area/(3*float64(k))
		*nodal = append(*nodal, NodalLoad{Node: n, Force: [3]float64{w[0] * s, w[1] * s, w[2] * s}})
	}
}

// spreadToMembers appends the member loads of a rectangular panel (see
// AreaLoad).
func (m *Model) spreadToMembers(a *AreaLoad, pn *panel, w [3]float64, loads *[]MemberLoad) *fault.Problem {
	var edge [4][3]float64
	var length [4]float64
	for i := range 4 {
		d := sub3(pn.p[(i+1)%4], pn.p[i])
		length[i], edge[i] = norm3(d), unit(d)
	}
	for i := range 4 {
		if math.Abs(dot3(edge[i], edge[(i+1)%4])) > squareTolerance {
			return &fault.Problem{Path: "/nodes/" + strconv.Itoa((i+1)%4), Message: fmt.Sprintf(
				"an area load spread to members needs a rectangular panel, but the corner at node %q is not square; spread it to the nodes instead", m.NodeIDs[a.Nodes[(i+1)%4]])}
		}
	}
	if a.OneWay {
		s := a.SpanDirection
		along := dot3(s, pn.normal)
		for d := range 3 {
			s[d] -= along * pn.normal[d]
		}
		first := -1
		switch {
		case norm3(s) <= squareTolerance*norm3(a.SpanDirection):
			return &fault.Problem{Path: "/span_direction", Message: "span_direction is normal to the panel; give a direction in its plane"}
		case math.Abs(dot3(unit(s), edge[0])) >= 1-squareTolerance:
			first = 1 // spans along edges 0 and 2: edges 1 and 3 carry it
		case math.Abs(dot3(unit(s), edge[1])) >= 1-squareTolerance:
			first = 0
		default:
			return &fault.Problem{Path: "/span_direction", Message: "span_direction must run along one pair of the panel's edges"}
		}
		span := length[(first+1)%4]
		for _, i := range []int{first, first + 2} {
			*loads = append(*loads, MemberLoad{Member: a.Edges[i], Kind: Uniform, Value: scale3(w, span/2)})
		}
		return nil
	}
	short := min(length[0], length[1])
	for i := range 4 {
		m.tributary(a.Edges[i], a.Nodes[i], length[i], short, w, loads)
	}
	return nil
}

// tributary appends the two-way share of one edge of length l (from node
// from) of a rectangle whose short side is a: a triangle when the edge is
// a short one, else a trapezoid, rising to w·a/2 over a/2 from each end.
func (m *Model) tributary(e, from int, l, a float64, w [3]float64, loads *[]MemberLoad) {
	peak := scale3(w, a/2)
	pieces := [][4]float64{{0, a / 2, 0, 1}, {l - a/2, l, 1, 0}}
	if l-a > squareTolerance*l {
		pieces = append(pieces, [4]float64{a / 2, l - a/2, 1, 1})
	} else {
		pieces[1][0] = a / 2
	}
	forward := m.Members[e].Ends[0] == from
	for _, pc := range pieces {
		x1, x2, f1, f2 := pc[0], pc[1], pc[2], pc[3]
		if !forward {
			x1, x2, f1, f2 = l-x2, l-x1, f2, f1
		}
		*loads = append(*loads, MemberLoad{Member: e, Kind: Linear, Partial: true, Start: x1, End: x2,
			Value: scale3(peak, f1), EndValue: scale3(peak, f2)})
	}
}

func sub3(a, b [3]float64) [3]float64 { return [3]float64{a[0] - b[0], a[1] - b[1], a[2] - b[2]} }

func scale3(a [3]float64, s float64) [3]float64 { return [3]float64{a[0] * s, a[1] * s, a[2] * s} }

// membersByEnds returns the first member joining each pair of nodes (the
// smaller index first), built once.
func (c *compiler) membersByEnds() map[[2]int]int {
	if c.byEnds == nil {
		c.byEnds = make(map[[2]int]int, len(c.m.Members))
		for e, mem := range c.m.Members {
			key := [2]int{min(mem.Ends[0], mem.Ends[1]), max(mem.Ends[0], mem.Ends[1])}
			if _, dup := c.byEnds[key]; !dup {
				c.byEnds[key] = e
			}
		}
	}
	return c.byEnds
}
