package model

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gusset/engine/fault"
)

func sqrt(x float64) float64 { return math.Sqrt(x) }

// target names the part of a Model a binding writes, so WithParameters
// copies exactly the slices it is about to change.
type target uint8

const (
	targetCoords target = iota
	targetMaterials
	targetSections
	targetNodal       // Cases[group].Nodal
	targetMemberLoads // Cases[group].MemberLoads
)

// sign is the constraint a bound value must keep when it is re-evaluated.
type sign uint8

const (
	anySign sign = iota
	positive
	nonNegative
)

// binding ties one compiled expression to the number it sets in a Model.
type binding struct {
	path   string                                  // JSON pointer of the expression in the model
	source string                                  // the expression, for messages
	eval   func(params []float64) (float64, error) // evaluates the compiled expression
	set    func(m *Model, v float64)               // writes the value into the model
	target target
	group  int  // load case index for targetNodal and targetMemberLoads; node index for targetCoords
	sign   sign // constraint on the value
	// members are the members incident to the node a coordinate binding
	// moves; their lengths are checked against tol after the move.
	members []int
	tol     float64
}

// ParamIndex returns the index of the named parameter in ParamNames and
// ParamValues, or −1 when there is none.
func (m *Model) ParamIndex(name string) int {
	for i, n := range m.ParamNames {
		if n == name {
			return i
		}
	}
	return -1
}

// WithParameters returns a copy of m with the named parameters set to new
// values and every expression in the model re-evaluated; parameters not
// named keep their values. Only the slices that expressions write are
// copied; the rest (topology, ids, untouched loads) is shared with m, which
// is left unchanged. Both models must be treated as read-only.
//
// It fails with a *fault.Error of kind Expression when a name is not a
// parameter of the model, a value is not finite, an expression fails to
// evaluate (division by zero, ...), a re-evaluated stiffness, area or
// limit is no longer positive, or a member whose end moved now has zero
// length. Problem paths point into the model object ("parameters/depth",
// "nodes/3/at/1").
func (m *Model) WithParameters(values map[string]float64) (*Model, error) {
	var problems []fault.Problem
	params := slices.Clone(m.ParamValues)
	for name, v := range values {
		i := m.ParamIndex(name)
		switch {
		case i < 0:
			problems = append(problems, fault.Problem{
				Path:    "parameters/" + escapePointer(name),
				Message: fmt.Sprintf("unknown parameter %q; %s", name, listParameters(m.ParamNames)),
			})
		case math.IsNaN(v) || math.IsInf(v, 0):
			problems = append(problems, fault.Problem{
				Path:    "parameters/" + escapePointer(name),
				Message: fmt.Sprintf("parameter %q must be a finite number, got %v", name, v),
			})
		default:
			params[i] = v
		}
	}
	if len(problems) > 0 {
		return nil, parameterError(problems)
	}
	out := *m
	out.ParamValues = params
	var copied cow
	for i := range m.bindings {
		b := &m.bindings[i]
		v, err := b.eval(params)
		if err != nil {
			problems = append(problems, fault.Problem{Path: b.path,
				Message: fmt.Sprintf("expression %q failed with %s: %v", b.source, describeParams(m.ParamNames, params), err)})
			continue
		}
		if (b.sign == positive && !(v > 0)) || (b.sign == nonNegative && v < 0) {
			want := "positive"
			if b.sign == nonNegative {
				want = "zero or positive"
			}
			problems = append(problems, fault.Problem{Path: b.path,
				Message: fmt.Sprintf("expression %q gives %g with %s; it must be %s", b.source, v, describeParams(m.ParamNames, params), want)})
			continue
		}
		copied.prepare(&out, b)
		b.set(&out, v)
	}
	for i := range m.bindings {
		b := &m.bindings[i]
		for _, e := range b.members {
			if out.Length(e) <= b.tol {
				mem := out.Members[e]
				problems = append(problems, fault.Problem{Path: b.path,
					Message: fmt.Sprintf("with %s member %q has zero length: its ends %q and %q are at the same point",
						describeParams(m.ParamNames, params), mem.ID, out.NodeIDs[mem.Ends[0]], out.NodeIDs[mem.Ends[1]])})
			}
		}
	}
	if copied.coords {
		problems = append(problems, out.respreadAreas()...)
	}
	if len(problems) > 0 {
		return nil, parameterError(problems)
	}
	return &out, nil
}

// cow records which of a Model's slices have been copied.
type cow struct {
	coords, materials, sections, cases bool
	nodal, memberLoads                 []bool
}

// prepare copies the slice that b writes, once.
func (c *cow) prepare(m *Model, b *binding) {
	switch b.target {
	case targetCoords:
		if !c.coords {
			m.Coords = slices.Clone(m.Coords)
			c.coords = true
		}
	case targetMaterials:
		if !c.materials {
			m.Materials = slices.Clone(m.Materials)
			c.materials = true
		}
	case targetSections:
		if !c.sections {
			m.Sections = slices.Clone(m.Sections)
			c.sections = true
		}
	case targetNodal, targetMemberLoads:
		if !c.cases {
			m.Cases = slices.Clone(m.Cases)
			c.nodal = make([]bool, len(m.Cases))
			c.memberLoads = make([]bool, len(m.Cases))
			c.cases = true
		}
		lc := &m.Cases[b.group]
		if b.target == targetNodal && !c.nodal[b.group] {
			lc.Nodal = slices.Clone(lc.Nodal)
			c.nodal[b.group] = true
		}
		if b.target == targetMemberLoads && !c.memberLoads[b.group] {
			lc.MemberLoads = slices.Clone(lc.MemberLoads)
			c.memberLoads[b.group] = true
		}
	}
}

func parameterError(problems []fault.Problem) *fault.Error {
	msg := problems[0].Message
	if len(problems) > 1 {
		msg = fmt.Sprintf("%d problems with the parameter values; the first: %s", len(problems), msg)
	}
	return &fault.Error{Kind: fault.Expression, Message: msg, Problems: problems}
}

func describeParams(names []string, values []float64) string {
	if len(names) == 0 {
		return "no parameters"
	}
	var b strings.Builder
	for i, n := range names {
		if i > 0 {
			b.WriteString(", ")
		}
		if i == 8 {
			fmt.Fprintf(&b, "...")
			break
		}
		fmt.Fprintf(&b, "%s = %g", n, values[i])
	}
	return b.String()
}

func listParameters(names []string) string {
	if len(names) == 0 {
		return "the model has no parameters"
	}
	sorted := slices.Clone(names)
	slices.Sort(sorted)
	return "parameters are: " + strings.Join(sorted, ", ")
}

// escapePointer escapes one JSON pointer reference token (RFC 6901).
func escapePointer(s string) string {
	if !strings.ContainsAny(s, "~/") {
		return s
	}
	return strings.ReplaceAll(strings.ReplaceAll(s, "~", "~0"), "/", "~1")
}
