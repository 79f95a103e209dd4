package reciprocal

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// sparseRedraw sends every redrawing down the sparse path until the test
// ends.
func sparseRedraw(t testing.TB) {
	old := denseRedrawColumns
	denseRedrawColumns = 0
	t.Cleanup(func() { denseRedrawColumns = old })
}

// TestReverseSparsePath runs the hand-checked redrawings (Maxwell's mutual
// figures, the roof truss edits and the collapse) on the sparse path.
func TestReverseSparsePath(t *testing.T) {
	sparseRedraw(t)
	t.Run("reciprocal of reciprocal", TestReciprocalOfReciprocal)
	t.Run("edits", TestReverseEdits)
	t.Run("collapse", TestReverseCollapse)
}

// scrambled returns a copy of m's coordinates moved at random by up to
// ±amount in x and y.
func scrambled(m *model.Model, amount float64, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 7))
	x := slices.Clone(m.Coords)
	for v := range x {
		x[v] += amount * (2*rng.Float64() - 1)
	}
	return x
}

// scrambledGrid builds the diagram of a loaded grid (loadedGrid) and then
// scrambles the model's coordinates by up to ±0.2, returning the model,
// the diagram and the original coordinates.
func scrambledGrid(t testing.TB, rows, cols int, seed uint64) (*model.Model, *Diagram, []float64) {
	m, axial, ext := loadedGrid(rows, cols, seed)
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: ext})
	if err != nil {
		t.Fatal(err)
	}
	original := slices.Clone(m.Coords)
	copy(m.Coords, scrambled(m, 0.2, seed))
	return m, d, original
}

// similarityResidual fits coords = s·original + (tx, ty) by least squares
// (gonum) and returns the largest misfit and the scale s.
func similarityResidual(original, coords []float64) (misfit, scale float64) {
	n := len(original) / 2
	a := mat.NewDense(2*n, 3, nil)
	for v := range n {
		a.SetRow(2*v, []float64{original[2*v], 1, 0})
		a.SetRow(2*v+1, []float64{original[2*v+1], 0, 1})
	}
	b := mat.NewVecDense(2*n, slices.Clone(coords))
	var fit, res mat.VecDense
	if err := fit.SolveVec(a, b); err != nil {
		return math.Inf(1), 0
	}
	res.MulVec(a, &fit)
	res.SubVec(&res, b)
	return mat.Norm(&res, math.Inf(1)), fit.AtVec(0)
}

// TestReverseSparseMatchesDense redraws a loaded triangulated grid from its
// own diagram, starting from scrambled coordinates, by both paths. A
// triangulated network's only parallel redrawings are similarities
// (common practice; reciprocal figures are mutual, Maxwell 1864), so both
// must return a dilation of the original, and as the same minimum-norm
// change (gonum's SVD is the reference). An edit the fixed boundary cannot
// follow must give the same least-squares form by both paths.
func TestReverseSparseMatchesDense(t *testing.T) {
	m, d, original := scrambledGrid(t, 9, 8, 3)
	defer copy(m.Coords, original)
	redraw := func(sparse bool, points [][2]float64, fixed []bool) (*Redrawn, error) {
		old := denseRedrawColumns
		defer func() { denseRedrawColumns = old }()
		if sparse {
			denseRedrawColumns = 0
		} else {
			denseRedrawColumns = math.MaxInt
		}
		return Reverse(context.Background(), m, d, points, fixed)
	}
	dense, err := redraw(false, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	sp, err := redraw(true, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range []*Redrawn{dense, sp} {
		if misfit, scale := similarityResidual(original, r.Coords); misfit > 1e-9 || scale < 0.1 {
			t.Errorf("not a dilation of the original: scale %g, misfit %g", scale, misfit)
		}
	}
	for v := range dense.Coords {
		if math.Abs(dense.Coords[v]-sp.Coords[v]) > 1e-9 {
			t.Fatalf("coordinate %d: dense %.12g, sparse %.12g", v, dense.Coords[v], sp.Coords[v])
		}
	}

	// Fix the nodes of the first row and move one interior space's point.
	fixed := make([]bool, m.NodeCount())
	for v := range 8 {
		fixed[v] = true
	}
	points := slices.Clone(d.Points)
	points[len(points)/2][0] += 0.3
	var nearest [2][]float64
	for k, useSparse := range []bool{false, true} {
		r, err := redraw(useSparse, points, fixed)
		if fe, ok := fault.As(err); ok && fe.Kind == fault.NoSolution {
			r = fe.Detail.(NoSolutionDetail).Nearest
		} else if err != nil {
			t.Fatal(err)
		}
		nearest[k] = r.Coords
	}
	for v := range nearest[0] {
		if math.Abs(nearest[0][v]-nearest[1][v]) > 1e-8 {
			t.Fatalf("edited, coordinate %d: dense %.12g, sparse %.12g", v, nearest[0][v], nearest[1][v])
		}
	}
}

// TestReverseLargeNetwork redraws a loaded grid of about 5,000 members
// (2·1,700 free coordinates, beyond the dense path) from scrambled
// coordinates: the result must again be a dilation of the original.
func TestReverseLargeNetwork(t *testing.T) {
	m, d, original := scrambledGrid(t, 40, 40, 5)
	r, err := Reverse(context.Background(), m, d, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	if misfit, scale := similarityResidual(original, r.Coords); misfit > 1e-8 || scale < 0.1 {
		t.Errorf("%d members: not a dilation of the original: scale %g, misfit %g", len(m.Members), scale, misfit)
	}
}

// BenchmarkReverse times redrawing loaded grids of about 1k, 10k and 100k
// members from their own diagrams, all nodes free.
func BenchmarkReverse(b *testing.B) {
	for _, side := range []int{18, 58, 183} {
		m, d, _ := scrambledGrid(b, side, side, 1)
		b.Run(fmt.Sprintf("members=%d", len(m.Members)), func(b *testing.B) {
			for b.Loop() {
				if _, err := Reverse(context.Background(), m, d, nil, nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
