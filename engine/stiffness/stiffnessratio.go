package stiffness

import (
	"context"
	"errors"
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/progress"
)

// residualWarning is the relative equilibrium residual of a case above
// which its result carries a warning: the member forces then balance the
// loads to fewer than six digits (common practice for a linear solve).
const residualWarning = 1e-6

// illConditionedLimit is the largest relative equilibrium residual a
// solve with every positive pivot accepted may leave and still answer:
// beyond it the forces are not known to three digits and the model is
// refused.
const illConditionedLimit = 1e-3

// acceptAnyPivot is the pivot tolerance of the second factorisation of a
// model whose geometry has no mechanism: every positive pivot passes.
const acceptAnyPivot = math.SmallestNonzeroFloat64

// uniformStiffness returns m with every member's stiffness properties set
// to 1 (E, G, A, I and J), so that each member's stiffness depends only on
// its length and direction: its stiffness matrix is singular exactly when
// the geometry and supports leave a mechanism.
func uniformStiffness(m *model.Model) *model.Model {
	u := *m
	u.Materials = make([]model.Material, len(m.Materials))
	for i, mat := range m.Materials {
		u.Materials[i] = model.Material{ID: mat.ID, ElasticModulus: 1, ShearModulus: 1}
	}
	u.Sections = make([]model.Section, len(m.Sections))
	for i, sec := range m.Sections {
		u.Sections[i] = model.Section{ID: sec.ID, Area: 1, SecondMoment: 1, SecondMomentY: 1, TorsionConstant: 1}
	}
	return &u
}

// geometryStable reports whether the model's geometry and supports leave
// no mechanism, by factorising the stiffness matrix of the model with
// uniform member properties (same freedoms, same pivot test). A model whose
// own matrix shows vanishing pivots while this one does not is not a
// mechanism: its member stiffnesses span more than double precision
// resolves.
func geometryStable(ctx context.Context, m *model.Model, nb *numbering, opt Options) (bool, error) {
	u := uniformStiffness(m)
	sys, err := assemble(ctx, u, nb, newPattern(u, nb), opt.Workers, progress.Or(nil))
	if err != nil {
		return false, err
	}
	path := Sparse
	if nb.equations <= opt.DenseLimit {
		path = Dense
	}
	_, _, err = sys.factorise(ctx, path, opt, nil, progress.Or(nil))
	var deficient *errDeficient
	if errors.As(err, &deficient) {
		return false, nil
	}
	return err == nil, err
}

// solveIllConditioned solves a model whose stiffness matrix failed the
// pivot test although its geometry has no mechanism, accepting every
// positive pivot, and says so in a warning with the members' stiffness
// ratio. When a pivot still vanishes, or the forces balance the loads no
// better than illConditionedLimit, the error names the stiffest and the
// softest member with pointers to their sections and materials.
func solveIllConditioned(ctx context.Context, m *model.Model, opt Options, an *Analysis) (*Result, error) {
	ratio, stiff, soft := stiffnessSpan(m)
	opt.PivotTolerance = acceptAnyPivot
	r, err := solve(ctx, m, opt, an)
	var fe *fault.Error
	if (errors.As(err, &fe) && fe.Kind == fault.Unstable) || (err == nil && worstResidual(r) > illConditionedLimit) {
		msg := fmt.Sprintf("the member stiffnesses E·A/L span a ratio of %.2g (member %q to member %q), more than double precision resolves: the stiffness matrix is singular in floating point although the geometry and supports leave no mechanism; bring the ratio below about 1e10 (a near-rigid member can take a smaller area or modulus)",
			ratio, m.Members[stiff].ID, m.Members[soft].ID)
		return nil, &fault.Error{Kind: fault.InvalidModel, Message: msg, Problems: memberStiffnessProblems(m, msg, stiff, soft)}
	}
	if err != nil {
		return nil, err
	}
	r.Warnings = append(r.Warnings, fmt.Sprintf(
		"the stiffness matrix failed the pivot test for a mechanism, but the geometry and supports leave none (the same members with uniform properties factorise): the member stiffnesses E·A/L span a ratio of %.2g (member %q to member %q), so pivots below %.0e of their diagonal were accepted",
		ratio, m.Members[stiff].ID, m.Members[soft].ID, DefaultPivotTolerance))
	return r, nil
}

// memberStiffnessProblems points at the sections and materials of the
// stiffest and softest members.
func memberStiffnessProblems(m *model.Model, msg string, members ...int) []fault.Problem {
	var problems []fault.Problem
	for _, e := range members {
		mem := m.Members[e]
		problems = append(problems,
			fault.Problem{Path: fmt.Sprintf("sections/%d/area", mem.Section), Message: msg},
			fault.Problem{Path: fmt.Sprintf("materials/%d/elastic_modulus", mem.Material), Message: msg})
	}
	return problems
}

// stiffnessSpan returns the ratio of the largest to the smallest axial
// stiffness E·A/L of the members, and those two members.
func stiffnessSpan(m *model.Model) (ratio float64, stiff, soft int) {
	soft, least := softestMember(m)
	stiff, most := -1, 0.0
	for e, mem := range m.Members {
		k := m.Materials[mem.Material].ElasticModulus * m.Sections[mem.Section].Area / m.Length(e)
		if stiff < 0 || k > most {
			stiff, most = e, k
		}
	}
	return most / least, stiff, soft
}

// residualWarnings says, for each case whose member forces leave a
// relative equilibrium residual above residualWarning, by how much: with
// widely spread stiffnesses the forces of the stiffer members come from
// small differences of large displacements and lose digits.
func residualWarnings(r *Result) []string {
	var out []string
	for _, c := range r.Cases {
		if c.Residual > residualWarning {
			out = append(out, fmt.Sprintf("case %q: the member forces balance the loads only to a relative residual of %.2g, so they may be wrong by about that fraction of the largest force (ill-conditioning)", c.ID, c.Residual))
		}
	}
	return out
}

// worstResidual is the largest relative equilibrium residual of r's cases.
func worstResidual(r *Result) float64 {
	worst := 0.0
	for _, c := range r.Cases {
		worst = math.Max(worst, c.Residual)
	}
	return worst
}
