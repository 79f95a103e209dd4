package render

import (
	"fmt"
	"io"
	"math"
	"strconv"
)

// Series is one line of a chart: points (X[i], Y[i]) joined in order.
// Points whose Y is NaN are left out and break the line (a failed step).
type Series struct {
	Name string
	X, Y []float64
}

// ChartSpec describes a line chart.
type ChartSpec struct {
	// Title heads the chart.
	Title string
	// XLabel and YLabel name the axes with their units: "depth (m)".
	XLabel, YLabel string
	// Series are drawn in TensionColour, continuous, with dots; a second
	// and third series in CompressionColour dash-dot and LoadColour.
	Series []Series
	// Optimum, when set, is marked with a diamond and labelled with
	// OptimumLabel.
	Optimum      *[2]float64
	OptimumLabel string
	// Notes are extra caption lines above the caution.
	Notes []string
	// Width and Height are the picture's size in pixels; 0 means 720×420.
	Width, Height float64
}

// chartStyles are the line classes of successive series.
var chartStyles = []string{"tension", "compression", "load"}

// Chart writes an SVG line chart in the pictures' style: the one font,
// margins measured from the tick labels, axis labels with units, the
// optimum marked, a legend below the plot and the caution. It returns the
// first write error.
func Chart(w io.Writer, spec ChartSpec) error {
	width, height := spec.Width, spec.Height
	if width <= 0 {
		width = 720
	}
	if height <= 0 {
		height = 420
	}
	xs, ys := emptyBox(), emptyBox()
	for _, s := range spec.Series {
		for i := range s.X {
			if i < len(s.Y) && finite(s.X[i]) && finite(s.Y[i]) {
				xs.add([2]float64{s.X[i], s.Y[i]})
			}
		}
	}
	if spec.Optimum != nil {
		xs.add(*spec.Optimum)
	}
	ys = xs
	if xs.maxX < xs.minX {
		xs = box{0, 0, 1, 1}
		ys = xs
	}
	xTicks := niceTicks(xs.minX, xs.maxX, 8)
	yTicks := niceTicks(ys.minY, ys.maxY, 6)
	yLabelWidth := 0.0
	for _, t := range yTicks {
		yLabelWidth = math.Max(yLabelWidth, textWidth(tickText(t, yTicks), SmallFontSize, false))
	}
	legendLines := len(spec.Series)
	if spec.Optimum != nil {
		legendLines++
	}
	captionLines := len(spec.Notes) + 1
	left := 18 + SmallFontSize + 8 + yLabelWidth + 8 // axis label, gap, tick labels, gap
	right := 24.0 + textWidth(tickText(xTicks[len(xTicks)-1], xTicks), SmallFontSize, false)/2
	top := 40.0
	bottom := 19 + SmallFontSize + 10 + FontSize + 14 + float64(legendLines)*18 + float64(captionLines)*16 + 8
	plot := frameChart{left: left, top: top, width: width - left - right, height: height - top - bottom,
		x0: xTicks[0], x1: xTicks[len(xTicks)-1], y0: yTicks[0], y1: yTicks[len(yTicks)-1]}
	if plot.height < 60 {
		height += 60 - plot.height
		plot.height = 60
	}
	c := newCanvas(w, width, height)
	c.text(18, 26, spec.Title, "title", "start")
	plot.axes(c, xTicks, yTicks, spec.XLabel, spec.YLabel)
	for k, s := range spec.Series {
		plot.series(c, s, chartStyles[k%len(chartStyles)])
	}
	y := top + plot.height + 19 + SmallFontSize + 10 + FontSize + 18
	if spec.Optimum != nil {
		px, py := plot.px(spec.Optimum[0]), plot.py(spec.Optimum[1])
		c.printf(`<path d="M%s,%s l7,7 l-7,7 l-7,-7 z" fill="%s" stroke="#ffffff" stroke-width="1"/>`+"\n", num(px), num(py-7), CompressionColour)
		c.placed = append(c.placed, rect{px - 8, py - 8, px + 8, py + 8})
	}
	for k, s := range spec.Series {
		c.line(18, y-4, 54, y-4, chartStyles[k%len(chartStyles)], 2, "")
		c.circle(36, y-4, 2.6, styleColour(chartStyles[k%len(chartStyles)]))
		c.text(62, y, s.Name, "small", "start")
		y += 18
	}
	if spec.Optimum != nil {
		c.printf(`<path d="M36,%s l6,6 l-6,6 l-6,-6 z" fill="%s"/>`+"\n", num(y-10), CompressionColour)
		c.text(62, y, spec.OptimumLabel, "small", "start")
		y += 18
	}
	for _, n := range spec.Notes {
		c.text(18, y+4, n, "small", "start")
		y += 16
	}
	c.text(18, y+4, Caution, "small", "start")
	return c.close()
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// textWidth estimates a text's width in pixels from its font size: 0.62
// em per character, 0.68 bold (see canvas.label).
func textWidth(s string, size float64, bold bool) float64 {
	em := 0.62
	if bold {
		em = 0.68
	}
	return em * size * float64(len([]rune(s)))
}

func styleColour(class string) string {
	switch class {
	case "compression":
		return CompressionColour
	case "load":
		return LoadColour
	}
	return TensionColour
}

// niceTicks returns about n round tick values (1, 2 or 5 × 10ᵏ apart)
// covering [lo, hi] (common practice for chart axes).
func niceTicks(lo, hi float64, n int) []float64 {
	if hi <= lo {
		d := math.Max(math.Abs(lo)*0.1, 1)
		lo, hi = lo-d, hi+d
	}
	// The smallest 1, 2 or 5 × 10ᵏ step that needs at most n−1 intervals.
	raw := (hi - lo) / float64(n-1)
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	step := 10 * p
	for _, k := range []float64{5, 2, 1} {
		if k*p >= raw {
			step = k * p
		}
	}
	start := math.Floor(lo/step) * step
	var ticks []float64
	for v := start; v < hi+step*0.999; v += step {
		ticks = append(ticks, math.Round(v/step)*step)
	}
	if len(ticks) < 2 {
		ticks = append(ticks, ticks[0]+step)
	}
	return ticks
}

// tickText formats a tick with as many decimals as its step needs.
func tickText(v float64, ticks []float64) string {
	step := ticks[1] - ticks[0]
	decimals := max(0, int(-math.Floor(math.Log10(step)+1e-9)))
	if v == 0 {
		v = 0 // no negative zero
	}
	return strconv.FormatFloat(v, 'f', decimals, 64)
}

// frameChart maps data to the plot area.
type frameChart struct {
	left, top, width, height float64
	x0, x1, y0, y1           float64
}

func (f frameChart) px(x float64) float64 { return f.left + (x-f.x0)/(f.x1-f.x0)*f.width }
func (f frameChart) py(y float64) float64 { return f.top + (f.y1-y)/(f.y1-f.y0)*f.height }

func (f frameChart) axes(c *canvas, xTicks, yTicks []float64, xLabel, yLabel string) {
	for _, t := range xTicks {
		x := f.px(t)
		c.line(x, f.top, x, f.top+f.height, "frame", 0.8, "")
		c.text(x, f.top+f.height+19, tickText(t, xTicks), "small", "middle")
	}
	for _, t := range yTicks {
		y := f.py(t)
		c.line(f.left, y, f.left+f.width, y, "frame", 0.8, "")
		c.text(f.left-8, y+4, tickText(t, yTicks), "small", "end")
	}
	c.printf(`<rect x="%s" y="%s" width="%s" height="%s" fill="none" stroke="#666666" stroke-width="1"/>`+"\n",
		num(f.left), num(f.top), num(f.width), num(f.height))
	c.text(f.left+f.width/2, f.top+f.height+19+SmallFontSize+14, xLabel, "", "middle")
	cx, cy := 18+SmallFontSize, f.top+f.height/2
	c.printf(`<text x="%s" y="%s" text-anchor="middle" transform="rotate(-90 %s %s)">%s</text>`+"\n",
		num(cx), num(cy), num(cx), num(cy), escape(yLabel))
}

func (f frameChart) series(c *canvas, s Series, class string) {
	path := ""
	pen := false
	for i := range s.X {
		if i >= len(s.Y) || !finite(s.X[i]) || !finite(s.Y[i]) {
			pen = false
			continue
		}
		cmd := "L"
		if !pen {
			cmd = "M"
		}
		path += fmt.Sprintf("%s%s,%s ", cmd, num(f.px(s.X[i])), num(f.py(s.Y[i])))
		pen = true
	}
	c.printf(`<path d="%s" class="%s" stroke-width="2"/>`+"\n", path, class)
	for i := range s.X {
		if i < len(s.Y) && finite(s.X[i]) && finite(s.Y[i]) {
			c.circle(f.px(s.X[i]), f.py(s.Y[i]), 2.6, styleColour(class))
		}
	}
}
