package layout

import "math"

// program is the linear program of a layout problem over a set of members
// (candidate indices), in standard form min cᵀx, A x = b, x ≥ 0.
//
// One case (K = 1): columns are T_i and C_i for every member, then two
// artificial columns ±1 per equilibrium row. Rows are the free freedoms.
//
// K > 1 cases (the multiple-load-case program): columns are the areas a_i,
// then per case k the tensions Tᵏ, compressions Cᵏ, capacity slacks sᵏ and
// the artificial columns; rows per case are the free freedoms (B(Tᵏ−Cᵏ) =
// fᵏ) and one capacity row per member (Tᵢᵏ/σ_t + Cᵢᵏ/σ_c + sᵢᵏ − a_i = 0).
//
// The artificial columns cost penalty per unit force; they keep every
// program feasible, so a positive artificial at the optimum means the loads
// cannot reach the supports through these members.
type program struct {
	members  []candidate
	cases    int
	freeRows int
	a        *sparseColumns
	b, c     []float64
	rowCoord []vec
}

// setting is the fixed data every program of one problem shares.
type setting struct {
	g              *groundStructure
	dim            int
	rowOf          [][3]int // equilibrium row of (node, component), or −1 where fixed
	freeRows       int
	rowNode        []int       // node of each equilibrium row
	rowComp        []int8      // component of each equilibrium row
	loads          [][]float64 // per case, per equilibrium row
	tension, compr float64
	jointCost      float64
	penalty        float64
	// nearBand is the fraction of the adding threshold above which a
	// candidate that does not violate yet is added with the violators
	// while there is room (1: violators only).
	nearBand float64
}

func (st *setting) cost(c candidate) float64 {
	return st.g.length(c) + st.jointCost
}

// unit returns the unit vector of candidate c from its first to its second
// node.
func (st *setting) unit(c candidate) vec {
	d := sub(st.g.nodes[c.b], st.g.nodes[c.a])
	return scaled(d, 1/norm(d))
}

// column returns the rows and values of B's column for candidate c.
func (st *setting) column(c candidate) (rows []int32, values []float64) {
	e := st.unit(c)
	for comp := 0; comp < st.dim; comp++ {
		if r := st.rowOf[c.a][comp]; r >= 0 {
			rows = append(rows, int32(r))
			values = append(values, -e[comp])
		}
		if r := st.rowOf[c.b][comp]; r >= 0 {
			rows = append(rows, int32(r))
			values = append(values, e[comp])
		}
	}
	return rows, values
}

// build assembles the program over the given members.
func (st *setting) build(members []candidate) *program {
	p := &program{members: members, cases: len(st.loads), freeRows: st.freeRows, a: &sparseColumns{colStart: []int{0}}}
	if p.cases == 1 {
		st.buildOneCase(p)
	} else {
		st.buildCases(p)
	}
	p.a.cols = len(p.c)
	return p
}

// addColumn appends a column (its rows sorted ascending) with its cost.
func (p *program) addColumn(rows []int32, values []float64, cost float64) {
	for s := 1; s < len(rows); s++ {
		for t := s; t > 0 && rows[t] < rows[t-1]; t-- {
			rows[t], rows[t-1] = rows[t-1], rows[t]
			values[t], values[t-1] = values[t-1], values[t]
		}
	}
	a := p.a
	a.rowIndex = append(a.rowIndex, rows...)
	a.value = append(a.value, values...)
	a.colStart = append(a.colStart, len(a.rowIndex))
	p.c = append(p.c, cost)
}

func negate(v []float64) []float64 {
	out := make([]float64, len(v))
	for i, t := range v {
		out[i] = -t
	}
	return out
}

// addArtificial appends the artificial columns ±1 of the equilibrium rows
// from offset on, and their rows' coordinates.
func (st *setting) addArtificial(p *program, offset int32) {
	for r := 0; r < st.freeRows; r++ {
		p.addColumn([]int32{offset + int32(r)}, []float64{1}, st.penalty)
		p.addColumn([]int32{offset + int32(r)}, []float64{-1}, st.penalty)
		p.rowCoord = append(p.rowCoord, st.g.nodes[st.rowNode[r]])
	}
}

// buildOneCase assembles the single-case program: T and C per member,
// then the artificial columns.
func (st *setting) buildOneCase(p *program) {
	for _, k := range p.members {
		rows, values := st.column(k)
		cost := st.cost(k)
		p.addColumn(rows, values, cost/st.tension)
		p.addColumn(append([]int32(nil), rows...), negate(values), cost/st.compr)
	}
	st.addArtificial(p, 0)
	p.b = append([]float64(nil), st.loads[0]...)
	p.a.rows = st.freeRows
}

// buildCases assembles the multiple-load-case program: the areas, then per
// case the tensions, compressions, capacity slacks and artificials, with
// the capacity rows placed at the members' midpoints for the ordering.
func (st *setting) buildCases(p *program) {
	K, R, m := p.cases, st.freeRows, len(p.members)
	block := R + m // rows per case
	for i, k := range p.members {
		rows := make([]int32, K)
		values := make([]float64, K)
		for c := 0; c < K; c++ {
			rows[c] = int32(c*block + R + i)
			values[c] = -1
		}
		p.addColumn(rows, values, st.cost(k))
	}
	for c := 0; c < K; c++ {
		offset := int32(c * block)
		for i, k := range p.members {
			rows, values := st.column(k)
			for t := range rows {
				rows[t] += offset
			}
			capRow := offset + int32(R+i)
			p.addColumn(append(append([]int32(nil), rows...), capRow), append(append([]float64(nil), values...), 1/st.tension), 0)
			p.addColumn(append(append([]int32(nil), rows...), capRow), append(negate(values), 1/st.compr), 0)
		}
		for i := range p.members {
			p.addColumn([]int32{offset + int32(R+i)}, []float64{1}, 0)
		}
		st.addArtificial(p, offset)
		for _, cd := range p.members {
			pa, pb := st.g.nodes[cd.a], st.g.nodes[cd.b]
			p.rowCoord = append(p.rowCoord, scaled(vec{pa[0] + pb[0], pa[1] + pb[1], pa[2] + pb[2]}, 0.5))
		}
		p.b = append(p.b, st.loads[c]...)
		p.b = append(p.b, make([]float64, m)...)
	}
	p.a.rows = K * block
}

// forces returns the member forces per case (tension positive) and the
// total artificial force per case from a primal solution x.
func (p *program) forces(x []float64) (forces [][]float64, artificial []float64) {
	m, R := len(p.members), p.freeRows
	forces = make([][]float64, p.cases)
	artificial = make([]float64, p.cases)
	if p.cases == 1 {
		forces[0] = make([]float64, m)
		for i := 0; i < m; i++ {
			forces[0][i] = x[2*i] - x[2*i+1]
		}
		for j := 2 * m; j < len(x); j++ {
			artificial[0] += x[j]
		}
		return forces, artificial
	}
	perCase := 3*m + 2*R
	for c := 0; c < p.cases; c++ {
		base := m + c*perCase
		forces[c] = make([]float64, m)
		for i := 0; i < m; i++ {
			forces[c][i] = x[base+2*i] - x[base+2*i+1]
		}
		for j := base + 3*m; j < base+perCase; j++ {
			artificial[c] += x[j]
		}
	}
	return forces, artificial
}

// displacements returns the nodal virtual displacements per case from the
// dual values y (zero at fixed freedoms).
func (p *program) displacements(st *setting, y []float64) [][]vec {
	u := make([][]vec, p.cases)
	block := p.freeRows
	if p.cases > 1 {
		block += len(p.members)
	}
	for c := range u {
		u[c] = make([]vec, len(st.g.nodes))
		for r := 0; r < p.freeRows; r++ {
			u[c][st.rowNode[r]][st.rowComp[r]] = y[c*block+r]
		}
	}
	return u
}

// artificialBasis returns a feasible starting basis for the simplex method
// for a one-case program: per row, the artificial column whose sign
// matches the load there.
func (p *program) artificialBasis() []int {
	if p.cases != 1 {
		return nil
	}
	basis := make([]int, p.freeRows)
	first := 2 * len(p.members)
	for r := range basis {
		basis[r] = first + 2*r
		if p.b[r] < 0 {
			basis[r]++
		}
	}
	return basis
}

// warmFor maps the point w of program p onto program next, whose members
// are p's followed by new ones, over the same rows (one case only): the
// new members' columns are marked new (NaN, see warmPoint), the others
// keep their values. It is nil when w is nil or next is not such a
// program.
func (p *program) warmFor(next *program, w *warmPoint) *warmPoint {
	if w == nil || p.cases != 1 || next.cases != 1 || p.freeRows != next.freeRows || len(next.members) < len(p.members) {
		return nil
	}
	for i, c := range p.members {
		if next.members[i] != c {
			return nil
		}
	}
	oldCols, newCols := 2*len(p.members), 2*len(next.members)
	out := &warmPoint{y: append([]float64(nil), w.y...), x: make([]float64, len(next.c)), s: make([]float64, len(next.c))}
	copy(out.x, w.x[:oldCols])
	copy(out.s, w.s[:oldCols])
	for j := oldCols; j < newCols; j++ {
		out.x[j], out.s[j] = math.NaN(), math.NaN()
	}
	copy(out.x[newCols:], w.x[oldCols:])
	copy(out.s[newCols:], w.s[oldCols:])
	return out
}
