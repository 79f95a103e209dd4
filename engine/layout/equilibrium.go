package layout

import "math"

// equilibrium is the equilibrium matrix B of a layout on its free freedoms
// with a factorisation of B Bᵀ, used to correct member forces by the
// least-norm change that balances the loads.
type equilibrium struct {
	b     *sparseColumns
	rowOf [][2]int
	ne    *normalEquations
}

func newEquilibrium(nodes [][2]float64, members []Member, fixed [][2]bool) *equilibrium {
	eq := &equilibrium{rowOf: make([][2]int, len(nodes))}
	var coords [][2]float64
	rows := 0
	for i := range nodes {
		for c := 0; c < 2; c++ {
			eq.rowOf[i][c] = -1
			if !fixed[i][c] {
				eq.rowOf[i][c] = rows
				coords = append(coords, nodes[i])
				rows++
			}
		}
	}
	b := &sparseColumns{rows: rows, cols: len(members), colStart: []int{0}}
	for _, m := range members {
		p, q := nodes[m.Ends[0]], nodes[m.Ends[1]]
		length := math.Hypot(q[0]-p[0], q[1]-p[1])
		e := [2]float64{(q[0] - p[0]) / length, (q[1] - p[1]) / length}
		type entry struct {
			row   int
			value float64
		}
		var entries []entry
		for c := 0; c < 2; c++ {
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
func (eq *equilibrium) restore(q []float64, f [][2]float64) float64 {
	rhs := make([]float64, eq.b.rows)
	for i, rc := range eq.rowOf {
		for c := 0; c < 2; c++ {
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
