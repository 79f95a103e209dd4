package render

import (
	"fmt"
	"io"
	"math"
	"sort"

	"gusset/engine/layout"
)

// LayoutOptions controls a layout picture. The zero value is valid.
type LayoutOptions struct {
	// Width is the picture's width in pixels; 0 means 800 for a plane
	// layout and 1140 for a space layout (three views).
	Width float64
	// Case is the index of the load case whose forces set each member's
	// sense and whose loads are drawn; default 0.
	Case int
	// Title heads the caption; "" means "Least-volume layout".
	Title string
	// LengthUnit and ForceUnit name the units; "" means m and kN.
	LengthUnit, ForceUnit string
	// MaxStroke is the drawn width in pixels of the member with the
	// largest area; 0 means 10. Widths are proportional to area, with a
	// hairline minimum of 0.6.
	MaxStroke float64
}

// bandWidth is the drawn width from which a member is shown as a pale band
// of its full width with a thin centre line in its sense's style, so that a
// thick compression member reads as one member, not as separate dashes.
const bandWidth = 3.0

// projection maps a layout's points to a drawing plane: screen right and
// up, and depth (larger is nearer the viewer).
type projection struct {
	name        string
	right, up   [3]float64
	toScale     bool // lengths parallel to the drawing plane are true
	depth       [3]float64
	axes        string // the axis names of right and up, for the panel
	orientation string
}

var (
	planView      = projection{name: "Plan", right: [3]float64{1, 0, 0}, up: [3]float64{0, 1, 0}, depth: [3]float64{0, 0, 1}, toScale: true, orientation: "from above: x to the right, y up"}
	elevationView = projection{name: "Elevation", right: [3]float64{1, 0, 0}, up: [3]float64{0, 0, 1}, depth: [3]float64{0, -1, 0}, toScale: true, orientation: "from the front (−y): x to the right, z up"}
	// The axonometric view looks from (1, −1, 1) towards the origin:
	// right = ẑ × d / |ẑ × d|, up = d × right (common practice).
	axonometricView = projection{name: "Axonometric view", right: [3]float64{1 / math.Sqrt2, 1 / math.Sqrt2, 0},
		up: [3]float64{-1 / math.Sqrt(6), 1 / math.Sqrt(6), 2 / math.Sqrt(6)}, depth: [3]float64{1 / math.Sqrt(3), -1 / math.Sqrt(3), 1 / math.Sqrt(3)},
		orientation: "from (1, −1, 1): not to scale"}
)

func (pr projection) at(p [3]float64) [2]float64 {
	return [2]float64{dot3(p, pr.right), dot3(p, pr.up)}
}

func dot3(p, q [3]float64) float64 { return p[0]*q[0] + p[1]*q[1] + p[2]*q[2] }

// layoutScene is a layout ready to draw in one projection.
type layoutScene struct {
	l       *layout.Layout
	pr      projection
	opt     LayoutOptions
	largest float64 // largest area
	maxLoad float64 // largest load magnitude of the drawn case
	content box
}

func newLayoutScene(l *layout.Layout, pr projection, opt LayoutOptions) *layoutScene {
	s := &layoutScene{l: l, pr: pr, opt: opt, content: emptyBox()}
	for _, p := range l.Nodes {
		s.content.add(pr.at(p))
	}
	for _, e := range append(append([][2][3]float64(nil), l.DomainEdges...), l.HoleEdges...) {
		s.content.add(pr.at(e[0]))
		s.content.add(pr.at(e[1]))
	}
	for _, m := range l.Members {
		s.largest = math.Max(s.largest, m.Area)
	}
	for _, ld := range s.loads() {
		s.maxLoad = math.Max(s.maxLoad, math.Sqrt(dot3(ld.Force, ld.Force)))
	}
	return s
}

func (s *layoutScene) loads() []layout.NodalForce {
	if s.opt.Case < len(s.l.Cases) {
		return s.l.Cases[s.opt.Case].Loads
	}
	return nil
}

// draw draws the scene into frame f: the domain, the members (farthest
// first), the supports, the nodes the loads act at and the loads with
// their magnitudes.
func (s *layoutScene) draw(c *canvas, f frame) {
	pt := func(p [3]float64) (float64, float64) {
		q := s.pr.at(p)
		return f.x(q[0]), f.y(q[1])
	}
	for _, e := range s.l.DomainEdges {
		x1, y1 := pt(e[0])
		x2, y2 := pt(e[1])
		c.line(x1, y1, x2, y2, "domain", 1, "")
	}
	for _, e := range s.l.HoleEdges {
		x1, y1 := pt(e[0])
		x2, y2 := pt(e[1])
		c.line(x1, y1, x2, y2, "hole", 1.6, "")
	}
	order := make([]int, len(s.l.Members))
	depth := make([]float64, len(s.l.Members))
	for i, m := range s.l.Members {
		order[i] = i
		depth[i] = dot3(s.l.Nodes[m.Ends[0]], s.pr.depth) + dot3(s.l.Nodes[m.Ends[1]], s.pr.depth)
	}
	sort.SliceStable(order, func(i, j int) bool { return depth[order[i]] < depth[order[j]] })
	for _, i := range order {
		s.member(c, pt, s.l.Members[i])
	}
	for _, sp := range s.l.Supports {
		x, y := pt(sp.At)
		var held [6]bool
		// The symbol shows the freedoms held in the drawing plane.
		for a := 0; a < 3; a++ {
			if sp.Fix[a] {
				held[0] = held[0] || math.Abs(s.pr.right[a]) > 0.5
				held[1] = held[1] || math.Abs(s.pr.up[a]) > 0.5
			}
		}
		if !held[0] && !held[1] {
			held[0], held[1] = true, true
		}
		c.support(x, y, held)
	}
	for _, ld := range s.loads() {
		s.load(c, pt, ld)
	}
}

// member draws one member: width proportional to area, style by sense.
func (s *layoutScene) member(c *canvas, pt func([3]float64) (float64, float64), m layout.Member) {
	x1, y1 := pt(s.l.Nodes[m.Ends[0]])
	x2, y2 := pt(s.l.Nodes[m.Ends[1]])
	maxStroke := s.opt.MaxStroke
	if maxStroke <= 0 {
		maxStroke = 10
	}
	width := 0.6
	if s.largest > 0 {
		width = math.Max(0.6, maxStroke*m.Area/s.largest)
	}
	force := 0.0
	if s.opt.Case < len(m.Forces) {
		force = m.Forces[s.opt.Case]
	}
	class := senseClass(force, 0)
	if width < bandWidth {
		c.line(x1, y1, x2, y2, class, width, "")
		return
	}
	c.line(x1, y1, x2, y2, class+"-band", width, "")
	c.line(x1, y1, x2, y2, class, 1.6, "")
}

// load draws a load arrow ending at its node with its magnitude; a load
// along the line of sight is a circle with a cross (pointing away from the
// viewer) or a dot (towards the viewer).
func (s *layoutScene) load(c *canvas, pt func([3]float64) (float64, float64), ld layout.NodalForce) {
	size := math.Sqrt(dot3(ld.Force, ld.Force))
	if size == 0 {
		return
	}
	x, y := pt(s.l.Nodes[ld.Node])
	unit := unitOr(s.opt.ForceUnit, "kN")
	text := fmt.Sprintf("%.4g %s", size, unit)
	dx, dy := dot3(ld.Force, s.pr.right)/size, -dot3(ld.Force, s.pr.up)/size
	if math.Hypot(dx, dy) < 0.2 {
		c.printf(`<circle cx="%s" cy="%s" r="6" class="load" stroke-width="1.6"/>`+"\n", num(x), num(y))
		if dot3(ld.Force, s.pr.depth) < 0 {
			c.line(x-4.2, y-4.2, x+4.2, y+4.2, "load", 1.6, "")
			c.line(x-4.2, y+4.2, x+4.2, y-4.2, "load", 1.6, "")
		} else {
			c.circle(x, y, 1.8, LoadColour)
		}
		c.label(x+9, y-8, text, "small label", "start", stepsAround)
		return
	}
	length := 22 + 28*size/math.Max(s.maxLoad, 1e-300)
	// The arrow ends at the node, pointing along the force.
	sx, sy := x-dx*length, y-dy*length
	c.line(sx, sy, x-dx*3, y-dy*3, "load", 2, ` marker-end="url(#arrow)"`)
	c.label(sx-dx*8, sy-dy*8+4, text, "small label", "middle", stepsVertical)
}

// Layout writes an SVG picture of a least-volume layout: in the plane one
// view, in space an axonometric view, a plan and an elevation. Members are
// drawn with width proportional to their area and styled by the sense of
// their axial force in the chosen case (tension positive); the design
// domain's boundary and its holes, the supports, the loads with their
// magnitudes, a scale bar in every view drawn to scale, a legend with the
// volume and its unit, and the caution are drawn too. It returns the first
// write error and panics if opt.Case is out of range.
func Layout(w io.Writer, l *layout.Layout, opt LayoutOptions) error {
	if opt.Case < 0 || (len(l.Cases) > 0 && opt.Case >= len(l.Cases)) {
		panic(fmt.Sprintf("render: layout case %d out of range [0, %d)", opt.Case, len(l.Cases)))
	}
	views := []projection{{name: "Layout", right: [3]float64{1, 0, 0}, up: [3]float64{0, 1, 0}, depth: [3]float64{0, 0, 1}, toScale: true}}
	width := opt.Width
	if l.Dim == 3 {
		views = []projection{axonometricView, planView, elevationView}
		if width <= 0 {
			width = 1140
		}
	} else if width <= 0 {
		width = 800
	}
	const gap, side, top = 20.0, 20.0, 40.0
	pw := (width - 2*side - gap*float64(len(views)-1)) / float64(len(views))
	scenes := make([]*layoutScene, len(views))
	ph := 0.0
	for i, v := range views {
		scenes[i] = newLayoutScene(l, v, opt)
		ph = math.Max(ph, panelHeight(pw, scenes[i].content))
	}
	height := top + ph + 170
	c := newCanvas(w, width, height)
	for i, s := range scenes {
		left := side + float64(i)*(pw+gap)
		if len(views) > 1 {
			c.text(left, 26, s.pr.name, "title", "start")
			c.text(left+pw, 26, s.pr.orientation, "small", "end")
		}
		c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(left), num(top), num(pw), num(ph))
		f := fit(left, top, pw, ph, 48, s.content.minX, s.content.minY, s.content.maxX, s.content.maxY)
		s.draw(c, f)
		if s.pr.toScale {
			c.scaleBar(f, unitOr(opt.LengthUnit, "m"))
		}
	}
	y := c.layoutLegend(side, top+ph+24, l, opt)
	title := opt.Title
	if title == "" {
		title = "Least-volume layout"
	}
	caseNote := ""
	if len(l.Cases) > 0 {
		caseNote = fmt.Sprintf(" Senses and loads of case %q.", l.Cases[opt.Case].ID)
	}
	c.caption(side, y+8, title, fmt.Sprintf("%d members, %d nodes; volume %.5g %s³.%s", len(l.Members), len(l.Nodes), l.Volume, unitOr(opt.LengthUnit, "m"), caseNote))
	return c.close()
}

// layoutLegend draws the key of a layout picture and returns the y below
// it.
func (c *canvas) layoutLegend(x, y float64, l *layout.Layout, opt LayoutOptions) float64 {
	items := []struct{ class, text string }{
		{"tension", "Tension (axial force > 0)"},
		{"compression", "Compression (axial force < 0)"},
		{"domain", "Design domain"},
	}
	if len(l.HoleEdges) > 0 {
		items = append(items, struct{ class, text string }{"hole", "Hole (no member crosses)"})
	}
	for k, it := range items {
		// Three to a row, 260 px apart: room for the longest text at 0.62
		// em a glyph within the narrowest picture (800 px).
		xx, yy := x+float64(k%3)*260, y+float64(k/3)*20
		if it.class == "tension" || it.class == "compression" {
			c.line(xx, yy, xx+36, yy, it.class+"-band", 8, "")
			c.line(xx, yy, xx+36, yy, it.class, 1.6, "")
		} else {
			c.line(xx, yy, xx+36, yy, it.class, 1.6, "")
		}
		c.text(xx+44, yy+4, it.text, "small", "start")
	}
	y += 20 * float64((len(items)+2)/3)
	c.line(x, y, x+36, y, "load", 2, ` marker-end="url(#arrow)"`)
	c.text(x+44, y+4, "Load, with its magnitude in "+unitOr(opt.ForceUnit, "kN"), "small", "start")
	y += 20
	c.text(x, y+4, fmt.Sprintf("Line width proportional to area (widest %.4g %s²); lengths in %s, forces in %s; tension positive.",
		largestArea(l), unitOr(opt.LengthUnit, "m"), unitOr(opt.LengthUnit, "m"), unitOr(opt.ForceUnit, "kN")), "small", "start")
	return y + 18
}

func largestArea(l *layout.Layout) float64 {
	a := 0.0
	for _, m := range l.Members {
		a = math.Max(a, m.Area)
	}
	return a
}
