package render

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"gusset/engine/model"
	"gusset/engine/reciprocal"
)

// FormAndForce writes an SVG picture of a form diagram and its reciprocal
// force diagram side by side, both labelled in Bow's notation: the letters
// of the spaces and the numbers of the inner faces sit in the form's faces
// and at the matching points of the force diagram. Members and their
// segments are styled by sense in the style of style.go (tension a
// continuous indigo line, compression a dash-dot amber line, zero a dotted
// grey line; the form uses the given sign, the force diagram the sense read
// from it); external forces are teal arrows in the form and the load line,
// with arrowheads, in the force diagram. Each diagram has a
// scale bar (model length unit, model force unit), and the caption carries
// the legend, the closure error and the caution. m must be the model d was
// built from. It returns the first write error.
func FormAndForce(w io.Writer, m *model.Model, d *reciprocal.Diagram, opt Options) error {
	if len(d.Members) != len(m.Members) {
		panic("render: diagram and model do not match")
	}
	axial := make([]float64, len(d.Members))
	for e, s := range d.Members {
		axial[e] = s.Force
	}
	arrows := make([]arrow, len(d.Forces))
	for k, f := range d.Forces {
		arrows[k] = arrow{node: f.Node, force: f.Vector, dir: f.Direction}
	}
	labels := make([]faceLabel, len(d.Spaces))
	for k, sp := range d.Spaces {
		labels[k] = faceLabel{at: sp.Anchor, text: sp.Label, outer: sp.Outer}
	}
	form := newFormScene(m, axial, d.Tolerance, arrows, labels)

	force := emptyBox()
	for _, p := range d.Points {
		force.add(p)
	}
	width := opt.Width
	if width <= 0 {
		width = 1100
	}
	gap := 30.0
	pw := (width - 2*20 - gap) / 2
	ph := math.Max(panelHeight(pw, form.content), panelHeight(pw, force))
	top := 40.0
	height := top + ph + 190
	c := newCanvas(w, width, height)
	c.text(20, 26, "Form diagram", "title", "start")
	c.text(20+pw+gap, 26, "Force diagram (reciprocal)", "title", "start")
	for _, x := range []float64{20, 20 + pw + gap} {
		c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(x), num(top), num(pw), num(ph))
	}
	ff := fit(20, top, pw, ph, 42, form.content.minX, form.content.minY, form.content.maxX, form.content.maxY)
	written := form.draw(c, ff, opt.ForceLabels)
	c.scaleBar(ff, unitOr(m.Units.Length, "m"))

	fd := fit(20+pw+gap, top, pw, ph, 42, force.minX, force.minY, force.maxX, force.maxY)
	drawForce(c, fd, d)
	c.scaleBar(fd, unitOr(m.Units.Force, "kN"))

	y := c.legend(20, top+ph+24, unitOr(m.Units.Force, "kN"), unitOr(m.Units.Length, "m"), true)
	title := opt.Title
	if title == "" {
		title = "Reciprocal diagrams in Bow's notation"
	}
	orient := "parallel to"
	if d.Perpendicular {
		orient = "perpendicular to"
	}
	notes := []string{
		fmt.Sprintf("Each force-diagram segment is %s its member, its length the axial force. Sense read clockwise round each joint, from the space before to the space after.", orient),
		fmt.Sprintf("Largest closure error at a node %.3g %s; largest segment misfit %.3g %s.", d.MaxClosure, unitOr(m.Units.Force, "kN"), d.MaxMisfit, unitOr(m.Units.Force, "kN")),
	}
	notes = withLabelNote(notes, written, m)
	if len(d.Disagreements) > 0 {
		notes = append(notes, fmt.Sprintf("Warning: %d members read from the diagram disagree with the given sign.", len(d.Disagreements)))
	}
	c.caption(20, y+10, title, notes...)
	return c.close()
}

// drawForce draws the force diagram: member segments by sense, the load
// line with arrowheads, and the points labelled with their spaces.
func drawForce(c *canvas, f frame, d *reciprocal.Diagram) {
	drawForceLines(c, f, d)
	groups := pointGroups(d)
	if len(d.Points) > 4000 {
		return // labels would be unreadable
	}
	for _, g := range groups {
		x, y := f.x(g.at[0]), f.y(g.at[1])
		c.circle(x, y, 2.4, inkColour)
		class := "label"
		if g.outer {
			class = "label space"
		}
		c.label(x+6, y-6, strings.Join(g.names, "="), class, "start", stepsAround)
	}
}

// drawForceLines draws the force diagram's member lines (coloured by sense)
// and its external forces (arrowed where the segment is long enough).
func drawForceLines(c *canvas, f frame, d *reciprocal.Diagram) {
	for _, s := range d.Members {
		if s.Zero {
			continue
		}
		p, q := d.Points[s.Left], d.Points[s.Right]
		class := "zero"
		switch s.Sense {
		case reciprocal.Tension:
			class = "tension"
		case reciprocal.Compression:
			class = "compression"
		}
		c.line(f.x(p[0]), f.y(p[1]), f.x(q[0]), f.y(q[1]), class, 1.8, "")
	}
	for _, s := range d.Forces {
		p, q := d.Points[s.Left], d.Points[s.Right]
		x1, y1, x2, y2 := f.x(p[0]), f.y(p[1]), f.x(q[0]), f.y(q[1])
		head := ` marker-end="url(#arrow)"`
		if math.Hypot(x2-x1, y2-y1) < 16 {
			head = "" // an arrowhead longer than its segment hides its neighbours
		}
		c.line(x1, y1, x2, y2, "external", 2.6, head)
	}
}

// pointGroup is one labelled point of the force diagram: the spaces whose
// points coincide there (zero-force members, spaces on the load line) share
// one label, "3=4".
type pointGroup struct {
	at    [2]float64
	names []string
	outer bool
}

// pointGroups merges the force diagram's points that coincide within 1e-9
// of the diagram's size, taking them left to right (then bottom to top).
func pointGroups(d *reciprocal.Diagram) []pointGroup {
	var groups []pointGroup
	size := 0.0
	for _, p := range d.Points {
		size = math.Max(size, math.Hypot(p[0], p[1]))
	}
	order := make([]int, len(d.Points))
	for k := range order {
		order[k] = k
	}
	slices.SortStableFunc(order, func(a, b int) int {
		pa, pb := d.Points[a], d.Points[b]
		switch {
		case pa[0] < pb[0]:
			return -1
		case pa[0] > pb[0]:
			return 1
		case pa[1] < pb[1]:
			return -1
		case pa[1] > pb[1]:
			return 1
		}
		return a - b
	})
	for _, k := range order {
		p := d.Points[k]
		merged := false
		for g := len(groups) - 1; g >= 0 && g >= len(groups)-8; g-- {
			if math.Hypot(groups[g].at[0]-p[0], groups[g].at[1]-p[1]) <= 1e-9*size {
				groups[g].names = append(groups[g].names, d.Spaces[k].Label)
				groups[g].outer = groups[g].outer || d.Spaces[k].Outer
				merged = true
				break
			}
		}
		if !merged {
			groups = append(groups, pointGroup{at: p, names: []string{d.Spaces[k].Label}, outer: d.Spaces[k].Outer})
		}
	}
	return groups
}
