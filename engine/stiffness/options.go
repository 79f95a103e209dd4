package stiffness

import (
	"gusset/engine/progress"
)

// Path selects the linear solver.
type Path string

// The solver paths.
const (
	Auto   Path = ""       // dense up to Options.DenseLimit freedoms, sparse above
	Dense  Path = "dense"  // gonum's dense Cholesky (O(n²) memory, O(n³) time)
	Sparse Path = "sparse" // the supernodal sparse Cholesky of package sparse
)

// Defaults of Options.
const (
	DefaultDenseLimit     = 200
	DefaultStabilityLimit = 300
	DefaultPivotTolerance = 1e-13
)

// Options configures Solve. The zero value is ready to use.
type Options struct {
	// Cases lists the ids of the load cases and combinations to return, in
	// that order; nil means every case, then every combination, in model
	// order.
	Cases []string
	// Reporter receives the stages "assembling", "ordering",
	// "factorising", "solving" and "recovering"; nil reports nothing.
	Reporter progress.Reporter
	// Workers bounds the goroutines of the sparse factorisation, and of
	// assembly, load cases and recovery on large models; 0 means
	// GOMAXPROCS. Results do not depend on it.
	Workers int
	// DenseLimit is the number of unconstrained freedoms at or below which
	// the Auto path uses the dense solver; 0 means DefaultDenseLimit.
	DenseLimit int
	// Path forces a solver; Auto chooses by DenseLimit.
	Path Path
	// StabilityLimit is the largest equilibrium matrix (rows or columns)
	// for which the stability report is computed by dense SVD (see
	// statics.Options.DenseLimit; the SVD costs O(n³), about 0.1 s at the
	// default); 0 means DefaultStabilityLimit, and a negative value skips
	// the SVD. Above the limit the counts still come from the
	// factorisation when the model has no springs. The same limit bounds
	// the dense eigen-decomposition that finds a mechanism's modes.
	StabilityLimit int
	// PivotTolerance is the smallest accepted pivot of the stiffness
	// matrix scaled to unit diagonal; a smaller pivot marks a mechanism.
	// 0 means DefaultPivotTolerance.
	PivotTolerance float64
	// SkipCondition leaves out the condition estimate (a dozen extra
	// solves) and its warning: Stats.ConditionNumber is then 0. Sweeps,
	// which keep only metrics, set it.
	SkipCondition bool
	// Stations is the number of evenly spaced stations (both ends
	// included) at which each beam's internal forces and displacements are
	// reported by CaseResult.Member; 0 means DefaultStations and a
	// negative value none. The exact extremes along each member are found
	// whatever the stations.
	Stations int
	// Recovery selects how much is worked out along each member after the
	// displacements; the zero value, RecoverAll, works out everything.
	Recovery Recovery
	// SecondOrder, when not nil, adds the P-Δ geometric stiffness of the
	// axial forces and iterates each case to convergence (see
	// SecondOrder); nil is a first-order analysis.
	SecondOrder *SecondOrder
	// Fold, when not nil, receives each case's result as soon as it is
	// recovered, with its index in Result.Cases, one call at a time (from
	// the recovering goroutines, in no fixed order). When it returns
	// false, Result.Cases keeps only the case's id, kind and scalars
	// (residual, balance, sums, largest displacement and moment), without
	// its per-node and per-member arrays, so a caller that folds the
	// cases into a running summary (package envelope) holds one case per
	// worker at a time instead of all of them. Result.Unchecked and the
	// warnings still cover every case. Cases solved by iteration
	// (one-sided members, second order) are folded one by one as each
	// converges; those of the held-mechanism path are not folded: they
	// stay whole in Result.Cases.
	Fold func(index int, c *CaseResult) (keep bool)
}

// Recovery selects how much Solve works out for each member once the
// displacements are known.
type Recovery int

const (
	// RecoverAll works out every result of CaseResult: the members' end
	// and axial forces, their results along the length (stations, exact
	// extremes, energies) and their checks.
	RecoverAll Recovery = iota
	// RecoverForces works out the nodal results (displacements,
	// rotations, reactions, external forces, sums, balance and residual)
	// and each member's end forces, axial force and stress, which are what
	// Maxwell's load path and the material volume need, and nothing along
	// the members: CaseResult.MemberCount is 0 and Utilisation nil (no member
	// is checked, and Result.Unchecked does not list them), MaxMoment is
	// unset (Member and Node −1) and MaxDisplacement is that of the nodes
	// when every member is a bar (exact then: a bar's displacement is
	// linear along it) and unset (Member and Node −1) otherwise. The
	// values it does work out are those of RecoverAll, bit for bit. A
	// sweep whose metrics need nothing more chooses it.
	RecoverForces
)

// recovery is what recoverCase works out along each member: stations per
// beam (0 for none) and, when forcesOnly, nothing but the end forces.
type recovery struct {
	stations   int
	forcesOnly bool
}

// recovery resolves opt's Stations and Recovery.
func (opt Options) recovery() recovery {
	if opt.Recovery == RecoverForces {
		return recovery{forcesOnly: true}
	}
	return recovery{stations: stationCount(opt.Stations)}
}
