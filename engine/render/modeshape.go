package render

import (
	"fmt"
	"io"
	"math"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// ModeShape describes one buckling or vibration mode for a picture.
type ModeShape struct {
	// Displacements holds Dim translations per node; Rotations per node one
	// rotation (2D) or three (3D), nil at a node without rotations. The
	// shape's scale is free: the picture scales it.
	Displacements [][]float64
	Rotations     [][]float64
	// Heading names the mode, e.g. "Buckling mode 1: load factor 3.42".
	Heading string
	// Notes are lines printed under the heading (the kind of analysis and
	// its limits).
	Notes []string
}

// Mode writes an SVG picture of a mode shape over the undeformed form: the
// form in ZeroColour with ZeroDash, the shape in DeflectedColour, drawn
// with its largest translation at a tenth of the model's size. Beams are
// drawn curved, by the cubic (Hermite) interpolation of their end
// translations and rotations; bars straight. A 3D model is drawn in an
// isometric view (x to the lower right, y to the lower left, z up). It
// returns the first write error and panics if the shape is not aligned
// with the nodes.
func Mode(w io.Writer, m *model.Model, shape ModeShape, opt Options) error {
	if len(shape.Displacements) != m.NodeCount() {
		panic(fmt.Sprintf("render: %d node displacements for %d nodes", len(shape.Displacements), m.NodeCount()))
	}
	width := opt.Width
	if width <= 0 {
		width = 640
	}
	project := modeProjection(m.Dim)
	b := emptyBox()
	var big float64
	for n := range m.NodeCount() {
		b.add(project(m.Node(n)))
		for _, u := range shape.Displacements[n] {
			big = math.Max(big, math.Abs(u))
		}
	}
	amplify := 0.0
	if big > 0 {
		amplify = 0.1 * b.diag() / big
	}
	ph := panelHeight(width-40, b)
	// The drawn shape may leave the form's box by a tenth of its size.
	pad := 0.1 * b.diag()
	f := fit(20, 46, width-40, ph, 30, b.minX-pad, b.minY-pad, b.maxX+pad, b.maxY+pad)
	c := newCanvas(w, width, 46+ph+110)
	title := opt.Title
	if title == "" {
		title = shape.Heading
	}
	c.text(20, 26, title, "title", "start")
	for e := range m.Members {
		drawModeMember(c, f, m, e, shape, project, 0, "zero")
	}
	for e := range m.Members {
		drawModeMember(c, f, m, e, shape, project, amplify, "")
	}
	if m.Dim == 2 {
		for _, s := range m.Supports {
			p := project(m.Node(s.Node))
			c.support(f.x(p[0]), f.y(p[1]), s.Fixed)
		}
	}
	c.scaleBar(f, unitOr(m.Units.Length, "m"))
	y := 46 + ph + 20
	c.line(20, y-4, 50, y-4, "zero", 1.5, "")
	c.text(56, y, "undeformed form", "small", "start")
	c.line(180, y-4, 210, y-4, "", 2, fmt.Sprintf(` stroke="%s" fill="none"`, DeflectedColour))
	c.text(216, y, "mode shape (scale arbitrary)", "small", "start")
	c.caption(20, y+24, "Linear modal analysis", shape.Notes...)
	return c.close()
}

// modeProjection maps a model point to the picture's plane.
func modeProjection(dim int) func(p [3]float64) [2]float64 {
	if dim == 2 {
		return func(p [3]float64) [2]float64 { return [2]float64{p[0], p[1]} }
	}
	c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)
	return func(p [3]float64) [2]float64 { return [2]float64{(p[0] - p[1]) * c, p[2] - (p[0]+p[1])*s} }
}

// drawModeMember draws member e displaced by amplify times the shape: the
// undeformed member (amplify 0) in class, or the shape as a polyline.
func drawModeMember(c *canvas, f frame, m *model.Model, e int, shape ModeShape, project func([3]float64) [2]float64, amplify float64, class string) {
	pts := modeMemberPoints(m, e, shape, amplify)
	if class != "" {
		a, b := project(pts[0]), project(pts[len(pts)-1])
		c.line(f.x(a[0]), f.y(a[1]), f.x(b[0]), f.y(b[1]), class, 1.3, "")
		return
	}
	c.printf(`<polyline points="`)
	for i, p := range pts {
		q := project(p)
		if i > 0 {
			c.printf(" ")
		}
		c.printf("%s,%s", num(f.x(q[0])), num(f.y(q[1])))
	}
	c.printf(`" fill="none" stroke="%s" stroke-width="2" stroke-linejoin="round"/>`+"\n", DeflectedColour)
}

// modeMemberPoints returns points along member e displaced by amplify
// times the shape: the two ends for a bar, nine stations for a beam with
// its transverse displacement interpolated by the cubic Hermite functions
// of its end translations and rotations (the shape functions of the
// Euler–Bernoulli element; common practice).
func modeMemberPoints(m *model.Model, e int, shape ModeShape, amplify float64) [][3]float64 {
	mem := m.Members[e]
	a, b := m.Node(mem.Ends[0]), m.Node(mem.Ends[1])
	var ua, ub [3]float64
	copy(ua[:], shape.Displacements[mem.Ends[0]])
	copy(ub[:], shape.Displacements[mem.Ends[1]])
	ra, rb := rotationOf(m, shape, mem.Ends[0]), rotationOf(m, shape, mem.Ends[1])
	stations := 1
	if mem.Kind == model.Beam && amplify != 0 {
		stations = 8
	}
	axes, _ := statics.MemberAxes(m, e)
	L := m.Length(e)
	// The end slopes relative to the chord, normal to the axis: the
	// rotation ω × axis less the chord's own transverse slope.
	var chord, slopeA, slopeB [3]float64
	sa, sb := cross(ra, axes[0]), cross(rb, axes[0])
	var along float64
	for i := range 3 {
		chord[i] = (ub[i] - ua[i]) / L
		along += chord[i] * axes[0][i]
	}
	for i := range 3 {
		chord[i] -= along * axes[0][i]
		slopeA[i], slopeB[i] = sa[i]-chord[i], sb[i]-chord[i]
	}
	pts := make([][3]float64, 0, stations+1)
	for k := 0; k <= stations; k++ {
		t := float64(k) / float64(stations)
		h2, h4 := L*(t-2*t*t+t*t*t), L*(-t*t+t*t*t)
		var p [3]float64
		for i := range 3 {
			// Linear interpolation of the end translations, then the
			// cubic correction normal to the axis from the rotations.
			p[i] = a[i] + t*(b[i]-a[i]) + amplify*((1-t)*ua[i]+t*ub[i])
		}
		if stations > 1 {
			for i := range 3 {
				p[i] += amplify * (h2*slopeA[i] + h4*slopeB[i])
			}
		}
		pts = append(pts, p)
	}
	return pts
}

// rotationOf returns node n's rotation vector (about z only in 2D).
func rotationOf(m *model.Model, shape ModeShape, n int) [3]float64 {
	var r [3]float64
	if shape.Rotations == nil || shape.Rotations[n] == nil {
		return r
	}
	if m.Dim == 2 {
		r[2] = shape.Rotations[n][0]
		return r
	}
	copy(r[:], shape.Rotations[n])
	return r
}

func cross(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}
