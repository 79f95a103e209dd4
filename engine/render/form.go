package render

import (
	"fmt"
	"io"
	"math"

	"gusset/engine/model"
)

// arrow is an external force drawn at a node along dir (unit, outwards).
type arrow struct {
	node  int
	force [2]float64
	dir   [2]float64
}

// faceLabel is a Bow's-notation name drawn at a point.
type faceLabel struct {
	at    [2]float64
	text  string
	outer bool
}

// formScene is a form diagram ready to draw: its geometry in model units.
type formScene struct {
	m       *model.Model
	axial   []float64
	tol     float64
	arrows  []arrow
	labels  []faceLabel
	maxF    float64 // largest external force magnitude
	arrowL  float64 // model length of the largest arrow
	content box
}

func newFormScene(m *model.Model, axial []float64, tol float64, arrows []arrow, labels []faceLabel) *formScene {
	s := &formScene{m: m, axial: axial, tol: tol, arrows: arrows, labels: labels, content: emptyBox()}
	for v := range m.NodeCount() {
		s.content.add(node(m, v))
	}
	s.arrowL = 0.16 * s.content.diag()
	for _, a := range arrows {
		s.maxF = math.Max(s.maxF, math.Hypot(a.force[0], a.force[1]))
	}
	for _, a := range arrows {
		tail, head := s.arrowEnds(a)
		s.content.add(tail)
		s.content.add(head)
	}
	for _, l := range labels {
		s.content.add(l.at)
	}
	return s
}

func node(m *model.Model, v int) [2]float64 { return [2]float64{m.Coords[2*v], m.Coords[2*v+1]} }

// arrowEnds returns an external force arrow's tail and head in model units:
// a force pushing on its node from outside ends at the node; one pulling it
// outwards starts there. Lengths grow with the force.
func (s *formScene) arrowEnds(a arrow) (tail, head [2]float64) {
	f := math.Hypot(a.force[0], a.force[1])
	l := s.arrowL * (0.4 + 0.6*f/math.Max(s.maxF, 1e-300))
	p := node(s.m, a.node)
	far := [2]float64{p[0] + l*a.dir[0], p[1] + l*a.dir[1]}
	if a.dir[0]*a.force[0]+a.dir[1]*a.force[1] < 0 {
		return far, p
	}
	return p, far
}

// draw draws the scene into frame f and, when forceLabels is set, the
// members' axial forces where they fit; it returns how many members have
// their force written (all of them when none was asked for).
func (s *formScene) draw(c *canvas, f frame, forceLabels bool) int {
	m := s.m
	maxT := 0.0
	for _, t := range s.axial {
		maxT = math.Max(maxT, math.Abs(t))
	}
	for e, mb := range m.Members {
		p, q := node(m, mb.Ends[0]), node(m, mb.Ends[1])
		t := s.axial[e]
		w := 1.2 + 3.3*math.Abs(t)/math.Max(maxT, 1e-300)
		c.line(f.x(p[0]), f.y(p[1]), f.x(q[0]), f.y(q[1]), senseClass(t, s.tol), w, "")
	}
	for _, sp := range m.Supports {
		x, y := f.x(node(m, sp.Node)[0]), f.y(node(m, sp.Node)[1])
		c.support(x, y, sp.Fixed)
	}
	for v := range m.NodeCount() {
		p := node(m, v)
		c.circle(f.x(p[0]), f.y(p[1]), 2.6, inkColour)
	}
	// Every line and arrowhead is drawn before any label, so that the
	// labels can keep clear of them all.
	arrowTags := s.drawArrows(c, f)
	// Space labels first, so that the numbers written next step aside
	// from them.
	for _, l := range s.labels {
		class := "label"
		if l.outer {
			class = "label space"
		}
		c.label(f.x(l.at[0]), f.y(l.at[1])+4, l.text, class, "middle", stepsVertical)
	}
	for _, t := range arrowTags {
		c.label(t.x, t.y, t.text, "small label", "middle", stepsVertical)
	}
	if !forceLabels {
		return len(m.Members)
	}
	return c.labelMemberForces(f, s.axial, func(e int) (x1, y1, x2, y2 float64) {
		p, q := node(m, m.Members[e].Ends[0]), node(m, m.Members[e].Ends[1])
		return f.x(p[0]), f.y(p[1]), f.x(q[0]), f.y(q[1])
	})
}

// arrowTag is an external force's magnitude, to be written near (x, y).
type arrowTag struct {
	x, y float64
	text string
}

// drawArrows draws the external forces and returns their magnitude
// labels, to be placed once every line is drawn.
func (s *formScene) drawArrows(c *canvas, f frame) []arrowTag {
	m := s.m
	var arrowTags []arrowTag
	unit := unitOr(m.Units.Force, "kN")
	supported := make(map[int]bool, len(m.Supports))
	for _, sp := range m.Supports {
		supported[sp.Node] = true
	}
	for _, a := range s.arrows {
		tail, head := s.arrowEnds(a)
		x1, y1, x2, y2 := f.x(tail[0]), f.y(tail[1]), f.x(head[0]), f.y(head[1])
		l := math.Hypot(x2-x1, y2-y1)
		// Stop the head short of the node dot, or of the support mark.
		gap := 4 / math.Max(l, 1e-300)
		if supported[a.node] {
			gap = 17 / math.Max(l, 1e-300)
		}
		if head == node(m, a.node) {
			x2, y2 = x2-(x2-x1)*gap, y2-(y2-y1)*gap
		}
		c.line(x1, y1, x2, y2, "external", 2, ` marker-end="url(#arrow)"`)
		far := tail
		if tail == node(m, a.node) {
			far = head
		}
		arrowTags = append(arrowTags, arrowTag{f.x(far[0]) + 9*a.dir[0], f.y(far[1]) - 9*a.dir[1] + 4,
			fmt.Sprintf("%.3g %s", math.Hypot(a.force[0], a.force[1]), unit)})
	}
	return arrowTags
}

// Form writes an SVG picture of a 2D form diagram alone, its members
// coloured and styled by the sign of their axial force (tension positive,
// in the model's force unit) with widths growing with its magnitude,
// supports marked, a legend, a scale bar and the caution. It is meant for
// the results of any method that gives axial forces. Forces within 1e-9
// of the largest count as zero. It returns the first write error and
// panics if axial is not aligned with the members or the model is not 2D.
func Form(w io.Writer, m *model.Model, axial []float64, opt Options) error {
	if m.Dim != 2 {
		panic("render: Form draws 2D models")
	}
	if len(axial) != len(m.Members) {
		panic(fmt.Sprintf("render: %d axial forces for %d members", len(axial), len(m.Members)))
	}
	maxT := 0.0
	for _, t := range axial {
		maxT = math.Max(maxT, math.Abs(t))
	}
	s := newFormScene(m, axial, 1e-9*maxT, nil, nil)
	width := opt.Width
	if width <= 0 {
		width = 640
	}
	pw := width - 40
	ph := panelHeight(pw, s.content)
	height := 40 + ph + 150
	c := newCanvas(w, width, height)
	c.text(20, 26, "Form diagram: axial forces", "title", "start")
	f := fit(20, 36, pw, ph, 42, s.content.minX, s.content.minY, s.content.maxX, s.content.maxY)
	c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(20), num(36), num(pw), num(ph))
	written := s.draw(c, f, opt.ForceLabels)
	c.scaleBar(f, unitOr(m.Units.Length, "m"))
	y := c.legendCompact(20, 36+ph+24, unitOr(m.Units.Force, "kN"), unitOr(m.Units.Length, "m"))
	title := opt.Title
	if title == "" {
		title = "Axial forces"
	}
	c.caption(20, y+10, title, withLabelNote([]string{fmt.Sprintf("Largest axial force %.4g %s.", maxT, unitOr(m.Units.Force, "kN"))}, written, m)...)
	return c.close()
}

// panelHeight returns a panel height for content of the given box drawn
// pw pixels wide, between 0.35 and 1.1 of the width.
func panelHeight(pw float64, b box) float64 {
	w, h := b.maxX-b.minX, b.maxY-b.minY
	aspect := 0.6
	if w > 0 {
		aspect = h / w
	}
	return pw * math.Min(math.Max(aspect*1.1, 0.35), 1.1)
}

// legendCompact is the legend stacked in one column, for narrow pictures.
func (c *canvas) legendCompact(x, y float64, forceUnit, lengthUnit string) float64 {
	items := []struct{ class, text string }{
		{"tension", "Tension (axial force > 0, " + forceUnit + "), continuous"},
		{"compression", "Compression (axial force < 0, " + forceUnit + "), dash-dot"},
		{"zero", "Zero force, dotted"},
	}
	for _, it := range items {
		c.line(x, y, x+36, y, it.class, 2.5, "")
		c.text(x+44, y+4, it.text, "small", "start")
		y += 18
	}
	c.text(x, y+4, "Lengths in "+lengthUnit+"; line width grows with |axial force|.", "small", "start")
	return y + 18
}
