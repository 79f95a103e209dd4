package formfind

import (
	"context"
	"errors"
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/model"
)

// TestTargetLengths checks the force density update for target lengths on
// two members meeting at one loaded node between supports (0, 0) and
// (2, 0): members of length L* = 1.25 put the node at (1, −√(L*² − 1)) =
// (1, −0.75), and vertical equilibrium 2·N·0.75/L* = P gives the force
// N = P·L*/1.5 (statics; closed form derived here).
func TestTargetLengths(t *testing.T) {
	const P, target = 10.0, 1.25
	m := chain(2, 1, P).compile(t)
	l := target
	r := find(t, m, Problem{ForceDensity: one(1), Targets: []Target{{Member: "m0", Length: &l}, {Member: "m1", Length: &l}}})
	if !r.Converged {
		t.Fatalf("not converged after %d iterations: %+v", r.Iterations, r.Targets)
	}
	if !scalar.EqualWithinAbsOrRel(r.Coords[2], 1, 1e-9, 1e-9) || !scalar.EqualWithinAbsOrRel(r.Coords[3], -0.75, 1e-8, 1e-8) {
		t.Errorf("node at (%g, %g), want (1, −0.75)", r.Coords[2], r.Coords[3])
	}
	for e, n := range r.Force {
		if !scalar.EqualWithinAbsOrRel(n, P*target/1.5, 1e-8, 1e-8) {
			t.Errorf("member %d force %g, want %g", e, n, P*target/1.5)
		}
	}
	for _, tr := range r.Targets {
		if tr.Misfit > DefaultTolerance || !scalar.EqualWithinAbsOrRel(tr.Achieved, target, 1e-8, 1e-8) {
			t.Errorf("target %+v not met", tr)
		}
	}
	t.Logf("target lengths met in %d iterations", r.Iterations)
	checkResidual(t, r)
}

// TestTargetForces checks target forces N* on both members of the same
// two-member chain: the node at (1, −y) has L = √(1 + y²) and vertical
// equilibrium 2N*·y/L = P, so 4N*²y² = P²(1 + y²), y = P/√(4N*² − P²);
// with P = 10 and N* = 13, y = 10/24 (closed form derived here).
func TestTargetForces(t *testing.T) {
	const P = 10.0
	m := chain(2, 1, P).compile(t)
	force := 13.0
	r := find(t, m, Problem{ForceDensity: one(4), Targets: []Target{{Member: "m0", Force: &force}, {Member: "m1", Force: &force}}})
	if !r.Converged {
		t.Fatalf("not converged after %d iterations: %+v", r.Iterations, r.Targets)
	}
	if !scalar.EqualWithinAbsOrRel(r.Coords[3], -10.0/24, 1e-8, 1e-8) {
		t.Errorf("node at height %.12g, want −10/24", r.Coords[3])
	}
	for _, n := range r.Force {
		if !scalar.EqualWithinAbsOrRel(n, force, 1e-8, 1e-8) {
			t.Errorf("force %g, want %g", n, force)
		}
	}
	t.Logf("target forces met in %d iterations", r.Iterations)
	checkResidual(t, r)
}

// TestTargetLengthsNet asks the members along the two middle lines of a
// 7 × 7 cable net (border fixed, equal loads) for 1.05 times their plan
// length (12 targets on 75 free coordinates, so they can be met) and
// checks that the iteration meets every target to the tolerance with the
// net in equilibrium for the force densities it reports.
func TestTargetLengthsNet(t *testing.T) {
	b := grid(7, 1)
	m := b.compile(t)
	var targets []Target
	for e, mem := range m.Members {
		a, c := m.Node(mem.Ends[0]), m.Node(mem.Ends[1])
		if a[0] == 3 && c[0] == 3 || a[1] == 3 && c[1] == 3 {
			l := 1.05 * m.Length(e)
			targets = append(targets, Target{Member: mem.ID, Length: &l})
		}
	}
	r := find(t, m, Problem{ForceDensity: one(1), Targets: targets})
	if !r.Converged {
		t.Fatalf("not converged after %d iterations", r.Iterations)
	}
	for _, tr := range r.Targets {
		if tr.Misfit > DefaultTolerance {
			t.Errorf("member %d: length %g, want %g", tr.Member, tr.Achieved, tr.Target)
		}
	}
	t.Logf("%d target lengths met in %d iterations", len(targets), r.Iterations)
	checkResidual(t, r)
}

// grid is a square 3D net of k × k nodes at unit spacing with the border
// fixed at z = 0 and load P down at every inner node.
func grid(k int, P float64) *specBuilder {
	b := newSpec(3)
	id := func(i, j int) string { return fmt.Sprintf("g%d_%d", i, j) }
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			b.node(id(i, j), float64(i), float64(j), 0)
			if i == 0 || j == 0 || i == k-1 || j == k-1 {
				b.fix(id(i, j))
			} else if P != 0 {
				b.load(id(i, j), 0, 0, -P)
			}
			if i > 0 {
				b.member(id(i-1, j), id(i, j))
			}
			if j > 0 {
				b.member(id(i, j-1), id(i, j))
			}
		}
	}
	return b
}

// TestCatenary checks self-weight per length re-lumped on the found form
// against the catenary. A chain of weight w per unit length hung between
// (0, 0) and (l, 0) with horizontal force H takes the catenary
// y(x) = a·cosh((x − l/2)/a) − a·cosh(l/(2a)), a = H/w (J. Bernoulli 1691;
// e.g. S. Timoshenko and D. H. Young, "Engineering Mechanics", McGraw-Hill
// 1956, §5.8, from memory). Equal force densities q over n panels keep the
// nodes at equal horizontal spacing l/n, so H = q·l/n. The discrete chain
// carries its weight lumped at the nodes; it converges to the curve as the
// panels are refined, at second order (central differences).
func TestCatenary(t *testing.T) {
	const l, H, w = 10.0, 8.0, 2.0 // a = 4: a deep chain, sag ≈ 3.4
	a := H / w
	var previous float64
	for _, n := range []int{8, 16, 32, 64, 128} {
		b := chain(n, l/float64(n), 0)
		density := model.Num(w / 1e-3) // weight density × area 1e-3 = w
		b.s.Materials[0].WeightDensity = &density
		b.s.LoadCases[0].SelfWeight = true
		m := b.compile(t)
		r := find(t, m, Problem{ForceDensity: one(H * float64(n) / l)})
		if !r.Converged || r.Change > DefaultTolerance*l {
			t.Fatalf("n=%d: self-weight iteration did not settle: %d iterations, change %g", n, r.Iterations, r.Change)
		}
		var worst float64
		for i := 0; i <= n; i++ {
			x, y := r.Coords[2*i], r.Coords[2*i+1]
			want := a*math.Cosh((x-l/2)/a) - a*math.Cosh(l/(2*a))
			worst = max(worst, math.Abs(y-want))
		}
		rate := 0.0
		if previous > 0 {
			rate = math.Log2(previous / worst)
			if rate < 1.9 || rate > 2.1 {
				t.Errorf("n=%d: convergence rate %.3f, want 2", n, rate)
			}
		}
		t.Logf("n=%3d: max |y − catenary| = %.3e (rate %.2f), %d iterations, final change %.1e", n, worst, rate, r.Iterations, r.Change)
		previous = worst
		checkResidual(t, r)
	}
	if previous > 1e-3 {
		t.Errorf("finest chain %.3g from the catenary", previous)
	}
}

// recorder keeps the iterations reported.
type recorder struct{ iterations []Iteration }

func (r *recorder) Record(stage string, done, total int, it Iteration) {
	if stage == "iterating" {
		r.iterations = append(r.iterations, it)
	}
}

// TestProgressAndCancel checks that every iteration is reported with its
// change, and that a cancelled context stops Find with ctx.Err().
func TestProgressAndCancel(t *testing.T) {
	b := chain(16, 1, 0)
	density := model.Num(1e3)
	b.s.Materials[0].WeightDensity = &density
	b.s.LoadCases[0].SelfWeight = true
	m := b.compile(t)
	rec := &recorder{}
	r, err := Find(t.Context(), m, Problem{ForceDensity: one(3)}, Options{Iterations: rec})
	if err != nil {
		t.Fatal(err)
	}
	if len(rec.iterations) != r.Iterations || rec.iterations[len(rec.iterations)-1].Change != r.Change {
		t.Errorf("reported %d iterations (%+v), result says %d with change %g", len(rec.iterations), rec.iterations, r.Iterations, r.Change)
	}
	ctx, cancel := context.WithCancel(t.Context())
	cancel()
	if _, err := Find(ctx, m, Problem{ForceDensity: one(3)}, Options{}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled: got %v", err)
	}
}

// TestCatenaryThroughSag combines the two iterations: a chain under its own
// weight w per length, sent through a sag f at midspan. The catenary
// through (±l/2, 0) and (0, −f) has a·(cosh(l/(2a)) − 1) = f, and its
// horizontal force is H = w·a (closed form; see TestCatenary), so the
// found force density must give H = q·l/n within the chain's second-order
// discretisation error.
func TestCatenaryThroughSag(t *testing.T) {
	const l, f, w, n = 10.0, 2.0, 2.0, 128
	b := chain(n, l/float64(n), 0)
	density := model.Num(w / 1e-3)
	b.s.Materials[0].WeightDensity = &density
	b.s.LoadCases[0].SelfWeight = true
	m := b.compile(t)
	r := find(t, m, Problem{ForceDensity: one(1), Through: &Through{Node: fmt.Sprintf("c%d", n/2), At: []float64{l / 2, -f}}})
	if !r.Converged || r.ThroughMisfit > 1e-12 {
		t.Fatalf("converged %v after %d iterations, misfit %g", r.Converged, r.Iterations, r.ThroughMisfit)
	}
	// Solve a·(cosh(l/(2a)) − 1) = f for a by bisection (the left side
	// falls as a grows).
	lo, hi := 0.1, 100.0
	for range 200 {
		a := (lo + hi) / 2
		if a*(math.Cosh(l/(2*a))-1) > f {
			lo = a
		} else {
			hi = a
		}
	}
	H := w * (lo + hi) / 2
	if got := r.ForceDensity[0] * l / n; !scalar.EqualWithinAbsOrRel(got, H, 1e-4, 1e-4) {
		t.Errorf("horizontal force %.8g, want w·a = %.8g", got, H)
	}
	t.Logf("H = %.8g against the catenary's %.8g after %d iterations", r.ForceDensity[0]*l/n, H, r.Iterations)
	checkResidual(t, r)
}
