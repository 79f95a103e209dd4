package main

import (
	"encoding/json"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gusset/engine/model/modelgen"
	"gusset/protocol"
)

// TestPropertiesOverGeneratedModels sends 200 random planar triangulated
// trusses (random loads on the boundary, random supports) through solve,
// load-path and
// reciprocate in one stream and checks the published identities on every
// one: equilibrium (the scaled residual ‖K·u − f‖/‖f‖ and the balance of
// loads and reactions at round-off), Maxwell's load-path theorem
// Z_T − Z_C = M (J. C. Maxwell, Trans. RSE 26, 1870) at round-off, and the
// closure of the reciprocal force diagram (Maxwell, Phil. Mag. 27, 1864)
// with the Airy stress function's slope jumps equal to the forces.
func TestPropertiesOverGeneratedModels(t *testing.T) {
	const models = 200
	rng := rand.New(rand.NewPCG(2026, 12))
	var in strings.Builder
	forces := map[int][]float64{}
	for i := 0; i < models; i++ {
		m := boundaryLoaded(wireModel(modelgen.RandomPlanarTruss(rng, 10+rng.IntN(60))))
		for _, method := range []string{"solve", "load-path", "reciprocate"} {
			params, _ := json.Marshal(map[string]any{"model": m})
			fmt.Fprintf(&in, `{"jsonrpc":"2.0","id":"%s-%d","method":"%s","params":%s}`+"\n", method, i, method, params)
		}
	}
	_, out, _ := runCapture([]string{"run", "--jobs", "2", "-"}, in.String())
	answers := map[string]json.RawMessage{}
	for _, msg := range readMessages(t, out) {
		if msg["method"] != nil {
			continue
		}
		if msg["error"] != nil {
			t.Errorf("request %v failed: %v", msg["id"], msg["error"])
			continue
		}
		b, _ := json.Marshal(msg["result"])
		answers[fmt.Sprint(msg["id"])] = b
	}
	for i := 0; i < models; i++ {
		var s protocol.SolveResult
		var lp protocol.LoadPathResult
		var rc protocol.ReciprocateResult
		for name, v := range map[string]any{"solve": &s, "load-path": &lp, "reciprocate": &rc} {
			if err := json.Unmarshal(answers[fmt.Sprintf("%s-%d", name, i)], v); err != nil {
				t.Fatalf("model %d %s: %v", i, name, err)
			}
		}
		c := s.Cases[0]
		if c.Residual > 1e-10 || c.BalanceError > 1e-10 {
			t.Errorf("model %d: equilibrium residual %g, balance %g", i, c.Residual, c.BalanceError)
		}
		forces[i] = c.AxialForces
		if r := lp.Cases[0].RelativeResidual; r > 1e-12 {
			t.Errorf("model %d: Maxwell's theorem residual %g", i, r)
		}
		scale := 0.0
		for _, n := range c.AxialForces {
			scale = max(scale, n, -n)
		}
		if rc.Closure.Max > 1e-9*scale {
			t.Errorf("model %d: reciprocal closure %g against forces up to %g", i, rc.Closure.Max, scale)
		}
		for e, jump := range rc.Airy.Jumps {
			if d := jump - c.AxialForces[e]; d > 1e-8*scale || d < -1e-8*scale {
				t.Errorf("model %d member %d: slope jump %g, axial force %g", i, e, jump, c.AxialForces[e])
				break
			}
		}
	}
}

// boundaryLoaded keeps only the loads on the boundary of a generated
// jittered grid (node i, j within 0.2 of the point (i, j)): a load inside a
// network has no place among the spaces of a reciprocal diagram, which
// reciprocate refuses as not planar. It loads the top right corner when no
// load is left.
func boundaryLoaded(m protocol.Model) protocol.Model {
	cols, rows := 0.0, 0.0
	for _, n := range m.Nodes {
		cols, rows = max(cols, math.Round(n.At[0].Value)), max(rows, math.Round(n.At[1].Value))
	}
	onBoundary := map[string]bool{}
	corner := ""
	for _, n := range m.Nodes {
		i, j := math.Round(n.At[0].Value), math.Round(n.At[1].Value)
		onBoundary[n.ID] = i == 0 || j == 0 || i == cols || j == rows
		if i == cols && j == rows {
			corner = n.ID
		}
	}
	c := &m.LoadCases[0]
	kept := c.Loads[:0]
	for _, l := range c.Loads {
		if onBoundary[l.Node] {
			kept = append(kept, l)
		}
	}
	if len(kept) == 0 {
		kept = append(kept, protocol.NodalLoad{Node: corner, Force: []protocol.Number{{Value: 3}, {Value: -7}}})
	}
	c.Loads = kept
	return m
}
