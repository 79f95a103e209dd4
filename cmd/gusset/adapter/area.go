package adapter

import (
	"gusset/engine/model"
	"gusset/protocol"
)

// areaLoadSpecs converts a load case's area loads for the compiler.
func areaLoadSpecs(w []protocol.AreaLoad) []model.AreaLoadSpec {
	if len(w) == 0 {
		return nil
	}
	out := make([]model.AreaLoadSpec, len(w))
	for i, a := range w {
		out[i] = model.AreaLoadSpec{Nodes: a.Nodes, Pressure: a.Pressure, Value: a.Value, Projected: a.Projected,
			To: a.To, Span: a.Span, SpanDirection: a.SpanDirection}
	}
	return out
}

// areaLoadWire converts area loads back to the wire (a returned model).
func areaLoadWire(s []model.AreaLoadSpec) []protocol.AreaLoad {
	if len(s) == 0 {
		return nil
	}
	out := make([]protocol.AreaLoad, len(s))
	for i, a := range s {
		out[i] = protocol.AreaLoad{Nodes: a.Nodes, Pressure: a.Pressure, Value: a.Value, Projected: a.Projected,
			To: a.To, Span: a.Span, SpanDirection: a.SpanDirection}
	}
	return out
}
