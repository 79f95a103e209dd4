package model

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

// TestSupportDirectionsRefused checks each bad directions field is
// refused with the pointer of the offending vector.
func TestSupportDirectionsRefused(t *testing.T) {
	for _, tc := range []struct {
		name, path, message string
		base                func() *Spec
		dirs                [][]float64
	}{
		{"two in a plane", "supports/1/directions", "takes one direction", triangle, [][]float64{{1, 0}, {0, 1}}},
		{"none", "supports/1/directions", "takes one direction", triangle, [][]float64{}},
		{"wrong length", "supports/1/directions/0", "has 3 entries", triangle, [][]float64{{1, 0, 0}}},
		{"zero", "supports/1/directions/0", "zero vector", triangle, [][]float64{{0, 0}}},
		{"non-finite", "supports/1/directions/0/1", "finite", triangle, [][]float64{{1, math.Inf(1)}}},
		{"three in space", "supports/0/directions", "one or two directions", portal, [][]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}},
		{"parallel", "supports/0/directions/1", "parallel", portal, [][]float64{{1, 1, 0}, {-2, -2, 1e-9}}},
		{"zero second", "supports/0/directions/1", "zero vector", portal, [][]float64{{1, 1, 0}, {0, 0, 0}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := tc.base()
			last := len(s.Supports) - 1
			if s.Dimension == 3 {
				last = 0
			}
			s.Supports[last].Directions = tc.dirs
			_, err := Compile(s)
			fe, ok := fault.As(err)
			if !ok || fe.Kind != fault.InvalidModel {
				t.Fatalf("got %v, want an invalid model", err)
			}
			if fe.Problems[0].Path != tc.path || !strings.Contains(fe.Problems[0].Message, tc.message) {
				t.Errorf("got %s: %s; want %s: …%s…", fe.Problems[0].Path, fe.Problems[0].Message, tc.path, tc.message)
			}
		})
	}
}

// TestSupportAxes checks the documented frames: a plane direction at 30°
// gives x = (cos30°, sin30°), y a quarter turn on; one space direction
// along global x gives the global axes, one along global z gives y =
// global y; two directions are orthonormalised (x along the first, y the
// first's normal part of the second: Gram–Schmidt, from memory) with
// z = x × y.
func TestSupportAxes(t *testing.T) {
	c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)
	for _, tc := range []struct {
		name string
		dim  int
		dirs [][3]float64
		want [3][3]float64
	}{
		{"plane 30°", 2, [][3]float64{{2 * c, 2 * s, 0}}, [3][3]float64{{c, s, 0}, {-s, c, 0}, {0, 0, 1}}},
		{"space along x", 3, [][3]float64{{3, 0, 0}}, [3][3]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}},
		{"space along y", 3, [][3]float64{{0, 1, 0}}, [3][3]float64{{0, 1, 0}, {-1, 0, 0}, {0, 0, 1}}},
		{"space along z", 3, [][3]float64{{0, 0, 2}}, [3][3]float64{{0, 0, 1}, {0, 1, 0}, {-1, 0, 0}}},
		{"space two", 3, [][3]float64{{0, 0, 5}, {1, 0, 1}}, [3][3]float64{{0, 0, 1}, {1, 0, 0}, {0, 1, 0}}},
	} {
		axes, ok := supportAxes(tc.dim, tc.dirs)
		if !ok {
			t.Fatalf("%s: refused", tc.name)
		}
		for i := range 3 {
			for j := range 3 {
				if !scalar.EqualWithinAbs(axes[i][j], tc.want[i][j], 1e-15) {
					t.Errorf("%s: axes[%d][%d] = %g, want %g", tc.name, i, j, axes[i][j], tc.want[i][j])
				}
			}
		}
	}
}

// TestSupportDirectionsCompiled checks a compiled inclined support: its
// axes and NodeAxes, and a plain model has none.
func TestSupportDirectionsCompiled(t *testing.T) {
	s := triangle()
	s.Supports[1].Directions = [][]float64{{1, 1}}
	m, err := Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	sup := m.Supports[1]
	r := 1 / math.Sqrt2
	if !sup.Inclined || !scalar.EqualWithinAbs(sup.Axes[0][0], r, 1e-15) || !scalar.EqualWithinAbs(sup.Axes[1][0], -r, 1e-15) {
		t.Errorf("axes %v", sup.Axes)
	}
	if axes := NodeAxes(m); axes == nil || axes[sup.Node] != &m.Supports[1].Axes || axes[0] != nil {
		t.Errorf("NodeAxes %v", axes)
	}
	m, err = Compile(triangle())
	if err != nil {
		t.Fatal(err)
	}
	if NodeAxes(m) != nil {
		t.Error("a model without inclined supports has node axes")
	}
}
