package protocol

// MethodTypes lists the params and result types of the engine methods, for
// the schema generator.
func MethodTypes() []any {
	return []any{
		SolveParams{}, SolveResult{}, Mechanism{},
		ReciprocateParams{}, ReciprocateResult{}, LoadPathParams{}, LoadPathResult{}, SweepParams{}, SweepResult{}, LayoutParams{}, LayoutResult{},
	}
}
