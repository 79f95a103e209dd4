package protocol

// LoadPathResult is the result of load-path. Load paths and M are in
// force × length, areas in length², volumes in length³, mass in kg and
// carbon in kg CO2e.
type LoadPathResult struct {
	// Cases holds Maxwell's load-path quantities per case or combination.
	Cases []LoadPathCase `json:"cases"`
	// Members holds per-member arrays aligned with model.members.
	Members MemberQuantities `json:"members"`
	// Totals are summed over the members, split by the sign of each
	// member's governing force.
	Totals QuantityTotals `json:"totals"`
	// Sized is true when sizing was asked for.
	Sized bool `json:"sized"`
	// Warnings say what the load path leaves out: for members in bending,
	// the share of the strain energy held in bending and torsion, and the
	// largest bending utilisation.
	Warnings []string `json:"warnings,omitempty"`
	// Caution: results are for preliminary design.
	Caution string `json:"caution"`
}

// LoadPathCase holds Maxwell's load-path quantities of one case. Tension
// is positive, and Maxwell's theorem reads Z_T − Z_C = M.
type LoadPathCase struct {
	// ID is the case's or combination's id.
	ID string `json:"id"`
	// LoadPath is Z = Σ|N|·L over all members.
	LoadPath float64 `json:"load_path"`
	// TensionLoadPath is Z_T = Σ N·L over members in tension.
	TensionLoadPath float64 `json:"tension_load_path"`
	// CompressionLoadPath is Z_C = Σ |N|·L over members in compression
	// (positive), so Z = Z_T + Z_C.
	CompressionLoadPath float64 `json:"compression_load_path"`
	// Constant is the load-path constant M = Σ F·r over the loads and
	// reactions (F the external force at a node, r its position); it does
	// not depend on the origin when the forces balance.
	Constant float64 `json:"constant"`
	// Residual is Z_T − Z_C − M: zero up to round-off when the forces are
	// in equilibrium (Maxwell 1870).
	Residual float64 `json:"residual"`
	// RelativeResidual is |residual| over the sum of the magnitudes of the
	// identity's terms.
	RelativeResidual float64 `json:"relative_residual"`
	// Resultant is ΣF over loads and reactions (zero in equilibrium).
	Resultant []float64 `json:"resultant"`
	// StressVolume is Σ|N|·L/σ for this case alone, σ the tension or
	// compression limit by the sign of N (no buckling); 0 unless sized.
	StressVolume float64 `json:"stress_volume"`
	// TheoremVolume is the same volume from the tension members and M
	// alone, Z_T/σ_t + (Z_T − M)/σ_c, when every member shares one pair
	// of limits; null otherwise.
	TheoremVolume *float64 `json:"theorem_volume"`
}

// MemberQuantities are per-member arrays aligned with model.members.
type MemberQuantities struct {
	// Length is each member's length.
	Length []float64 `json:"length"`
	// Force is each member's axial force in its governing case.
	Force []float64 `json:"force"`
	// GoverningCase is the id of the case that governs each member.
	GoverningCase []string `json:"governing_case"`
	// Area is the area each member needs (empty unless sized).
	Area []float64 `json:"area"`
	// Volume is area × length (empty unless sized).
	Volume []float64 `json:"volume"`
	// Mass is each member's mass in kg (empty unless sized).
	Mass []float64 `json:"mass"`
	// Criterion says what fixed each area: unloaded, tension,
	// compression, buckling or minimum (empty unless sized).
	Criterion []string `json:"criterion"`
}

// QuantityTotals are summed quantities, split by tension and compression.
type QuantityTotals struct {
	// Tension sums the members whose governing force is tension.
	Tension Quantity `json:"tension"`
	// Compression sums the members whose governing force is compression.
	Compression Quantity `json:"compression"`
	// All sums every member.
	All Quantity `json:"all"`
	// PerFloorArea is All divided by the floor area, when given.
	PerFloorArea *Quantity `json:"per_floor_area,omitempty"`
	// CarbonMissing lists materials without a carbon factor, whose carbon
	// is not counted.
	CarbonMissing []string `json:"carbon_missing"`
}

// Quantity is a set of summed quantities.
type Quantity struct {
	// LoadPath is Σ|N|·L with each member's governing force.
	LoadPath float64 `json:"load_path"`
	// Volume is in length³.
	Volume float64 `json:"volume"`
	// Mass is in kg.
	Mass float64 `json:"mass"`
	// Carbon is in kg CO2e.
	Carbon float64 `json:"carbon"`
}
