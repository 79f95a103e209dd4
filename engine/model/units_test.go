package model

import (
	"math"
	"testing"
)

// TestStressFromPascals converts steel's modulus (210 GPa, EN 1993-1-1
// §3.2.6) into every unit system the schema allows and compares with the
// conversion factors of NIST Special Publication 811 (2008 edition,
// Appendix B.8: foot 3.048 E−01 m, inch 2.54 E−02 m, pound-force
// 4.448 222 E+00 N, kip 4.448 222 E+03 N; from memory), to the 7 digits
// NIST gives; and checks the handbook figures 210 000 N/mm² (EN 1993-1-1)
// and 30 458 ksi (210 GPa over NIST's 6.894 757 E+03 Pa per psi).
func TestStressFromPascals(t *testing.T) {
	metres := map[string]float64{"m": 1, "cm": 1e-2, "mm": 1e-3, "ft": 3.048e-1, "in": 2.54e-2}
	newtons := map[string]float64{"N": 1, "kN": 1e3, "MN": 1e6, "lbf": 4.448222, "kip": 4.448222e3}
	for length, l := range metres {
		for force, f := range newtons {
			t.Run(force+"/"+length+"²", func(t *testing.T) {
				got, ok := StressFromPascals(UnitsSpec{Length: length, Force: force}, SteelElasticModulus)
				want := 210e9 * l * l / f
				if !ok || math.Abs(got-want) > 1e-6*want {
					t.Errorf("got %g (ok %v), want %g", got, ok, want)
				}
			})
		}
	}
	if got, _ := StressFromPascals(UnitsSpec{Length: "mm", Force: "N"}, SteelElasticModulus); math.Abs(got-210000) > 1e-9 {
		t.Errorf("N/mm²: %g, want 210 000", got)
	}
	if got, _ := StressFromPascals(UnitsSpec{Length: "in", Force: "kip"}, SteelElasticModulus); math.Abs(got-30458) > 1 {
		t.Errorf("ksi: %g, want 30 458", got)
	}
	if got, _ := StressFromPascals(UnitsSpec{}, SteelElasticModulus); got != 2.1e8 {
		t.Errorf("default units (kN, m): %g, want 2.1e8 kN/m²", got)
	}
	if _, ok := StressFromPascals(UnitsSpec{Length: "yd"}, 1); ok {
		t.Error("an unknown unit is accepted")
	}
}
