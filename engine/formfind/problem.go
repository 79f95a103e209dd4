package formfind

import (
	"fmt"
	"math"

	"gusset/engine/expr"
	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/progress"
)

// Problem is what Find is asked to do with a model. JSON pointers in Find's
// errors and warnings are relative to an object that holds the model at
// /model and Problem's fields under the wire names below (/force_density,
// /force_densities/3, /through/node, /targets/0/length, ...).
type Problem struct {
	// Case is the id of the load case or combination whose nodal loads
	// (and self-weight and member loads, lumped to the member ends) load
	// the free nodes; "" means the model's first load case, or no loads
	// when it has none.
	Case string
	// ForceDensity is one force density (force per length, tension
	// positive) for every member; nil unless given. Exactly one of
	// ForceDensity and ForceDensities must be given.
	ForceDensity *model.Value
	// ForceDensities holds one force density per member, aligned with the
	// model's members; numbers or expressions over the model's parameters.
	ForceDensities []model.Value
	// Through, when not nil, scales every force density by one factor so
	// that a node passes through a point.
	Through *Through
	// Targets are lengths or forces of chosen members met by iterating
	// their force densities. Targets and Through exclude each other.
	Targets []Target
}

// Through asks that node Node pass through point At (Dim coordinates, length
// units). Find scales every force density by one factor s; the node's
// position is then h + l/s, with h and l fixed vectors, and s is chosen by
// least squares over the components. With vertical loads only the
// component along gravity can be met; the distance left in the others is
// reported as Result.ThroughMisfit.
type Through struct {
	Node string
	At   []float64
}

// Target asks for a length (length units, positive) or an axial force
// (force units, tension positive) of member Member; exactly one of Length
// and Force is set.
type Target struct {
	Member string
	Length *float64
	Force  *float64
}

// Defaults of Options.
const (
	DefaultMaxIterations = 100
	DefaultTolerance     = 1e-9
)

// Options controls Find. The zero value is ready to use.
type Options struct {
	// MaxIterations bounds the iterations of targets and of loads that
	// follow the form; 0 means DefaultMaxIterations.
	MaxIterations int
	// Tolerance ends those iterations: the largest move of a free node
	// relative to the size of the model (the diagonal of its bounding box)
	// and the largest relative misfit of a target must both fall to it;
	// 0 means DefaultTolerance.
	Tolerance float64
	// Workers bounds the goroutines of the factorisation; 0 means
	// GOMAXPROCS. Results do not depend on it.
	Workers int
	// Reporter receives the sparse factorisation's stages "ordering",
	// "symbolic" and "factorising" (done and total count supernodes; every
	// factorisation of an iteration reports again) and, when iterating and
	// Iterations is nil, "iterating" after each iteration (done counts
	// iterations, total is MaxIterations); nil reports nothing.
	Reporter progress.Reporter
	// Iterations, when not nil, receives "iterating" after each iteration
	// with the Iteration itself instead of Reporter.
	Iterations progress.Recorder[Iteration]
}

// Iteration is the partial result reported after each iteration.
type Iteration struct {
	Iteration int     // 1-based
	Change    float64 // largest move of a free node in this iteration (length units)
	Misfit    float64 // largest relative misfit of a target (0 without targets)
}

func (o Options) withDefaults() Options {
	if o.MaxIterations <= 0 {
		o.MaxIterations = DefaultMaxIterations
	}
	if !(o.Tolerance > 0) {
		o.Tolerance = DefaultTolerance
	}
	o.Reporter = progress.Or(o.Reporter)
	return o
}

// forceDensities evaluates the problem's force densities, one per member.
func forceDensities(m *model.Model, p *Problem) ([]float64, error) {
	n := len(m.Members)
	switch {
	case p.ForceDensity != nil && p.ForceDensities != nil:
		return nil, fault.At(fault.InvalidModel, "/force_densities", "give either force_density or force_densities, not both")
	case p.ForceDensity == nil && p.ForceDensities == nil:
		return nil, fault.At(fault.MissingData, "/force_density", "give a force density: force_density (one for every member) or force_densities (one per member)")
	case p.ForceDensities != nil && len(p.ForceDensities) != n:
		return nil, fault.At(fault.InvalidModel, "/force_densities", "force_densities has %d entries; the model has %d members", len(p.ForceDensities), n)
	}
	q := make([]float64, n)
	if p.ForceDensity != nil {
		v, err := evaluate(m, *p.ForceDensity, "/force_density")
		if err != nil {
			return nil, err
		}
		for e := range q {
			q[e] = v
		}
		return q, nil
	}
	var problems []fault.Problem
	for e, val := range p.ForceDensities {
		v, err := evaluate(m, val, fmt.Sprintf("/force_densities/%d", e))
		if err != nil {
			fe, _ := fault.As(err)
			problems = append(problems, fe.Problems...)
		}
		q[e] = v
	}
	if problems != nil {
		return nil, &fault.Error{Kind: fault.Expression, Message: "force densities that are not finite numbers: " + problems[0].Message, Problems: problems}
	}
	return q, nil
}

// evaluate returns v's number, compiling and evaluating an expression over
// the model's parameters.
func evaluate(m *model.Model, v model.Value, path string) (float64, error) {
	x := v.Num
	if v.IsExpr {
		prog, err := expr.Compile(v.Expr, m.ParamNames)
		if err != nil {
			return 0, fault.At(fault.Expression, path, "expression %q: %v", v.Expr, err)
		}
		if x, err = prog.Eval(m.ParamValues); err != nil {
			return 0, fault.At(fault.Expression, path, "expression %q cannot be evaluated: %v", v.Expr, err)
		}
	}
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, fault.At(fault.Expression, path, "force density must be a finite number, got %v", x)
	}
	return x, nil
}

// fixity returns, per node, whether its supports hold every translational
// component. A support that holds only some is an error: the force density
// method fixes a node or leaves it free.
func fixity(m *model.Model, warn func(path, format string, args ...any)) ([]bool, error) {
	fixed := make([]bool, m.NodeCount())
	var problems []fault.Problem
	for k, s := range m.Supports {
		all, any := true, false
		for c := 0; c < m.Dim; c++ {
			all = all && s.Fixed[c]
			any = any || s.Fixed[c]
		}
		for c := range s.Spring {
			if s.Spring[c] != 0 {
				warn(fmt.Sprintf("/model/supports/%d/springs", k), "springs are not used by form finding: the node is held or free")
				break
			}
		}
		for c := range s.Displacement {
			if s.Displacement[c] != 0 {
				warn(fmt.Sprintf("/model/supports/%d/displacement", k), "prescribed displacements are not used by form finding: the node stays where it is given")
				break
			}
		}
		if any && !all {
			problems = append(problems, fault.Problem{Path: fmt.Sprintf("/model/supports/%d/fix", k),
				Message: fmt.Sprintf("support of node %q holds only some translations; form finding fixes a node in every direction or leaves it free", m.NodeIDs[s.Node])})
		}
		if all {
			fixed[s.Node] = true
		}
	}
	if problems != nil {
		return nil, &fault.Error{Kind: fault.InvalidModel, Message: problems[0].Message, Problems: problems}
	}
	return fixed, nil
}
