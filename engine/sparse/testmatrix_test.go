package sparse

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/mat"
)

// Test matrices shared by the tests and benchmarks of this package.

// dense returns a as a gonum symmetric dense matrix.
func dense(a *Matrix) *mat.SymDense {
	d := mat.NewSymDense(a.N, nil)
	for j := 0; j < a.N; j++ {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			d.SetSym(a.RowIdx[p], j, a.Val[p])
		}
	}
	return d
}

// randomSPD returns a random symmetric matrix of the given pattern kind
// made positive definite by strict diagonal dominance (Gershgorin's circle
// theorem: every eigenvalue lies within a disc about a diagonal entry whose
// radius is the off-diagonal row sum, common practice).
func randomSPD(n int, kind string, seed uint64) *Matrix {
	rng := rand.New(rand.NewPCG(seed, 7))
	b := NewBuilder(n, 8*n)
	rowSum := make([]float64, n)
	add := func(i, j int) {
		v := rng.Float64()*2 - 1
		b.Add(i, j, v)
		rowSum[i] += math.Abs(v)
		rowSum[j] += math.Abs(v)
	}
	switch kind {
	case "random":
		for k := 0; k < 3*n; k++ {
			i, j := rng.IntN(n), rng.IntN(n)
			if i != j {
				add(i, j)
			}
		}
	case "banded":
		for i := 0; i < n; i++ {
			for j := i + 1; j < min(n, i+5); j++ {
				add(i, j)
			}
		}
	case "arrow": // dense last row and column
		for i := 0; i < n-1; i++ {
			add(i, n-1)
			if i > 0 {
				add(i, i-1)
			}
		}
	case "blocks": // independent dense 4×4 blocks: a forest
		for s := 0; s+3 < n; s += 4 {
			for i := s; i < s+4; i++ {
				for j := i + 1; j < s+4; j++ {
					add(i, j)
				}
			}
		}
	case "diagonal":
	default:
		panic("unknown kind")
	}
	for i := 0; i < n; i++ {
		b.Add(i, i, rowSum[i]+0.5+rng.Float64())
	}
	return b.Matrix()
}

// laplacian1D returns tridiag(−1, 2, −1) of order n.
func laplacian1D(n int) *Matrix {
	b := NewBuilder(n, 2*n)
	for i := 0; i < n; i++ {
		b.Add(i, i, 2)
		if i > 0 {
			b.Add(i, i-1, -1)
		}
	}
	return b.Matrix()
}

// laplacian2D returns the 5-point Laplacian of a k×k grid with Dirichlet
// boundary, numbered row by row.
func laplacian2D(k int) *Matrix {
	n := k * k
	b := NewBuilder(n, 3*n)
	for y := 0; y < k; y++ {
		for x := 0; x < k; x++ {
			i := y*k + x
			b.Add(i, i, 4)
			if x > 0 {
				b.Add(i, i-1, -1)
			}
			if y > 0 {
				b.Add(i, i-k, -1)
			}
		}
	}
	return b.Matrix()
}

// addBar adds the stiffness of a pin-jointed bar of axial stiffness k
// between nodes u and v with dim freedoms each along the unit direction d.
func addBar(b *Builder, dim, u, v int, d []float64, k float64) {
	for r := 0; r < dim; r++ {
		for c := 0; c < dim; c++ {
			kv := k * d[r] * d[c]
			if u*dim+r >= u*dim+c {
				b.Add(u*dim+r, u*dim+c, kv)
				b.Add(v*dim+r, v*dim+c, kv)
			}
			b.Add(u*dim+r, v*dim+c, -kv)
		}
	}
}

// gridTruss2D returns the stiffness of an nx×ny grid of nodes with 2
// freedoms each, every node joined by bars to its 8 neighbours, plus a weak
// spring to ground at every freedom so the matrix is positive definite.
func gridTruss2D(nx, ny int, seed uint64) *Matrix {
	rng := rand.New(rand.NewPCG(seed, 11))
	nodes := nx * ny
	b := NewBuilder(2*nodes, 40*nodes)
	for y := 0; y < ny; y++ {
		for x := 0; x < nx; x++ {
			u := y*nx + x
			for _, off := range [][2]int{{1, 0}, {0, 1}, {1, 1}, {-1, 1}} {
				x2, y2 := x+off[0], y+off[1]
				if x2 < 0 || x2 >= nx || y2 >= ny {
					continue
				}
				l := math.Hypot(float64(off[0]), float64(off[1]))
				d := []float64{float64(off[0]) / l, float64(off[1]) / l}
				addBar(b, 2, u, y2*nx+x2, d, (1+rng.Float64())/l)
			}
			b.Add(2*u, 2*u, 1e-3)
			b.Add(2*u+1, 2*u+1, 1e-3)
		}
	}
	return b.Matrix()
}

// doubleLayerGrid returns the stiffness of a double-layer space grid: two
// square grids of n×n nodes, 3 freedoms each, the top layer offset by half
// a bay and 1 above; bars join each node to its 8 neighbours in its layer and
// each top node to the 4 bottom nodes below it, with weak springs to ground.
func doubleLayerGrid(n int, seed uint64) *Matrix {
	rng := rand.New(rand.NewPCG(seed, 13))
	nodes := 2 * n * n
	b := NewBuilder(3*nodes, 80*nodes)
	at := func(layer, x, y int) (int, [3]float64) {
		p := [3]float64{float64(x), float64(y), 0}
		if layer == 1 {
			p = [3]float64{float64(x) + 0.5, float64(y) + 0.5, 1}
		}
		return layer*n*n + y*n + x, p
	}
	bar := func(u int, pu [3]float64, v int, pv [3]float64) {
		d := []float64{pv[0] - pu[0], pv[1] - pu[1], pv[2] - pu[2]}
		l := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
		for i := range d {
			d[i] /= l
		}
		addBar(b, 3, u, v, d, (1+rng.Float64())/l)
	}
	for layer := 0; layer < 2; layer++ {
		for y := 0; y < n; y++ {
			for x := 0; x < n; x++ {
				u, pu := at(layer, x, y)
				for _, off := range [][2]int{{1, 0}, {0, 1}, {1, 1}, {-1, 1}} {
					x2, y2 := x+off[0], y+off[1]
					if x2 < 0 || x2 >= n || y2 >= n {
						continue
					}
					v, pv := at(layer, x2, y2)
					bar(u, pu, v, pv)
				}
				if layer == 1 {
					for _, off := range [][2]int{{0, 0}, {1, 0}, {0, 1}, {1, 1}} {
						x2, y2 := x+off[0], y+off[1]
						if x2 < n && y2 < n {
							v, pv := at(0, x2, y2)
							bar(u, pu, v, pv)
						}
					}
				}
				for r := 0; r < 3; r++ {
					b.Add(3*u+r, 3*u+r, 1e-3)
				}
			}
		}
	}
	return b.Matrix()
}

// cubeTruss returns the stiffness of a k×k×k cubic lattice truss, 3
// freedoms per node, with bars along the three axes and the diagonals of the
// three faces at each node (9 bars per node, about 9k³ in all), plus weak
// springs to ground.
func cubeTruss(k int, seed uint64) *Matrix {
	rng := rand.New(rand.NewPCG(seed, 17))
	nodes := k * k * k
	b := NewBuilder(3*nodes, 100*nodes)
	id := func(x, y, z int) int { return (z*k+y)*k + x }
	offsets := [][3]int{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {1, 1, 0}, {1, -1, 0}, {1, 0, 1}, {1, 0, -1}, {0, 1, 1}, {0, 1, -1}}
	for z := 0; z < k; z++ {
		for y := 0; y < k; y++ {
			for x := 0; x < k; x++ {
				u := id(x, y, z)
				for _, o := range offsets {
					x2, y2, z2 := x+o[0], y+o[1], z+o[2]
					if x2 < 0 || x2 >= k || y2 < 0 || y2 >= k || z2 < 0 || z2 >= k {
						continue
					}
					l := math.Sqrt(float64(o[0]*o[0] + o[1]*o[1] + o[2]*o[2]))
					d := []float64{float64(o[0]) / l, float64(o[1]) / l, float64(o[2]) / l}
					addBar(b, 3, u, id(x2, y2, z2), d, (1+rng.Float64())/l)
				}
				for r := 0; r < 3; r++ {
					b.Add(3*u+r, 3*u+r, 1e-3)
				}
			}
		}
	}
	return b.Matrix()
}
