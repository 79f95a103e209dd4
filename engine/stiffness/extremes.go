package stiffness

import "math"

// MeanAxialForce returns per member the mean (N₁ + N₂)/2 of the axial
// force at its two ends, tension positive: the force that balances the
// loads as carried to the nodes. A bar's own weight has a component along
// an inclined bar, so its axial force varies along it and the end values
// differ by that component; the elastic force EA·δ/L between the nodes is
// their mean. For members without loads along them N₁ = N₂ = AxialForce.
// The end values are read from EndForces (end 1's first entry is −N₁, end
// 2's first entry is N₂, in every member layout).
func (c *CaseResult) MeanAxialForce() []float64 {
	axial := make([]float64, len(c.AxialForce))
	for e, n := range c.AxialForce {
		p := c.EndForces[e]
		axial[e] = n
		if half := len(p) / 2; half > 0 {
			axial[e] = (-p[0] + p[half]) / 2
		}
	}
	return axial
}

// MaxNodeDisplacement returns the largest translation's length over the
// nodes (length units) and the first node where it occurs; node is −1 for
// a case without nodes. MaxDisplacement also looks inside the members.
func (c *CaseResult) MaxNodeDisplacement() (value float64, node int) {
	node = -1
	for j, d := range c.Displacements {
		var sum float64
		for _, x := range d {
			sum += x * x
		}
		if n := math.Sqrt(sum); n > value || j == 0 {
			value, node = n, j
		}
	}
	return value, node
}

// MaxUtilisation returns the largest utilisation over the members that
// were checked and the first member where it occurs; with no member
// checked it returns −1, −1 (never 0: an unchecked member is not an
// unused one).
func (c *CaseResult) MaxUtilisation() (value float64, member int) {
	value, member = -1, -1
	for e, u := range c.Utilisation {
		if u >= 0 && (u > value || member < 0) {
			value, member = u, e
		}
	}
	return value, member
}
