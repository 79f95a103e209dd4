package model

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"unicode/utf8"

	"gusset/engine/expr"
	"gusset/engine/fault"
)

// maxProblems caps the problems one Compile reports, so a hopeless input
// (100k members naming a missing material) gives a readable error.
const maxProblems = 1000

// Default material and section properties, used when the Spec leaves them
// out.
const (
	// PoissonRatio gives the default shear modulus G = E / (2 (1 + ν)),
	// ν = 0.3 for structural steel (common practice).
	PoissonRatio = 0.3
	// coincidenceTolerance, times the diagonal of the nodes' bounding box,
	// is the distance below which two nodes count as one point.
	coincidenceTolerance = 1e-9
)

var (
	lengthUnits = []string{"m", "cm", "mm", "ft", "in"}
	forceUnits  = []string{"N", "kN", "MN", "lbf", "kip"}
)

// Compile checks spec and builds the numeric Model: ids become indices,
// each expression is compiled once over spec.Parameters and evaluated, and
// defaults are filled in (units m and kN; shear modulus E / (2 (1 + 0.3));
// buckling factor 1; member type bar; in 3D, second_moment_y equal to
// second_moment and torsion_constant twice it, as for a round section).
//
// Every problem found is reported, not only the first: the error is a
// *fault.Error whose Problems carry JSON pointers relative to the model
// object, using the wire field names ("members/3/ends/1"). Its Kind is
// fault.Expression when every problem is an expression that fails to
// compile or evaluate, and fault.InvalidModel otherwise. Compile panics if
// spec is nil.
func Compile(spec *Spec) (*Model, error) {
	if spec == nil {
		panic("model: Compile of a nil Spec")
	}
	c := &compiler{spec: spec, m: &Model{}, exprs: make(map[string]compiled)}
	c.run()
	if len(c.problems) > 0 {
		return nil, c.error()
	}
	c.attachIncidentMembers()
	c.m.bindings = c.bindings
	return c.m, nil
}

// attachIncidentMembers gives the first coordinate binding of each moved
// node the members at that node, so WithParameters can check that none of
// them shrinks to zero length.
func (c *compiler) attachIncidentMembers() {
	first := make(map[int]int) // node -> binding
	for i, b := range c.bindings {
		if b.target != targetCoords {
			continue
		}
		if _, seen := first[b.group]; !seen {
			first[b.group] = i
		}
	}
	if len(first) == 0 {
		return
	}
	for e, mem := range c.m.Members {
		for _, end := range mem.Ends {
			if b, ok := first[end]; ok {
				c.bindings[b].members = append(c.bindings[b].members, e)
				c.bindings[b].tol = c.tol
			}
		}
	}
}

type compiled struct {
	prog *expr.Program
	err  error
}

type compiler struct {
	spec     *Spec
	m        *Model
	dim      int // 0 when the dimension is invalid
	problems []fault.Problem
	dropped  int  // problems beyond maxProblems
	invalid  bool // some problem is not an expression problem
	exprs    map[string]compiled
	bindings []binding

	nodeIndex   *idIndex
	memberIndex *idIndex       // first member of each id
	tol         float64        // coincidence tolerance, length units
	byEnds      map[[2]int]int // node pair -> member, for area loads

	// The programs of expressions that defaults and thermal strains derive
	// from, so their bindings can recompute the derived values.
	elasticProg   []*expr.Program
	thermalProg   []*expr.Program
	secondProg    []*expr.Program
	hasThermal    []bool
	beamOnSection []int // the first beam using each section, or −1
}

func (c *compiler) add(expression bool, path, format string, args ...any) {
	if !expression {
		c.invalid = true
	}
	if len(c.problems) >= maxProblems {
		c.dropped++
		return
	}
	c.problems = append(c.problems, fault.Problem{Path: path, Message: fmt.Sprintf(format, args...)})
}

// problem records a semantic problem at path.
func (c *compiler) problem(path, format string, args ...any) { c.add(false, path, format, args...) }

func (c *compiler) error() *fault.Error {
	kind := fault.InvalidModel
	if !c.invalid {
		kind = fault.Expression
	}
	n := len(c.problems) + c.dropped
	msg := c.problems[0].Message
	if n > 1 {
		msg = fmt.Sprintf("the model has %d problems; the first: %s", n, msg)
	}
	if c.dropped > 0 {
		msg += fmt.Sprintf(" (only the first %d are listed)", maxProblems)
	}
	return &fault.Error{Kind: kind, Message: msg, Problems: c.problems}
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// number returns the value of v, compiling and evaluating it when it is an
// expression. An expression that reads parameters gets a binding that
// writes it with set. The returned program is nil unless v reads
// parameters. On failure it records a problem at path and returns NaN,
// which later checks treat as "already reported".
func (c *compiler) number(v Value, path func() string, bind binding) (float64, *expr.Program) {
	if !v.IsExpr {
		if !finite(v.Num) {
			c.problem(path(), "must be a finite number, got %v", v.Num)
			return math.NaN(), nil
		}
		return v.Num, nil
	}
	ce, ok := c.exprs[v.Expr]
	if !ok {
		ce.prog, ce.err = expr.Compile(v.Expr, c.m.ParamNames)
		c.exprs[v.Expr] = ce
	}
	if ce.err != nil {
		if se, ok := ce.err.(*expr.SyntaxError); ok {
			c.add(true, path(), "expression %s has a syntax error at byte %d: %s", quoted(v.Expr), se.Pos, se.Msg)
		} else {
			c.add(true, path(), "expression %s: %v", quoted(v.Expr), ce.err)
		}
		return math.NaN(), nil
	}
	x, err := ce.prog.Eval(c.m.ParamValues)
	if err != nil {
		c.add(true, path(), "expression %s cannot be evaluated with %s: %v", quoted(v.Expr), describeParams(c.m.ParamNames, c.m.ParamValues), err)
		return math.NaN(), nil
	}
	if len(ce.prog.Uses()) == 0 {
		return x, nil
	}
	c.markUsed(ce.prog.Uses())
	if bind.set != nil {
		bind.path = path()
		bind.source = v.Expr
		bind.eval = ce.prog.Eval
		c.bindings = append(c.bindings, bind)
	}
	return x, ce.prog
}

// quoted returns src quoted for a message: whole when short, else its
// first 60 bytes (cut at a character boundary) and its length, so an error
// about a megabyte-long expression stays a readable line.
func quoted(src string) string {
	const shown = 60
	if len(src) <= 2*shown {
		return strconv.Quote(src)
	}
	cut := shown
	for cut > 0 && !utf8.RuneStart(src[cut]) {
		cut--
	}
	return fmt.Sprintf("%s… (%d bytes)", strconv.Quote(src[:cut]), len(src))
}

// fast returns v's number without building a path when v is a plain
// finite number, which is almost every value of a large model.
func (c *compiler) fast(v Value, path func() string, bind binding) float64 {
	if !v.IsExpr && finite(v.Num) {
		return v.Num
	}
	x, _ := c.number(v, path, bind)
	return x
}

func pathf(format string, args ...any) func() string {
	return func() string { return fmt.Sprintf(format, args...) }
}

func (c *compiler) run() {
	s := c.spec
	c.header()
	c.materials()
	c.sections()
	c.nodes()
	c.members()
	c.coincidentNodes()
	c.supports()
	c.loadCases()
	c.combinations()
	c.patterns()
	if len(s.Nodes) == 0 {
		c.problem("nodes", "the model has no nodes; add at least two nodes and a member between them")
	}
	if len(s.Members) == 0 {
		c.problem("members", "the model has no members; add at least one member between two nodes")
	}
}

func (c *compiler) header() {
	s, m := c.spec, c.m
	if s.Dimension == 2 || s.Dimension == 3 {
		c.dim = s.Dimension
	} else {
		c.problem("dimension", "dimension must be 2 (a plane model) or 3 (a space model), got %d", s.Dimension)
	}
	m.Dim = c.dim
	m.Units = s.Units
	if m.Units.Length == "" {
		m.Units.Length = "m"
	} else if !slices.Contains(lengthUnits, m.Units.Length) {
		c.problem("units/length", "length unit %q is not one of m, cm, mm, ft, in", m.Units.Length)
	}
	if m.Units.Force == "" {
		m.Units.Force = "kN"
	} else if !slices.Contains(forceUnits, m.Units.Force) {
		c.problem("units/force", "force unit %q is not one of N, kN, MN, lbf, kip", m.Units.Force)
	}
	m.ParamNames = make([]string, len(s.Parameters))
	m.ParamValues = make([]float64, len(s.Parameters))
	seen := make(map[string]bool, len(s.Parameters))
	for i, p := range s.Parameters {
		path := "parameters/" + escapePointer(p.Name)
		m.ParamNames[i] = p.Name
		m.ParamValues[i] = p.Value
		if seen[p.Name] {
			c.problem(path, "parameter %q is declared twice", p.Name)
		}
		seen[p.Name] = true
		if !validName(p.Name) {
			c.problem(path, "parameter name %q must start with a letter or underscore and hold only letters, digits and underscores", p.Name)
		}
		if !finite(p.Value) {
			c.problem(path, "parameter %q must be a finite number, got %v", p.Name, p.Value)
			m.ParamValues[i] = 0
		}
	}
}

func validName(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		ch := s[i]
		letter := ch == '_' || ('a' <= ch && ch <= 'z') || ('A' <= ch && ch <= 'Z')
		if !letter && (i == 0 || ch < '0' || ch > '9') {
			return false
		}
	}
	return true
}

// ids indexes the ids of one array and reports empty and duplicate ones.
func (c *compiler) ids(kind, array string, n int, id func(int) string, index map[string]int) {
	for i := range n {
		s := id(i)
		if s == "" {
			c.problem(array+"/"+strconv.Itoa(i)+"/id", "%s %d has an empty id; give it a unique id", kind, i)
			continue
		}
		if j, dup := index[s]; dup {
			c.problem(array+"/"+strconv.Itoa(i)+"/id", "%s id %q is used twice (also by %s/%d); ids must be unique", kind, s, array, j)
			continue
		}
		index[s] = i
	}
}

func (c *compiler) materials() {
	s, m := c.spec, c.m
	n := len(s.Materials)
	m.Materials = make([]Material, n)
	c.elasticProg = make([]*expr.Program, n)
	c.thermalProg = make([]*expr.Program, n)
	c.hasThermal = make([]bool, n)
	for i := range s.Materials {
		ms := &s.Materials[i]
		mat := &m.Materials[i]
		mat.ID = ms.ID
		field := func(name string) func() string { return pathf("materials/%d/%s", i, name) }
		bind := func(sg sign, set func(*Material, float64)) binding {
			return binding{target: targetMaterials, sign: sg, set: func(m *Model, v float64) { set(&m.Materials[i], v) }}
		}
		var prog *expr.Program
		mat.ElasticModulus, prog = c.number(ms.ElasticModulus, field("elastic_modulus"),
			bind(positive, func(mt *Material, v float64) { mt.ElasticModulus = v }))
		c.elasticProg[i] = prog
		if !(mat.ElasticModulus > 0) && !math.IsNaN(mat.ElasticModulus) {
			c.problem(field("elastic_modulus")(), "material %q needs a positive elastic_modulus, got %g", ms.ID, mat.ElasticModulus)
		}
		if ms.ShearModulus != nil {
			mat.ShearModulus = c.positive(*ms.ShearModulus, field("shear_modulus"), "material", ms.ID, "shear_modulus",
				bind(positive, func(mt *Material, v float64) { mt.ShearModulus = v }))
		} else {
			mat.ShearModulus = mat.ElasticModulus / (2 * (1 + PoissonRatio))
			if prog != nil {
				c.bindings = append(c.bindings, binding{
					path: field("elastic_modulus")(), source: ms.ElasticModulus.Expr, target: targetMaterials,
					eval: func(p []float64) (float64, error) {
						e, err := prog.Eval(p)
						return e / (2 * (1 + PoissonRatio)), err
					},
					set: func(m *Model, v float64) { m.Materials[i].ShearModulus = v },
				})
			}
		}
		if ms.WeightDensity != nil {
			mat.WeightDensity = c.fast(*ms.WeightDensity, field("weight_density"),
				bind(nonNegative, func(mt *Material, v float64) { mt.WeightDensity = v }))
			if mat.WeightDensity < 0 {
				c.problem(field("weight_density")(), "material %q has a negative weight_density %g; use zero or a positive value", ms.ID, mat.WeightDensity)
			}
		}
		if ms.TensionLimit != nil {
			mat.TensionLimit = c.positive(*ms.TensionLimit, field("tension_limit"), "material", ms.ID, "tension_limit",
				bind(positive, func(mt *Material, v float64) { mt.TensionLimit = v }))
		}
		if ms.CompressionLimit != nil {
			mat.CompressionLimit = c.positive(*ms.CompressionLimit, field("compression_limit"), "material", ms.ID, "compression_limit",
				bind(positive, func(mt *Material, v float64) { mt.CompressionLimit = v }))
		}
		if ms.CarbonFactor != nil {
			mat.HasCarbonFactor = true
			mat.CarbonFactor = c.fast(*ms.CarbonFactor, field("carbon_factor"),
				bind(nonNegative, func(mt *Material, v float64) { mt.CarbonFactor = v }))
			if mat.CarbonFactor < 0 {
				c.problem(field("carbon_factor")(), "material %q has a negative carbon_factor %g; use zero or a positive value", ms.ID, mat.CarbonFactor)
			}
		}
		if ms.MassDensity != nil {
			mat.HasMassDensity = true
			mat.MassDensity = c.fast(*ms.MassDensity, field("mass_density"),
				bind(nonNegative, func(mt *Material, v float64) { mt.MassDensity = v }))
			if mat.MassDensity < 0 {
				c.problem(field("mass_density")(), "material %q has a negative mass_density %g; use zero or a positive value", ms.ID, mat.MassDensity)
			}
		}
		if ms.ThermalExpansion != nil {
			c.hasThermal[i] = true
			mat.ThermalExpansion, c.thermalProg[i] = c.number(*ms.ThermalExpansion, field("thermal_expansion"),
				bind(anySign, func(mt *Material, v float64) { mt.ThermalExpansion = v }))
		}
	}
}

// positive evaluates a value that must be positive when given.
func (c *compiler) positive(v Value, path func() string, kind, id, name string, bind binding) float64 {
	x := c.fast(v, path, bind)
	if !(x > 0) && !math.IsNaN(x) {
		c.problem(path(), "%s %q needs a positive %s, got %g", kind, id, name, x)
	}
	return x
}

func (c *compiler) sections() {
	s, m := c.spec, c.m
	m.Sections = make([]Section, len(s.Sections))
	c.secondProg = make([]*expr.Program, len(s.Sections))
	for i := range s.Sections {
		ss := &s.Sections[i]
		sec := &m.Sections[i]
		sec.ID = ss.ID
		field := func(name string) func() string { return pathf("sections/%d/%s", i, name) }
		bind := func(set func(*Section, float64)) binding {
			return binding{target: targetSections, sign: positive, set: func(m *Model, v float64) { set(&m.Sections[i], v) }}
		}
		if ss.Shape == nil || ss.Area.IsExpr || ss.Area.Num != 0 {
			sec.Area = c.positive(ss.Area, field("area"), "section", ss.ID, "area",
				bind(func(sc *Section, v float64) { sc.Area = v }))
		}
		if ss.SecondMoment != nil {
			var prog *expr.Program
			sec.SecondMoment, prog = c.number(*ss.SecondMoment, field("second_moment"),
				bind(func(sc *Section, v float64) { sc.SecondMoment = v }))
			c.secondProg[i] = prog
			if !(sec.SecondMoment > 0) && !math.IsNaN(sec.SecondMoment) {
				c.problem(field("second_moment")(), "section %q needs a positive second_moment, got %g", ss.ID, sec.SecondMoment)
			}
		}
		if ss.SecondMomentY != nil {
			sec.SecondMomentY = c.positive(*ss.SecondMomentY, field("second_moment_y"), "section", ss.ID, "second_moment_y",
				bind(func(sc *Section, v float64) { sc.SecondMomentY = v }))
		}
		if ss.TorsionConstant != nil {
			sec.TorsionConstant = c.positive(*ss.TorsionConstant, field("torsion_constant"), "section", ss.ID, "torsion_constant",
				bind(func(sc *Section, v float64) { sc.TorsionConstant = v }))
		}
		c.sectionModuli(i)
		if ss.Shape != nil {
			c.sectionShape(i)
		} else if c.dim == 3 {
			c.roundSectionDefaults(i)
		}
	}
}

// roundSectionDefaults fills second_moment_y = I and torsion_constant = 2I
// (a round section, common practice) in 3D, with bindings that follow an
// expression for I.
func (c *compiler) roundSectionDefaults(i int) {
	ss, sec, prog := &c.spec.Sections[i], &c.m.Sections[i], c.secondProg[i]
	derive := func(factor float64, set func(*Section, float64)) {
		if prog == nil {
			return
		}
		c.bindings = append(c.bindings, binding{
			path: fmt.Sprintf("sections/%d/second_moment", i), source: ss.SecondMoment.Expr, target: targetSections,
			eval: func(p []float64) (float64, error) {
				v, err := prog.Eval(p)
				return factor * v, err
			},
			set: func(m *Model, v float64) { set(&m.Sections[i], v) },
		})
	}
	if ss.SecondMomentY == nil {
		sec.SecondMomentY = sec.SecondMoment
		derive(1, func(s *Section, v float64) { s.SecondMomentY = v })
	}
	if ss.TorsionConstant == nil {
		sec.TorsionConstant = 2 * sec.SecondMoment
		derive(2, func(s *Section, v float64) { s.TorsionConstant = v })
	}
}

func (c *compiler) nodes() {
	s, m := c.spec, c.m
	n := len(s.Nodes)
	m.NodeIDs = make([]string, n)
	c.nodeIndex = c.newIDIndex("node", "nodes", n, func(i int) string { return s.Nodes[i].ID })
	if c.dim == 0 {
		return
	}
	dim := c.dim
	m.Coords = make([]float64, n*dim)
	for i := range s.Nodes {
		ns := &s.Nodes[i]
		m.NodeIDs[i] = ns.ID
		if ns.Mass != nil {
			if m.NodeMasses == nil {
				m.NodeMasses = make([]float64, n)
			}
			m.NodeMasses[i] = *ns.Mass
			if !(*ns.Mass >= 0) || math.IsInf(*ns.Mass, 0) {
				c.problem(pathf("nodes/%d/mass", i)(), "node %q has mass %g; use zero or a positive finite value", ns.ID, *ns.Mass)
			}
		}
		if len(ns.At) != dim {
			c.problem(pathf("nodes/%d/at", i)(), "node %q has %d coordinates; a %dD model needs %d", ns.ID, len(ns.At), dim, dim)
			for k := range dim {
				m.Coords[i*dim+k] = math.NaN()
			}
			continue
		}
		for k, v := range ns.At {
			if !v.IsExpr && finite(v.Num) {
				m.Coords[i*dim+k] = v.Num
				continue
			}
			at := i*dim + k
			m.Coords[at] = c.fast(v, pathf("nodes/%d/at/%d", i, k),
				binding{target: targetCoords, group: i, set: func(m *Model, x float64) { m.Coords[at] = x }})
		}
	}
	c.tol = coincidenceTolerance * c.boundingDiagonal()
}

// boundingDiagonal returns the diagonal of the box around the nodes with
// valid coordinates.
func (c *compiler) boundingDiagonal() float64 {
	dim, coords := c.dim, c.m.Coords
	lo := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi := [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for i := 0; i+dim <= len(coords); i += dim {
		for k := range dim {
			x := coords[i+k]
			if math.IsNaN(x) {
				continue
			}
			lo[k] = math.Min(lo[k], x)
			hi[k] = math.Max(hi[k], x)
		}
	}
	var d2 float64
	for k := range dim {
		if hi[k] >= lo[k] {
			d2 += (hi[k] - lo[k]) * (hi[k] - lo[k])
		}
	}
	return math.Sqrt(d2)
}
