package adapter

// memberEnds returns a wire member's two node ids. The decoder has checked
// that there are exactly two (schema.CheckBounds, maxItems and minItems of
// Member.ends); a missing one is the empty id, which the model compiler
// reports as a node that does not exist.
func memberEnds(ends []string) [2]string {
	var pair [2]string
	copy(pair[:], ends)
	return pair
}
