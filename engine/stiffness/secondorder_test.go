package stiffness

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"gusset/engine/fault"
)

// cantileverColumn builds a cantilever column of n beam elements, L high along y,
// fixed at its base, with an end load (H across, −P along) at its top.
func cantileverColumn(n int, L, ei, ea, H, P float64) (*builder, int) {
	bl := newBuilder(2, 1, 0, ea, ei, 0, 0)
	prev := bl.node(0, 0)
	bl.fix(prev, fixed2...)
	for i := 1; i <= n; i++ {
		next := bl.node(0, L*float64(i)/float64(n))
		bl.beam(prev, next)
		prev = next
	}
	bl.force(prev, [3]float64{H, -P}, [3]float64{})
	return bl, prev
}

// TestPDeltaCantilever checks the second-order response of a cantilever
// column under an axial load P and an end lateral load H. The exact
// beam-column solution (S. P. Timoshenko and J. M. Gere, "Theory of
// Elastic Stability", 2nd ed., McGraw-Hill 1961, §1.11, from memory; also
// derived here from EI·d²y/dx² = H·(L − x) + P·(δ − y)) with k = √(P/EI) and
// u = kL gives the tip deflection δ = H·(tan u − u)/(P·k), which is
// 3(tan u − u)/u³ times the first-order H·L³/(3EI), and the base moment
// H·tan(u)/k, tan(u)/u times H·L. A column of 32 elements with the
// string (P-Δ) geometric stiffness on each chord reaches both within
// 0.1%. The usual approximation 1/(1 − P/P_cr) with P_cr = π²EI/(4L²)
// (W.-F. Chen and E. M. Lui, "Structural Stability", Elsevier 1987, §1.7,
// from memory) is within 2% at P = P_cr/2, and Rayleigh's quotient bounds
// the critical factor P_cr/P from above, within 1%.
func TestPDeltaCantilever(t *testing.T) {
	const L, ei, ea, H = 5.0, 2000.0, 2e6, 1.0
	pcr := math.Pi * math.Pi * ei / (4 * L * L)
	for _, ratio := range []float64{0.25, 0.5, 0.8} {
		P := ratio * pcr
		bl, top := cantileverColumn(32, L, ei, ea, H, P)
		res, err := Solve(context.Background(), bl.m, Options{SecondOrder: &SecondOrder{}})
		if err != nil {
			t.Fatal(err)
		}
		r := &res.Cases[0]
		u := math.Sqrt(P/ei) * L
		exact := 3 * (math.Tan(u) - u) / (u * u * u)
		near(t, "tip deflection", r.Displacements[top][0], exact*H*L*L*L/(3*ei), 1e-3)
		near(t, "amplification", r.Iteration.Amplification, exact, 1e-3)
		near(t, "base moment", r.Reactions[0].Moment[0], H*L*math.Tan(u)/u, 1e-3)
		near(t, "approximate amplification", r.Iteration.Amplification, 1/(1-ratio), 0.02)
		if lam := r.Iteration.CriticalFactor; lam < 0.999/ratio || lam > 1.01/ratio {
			t.Errorf("P/P_cr = %g: critical factor bound %g, want a little above %g", ratio, lam, 1/ratio)
		}
		if r.Residual > 1e-10 {
			t.Errorf("residual %g", r.Residual)
		}
	}
}

// TestPDeltaBeyondCritical checks the fault at and beyond the critical
// load (P_cr = π²EI/(4L²), Euler's cantilever, from memory): K + K_G is
// not positive definite, and the error says so, names the case, and
// bounds the critical factor on the applied forces by one inverse
// iteration from the first-order deflection: at most 0.91 ≈ 1/1.1.
func TestPDeltaBeyondCritical(t *testing.T) {
	const L, ei, ea, H = 5.0, 2000.0, 2e6, 1.0
	pcr := math.Pi * math.Pi * ei / (4 * L * L)
	for _, path := range []Path{Dense, Sparse} {
		bl, _ := cantileverColumn(32, L, ei, ea, H, 1.1*pcr)
		_, err := Solve(context.Background(), bl.m, Options{Path: path, SecondOrder: &SecondOrder{}})
		var fe *fault.Error
		if !errors.As(err, &fe) || fe.Kind != fault.Unstable || !strings.Contains(fe.Message, "critical load") || !strings.Contains(fe.Message, `"case"`) ||
			!strings.Contains(fe.Message, "at most 0.909") {
			t.Errorf("path %s: error %v, want the critical-load fault for case \"case\"", path, err)
		}
	}
}

// TestPDeltaLinearWithoutCompression checks that second order changes
// nothing where no member carries an axial force: a cantilever with a
// lateral load alone gives the first-order tip deflection H·L³/(3EI)
// (Euler–Bernoulli, from memory) with amplification 1.
func TestPDeltaLinearWithoutCompression(t *testing.T) {
	const L, ei, ea, H = 5.0, 2000.0, 2e6, 1.0
	bl, top := cantileverColumn(4, L, ei, ea, H, 0)
	r := solve1(t, bl.m, Options{SecondOrder: &SecondOrder{}})
	near(t, "tip", r.Displacements[top][0], H*L*L*L/(3*ei), 1e-9)
	near(t, "amplification", r.Iteration.Amplification, 1, 1e-9)
}

// TestPDeltaIterationLimit checks the refusal of a case still changing
// when the solves run out: one solve cannot settle a second-order
// iteration, which needs two to compare.
func TestPDeltaIterationLimit(t *testing.T) {
	bl, _ := cantileverColumn(8, 5, 2000, 2e6, 1, 50)
	_, err := Solve(context.Background(), bl.m, Options{SecondOrder: &SecondOrder{MaxIterations: 1}})
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.NoSolution || !strings.Contains(fe.Message, "did not settle in 1 solves") {
		t.Errorf("error %v, want NoSolution after 1 solve", err)
	}
}

// TestPDeltaMeshConvergence checks how the chord-only (P-Δ) geometric
// stiffness reaches the exact beam-column tip deflection of
// TestPDeltaCantilever (Timoshenko & Gere 1961, from memory) as the
// column is divided: the error falls by about four at each halving of
// the elements (second order in their length, as a chord approximation
// of the curvature's P-δ effect does).
func TestPDeltaMeshConvergence(t *testing.T) {
	const L, ei, ea, H = 5.0, 2000.0, 2e6, 1.0
	P := 0.6 * math.Pi * math.Pi * ei / (4 * L * L)
	u := math.Sqrt(P/ei) * L
	exact := H * (math.Tan(u) - u) / (P * u / L)
	prev := 0.0
	for _, n := range []int{2, 4, 8, 16} {
		bl, top := cantileverColumn(n, L, ei, ea, H, P)
		r := solve1(t, bl.m, Options{SecondOrder: &SecondOrder{Tolerance: 1e-10}})
		e := math.Abs(r.Displacements[top][0]-exact) / exact
		if prev > 0 && !(e < prev/3 && e > prev/5) {
			t.Errorf("%d elements: error %.3g after %.3g, want about a quarter", n, e, prev)
		}
		prev = e
	}
}
