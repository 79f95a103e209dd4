package reciprocal

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

// TestReciprocalOfReciprocal redraws the Pratt truss from its own force
// diagram starting from a scrambled form. Reciprocal figures are mutual
// (J. C. Maxwell, "On reciprocal figures and diagrams of forces", Phil.
// Mag. 27, 1864, and "On reciprocal figures, frames and diagrams of forces",
// Trans. R. Soc. Edinburgh 26, 1870, from memory), and a triangulated
// truss's only parallel redrawings are similarities with the same
// directions (dilations and translations, common practice), so: with no
// node fixed the result is a dilation of the original, and with the two
// supports fixed it is the original itself. A load at the top middle node
// keeps the centre vertical from being a zero-force member, whose direction
// a force diagram cannot fix.
func TestReciprocalOfReciprocal(t *testing.T) {
	xy, ends, loads, sup := prattTruss()
	loads[6] = [2]float64{0, -10}
	m := newModel(xy, ends)
	axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for v := range m.Coords {
		m.Coords[v] += 0.6 * (rng.Float64() - 0.5)
	}
	t.Run("free", func(t *testing.T) {
		r, err := Reverse(context.Background(), m, d, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		// A similarity with the original's directions fits exactly.
		original := make([]float64, 0, 2*len(xy))
		for _, p := range xy {
			original = append(original, p[0], p[1])
		}
		if misfit, scale := similarityResidual(original, r.Coords); misfit > 1e-10 || math.Abs(scale) < 0.1 {
			t.Errorf("not a dilation of the original: scale %g, residual %g", scale, misfit)
		}
	})
	t.Run("perpendicular", func(t *testing.T) {
		orig := append([]float64{}, m.Coords...)
		defer copy(m.Coords, orig)
		for v, p := range xy {
			m.Coords[2*v], m.Coords[2*v+1] = p[0], p[1]
		}
		dp, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions), Perpendicular: true})
		if err != nil {
			t.Fatal(err)
		}
		copy(m.Coords, orig)
		copy(m.Coords[0:2], xy[0][:])
		copy(m.Coords[8:10], xy[4][:])
		fixed := make([]bool, len(xy))
		fixed[0], fixed[4] = true, true
		r, err := Reverse(context.Background(), m, dp, nil, fixed)
		if err != nil {
			t.Fatal(err)
		}
		for v, p := range xy {
			if math.Abs(r.Coords[2*v]-p[0]) > 1e-10 || math.Abs(r.Coords[2*v+1]-p[1]) > 1e-10 {
				t.Errorf("node %d at (%g, %g), want %v", v, r.Coords[2*v], r.Coords[2*v+1], p)
			}
		}
	})
	t.Run("supports fixed", func(t *testing.T) {
		fixed := make([]bool, len(xy))
		fixed[0], fixed[4] = true, true
		copy(m.Coords[0:2], xy[0][:])
		copy(m.Coords[8:10], xy[4][:])
		r, err := Reverse(context.Background(), m, d, nil, fixed)
		if err != nil {
			t.Fatal(err)
		}
		for v, p := range xy {
			if math.Abs(r.Coords[2*v]-p[0]) > 1e-10 || math.Abs(r.Coords[2*v+1]-p[1]) > 1e-10 {
				t.Errorf("node %d at (%g, %g), want %v", v, r.Coords[2*v], r.Coords[2*v+1], p)
			}
		}
	})
}

// TestReverseEdits edits the force diagram of the 3-4-5 roof truss. Moving
// point 1 from (−8, −6) to (−6, −6) keeps the tie horizontal and makes the
// rafters 45°: with the supports in place the apex rises to (4, 4), the
// rise at which the tie force H = P·L/(4f) is 6 kN for P = 12 kN, L = 8 m
// (three-hinged triangle, common practice). Moving it to (−8, −4) tilts the
// tie's segment, which no form with both supports fixed can follow: a
// NoSolution error naming the tie.
func TestReverseEdits(t *testing.T) {
	xy, ends, loads, sup := triangleTruss()
	m := newModel(xy, ends)
	axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
	if err != nil {
		t.Fatal(err)
	}
	one := labelIndex(t, d, "1")
	fixed := []bool{true, true, false}
	edit := func(p [2]float64) [][2]float64 {
		pts := append([][2]float64{}, d.Points...)
		pts[one] = p
		return pts
	}
	r, err := Reverse(context.Background(), m, d, edit([2]float64{-6, -6}), fixed)
	if err != nil {
		t.Fatal(err)
	}
	want := []float64{0, 0, 8, 0, 4, 4}
	for k, w := range want {
		if !scalar.EqualWithinAbsOrRel(r.Coords[k], w, 1e-12, 1e-12) {
			t.Errorf("coords %v, want %v", r.Coords, want)
			break
		}
	}
	_, err = Reverse(context.Background(), m, d, edit([2]float64{-8, -4}), fixed)
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.NoSolution {
		t.Fatalf("got %v", err)
	}
	if len(fe.Problems) != 1 || fe.Problems[0].Path != "/members/0" {
		t.Errorf("problems %v", fe.Problems)
	}
	// Freed, the same edit has a form: a triangle takes any three
	// directions (common practice).
	r, err = Reverse(context.Background(), m, d, edit([2]float64{-8, -4}), nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Residual > 1e-12 {
		t.Errorf("residual %g", r.Residual)
	}
}

// TestReverseCollapse edits the triangle's diagram so that the left rafter
// (member 1, node 0 to the apex) must be vertical and the right rafter
// (member 2, node 1 to the apex) horizontal, the tie staying horizontal,
// with both supports fixed: the vertical through (0, 0) and the horizontal
// through (8, 0) meet at (0, 0), so the only parallel form puts the apex on
// the left support and the left rafter has no length (plane geometry). That
// is no structure, and Reverse says so, naming the left rafter.
func TestReverseCollapse(t *testing.T) {
	xy, ends, loads, sup := triangleTruss()
	m := newModel(xy, ends)
	axial, reactions, _ := jointEquilibrium(t, m, loads, sup)
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: external(loads, reactions)})
	if err != nil {
		t.Fatal(err)
	}
	one := labelIndex(t, d, "1")
	pts := append([][2]float64{}, d.Points...)
	p := pts[one]
	direction := map[int][2]float64{0: {-5, 0}, 1: {0, 10}, 2: {10, 0}}
	for e, dir := range direction {
		other := d.Members[e].Left
		if other == one {
			other = d.Members[e].Right
		}
		pts[other] = [2]float64{p[0] + dir[0], p[1] + dir[1]}
	}
	_, err = Reverse(context.Background(), m, d, pts, []bool{true, true, false})
	fe, ok := fault.As(err)
	if !ok || fe.Kind != fault.NoSolution {
		t.Fatalf("got %v, want a NoSolution error", err)
	}
	if len(fe.Problems) != 1 || fe.Problems[0].Path != "/members/1" {
		t.Errorf("problems %v, want the left rafter /members/1", fe.Problems)
	}
}
