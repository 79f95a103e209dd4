package expr_test

import (
	"fmt"

	"gusset/engine/expr"
)

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
