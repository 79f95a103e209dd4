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
// with the Airy stress function's slope jumps equal to the forces. Besides
// the residuals the responses report about themselves, joint equilibrium
// and both sides of Maxwell's theorem are recomputed in the test from the
// model's geometry and loads and the forces and reactions returned.
func TestPropertiesOverGeneratedModels(t *testing.T) {
	const models = 200
	rng := rand.New(rand.NewPCG(2026, 12))
	var in strings.Builder
	forces := map[int][]float64{}
	var generated []protocol.Model
	for i := 0; i < models; i++ {
		m := boundaryLoaded(wireModel(modelgen.RandomPlanarTruss(rng, 10+rng.IntN(60))))
		generated = append(generated, m)
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
		// The residuals above are the code's own report of itself; the
		// checks below recompute both identities here from the model's
		// geometry, its loads and the forces and reactions returned.
		checkJointEquilibrium(t, i, generated[i], c)
		checkMaxwellTheorem(t, i, generated[i], c, lp.Cases[0])
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

// position returns the coordinates of every node of a wire model by id.
func position(m protocol.Model) map[string][2]float64 {
	at := map[string][2]float64{}
	for _, n := range m.Nodes {
		at[n.ID] = [2]float64{n.At[0].Value, n.At[1].Value}
	}
	return at
}

// checkJointEquilibrium sums at every node the pulls of its bars
// (N along the unit vector from the node to the bar's far end, tension
// positive), the loads and the reactions, and wants zero: the method of
// joints (any statics text, common practice), computed here independently
// of the solver. The tolerance is relative to the largest force present.
func checkJointEquilibrium(t *testing.T, i int, m protocol.Model, c protocol.CaseResult) {
	t.Helper()
	at := position(m)
	sum := map[string][2]float64{}
	scale := 0.0
	add := func(node string, fx, fy float64) {
		s := sum[node]
		sum[node] = [2]float64{s[0] + fx, s[1] + fy}
		scale = max(scale, math.Hypot(fx, fy))
	}
	if len(c.AxialForces) != len(m.Members) {
		t.Fatalf("model %d: %d axial forces for %d members", i, len(c.AxialForces), len(m.Members))
	}
	for e, mem := range m.Members {
		p, q := at[mem.Ends[0]], at[mem.Ends[1]]
		l := math.Hypot(q[0]-p[0], q[1]-p[1])
		ux, uy := (q[0]-p[0])/l, (q[1]-p[1])/l
		n := c.AxialForces[e]
		add(mem.Ends[0], n*ux, n*uy)
		add(mem.Ends[1], -n*ux, -n*uy)
	}
	for _, l := range m.LoadCases[0].Loads {
		add(l.Node, l.Force[0].Value, l.Force[1].Value)
	}
	for _, r := range c.Reactions {
		add(r.Node, r.Force[0], r.Force[1])
	}
	if scale == 0 {
		t.Fatalf("model %d: no forces at all", i)
	}
	for node, s := range sum {
		if math.Hypot(s[0], s[1]) > 1e-9*scale {
			t.Errorf("model %d: node %s out of balance by %v (forces up to %g)", i, node, s, scale)
			return
		}
	}
}

// checkMaxwellTheorem recomputes Maxwell's load-path theorem
// Σ N·L = Σ F·r over loads and reactions (J. C. Maxwell, "On reciprocal
// figures, frames, and diagrams of forces", Trans. RSE 26, 1870) from the
// solve result and the geometry, and wants load-path's Z_T − Z_C and M to
// equal the two sides.
func checkMaxwellTheorem(t *testing.T, i int, m protocol.Model, c protocol.CaseResult, lc protocol.LoadPathCase) {
	t.Helper()
	at := position(m)
	sumNL, sumAbs := 0.0, 0.0
	for e, mem := range m.Members {
		p, q := at[mem.Ends[0]], at[mem.Ends[1]]
		nl := c.AxialForces[e] * math.Hypot(q[0]-p[0], q[1]-p[1])
		sumNL += nl
		sumAbs += math.Abs(nl)
	}
	sumFr := 0.0
	for _, l := range m.LoadCases[0].Loads {
		r := at[l.Node]
		sumFr += l.Force[0].Value*r[0] + l.Force[1].Value*r[1]
	}
	for _, re := range c.Reactions {
		r := at[re.Node]
		sumFr += re.Force[0]*r[0] + re.Force[1]*r[1]
	}
	tol := 1e-9 * max(sumAbs, 1)
	if math.Abs(sumNL-sumFr) > tol {
		t.Errorf("model %d: Σ N·L = %g but Σ F·r = %g", i, sumNL, sumFr)
	}
	if d := lc.TensionLoadPath - lc.CompressionLoadPath - sumNL; math.Abs(d) > tol {
		t.Errorf("model %d: Z_T − Z_C = %g, Σ N·L = %g", i, lc.TensionLoadPath-lc.CompressionLoadPath, sumNL)
	}
	if math.Abs(lc.LoadPath-sumAbs) > tol {
		t.Errorf("model %d: Z = %g, Σ |N|·L = %g", i, lc.LoadPath, sumAbs)
	}
	if math.Abs(lc.Constant-sumFr) > tol {
		t.Errorf("model %d: M = %g, Σ F·r = %g", i, lc.Constant, sumFr)
	}
}
