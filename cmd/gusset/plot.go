package main

import (
	"fmt"
	"math"
	"os"

	"gusset/engine/render"
	"gusset/protocol"
)

// plotSweep draws a one-parameter sweep's volume curve with the refined
// optimum marked, in the pictures' style (engine/render's Chart), and
// writes it as SVG.
func plotSweep(file string, sw protocol.SweepResult, bestX, bestY float64) error {
	series := render.Series{Name: "steel volume at each sweep step"}
	for _, s := range sw.Steps {
		v, ok := s.Metrics["volume"]
		if !ok || s.Error != "" {
			v = math.NaN() // a failed step breaks the line
		}
		series.X = append(series.X, s.Values[0])
		series.Y = append(series.Y, v)
	}
	f, err := os.Create(file)
	if err != nil {
		return err
	}
	err = render.Chart(f, render.ChartSpec{
		Title:        "Steel volume against truss depth",
		XLabel:       sw.Parameters[0] + " (m)",
		YLabel:       "steel volume (m³)",
		Series:       []render.Series{series},
		Optimum:      &[2]float64{bestX, bestY},
		OptimumLabel: fmt.Sprintf("least volume %.3f m³ at %s %.3f m (refined by Brent's method)", bestY, sw.Parameters[0], bestX),
		Width:        760,
	})
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return err
}
