package adapter

import (
	"gusset/engine/model"
	"gusset/protocol"
)

// patternSpecs converts the model's patterns to the compiler's.
func patternSpecs(w []protocol.Pattern) []model.PatternSpec {
	if len(w) == 0 {
		return nil
	}
	out := make([]model.PatternSpec, len(w))
	for i, p := range w {
		out[i] = model.PatternSpec{ID: p.ID, Permanent: p.Permanent, Mode: p.Mode, Variable: make([]model.VariableSpec, len(p.Variable))}
		for k, v := range p.Variable {
			out[i].Variable[k] = model.VariableSpec{Case: v.Case, FactorOn: v.FactorOn, FactorOff: v.FactorOff}
		}
	}
	return out
}

// patternWire converts the compiler's patterns back to wire types.
func patternWire(s []model.PatternSpec) []protocol.Pattern {
	if len(s) == 0 {
		return nil
	}
	out := make([]protocol.Pattern, len(s))
	for i, p := range s {
		out[i] = protocol.Pattern{ID: p.ID, Permanent: p.Permanent, Mode: p.Mode, Variable: make([]protocol.PatternVariable, len(p.Variable))}
		for k, v := range p.Variable {
			out[i].Variable[k] = protocol.PatternVariable{Case: v.Case, FactorOn: v.FactorOn, FactorOff: v.FactorOff}
		}
	}
	return out
}
