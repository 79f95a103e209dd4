package model

import (
	"math"
	"slices"
	"strconv"
)

// componentIndex returns the freedom index of a component name valid for
// the dimension, or −1.
func componentIndex(name string, dim int) int {
	for k, n := range ComponentNames {
		if n == name {
			if dim == 2 && k != X && k != Y && k != RZ {
				return -1
			}
			return k
		}
	}
	return -1
}

func componentList(dim int) string {
	if dim == 2 {
		return "x, y, rz"
	}
	return "x, y, z, rx, ry, rz"
}

func sortedKeys(m map[string]float64) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

func (c *compiler) supports() {
	s, m := c.spec, c.m
	m.Supports = make([]Support, len(s.Supports))
	supportedBy := make(map[int]int, len(s.Supports))
	for i := range s.Supports {
		ss := &s.Supports[i]
		sup := &m.Supports[i]
		base := "supports/" + strconv.Itoa(i)
		j, ok := c.nodeIndex.find(ss.Node)
		if !ok {
			sup.Node = -1
			c.problem(base+"/node", "support names node %q, which does not exist", ss.Node)
		} else {
			sup.Node = j
			if first, twice := supportedBy[j]; twice {
				c.problem(base+"/node", "node %q already has a support (supports/%d); combine them into one", ss.Node, first)
			} else {
				supportedBy[j] = i
			}
		}
		if c.dim == 0 {
			continue
		}
		c.supportDirections(i)
		for k, name := range ss.Fix {
			comp := componentIndex(name, c.dim)
			path := base + "/fix/" + strconv.Itoa(k)
			switch {
			case comp < 0:
				c.badComponent(path, name)
			case sup.Fixed[comp]:
				c.problem(path, "component %q is fixed twice", name)
			default:
				sup.Fixed[comp] = true
			}
		}
		for _, name := range sortedKeys(ss.Springs) {
			k := ss.Springs[name]
			comp := componentIndex(name, c.dim)
			path := base + "/springs/" + escapePointer(name)
			switch {
			case comp < 0:
				c.badComponent(path, name)
			case !(k > 0) || math.IsInf(k, 0):
				c.problem(path, "a spring needs a positive, finite stiffness, got %v", k)
			case sup.Fixed[comp]:
				c.problem(path, "component %q is both fixed and on a spring; keep one", name)
			default:
				sup.Spring[comp] = k
			}
		}
		for _, name := range sortedKeys(ss.Displacement) {
			d := ss.Displacement[name]
			comp := componentIndex(name, c.dim)
			path := base + "/displacement/" + escapePointer(name)
			switch {
			case comp < 0:
				c.badComponent(path, name)
			case !finite(d):
				c.problem(path, "must be a finite number, got %v", d)
			case !sup.Fixed[comp]:
				c.problem(path, "a displacement is prescribed on component %q, which is not fixed; add %q to fix", name, name)
			default:
				sup.Displacement[comp] = d
			}
		}
	}
}

func (c *compiler) loadCases() {
	s, m := c.spec, c.m
	m.Cases = make([]LoadCase, len(s.LoadCases))
	caseIndex := make(map[string]int, len(s.LoadCases))
	c.ids("load case", "load_cases", len(s.LoadCases), func(i int) string { return s.LoadCases[i].ID }, caseIndex)
	for ci := range s.LoadCases {
		ls := &s.LoadCases[ci]
		lc := &m.Cases[ci]
		lc.ID = ls.ID
		lc.SelfWeight = ls.SelfWeight
		lc.Nodal = make([]NodalLoad, len(ls.Loads))
		for j := range ls.Loads {
			c.nodalLoad(ci, j)
		}
		lc.MemberLoads = make([]MemberLoad, len(ls.MemberLoads))
		for j := range ls.MemberLoads {
			c.memberLoad(ci, j)
		}
		c.areaLoads(ci, c.membersByEnds)
	}
}

func (c *compiler) nodalLoad(ci, j int) {
	ls := &c.spec.LoadCases[ci].Loads[j]
	load := &c.m.Cases[ci].Nodal[j]
	// The path is built only when needed: large models have a load at
	// almost every node, and nearly all of them are plain numbers.
	base := func() string { return "load_cases/" + strconv.Itoa(ci) + "/loads/" + strconv.Itoa(j) }
	if n, ok := c.nodeIndex.find(ls.Node); ok {
		load.Node = n
	} else {
		load.Node = -1
		c.problem(base()+"/node", "load names node %q, which does not exist", ls.Node)
	}
	if c.dim == 0 {
		return
	}
	if len(ls.Force) != c.dim && ls.Force != nil {
		c.problem(base()+"/force", "force has %d entries; a %dD model needs %d", len(ls.Force), c.dim, c.dim)
	} else {
		for k, v := range ls.Force {
			if !v.IsExpr && finite(v.Num) {
				load.Force[k] = v.Num
				continue
			}
			load.Force[k] = c.fast(v, pathf("%s/force/%d", base(), k), binding{target: targetNodal, group: ci,
				set: func(m *Model, x float64) { m.Cases[ci].Nodal[j].Force[k] = x }})
		}
	}
	moments := 3
	if c.dim == 2 {
		moments = 1
	}
	if ls.Moment != nil && len(ls.Moment) != moments {
		c.problem(base()+"/moment", "moment has %d entries; a %dD model needs %d", len(ls.Moment), c.dim, moments)
		return
	}
	for k, v := range ls.Moment {
		slot := k
		if c.dim == 2 {
			slot = 2 // about z
		}
		if !v.IsExpr && finite(v.Num) {
			load.Moment[slot] = v.Num
			continue
		}
		load.Moment[slot] = c.fast(v, pathf("%s/moment/%d", base(), k), binding{target: targetNodal, group: ci,
			set: func(m *Model, x float64) { m.Cases[ci].Nodal[j].Moment[slot] = x }})
	}
}

func (c *compiler) memberLoad(ci, j int) {
	ls := &c.spec.LoadCases[ci].MemberLoads[j]
	load := &c.m.Cases[ci].MemberLoads[j]
	base := memberLoadPath(ci, j)
	bind := func(set func(*MemberLoad, float64)) binding {
		return binding{target: targetMemberLoads, group: ci,
			set: func(m *Model, x float64) { set(&m.Cases[ci].MemberLoads[j], x) }}
	}
	e, ok := c.memberIndex.find(ls.Member)
	if ok {
		load.Member = e
	} else {
		load.Member = -1
		c.problem(base+"/member", "member load names member %q, which does not exist", ls.Member)
	}
	switch ls.Axes {
	case "", "global":
	case "local":
		load.Local = true
	default:
		c.problem(base+"/axes", "axes %q is not \"global\" or \"local\"", ls.Axes)
	}
	vector := func(name string, vals []Value, dst *[3]float64, end bool) {
		if len(vals) != c.dim {
			c.problem(base+"/"+name, "a %s member load needs %s with %d entries, got %d", ls.Kind, name, c.dim, len(vals))
			return
		}
		for k, v := range vals {
			if !v.IsExpr && finite(v.Num) {
				dst[k] = v.Num
				continue
			}
			dst[k] = c.fast(v, pathf("%s/%s/%d", base, name, k), bind(func(ml *MemberLoad, x float64) {
				if end {
					ml.EndValue[k] = x
				} else {
					ml.Value[k] = x
				}
			}))
		}
	}
	switch ls.Kind {
	case "uniform":
		load.Kind = Uniform
		if c.dim > 0 {
			vector("value", ls.Value, &load.Value, false)
		}
	case "linear":
		load.Kind = Linear
		if c.dim > 0 {
			vector("value", ls.Value, &load.Value, false)
			vector("end_value", ls.EndValue, &load.EndValue, true)
		}
	case "point":
		load.Kind = Point
		if c.dim > 0 {
			vector("value", ls.Value, &load.Value, false)
		}
		if ls.Distance == nil {
			c.problem(base+"/distance", "a point member load needs distance, measured from the member's first end")
			break
		}
		path := pathf("%s/distance", base)
		load.Distance = c.fast(*ls.Distance, path, bind(func(ml *MemberLoad, x float64) { ml.Distance = x }))
		if ok && c.dim > 0 {
			ends := c.m.Members[e].Ends
			if ends[0] >= 0 && ends[1] >= 0 {
				L := c.m.Length(e)
				if load.Distance < 0 || load.Distance > L*(1+1e-12) {
					c.problem(path(), "distance %g lies outside member %q, whose length is %g", load.Distance, ls.Member, L)
				}
			}
		}
	case "thermal":
		load.Kind = Thermal
		c.thermal(ci, j, e, ok, base)
	default:
		c.problem(base+"/kind", "member load kind %q is not one of uniform, linear, point, thermal", ls.Kind)
	}
}

// memberLoadPath returns the pointer of a member load: one short string
// per member load, cheap beside the load's own checks.
func memberLoadPath(ci, j int) string {
	return "load_cases/" + strconv.Itoa(ci) + "/member_loads/" + strconv.Itoa(j)
}

// thermal sets a thermal load's free strain: strain when given, else
// temperature_change times the material's thermal_expansion.
func (c *compiler) thermal(ci, j, e int, memberOK bool, base string) {
	ls := &c.spec.LoadCases[ci].MemberLoads[j]
	load := &c.m.Cases[ci].MemberLoads[j]
	set := func(m *Model, x float64) { m.Cases[ci].MemberLoads[j].Strain = x }
	if ls.Strain != nil {
		load.Strain = c.fast(*ls.Strain, pathf("%s/strain", base), binding{target: targetMemberLoads, group: ci, set: set})
		return
	}
	if ls.TemperatureChange == nil {
		c.problem(base+"/strain", "a thermal member load needs strain, or temperature_change with a material that has thermal_expansion")
		return
	}
	dt, dtProg := c.number(*ls.TemperatureChange, pathf("%s/temperature_change", base), binding{})
	if !memberOK {
		return
	}
	mat := c.m.Members[e].Material
	if mat < 0 {
		return
	}
	if !c.hasThermal[mat] {
		c.problem(base+"/temperature_change", "member %q is of material %q, which has no thermal_expansion; give it one or give the load a strain",
			ls.Member, c.m.Materials[mat].ID)
		return
	}
	alpha, alphaProg := c.m.Materials[mat].ThermalExpansion, c.thermalProg[mat]
	load.Strain = dt * alpha
	if math.IsNaN(load.Strain) || (dtProg == nil && alphaProg == nil) {
		return
	}
	source := ls.TemperatureChange.Expr
	if dtProg == nil {
		source = c.spec.Materials[mat].ThermalExpansion.Expr
	}
	c.bindings = append(c.bindings, binding{
		path: base + "/temperature_change", source: source, target: targetMemberLoads, group: ci, set: set,
		eval: func(p []float64) (float64, error) {
			d, a := dt, alpha
			var err error
			if dtProg != nil {
				if d, err = dtProg.Eval(p); err != nil {
					return 0, err
				}
			}
			if alphaProg != nil {
				if a, err = alphaProg.Eval(p); err != nil {
					return 0, err
				}
			}
			return d * a, nil
		},
	})
}

func (c *compiler) combinations() {
	s, m := c.spec, c.m
	// Cases and combinations share one namespace of ids.
	names := make(map[string]int, len(s.LoadCases)+len(s.Combos))
	for i := range s.LoadCases {
		if s.LoadCases[i].ID != "" {
			if _, dup := names[s.LoadCases[i].ID]; !dup {
				names[s.LoadCases[i].ID] = i
			}
		}
	}
	combos := make(map[string]int, len(s.Combos))
	m.Combinations = make([]Combination, len(s.Combos))
	for i := range s.Combos {
		cs := &s.Combos[i]
		base := "combinations/" + strconv.Itoa(i)
		m.Combinations[i].ID = cs.ID
		switch _, isCase := names[cs.ID]; {
		case cs.ID == "":
			c.problem(base+"/id", "combination %d has an empty id; give it a unique id", i)
		case isCase:
			c.problem(base+"/id", "combination id %q is already the id of a load case; cases and combinations share one set of ids", cs.ID)
		default:
			if j, dup := combos[cs.ID]; dup {
				c.problem(base+"/id", "combination id %q is used twice (also by combinations/%d); ids must be unique", cs.ID, j)
			} else {
				combos[cs.ID] = i
			}
		}
	}
	for i := range s.Combos {
		cs := &s.Combos[i]
		base := "combinations/" + strconv.Itoa(i)
		if len(cs.Factors) == 0 {
			c.problem(base+"/factors", "combination %q has no factors; name at least one load case", cs.ID)
		}
		for _, id := range sortedKeys(cs.Factors) {
			f := cs.Factors[id]
			path := base + "/factors/" + escapePointer(id)
			ci, isCase := names[id]
			_, isCombo := combos[id]
			switch {
			case isCase && finite(f):
				m.Combinations[i].Terms = append(m.Combinations[i].Terms, Term{Case: ci, Factor: f})
			case isCase:
				c.problem(path, "factor of %q must be a finite number, got %v", id, f)
			case isCombo:
				c.problem(path, "combination %q names %q, which is a combination; a combination may only combine load cases", cs.ID, id)
			default:
				c.problem(path, "combination %q names load case %q, which does not exist%s", cs.ID, id,
					listIDs("; cases are: ", len(s.LoadCases), func(i int) string { return s.LoadCases[i].ID }))
			}
		}
		slices.SortFunc(m.Combinations[i].Terms, func(a, b Term) int { return a.Case - b.Case })
	}
}

// badComponent reports a component name that the model's dimension lacks.
func (c *compiler) badComponent(path, name string) {
	c.problem(path, "%q is not a component of a %dD model; use %s", name, c.dim, componentList(c.dim))
}
