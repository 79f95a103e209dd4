package loadpath

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
)

// steel is a material in kN and m: E = 210 GPa, weight 77 kN/m³, yield
// 235 MPa (common practice values for structural steel).
var steel = model.Material{
	ID: "steel", ElasticModulus: 2.1e8, WeightDensity: 77,
	TensionLimit: 2.35e5, CompressionLimit: 2.35e5,
	CarbonFactor: 1.5, HasCarbonFactor: true,
}

// newModel builds a bar model directly (the compiler is not needed for
// these tests): coords holds one point per node, ends one pair per member.
func newModel(dim int, coords [][]float64, ends [][2]int, mats ...model.Material) *model.Model {
	if len(mats) == 0 {
		mats = []model.Material{steel}
	}
	m := &model.Model{Dim: dim, Units: model.UnitsSpec{Length: "m", Force: "kN"}, Materials: mats,
		Sections: []model.Section{{ID: "s", Area: 1e-3}}}
	for i, p := range coords {
		m.NodeIDs = append(m.NodeIDs, "n"+strconv.Itoa(i))
		m.Coords = append(m.Coords, p[:dim]...)
	}
	for e, ij := range ends {
		m.Members = append(m.Members, model.Member{ID: "m" + strconv.Itoa(e), Ends: ij, BucklingFactor: 1})
	}
	return m
}

// fixity is one restrained freedom: a node and a component (0..Dim-1).
type fixity struct{ node, comp int }

// equilibrium solves the joint equilibrium equations of a pin-jointed model
// for its axial forces and reactions by least squares (minimum norm via the
// SVD, so statically indeterminate models get one particular equilibrium
// solution): at node i, Σ_e N_e·u_ei + R_i + P_i = 0 with u_ei the unit
// vector from node i along member e, tension positive (the method of joints,
// e.g. Hibbeler, Structural Analysis, ch. 3, from memory). It fails the test
// when the loads cannot be balanced, and returns the case with the applied
// loads and reactions together as external forces.
func equilibrium(t testing.TB, m *model.Model, fixed []fixity, loads [][]float64) Case {
	t.Helper()
	d, nn, nm := m.Dim, m.NodeCount(), len(m.Members)
	A := mat.NewDense(d*nn, nm+len(fixed), nil)
	b := mat.NewVecDense(d*nn, nil)
	for e, mem := range m.Members {
		i, j := mem.Ends[0], mem.Ends[1]
		L := m.Length(e)
		for k := 0; k < d; k++ {
			u := (m.Coords[j*d+k] - m.Coords[i*d+k]) / L
			A.Set(i*d+k, e, u)
			A.Set(j*d+k, e, -u)
		}
	}
	for r, f := range fixed {
		A.Set(f.node*d+f.comp, nm+r, 1)
	}
	var bnorm float64
	for i, p := range loads {
		for k, v := range p {
			b.SetVec(i*d+k, -v)
			bnorm += v * v
		}
	}
	var svd mat.SVD
	if !svd.Factorize(A, mat.SVDThin) {
		t.Fatal("equilibrium: SVD failed")
	}
	rank := svd.Rank(1e-12)
	var x mat.VecDense
	svd.SolveVecTo(&x, b, rank)
	var res mat.VecDense
	res.MulVec(A, &x)
	res.SubVec(&res, b)
	if r := mat.Norm(&res, 2); r > 1e-10*math.Sqrt(bnorm) {
		t.Fatalf("equilibrium: loads cannot be balanced (residual %g)", r)
	}
	c := Case{ID: "test", AxialForce: make([]float64, nm), External: make([][]float64, nn)}
	for e := range c.AxialForce {
		c.AxialForce[e] = x.AtVec(e)
	}
	for i := range c.External {
		c.External[i] = make([]float64, d)
		if i < len(loads) && loads[i] != nil {
			copy(c.External[i], loads[i])
		}
	}
	for r, f := range fixed {
		c.External[f.node][f.comp] += x.AtVec(nm + r)
	}
	return c
}

// randomTruss builds a generically rigid truss by Henneberg's first
// construction (each new node joined to Dim existing nodes), with extra
// random members that make it statically indeterminate, restrained against
// rigid motion only, and loaded at every node by random forces.
func randomTruss(rng *rand.Rand, dim, nodes, extra int) (*model.Model, []fixity, [][]float64) {
	coords := make([][]float64, nodes)
	for i := range coords {
		coords[i] = make([]float64, dim)
		for k := range coords[i] {
			coords[i][k] = 10 * rng.Float64()
		}
	}
	has := map[[2]int]bool{}
	var ends [][2]int
	join := func(i, j int) {
		if i > j {
			i, j = j, i
		}
		if i != j && !has[[2]int{i, j}] {
			has[[2]int{i, j}] = true
			ends = append(ends, [2]int{i, j})
		}
	}
	for i := 0; i <= dim; i++ {
		for j := 0; j < i; j++ {
			join(i, j)
		}
	}
	for i := dim + 1; i < nodes; i++ {
		for _, j := range rng.Perm(i)[:dim] {
			join(i, j)
		}
	}
	for len(ends) < (nodes-dim-1)*dim+dim*(dim+1)/2+extra {
		join(rng.IntN(nodes), rng.IntN(nodes))
	}
	var fixed []fixity
	if dim == 2 {
		fixed = []fixity{{0, 0}, {0, 1}, {1, 1}}
	} else {
		fixed = []fixity{{0, 0}, {0, 1}, {0, 2}, {1, 1}, {1, 2}, {2, 2}}
	}
	loads := make([][]float64, nodes)
	for i := range loads {
		loads[i] = make([]float64, dim)
		for k := range loads[i] {
			loads[i][k] = 20*rng.Float64() - 10
		}
	}
	return newModel(dim, coords, ends), fixed, loads
}

// twoBar is the symmetric two-bar truss: supports at (±a, 0), apex at
// (0, h) carrying P downward. By vertical equilibrium of the apex,
// 2·|N|·h/L = P with L = sqrt(a² + h²), so each bar carries N = −P·L/(2h)
// (compression) and the supports react with (±P·a/(2h), P/2) (pushed outward
// by the bars). Hence Z = 2·|N|·L = P·L²/h = P(a² + h²)/h, the classic
// result (e.g. Michell, Phil. Mag. 1904; any statics text).
func twoBar(a, h, P float64) (*model.Model, Case) {
	m := newModel(2, [][]float64{{-a, 0}, {a, 0}, {0, h}}, [][2]int{{0, 2}, {1, 2}})
	L := math.Hypot(a, h)
	n := -P * L / (2 * h)
	return m, Case{ID: "P", AxialForce: []float64{n, n},
		External: [][]float64{{P * a / (2 * h), P / 2}, {-P * a / (2 * h), P / 2}, {0, -P}}}
}

// pratt builds a rectangular Pratt truss of even panel count N, panel width
// d and depth h: bottom nodes 0..N at (i·d, 0), top nodes N+1..2N+1 above
// them, end and interior verticals, both chords, and in each panel a
// diagonal running down towards mid-span (so it is in tension under
// gravity). A pin at the left bottom node and a roller at the right one; a
// load P downward at every interior bottom node.
func pratt(N int, d, h, P float64) (*model.Model, []fixity, [][]float64) {
	var coords [][]float64
	for i := 0; i <= N; i++ {
		coords = append(coords, []float64{float64(i) * d, 0})
	}
	for i := 0; i <= N; i++ {
		coords = append(coords, []float64{float64(i) * d, h})
	}
	top := func(i int) int { return N + 1 + i }
	var ends [][2]int
	for i := 0; i < N; i++ {
		ends = append(ends, [2]int{i, i + 1}, [2]int{top(i), top(i + 1)})
		if i < N/2 {
			ends = append(ends, [2]int{top(i), i + 1})
		} else {
			ends = append(ends, [2]int{i, top(i + 1)})
		}
	}
	for i := 0; i <= N; i++ {
		ends = append(ends, [2]int{i, top(i)})
	}
	loads := make([][]float64, len(coords))
	for i := 1; i < N; i++ {
		loads[i] = []float64{0, -P}
	}
	return newModel(2, coords, ends), []fixity{{0, 0}, {0, 1}, {N, 1}}, loads
}

// nanSlice returns a slice of n NaNs, so entries never written show.
func nanSlice(n int) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = math.NaN()
	}
	return s
}
