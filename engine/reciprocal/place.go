package reciprocal

import (
	"context"
	"math"
)

// dual is the face graph of an embedding: one vertex per space or face,
// one edge per member or external force, stored in compressed rows.
type dual struct {
	faces int
	left  []int32 // per edge
	right []int32 // per edge
	start []int32 // per face: first entry in adj; len faces+1
	adj   []int32 // neighbouring face per entry
	edge  []int32 // edge per entry

	factor *milu // preconditioner, made on first need
	jacobi bool  // the factorisation failed: precondition by the diagonal
}

// newDual builds the face graph of edges given by their left and right
// faces. Edges with the same face on both sides (bridges) join no faces.
func newDual(faces int, left, right []int32) *dual {
	d := &dual{faces: faces, left: left, right: right, start: make([]int32, faces+1)}
	for e := range left {
		if left[e] != right[e] {
			d.start[left[e]+1]++
			d.start[right[e]+1]++
		}
	}
	for f := 1; f <= faces; f++ {
		d.start[f] += d.start[f-1]
	}
	d.adj = make([]int32, d.start[faces])
	d.edge = make([]int32, d.start[faces])
	fill := make([]int32, faces)
	copy(fill, d.start[:faces])
	for e := range left {
		l, r := left[e], right[e]
		if l == r {
			continue
		}
		d.adj[fill[l]], d.edge[fill[l]] = r, int32(e)
		fill[l]++
		d.adj[fill[r]], d.edge[fill[r]] = l, int32(e)
		fill[r]++
	}
	return d
}

// bfs visits the faces breadth first from face 0, calling visit(f, g, e)
// when face g is first reached from face f across edge e. The dual of a
// connected plane network is connected, so every face is visited.
func (d *dual) bfs(visit func(from, to, edge int32)) {
	seen := make([]bool, d.faces)
	queue := make([]int32, 1, d.faces)
	seen[0] = true
	for k := 0; k < len(queue); k++ {
		f := queue[k]
		for p := d.start[f]; p < d.start[f+1]; p++ {
			if g := d.adj[p]; !seen[g] {
				seen[g] = true
				visit(f, g, d.edge[p])
				queue = append(queue, g)
			}
		}
	}
}

// place returns the points q (one per face, q[0] at the origin) that
// minimise Σₑ ‖q[right] − q[left] − vₑ‖² over the edges. It starts from the
// exact placement along a spanning tree of the dual, which is already the
// answer when the vectors balance at every node, and then corrects it by
// conjugate gradients on the normal equations (the dual graph's
// Laplacian), preconditioned by a modified incomplete factorisation (or by
// the diagonal should that break down), so that any small closure error spreads
// over all segments instead of piling up off the tree. It returns the
// iterations used.
func (d *dual) place(ctx context.Context, v [][2]float64) ([][2]float64, int, error) {
	q := make([][2]float64, d.faces)
	d.bfs(func(f, g, e int32) {
		if d.right[e] == g {
			q[g] = [2]float64{q[f][0] + v[e][0], q[f][1] + v[e][1]}
		} else {
			q[g] = [2]float64{q[f][0] - v[e][0], q[f][1] - v[e][1]}
		}
	})
	iters := 0
	for c := 0; c < 2; c++ {
		x := make([]float64, d.faces)
		b := make([]float64, d.faces)
		for f := range x {
			x[f] = q[f][c]
		}
		for e := range d.left {
			if d.left[e] != d.right[e] {
				b[d.right[e]] += v[e][c]
				b[d.left[e]] -= v[e][c]
			}
		}
		it, err := d.solveLaplacian(ctx, x, b)
		iters += it
		if err != nil {
			return nil, iters, err
		}
		for f := range x {
			q[f][c] = x[f]
		}
	}
	return q, iters, nil
}

// solveLaplacian improves x towards L·x = b with x[0] held at 0, by
// preconditioned conjugate gradients; it stops when the residual is below
// 1e-12 of ‖b‖ (or of the scale of x when b vanishes) or after a bound on
// the iterations proportional to the square root of the size (the
// Laplacian of a planar graph has condition number of order its size).
func (d *dual) solveLaplacian(ctx context.Context, x, b []float64) (int, error) {
	n := d.faces
	if n < 2 {
		return 0, nil
	}
	x[0] = 0
	r := make([]float64, n)
	d.applyLaplacian(r, x)
	bnorm, rnorm := 0.0, 0.0
	for f := 1; f < n; f++ {
		r[f] = b[f] - r[f]
		bnorm += b[f] * b[f]
		rnorm += r[f] * r[f]
	}
	tol := 1e-12 * math.Sqrt(bnorm)
	if math.Sqrt(rnorm) <= tol || rnorm == 0 {
		return 0, nil
	}
	z := make([]float64, n)
	p := make([]float64, n)
	ap := make([]float64, n)
	if d.factor == nil && !d.jacobi {
		d.factor = newMILU(d)
		d.jacobi = d.factor == nil
	}
	rz := d.precondition(z, r)
	copy(p, z)
	maxIter := 200 + 40*int(math.Sqrt(float64(n)))
	for it := 1; it <= maxIter; it++ {
		if it%64 == 0 {
			if err := ctx.Err(); err != nil {
				return it, err
			}
		}
		d.applyLaplacian(ap, p)
		pap := 0.0
		for f := 1; f < n; f++ {
			pap += p[f] * ap[f]
		}
		if pap <= 0 {
			return it, nil
		}
		alpha := rz / pap
		rnorm = 0
		for f := 1; f < n; f++ {
			x[f] += alpha * p[f]
			r[f] -= alpha * ap[f]
			rnorm += r[f] * r[f]
		}
		if math.Sqrt(rnorm) <= tol {
			return it, nil
		}
		rzNew := d.precondition(z, r)
		beta := rzNew / rz
		rz = rzNew
		for f := 1; f < n; f++ {
			p[f] = z[f] + beta*p[f]
		}
	}
	return maxIter, nil
}

// applyLaplacian sets dst = L·p on faces 1..n−1, where L is the face graph's
// Laplacian (degree on the diagonal, −1 per neighbour) with face 0 grounded:
// its row is zero and its column is left out.
func (d *dual) applyLaplacian(dst, p []float64) {
	n := d.faces
	for f := 1; f < n; f++ {
		s := float64(d.start[f+1]-d.start[f]) * p[f]
		for k := d.start[f]; k < d.start[f+1]; k++ {
			if g := d.adj[k]; g != 0 {
				s -= p[g]
			}
		}
		dst[f] = s
	}
	dst[0] = 0
}

// precondition sets z = M⁻¹·r (the modified incomplete factorisation, or
// the diagonal when it failed) on faces 1..n−1 and returns r·z.
func (d *dual) precondition(z, r []float64) float64 {
	n := d.faces
	if d.factor != nil {
		d.factor.solve(z, r)
	} else {
		for f := 1; f < n; f++ {
			z[f] = r[f] / float64(d.start[f+1]-d.start[f])
		}
	}
	rz := 0.0
	for f := 1; f < n; f++ {
		rz += r[f] * z[f]
	}
	return rz
}
