package modes

import (
	"context"
	"math"
	"reflect"
	"testing"

	"gusset/engine/stiffness"
)

// TestBucklingWithAnalysis: a pinned column of 80 elements (240 freedoms,
// above the dense limit, so the sparse order is shared) buckles at Euler's
// π²EI/L² (Timoshenko and Gere, "Theory of Elastic Stability", 1961, §2.1;
// from memory) whether or not a sweep's stiffness.Analysis is passed in,
// and the two results are the same bit for bit (the analysis only saves
// ordering again). At several lengths, one Analysis serves them all, as
// in a sweep: the topology is kept, the geometry changes.
func TestBucklingWithAnalysis(t *testing.T) {
	an := stiffness.NewAnalysis(column("pinned", 5, 80), stiffness.Options{})
	for _, L := range []float64{5, 6.5} {
		m := column("pinned", L, 80)
		want, err := Buckling(context.Background(), m, Options{Count: 3})
		if err != nil {
			t.Fatal(err)
		}
		got, err := Buckling(context.Background(), m, Options{Count: 3, Analysis: an})
		if err != nil {
			t.Fatal(err)
		}
		got.Stats, want.Stats = Stats{}, Stats{} // timings
		if !reflect.DeepEqual(got, want) {
			t.Errorf("L=%g: results with a shared analysis differ", L)
		}
		euler := math.Pi * math.Pi * testE * testI / (L * L)
		if rel := (got.Critical - euler) / euler; rel < -1e-12 || rel > 1e-6 {
			t.Errorf("L=%g: critical factor %.10g, Euler %.10g (relative %.3g)", L, got.Critical, euler, rel)
		}
	}
}

// TestVibrationWithAnalysis: the frequencies with a shared analysis are
// those without it, bit for bit.
func TestVibrationWithAnalysis(t *testing.T) {
	m := frame2D(6, 8)
	want, err := Vibration(context.Background(), m, Options{Count: 4})
	if err != nil {
		t.Fatal(err)
	}
	got, err := Vibration(context.Background(), m, Options{Count: 4, Analysis: stiffness.NewAnalysis(m, stiffness.Options{})})
	if err != nil {
		t.Fatal(err)
	}
	got.Stats, want.Stats = Stats{}, Stats{}
	if !reflect.DeepEqual(got, want) {
		t.Error("results with a shared analysis differ")
	}
}
