package statics

import (
	"context"
	"math"
	"testing"

	"gusset/engine/model"
)

// incline turns the support at node n into one whose axes have rows x and
// y (z = ẑ, a plane model), fixing its local comps.
func incline(m *model.Model, n int, x, y [3]float64, comps ...int) {
	s := model.Support{Node: n, Inclined: true, Axes: [3][3]float64{x, y, {0, 0, 1}}}
	for _, c := range comps {
		s.Fixed[c] = true
	}
	for i := range m.Supports {
		if m.Supports[i].Node == n {
			m.Supports[i] = s
			return
		}
	}
	m.Supports = append(m.Supports, s)
}

// TestInclinedCounting checks Maxwell's rule with an inclined roller in
// its extended form b − dj + k = s − m (Maxwell 1864, extended by
// Pellegrino, Structural computations with the singular value
// decomposition of the equilibrium matrix, 1993, from memory): a triangle A(0,0), B(4,0), C(2,2) pinned at A and on a roller
// at B has b − dj + k = 3 − 6 + 3 = 0. On a 30° incline the three
// constraints are independent (s = m = 0); on a roller whose reaction
// runs along AB every reaction passes through A, so a rigid turn about A
// survives (m = 1) and AB with the two horizontal reactions holds a
// self-stress (s = 1). In the mechanism B moves vertically (global axes)
// and C normal to AC.
func TestInclinedCounting(t *testing.T) {
	coords := []float64{0, 0, 4, 0, 2, 2}
	bars := [][2]int{{0, 1}, {1, 2}, {0, 2}}
	c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)

	m := frame(2, coords, bars, model.Bar, map[int][]int{0: pin})
	incline(m, 1, [3]float64{c, s, 0}, [3]float64{-s, c, 0}, model.Y)
	r, err := Analyse(context.Background(), m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if r.Constraints != 3 || r.Mechanisms != 0 || r.SelfStress != 0 {
		t.Errorf("30° roller: k = %d, m = %d, s = %d; want 3, 0, 0", r.Constraints, r.Mechanisms, r.SelfStress)
	}

	m = frame(2, coords, bars, model.Bar, map[int][]int{0: pin})
	incline(m, 1, [3]float64{0, 1, 0}, [3]float64{-1, 0, 0}, model.Y)
	if r, err = Analyse(context.Background(), m, Options{}); err != nil {
		t.Fatal(err)
	}
	if r.Constraints != 3 || r.Mechanisms != 1 || r.SelfStress != 1 {
		t.Fatalf("roller along AB: k = %d, m = %d, s = %d; want 3, 1, 1", r.Constraints, r.Mechanisms, r.SelfStress)
	}
	mode := r.MechanismModes[0]
	if math.Abs(mode[2]) > 1e-9 || mode[3] == 0 {
		t.Errorf("B moves (%g, %g), want vertical", mode[2], mode[3])
	}
	if dot := 2*mode[4] + 2*mode[5]; math.Abs(dot) > 1e-9 {
		t.Errorf("C moves (%g, %g), not normal to AC", mode[4], mode[5])
	}
}
