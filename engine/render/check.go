package render

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// LabelReport counts the label defects of a picture, as a reader would
// see them: texts whose estimated boxes overlap another text, an
// arrowhead or a release mark (the open circle of a member end released in
// bending, the open diamond of one released in torsion only), and texts
// without a white halo lying on a drawn line. Hinges and TorsionMarks
// count the two kinds of release mark read; HingeOverlaps lists the texts
// on either.
type LabelReport struct {
	Texts          int
	Hinges         int
	TorsionMarks   int
	TextOverlaps   []string
	ArrowOverlaps  []string
	HingeOverlaps  []string
	UnhaloedOnLine []string
}

// Defects is the number of defects found.
func (r LabelReport) Defects() int {
	return len(r.TextOverlaps) + len(r.ArrowOverlaps) + len(r.HingeOverlaps) + len(r.UnhaloedOnLine)
}

// CheckLabels reads an SVG picture and reports its label defects. It
// reads <text> elements (position, anchor, class; rotated texts are left
// out), <line> elements (an arrowhead where marker-end is set), the
// <circle> elements of class "hinge" and the <polygon> elements of class
// "torsion-release" (their bounding boxes), with
// the same box estimates the placement uses; it is meant for tests of
// every picture Gusset writes, including pictures drawn outside this
// package.
func CheckLabels(svg []byte) (LabelReport, error) {
	marks, err := readMarks(svg)
	if err != nil {
		return LabelReport{}, err
	}
	return marks.report(), nil
}

// checkedText is one <text> of a picture: its estimated box, its content
// and whether it has a white halo (a "label" class).
type checkedText struct {
	box  rect
	s    string
	halo bool
}

// pictureMarks are the marks of a picture CheckLabels compares: its
// unrotated texts, its lines (leaders left out), its arrowheads' boxes and
// its release marks' boxes (hinges, then torsion marks).
type pictureMarks struct {
	texts    []checkedText
	segs     []segment
	heads    []rect
	hinges   []rect
	torsions []rect
}

// readMarks decodes the <text> and <line> elements of an SVG picture.
func readMarks(svg []byte) (pictureMarks, error) {
	var pm pictureMarks
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return pm, err
		}
		el, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		attr := func(name string) string {
			for _, a := range el.Attr {
				if a.Name.Local == name {
					return a.Value
				}
			}
			return ""
		}
		f := func(name string) float64 {
			v, _ := strconv.ParseFloat(attr(name), 64)
			return v
		}
		switch el.Name.Local {
		case "circle":
			if attr("class") == "hinge" {
				x, y, r := f("cx"), f("cy"), f("r")
				pm.hinges = append(pm.hinges, rect{x - r, y - r, x + r, y + r})
			}
		case "polygon":
			if attr("class") == "torsion-release" {
				pm.torsions = append(pm.torsions, pointsBox(attr("points")))
			}
		case "line":
			if attr("class") == "leader" {
				continue // a leader ends at its label by design
			}
			s := segment{f("x1"), f("y1"), f("x2"), f("y2")}
			pm.segs = append(pm.segs, s)
			if attr("marker-end") != "" {
				pm.heads = append(pm.heads, arrowheadBox(s.x1, s.y1, s.x2, s.y2))
			}
		case "text":
			var content string
			if err := dec.DecodeElement(&content, &el); err != nil {
				return pm, err
			}
			if attr("transform") != "" || strings.TrimSpace(content) == "" {
				continue
			}
			class, anchor := attr("class"), attr("text-anchor")
			if anchor == "" {
				anchor = "start"
			}
			pm.texts = append(pm.texts, checkedText{box: labelBox(f("x"), f("y"), content, class, anchor), s: content,
				halo: strings.Contains(class, "label")})
		}
	}
	return pm, nil
}

// report lists each text that overlaps an earlier text or an arrowhead, or
// that lies on a line without a halo.
func (pm pictureMarks) report() LabelReport {
	var rep LabelReport
	rep.Texts, rep.Hinges, rep.TorsionMarks = len(pm.texts), len(pm.hinges), len(pm.torsions)
	for i, a := range pm.texts {
		for _, b := range pm.texts[:i] {
			if a.box.overlaps(shrink(b.box)) {
				rep.TextOverlaps = append(rep.TextOverlaps, fmt.Sprintf("%q on %q", a.s, b.s))
			}
		}
		for _, h := range pm.heads {
			if shrink(a.box).overlaps(h) {
				rep.ArrowOverlaps = append(rep.ArrowOverlaps, fmt.Sprintf("%q on an arrowhead", a.s))
				break
			}
		}
		for i, h := range append(pm.hinges[:len(pm.hinges):len(pm.hinges)], pm.torsions...) {
			if shrink(a.box).overlaps(h) {
				kind := "hinge"
				if i >= len(pm.hinges) {
					kind = "torsion"
				}
				rep.HingeOverlaps = append(rep.HingeOverlaps, fmt.Sprintf("%q on a %s mark", a.s, kind))
				break
			}
		}
		if !a.halo {
			for _, s := range pm.segs {
				if s.hits(shrink(a.box)) {
					rep.UnhaloedOnLine = append(rep.UnhaloedOnLine, fmt.Sprintf("%q on a line without a halo", a.s))
					break
				}
			}
		}
	}
	return rep
}

// shrink takes the one-pixel margin off a label box, so that two labels
// merely touching do not count as overlapping.
func shrink(r rect) rect { return rect{r.x0 + 1, r.y0 + 1, r.x1 - 1, r.y1 - 1} }

// pointsBox is the bounding box of an SVG points list ("x,y x,y ..."); an
// empty or unreadable list gives the box of the pairs it could read.
func pointsBox(points string) rect {
	b := rect{math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)}
	for _, pair := range strings.Fields(points) {
		xs, ys, ok := strings.Cut(pair, ",")
		x, errX := strconv.ParseFloat(xs, 64)
		y, errY := strconv.ParseFloat(ys, 64)
		if !ok || errX != nil || errY != nil {
			continue
		}
		b = rect{math.Min(b.x0, x), math.Min(b.y0, y), math.Max(b.x1, x), math.Max(b.y1, y)}
	}
	return b
}
