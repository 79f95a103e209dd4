package model

// SteelElasticModulus is the elastic modulus of structural steel in
// pascals (N/m²): E = 210 000 N/mm², EN 1993-1-1 §3.2.6(1).
const SteelElasticModulus = 210e9

// metresPer gives one length unit in metres and newtonsPer one force unit
// in newtons: the international foot is 0.3048 m and the inch 0.0254 m
// exactly, and the pound-force is 0.45359237 kg × 9.80665 m/s² exactly
// (the international pound of 1959 under standard gravity, 3rd CGPM 1901);
// the kip is 1000 lbf.
var (
	metresPer  = map[string]float64{"m": 1, "cm": 0.01, "mm": 0.001, "ft": 0.3048, "in": 0.0254}
	newtonsPer = map[string]float64{"N": 1, "kN": 1e3, "MN": 1e6,
		"lbf": 0.45359237 * 9.80665, "kip": 1e3 * 0.45359237 * 9.80665}
)

// StressFromPascals returns a stress (or modulus) given in pascals in the
// force/length² of units, whose empty fields mean m and kN (the model's
// defaults); ok is false for a unit that is not one of m, cm, mm, ft, in
// and N, kN, MN, lbf, kip. A default that carries units, such as
// SteelElasticModulus, follows the request's units through it.
func StressFromPascals(units UnitsSpec, pascals float64) (stress float64, ok bool) {
	length, force := units.Length, units.Force
	if length == "" {
		length = "m"
	}
	if force == "" {
		force = "kN"
	}
	l, okL := metresPer[length]
	f, okF := newtonsPer[force]
	if !okL || !okF {
		return 0, false
	}
	return pascals * l * l / f, true
}
