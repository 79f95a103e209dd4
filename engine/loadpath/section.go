package loadpath

import (
	"fmt"
	"math"
)

// Shape names of the section families that Coefficient derives c from.
const (
	// ShapeTube is a circular hollow section of outer diameter D and wall
	// thickness t with a fixed ratio D/t ≥ 2 (D/t = 2 is a solid bar).
	ShapeTube = "tube"
	// ShapeSolidRound is a solid circular bar.
	ShapeSolidRound = "solid-round"
	// ShapeSolidSquare is a solid square bar.
	ShapeSolidSquare = "solid-square"
)

// SectionFamily declares the cross-sections that compression members are
// sized from for Euler buckling: geometrically similar sections, whose
// second moment of area grows with the square of the area, I = c·A² (c is
// dimensionless). The zero value declares no family: compression members
// are then sized from the compression limit alone.
//
// Either Shape names a family, from which c is derived, or Shape is empty
// and Coefficient gives c directly.
type SectionFamily struct {
	// Shape is "", ShapeTube, ShapeSolidRound or ShapeSolidSquare.
	Shape string
	// Coefficient is c in I = c·A² when Shape is empty; 0 with an empty
	// Shape means no buckling check. Must be positive when given.
	Coefficient float64
	// DiameterToThickness is D/t for ShapeTube; it must be at least 2.
	DiameterToThickness float64
}

// Declared reports whether the family asks for a buckling check.
func (f SectionFamily) Declared() bool { return f.Shape != "" || f.Coefficient != 0 }

// SectionCoefficient returns c in I = c·A² for the family, and ok = false
// with a reason when the family is malformed (an unknown shape, D/t < 2, a
// non-positive or non-finite coefficient). It returns 0, true for the zero
// value.
//
// The shapes give, with A and I of the whole section:
//
//   - solid round of diameter d: A = πd²/4, I = πd⁴/64, so c = 1/(4π).
//   - solid square of side b: A = b², I = b⁴/12, so c = 1/12.
//   - tube, exact: with d = D − 2t the bore, A = π(D² − d²)/4 and
//     I = π(D⁴ − d⁴)/64, so I/A² = (D² + d²)/(4π(D² − d²)). With r = D/t,
//     D² − d² = 4t(D − t) and D² + d² = 2D² − 4Dt + 4t², which gives
//     c = (r² − 2r + 2)/(8π(r − 1)). At r = 2 this is 1/(4π), the solid
//     bar; for thin walls (r large) it tends to r/(8π), the familiar
//     thin-walled result from A ≈ πDt and I ≈ πD³t/8.
func (f SectionFamily) SectionCoefficient() (c float64, ok bool, reason string) {
	switch f.Shape {
	case "":
		if f.Coefficient == 0 {
			return 0, true, ""
		}
		if !(f.Coefficient > 0) || math.IsInf(f.Coefficient, 1) {
			return 0, false, fmt.Sprintf("section coefficient must be positive and finite, not %g", f.Coefficient)
		}
		return f.Coefficient, true, ""
	case ShapeSolidRound:
		return 1 / (4 * math.Pi), true, ""
	case ShapeSolidSquare:
		return 1.0 / 12, true, ""
	case ShapeTube:
		r := f.DiameterToThickness
		if !(r >= 2) || math.IsInf(r, 1) {
			return 0, false, fmt.Sprintf("a tube's diameter-to-thickness ratio must be at least 2 and finite, not %g", r)
		}
		return (r*r - 2*r + 2) / (8 * math.Pi * (r - 1)), true, ""
	}
	return 0, false, fmt.Sprintf("unknown section shape %q (want %q, %q or %q, or a coefficient)",
		f.Shape, ShapeTube, ShapeSolidRound, ShapeSolidSquare)
}

// BucklingArea returns the least area A of a member of the family with
// coefficient c whose Euler load π²E·c·A²/(kL)² equals the compression
// force magnitude n: A = (kL/π)·sqrt(n/(E·c)). E is the elastic modulus,
// length the member length and k the effective-length factor. It panics
// unless E, c, length and k are positive and n ≥ 0.
func BucklingArea(n, E, c, length, k float64) float64 {
	if !(E > 0 && c > 0 && length > 0 && k > 0 && n >= 0) {
		panic(fmt.Sprintf("loadpath: BucklingArea(%g, %g, %g, %g, %g): bad argument", n, E, c, length, k))
	}
	return k * length / math.Pi * math.Sqrt(n/(E*c))
}
