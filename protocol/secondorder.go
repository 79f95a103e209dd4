package protocol

// SecondOrder configures the second-order (P-Δ) analysis of solve: each
// case is solved with the stiffness plus the geometric stiffness of the
// axial forces of the previous solve (first the pretension alone; the
// string term N/L on each member's transverse translations), until the
// displacements settle.
type SecondOrder struct {
	// Tolerance is the largest change of a displacement between two
	// solves, relative to the largest displacement, at which the
	// iteration stops; default 1e-6.
	Tolerance float64 `json:"tolerance,omitempty" jsonschema:"exclusiveMinimum=0,maximum=0.1"`
	// MaxIterations bounds the solves per case; default 50. A case still
	// changing after them fails with a no-solution error.
	MaxIterations int `json:"max_iterations,omitempty" jsonschema:"minimum=1,maximum=1000"`
}

// CaseIteration reports how one case was iterated: by the active set of
// one-sided members (tension-only, compression-only, cables), by second
// order, or both in one loop.
type CaseIteration struct {
	// Iterations is the number of solves made for the case.
	Iterations int `json:"iterations"`
	// Factorisations counts the numeric factorisations of the stiffness
	// matrix for the case, all on one symbolic analysis.
	Factorisations int `json:"factorisations"`
	// LowRankSolves counts the solves made instead on the last
	// factorisation updated by the few members that switched (rank-one
	// terms, the Sherman–Morrison–Woodbury identity); iterations is
	// factorisations plus low_rank_solves.
	LowRankSolves int `json:"low_rank_solves"`
	// SlackMembers lists the ids of the one-sided members out of the
	// structure at the end (tension-only members the loads would
	// compress, compression-only members they would stretch); their
	// axial forces are 0.
	SlackMembers []string `json:"slack_members"`
	// Amplification (second order only) is the largest nodal
	// translation over that of the first, first-order solve (which has
	// the geometric stiffness of the pretension alone); absent when that
	// solve moved nothing or without second order.
	Amplification *float64 `json:"amplification,omitempty"`
	// CriticalFactorBound (second order only) bounds from above the
	// elastic critical load factor on the case's axial forces (Rayleigh's
	// quotient of the second-order part of the displacements): the true
	// factor is at most this, and modes gives it. Absent when the
	// displacements do not engage the compression.
	CriticalFactorBound *float64 `json:"critical_factor_bound,omitempty"`
}
