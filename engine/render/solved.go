package render

import (
	"fmt"
	"io"
	"math"

	"gusset/engine/model"
)

// view is one projection of a model into a panel: plan, elevation or an
// axonometric view, in model units with y (or the screen's up) upwards.
type view struct {
	title string
	// project maps a point in model coordinates to the panel's plane.
	project func(p [3]float64) [2]float64
	// held maps a support's held components to the components the 2D
	// symbols read (X, Y, RZ of the panel).
	held func(fixed [6]bool) [6]bool
}

// isometric is the isometric axonometric projection: x and y at 30° below
// the horizontal either side, z up (the standard isometric of technical
// drawing, common practice).
func isometric(p [3]float64) [2]float64 {
	c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)
	return [2]float64{(p[0] - p[1]) * c, p[2] + (p[0]+p[1])*s}
}

func views(dim int) []view {
	if dim == 2 {
		return []view{{title: "Deflected shape", project: func(p [3]float64) [2]float64 { return [2]float64{p[0], p[1]} },
			held: func(f [6]bool) [6]bool { return [6]bool{f[0], f[1], false, false, false, f[5]} }}}
	}
	pinned := func(f [6]bool) [6]bool { // any held translation reads as a pin in a 3D view
		any := f[0] || f[1] || f[2]
		return [6]bool{any, any, false, false, false, any && f[3] && f[4] && f[5]}
	}
	return []view{
		{title: "Axonometric view (isometric)", project: isometric, held: pinned},
		{title: "Plan (x right, y up)", project: func(p [3]float64) [2]float64 { return [2]float64{p[0], p[1]} }, held: pinned},
		{title: "Elevation (x right, z up)", project: func(p [3]float64) [2]float64 { return [2]float64{p[0], p[2]} },
			held: func(f [6]bool) [6]bool { return [6]bool{f[0], f[2], false, false, false, f[4]} }},
	}
}

// Solved writes an SVG picture of a solved model: the undeformed members
// thin, dotted and grey, and the deflected shape over them with each
// member styled by the sense of its axial force (tension positive, in the
// model's force unit) and its width growing with the magnitude, supports
// marked, a scale bar, a legend and the caution. disp holds each node's
// translations (length units, dim components); they are magnified so that
// the largest is 8% of the model's size, and the caption says by how much.
// A 2D model is drawn in one panel; a 3D model in an isometric view, a
// plan and an elevation. It returns the first write error and panics if
// disp or axial is not aligned with the model.
func Solved(w io.Writer, m *model.Model, disp [][]float64, axial []float64, opt Options) error {
	n := len(m.Coords) / m.Dim
	if len(disp) != n || len(axial) != len(m.Members) {
		panic(fmt.Sprintf("render: %d displacements and %d forces for %d nodes and %d members", len(disp), len(axial), n, len(m.Members)))
	}
	at := func(v int) [3]float64 {
		var p [3]float64
		copy(p[:], m.Coords[v*m.Dim:(v+1)*m.Dim])
		return p
	}
	lo, hi := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}, [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	maxU, maxT := 0.0, 0.0
	for v := range n {
		p := at(v)
		for k := range 3 {
			lo[k], hi[k] = math.Min(lo[k], p[k]), math.Max(hi[k], p[k])
		}
		maxU = math.Max(maxU, math.Sqrt(dotSlice(disp[v], disp[v])))
	}
	size := math.Max(math.Sqrt((hi[0]-lo[0])*(hi[0]-lo[0])+(hi[1]-lo[1])*(hi[1]-lo[1])+(hi[2]-lo[2])*(hi[2]-lo[2])), 1e-300)
	for _, t := range axial {
		maxT = math.Max(maxT, math.Abs(t))
	}
	magnify := 1.0
	if maxU > 0 {
		magnify = niceLength(0.08 * size / maxU)
	}
	moved := func(v int) [3]float64 {
		p := at(v)
		for k := range min(3, len(disp[v])) {
			p[k] += magnify * disp[v][k]
		}
		return p
	}
	vs := views(m.Dim)
	width := solvedWidth(opt, len(vs))
	pw := (width - 40 - float64(len(vs)-1)*20) / float64(len(vs))
	var ph float64
	boxes := make([]box, len(vs))
	for k, vw := range vs {
		boxes[k] = emptyBox()
		for v := range n {
			boxes[k].add(vw.project(at(v)))
			boxes[k].add(vw.project(moved(v)))
		}
		ph = math.Max(ph, panelHeight(pw, boxes[k]))
	}
	top := 40.0
	c := newCanvas(w, width, top+ph+170)
	tol := 1e-9 * maxT
	written := len(m.Members)
	for k, vw := range vs {
		left := 20 + float64(k)*(pw+20)
		c.text(left, 26, vw.title, "title", "start")
		c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(left), num(top), num(pw), num(ph))
		f := fit(left, top, pw, ph, 42, boxes[k].minX, boxes[k].minY, boxes[k].maxX, boxes[k].maxY)
		drawSolvedView(c, f, m, vw, at, moved, axial, maxT, tol)
		if opt.ForceLabels && k == 0 {
			written = c.labelMemberForces(f, axial, func(e int) (x1, y1, x2, y2 float64) {
				p, q := vw.project(moved(m.Members[e].Ends[0])), vw.project(moved(m.Members[e].Ends[1]))
				return f.x(p[0]), f.y(p[1]), f.x(q[0]), f.y(q[1])
			})
		}
		c.scaleBar(f, unitOr(m.Units.Length, "m"))
	}
	y := c.legendCompact(20, top+ph+24, unitOr(m.Units.Force, "kN"), unitOr(m.Units.Length, "m"))
	title := opt.Title
	if title == "" {
		title = "Deflected shape and axial forces"
	}
	c.caption(20, y+10, title, withLabelNote([]string{
		fmt.Sprintf("Undeformed shape dotted grey beneath; displacements drawn ×%s.", fmt.Sprint(magnify)),
		fmt.Sprintf("Largest displacement %.4g %s; largest axial force %.4g %s.", maxU, unitOr(m.Units.Length, "m"), maxT, unitOr(m.Units.Force, "kN")),
	}, written, m)...)
	return c.close()
}

// solvedWidth is the picture's width: opt.Width, or 640 for one view and
// 1100 for several side by side.
func solvedWidth(opt Options, views int) float64 {
	switch {
	case opt.Width > 0:
		return opt.Width
	case views > 1:
		return 1100
	}
	return 640
}

func dotSlice(a, b []float64) float64 {
	s := 0.0
	for i := range min(len(a), len(b), 3) {
		s += a[i] * b[i]
	}
	return s
}

// drawSolvedView draws one panel: undeformed, deflected, supports, nodes.
func drawSolvedView(c *canvas, f frame, m *model.Model, vw view, at, moved func(int) [3]float64, axial []float64, maxT, tol float64) {
	pt := func(p [3]float64) (float64, float64) {
		q := vw.project(p)
		return f.x(q[0]), f.y(q[1])
	}
	for _, mb := range m.Members {
		x1, y1 := pt(at(mb.Ends[0]))
		x2, y2 := pt(at(mb.Ends[1]))
		c.line(x1, y1, x2, y2, "zero", 1, "")
	}
	for e, mb := range m.Members {
		x1, y1 := pt(moved(mb.Ends[0]))
		x2, y2 := pt(moved(mb.Ends[1]))
		wd := 1.2 + 3.3*math.Abs(axial[e])/math.Max(maxT, 1e-300)
		c.line(x1, y1, x2, y2, senseClass(axial[e], tol), wd, "")
	}
	for _, sp := range m.Supports {
		x, y := pt(at(sp.Node))
		c.support(x, y, vw.held(sp.Fixed))
	}
	for v := range len(m.Coords) / m.Dim {
		x, y := pt(moved(v))
		c.circle(x, y, 2.4, InkColour)
	}
}
