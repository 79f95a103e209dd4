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

// torsionNote is the caption's sentence on the marks of ends released in
// torsion only (3D).
const torsionNote = "Open diamonds mark member ends released in torsion only: no torque there, while bending carries on through the joint."

// hingeMark draws the open circle that marks a released member end (an
// open circle at a hinge: common practice in structural drawings), for
// the end drawn at (x, y) of a member whose other end is drawn at
// (ox, oy). The circle sits on the member just inside the node, so that
// at a joint the released member's own end is marked and not the others',
// and its box is remembered so that labels keep clear of it.
func (c *canvas) hingeMark(x, y, ox, oy float64) {
	cx, cy := markCentre(x, y, ox, oy)
	c.printf(`<circle cx="%s" cy="%s" r="%s" class="hinge"/>`+"\n", num(cx), num(cy), num(hingeRadius))
	c.marks = append(c.marks, rect{cx - hingeRadius, cy - hingeRadius, cx + hingeRadius, cy + hingeRadius})
}

// torsionMark draws the open diamond (a square standing on a corner, our
// own mark) that marks a member end released in torsion only, placed as
// hingeMark places its circle: on the member, just inside the node at
// (x, y), towards (ox, oy). Its box is remembered so that labels keep
// clear of it.
func (c *canvas) torsionMark(x, y, ox, oy float64) {
	cx, cy := markCentre(x, y, ox, oy)
	r := hingeRadius
	c.printf(`<polygon points="%s,%s %s,%s %s,%s %s,%s" class="torsion-release"/>`+"\n",
		num(cx), num(cy-r), num(cx+r), num(cy), num(cx), num(cy+r), num(cx-r), num(cy))
	c.marks = append(c.marks, rect{cx - r, cy - r, cx + r, cy + r})
}

// markCentre is where a release mark for the end drawn at (x, y) of a
// member whose other end (or next drawn point) is at (ox, oy) goes: on the
// member, a mark's radius and a pixel inside the end (at most half way).
func markCentre(x, y, ox, oy float64) (cx, cy float64) {
	cx, cy = x, y
	if d := math.Hypot(ox-x, oy-y); d > 0 {
		in := math.Min(hingeRadius+1, d/2) / d
		cx, cy = x+in*(ox-x), y+in*(oy-y)
	}
	return cx, cy
}

// releaseNotes returns notes, followed by the sentence on hinge marks
// when any are drawn and on torsion marks when any are.
func releaseNotes(hinges, torsion bool, notes ...string) []string {
	if hinges {
		notes = append(notes, hingeNote)
	}
	if torsion {
		notes = append(notes, torsionNote)
	}
	return notes
}

// bendingReleasedEnds lists the ends of m's beams released in bending
// about local y or z, each once, in member order.
func bendingReleasedEnds(m *model.Model) [][2]int {
	return endsWhere(m, func(mem *model.Member, side int) bool {
		return mem.Released(side, model.RY) || mem.Released(side, model.RZ)
	})
}

// torsionReleasedEnds lists the ends of m's beams released in torsion and
// in nothing else (an end released in bending too is marked as a hinge).
func torsionReleasedEnds(m *model.Model) [][2]int {
	return endsWhere(m, func(mem *model.Member, side int) bool {
		return mem.Releases[side] == model.ReleaseBit(model.RX)
	})
}

// releasedEnds lists the ends of m's beams released about rotation
// component c (model.RX, RY or RZ) as member index and side (0 for the
// first end, 1 for the second).
func releasedEnds(m *model.Model, c int) [][2]int {
	return endsWhere(m, func(mem *model.Member, side int) bool { return mem.Released(side, c) })
}

// endsWhere lists the ends (member index, side) of m's beams with
// releases for which released holds.
func endsWhere(m *model.Model, released func(mem *model.Member, side int) bool) [][2]int {
	var ends [][2]int
	for e := range m.Members {
		mem := &m.Members[e]
		if mem.Kind != model.Beam || !mem.HasReleases() {
			continue
		}
		for side := range 2 {
			if released(mem, side) {
				ends = append(ends, [2]int{e, side})
			}
		}
	}
	return ends
}
