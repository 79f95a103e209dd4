package render

import (
	"bytes"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestBeams3DCantilever draws a space cantilever along global x, fixed at
// the origin, with a load P down (global −z) at its tip. Its moment is
// hogging, M(x) = P(L − x) in magnitude with the top fibre in tension
// (statics, common practice); with the default local y along global z,
// that is Mz = −P(L − x) and My = 0 in the stiffness results' sign
// convention. The Mz diagram must stand on the top (the tension side),
// its ordinate at the root P·L over the stated scale, and the My diagram
// must be flat; no label may collide.
func TestBeams3DCantilever(t *testing.T) {
	const P, L = 10.0, 4.0
	m := &model.Model{Dim: 3, Units: model.UnitsSpec{Length: "m", Force: "kN"},
		NodeIDs: []string{"root", "tip"}, Coords: []float64{0, 0, 0, L, 0, 0},
		Members:  []model.Member{{ID: "c", Ends: [2]int{0, 1}, Kind: model.Beam}},
		Supports: []model.Support{{Node: 0, Fixed: [6]bool{true, true, true, true, true, true}}}}
	bc := BeamCurve{Member: 0, PeakMoment: [2]float64{-P * L, 0}, PeakDisplacement: [2]float64{0.01, L}}
	for k := range 5 {
		x := L * float64(k) / 4
		bc.Stations = append(bc.Stations, x)
		bc.Moment = append(bc.Moment, -P*(L-x))
		bc.MomentY = append(bc.MomentY, 0)
		// The tip deflection shape P x²(3L − x)/(6EI), scaled to 1 cm at
		// the tip (Gere & Timoshenko, Mechanics of Materials, table of
		// cantilever deflections; from memory).
		bc.Displacements = append(bc.Displacements, []float64{0, 0, -0.01 * x * x * (3*L - x) / (2 * L * L * L)})
	}
	var b bytes.Buffer
	if err := Beams3D(&b, m, [][]float64{{0, 0, 0}, {0, 0, -0.01}}, []BeamCurve{bc}, Options{}); err != nil {
		t.Fatal(err)
	}
	doc := b.String()
	parseSVG(t, b.Bytes())
	polys := regexp.MustCompile(`<polygon points="([^"]*)"`).FindAllStringSubmatch(doc, -1)
	if len(polys) != 2 {
		t.Fatalf("%d moment polygons, want 2 (Mz and My)", len(polys))
	}
	point := func(s string) [2]float64 {
		xy := strings.Split(s, ",")
		x, _ := strconv.ParseFloat(xy[0], 64)
		y, _ := strconv.ParseFloat(xy[1], 64)
		return [2]float64{x, y}
	}
	mz := strings.Fields(polys[0][1])
	root, ordinate := point(mz[0]), point(mz[1])
	if !(ordinate[1] < root[1]-5) || math.Abs(ordinate[0]-root[0]) > 1e-6 {
		t.Errorf("Mz ordinate at the root drawn at %v from %v: want straight up (the top fibre is in tension)", ordinate, root)
	}
	scale := regexp.MustCompile(`1 m of drawing = ([0-9.e+]+) kN·m`).FindStringSubmatch(doc)
	if scale == nil {
		t.Fatal("no moment scale in the caption")
	}
	s, _ := strconv.ParseFloat(scale[1], 64)
	// Up the screen is global z in the isometric view, so the ordinate
	// P·L/s model units long is drawn at the panel's pixels per unit: the
	// member's drawn length over L times cos 30°.
	tip := point(mz[len(mz)-1])
	perUnit := math.Hypot(tip[0]-root[0], tip[1]-root[1]) / L
	if got, want := root[1]-ordinate[1], P*L/s*perUnit; math.Abs(got-want) > 0.02*want {
		t.Errorf("Mz ordinate at the root %.2f px, want P·L/scale = %.2f px", got, want)
	}
	for _, q := range strings.Fields(polys[1][1]) {
		p := point(q)
		// The My band is flat: every point lies on the member's line.
		r0 := point(strings.Fields(polys[1][1])[0])
		if math.Abs((p[1]-r0[1])*(tip[0]-root[0])-(p[0]-r0[0])*(tip[1]-root[1])) > 1e-3*perUnit*perUnit {
			t.Errorf("My band point %v off the member line", p)
		}
	}
	rep, err := CheckLabels(b.Bytes())
	if err != nil || rep.Defects() != 0 {
		t.Errorf("label defects %v (%v)", rep, err)
	}
	if !strings.Contains(doc, Caution) {
		t.Error("no caution")
	}
}
