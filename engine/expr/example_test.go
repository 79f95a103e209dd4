package expr_test

import (
	"fmt"

	"gusset/engine/expr"
)

// ExampleCompile evaluates the length of a rafter over half an 8 m span
// and 3 m deep: √(4² + 3²) = 5 (a 3-4-5 triangle, common practice).
func ExampleCompile() {
	params := []string{"span", "depth"}
	p, err := expr.Compile("sqrt((span/2)^2 + depth^2)", params)
	if err != nil {
		fmt.Println(err)
		return
	}
	length, err := p.Eval([]float64{8, 3})
	fmt.Println(length, err, p.Uses())

	_, err = expr.Compile("2*dpeth", params)
	fmt.Println(err)
	// Output:
	// 5 <nil> [0 1]
	// unknown parameter "dpeth" (did you mean "depth"?); parameters are: depth, span
}
