package model

import (
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"
)

// TestCoincidentNodesAgreesWithAllPairs compiles random 2D and 3D node
// clouds, some nodes placed on (or within the tolerance of) earlier ones,
// and checks that the nodes reported as coincident are exactly those an
// all-pairs search finds within the tolerance of an earlier node.
func TestCoincidentNodesAgreesWithAllPairs(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for _, dim := range []int{2, 3} {
		for trial := range 20 {
			spec := &Spec{Dimension: dim,
				Materials: []MaterialSpec{{ID: "s", ElasticModulus: Num(1)}},
				Sections:  []SectionSpec{{ID: "a", Area: Num(1)}}}
			n := 50 + rng.IntN(200)
			scale := []float64{1, 1e-3, 1e4}[trial%3]
			for i := range n {
				at := make([]Value, dim)
				if i > 0 && rng.IntN(8) == 0 {
					src := spec.Nodes[rng.IntN(i)].At
					for k := range dim {
						at[k] = Num(src[k].Num * (1 + 1e-12*rng.Float64()))
					}
				} else {
					for k := range dim {
						at[k] = Num(scale * (rng.Float64() - 0.5))
					}
				}
				spec.Nodes = append(spec.Nodes, NodeSpec{ID: fmt.Sprintf("n%d", i), At: at})
			}
			spec.Members = []MemberSpec{{ID: "m", Ends: [2]string{"n0", "n1"}, Material: "s", Section: "a"}}
			c := newCompilerFor(t, spec)
			want := map[string]bool{}
			for i := range n {
				for j := range i {
					d2 := 0.0
					for k := range dim {
						d := c.m.Coords[i*dim+k] - c.m.Coords[j*dim+k]
						d2 += d * d
					}
					if d2 <= c.tol*c.tol {
						want[fmt.Sprintf("nodes/%d/at", i)] = true
					}
				}
			}
			got := map[string]bool{}
			for _, p := range c.problems {
				if strings.HasPrefix(p.Path, "nodes/") && strings.Contains(p.Message, "same point") {
					got[p.Path] = true
				}
			}
			if len(want) == 0 {
				t.Errorf("dim %d trial %d: no coincident nodes to find", dim, trial)
			}
			if fmt.Sprint(got) != fmt.Sprint(want) {
				t.Errorf("dim %d trial %d: reported %v, all pairs %v", dim, trial, got, want)
			}
		}
	}
}

// newCompilerFor runs the compiler on spec and returns it with its
// problems and compiled coordinates.
func newCompilerFor(t *testing.T, spec *Spec) *compiler {
	t.Helper()
	c := &compiler{spec: spec, m: &Model{}, exprs: make(map[string]compiled)}
	c.run()
	return c
}
