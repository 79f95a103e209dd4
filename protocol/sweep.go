package protocol

// SweepResult is the result of sweep-parameter.
type SweepResult struct {
	// Parameters names the swept parameters, in axis order.
	Parameters []string `json:"parameters"`
	// Total is the number of steps of the whole sweep (all shards).
	Total int `json:"total"`
	// Steps holds this shard's steps in index order (empty when the
	// request asked for steps "summary").
	Steps []SweepStep `json:"steps"`
	// Failed counts the steps that failed.
	Failed int `json:"failed"`
	// Best is the index of the best successful step for the objective, −1
	// when there is no objective or no step succeeded.
	Best int `json:"best"`
	// Refinement is the refined optimum, when an objective was given.
	Refinement *Refinement `json:"refinement,omitempty"`
	// Warnings locate what the sweep cannot vary: a swept parameter that
	// no expression of the model reads (its steps are all one model), with
	// the pointer of its axis.
	Warnings []Problem `json:"warnings,omitempty"`
	// Caution: results are for preliminary design.
	Caution string `json:"caution"`
}

// SweepStep is one step of a sweep; it is also the partial of each "step"
// progress notification.
type SweepStep struct {
	// Index is the step's global index: for a grid, i·n₂ + j.
	Index int `json:"index"`
	// Values are the parameter values, in axis order.
	Values []float64 `json:"values"`
	// Metrics maps metric names to values; empty when the step failed.
	Metrics map[string]float64 `json:"metrics"`
	// Error says why the step failed; empty when it succeeded.
	Error string `json:"error,omitempty"`
}

// Refinement is the optimum found from the best step.
type Refinement struct {
	// Method is "brent" (one parameter) or "nelder-mead" (two).
	Method string `json:"method"`
	// StartIndex is the step refinement started from.
	StartIndex int `json:"start_index"`
	// Values are the parameter values at the optimum.
	Values []float64 `json:"values"`
	// Objective is the objective's value there.
	Objective float64 `json:"objective"`
	// Metrics are all requested metrics there.
	Metrics map[string]float64 `json:"metrics"`
	// Evaluations counts the evaluations the refinement made.
	Evaluations int `json:"evaluations"`
	// Converged is true when the tolerance was met.
	Converged bool `json:"converged"`
	// AtEdge is true when the optimum lies on a bound of the range: the
	// true optimum may lie outside it.
	AtEdge bool `json:"at_edge"`
	// Message says why refinement could not run, when it could not.
	Message string `json:"message,omitempty"`
	// Feasible is true when the optimum meets every constraint (always
	// once refinement has run).
	Feasible bool `json:"feasible"`
	// ActiveConstraints lists the constraints (indices into the request's
	// constraints) whose boundary the optimum lies on; empty when the
	// optimum is interior.
	ActiveConstraints []int `json:"active_constraints"`
}
