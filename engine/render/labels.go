package render

import (
	"math"
	"strings"
)

// segment is a drawn line in picture coordinates.
type segment struct{ x1, y1, x2, y2 float64 }

// arrowheadBox returns the box an arrowhead marker covers at the end
// (x2, y2) of a line: ArrowheadSize long and wide, its tip at the end,
// whatever the line's width (the markers are sized in pixels).
func arrowheadBox(x1, y1, x2, y2 float64) rect {
	size := ArrowheadSize
	l := math.Max(math.Hypot(x2-x1, y2-y1), 1e-9)
	cx, cy := x2-(x2-x1)/l*size/2, y2-(y2-y1)/l*size/2
	return rect{cx - size/2, cy - size/2, cx + size/2, cy + size/2}
}

// hits reports whether the segment crosses or touches the box, by
// clipping it to the box (Liang and Barsky, "A new concept and method for
// line clipping", ACM TOG 3(1), 1984; from memory).
func (s segment) hits(r rect) bool {
	t0, t1 := 0.0, 1.0
	dx, dy := s.x2-s.x1, s.y2-s.y1
	for _, pq := range [4][2]float64{{-dx, s.x1 - r.x0}, {dx, r.x1 - s.x1}, {-dy, s.y1 - r.y0}, {dy, r.y1 - s.y1}} {
		p, q := pq[0], pq[1]
		if p == 0 {
			if q < 0 {
				return false
			}
			continue
		}
		t := q / p
		if p < 0 {
			t0 = math.Max(t0, t)
		} else {
			t1 = math.Min(t1, t)
		}
		if t0 > t1 {
			return false
		}
	}
	return true
}

// labelBox estimates a label's box from its font size: an average glyph
// width of 0.62 em (0.68 em bold), ascent 0.8 em and descent 0.25 em, and
// a pixel of margin, close enough for the sans fonts of the style (common
// practice for label placement without font metrics).
func labelBox(x, y float64, s, class, anchor string) rect {
	size := FontSize
	if strings.Contains(class, "small") {
		size = SmallFontSize
	}
	if strings.Contains(class, "title") {
		size = TitleFontSize
	}
	w := textWidth(s, size, strings.Contains(class, "space") || strings.Contains(class, "title"))
	x0 := x
	switch anchor {
	case "middle":
		x0 = x - w/2
	case "end":
		x0 = x - w
	}
	return rect{x0 - 1, y - 0.8*size - 1, x0 + w + 1, y + 0.25*size + 1}
}

// label writes a text at the best of a few positions near (x, y): the
// positions given by steps (multiples of the text's width and height)
// first, then rings further out. The first position whose box overlaps
// no label placed before, no arrowhead and no drawn segment wins; failing
// that, the first that overlaps no label or arrowhead (the label's white
// halo keeps it readable over a line); failing that, (x, y). A label that
// ends up more than a line's height from its point gets a thin leader
// line back to it.
func (c *canvas) label(x, y float64, s, class, anchor string, steps [][2]float64) {
	candidates := labelCandidates(x, y, s, class, anchor, steps)
	best, fallback := c.clearCandidate(candidates, s, class, anchor)
	at := [2]float64{x, y}
	switch {
	case best >= 0:
		at = candidates[best]
	case fallback >= 0:
		at = candidates[fallback]
	}
	c.placeLabel(x, y, at, s, class, anchor)
}

// placement says where labelIfClear may put a text: the steps to try
// (as label's), whether to try label's rings further out too, whether
// the text may lie over a drawn line (on its white halo), and, when
// bounded, the box it must stay inside.
type placement struct {
	steps     [][2]float64
	rings     bool
	overLines bool
	bounded   bool
	within    rect
}

// labelIfClear writes a text like label, but only at a position p allows
// whose box overlaps no label and no arrowhead; it reports whether it
// found one (and wrote the text).
func (c *canvas) labelIfClear(x, y float64, s, class, anchor string, p placement) bool {
	candidates := labelCandidates(x, y, s, class, anchor, p.steps)
	if !p.rings {
		candidates = candidates[:len(p.steps)]
	}
	if p.bounded {
		kept := candidates[:0]
		for _, q := range candidates {
			if b := labelBox(q[0], q[1], s, class, anchor); b.x0 >= p.within.x0 && b.x1 <= p.within.x1 && b.y0 >= p.within.y0 && b.y1 <= p.within.y1 {
				kept = append(kept, q)
			}
		}
		candidates = kept
	}
	best, fallback := c.clearCandidate(candidates, s, class, anchor)
	if best < 0 && p.overLines {
		best = fallback
	}
	if best < 0 {
		return false
	}
	c.placeLabel(x, y, candidates[best], s, class, anchor)
	return true
}

// labelCandidates lists the positions label tries for a text at (x, y):
// the steps first, then three rings of 16 further out.
func labelCandidates(x, y float64, s, class, anchor string, steps [][2]float64) [][2]float64 {
	b0 := labelBox(x, y, s, class, anchor)
	w, h := b0.x1-b0.x0, b0.y1-b0.y0
	candidates := make([][2]float64, 0, len(steps)+48)
	for _, st := range steps {
		candidates = append(candidates, [2]float64{x + st[0]*(w+2), y + st[1]*(h+2)})
	}
	for _, r := range []float64{1.6, 2.6, 3.8} {
		for k := range 16 {
			a := float64(k) * math.Pi / 8
			candidates = append(candidates, [2]float64{x + r*math.Cos(a)*(w/2+h), y + r*math.Sin(a)*h*1.3})
		}
	}
	return candidates
}

// clearCandidate returns the first candidate clear of labels, arrowheads,
// hinge marks and segments (best) and the first clear of labels,
// arrowheads and hinge marks only (fallback), each -1 when there is none.
func (c *canvas) clearCandidate(candidates [][2]float64, s, class, anchor string) (best, fallback int) {
	best, fallback = -1, -1
	for i, p := range candidates {
		b := labelBox(p[0], p[1], s, class, anchor)
		if c.collides(b, c.placed) || c.collides(b, c.heads) || c.collides(b, c.marks) {
			continue
		}
		if fallback < 0 {
			fallback = i
		}
		if !c.crossesSegment(b) {
			return i, fallback
		}
	}
	return best, fallback
}

// placeLabel writes a text chosen for the point (x, y) at at, with a
// leader line back to the point when it stands more than a line's height
// away, and remembers its box.
func (c *canvas) placeLabel(x, y float64, at [2]float64, s, class, anchor string) {
	b0 := labelBox(x, y, s, class, anchor)
	h := b0.y1 - b0.y0
	b := labelBox(at[0], at[1], s, class, anchor)
	if d := math.Hypot(at[0]-x, at[1]-y); d > 1.5*h {
		// Leader from the label's nearest edge point to its anchor point's
		// box centre, drawn before the text so the halo covers its end.
		ax, ay := (b0.x0+b0.x1)/2, (b0.y0+b0.y1)/2
		lx, ly := math.Max(b.x0, math.Min(ax, b.x1)), math.Max(b.y0, math.Min(ay, b.y1))
		c.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" class="leader"/>`+"\n", num(lx), num(ly), num(ax), num(ay))
	}
	c.placed = append(c.placed, b)
	c.text(at[0], at[1], s, class, anchor)
}

func (c *canvas) collides(b rect, boxes []rect) bool {
	for _, o := range boxes {
		if b.overlaps(o) {
			return true
		}
	}
	return false
}

func (c *canvas) crossesSegment(b rect) bool {
	for _, s := range c.segments {
		if s.hits(b) {
			return true
		}
	}
	return false
}
