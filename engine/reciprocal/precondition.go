package reciprocal

import "slices"

// milu is a modified incomplete LU factorisation, with no fill, of the
// face graph's Laplacian with face 0 held fixed (rows and columns of the
// other faces, shifted down by one). Fill that the pattern drops is moved,
// scaled by a relaxation factor, onto the diagonal, which keeps the row
// sums close to those of the Laplacian; for grid-like Laplacians this
// lowers the condition number of the preconditioned system from the order
// of the size to the order of its square root (I. Gustafsson, "A class of
// first order factorization methods", BIT 18, 1978, from memory). The
// matrix is symmetric, so the factors are Lᵀ-symmetric up to the diagonal
// and serve conjugate gradients. Rows are in breadth-first order from face
// 0, a wavefront ordering under which incomplete factorisations of
// Laplacians work well (common practice, as with reverse Cuthill–McKee).
type milu struct {
	order []int32   // face per row: breadth-first from face 0
	row   []int32   // row per face; −1 for face 0
	work  []float64 // permuted right-hand side
	start []int32   // row starts; len rows+1
	col   []int32   // column per entry, increasing within a row
	val   []float64 // multipliers left of the diagonal, U on and right of it
	diag  []int32   // entry of the diagonal per row
}

// miluRelaxation is the share of dropped fill moved to the diagonal: 1 is
// the fully modified factorisation, which can lose positivity on a
// Laplacian held at a single point; a little less keeps it robust.
const miluRelaxation = 0.97

// newMILU factorises the Laplacian of d without face 0. It returns nil when
// a pivot is not safely positive, and the caller falls back to Jacobi.
func newMILU(d *dual) *milu {
	rows := d.faces - 1
	f := &milu{start: make([]int32, rows+1), diag: make([]int32, rows), row: make([]int32, d.faces), work: make([]float64, rows)}
	f.row[0] = -1
	d.bfs(func(_, to, _ int32) {
		f.row[to] = int32(len(f.order))
		f.order = append(f.order, to)
	})
	type entry struct {
		col int32
		val float64
	}
	var row []entry
	for r := range rows {
		face := f.order[r]
		row = row[:0]
		row = append(row, entry{int32(r), float64(d.start[face+1] - d.start[face])})
		for p := d.start[face]; p < d.start[face+1]; p++ {
			if g := d.adj[p]; g != 0 {
				row = append(row, entry{f.row[g], -1})
			}
		}
		slices.SortFunc(row, func(a, b entry) int { return int(a.col - b.col) })
		// Merge the entries of faces that share several edges.
		k := 0
		for _, e := range row {
			if k > 0 && row[k-1].col == e.col {
				row[k-1].val += e.val
				continue
			}
			row[k] = e
			k++
		}
		for _, e := range row[:k] {
			if e.col == int32(r) {
				f.diag[r] = int32(len(f.col))
			}
			f.col = append(f.col, e.col)
			f.val = append(f.val, e.val)
		}
		f.start[r+1] = int32(len(f.col))
	}
	where := make([]int32, rows)
	for i := range where {
		where[i] = -1
	}
	for i := range rows {
		for p := f.start[i]; p < f.start[i+1]; p++ {
			where[f.col[p]] = p
		}
		original := f.val[f.diag[i]]
		for p := f.start[i]; p < f.diag[i]; p++ {
			k := f.col[p]
			f.val[p] /= f.val[f.diag[k]]
			lik := f.val[p]
			for q := f.diag[k] + 1; q < f.start[k+1]; q++ {
				if w := where[f.col[q]]; w >= 0 {
					f.val[w] -= lik * f.val[q]
				} else {
					f.val[f.diag[i]] -= miluRelaxation * lik * f.val[q]
				}
			}
		}
		if !(f.val[f.diag[i]] > 1e-8*original) {
			return nil
		}
		for p := f.start[i]; p < f.start[i+1]; p++ {
			where[f.col[p]] = -1
		}
	}
	return f
}

// solve sets z = (LU)⁻¹ r over the faces (entry 0 of z is left alone).
func (f *milu) solve(z, r []float64) {
	rows := len(f.diag)
	y := f.work
	for i := range rows {
		s := r[f.order[i]]
		for p := f.start[i]; p < f.diag[i]; p++ {
			s -= f.val[p] * y[f.col[p]]
		}
		y[i] = s
	}
	for i := rows - 1; i >= 0; i-- {
		s := y[i]
		for p := f.diag[i] + 1; p < f.start[i+1]; p++ {
			s -= f.val[p] * y[f.col[p]]
		}
		y[i] = s / f.val[f.diag[i]]
		z[f.order[i]] = y[i]
	}
}
