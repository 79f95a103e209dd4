package protocol

// Pattern generates combinations for pattern loading: the permanent cases
// with their factors in every combination, and each variable case either
// on (factor_on) or off (factor_off). The generated combinations join the
// model's combinations (after the given ones) with the ids
// "<id>/on:<case>+<case>…" (the variable cases on, in the order listed)
// and "<id>/all-off"; solve reports and envelopes them like any other.
type Pattern struct {
	// ID names the pattern; its generated ids must not clash with a case
	// or combination.
	ID string `json:"id" jsonschema:"minLength=1"`
	// Permanent maps load-case ids to the factor they carry in every
	// generated combination.
	Permanent map[string]float64 `json:"permanent,omitempty"`
	// Variable lists the load cases switched on and off: at most 10 with
	// mode "all" (1024 combinations); at most 4096 generated combinations
	// in a model.
	Variable []PatternVariable `json:"variable" jsonschema:"minItems=1"`
	// Mode is "all" (every on/off pattern of the variable cases, 2ⁿ
	// combinations, the all-off one included; the default) or "each"
	// (each variable case on alone, n combinations).
	Mode string `json:"mode,omitempty" jsonschema:"enum=all,enum=each"`
}

// PatternVariable is one variable case of a pattern.
type PatternVariable struct {
	// Case is the load case's id.
	Case string `json:"case"`
	// FactorOn is its factor when on; default 1.
	FactorOn *float64 `json:"factor_on,omitempty"`
	// FactorOff is its factor when off; default 0.
	FactorOff *float64 `json:"factor_off,omitempty"`
}
