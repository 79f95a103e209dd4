package modes

import (
	"context"
	"math"
	"testing"

	"gusset/engine/model"
)

// TestReleasedColumn checks buckling with end releases: a column fixed
// at both ends (the top guided) whose end elements are released in rz at
// the supports buckles as a pinned column, at Euler's π²EI/L² rather than
// the fixed column's 4π²EI/L² (S. P. Timoshenko and J. M. Gere, "Theory
// of Elastic Stability", 2nd ed., 1961, §2.1–2.5; from memory). The
// released elements' geometric stiffness is reduced with their static
// shape, as their stiffness is condensed.
func TestReleasedColumn(t *testing.T) {
	const L, elements = 5.0, 16
	m := column("fixed-fixed", L, elements)
	m.Members[0].Releases[0] = model.ReleaseBit(model.RZ)
	m.Members[elements-1].Releases[1] = model.ReleaseBit(model.RZ)
	res, err := Buckling(context.Background(), m, Options{Count: 2})
	if err != nil {
		t.Fatal(err)
	}
	euler := math.Pi * math.Pi * testE * testI / (L * L)
	if rel := (res.Critical - euler) / euler; !res.HasCritical || rel < -1e-12 || rel > 1e-4 {
		t.Errorf("critical %g, Euler's pinned column %g (%.2g relative)", res.Critical, euler, rel)
	}
}

// TestReleasedBeamFrequencies checks vibration with end releases: a beam
// on supports that fix its rotations too, released in rz at both ends,
// vibrates as the simply supported beam, ω = (βL)²·√(EI/(ρA·L⁴)) with βL =
// π and 2π (R. D. Blevins, "Formulas for Natural Frequency and Mode
// Shape", 1979, Table 8-1; from memory), where without the releases it
// would be the clamped beam's 4.730. The released elements' consistent
// mass is reduced with their static shape, as their stiffness is
// condensed.
func TestReleasedBeamFrequencies(t *testing.T) {
	const L, elements = 10.0, 16
	b := newTestModel(2)
	nodes := b.line([]float64{0, 0}, []float64{L, 0}, elements, model.Beam)
	b.fix(nodes[0], model.X, model.Y, model.RZ)
	b.fix(nodes[elements], model.Y, model.RZ)
	b.m.Members[0].Releases[0] = model.ReleaseBit(model.RZ)
	b.m.Members[elements-1].Releases[1] = model.ReleaseBit(model.RZ)
	res, err := Vibration(context.Background(), b.m, Options{Count: 2})
	if err != nil {
		t.Fatal(err)
	}
	scale := math.Sqrt(testE * testI / (testRho * testA * L * L * L * L))
	for k, bl := range []float64{math.Pi, 2 * math.Pi} {
		want := bl * bl * scale
		if rel := (res.Modes[k].Angular - want) / want; rel < -1e-12 || rel > 1e-4 {
			t.Errorf("mode %d: ω = %.8g rad/s, Blevins %.8g (%.2g relative)", k+1, res.Modes[k].Angular, want, rel)
		}
	}
}
