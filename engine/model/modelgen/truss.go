package modelgen

import (
	"math"
	"math/rand/v2"

	"gusset/engine/model"
)

// Pratt returns a simply supported 2D Pratt truss with parallel chords:
// panels ≥ 2 panels over span (m), chords depth (m) apart. Bottom nodes
// n0..n{panels} run left to right along y = 0, then top nodes follow at
// y = depth above bottom nodes 1..panels−1. Members (all bars): bottom
// chord, top chord, two end diagonals, verticals, and one diagonal per
// inner panel sloping down towards mid-span (tension under gravity). The
// truss is statically determinate: 2·panels nodes, 4·panels − 3 members,
// a pin at the left end (x, y) and a roller at the right end (y). Load
// case "load" applies −load (kN) along y at each inner bottom node.
// Pratt panics if panels < 2 or span or depth is not positive.
func Pratt(panels int, span, depth, load float64) *model.Spec {
	if panels < 2 || !(span > 0) || !(depth > 0) {
		panic("modelgen: Pratt needs panels ≥ 2 and positive span and depth")
	}
	b := newBuilder(2, 2*panels, 4*panels-3)
	dx := span / float64(panels)
	bottom := make([]int, panels+1)
	for i := range bottom {
		bottom[i] = b.node(float64(i)*dx, 0)
	}
	top := make([]int, panels+1) // top[0] and top[panels] unused
	for i := 1; i < panels; i++ {
		top[i] = b.node(float64(i)*dx, depth)
	}
	for i := range panels {
		b.member(bottom[i], bottom[i+1], "bar")
	}
	for i := 1; i < panels-1; i++ {
		b.member(top[i], top[i+1], "bar")
	}
	b.member(bottom[0], top[1], "bar")
	b.member(bottom[panels], top[panels-1], "bar")
	for i := 1; i < panels; i++ {
		b.member(bottom[i], top[i], "bar")
	}
	half := panels / 2
	for i := 1; i < panels-1; i++ {
		if i+1 <= half {
			b.member(top[i], bottom[i+1], "bar")
		} else {
			b.member(bottom[i], top[i+1], "bar")
		}
	}
	b.support(bottom[0], "x", "y")
	b.support(bottom[panels], "y")
	for i := 1; i < panels; i++ {
		b.load(0, "load", bottom[i], 0, -load)
	}
	return b.spec
}

// GridTruss2D returns a 2D braced grid: (nx+1)×(ny+1) nodes on a 1 m
// square grid (node (i, j) at x = i, y = j is n{j·(nx+1)+i}), each square
// braced by one diagonal, all bars. The left edge (x = 0) is pinned (x, y)
// and load case "load" applies −10 kN along y at each right-edge node.
// It has 3·nx·ny + nx + ny members, no mechanism, and nx·ny − nx + ny
// states of self-stress (the left-edge verticals between pins included). GridTruss2D panics unless nx, ny ≥ 1.
func GridTruss2D(nx, ny int) *model.Spec {
	if nx < 1 || ny < 1 {
		panic("modelgen: GridTruss2D needs nx, ny ≥ 1")
	}
	b := newBuilder(2, (nx+1)*(ny+1), 3*nx*ny+nx+ny)
	id := func(i, j int) int { return j*(nx+1) + i }
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			b.node(float64(i), float64(j))
		}
	}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			if i < nx {
				b.member(id(i, j), id(i+1, j), "bar")
			}
			if j < ny {
				b.member(id(i, j), id(i, j+1), "bar")
			}
			if i < nx && j < ny {
				b.member(id(i, j), id(i+1, j+1), "bar")
			}
		}
	}
	for j := 0; j <= ny; j++ {
		b.support(id(0, j), "x", "y")
		b.load(0, "load", id(nx, j), 0, -10)
	}
	return b.spec
}

// SpaceTruss3D returns a double-layer square-on-square offset space grid
// of bars: a top layer of (nx+1)×(ny+1) nodes on a 2 m grid at z = 1.5 m
// (n0.. row by row), then a bottom layer of nx×ny nodes at z = 0 below the
// centres of the top squares. Members: top chords, bottom chords and four
// web diagonals from each bottom node to the corners of its top square,
// 8·nx·ny members in all. Every top perimeter node is pinned (x, y, z),
// which leaves no mechanism (the tests check the rank of the equilibrium
// matrix for several sizes). Load
// case "gravity" applies −10 kN along z at each unsupported top node, or
// at every top node when none is free.
// SpaceTruss3D panics unless nx, ny ≥ 1.
func SpaceTruss3D(nx, ny int) *model.Spec {
	if nx < 1 || ny < 1 {
		panic("modelgen: SpaceTruss3D needs nx, ny ≥ 1")
	}
	const spacing, depth = 2.0, 1.5
	b := newBuilder(3, (nx+1)*(ny+1)+nx*ny, 8*nx*ny)
	top := func(i, j int) int { return j*(nx+1) + i }
	bottom := func(i, j int) int { return (nx+1)*(ny+1) + j*nx + i }
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			b.node(float64(i)*spacing, float64(j)*spacing, depth)
		}
	}
	for j := range ny {
		for i := range nx {
			b.node((float64(i)+0.5)*spacing, (float64(j)+0.5)*spacing, 0)
		}
	}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			if i < nx {
				b.member(top(i, j), top(i+1, j), "bar")
			}
			if j < ny {
				b.member(top(i, j), top(i, j+1), "bar")
			}
		}
	}
	for j := range ny {
		for i := range nx {
			if i+1 < nx {
				b.member(bottom(i, j), bottom(i+1, j), "bar")
			}
			if j+1 < ny {
				b.member(bottom(i, j), bottom(i, j+1), "bar")
			}
			for _, c := range [4][2]int{{0, 0}, {1, 0}, {1, 1}, {0, 1}} {
				b.member(bottom(i, j), top(i+c[0], j+c[1]), "bar")
			}
		}
	}
	free := 0
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			if i == 0 || j == 0 || i == nx || j == ny {
				b.support(top(i, j), "x", "y", "z")
			} else {
				b.load(0, "gravity", top(i, j), 0, 0, -10)
				free++
			}
		}
	}
	if free == 0 {
		for k := range (nx + 1) * (ny + 1) {
			b.load(0, "gravity", k, 0, 0, -10)
		}
	}
	return b.spec
}

// RandomPlanarTruss returns a random triangulated planar truss of about n
// nodes (at least 4): a grid of cols×rows cells of 1 m with every node
// jittered by up to ±0.2 m in x and y, each cell split by a randomly
// chosen diagonal, so no two members cross. Node (i, j) is
// n{j·(cols+1)+i}. The bottom-left node is pinned (x, y); the bottom-right
// node is a roller (y) or, at random, a pin, so the truss is externally
// determinate or indeterminate; a single row of cells is internally
// determinate, more rows add one redundant member per interior node. Load
// case "load" holds random nodal forces with components in [−10, 10] kN on
// about half the nodes (at least one). Members are about 3·n.
func RandomPlanarTruss(rng *rand.Rand, n int) *model.Spec {
	if n < 4 {
		n = 4
	}
	maxRows := max(1, int(math.Sqrt(float64(n)))-1)
	rows := 1 + rng.IntN(maxRows)
	cols := max(1, n/(rows+1)-1)
	b := newBuilder(2, (cols+1)*(rows+1), 3*cols*rows+cols+rows)
	id := func(i, j int) int { return j*(cols+1) + i }
	jitter := func() float64 { return 0.4 * (rng.Float64() - 0.5) }
	for j := 0; j <= rows; j++ {
		for i := 0; i <= cols; i++ {
			b.node(round(float64(i)+jitter()), round(float64(j)+jitter()))
		}
	}
	for j := 0; j <= rows; j++ {
		for i := 0; i <= cols; i++ {
			if i < cols {
				b.member(id(i, j), id(i+1, j), "bar")
			}
			if j < rows {
				b.member(id(i, j), id(i, j+1), "bar")
			}
			if i < cols && j < rows {
				if rng.IntN(2) == 0 {
					b.member(id(i, j), id(i+1, j+1), "bar")
				} else {
					b.member(id(i+1, j), id(i, j+1), "bar")
				}
			}
		}
	}
	b.support(id(0, 0), "x", "y")
	if rng.IntN(2) == 0 {
		b.support(id(cols, 0), "y")
	} else {
		b.support(id(cols, 0), "x", "y")
	}
	loaded := 0
	total := (cols + 1) * (rows + 1)
	for k := range total {
		if rng.IntN(2) == 0 || (k == total-1 && loaded == 0) {
			b.load(0, "load", k, round(20*rng.Float64()-10), round(20*rng.Float64()-10))
			loaded++
		}
	}
	return b.spec
}

// round keeps generated coordinates and loads to 1e-6 so they print
// compactly and survive a JSON round trip exactly.
func round(x float64) float64 { return math.Round(x*1e6) / 1e6 }
