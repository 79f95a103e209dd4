package sweep

import (
	"context"
	"math"
	"slices"

	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// StiffnessSolver returns the Solver of a structural sweep over m: the
// stiffness analysis of the given cases (nil for all), built once from m so
// that the numbering, the stiffness pattern and its ordering are worked
// out once (the steps change numbers only, never the topology); no
// stations are reported along the members. Each solution holds the
// load-path cases (mean axial forces and external forces,
// loadpath.Solved), the largest translation anywhere (at the nodes and
// inside the members, CaseResult.MaxDisplacement) and the largest
// utilisation over the cases (0 when no member was checked).
func StiffnessSolver(m *model.Model, cases []string) Solver {
	return solverRecovering(m, cases, stiffness.RecoverAll)
}

// StiffnessSolverFor is StiffnessSolver for a sweep that computes the given
// metrics (as Metrics returns them; nil means every metric). When none of
// them needs the members' results along their length or their checks
// (max_utilisation does, and max_displacement on a model with beams, whose
// largest displacement may lie inside a member), it recovers the forces
// alone (stiffness.RecoverForces): the load path, volume, mass, carbon and
// a bar model's largest displacement are the same, bit for bit, at a
// fraction of the recovery's cost. Its Solutions then have ForcesOnly set
// and no MaxUtilisation.
func StiffnessSolverFor(m *model.Model, cases, metrics []string) Solver {
	if metrics == nil || needsMemberResults(m, metrics) {
		return solverRecovering(m, cases, stiffness.RecoverAll)
	}
	return solverRecovering(m, cases, stiffness.RecoverForces)
}

// needsMemberResults reports whether a metric needs what
// stiffness.RecoverForces leaves out.
func needsMemberResults(m *model.Model, metrics []string) bool {
	return slices.Contains(metrics, MetricMaxUtilisation) || !m.LinearBetweenEnds() && slices.Contains(metrics, MetricMaxDisplacement)
}

// solverRecovering is StiffnessSolver recovering as much as recovery says.
func solverRecovering(m *model.Model, cases []string, recovery stiffness.Recovery) Solver {
	analysis := stiffness.NewAnalysis(m, stiffness.Options{Cases: cases, Workers: 1, StabilityLimit: -1, SkipCondition: true, Stations: -1,
		Recovery: recovery})
	return func(ctx context.Context, mm *model.Model) (*Solution, error) {
		r, err := analysis.Solve(ctx, mm)
		if err != nil {
			return nil, err
		}
		sol := &Solution{Cases: loadpath.Solved(r), ForcesOnly: recovery == stiffness.RecoverForces}
		for i := range r.Cases {
			u, _ := r.Cases[i].MaxUtilisation()
			sol.MaxDisplacement = math.Max(sol.MaxDisplacement, r.Cases[i].MaxDisplacement.Value)
			sol.MaxUtilisation = math.Max(sol.MaxUtilisation, u)
			for e, v := range r.Cases[i].Utilisation {
				if v < 0 && sol.UncheckedMember == "" {
					sol.UncheckedMember = mm.Members[e].ID
				}
			}
		}
		return sol, nil
	}
}

// Metrics returns the metrics a sweep of m computes: those requested or,
// when none are, the load path, with the volume too when the members are
// sized (sized) or every material has both strength limits; the
// objective's metric is added when missing.
func Metrics(m *model.Model, requested []string, sized bool, objective string) []string {
	metrics := requested
	if len(metrics) == 0 {
		metrics = []string{MetricLoadPath}
		if sized || hasLimits(m) {
			metrics = append(metrics, MetricVolume)
		}
	}
	if objective != "" && !slices.Contains(metrics, objective) {
		metrics = append(metrics, objective)
	}
	return metrics
}

// hasLimits reports whether m has materials and every one has a tension
// and a compression limit.
func hasLimits(m *model.Model) bool {
	for _, mat := range m.Materials {
		if mat.TensionLimit <= 0 || mat.CompressionLimit <= 0 {
			return false
		}
	}
	return len(m.Materials) > 0
}
