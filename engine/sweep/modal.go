package sweep

import (
	"context"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/modes"
	"gusset/engine/stiffness"
)

// The modal metrics ModelEvaluatorModal computes with package modes.
const (
	// MetricCriticalLoadFactor is the least positive linear buckling load
	// factor over the cases (dimensionless).
	MetricCriticalLoadFactor = "critical_load_factor"
	// MetricFirstFrequency is the lowest natural frequency that is not a
	// mechanism (Hz).
	MetricFirstFrequency = "first_frequency"
)

// Modal configures the modal metrics.
type Modal struct {
	// Cases are the load cases and combinations whose least positive
	// buckling factor is critical_load_factor; nil means every case and
	// combination.
	Cases []string
	// Count is the number of buckling factors sought per case, the least
	// positive among them counting; 0 means modes.DefaultCount.
	Count int

	// analysis is the stiffness analysis of the swept model's topology,
	// made once by ModelEvaluatorModal for the modal metrics of every
	// step (numbering, pattern and order reused).
	analysis *stiffness.Analysis
}

// modalMetrics adds the modal metrics wanted to out for the model mm. A
// case whose factors found are all negative (it cannot buckle the
// structure in its own sense) does not govern; when none governs, the
// step fails with a fault.NoSolution error saying so rather than report a
// number that was not found.
func modalMetrics(ctx context.Context, mm *model.Model, want map[string]bool, modal Modal, out map[string]float64) error {
	if want[MetricCriticalLoadFactor] {
		cases := modal.Cases
		if cases == nil {
			for _, c := range mm.Cases {
				cases = append(cases, c.ID)
			}
			for _, c := range mm.Combinations {
				cases = append(cases, c.ID)
			}
		}
		least := math.Inf(1)
		for _, id := range cases {
			res, err := modes.Buckling(ctx, mm, modes.Options{Case: id, Count: modal.Count, Workers: 1, Analysis: modal.analysis, AboveShift: true})
			if err != nil {
				return err
			}
			if res.HasCritical {
				least = math.Min(least, res.Critical)
			}
		}
		if math.IsInf(least, 1) {
			return fault.New(fault.NoSolution, "no positive buckling factor among the lowest %d of cases %q: critical_load_factor is not defined here", max(modal.Count, modes.DefaultCount), cases)
		}
		out[MetricCriticalLoadFactor] = least
	}
	if want[MetricFirstFrequency] {
		res, err := modes.Vibration(ctx, mm, modes.Options{Count: 1 + mechanismCount(mm), Workers: 1, Analysis: modal.analysis})
		if err != nil {
			return err
		}
		for _, md := range res.Modes {
			if !md.Mechanism {
				out[MetricFirstFrequency] = md.Frequency
				return nil
			}
		}
		return fault.New(fault.NoSolution, "every mode found is a mechanism: first_frequency is not defined here")
	}
	return nil
}

// mechanismCount bounds the zero-frequency modes to look past: none for a
// supported structure (the usual case); the rigid-body motions, 3 in the
// plane and 6 in space, otherwise.
func mechanismCount(m *model.Model) int {
	if len(m.Supports) > 0 {
		return 0
	}
	if m.Dim == 2 {
		return 3
	}
	return 6
}
