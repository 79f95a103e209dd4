package protocol

// The method names on the wire. The adapter's method table
// (cmd/gusset/adapter/table.go) pairs each with its params and result types
// and its handler; describe, the schema's definitions and dispatch are all
// derived from that table.
const (
	MethodDescribe       = "describe"
	MethodCancel         = "cancel"
	MethodSolve          = "solve"
	MethodReciprocate    = "reciprocate"
	MethodLoadPath       = "load-path"
	MethodSweepParameter = "sweep-parameter"
	MethodOptimiseLayout = "optimise-layout"
	MethodFindForm       = "find-form"
)
