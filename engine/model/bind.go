package model

import "math"

func sqrt(x float64) float64 { return math.Sqrt(x) }

// binding ties one compiled expression to the number it sets in a Model.
type binding struct {
	path string                                  // JSON pointer of the expression in the model
	eval func(params []float64) (float64, error) // evaluates the compiled expression
	set  func(m *Model, v float64)               // writes the value into the model
}
