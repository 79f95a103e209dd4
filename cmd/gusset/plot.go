package main

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gusset/cmd/gusset/adapter"
	"gusset/protocol"
)

// plotSweep draws a one-parameter sweep's volume curve with the refined
// optimum marked, and writes it as SVG.
func plotSweep(file string, sw protocol.SweepResult, bestX, bestY float64) error {
	p := plot.New()
	p.Title.Text = "Steel volume against truss depth"
	p.X.Label.Text = sw.Parameters[0] + " (m)\n\n" + adapter.Caution
	p.X.Label.TextStyle.Font.Size = vg.Points(8)
	p.Y.Label.Text = "volume (m³)"
	var pts plotter.XYs
	for _, s := range sw.Steps {
		if v, ok := s.Metrics["volume"]; ok && s.Error == "" {
			pts = append(pts, plotter.XY{X: s.Values[0], Y: v})
		}
	}
	line, points, err := plotter.NewLinePoints(pts)
	if err != nil {
		return err
	}
	line.Color = color.RGBA{R: 40, G: 90, B: 150, A: 255}
	line.Width = vg.Points(1.5)
	points.Shape = draw.CircleGlyph{}
	points.Color = line.Color
	optimum, err := plotter.NewScatter(plotter.XYs{{X: bestX, Y: bestY}})
	if err != nil {
		return err
	}
	optimum.Shape = draw.PyramidGlyph{}
	optimum.Radius = vg.Points(5)
	optimum.Color = color.RGBA{R: 200, G: 70, B: 30, A: 255}
	p.Add(plotter.NewGrid(), line, points, optimum)
	p.Legend.Add("sweep steps", line, points)
	p.Legend.Add(fmt.Sprintf("least volume: %.3f m³ at %.3f m", bestY, bestX), optimum)
	p.Legend.Top = true
	p.Legend.TextStyle.Font.Size = vg.Points(9)
	p.Legend.Padding = vg.Points(4)
	// Thumbnails on the left, placed over the flat middle of the curve:
	// renderers measure text differently, and text that grows to the
	// right cannot run into its symbol.
	p.Legend.Left = true
	p.Legend.XOffs = 2.5 * vg.Inch
	return p.Save(8*vg.Inch, 4.5*vg.Inch, file)
}
