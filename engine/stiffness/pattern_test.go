package stiffness

import (
	"context"
	"math/rand/v2"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
	"gusset/engine/progress"
	"gusset/engine/sparse"
)

// tripletStiffness assembles K and the settlement right-hand side the
// textbook way, K = Σ over members of the element blocks added entry by
// entry (W. McGuire, R. H. Gallagher and R. D. Ziemian, "Matrix Structural
// Analysis", 2nd ed., 2000, sec. 2.6, the direct stiffness method; from
// memory), with triplets summed by sparse.Builder.
func tripletStiffness(m *model.Model, nb *numbering) (*sparse.Matrix, []float64) {
	b := sparse.NewBuilder(nb.equations, 0)
	settle := make([]float64, nb.equations)
	var el element
	var kg [144]float64
	for e := range m.Members {
		el.build(m, nb, e)
		el.globalStiffness(kg[:])
		n := el.size
		for i := range n {
			ei := nb.equation[el.dofs[i]]
			if ei < 0 {
				continue
			}
			for j := range n {
				ej := nb.equation[el.dofs[j]]
				if ej < 0 {
					settle[ei] -= kg[i*n+j] * nb.prescribed[el.dofs[j]]
					continue
				}
				if ej <= ei {
					b.Add(ei, ej, kg[i*n+j])
				}
			}
		}
	}
	for eq, f := range nb.freedomOf {
		b.Add(eq, eq, nb.spring[f])
	}
	return b.Matrix(), settle
}

// TestPatternAssemblyMatchesTriplets checks the assembly into the pattern
// built from the connectivity (positions found by arithmetic, members
// shared among workers) against the triplet assembly: the same structure,
// entry for entry, and the same values, on bar, beam and mixed models with
// a settlement, for one to three workers. The values are sums of the same
// terms in the same (member) order, so they must agree exactly.
func TestPatternAssemblyMatchesTriplets(t *testing.T) {
	for _, tc := range []struct {
		name  string
		spec  *model.Spec
		mixed bool // every third member of a frame becomes a bar
	}{
		{"grid truss", modelgen.GridTruss2D(18, 18), false},
		{"space truss", modelgen.SpaceTruss3D(35, 36), false},
		{"random planar truss", modelgen.RandomPlanarTruss(rand.New(rand.NewPCG(1, 2)), 300), false},
		{"plane frame", modelgen.Frame2D(20, 24), false},
		{"space frame", modelgen.Frame3D(5, 5, 10), false},
		{"mixed space frame", modelgen.Frame3D(5, 5, 10), true},
		{"large plane frame", modelgen.Frame2D(50, 100), true},
	} {
		m := modelgen.Must(tc.spec)
		if tc.mixed {
			for e := range m.Members {
				if e%3 == 0 {
					m.Members[e].Kind = model.Bar
				}
			}
		}
		for c := range m.Dim {
			if m.Supports[0].Fixed[c] {
				m.Supports[0].Displacement[c] = 1e-3
			}
		}
		nb := newNumbering(m)
		ref, settle := tripletStiffness(m, nb)
		for _, workers := range []int{1, 2, 3} {
			sys, err := assemble(context.Background(), m, nb, newPattern(m, nb), workers, progress.Or(nil))
			if err != nil {
				t.Fatal(err)
			}
			a := sys.k
			if a.N != ref.N || a.Nonzeros() != ref.Nonzeros() {
				t.Fatalf("%s, %d workers: order %d with %d entries, want %d with %d", tc.name, workers, a.N, a.Nonzeros(), ref.N, ref.Nonzeros())
			}
			for j := range a.N {
				for p := ref.ColPtr[j]; p < ref.ColPtr[j+1]; p++ {
					i := ref.RowIdx[p]
					if a.ColPtr[j] != ref.ColPtr[j] || a.RowIdx[p] != i {
						t.Fatalf("%s, %d workers: structure differs in column %d", tc.name, workers, j)
					}
					// assemble scales to unit diagonal in place.
					if want := ref.Val[p] * (sys.scale[j] * sys.scale[i]); a.Val[p] != want {
						t.Fatalf("%s, %d workers: K(%d,%d) = %v, want %v", tc.name, workers, i, j, a.Val[p], want)
					}
				}
			}
			for i := range settle {
				if sys.settle[i] != settle[i] {
					t.Fatalf("%s, %d workers: settlement load %d = %v, want %v", tc.name, workers, i, sys.settle[i], settle[i])
				}
			}
		}
	}
}
