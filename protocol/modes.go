package protocol

// MethodModes is the method name of linear buckling and natural
// frequencies.
const MethodModes = "modes"

// ModesParams are the params of modes: the linear buckling load factors of
// a load case, (K + λ·K_G)·φ = 0, or the natural frequencies of the
// structure, (K − ω²·M)·φ = 0, with their mode shapes, by shift-invert
// Lanczos on the sparse Cholesky factorisation.
type ModesParams struct {
	// Model is the structure. Vibration needs mass: the materials'
	// mass_density and/or the nodes' mass.
	Model Model `json:"model"`
	// Kind is "buckling" or "vibration".
	Kind string `json:"kind" jsonschema:"enum=buckling,enum=vibration"`
	// Case is the load case or combination whose axial forces make the
	// geometric stiffness (buckling); default the first case, or the
	// first combination when there are no cases. Not used by vibration.
	Case string `json:"case,omitempty"`
	// Count is the number of modes wanted; default 6.
	Count int `json:"count,omitempty" jsonschema:"minimum=1,maximum=200"`
	// Shift is where the modes are sought: the modes nearest it are
	// found. For buckling a load factor (default 0: the smallest factors
	// of either sign); for vibration a frequency in Hz (default 0: the
	// lowest). It must lie below the first critical factor or frequency
	// above it.
	Shift *float64 `json:"shift,omitempty"`
	// Picture asks for an SVG drawing of the first mode over the
	// undeformed form in the result.
	Picture bool `json:"picture,omitempty"`
}

// ModesResult is the result of modes.
type ModesResult struct {
	// Kind is "buckling" or "vibration".
	Kind string `json:"kind"`
	// Case is the load case or combination analysed (buckling).
	Case string `json:"case,omitempty"`
	// Modes holds the modes nearest the shift, nearest first.
	Modes []ModeResult `json:"modes"`
	// CriticalFactor is the least positive load factor among the modes
	// (buckling); absent when none of them is positive, which a warning
	// then says.
	CriticalFactor *float64 `json:"critical_factor,omitempty"`
	// FirstFrequency is the lowest nonzero natural frequency among the
	// modes, in Hz (vibration).
	FirstFrequency *float64 `json:"first_frequency,omitempty"`
	// TotalMass holds per direction (x, y, (z)) the mass that moves with
	// the free freedoms, which the effective masses of all modes sum to
	// (vibration), in the mass unit of the model's units (force·s²/length).
	TotalMass []float64 `json:"total_mass,omitempty"`
	// Warnings locate what the analysis does not cover.
	Warnings []Problem `json:"warnings"`
	// Stats sizes the work.
	Stats ModesStats `json:"stats"`
	// Picture is an SVG drawing of the first mode (only when asked for).
	Picture string `json:"picture,omitempty"`
	// Caution: linear results for preliminary design.
	Caution string `json:"caution"`
}

// ModeResult is one mode. Per-node arrays are aligned with the model's
// nodes.
type ModeResult struct {
	// Number counts the modes from 1, nearest the shift first.
	Number int `json:"number"`
	// Factor is the critical load factor λ (buckling): the case's loads
	// times λ reach bifurcation. Negative when the loads must reverse.
	Factor *float64 `json:"factor,omitempty"`
	// LoadReversal marks a negative factor: the structure buckles under
	// the reversed loads.
	LoadReversal bool `json:"load_reversal,omitempty"`
	// Frequency is the natural frequency in Hz, AngularFrequency ω in
	// rad/s (vibration).
	Frequency        *float64 `json:"frequency,omitempty"`
	AngularFrequency *float64 `json:"angular_frequency,omitempty"`
	// Mechanism marks a mode of zero frequency: a rigid-body motion or
	// mechanism the supports leave free.
	Mechanism bool `json:"mechanism,omitempty"`
	// Displacements holds dimension translations per node; buckling
	// shapes have a largest translation of 1, vibration shapes are
	// mass-normalised (φᵀ·M·φ = 1).
	Displacements [][]float64 `json:"displacements"`
	// Rotations holds per node its rotations (one in 2D, three in 3D),
	// empty at a node without rotational freedom.
	Rotations [][]float64 `json:"rotations"`
	// Residual is the mode's backward error ‖K·φ − λ·B·φ‖ / ((‖K‖ +
	// |λ|·‖B‖)·‖φ‖), B being −K_G or M, on the matrices scaled to K's unit
	// diagonal: the relative change of the matrices that makes it exact.
	Residual float64 `json:"residual"`
	// Participation holds per direction the participation factor
	// Γ = φᵀ·M·r (vibration).
	Participation []float64 `json:"participation,omitempty"`
	// EffectiveMass holds per direction the effective modal mass Γ²
	// (vibration).
	EffectiveMass []float64 `json:"effective_mass,omitempty"`
}

// ModesStats sizes the work of modes.
type ModesStats struct {
	// Equations is the number of unconstrained freedoms.
	Equations int `json:"equations"`
	// Iterations counts the Lanczos steps, Solves the solves with the
	// factor, Restarts the thick restarts and fresh starts, and
	// Factorisations those of K − σ·B (buckling's static solve not
	// counted).
	Iterations     int `json:"iterations"`
	Solves         int `json:"solves"`
	Restarts       int `json:"restarts"`
	Factorisations int `json:"factorisations"`
	// Converged reports that every mode met the residual tolerance.
	Converged bool `json:"converged"`
}
