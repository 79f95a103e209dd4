package sweep_test

import (
	"context"
	"fmt"

	"gusset/engine/sweep"
)

// A sweep of (x − 2)² + 1 over five values, refined by Brent's method to
// its minimum 1 at x = 2 (from calculus).
func ExampleRun() {
	values, _ := sweep.Range(0, 4.5, 5)
	eval := func(_ context.Context, x []float64) (map[string]float64, error) {
		return map[string]float64{"f": (x[0]-2)*(x[0]-2) + 1}, nil
	}
	res, err := sweep.Run(context.Background(), sweep.Plan{
		Axes:      []sweep.Axis{{Name: "x", Values: values}},
		Workers:   2,
		Objective: "f",
	}, eval, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range res.Steps {
		fmt.Printf("step %d: x = %.3f, f = %.4f\n", s.Index, s.Values[0], s.Metrics["f"])
	}
	r := res.Refinement
	fmt.Printf("%s from step %d: x = %.6f, f = %.6f, converged %v\n", r.Method, r.StartIndex, r.Values[0], r.Objective, r.Converged)
	// Output:
	// step 0: x = 0.000, f = 5.0000
	// step 1: x = 1.125, f = 1.7656
	// step 2: x = 2.250, f = 1.0625
	// step 3: x = 3.375, f = 2.8906
	// step 4: x = 4.500, f = 7.2500
	// brent from step 2: x = 2.000000, f = 1.000000, converged true
}
