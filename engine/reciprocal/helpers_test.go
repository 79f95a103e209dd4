package reciprocal

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
)

// newModel builds a 2D model of bars directly (model.Compile is not needed
// for the geometry this package reads).
func newModel(xy [][2]float64, ends [][2]int) *model.Model {
	m := &model.Model{Dim: 2, Units: model.UnitsSpec{Length: "m", Force: "kN"}}
	for v, p := range xy {
		m.NodeIDs = append(m.NodeIDs, fmt.Sprintf("N%d", v))
		m.Coords = append(m.Coords, p[0], p[1])
	}
	for e, en := range ends {
		m.Members = append(m.Members, model.Member{ID: fmt.Sprintf("M%d", e), Ends: en})
	}
	return m
}

// support fixes the x and/or y reaction components of a node.
type support struct {
	node int
	x, y bool
}

// jointEquilibrium solves the equilibrium of every joint, Σ t·û + R + P = 0,
// for the axial forces t and the reactions R at the supports, by a
// minimum-norm least-squares solve (gonum SVD). For a statically
// determinate truss this is the method of joints (common practice); for an
// indeterminate one it is one admissible equilibrium state, which is all a
// reciprocal diagram needs. It is an independent check of Build: it knows
// nothing of faces or diagrams. It returns the largest equilibrium residual.
func jointEquilibrium(t *testing.T, m *model.Model, loads [][2]float64, supports []support) (axial []float64, reactions [][2]float64, residual float64) {
	t.Helper()
	n, ne := m.NodeCount(), len(m.Members)
	cols := ne
	type col struct{ node, comp int }
	var rcols []col
	for _, s := range supports {
		if s.x {
			rcols = append(rcols, col{s.node, 0})
		}
		if s.y {
			rcols = append(rcols, col{s.node, 1})
		}
	}
	cols += len(rcols)
	a := mat.NewDense(2*n, cols, nil)
	b := mat.NewVecDense(2*n, nil)
	for e, mb := range m.Members {
		i, j := mb.Ends[0], mb.Ends[1]
		dx, dy := m.Coords[2*j]-m.Coords[2*i], m.Coords[2*j+1]-m.Coords[2*i+1]
		l := math.Hypot(dx, dy)
		a.Set(2*i, e, dx/l)
		a.Set(2*i+1, e, dy/l)
		a.Set(2*j, e, -dx/l)
		a.Set(2*j+1, e, -dy/l)
	}
	for k, c := range rcols {
		a.Set(2*c.node+c.comp, ne+k, 1)
	}
	for v, p := range loads {
		b.SetVec(2*v, -p[0])
		b.SetVec(2*v+1, -p[1])
	}
	var svd mat.SVD
	if !svd.Factorize(a, mat.SVDThin) {
		t.Fatal("SVD failed")
	}
	var x mat.VecDense
	svd.SolveVecTo(&x, b, svd.Rank(1e-12))
	axial = make([]float64, ne)
	reactions = make([][2]float64, n)
	for e := range axial {
		axial[e] = x.AtVec(e)
	}
	for k, c := range rcols {
		reactions[c.node][c.comp] = x.AtVec(ne + k)
	}
	var r mat.VecDense
	r.MulVec(a, &x)
	r.SubVec(&r, b)
	residual = mat.Norm(&r, math.Inf(1))
	return axial, reactions, residual
}

// external sums loads and reactions per node.
func external(loads, reactions [][2]float64) [][2]float64 {
	out := make([][2]float64, len(loads))
	for v := range out {
		out[v] = [2]float64{loads[v][0] + reactions[v][0], loads[v][1] + reactions[v][1]}
	}
	return out
}

// gridTruss returns a jittered rows×cols grid of nodes with each cell split
// by a random diagonal: a planar triangulation by construction.
func gridTruss(rows, cols int, jitter float64, rng *rand.Rand) ([][2]float64, [][2]int) {
	var xy [][2]float64
	id := func(r, c int) int { return r*cols + c }
	for r := 0; r < rows; r++ {
		for c := 0; c < cols; c++ {
			jx, jy := 0.0, 0.0
			if r > 0 && r < rows-1 && c > 0 && c < cols-1 {
				jx, jy = jitter*(rng.Float64()-0.5), jitter*(rng.Float64()-0.5)
			}
			xy = append(xy, [2]float64{float64(c) + jx, float64(r) + jy})
		}
	}
	var ends [][2]int
	for r := 0; r < rows; r++ {
		for c := 0; c < cols; c++ {
			if c+1 < cols {
				ends = append(ends, [2]int{id(r, c), id(r, c+1)})
			}
			if r+1 < rows {
				ends = append(ends, [2]int{id(r, c), id(r+1, c)})
			}
			if r+1 < rows && c+1 < cols {
				if rng.IntN(2) == 0 {
					ends = append(ends, [2]int{id(r, c), id(r+1, c+1)})
				} else {
					ends = append(ends, [2]int{id(r, c+1), id(r+1, c)})
				}
			}
		}
	}
	return xy, ends
}

// airySelfStress returns the self-stress of a grid triangulation (see
// gridTruss) given heights at its nodes, with boundary heights 0 so the
// outer face lies in the plane z = 0: the slope jump of the piecewise-plane
// function across each member is its axial force, positive for a convex
// crease (tension in Airy's convention, see Lift). This is Maxwell's
// theorem read backwards (J. C. Maxwell, "On reciprocal figures and
// diagrams of forces", Phil. Mag. 1864; W. Whiteley, "Motions and stresses
// of projected polyhedra", Structural Topology 7, 1982, from memory): any
// lift of a plane network gives a state of self-stress. The forces are
// computed here from the grid's triangles, not from the package's faces.
func airySelfStress(xy [][2]float64, ends [][2]int, rows, cols int, heights []float64) []float64 {
	plane := func(a, b, c int) [3]float64 {
		m := mat.NewDense(3, 3, []float64{xy[a][0], xy[a][1], 1, xy[b][0], xy[b][1], 1, xy[c][0], xy[c][1], 1})
		var s mat.VecDense
		if err := s.SolveVec(m, mat.NewVecDense(3, []float64{heights[a], heights[b], heights[c]})); err != nil {
			panic(err)
		}
		return [3]float64{s.AtVec(0), s.AtVec(1), s.AtVec(2)}
	}
	type side struct {
		plane [3]float64
		third int
	}
	key := func(i, j int) [2]int { return [2]int{min(i, j), max(i, j)} }
	sides := map[[2]int][]side{}
	isEdge := map[[2]int]bool{}
	for _, e := range ends {
		isEdge[key(e[0], e[1])] = true
	}
	id := func(r, c int) int { return r*cols + c }
	for r := 0; r+1 < rows; r++ {
		for c := 0; c+1 < cols; c++ {
			a, b, cc, d := id(r, c), id(r, c+1), id(r+1, c+1), id(r+1, c)
			tris := [][3]int{{a, b, d}, {b, cc, d}}
			if isEdge[key(a, cc)] {
				tris = [][3]int{{a, b, cc}, {a, cc, d}}
			}
			for _, t := range tris {
				p := plane(t[0], t[1], t[2])
				for k := 0; k < 3; k++ {
					ed := key(t[k], t[(k+1)%3])
					sides[ed] = append(sides[ed], side{p, t[(k+2)%3]})
				}
			}
		}
	}
	z := func(g [3]float64, x [2]float64) float64 { return g[0]*x[0] + g[1]*x[1] + g[2] }
	out := make([]float64, len(ends))
	for e, en := range ends {
		s := sides[key(en[0], en[1])]
		var other [3]float64 // the outer face's plane z = 0
		if len(s) == 2 {
			other = s[1].plane
		}
		// The planes agree on the member's line, so their difference at
		// the third corner w, over w's distance to the line, is the slope
		// jump; positive when the crease is convex.
		p, q, w := xy[en[0]], xy[en[1]], xy[s[0].third]
		dist := math.Abs((q[0]-p[0])*(w[1]-p[1])-(q[1]-p[1])*(w[0]-p[0])) / math.Hypot(q[0]-p[0], q[1]-p[1])
		out[e] = (z(s[0].plane, w) - z(other, w)) / dist
	}
	return out
}
