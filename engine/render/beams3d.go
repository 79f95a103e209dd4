package render

import (
	"cmp"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// Beams3D writes an SVG picture of a solved 3D frame in three isometric
// panels: the bending moments about each member's local z axis (Mz, drawn
// along local y) and about its local y axis (My, drawn along local z),
// each on the side of the member in tension (−Mz·y/Iz and My·z/Iy
// positive, the sign convention of the stiffness results), both to one
// stated scale with the largest moments labelled; and the deflected shape
// along the members (the stations' displacements, magnified by a stated
// round factor) over the undeformed model. A curve's MomentY holds My.
// Members without a curve (bars) are drawn straight between their nodes.
// Beam ends released about local z are marked by open circles in the Mz
// panel, those released about local y in the My panel (hingeMark), and
// both in the deflected shape, where an end released in torsion only is
// marked by an open diamond (torsionMark); the caption explains the marks
// drawn and carries the caution. It returns the first write error and
// panics for a 2D model or a curve whose arrays differ in length.
func Beams3D(w io.Writer, m *model.Model, nodeDisp [][]float64, curves []BeamCurve, opt Options) error {
	if m.Dim != 3 {
		panic("render: Beams3D draws 3D models")
	}
	for _, bc := range curves {
		if len(bc.Moment) != len(bc.Stations) || len(bc.MomentY) != len(bc.Stations) || len(bc.Displacements) != len(bc.Stations) {
			panic(fmt.Sprintf("render: member %d has %d stations, %d and %d moments and %d displacements",
				bc.Member, len(bc.Stations), len(bc.Moment), len(bc.MomentY), len(bc.Displacements)))
		}
	}
	sc := newSpaceCurves(m, nodeDisp, curves)
	width := opt.Width
	if width <= 0 {
		width = 1100
	}
	pw := (width - 40 - 2*20) / 3
	panels := []struct {
		title string
		pts   func(bc *BeamCurve, k int) [3]float64
	}{
		{"Mz about local z", func(bc *BeamCurve, k int) [3]float64 { return sc.ordinate(bc, k, 1, -bc.Moment[k]) }},
		{"My about local y", func(bc *BeamCurve, k int) [3]float64 { return sc.ordinate(bc, k, 2, bc.MomentY[k]) }},
		{"Deflected shape", sc.moved},
	}
	boxes := make([]box, len(panels))
	ph := 0.0
	for i, p := range panels {
		boxes[i] = sc.panelBox(p.pts)
		ph = math.Max(ph, panelHeight(pw, boxes[i]))
	}
	c := newCanvas(w, width, 40+ph+150)
	forceUnit, lengthUnit := unitOr(m.Units.Force, "kN"), unitOr(m.Units.Length, "m")
	momentUnit := forceUnit + "·" + lengthUnit
	for i, p := range panels {
		left := 20 + float64(i)*(pw+20)
		c.text(left, 26, p.title, "title", "start")
		c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(left), num(36), num(pw), num(ph))
		f := fit(left, 36, pw, ph, 40, boxes[i].minX, boxes[i].minY, boxes[i].maxX, boxes[i].maxY)
		if i < 2 {
			sc.drawMomentPanel(c, f, p.pts, i == 1, momentUnit)
		} else {
			sc.drawDeflectedPanel(c, f, lengthUnit)
		}
		c.scaleBar(f, lengthUnit)
	}
	title := opt.Title
	if title == "" {
		title = "Moments and deflections along the members"
	}
	c.caption(20, 36+ph+30, title, releaseNotes(len(bendingReleasedEnds(m)) > 0, len(torsionReleasedEnds(m)) > 0,
		fmt.Sprintf("Isometric views; moments drawn on the tension side. Moment scale: 1 %s of drawing = %.4g %s; largest moment %.4g %s.", lengthUnit, sc.momentScale, momentUnit, sc.maxM, momentUnit),
		fmt.Sprintf("Displacements magnified ×%.4g; largest displacement %.4g %s (undeformed members dotted grey).", sc.magnify, sc.maxU, lengthUnit))...)
	return c.close()
}

// spaceCurves is what Beams3D draws from: the model, each member's local
// axes, the curves by member and the scales.
type spaceCurves struct {
	m                    *model.Model
	nodeDisp             [][]float64
	curves               []BeamCurve
	axes                 [][3][3]float64
	byMember             map[int]*BeamCurve
	maxM, maxU           float64
	momentScale, magnify float64
}

func newSpaceCurves(m *model.Model, nodeDisp [][]float64, curves []BeamCurve) *spaceCurves {
	sc := &spaceCurves{m: m, nodeDisp: nodeDisp, curves: curves, axes: make([][3][3]float64, len(m.Members)),
		byMember: make(map[int]*BeamCurve, len(curves)), momentScale: 1, magnify: 1}
	for e := range m.Members {
		sc.axes[e], _ = statics.MemberAxes(m, e)
	}
	b := emptyBox()
	for v := range m.NodeCount() {
		b.add(isometric(m.Node(v)))
	}
	for i := range curves {
		bc := &curves[i]
		sc.byMember[bc.Member] = bc
		sc.maxM = math.Max(sc.maxM, math.Max(math.Abs(bc.PeakMoment[0]), math.Abs(bc.PeakMomentY[0])))
		sc.maxU = math.Max(sc.maxU, bc.PeakDisplacement[0])
	}
	for _, d := range nodeDisp {
		sc.maxU = math.Max(sc.maxU, math.Sqrt(sq3(d)))
	}
	if sc.maxM > 0 {
		sc.momentScale = niceAbove(sc.maxM / (0.15 * b.diag()))
	}
	if sc.maxU > 0 {
		sc.magnify = niceLength(0.08 * b.diag() / sc.maxU)
	}
	return sc
}

func sq3(d []float64) float64 {
	s := 0.0
	for _, x := range d {
		s += x * x
	}
	return s
}

// along is the point at station k of curve bc on its member's axis.
func (sc *spaceCurves) along(bc *BeamCurve, k int) [3]float64 {
	a, x := sc.m.Node(sc.m.Members[bc.Member].Ends[0]), sc.axes[bc.Member][0]
	s := bc.Stations[k]
	return [3]float64{a[0] + s*x[0], a[1] + s*x[1], a[2] + s*x[2]}
}

// ordinate is station k's point of a moment diagram drawn value/scale
// along the member's local axis number axis.
func (sc *spaceCurves) ordinate(bc *BeamCurve, k, axis int, value float64) [3]float64 {
	p, d := sc.along(bc, k), sc.axes[bc.Member][axis]
	off := value / sc.momentScale
	return [3]float64{p[0] + off*d[0], p[1] + off*d[1], p[2] + off*d[2]}
}

// moved is station k's magnified displaced position.
func (sc *spaceCurves) moved(bc *BeamCurve, k int) [3]float64 {
	p, d := sc.along(bc, k), bc.Displacements[k]
	return [3]float64{p[0] + sc.magnify*d[0], p[1] + sc.magnify*d[1], p[2] + sc.magnify*d[2]}
}

// panelBox bounds the nodes and the points pts draws, projected.
func (sc *spaceCurves) panelBox(pts func(bc *BeamCurve, k int) [3]float64) box {
	b := emptyBox()
	for v := range sc.m.NodeCount() {
		b.add(isometric(sc.m.Node(v)))
	}
	for i := range sc.curves {
		for k := range sc.curves[i].Stations {
			b.add(isometric(pts(&sc.curves[i], k)))
		}
	}
	return b
}

// pt projects a model point into frame f.
func pt(f frame, p [3]float64) (float64, float64) {
	q := isometric(p)
	return f.x(q[0]), f.y(q[1])
}

// drawMembersAndSupports draws every member straight between its nodes
// in class (with attrs) and the supports of the isometric view.
func (sc *spaceCurves) drawMembersAndSupports(c *canvas, f frame, class string, width float64, attrs string) {
	for _, mem := range sc.m.Members {
		x1, y1 := pt(f, sc.m.Node(mem.Ends[0]))
		x2, y2 := pt(f, sc.m.Node(mem.Ends[1]))
		c.line(x1, y1, x2, y2, class, width, attrs)
	}
	held := views(3)[0].held
	for _, s := range sc.m.Supports {
		x, y := pt(f, sc.m.Node(s.Node))
		c.support(x, y, held(s.Fixed))
	}
}

// drawMomentPanel draws one moment diagram (pts gives its ordinates) as a
// filled band on each member, marks the member ends released about the
// panel's axis (local y when aboutY, else local z) and labels the largest
// peaks of My when aboutY, else of Mz.
func (sc *spaceCurves) drawMomentPanel(c *canvas, f frame, pts func(bc *BeamCurve, k int) [3]float64, aboutY bool, unit string) {
	sc.drawMembersAndSupports(c, f, "", 1.6, ` stroke="`+InkColour+`"`)
	for i := range sc.curves {
		bc := &sc.curves[i]
		var s strings.Builder
		x, y := pt(f, sc.along(bc, 0))
		fmt.Fprintf(&s, "%s,%s ", num(x), num(y))
		for k := range bc.Stations {
			x, y := pt(f, pts(bc, k))
			fmt.Fprintf(&s, "%s,%s ", num(x), num(y))
		}
		x, y = pt(f, sc.along(bc, len(bc.Stations)-1))
		fmt.Fprintf(&s, "%s,%s", num(x), num(y))
		c.printf(`<polygon points="%s" fill="%s" fill-opacity="0.75" stroke="%s" stroke-width="1.2"/>`+"\n",
			s.String(), TensionBandColour, TensionColour)
	}
	axis := model.RZ
	if aboutY {
		axis = model.RY
	}
	for _, end := range releasedEnds(sc.m, axis) {
		mem := sc.m.Members[end[0]]
		x, y := pt(f, sc.m.Node(mem.Ends[end[1]]))
		ox, oy := pt(f, sc.m.Node(mem.Ends[1-end[1]]))
		c.hingeMark(x, y, ox, oy)
	}
	peak := func(bc *BeamCurve) [2]float64 {
		if aboutY {
			return bc.PeakMomentY
		}
		return bc.PeakMoment
	}
	order := make([]int, len(sc.curves))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(i, j int) int {
		return cmp.Compare(math.Abs(peak(&sc.curves[j])[0]), math.Abs(peak(&sc.curves[i])[0]))
	})
	for _, i := range order[:min(beamLabels, len(order))] {
		bc := &sc.curves[i]
		pk := peak(bc)
		if pk[0] == 0 {
			continue
		}
		k := nearestStation(bc.Stations, pk[1])
		x, y := pt(f, pts(bc, k))
		c.circle(x, y, 2.5, TensionColour)
		labelInside(c, f, x, y, 4, -6, fmt.Sprintf("%.4g %s", pk[0], unit))
	}
}

// movedEnd returns in frame f the magnified displaced position of a
// member's end (member index, side) and of the next point drawn along the
// member from it: the neighbouring station of its curve, or, for a member
// drawn straight, its other end.
func (sc *spaceCurves) movedEnd(f frame, end [2]int) (x, y, ox, oy float64) {
	if bc, ok := sc.byMember[end[0]]; ok && len(bc.Stations) >= 2 {
		k, step := 0, 1
		if end[1] == 1 {
			k, step = len(bc.Stations)-1, -1
		}
		x, y = pt(f, sc.moved(bc, k))
		ox, oy = pt(f, sc.moved(bc, k+step))
		return x, y, ox, oy
	}
	moved := func(v int) (float64, float64) {
		p, d := sc.m.Node(v), sc.nodeDisp[v]
		return pt(f, [3]float64{p[0] + sc.magnify*d[0], p[1] + sc.magnify*d[1], p[2] + sc.magnify*d[2]})
	}
	ends := sc.m.Members[end[0]].Ends
	x, y = moved(ends[end[1]])
	ox, oy = moved(ends[1-end[1]])
	return x, y, ox, oy
}

// drawDeflectedPanel draws the undeformed members dotted and the
// deflected shape along them, marks the released member ends (open
// circles in bending, open diamonds in torsion only) and the largest
// displacement.
func (sc *spaceCurves) drawDeflectedPanel(c *canvas, f frame, unit string) {
	sc.drawMembersAndSupports(c, f, "zero", 1, "")
	best, bx, by := -1.0, 0.0, 0.0
	for e, mem := range sc.m.Members {
		var s strings.Builder
		if bc, ok := sc.byMember[e]; ok {
			for k := range bc.Stations {
				x, y := pt(f, sc.moved(bc, k))
				fmt.Fprintf(&s, "%s,%s ", num(x), num(y))
			}
			if bc.PeakDisplacement[0] > best {
				best = bc.PeakDisplacement[0]
				bx, by = pt(f, sc.moved(bc, nearestStation(bc.Stations, bc.PeakDisplacement[1])))
			}
		} else {
			for _, v := range mem.Ends {
				p, d := sc.m.Node(v), sc.nodeDisp[v]
				x, y := pt(f, [3]float64{p[0] + sc.magnify*d[0], p[1] + sc.magnify*d[1], p[2] + sc.magnify*d[2]})
				fmt.Fprintf(&s, "%s,%s ", num(x), num(y))
				if u := math.Sqrt(sq3(d)); u > best {
					best, bx, by = u, x, y
				}
			}
		}
		c.printf(`<polyline points="%s" fill="none" stroke="%s" stroke-width="2"/>`+"\n", strings.TrimSpace(s.String()), DeflectedColour)
	}
	for _, end := range bendingReleasedEnds(sc.m) {
		x, y, ox, oy := sc.movedEnd(f, end)
		c.hingeMark(x, y, ox, oy)
	}
	for _, end := range torsionReleasedEnds(sc.m) {
		x, y, ox, oy := sc.movedEnd(f, end)
		c.torsionMark(x, y, ox, oy)
	}
	if best > 0 {
		c.circle(bx, by, 3, DeflectedColour)
		labelInside(c, f, bx, by, 5, 14, fmt.Sprintf("largest %.4g %s", best, unit))
	}
}

// labelInside writes a small label for the point (x, y), dx to its right
// (or, failing that, its left) and dy below, inside the panel f where it
// can (near positions before far ones), else wherever label puts it.
func labelInside(c *canvas, f frame, x, y, dx, dy float64, s string) {
	inside := placement{steps: [][2]float64{{0, 0}, {0, -1}, {0, 1}, {0, -2}, {0, 2}}, overLines: true, bounded: true,
		within: rect{f.left, f.top, f.left + f.width, f.top + f.height}}
	for _, rings := range []bool{false, true} {
		inside.rings = rings
		if c.labelIfClear(x+dx, y+dy, s, "small label", "start", inside) || c.labelIfClear(x-dx, y+dy, s, "small label", "end", inside) {
			return
		}
	}
	c.label(x+dx, y+dy, s, "small label", "start", stepsVertical)
}
