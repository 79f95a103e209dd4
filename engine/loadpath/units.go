package loadpath

import "gusset/engine/model"

// StandardGravity is g₀ in m/s², the conventional value fixed by the 3rd
// CGPM (1901); the weight of one kilogram is g₀ newtons.
const StandardGravity = 9.80665

// newtonsPer gives one force unit in newtons. The pound-force is exactly
// 0.45359237 kg × g₀ (international pound, 1959) and the kip is 1000 lbf.
var newtonsPer = map[string]float64{
	"N":   1,
	"kN":  1e3,
	"MN":  1e6,
	"lbf": 0.45359237 * StandardGravity,
	"kip": 1e3 * 0.45359237 * StandardGravity,
}

var lengthUnits = map[string]bool{"m": true, "cm": true, "mm": true, "ft": true, "in": true}

// KilogramsPerForceUnit returns the mass in kilograms whose weight under
// standard gravity is one force unit of the model (an empty unit means kN),
// and ok = false for an unknown unit. A member's mass is then its weight
// density × area × length × KilogramsPerForceUnit: the length unit cancels
// because weight density is force/length³.
func KilogramsPerForceUnit(units model.UnitsSpec) (kg float64, ok bool) {
	f := units.Force
	if f == "" {
		f = "kN"
	}
	n, ok := newtonsPer[f]
	if !ok {
		return 0, false
	}
	return n / StandardGravity, true
}
