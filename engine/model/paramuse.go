package model

// ParamUsed reports whether some expression of the model reads parameter
// i (an index into ParamNames): a parameter that none reads changes
// nothing when it varies, so sweeping it is pointless.
func (m *Model) ParamUsed(i int) bool {
	return i >= 0 && i < len(m.paramUsed) && m.paramUsed[i]
}

// markUsed records the parameters an expression reads.
func (c *compiler) markUsed(uses []int) {
	if c.m.paramUsed == nil {
		c.m.paramUsed = make([]bool, len(c.m.ParamNames))
	}
	for _, i := range uses {
		c.m.paramUsed[i] = true
	}
}
