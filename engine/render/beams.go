package render

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"gusset/engine/model"
)

// BeamCurve is what Beams draws along one member: values at stations and
// the exact extremes to label.
type BeamCurve struct {
	// Member is the member's index in the model.
	Member int
	// Stations are distances from the member's first end (length units),
	// increasing from 0 to the member's length.
	Stations []float64
	// Moment is the bending moment at each station (force·length), positive
	// when the member's local −y side is in tension (sagging for a member
	// running left to right).
	Moment []float64
	// Displacements are the translations at each station (global axes,
	// two entries, length units).
	Displacements [][]float64
	// PeakMoment is the moment of largest magnitude and its distance from
	// the first end; PeakDisplacement the largest translation magnitude and
	// its distance.
	PeakMoment, PeakDisplacement [2]float64
	// MomentY and PeakMomentY are the moment about local y (My, positive
	// when the member's local +z side is in tension) at each station and
	// its peak, for Beams3D; Moment and PeakMoment are then Mz, and
	// Displacements have three entries.
	MomentY     []float64
	PeakMomentY [2]float64
}

// beamLabels is the most members whose peak moment is labelled.
const beamLabels = 8

// Beams writes an SVG picture of a solved 2D frame in two panels: the
// bending-moment diagram drawn on the tension side of each member, to a
// stated scale (one length unit of drawing for a round number of
// force·length units), with the largest moments labelled; and the
// deflected shape along the members (the stations' displacements,
// magnified by a stated round factor) over the undeformed model, with
// the largest displacement labelled. Members without a curve (bars) are
// drawn straight between their nodes. A beam end released in bending
// (model.Member.Releases, rz) is marked in both panels by an open circle
// on the beam just inside its node, which the caption explains.
// The caption carries the caution.
// It returns the first write error and panics for a 3D model or a curve
// whose arrays differ in length.
func Beams(w io.Writer, m *model.Model, nodeDisp [][]float64, curves []BeamCurve, opt Options) error {
	if m.Dim != 2 {
		panic("render: Beams draws 2D models")
	}
	for _, bc := range curves {
		if len(bc.Moment) != len(bc.Stations) || len(bc.Displacements) != len(bc.Stations) {
			panic(fmt.Sprintf("render: member %d has %d stations, %d moments and %d displacements", bc.Member, len(bc.Stations), len(bc.Moment), len(bc.Displacements)))
		}
	}
	b := emptyBox()
	for v := range m.NodeCount() {
		b.add(node(m, v))
	}
	size := b.diag()
	maxM, maxU := 0.0, 0.0
	for _, bc := range curves {
		maxM = math.Max(maxM, math.Abs(bc.PeakMoment[0]))
		maxU = math.Max(maxU, bc.PeakDisplacement[0])
	}
	for _, d := range nodeDisp {
		maxU = math.Max(maxU, math.Hypot(d[0], d[1]))
	}
	momentScale := 1.0 // force·length per length unit of drawing
	if maxM > 0 {
		momentScale = niceAbove(maxM / (0.15 * size))
	}
	magnify := 1.0
	if maxU > 0 {
		magnify = niceLength(0.08 * size / maxU)
	}
	byMember := make(map[int]*BeamCurve, len(curves))
	for i := range curves {
		byMember[curves[i].Member] = &curves[i]
	}
	momentBox, movedBox := b, b
	for _, bc := range curves {
		for k := range bc.Stations {
			momentBox.add(momentPoint(m, bc, k, momentScale))
			movedBox.add(movedPoint(m, bc, k, magnify))
		}
	}
	width := opt.Width
	if width <= 0 {
		width = 720
	}
	pw := width - 40
	h1, h2 := panelHeight(pw, momentBox), panelHeight(pw, movedBox)
	c := newCanvas(w, width, 40+h1+40+h2+150)
	forceUnit, lengthUnit := unitOr(m.Units.Force, "kN"), unitOr(m.Units.Length, "m")
	momentUnit := forceUnit + "·" + lengthUnit
	c.text(20, 26, "Bending moments (drawn on the tension side)", "title", "start")
	f1 := fit(20, 36, pw, h1, 48, momentBox.minX, momentBox.minY, momentBox.maxX, momentBox.maxY)
	c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(20), num(36), num(pw), num(h1))
	drawMoments(c, f1, m, curves, byMember, momentScale, momentUnit)
	c.scaleBar(f1, lengthUnit)
	top2 := 36 + h1 + 40
	c.text(20, top2-10, "Deflected shape along the members", "title", "start")
	f2 := fit(20, top2, pw, h2, 48, movedBox.minX, movedBox.minY, movedBox.maxX, movedBox.maxY)
	c.printf(`<rect x="%s" y="%s" width="%s" height="%s" class="frame"/>`+"\n", num(20), num(top2), num(pw), num(h2))
	drawDeflected(c, f2, m, nodeDisp, byMember, magnify, lengthUnit)
	c.scaleBar(f2, lengthUnit)
	title := opt.Title
	if title == "" {
		title = "Moments and deflections along the members"
	}
	c.caption(20, top2+h2+30, title, releaseNotes(len(releasedEnds(m, model.RZ)) > 0, false,
		fmt.Sprintf("Moment scale: 1 %s of drawing = %.4g %s; largest moment %.4g %s.", lengthUnit, momentScale, momentUnit, maxM, momentUnit),
		fmt.Sprintf("Displacements magnified ×%.4g; largest displacement %.4g %s (undeformed members dotted grey).", magnify, maxU, lengthUnit))...)
	return c.close()
}

// niceAbove returns the smallest 1, 2 or 5 × 10ᵏ not below x > 0.
func niceAbove(x float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, k := range []float64{1, 2, 5, 10} {
		if k*p >= x {
			return k * p
		}
	}
	return 10 * p
}

// memberFrame returns member e's first end and its unit axis and normal
// (local x and y in 2D).
func memberFrame(m *model.Model, e int) (start, axis, normal [2]float64) {
	a, b := node(m, m.Members[e].Ends[0]), node(m, m.Members[e].Ends[1])
	l := math.Hypot(b[0]-a[0], b[1]-a[1])
	axis = [2]float64{(b[0] - a[0]) / l, (b[1] - a[1]) / l}
	return a, axis, [2]float64{-axis[1], axis[0]}
}

// momentPoint is station k's ordinate of the moment diagram: on the
// tension side, −M/scale along the local y axis.
func momentPoint(m *model.Model, bc BeamCurve, k int, scale float64) [2]float64 {
	a, t, n := memberFrame(m, bc.Member)
	s, off := bc.Stations[k], -bc.Moment[k]/scale
	return [2]float64{a[0] + s*t[0] + off*n[0], a[1] + s*t[1] + off*n[1]}
}

// movedPoint is station k's magnified displaced position.
func movedPoint(m *model.Model, bc BeamCurve, k int, magnify float64) [2]float64 {
	a, t, _ := memberFrame(m, bc.Member)
	s, d := bc.Stations[k], bc.Displacements[k]
	return [2]float64{a[0] + s*t[0] + magnify*d[0], a[1] + s*t[1] + magnify*d[1]}
}

func drawMoments(c *canvas, f frame, m *model.Model, curves []BeamCurve, byMember map[int]*BeamCurve, scale float64, unit string) {
	for e, mem := range m.Members {
		a, b := node(m, mem.Ends[0]), node(m, mem.Ends[1])
		c.line(f.x(a[0]), f.y(a[1]), f.x(b[0]), f.y(b[1]), "", 1.6, ` stroke="`+InkColour+`"`)
		bc, ok := byMember[e]
		if !ok {
			continue
		}
		var pts strings.Builder
		fmt.Fprintf(&pts, "%s,%s ", num(f.x(a[0])), num(f.y(a[1])))
		for k := range bc.Stations {
			p := momentPoint(m, *bc, k, scale)
			fmt.Fprintf(&pts, "%s,%s ", num(f.x(p[0])), num(f.y(p[1])))
		}
		fmt.Fprintf(&pts, "%s,%s", num(f.x(b[0])), num(f.y(b[1])))
		c.printf(`<polygon points="%s" fill="%s" fill-opacity="0.75" stroke="%s" stroke-width="1.2"/>`+"\n",
			pts.String(), TensionBandColour, TensionColour)
	}
	drawSupports(c, f, m)
	for _, end := range releasedEnds(m, model.RZ) {
		mem := m.Members[end[0]]
		a, b := node(m, mem.Ends[end[1]]), node(m, mem.Ends[1-end[1]])
		c.hingeMark(f.x(a[0]), f.y(a[1]), f.x(b[0]), f.y(b[1]))
	}
	order := make([]int, len(curves))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(i, j int) int {
		a, b := math.Abs(curves[i].PeakMoment[0]), math.Abs(curves[j].PeakMoment[0])
		switch {
		case a > b:
			return -1
		case a < b:
			return 1
		}
		return 0
	})
	for _, i := range order[:min(beamLabels, len(order))] {
		bc := curves[i]
		if bc.PeakMoment[0] == 0 {
			continue
		}
		a, t, n := memberFrame(m, bc.Member)
		s, off := bc.PeakMoment[1], -bc.PeakMoment[0]/scale
		p := [2]float64{a[0] + s*t[0] + off*n[0], a[1] + s*t[1] + off*n[1]}
		c.circle(f.x(p[0]), f.y(p[1]), 2.5, TensionColour)
		labelInside(c, f, f.x(p[0]), f.y(p[1]), 4, -6, fmt.Sprintf("%.4g %s", bc.PeakMoment[0], unit))
	}
}

func drawDeflected(c *canvas, f frame, m *model.Model, nodeDisp [][]float64, byMember map[int]*BeamCurve, magnify float64, unit string) {
	best, bestAt := -1.0, [2]float64{}
	for e, mem := range m.Members {
		a, b := node(m, mem.Ends[0]), node(m, mem.Ends[1])
		c.line(f.x(a[0]), f.y(a[1]), f.x(b[0]), f.y(b[1]), "zero", 1, "")
		var pts strings.Builder
		if bc, ok := byMember[e]; ok {
			for k := range bc.Stations {
				p := movedPoint(m, *bc, k, magnify)
				fmt.Fprintf(&pts, "%s,%s ", num(f.x(p[0])), num(f.y(p[1])))
			}
			if bc.PeakDisplacement[0] > best {
				a, t, _ := memberFrame(m, e)
				// The displacement at the peak lies between stations: place
				// the mark at the nearest station's displaced position.
				k := nearestStation(bc.Stations, bc.PeakDisplacement[1])
				d := bc.Displacements[k]
				s := bc.Stations[k]
				best, bestAt = bc.PeakDisplacement[0], [2]float64{a[0] + s*t[0] + magnify*d[0], a[1] + s*t[1] + magnify*d[1]}
			}
		} else {
			for _, v := range mem.Ends {
				p := node(m, v)
				d := nodeDisp[v]
				fmt.Fprintf(&pts, "%s,%s ", num(f.x(p[0]+magnify*d[0])), num(f.y(p[1]+magnify*d[1])))
				if u := math.Hypot(d[0], d[1]); u > best {
					best, bestAt = u, [2]float64{p[0] + magnify*d[0], p[1] + magnify*d[1]}
				}
			}
		}
		c.printf(`<polyline points="%s" fill="none" stroke="%s" stroke-width="2"/>`+"\n", strings.TrimSpace(pts.String()), DeflectedColour)
	}
	drawSupports(c, f, m)
	for _, end := range releasedEnds(m, model.RZ) {
		at, next := movedEnd(m, nodeDisp, byMember, magnify, end)
		c.hingeMark(f.x(at[0]), f.y(at[1]), f.x(next[0]), f.y(next[1]))
	}
	if best > 0 {
		c.circle(f.x(bestAt[0]), f.y(bestAt[1]), 3, DeflectedColour)
		labelInside(c, f, f.x(bestAt[0]), f.y(bestAt[1]), 5, 14, fmt.Sprintf("largest %.4g %s", best, unit))
	}
}

// movedEnd returns the magnified displaced position of a member's end
// (member index, side) in the deflected shape and the next point drawn
// along the member from it: the neighbouring station of its curve, or,
// for a member drawn straight, its other end.
func movedEnd(m *model.Model, nodeDisp [][]float64, byMember map[int]*BeamCurve, magnify float64, end [2]int) (at, next [2]float64) {
	if bc, ok := byMember[end[0]]; ok && len(bc.Stations) >= 2 {
		k, step := 0, 1
		if end[1] == 1 {
			k, step = len(bc.Stations)-1, -1
		}
		return movedPoint(m, *bc, k, magnify), movedPoint(m, *bc, k+step, magnify)
	}
	moved := func(v int) [2]float64 {
		p, d := node(m, v), nodeDisp[v]
		return [2]float64{p[0] + magnify*d[0], p[1] + magnify*d[1]}
	}
	ends := m.Members[end[0]].Ends
	return moved(ends[end[1]]), moved(ends[1-end[1]])
}

func nearestStation(stations []float64, at float64) int {
	best := 0
	for k, s := range stations {
		if math.Abs(s-at) < math.Abs(stations[best]-at) {
			best = k
		}
	}
	return best
}

func drawSupports(c *canvas, f frame, m *model.Model) {
	for _, s := range m.Supports {
		p := node(m, s.Node)
		c.support(f.x(p[0]), f.y(p[1]), s.Fixed)
	}
}
