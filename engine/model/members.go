package model

import (
	"math"
	"strconv"
)

// parallelTolerance is the sine of the angle below which an orientation
// vector counts as parallel to its member.
const parallelTolerance = 1e-6

func (c *compiler) members() {
	s, m := c.spec, c.m
	n := len(s.Members)
	m.Members = make([]Member, n)
	c.memberIndex = c.newIDIndex("member", "members", n, func(i int) string { return s.Members[i].ID })
	materialIndex := make(map[string]int, len(s.Materials))
	c.ids("material", "materials", len(s.Materials), func(i int) string { return s.Materials[i].ID }, materialIndex)
	sectionIndex := make(map[string]int, len(s.Sections))
	c.ids("section", "sections", len(s.Sections), func(i int) string { return s.Sections[i].ID }, sectionIndex)
	c.beamOnSection = make([]int, len(s.Sections))
	for i := range c.beamOnSection {
		c.beamOnSection[i] = -1
	}
	// Resolve with a one-entry cache: generated and real models alike tend
	// to repeat one material and one section.
	materials := idLookup{index: materialIndex, lastIndex: -1}
	sections := idLookup{index: sectionIndex, lastIndex: -1}
	for i := range s.Members {
		ms := &s.Members[i]
		mem := &m.Members[i]
		mem.ID = ms.ID
		mem.BucklingFactor = 1
		c.memberEnds(i)
		if j, ok := materials.find(ms.Material); ok {
			mem.Material = j
		} else {
			mem.Material = -1
			c.problem("members/"+strconv.Itoa(i)+"/material", "member %q names material %q, which does not exist%s",
				ms.ID, ms.Material, listIDs("; materials are: ", len(s.Materials), func(i int) string { return s.Materials[i].ID }))
		}
		if j, ok := sections.find(ms.Section); ok {
			mem.Section = j
		} else {
			mem.Section = -1
			c.problem("members/"+strconv.Itoa(i)+"/section", "member %q names section %q, which does not exist%s",
				ms.ID, ms.Section, listIDs("; sections are: ", len(s.Sections), func(i int) string { return s.Sections[i].ID }))
		}
		c.memberKind(i)
		c.memberReleases(i)
		c.memberBehaviour(i)
		if ms.Orientation != nil {
			c.orientation(i)
		}
		if ms.BucklingCurve != "" {
			c.bucklingCurve(i)
		}
		if ms.BucklingFactor != nil {
			k := *ms.BucklingFactor
			if !(k > 0) || math.IsInf(k, 0) {
				c.problem("members/"+strconv.Itoa(i)+"/buckling_factor",
					"member %q needs a positive, finite buckling_factor, got %v", ms.ID, k)
			} else {
				mem.BucklingFactor = k
			}
		}
	}
	for j, e := range c.beamOnSection {
		if e >= 0 && !(m.Sections[j].SecondMoment > 0) && !math.IsNaN(m.Sections[j].SecondMoment) {
			c.problem("sections/"+strconv.Itoa(j)+"/second_moment",
				"section %q is used by beam %q and so needs a positive second_moment", s.Sections[j].ID, s.Members[e].ID)
		}
	}
}

// memberEnds resolves member i's end ids to node indices (−1 for an id
// that names no node) and reports a member whose ends coincide.
func (c *compiler) memberEnds(i int) {
	ms, mem := &c.spec.Members[i], &c.m.Members[i]
	for k, end := range ms.Ends {
		j, ok := c.nodeIndex.find(end)
		if !ok {
			mem.Ends[k] = -1
			c.problem("members/"+strconv.Itoa(i)+"/ends/"+strconv.Itoa(k),
				"member %q names node %q, which does not exist", ms.ID, end)
			continue
		}
		mem.Ends[k] = j
	}
	if mem.Ends[0] >= 0 && mem.Ends[0] == mem.Ends[1] {
		c.problem("members/"+strconv.Itoa(i)+"/ends/1",
			"member %q has zero length: both ends are at node %q", ms.ID, ms.Ends[0])
	} else if mem.Ends[0] >= 0 && mem.Ends[1] >= 0 && c.dim > 0 {
		if L := c.m.Length(i); L <= c.tol {
			c.problem("members/"+strconv.Itoa(i)+"/ends/1",
				"member %q has zero length: its ends %q and %q are at the same point", ms.ID, ms.Ends[0], ms.Ends[1])
		}
	}
}

// memberKind sets member i's kind from its type (bar by default) and
// records the first beam on each section, whose second moment is then
// required.
func (c *compiler) memberKind(i int) {
	ms, mem := &c.spec.Members[i], &c.m.Members[i]
	switch ms.Type {
	case "", "bar":
		mem.Kind = Bar
	case "cable":
		mem.Kind, mem.Cable, mem.Behaviour = Bar, true, TensionOnly
	case "beam":
		mem.Kind = Beam
		if mem.Section >= 0 && c.beamOnSection[mem.Section] < 0 {
			c.beamOnSection[mem.Section] = i
		}
	default:
		c.problem("members/"+strconv.Itoa(i)+"/type", "member %q has type %q; use \"bar\", \"cable\" or \"beam\"", ms.ID, ms.Type)
	}
}

func (c *compiler) orientation(i int) {
	ms, mem := &c.spec.Members[i], &c.m.Members[i]
	path := "members/" + strconv.Itoa(i) + "/orientation"
	if c.dim != 3 || ms.Type != "beam" {
		c.problem(path, "member %q has an orientation, which only a beam in a 3D model takes; remove it", ms.ID)
		return
	}
	o := ms.Orientation
	if len(o) != 3 {
		c.problem(path, "member %q has an orientation with %d entries; it needs 3", ms.ID, len(o))
		return
	}
	for k, x := range o {
		if !finite(x) {
			c.problem(path+"/"+strconv.Itoa(k), "must be a finite number, got %v", x)
			return
		}
	}
	v := [3]float64{o[0], o[1], o[2]}
	if mem.Ends[0] < 0 || mem.Ends[1] < 0 {
		mem.Orientation = v
		return
	}
	a, b := c.m.Node(mem.Ends[0]), c.m.Node(mem.Ends[1])
	axis := [3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}
	cross := [3]float64{
		axis[1]*v[2] - axis[2]*v[1],
		axis[2]*v[0] - axis[0]*v[2],
		axis[0]*v[1] - axis[1]*v[0],
	}
	na, nv := norm(axis), norm(v)
	if nv == 0 || norm(cross) <= parallelTolerance*na*nv {
		c.problem(path, "member %q has an orientation (%g, %g, %g) that is zero or parallel to the member; choose a vector across it",
			ms.ID, v[0], v[1], v[2])
		return
	}
	mem.Orientation = v
}

func norm(v [3]float64) float64 { return math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2]) }

// listIDs lists up to ten ids after prefix, or says there are none.
func listIDs(prefix string, n int, id func(int) string) string {
	if n == 0 {
		return "; there are none"
	}
	out := prefix
	for i := range min(n, 10) {
		if i > 0 {
			out += ", "
		}
		out += strconv.Quote(id(i))
	}
	if n > 10 {
		out += " and " + strconv.Itoa(n-10) + " more"
	}
	return out
}

// idLookup resolves ids through a map, remembering the last one found:
// consecutive members usually name the same material and section, and the
// remembered answer saves a map lookup per member on large models.
type idLookup struct {
	index     map[string]int
	last      string
	lastIndex int
}

// find returns the index of id and whether it exists.
func (l *idLookup) find(id string) (int, bool) {
	if l.lastIndex >= 0 && id == l.last {
		return l.lastIndex, true
	}
	j, ok := l.index[id]
	if ok {
		l.last, l.lastIndex = id, j
	}
	return j, ok
}
