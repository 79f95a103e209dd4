package layout

import (
	"math"

	"gusset/engine/fault"
)

// areaRange bounds the member areas a layout may need, in length²: an
// area is |force|/limit, the linear program's volume terms are area ×
// length and its interior-point steps square them, so areas far outside
// 1e±100 leave the arithmetic of double precision (largest about 1.8e308,
// smallest normal 2.2e−308; IEEE 754-2019 binary64) long before any
// structure does.
const areaRange = 1e100

// checkLimitScale reports a stress limit that, against the largest load
// component, asks for member areas outside [1/areaRange, areaRange]: a
// limit near zero (1e−300) or near overflow, most often a unit mismatch.
// The error points at the limit ("/tension_limit" or "/compression_limit").
func checkLimitScale(p *Problem) error {
	load := 0.0
	for _, c := range p.Cases {
		for _, l := range c.Loads {
			for _, f := range l.Force {
				load = math.Max(load, math.Abs(f))
			}
		}
	}
	if load == 0 {
		return nil
	}
	for _, limit := range []struct {
		name  string
		value float64
	}{{"tension_limit", p.TensionLimit}, {"compression_limit", p.CompressionLimit}} {
		if area := load / limit.value; !(area <= areaRange && area >= 1/areaRange) {
			return fault.At(fault.InvalidModel, "/"+limit.name,
				"%s %g is out of range for loads up to %g: members would need areas of about %.3g (force/limit), outside the 1e-100 to 1e100 the optimisation's arithmetic carries; give the limits and loads in consistent units",
				limit.name, limit.value, load, area)
		}
	}
	return nil
}
