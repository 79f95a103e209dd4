package layout

import (
	"bufio"
	"fmt"
	"io"
	"math"
)

// Caution is the caption every picture of a layout carries.
const Caution = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."

// SVGOptions tune WriteSVG. The zero value is valid.
type SVGOptions struct {
	// Width is the picture width in pixels; default 800.
	Width float64
	// Case is the index of the load case whose forces set tension or
	// compression; default 0.
	Case int
	// MaxStroke is the stroke width in pixels of the member with the
	// largest area; default 10. Strokes are proportional to area, with a
	// hairline minimum of 0.5.
	MaxStroke float64
	// Title is an optional heading.
	Title string
	// LengthUnit names the length unit, so that the legend gives the
	// volume in its cube; "" leaves the volume without a unit.
	LengthUnit string
}

// Colours and dashes of the picture. Tension and compression differ in
// both colour and line style so that the picture reads in grey too.
const (
	tensionColour     = "#1f5fa8" // blue, solid: the same as the reciprocal-diagram pictures
	compressionColour = "#b8322a" // red, dashed
	supportColour     = "#3b3b3b"
	loadColour        = "#2e7d32"
)

// WriteSVG draws the layout as an SVG picture: members with stroke width
// proportional to area, tension solid red-brown and compression dashed
// blue, supports as triangles, loads as arrows, a legend and the caution
// caption.
func (l *Layout) WriteSVG(w io.Writer, opt SVGOptions) error {
	if opt.Width <= 0 {
		opt.Width = 800
	}
	if opt.MaxStroke <= 0 {
		opt.MaxStroke = 10
	}
	if opt.Case < 0 || (len(l.Cases) > 0 && opt.Case >= len(l.Cases)) {
		panic(fmt.Sprintf("layout: SVG case %d out of range [0, %d)", opt.Case, len(l.Cases)))
	}
	var lo, hi [2]float64
	if len(l.Nodes) > 0 {
		lo, hi = l.Nodes[0], l.Nodes[0]
	}
	for _, p := range l.Nodes {
		for a := 0; a < 2; a++ {
			lo[a], hi[a] = min(lo[a], p[a]), max(hi[a], p[a])
		}
	}
	spanX, spanY := hi[0]-lo[0], hi[1]-lo[1]
	extent := max(spanX, spanY)
	if extent == 0 {
		extent = 1
	}
	margin := 40.0
	scale := (opt.Width - 2*margin) / max(spanX, extent*0.25)
	drawH := max(spanY, extent*0.25) * scale
	top := 30.0
	if opt.Title != "" {
		top += 20
	}
	legendH := 70.0
	height := top + drawH + 2*margin + legendH
	px := func(p [2]float64) (float64, float64) {
		return margin + (p[0]-lo[0])*scale, top + margin + (hi[1]-p[1])*scale
	}
	b := bufio.NewWriter(w)
	fmt.Fprintf(b, `<svg xmlns="http://www.w3.org/2000/svg" width="%.0f" height="%.0f" viewBox="0 0 %.0f %.0f" font-family="sans-serif" font-size="12">`+"\n", opt.Width, height, opt.Width, height)
	fmt.Fprintf(b, `<rect width="100%%" height="100%%" fill="#fcfcf8"/>`+"\n")
	if opt.Title != "" {
		fmt.Fprintf(b, `<text x="%.1f" y="24" font-size="16">%s</text>`+"\n", margin, escape(opt.Title))
	}
	largest := 0.0
	for _, m := range l.Members {
		largest = max(largest, m.Area)
	}
	for _, m := range l.Members {
		x1, y1 := px(l.Nodes[m.Ends[0]])
		x2, y2 := px(l.Nodes[m.Ends[1]])
		stroke := 0.5
		if largest > 0 {
			stroke = max(0.5, opt.MaxStroke*m.Area/largest)
		}
		force := 0.0
		if len(m.Forces) > opt.Case {
			force = m.Forces[opt.Case]
		}
		colour, dash := tensionColour, ""
		if force < 0 {
			colour = compressionColour
			dash = fmt.Sprintf(` stroke-dasharray="%.1f %.1f"`, 3*stroke+4, 1.5*stroke+3)
		}
		fmt.Fprintf(b, `<line x1="%.2f" y1="%.2f" x2="%.2f" y2="%.2f" stroke="%s" stroke-width="%.2f"%s stroke-linecap="butt"/>`+"\n", x1, y1, x2, y2, colour, stroke, dash)
	}
	for _, s := range l.Supports {
		x, y := px(l.Nodes[s.Node])
		fmt.Fprintf(b, `<path d="M %.2f %.2f l -8 14 h 16 z" fill="none" stroke="%s" stroke-width="1.5"/>`+"\n", x, y, supportColour)
	}
	if len(l.Cases) > opt.Case {
		maxLoad := 0.0
		for _, ld := range l.Cases[opt.Case].Loads {
			maxLoad = max(maxLoad, math.Hypot(ld.Force[0], ld.Force[1]))
		}
		for _, ld := range l.Cases[opt.Case].Loads {
			size := math.Hypot(ld.Force[0], ld.Force[1])
			if size == 0 {
				continue
			}
			x, y := px(l.Nodes[ld.Node])
			length := 40 * size / maxLoad
			dx, dy := ld.Force[0]/size, -ld.Force[1]/size
			// The arrow ends at the node, pointing along the force.
			sx, sy := x-dx*length, y-dy*length
			fmt.Fprintf(b, `<line x1="%.2f" y1="%.2f" x2="%.2f" y2="%.2f" stroke="%s" stroke-width="2"/>`+"\n", sx, sy, x, y, loadColour)
			hx, hy := -dx*9, -dy*9
			fmt.Fprintf(b, `<path d="M %.2f %.2f l %.2f %.2f l %.2f %.2f z" fill="%s"/>`+"\n", x, y, hx-hy*0.45, hy+hx*0.45, hy*0.9, -hx*0.9, loadColour)
		}
	}
	legendY := top + drawH + 2*margin
	fmt.Fprintf(b, `<line x1="%.1f" y1="%.1f" x2="%.1f" y2="%.1f" stroke="%s" stroke-width="4"/>`+"\n", margin, legendY, margin+40, legendY, tensionColour)
	fmt.Fprintf(b, `<text x="%.1f" y="%.1f">tension (solid)</text>`+"\n", margin+48, legendY+4)
	fmt.Fprintf(b, `<line x1="%.1f" y1="%.1f" x2="%.1f" y2="%.1f" stroke="%s" stroke-width="4" stroke-dasharray="16 9"/>`+"\n", margin+170, legendY, margin+210, legendY, compressionColour)
	fmt.Fprintf(b, `<text x="%.1f" y="%.1f">compression (dashed)</text>`+"\n", margin+218, legendY+4)
	volume := fmt.Sprintf("%.4g", l.Volume)
	if opt.LengthUnit != "" {
		volume += " " + escape(opt.LengthUnit) + "³"
	}
	fmt.Fprintf(b, `<text x="%.1f" y="%.1f">line width ∝ area; volume %s</text>`+"\n", margin+370, legendY+4, volume)
	fmt.Fprintf(b, `<text x="%.1f" y="%.1f" font-style="italic">%s</text>`+"\n", margin, legendY+34, escape(Caution))
	fmt.Fprintf(b, "</svg>\n")
	return b.Flush()
}

func escape(s string) string {
	out := make([]byte, 0, len(s))
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '<':
			out = append(out, "&lt;"...)
		case '>':
			out = append(out, "&gt;"...)
		case '&':
			out = append(out, "&amp;"...)
		case '"':
			out = append(out, "&quot;"...)
		default:
			out = append(out, s[i])
		}
	}
	return string(out)
}
