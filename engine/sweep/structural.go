package sweep

import (
	"context"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/loadpath"
	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// The metrics ModelEvaluator computes.
const (
	MetricLoadPath        = "load_path"        // largest Z = Σ|N|·L over the cases (force × length)
	MetricVolume          = "volume"           // sized volume enveloped over the cases (length³)
	MetricMass            = "mass"             // mass of that volume (kg)
	MetricCarbon          = "carbon"           // embodied carbon of that mass (kg CO2e)
	MetricMaxDisplacement = "max_displacement" // Solution.MaxDisplacement (length)
	MetricMaxUtilisation  = "max_utilisation"  // Solution.MaxUtilisation (dimensionless)
)

var knownMetrics = []string{MetricLoadPath, MetricVolume, MetricMass, MetricCarbon, MetricMaxDisplacement, MetricMaxUtilisation,
	MetricCriticalLoadFactor, MetricFirstFrequency}

// Solution is what a structural solver reports to ModelEvaluator for one
// set of parameter values.
type Solution struct {
	// Cases holds the axial forces and external forces (applied loads with
	// member loads lumped to the nodes, plus reactions) of each case or
	// combination of interest, as loadpath.Compute takes them.
	Cases []loadpath.Case
	// MaxDisplacement is the largest translation magnitude over the cases,
	// at the nodes and inside the members, in the model's length unit.
	MaxDisplacement float64
	// MaxUtilisation is the largest member utilisation over the cases.
	MaxUtilisation float64
	// UncheckedMember names a member whose checks could not all be made
	// (a missing limit or section property), empty when every member was
	// checked: MaxUtilisation then covers the checked members only, and
	// the max_utilisation metric fails rather than flatter.
	UncheckedMember string
	// ForcesOnly is set by a solver that recovered the forces alone
	// (StiffnessSolverFor): MaxUtilisation is then not computed, nor
	// MaxDisplacement for a model with beams, and ModelEvaluator panics
	// when asked for those metrics from such a solution.
	ForcesOnly bool
}

// Solver analyses one re-parametrised model. It returns a *fault.Error
// (for example of kind Unstable at a geometry that is a mechanism) when the
// model cannot be solved; the step then fails with that error.
type Solver func(ctx context.Context, m *model.Model) (*Solution, error)

// ModelEvaluator returns the Evaluator of a structural sweep over the
// parameters names (one per axis, in axis order) of the compiled model m.
// Each evaluation sets the parameters with m.WithParameters (re-evaluating
// the expressions only; the topology stays compiled), solves with solve and
// computes the requested metrics (the Metric constants) with
// package loadpath under opt; opt.Size is turned on when volume, mass or
// carbon is asked for.
//
// It returns a *PlanError for an unknown parameter (path /axes/i/name) or
// metric (path /metrics/i) and, when carbon is asked for, a *fault.Error
// of kind MissingData for each material without a carbon factor. It panics
// if m or solve is nil.
func ModelEvaluator(m *model.Model, names, metrics []string, solve Solver, opt loadpath.Options) (Evaluator, error) {
	return ModelEvaluatorModal(m, names, metrics, solve, opt, Modal{})
}

// ModelEvaluatorModal is ModelEvaluator with the modal metrics
// (critical_load_factor, first_frequency: package modes) configured by
// modal.
func ModelEvaluatorModal(m *model.Model, names, metrics []string, solve Solver, opt loadpath.Options, modal Modal) (Evaluator, error) {
	if m == nil || solve == nil {
		panic("sweep: nil model or solver")
	}
	for i, name := range names {
		found := false
		for _, p := range m.ParamNames {
			found = found || p == name
		}
		if !found {
			return nil, &PlanError{Path: fmt.Sprintf("/axes/%d/name", i),
				Message: fmt.Sprintf("the model has no parameter %q (it has %q)", name, m.ParamNames)}
		}
	}
	want, err := wanted(metrics)
	if err != nil {
		return nil, err
	}
	if want[MetricCarbon] {
		var problems []fault.Problem
		for i, mat := range m.Materials {
			if !mat.HasCarbonFactor {
				problems = append(problems, fault.Problem{Path: fmt.Sprintf("/materials/%d/carbon_factor", i),
					Message: fmt.Sprintf("material %q has no carbon factor, which the carbon metric needs", mat.ID)})
			}
		}
		if problems != nil {
			return nil, &fault.Error{Kind: fault.MissingData, Message: "the carbon metric needs a carbon factor for every material", Problems: problems}
		}
	}
	opt.Size = opt.Size || want[MetricVolume] || want[MetricMass] || want[MetricCarbon]
	needLoadPath := opt.Size || want[MetricLoadPath]
	names = append([]string(nil), names...)
	if want[MetricCriticalLoadFactor] || want[MetricFirstFrequency] {
		modal.analysis = stiffness.NewAnalysis(m, stiffness.Options{Workers: 1})
	}

	return func(ctx context.Context, values []float64) (map[string]float64, error) {
		if len(values) != len(names) {
			panic(fmt.Sprintf("sweep: %d values for %d parameters", len(values), len(names)))
		}
		params := make(map[string]float64, len(names))
		for i, name := range names {
			params[name] = values[i]
		}
		mm, err := m.WithParameters(params)
		if err != nil {
			return nil, err
		}
		sol, err := solve(ctx, mm)
		if err != nil {
			return nil, err
		}
		out := make(map[string]float64, len(want))
		if needLoadPath {
			res, err := loadpath.Compute(mm, sol.Cases, opt)
			if err != nil {
				return nil, err
			}
			z := 0.0
			for _, c := range res.Cases {
				z = math.Max(z, c.LoadPath)
			}
			set(out, want, MetricLoadPath, z)
			set(out, want, MetricVolume, res.Totals.All.Volume)
			set(out, want, MetricMass, res.Totals.All.Mass)
			set(out, want, MetricCarbon, res.Totals.All.Carbon)
		}
		mustServe(sol, mm, metrics)
		set(out, want, MetricMaxDisplacement, sol.MaxDisplacement)
		if want[MetricMaxUtilisation] && sol.UncheckedMember != "" {
			return nil, fault.New(fault.MissingData, "max_utilisation is unknown: member %q could not be checked (solve's unchecked list says which data is missing)", sol.UncheckedMember)
		}
		set(out, want, MetricMaxUtilisation, sol.MaxUtilisation)
		if err := modalMetrics(ctx, mm, want, modal, out); err != nil {
			return nil, err
		}
		return out, nil
	}, nil
}

func set(out map[string]float64, want map[string]bool, name string, v float64) {
	if want[name] {
		out[name] = v
	}
}

// quotedList writes names quoted and separated by commas: "a", "b".
func quotedList(names []string) string {
	quoted := make([]string, len(names))
	for i, n := range names {
		quoted[i] = strconv.Quote(n)
	}
	return strings.Join(quoted, ", ")
}

// wanted returns the set of metrics asked for, or a *PlanError for an
// unknown one.
func wanted(metrics []string) (map[string]bool, error) {
	want := map[string]bool{}
	for i, name := range metrics {
		if !slices.Contains(knownMetrics, name) {
			return nil, &PlanError{Path: fmt.Sprintf("/metrics/%d", i),
				Message: fmt.Sprintf("unknown metric %q (known: %s)", name, quotedList(knownMetrics))}
		}
		want[name] = true
	}
	return want, nil
}

// mustServe panics when sol, from a solver that recovered forces only
// (StiffnessSolverFor), is asked for metrics that need the members'
// results: a programming error, never a result that quietly lacks them.
func mustServe(sol *Solution, m *model.Model, metrics []string) {
	if sol.ForcesOnly && needsMemberResults(m, metrics) {
		panic("sweep: a solver that recovers forces only (StiffnessSolverFor) serves metrics that need the members' results")
	}
}
