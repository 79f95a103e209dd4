package render

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// Caution is the sentence every picture carries in its caption.
const Caution = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."

// Options controls a picture. The zero value is valid.
type Options struct {
	// Width is the picture's width in pixels; 0 means 1100 for two
	// diagrams side by side and 640 for one.
	Width float64
	// Title heads the caption; "" means a title naming the diagrams.
	Title string
	// ForceLabels writes members' axial forces beside them in the form
	// diagram (the first view of a 3D picture): every member's up to 40
	// members; above that, largest first, only those that fit clear of
	// the drawing, and the caption says how many of how many.
	ForceLabels bool
}

// canvas accumulates SVG elements and remembers the first write error.
type canvas struct {
	w   *bufio.Writer
	err error
	// placed holds the estimated boxes of the labels written by label, so
	// that later labels can step aside; heads the boxes of the arrowheads
	// drawn and segments the lines drawn, which labels avoid too; marks
	// the boxes of the hinge marks (hingeMark), which labels keep off.
	placed   []rect
	heads    []rect
	segments []segment
	marks    []rect
}

// rect is an axis-aligned box in picture coordinates.
type rect struct{ x0, y0, x1, y1 float64 }

func (r rect) overlaps(o rect) bool {
	return r.x0 < o.x1 && o.x0 < r.x1 && r.y0 < o.y1 && o.y0 < r.y1
}

func newCanvas(w io.Writer, width, height float64) *canvas {
	c := &canvas{w: bufio.NewWriter(w)}
	c.printf(`<?xml version="1.0" encoding="UTF-8"?>`+"\n"+
		`<svg xmlns="http://www.w3.org/2000/svg" width="%s" height="%s" viewBox="0 0 %s %s">`+"\n",
		num(width), num(height), num(width), num(height))
	c.printf("<style>%s</style>\n", StyleSheet)
	c.printf("%s\n", markerDefs)
	c.printf(`<rect width="100%%" height="100%%" fill="#ffffff"/>` + "\n")
	return c
}

func (c *canvas) printf(format string, args ...any) {
	if c.err == nil {
		_, c.err = fmt.Fprintf(c.w, format, args...)
	}
}

// close ends the document and flushes it.
func (c *canvas) close() error {
	c.printf("</svg>\n")
	if c.err == nil {
		c.err = c.w.Flush()
	}
	return c.err
}

func (c *canvas) line(x1, y1, x2, y2 float64, class string, width float64, extra string) {
	c.segments = append(c.segments, segment{x1, y1, x2, y2})
	if strings.Contains(extra, "marker-end") {
		c.heads = append(c.heads, arrowheadBox(x1, y1, x2, y2))
	}
	c.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" class="%s" stroke-width="%s"%s/>`+"\n",
		num(x1), num(y1), num(x2), num(y2), class, num(width), extra)
}

func (c *canvas) circle(x, y, r float64, fill string) {
	c.printf(`<circle cx="%s" cy="%s" r="%s" fill="%s"/>`+"\n", num(x), num(y), num(r), fill)
}

func (c *canvas) text(x, y float64, s, class, anchor string) {
	c.printf(`<text x="%s" y="%s" class="%s" text-anchor="%s">%s</text>`+"\n", num(x), num(y), class, anchor, escape(s))
}

// escape escapes text for XML.
func escape(s string) string {
	var b strings.Builder
	_ = xml.EscapeText(&b, []byte(s))
	return b.String()
}

// Steps for label: around a point above and below first, then to the sides.
var (
	stepsVertical = [][2]float64{{0, 0}, {0, -1}, {0, 1}, {0, -2}, {0, 2}, {0.6, 0}, {-0.6, 0}, {0, -3}, {0, 3}}
	stepsAround   = [][2]float64{{0, 0}, {0, 1.2}, {-1.2, 0}, {-1.2, 1.2}, {0, -1}, {1, 0}, {1, 1.2}, {1, -1}, {2, 0}, {2, 1.2}, {2, -1}, {0, 2.2}, {-1.2, -1}, {3, 0}, {3, 1.2}}
)

// num formats a coordinate compactly.
func num(x float64) string { return strconv.FormatFloat(x, 'f', 2, 64) }

// frame maps model coordinates into a panel, y upwards, one scale.
type frame struct {
	left, top, width, height float64 // panel in pixels
	minX, maxY, scale        float64
}

// fit returns the frame that shows the box [minX, maxX]×[minY, maxY]
// centred in the panel with a margin of pad pixels.
func fit(left, top, width, height, pad float64, minX, minY, maxX, maxY float64) frame {
	w, h := maxX-minX, maxY-minY
	if w <= 0 {
		w = math.Max(h, 1)
	}
	if h <= 0 {
		h = math.Max(w, 1)
	}
	s := math.Min((width-2*pad)/w, (height-2*pad)/h)
	f := frame{left: left, top: top, width: width, height: height, scale: s}
	// Centre the box.
	f.minX = minX - ((width-2*pad)/s-(maxX-minX))/2 - pad/s
	f.maxY = maxY + ((height-2*pad)/s-(maxY-minY))/2 + pad/s
	return f
}

func (f frame) x(x float64) float64 { return f.left + (x-f.minX)*f.scale }
func (f frame) y(y float64) float64 { return f.top + (f.maxY-y)*f.scale }

// box is a growing bounding box.
type box struct{ minX, minY, maxX, maxY float64 }

func emptyBox() box { return box{math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)} }

func (b *box) add(p [2]float64) {
	b.minX, b.maxX = math.Min(b.minX, p[0]), math.Max(b.maxX, p[0])
	b.minY, b.maxY = math.Min(b.minY, p[1]), math.Max(b.maxY, p[1])
}

func (b box) diag() float64 {
	if b.maxX < b.minX {
		return 1
	}
	return math.Max(math.Hypot(b.maxX-b.minX, b.maxY-b.minY), 1e-300)
}

// niceLength returns the largest 1, 2 or 5 × 10ᵏ not above target.
func niceLength(target float64) float64 {
	if target <= 0 || math.IsInf(target, 0) || math.IsNaN(target) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(target)))
	for _, k := range []float64{5, 2, 1} {
		if k*p <= target {
			return k * p
		}
	}
	return p
}

// scaleBar draws a bar of a round length near a quarter of the panel's
// width in model units, at the panel's bottom left, labelled with unit.
func (c *canvas) scaleBar(f frame, unit string) {
	l := niceLength(0.25 * f.width / f.scale)
	px := l * f.scale
	x0, y0 := f.left+12, f.top+f.height-14
	c.line(x0, y0, x0+px, y0, "bar", 2, "")
	c.line(x0, y0-5, x0, y0+5, "bar", 1.5, "")
	c.line(x0+px, y0-5, x0+px, y0+5, "bar", 1.5, "")
	c.text(x0+px/2, y0-7, strconv.FormatFloat(l, 'g', 4, 64)+" "+unit, "small label", "middle")
}

// senseClass returns the CSS class and the sense word of an axial force.
func senseClass(t, tol float64) string {
	switch {
	case t > tol:
		return "tension"
	case t < -tol:
		return "compression"
	}
	return "zero"
}

// legend draws the key of line styles with units, and returns the y below it.
func (c *canvas) legend(x, y float64, forceUnit, lengthUnit string, withExternal bool) float64 {
	items := []struct{ class, text string }{
		{"tension", "Tension (axial force > 0), continuous"},
		{"compression", "Compression (axial force < 0), dash-dot"},
		{"zero", "Zero force, dotted"},
	}
	for k, it := range items {
		xx := x + float64(k)*320
		c.line(xx, y, xx+36, y, it.class, 2.5, "")
		c.text(xx+44, y+4, it.text, "small", "start")
	}
	y += 20
	if withExternal {
		c.line(x, y, x+36, y, "load", 2, ` marker-end="url(#arrow)"`)
		c.text(x+44, y+4, "Load, "+forceUnit, "small", "start")
		c.line(x+320, y, x+356, y, "reaction", 2, ` marker-end="url(#arrow-reaction)"`)
		c.text(x+364, y+4, "Reaction (open head), "+forceUnit, "small", "start")
		y += 20
	}
	c.text(x, y+4, "Lengths in "+lengthUnit+", forces in "+forceUnit+"; tension positive. Line width in the form diagram grows with |axial force|.", "small", "start")
	return y + 20
}

// caption draws the title and the caution, returning the y below them.
func (c *canvas) caption(x, y float64, title string, notes ...string) float64 {
	c.text(x, y, title, "title", "start")
	y += 18
	for _, n := range notes {
		c.text(x, y, n, "small", "start")
		y += 16
	}
	c.text(x, y, Caution, "small", "start")
	return y + 16
}

func unitOr(s, def string) string {
	if s == "" {
		return def
	}
	return s
}

// support draws the symbol of a support at the node drawn at (x, y): a
// clamp (the in-plane rotation held) as a hatched block beside the node, a
// pin (both directions held) as a triangle on a hatched ground line, and a
// roller (one direction held) as a triangle on a line set off by a gap,
// turned to push along the held direction. held names the held components
// (model.X, model.Y, model.RZ). The symbols follow textbook practice
// (common practice) and are drawn in InkColour.
func (c *canvas) support(x, y float64, held [6]bool) {
	hatch := func(x0, y0, x1 float64) {
		c.line(x0, y0, x1, y0, "hatch", 1.3, "")
		for hx := x0 + 3; hx <= x1; hx += 4 {
			c.line(hx, y0, hx-4, y0+4, "hatch", 0.9, "")
		}
	}
	switch {
	case held[5] && held[0] && held[1]: // clamp
		c.printf(`<rect x="%s" y="%s" width="16" height="7" class="support"/>`+"\n", num(x-8), num(y+3))
		hatch(x-9, y+10, x+9)
	case held[0] && held[1]: // pin
		c.printf(`<path d="M%s,%s L%s,%s L%s,%s z" class="support"/>`+"\n", num(x), num(y+3), num(x-7), num(y+14), num(x+7), num(y+14))
		hatch(x-10, y+14, x+10)
	case held[1]: // roller, holding y
		c.printf(`<path d="M%s,%s L%s,%s L%s,%s z" class="support"/>`+"\n", num(x), num(y+3), num(x-7), num(y+13), num(x+7), num(y+13))
		c.line(x-10, y+16, x+10, y+16, "hatch", 1.3, "")
	case held[0]: // roller, holding x
		c.printf(`<path d="M%s,%s L%s,%s L%s,%s z" class="support"/>`+"\n", num(x-3), num(y), num(x-13), num(y-7), num(x-13), num(y+7))
		c.line(x-16, y-10, x-16, y+10, "hatch", 1.3, "")
	default: // springs or a held rotation alone: a small open square
		c.printf(`<rect x="%s" y="%s" width="8" height="8" class="support"/>`+"\n", num(x-4), num(y+3))
	}
}
