package adapter

import "gusset/engine/stiffness"

// axialParts returns, for the wire's axial_utilisation, each member's
// axial check alone (nil where it was not made) when some member's
// utilisation is unknown although its axial check was made (a bar loaded
// across its length, a beam whose bending could not be checked); nil
// otherwise, so that a case whose checks were all made, or none, carries
// no second array.
func axialParts(c *stiffness.CaseResult) []*float64 {
	if c.MemberCount() != len(c.Utilisation) {
		return nil
	}
	partial := false
	var scratch stiffness.MemberResult
	for e, u := range c.Utilisation {
		if u < 0 && c.Member(e, &scratch).AxialUtilisation >= 0 {
			partial = true
			break
		}
	}
	if !partial {
		return nil
	}
	out := make([]*float64, c.MemberCount())
	for e := range c.MemberCount() {
		if a := c.Member(e, &scratch).AxialUtilisation; a >= 0 {
			out[e] = &a
		}
	}
	return out
}
