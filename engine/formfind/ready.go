package formfind

import (
	"fmt"
	"math"
	"slices"
	"strconv"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// Ready is a found form as a model for the other methods.
type Ready struct {
	// Spec is the input model with the free nodes at their found
	// coordinates (plain numbers; fixed nodes keep what was given), each
	// member whose material has the limit its force needs on a section of
	// its own with area |N|/limit, and, when the form's loads are not one
	// plain load case of nodal loads, a load case holding exactly the
	// nodal loads the form balances.
	Spec *model.Spec
	// Case is the id of the load case of Spec that reproduces the form.
	Case string
	// Sized counts the members given a section sized from their force.
	Sized int
	// Parameter names the parameter added to Spec when the form was found
	// through a point with loads that do not follow it: the height (along
	// gravity) of the through node, whose value is the height found. The
	// free nodes' coordinates are then expressions in it that give, for
	// every value, the form the force densities scaled to pass through that
	// height would take (linear in it: Schek's solution for force densities
	// q/t is h + t·l), so that a sweep over it studies the rise. "" when
	// none was added.
	Parameter string
	// Warnings say which members were not sized and what sizing left
	// unchecked.
	Warnings []fault.Problem
}

// Ready builds the model of the found form from spec, the Spec whose
// compilation Find was given (it is not modified). Areas are sized by
// stress alone: A = N/tension limit in tension and |N|/compression limit in
// compression, buckling not checked; a member with no force worth sizing
// (at most 10⁻⁹ of the largest) or whose material lacks the limit keeps its
// section.
func (r *Result) Ready(spec *model.Spec) *Ready {
	out := &Ready{Spec: new(model.Spec), Case: r.Case}
	*out.Spec = *spec
	s := out.Spec
	d := r.Dim
	s.Nodes = slices.Clone(spec.Nodes)
	for i := range s.Nodes {
		if r.Fixed[i] {
			continue
		}
		at := make([]model.Value, d)
		for k := range at {
			at[k] = model.Num(r.Coords[i*d+k])
		}
		s.Nodes[i].At = at
	}
	r.riseParameter(out, spec)
	r.size(out, spec)
	r.foundCase(out, spec)
	return out
}

// riseParameter writes the free nodes' coordinates as expressions in a
// parameter for the through node's height (see Ready.Parameter).
func (r *Result) riseParameter(out *Ready, spec *model.Spec) {
	fam := r.family
	if fam == nil {
		return
	}
	d := r.Dim
	g := d - 1 // the gravity axis
	lc := fam.l[g][fam.free[fam.node]]
	if lc == 0 {
		return
	}
	hc := fam.h[g][fam.free[fam.node]]
	name := "rise"
	taken := func(n string) bool {
		return slices.ContainsFunc(spec.Parameters, func(p model.ParameterSpec) bool { return p.Name == n })
	}
	for k := 2; taken(name); k++ {
		name = "rise" + strconv.Itoa(k)
	}
	out.Parameter = name
	out.Spec.Parameters = append(slices.Clone(spec.Parameters), model.ParameterSpec{Name: name, Value: r.Coords[fam.node*d+g]})
	for i := range out.Spec.Nodes {
		fi := fam.free[i]
		if fi < 0 {
			continue
		}
		for k := 0; k < d; k++ {
			// x = h + t·l with t = (rise − h_c)/l_c.
			c := fam.l[k][fi] / lc
			if c == 0 {
				continue
			}
			src := strconv.FormatFloat(c, 'g', -1, 64) + "*" + name
			if base := fam.h[k][fi] - hc*c; base != 0 {
				src = strconv.FormatFloat(base, 'g', -1, 64) + " + " + src
			}
			out.Spec.Nodes[i].At[k] = model.Expr(src)
		}
	}
}

// size gives each member that can be sized a section of its own.
func (r *Result) size(out *Ready, spec *model.Spec) {
	s, m := out.Spec, r.m
	s.Members = slices.Clone(spec.Members)
	s.Sections = slices.Clone(spec.Sections)
	ids := map[string]bool{}
	for _, c := range spec.Sections {
		ids[c.ID] = true
	}
	var largest float64
	for _, n := range r.Force {
		largest = max(largest, math.Abs(n))
	}
	missing := map[string]bool{}
	compression := map[int]bool{}
	for e, mem := range m.Members {
		n := r.Force[e]
		if math.Abs(n) <= 1e-9*largest {
			continue
		}
		mat := &m.Materials[mem.Material]
		limit, field := mat.TensionLimit, "tension_limit"
		if n < 0 {
			limit, field = mat.CompressionLimit, "compression_limit"
		}
		path := "/model/materials/" + strconv.Itoa(mem.Material) + "/" + field
		if limit <= 0 {
			if !missing[path] {
				missing[path] = true
				out.Warnings = append(out.Warnings, fault.Problem{Path: path,
					Message: fmt.Sprintf("material %q has no %s: its members in %s keep their given sections (not sized)", mat.ID, field, map[bool]string{true: "tension", false: "compression"}[n > 0])})
			}
			continue
		}
		if n < 0 {
			compression[mem.Material] = true
		}
		id := mem.ID + "_sized"
		for k := 2; ids[id]; k++ {
			id = mem.ID + "_sized" + strconv.Itoa(k)
		}
		ids[id] = true
		sec := spec.Sections[mem.Section]
		sec.ID, sec.Area = id, model.Num(math.Abs(n)/limit)
		s.Sections = append(s.Sections, sec)
		s.Members[e].Section = id
		out.Sized++
	}
	for k := range m.Materials {
		if compression[k] {
			out.Warnings = append(out.Warnings, fault.Problem{Path: "/model/materials/" + strconv.Itoa(k) + "/compression_limit",
				Message: fmt.Sprintf("members of %q in compression are sized by the compression limit alone: buckling is not checked", m.Materials[k].ID)})
		}
	}
}

// foundCase adds a load case of the nodal loads the form balances unless
// the case used is already a load case of nodal loads alone.
func (r *Result) foundCase(out *Ready, spec *model.Spec) {
	m := r.m
	if c := m.CaseIndex(r.Case); r.Case == "" || c >= 0 && !m.Cases[c].SelfWeight && len(m.Cases[c].MemberLoads) == 0 {
		return
	}
	id := "found"
	for k := 2; m.CaseIndex(id) >= 0 || m.CombinationIndex(id) >= 0; k++ {
		id = "found" + strconv.Itoa(k)
	}
	lc := model.LoadCaseSpec{ID: id}
	for i, p := range r.Loads {
		if !slices.ContainsFunc(p, func(x float64) bool { return x != 0 }) {
			continue
		}
		force := make([]model.Value, len(p))
		for k, x := range p {
			force[k] = model.Num(x)
		}
		lc.Loads = append(lc.Loads, model.NodalLoadSpec{Node: m.NodeIDs[i], Force: force})
	}
	out.Spec.LoadCases = append(slices.Clone(spec.LoadCases), lc)
	out.Case = id
}
