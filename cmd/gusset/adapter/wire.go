package adapter

import (
	"gusset/engine/model"
	"gusset/protocol"
)

// WireModel converts an engine Spec back to the wire model, so that tests,
// benchmarks and the layout optimiser can send engine-built models as requests.
func WireModel(s *model.Spec) *protocol.Model {
	num := func(v model.Value) protocol.Number {
		if v.IsExpr {
			return protocol.Number{Expr: v.Expr, IsExpr: true}
		}
		return protocol.Number{Value: v.Num}
	}
	opt := func(v *model.Value) *protocol.Number {
		if v == nil {
			return nil
		}
		n := num(*v)
		return &n
	}
	nums := func(vs []model.Value) []protocol.Number {
		if vs == nil {
			return nil
		}
		out := make([]protocol.Number, len(vs))
		for i, v := range vs {
			out[i] = num(v)
		}
		return out
	}
	w := &protocol.Model{Dimension: s.Dimension, Units: &protocol.Units{Length: s.Units.Length, Force: s.Units.Force}}
	if len(s.Parameters) > 0 {
		w.Parameters = map[string]float64{}
		for _, p := range s.Parameters {
			w.Parameters[p.Name] = p.Value
		}
	}
	for _, m := range s.Materials {
		w.Materials = append(w.Materials, protocol.Material{ID: m.ID, ElasticModulus: num(m.ElasticModulus),
			ShearModulus: opt(m.ShearModulus), WeightDensity: opt(m.WeightDensity), TensionLimit: opt(m.TensionLimit),
			CompressionLimit: opt(m.CompressionLimit), CarbonFactor: opt(m.CarbonFactor), ThermalExpansion: opt(m.ThermalExpansion),
			MassDensity: opt(m.MassDensity)})
	}
	for _, c := range s.Sections {
		w.Sections = append(w.Sections, protocol.Section{ID: c.ID, Area: wireArea(c.Area, c.Shape), Shape: wireShape(c.Shape), SectionModulus: opt(c.SectionModulus), SectionModulusY: opt(c.SectionModulusY), SecondMoment: opt(c.SecondMoment),
			SecondMomentY: opt(c.SecondMomentY), TorsionConstant: opt(c.TorsionConstant)})
	}
	for _, n := range s.Nodes {
		w.Nodes = append(w.Nodes, protocol.Node{ID: n.ID, At: nums(n.At), Mass: n.Mass})
	}
	for _, m := range s.Members {
		w.Members = append(w.Members, protocol.Member{ID: m.ID, Ends: []string{m.Ends[0], m.Ends[1]}, Material: m.Material, Section: m.Section,
			Type: m.Type, Orientation: m.Orientation, BucklingFactor: m.BucklingFactor, BucklingCurve: m.BucklingCurve,
			Behaviour: m.Behaviour, Pretension: m.Pretension})
	}
	for i, m := range s.Members {
		w.Members[i].Releases = releasesWire(m.Releases)
	}
	for _, p := range s.Supports {
		w.Supports = append(w.Supports, protocol.Support{Node: p.Node, Fix: p.Fix, Springs: p.Springs, Displacement: p.Displacement, Directions: p.Directions})
	}
	for _, c := range s.LoadCases {
		lc := protocol.LoadCase{ID: c.ID, SelfWeight: c.SelfWeight}
		for _, l := range c.Loads {
			lc.Loads = append(lc.Loads, protocol.NodalLoad{Node: l.Node, Force: nums(l.Force), Moment: nums(l.Moment)})
		}
		for _, l := range c.MemberLoads {
			lc.MemberLoads = append(lc.MemberLoads, protocol.MemberLoad{Member: l.Member, Kind: l.Kind, Axes: l.Axes,
				Value: nums(l.Value), EndValue: nums(l.EndValue), Distance: opt(l.Distance), Strain: opt(l.Strain),
				TemperatureChange: opt(l.TemperatureChange)})
		}
		lc.AreaLoads = areaLoadWire(c.AreaLoads)
		w.LoadCases = append(w.LoadCases, lc)
	}
	for _, c := range s.Combos {
		w.Combinations = append(w.Combinations, protocol.Combination{ID: c.ID, Factors: c.Factors})
	}
	w.Patterns = patternWire(s.Patterns)
	return w
}
