package render

import (
	"math"

	"gusset/engine/model"
)

// hingeRadius is the radius in pixels of the open circle that marks a
// released member end.
const hingeRadius = 4.0

// hingeNote is the caption's sentence on the hinge marks.
const hingeNote = "Open circles mark released member ends (hinges): no bending moment there about the released axis."

// hingeMark draws the open circle that marks a released member end (an
// open circle at a hinge: common practice in structural drawings), for
// the end drawn at (x, y) of a member whose other end is drawn at
// (ox, oy). The circle sits on the member just inside the node, so that
// at a joint the released member's own end is marked and not the others',
// and its box is remembered so that labels keep clear of it.
func (c *canvas) hingeMark(x, y, ox, oy float64) {
	cx, cy := x, y
	if d := math.Hypot(ox-x, oy-y); d > 0 {
		in := math.Min(hingeRadius+1, d/2) / d
		cx, cy = x+in*(ox-x), y+in*(oy-y)
	}
	c.printf(`<circle cx="%s" cy="%s" r="%s" class="hinge"/>`+"\n", num(cx), num(cy), num(hingeRadius))
	c.marks = append(c.marks, rect{cx - hingeRadius, cy - hingeRadius, cx + hingeRadius, cy + hingeRadius})
}

// releasedEnds lists the ends of m's beams released about rotation
// component c (model.RX, RY or RZ) as member index and side (0 for the
// first end, 1 for the second).
func releasedEnds(m *model.Model, c int) [][2]int {
	var ends [][2]int
	for e := range m.Members {
		mem := &m.Members[e]
		if mem.Kind != model.Beam || !mem.HasReleases() {
			continue
		}
		for side := range 2 {
			if mem.Released(side, c) {
				ends = append(ends, [2]int{e, side})
			}
		}
	}
	return ends
}
