package layout

// equilibrium is the equilibrium matrix B of a layout on its free freedoms
// with a factorisation of B Bᵀ, used to correct member forces by the
// least-norm change that balances the loads.
type equilibrium struct {
	b     *sparseColumns
	dim   int
	rowOf [][3]int
	ne    *normalEquations
}

func newEquilibrium(dim int, nodes []vec, members []Member, fixed [][3]bool) *equilibrium {
	eq := &equilibrium{dim: dim, rowOf: make([][3]int, len(nodes))}
	var coords []vec
	rows := 0
	for i := range nodes {
		for c := 0; c < 3; c++ {
			eq.rowOf[i][c] = -1
			if c >= dim {
				continue
			}
			if !fixed[i][c] {
				eq.rowOf[i][c] = rows
				coords = append(coords, nodes[i])
				rows++
			}
		}
	}
	b := &sparseColumns{rows: rows, cols: len(members), colStart: []int{0}}
	for _, m := range members {
		d := sub(nodes[m.Ends[1]], nodes[m.Ends[0]])
		e := scaled(d, 1/norm(d))
		type entry struct {
			row   int
			value float64
		}
		var entries []entry
		for c := 0; c < dim; c++ {
			if r := eq.rowOf[m.Ends[0]][c]; r >= 0 {
				entries = append(entries, entry{r, -e[c]})
			}
			if r := eq.rowOf[m.Ends[1]][c]; r >= 0 {
				entries = append(entries, entry{r, e[c]})
			}
		}
		for s := 1; s < len(entries); s++ {
			for t := s; t > 0 && entries[t].row < entries[t-1].row; t-- {
				entries[t], entries[t-1] = entries[t-1], entries[t]
			}
		}
		for _, en := range entries {
			b.rowIndex = append(b.rowIndex, int32(en.row))
			b.value = append(b.value, en.value)
		}
		b.colStart = append(b.colStart, len(b.rowIndex))
	}
	eq.b = b
	if rows > 0 && len(members) > 0 {
		eq.ne = newNormalEquations(b, coords)
		ones := make([]float64, len(members))
		for i := range ones {
			ones[i] = 1
		}
		eq.ne.factorize(ones)
	}
	return eq
}

// restore changes the member forces q by the least-norm correction
// Bᵀ(BBᵀ)⁻¹(f − Bq), a few times over, and returns the scaled residual
// max|Bq − f| / (max|q| + max|f|) on the free freedoms.
func (eq *equilibrium) restore(q []float64, f []vec) float64 {
	rhs := make([]float64, eq.b.rows)
	for i, rc := range eq.rowOf {
		for c := 0; c < eq.dim; c++ {
			if r := rc[c]; r >= 0 {
				rhs[r] = f[i][c]
			}
		}
	}
	scale := maxAbs(rhs)
	bq := make([]float64, eq.b.rows)
	correction := make([]float64, len(q))
	residual := func() float64 {
		eq.b.mulVec(bq, q)
		for r := range bq {
			bq[r] = rhs[r] - bq[r]
		}
		return maxAbs(bq) / (maxAbs(q) + scale + 1e-300)
	}
	res := residual()
	for pass := 0; pass < 3 && eq.ne != nil && res > 1e-15; pass++ {
		eq.ne.solve(bq)
		eq.b.mulTransVec(correction, bq)
		for i := range q {
			q[i] += correction[i]
		}
		res = residual()
	}
	return res
}
