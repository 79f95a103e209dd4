package adapter

import (
	"sort"

	"gusset/engine/model"
	"gusset/protocol"
)

// specOf converts the wire model to the engine's input form. It copies
// field by field; all checking is the compiler's. Nodes and members that
// the decode took straight into the engine's form (w.Decoded) are used as
// they are.
func specOf(w *protocol.Model) *model.Spec {
	s := &model.Spec{Dimension: w.Dimension}
	if w.Units != nil {
		s.Units = model.UnitsSpec{Length: w.Units.Length, Force: w.Units.Force}
	}
	names := make([]string, 0, len(w.Parameters))
	for name := range w.Parameters {
		names = append(names, name)
	}
	sort.Strings(names)
	for _, name := range names {
		s.Parameters = append(s.Parameters, model.ParameterSpec{Name: name, Value: w.Parameters[name]})
	}
	s.Materials = make([]model.MaterialSpec, len(w.Materials))
	for i, m := range w.Materials {
		s.Materials[i] = model.MaterialSpec{
			ID: m.ID, ElasticModulus: value(m.ElasticModulus), ShearModulus: optional(m.ShearModulus),
			WeightDensity: optional(m.WeightDensity), TensionLimit: optional(m.TensionLimit),
			CompressionLimit: optional(m.CompressionLimit), CarbonFactor: optional(m.CarbonFactor),
			ThermalExpansion: optional(m.ThermalExpansion), MassDensity: optional(m.MassDensity),
		}
	}
	s.Sections = make([]model.SectionSpec, len(w.Sections))
	for i, c := range w.Sections {
		s.Sections[i] = model.SectionSpec{ID: c.ID, Area: areaOf(c.Area), Shape: shapeOf(c.Shape), SectionModulus: optional(c.SectionModulus), SectionModulusY: optional(c.SectionModulusY), SecondMoment: optional(c.SecondMoment),
			SecondMomentY: optional(c.SecondMomentY), TorsionConstant: optional(c.TorsionConstant)}
	}
	if st, ok := w.Decoded.(*straight); ok {
		s.Nodes, s.Members = st.nodes, st.members
	} else {
		s.Nodes = nodeSpecs(w.Nodes)
		s.Members = make([]model.MemberSpec, len(w.Members))
		for i := range w.Members {
			memberSpecOf(&s.Members[i], &w.Members[i])
		}
	}
	s.Supports = make([]model.SupportSpec, len(w.Supports))
	for i, p := range w.Supports {
		s.Supports[i] = model.SupportSpec{Node: p.Node, Fix: p.Fix, Springs: p.Springs, Displacement: p.Displacement, Directions: p.Directions}
	}
	s.LoadCases = make([]model.LoadCaseSpec, len(w.LoadCases))
	for i, c := range w.LoadCases {
		lc := model.LoadCaseSpec{ID: c.ID, SelfWeight: c.SelfWeight}
		for _, l := range c.Loads {
			lc.Loads = append(lc.Loads, model.NodalLoadSpec{Node: l.Node, Force: values(l.Force), Moment: values(l.Moment)})
		}
		for _, l := range c.MemberLoads {
			lc.MemberLoads = append(lc.MemberLoads, model.MemberLoadSpec{
				Member: l.Member, Kind: l.Kind, Axes: l.Axes, Value: values(l.Value), EndValue: values(l.EndValue),
				Distance: optional(l.Distance), Strain: optional(l.Strain), TemperatureChange: optional(l.TemperatureChange),
			})
		}
		lc.AreaLoads = areaLoadSpecs(c.AreaLoads)
		s.LoadCases[i] = lc
	}
	s.Combos = make([]model.CombinationSpec, len(w.Combinations))
	for i, c := range w.Combinations {
		s.Combos[i] = model.CombinationSpec{ID: c.ID, Factors: c.Factors}
	}
	s.Patterns = patternSpecs(w.Patterns)
	return s
}

// memberSpecOf writes the wire member m into ms field by field: no copy
// of either struct (a large model's members are tens of megabytes).
func memberSpecOf(ms *model.MemberSpec, m *protocol.Member) {
	ms.ID, ms.Ends, ms.Material, ms.Section, ms.Type = m.ID, memberEnds(m.Ends), m.Material, m.Section, m.Type
	ms.BucklingCurve, ms.Orientation, ms.BucklingFactor = m.BucklingCurve, m.Orientation, m.BucklingFactor
	ms.Behaviour, ms.Pretension, ms.Releases = m.Behaviour, m.Pretension, releasesSpec(m.Releases)
}

// nodeSpecs converts the nodes; their coordinates share one array (one
// allocation, not one a node).
func nodeSpecs(nodes []protocol.Node) []model.NodeSpec {
	out := make([]model.NodeSpec, len(nodes))
	coordinates := 0
	for _, n := range nodes {
		coordinates += len(n.At)
	}
	all := make([]model.Value, 0, coordinates)
	for i, n := range nodes {
		var at []model.Value
		if n.At != nil {
			start := len(all)
			for _, x := range n.At {
				all = append(all, value(x))
			}
			at = all[start:len(all):len(all)]
		}
		out[i] = model.NodeSpec{ID: n.ID, At: at, Mass: n.Mass}
	}
	return out
}

func value(n protocol.Number) model.Value {
	if n.IsExpr {
		return model.Expr(n.Expr)
	}
	return model.Num(n.Value)
}

func optional(n *protocol.Number) *model.Value {
	if n == nil {
		return nil
	}
	v := value(*n)
	return &v
}

func values(ns []protocol.Number) []model.Value {
	if ns == nil {
		return nil
	}
	out := make([]model.Value, len(ns))
	for i, n := range ns {
		out[i] = value(n)
	}
	return out
}
