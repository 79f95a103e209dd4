package render

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"gusset/engine/model"
)

// crowdedMembers is the member count above which a member's axial force is
// written only right beside its member, inside the panel and clear of
// every label, arrowhead and line; up to it a label may also stand
// further off with a leader, or lie over a line on its white halo. Either
// way a label never overlaps another label or an arrowhead: a member
// whose force finds no place is left unlabelled and the caption says so.
const crowdedMembers = 40

// memberLabelTries bounds the members tried, largest force first. Each
// try compares the label's candidate boxes with every label and line
// drawn, so the bound keeps a picture of thousands of members quick.
const memberLabelTries = 200

// stepsBeside are the label positions right beside a member: on the
// member's upper or left side, over its middle, or either side of that.
var stepsBeside = [][2]float64{{0, 0}, {0, -1}, {0, 1}, {0.6, 0}, {-0.6, 0}}

// labelMemberForces writes the axial force of each member beside its
// drawn line (ends gives the line's ends in picture coordinates), near the
// side above or left of the member, largest force first, inside the
// panel f, and returns how many it wrote.
func (c *canvas) labelMemberForces(f frame, axial []float64, ends func(e int) (x1, y1, x2, y2 float64)) int {
	n := len(axial)
	at := func(e int) (x, y float64) {
		x1, y1, x2, y2 := ends(e)
		l := math.Max(math.Hypot(x2-x1, y2-y1), 1e-9)
		nx, ny := -(y2-y1)/l, (x2-x1)/l
		if ny > 0 { // keep the number above or left of the member
			nx, ny = -nx, -ny
		}
		return (x1+x2)/2 + 9*nx, (y1+y2)/2 + 9*ny + 4
	}
	order := make([]int, n)
	for e := range order {
		order[e] = e
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(math.Abs(axial[b]), math.Abs(axial[a])) })
	p := placement{steps: stepsBeside, bounded: true, within: rect{f.left, f.top, f.left + f.width, f.top + f.height}}
	if n <= crowdedMembers {
		p.steps, p.rings, p.overLines = stepsVertical, true, true
	}
	written := 0
	for _, e := range order[:min(n, memberLabelTries)] {
		x, y := at(e)
		if c.labelIfClear(x, y, fmt.Sprintf("%.3g", axial[e]), "small label", "middle", p) {
			written++
		}
	}
	return written
}

// withLabelNote appends to a caption's notes the sentence for a picture
// of m that wrote the forces of only written of its members; notes as
// they are when it wrote them all or none was asked for.
func withLabelNote(notes []string, written int, m *model.Model) []string {
	if written >= len(m.Members) {
		return notes
	}
	return append(notes, fmt.Sprintf("Forces (%s) written where they fit: %d of %d members, largest first; axial_forces lists all.",
		unitOr(m.Units.Force, "kN"), written, len(m.Members)))
}
