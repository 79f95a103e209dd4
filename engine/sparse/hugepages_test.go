package sparse

import (
	"context"
	"math"
	"testing"
)

// TestHugePageFactor factorises a plane grid whose factor (about 1.1
// million entries, 9 MB) is large enough to be advised to use huge pages,
// and checks the solution by its scaled residual ‖A·x − b‖/(‖A‖‖x‖ε), as
// TestStiffnessResidual does for small factors, and the advice on an array
// already written, which must keep its values.
func TestHugePageFactor(t *testing.T) {
	a := gridTruss2D(90, 90, 4)
	c, err := Factorize(context.Background(), a, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if size := len(c.val) * 8; size < hugePageMin {
		t.Fatalf("factor of %d bytes, want at least %d to reach the advice", size, hugePageMin)
	}
	b := randomVec(a.N, 5)
	x := nanVec(a.N)
	c.Solve(x, b)
	if r := scaledResidual(a, x, b); r > float64(3*a.N+1) || math.IsNaN(r) {
		t.Errorf("scaled residual %.3g", r)
	}
	v := make([]float64, 2*hugePageMin/8)
	for i := range v {
		v[i] = float64(i)
	}
	adviseHugePages(v)
	for i := range v {
		if v[i] != float64(i) {
			t.Fatalf("v[%d] = %g after the advice, want %d", i, v[i], i)
		}
	}
}
