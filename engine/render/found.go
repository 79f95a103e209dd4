package render

import (
	"fmt"
	"io"
	"math"

	"gusset/engine/model"
)

// FoundForm writes an SVG picture of a form found by the force density
// method: a 2D model as one form diagram (see Form), a 3D model as its plan
// (x right, y up) beside its elevation (x right, z up) at one scale.
// Members are coloured and styled by the sign of their axial force (tension
// positive, in the model's force unit; forces within 1e-9 of the largest
// count as zero) with widths growing with its magnitude; fixed nodes are
// drawn as open squares. It returns the first write error and panics if
// axial is not aligned with the members.
func FoundForm(w io.Writer, m *model.Model, axial []float64, opt Options) error {
	if len(axial) != len(m.Members) {
		panic(fmt.Sprintf("render: %d axial forces for %d members", len(axial), len(m.Members)))
	}
	if opt.Title == "" {
		opt.Title = "Found form (force density method)"
	}
	if m.Dim == 2 {
		return Form(w, m, axial, opt)
	}
	width := opt.Width
	if width <= 0 {
		width = 1100
	}
	views := [2]foundView{{name: "Plan (x, y)", axes: [2]int{0, 1}}, {name: "Elevation (x, z)", axes: [2]int{0, 2}}}
	pw := (width - 60) / 2
	var ph float64
	for k := range views {
		views[k].content = foundBox(m, views[k].axes)
		ph = math.Max(ph, panelHeight(pw, views[k].content))
	}
	// One scale for both views, the smaller of their own.
	scale := math.Inf(1)
	for k := range views {
		b := views[k].content
		views[k].f = fit(20+float64(k)*(pw+20), 46, pw, ph, 30, b.minX, b.minY, b.maxX, b.maxY)
		scale = math.Min(scale, views[k].f.scale)
	}
	c := newCanvas(w, width, 46+ph+130)
	c.text(20, 26, opt.Title, "title", "start")
	var maxT float64
	for _, t := range axial {
		maxT = math.Max(maxT, math.Abs(t))
	}
	for k := range views {
		b := views[k].content
		views[k].f = foundFit(views[k].f, scale, b)
		views[k].draw(c, m, axial, maxT)
	}
	c.scaleBar(views[0].f, unitOr(m.Units.Length, "m"))
	y := c.legendCompact(20, 46+ph+24, unitOr(m.Units.Force, "kN"), unitOr(m.Units.Length, "m"))
	c.caption(20, y+10, "Plan and elevation", fmt.Sprintf("Largest axial force %.4g %s; open squares are fixed nodes.", maxT, unitOr(m.Units.Force, "kN")))
	return c.close()
}

// foundView is one projection of a 3D model onto two of its axes.
type foundView struct {
	name    string
	axes    [2]int
	content box
	f       frame
}

func foundBox(m *model.Model, axes [2]int) box {
	b := emptyBox()
	for v := range m.NodeCount() {
		b.add([2]float64{m.Coords[v*m.Dim+axes[0]], m.Coords[v*m.Dim+axes[1]]})
	}
	return b
}

// foundFit recentres f's box at the given (smaller) scale.
func foundFit(f frame, scale float64, b box) frame {
	f.scale = scale
	f.minX = (b.minX+b.maxX)/2 - f.width/2/scale
	f.maxY = (b.minY+b.maxY)/2 + f.height/2/scale
	return f
}

func (v *foundView) draw(c *canvas, m *model.Model, axial []float64, maxT float64) {
	f, d := v.f, m.Dim
	c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(f.left), num(f.top), num(f.width), num(f.height))
	c.text(f.left+8, f.top+16, v.name, "small", "start")
	at := func(n int) (float64, float64) {
		return f.x(m.Coords[n*d+v.axes[0]]), f.y(m.Coords[n*d+v.axes[1]])
	}
	for e, mb := range m.Members {
		x1, y1 := at(mb.Ends[0])
		x2, y2 := at(mb.Ends[1])
		t := axial[e]
		c.line(x1, y1, x2, y2, senseClass(t, 1e-9*maxT), 0.8+2.2*math.Abs(t)/math.Max(maxT, 1e-300), "")
	}
	for _, sp := range m.Supports {
		x, y := at(sp.Node)
		c.printf(`<rect x="%s" y="%s" width="6" height="6" class="support"/>`+"\n", num(x-3), num(y-3))
	}
}
