package modes

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"

	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// TestBeamFrequencies checks the first two bending frequencies of a
// simply supported and of a cantilever beam against ω = β²·√(EI/(ρA·L⁴))
// with β₁L = π, β₂L = 2π (so the second is 4× the first) and β₁L =
// 1.875104, β₂L = 4.694091 (6.267×) (R. D. Blevins, "Formulas for Natural
// Frequency and Mode Shape", Van Nostrand Reinhold 1979, Table 8-1; from
// memory). Consistent mass gives upper bounds.
func TestBeamFrequencies(t *testing.T) {
	const L, elements = 10.0, 16
	scale := math.Sqrt(testE * testI / (testRho * testA * L * L * L * L))
	cases := []struct {
		name  string
		betaL [2]float64
		fix   func(b *testModel, first, last int)
	}{
		{"simply supported", [2]float64{math.Pi, 2 * math.Pi}, func(b *testModel, first, last int) {
			b.fix(first, model.X, model.Y)
			b.fix(last, model.Y)
		}},
		{"cantilever", [2]float64{1.8751040687, 4.6940911330}, func(b *testModel, first, last int) {
			b.fix(first, model.X, model.Y, model.RZ)
		}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			b := newTestModel(2)
			nodes := b.line([]float64{0, 0}, []float64{L, 0}, elements, model.Beam)
			c.fix(b, nodes[0], nodes[elements])
			res, err := Vibration(context.Background(), b.m, Options{Count: 2})
			if err != nil {
				t.Fatal(err)
			}
			for k, bl := range c.betaL {
				want := bl * bl * scale
				got := res.Modes[k].Angular
				if rel := (got - want) / want; rel < -1e-12 || rel > 1e-4 {
					t.Errorf("mode %d: ω = %.8g rad/s, Blevins %.8g (%.2g relative)", k+1, got, want, rel)
				}
				if f := res.Modes[k].Frequency; math.Abs(f*2*math.Pi-got) > 1e-12*got {
					t.Errorf("mode %d: %g Hz is not ω/2π", k+1, f)
				}
			}
		})
	}
}

// TestTautChain checks the transverse vibration of a pin-jointed chain of
// n bars under tension T between fixed ends, whose stiffness is the
// geometric (string) term alone, against the closed form of the discrete
// chain with consistent bar masses, ω_k² = (6T/(μh²))·(1 − cos κ)/(2 + cos κ),
// κ = kπ/n (the dispersion relation of linear elements with consistent
// mass, obtained by substituting sin(jκ) into the element equations:
// T. J. R. Hughes, "The Finite Element Method", Prentice-Hall 1987,
// §9.2; from memory), which tends to the string's (kπ/L)²·T/μ.
func TestTautChain(t *testing.T) {
	const L, n, tension = 12.0, 24, 50.0
	b := newTestModel(2)
	nodes := b.line([]float64{0, 0}, []float64{L, 0}, n, model.Bar)
	for i, node := range nodes {
		if i == 0 || i == n {
			b.fix(node, model.X, model.Y)
		} else {
			b.fix(node, model.X)
		}
	}
	m := b.m
	mx, err := stiffness.Assemble(context.Background(), m, stiffness.Options{})
	if err != nil {
		t.Fatal(err)
	}
	ends := make([][]float64, n)
	for e := range ends {
		ends[e] = []float64{-tension, 0, tension, 0}
	}
	negKG, _ := geometric(mx, m, ends)
	// K is zero in y; K + K_G = −B.
	s := mx.NewMatrix()
	for i := range s.Val {
		s.Val[i] = mx.K.Val[i] - negKG.Val[i]
	}
	var res Result
	mass, err := massMatrix(mx, m, &res)
	if err != nil {
		t.Fatal(err)
	}
	pairs, err := solvePencil(context.Background(), &stiffness.Matrices{K: s, Symbolic: mx.Symbolic}, mass, Options{Count: 4}.withDefaults(), true, &res)
	if err != nil {
		t.Fatal(err)
	}
	h, mu := L/n, testRho*testA
	for k, p := range pairs {
		kappa := float64(k+1) * math.Pi / n
		want := 6 * tension / (mu * h * h) * (1 - math.Cos(kappa)) / (2 + math.Cos(kappa))
		if rel := math.Abs(p.value-want) / want; rel > 1e-9 {
			t.Errorf("mode %d: ω² = %.12g, discrete chain %.12g (%.2g)", k+1, p.value, want, rel)
		}
		str := math.Pow(float64(k+1)*math.Pi/L, 2) * tension / mu
		if rel := math.Abs(p.value-str) / str; rel > 0.03 {
			t.Errorf("mode %d: ω² = %g, string %g", k+1, p.value, str)
		}
	}
}

// TestOrthogonality checks φᵢᵀ·M·φⱼ = δᵢⱼ and the residuals of the modes
// of a 2D frame and a 3D frame to 1e-8 (the defining properties of a
// mass-normalised eigenbasis; common practice).
func TestOrthogonality(t *testing.T) {
	for _, tc := range []struct {
		name string
		m    *model.Model
	}{{"frame2D", frame2D(3, 4)}, {"frame3D", frame3D()}} {
		t.Run(tc.name, func(t *testing.T) {
			res, err := Vibration(context.Background(), tc.m, Options{Count: 8})
			if err != nil {
				t.Fatal(err)
			}
			mx, _ := stiffness.Assemble(context.Background(), tc.m, stiffness.Options{})
			mass, _ := massMatrix(mx, tc.m, &Result{})
			ys := make([][]float64, len(res.Modes))
			for k, md := range res.Modes {
				ys[k] = scaledVector(tc.m, mx, md)
				if md.Residual > 1e-8 {
					t.Errorf("mode %d residual %g", k, md.Residual)
				}
				// The residual again, here.
				sy, my := make([]float64, mx.K.N), make([]float64, mx.K.N)
				mx.K.MulVec(sy, ys[k])
				mass.MulVec(my, ys[k])
				lam := md.Angular * md.Angular
				den := floats.Norm(sy, 2) + lam*floats.Norm(my, 2)
				floats.AddScaled(sy, -lam, my)
				if r := floats.Norm(sy, 2) / den; r > 1e-8 {
					t.Errorf("mode %d: recomputed residual %g", k, r)
				}
			}
			my := make([]float64, mx.K.N)
			for i := range ys {
				mass.MulVec(my, ys[i])
				for j := range ys {
					want := 0.0
					if i == j {
						want = 1
					}
					if d := math.Abs(floats.Dot(ys[j], my) - want); d > 1e-8 {
						t.Errorf("φ%dᵀMφ%d off by %g", j, i, d)
					}
				}
			}
			var sum float64
			for _, md := range res.Modes {
				sum += md.EffectiveMass[0]
			}
			if sum > res.TotalMass[0]*(1+1e-12) {
				t.Errorf("effective masses in x sum to %g, above the total %g", sum, res.TotalMass[0])
			}
		})
	}
}

// scaledVector returns the mode's shape in mx's scaled coordinates.
func scaledVector(m *model.Model, mx *stiffness.Matrices, md Mode) []float64 {
	y := make([]float64, mx.K.N)
	for i := range y {
		n, c := mx.Node[i], mx.Component[i]
		var v float64
		switch {
		case c < m.Dim:
			v = md.Displacements[n][c]
		case m.Dim == 2:
			v = md.Rotations[n][0]
		default:
			v = md.Rotations[n][c-model.RX]
		}
		y[i] = v / mx.Scale[i]
	}
	return y
}

// TestFreeFloating checks that a structure with no supports gives its
// rigid-body modes (three in the plane) as mechanisms at zero frequency
// and then its first elastic mode, a free-free beam's β₁L = 4.730041
// (Blevins 1979, Table 8-1; from memory).
func TestFreeFloating(t *testing.T) {
	const L, elements = 10.0, 16
	b := newTestModel(2)
	b.line([]float64{0, 0}, []float64{L, 0}, elements, model.Beam)
	res, err := Vibration(context.Background(), b.m, Options{Count: 4})
	if err != nil {
		t.Fatal(err)
	}
	for k := range 3 {
		if !res.Modes[k].Mechanism || res.Modes[k].Frequency != 0 {
			t.Errorf("mode %d: %+v Hz, want a zero-frequency mechanism", k, res.Modes[k].Frequency)
		}
	}
	want := 4.730041 * 4.730041 * math.Sqrt(testE*testI/(testRho*testA*L*L*L*L))
	if got := res.Modes[3].Angular; math.Abs(got-want)/want > 1e-4 || res.Modes[3].Mechanism {
		t.Errorf("first elastic mode ω = %g, want %g", got, want)
	}
	if len(res.Warnings) == 0 {
		t.Error("no warning about the singular stiffness")
	}
}

// TestNoMass checks the error for a model without any mass.
func TestNoMass(t *testing.T) {
	m := frame2D(1, 1)
	m.Materials[0].HasMassDensity = false
	if _, err := Vibration(context.Background(), m, Options{}); err == nil {
		t.Fatal("no error without mass")
	}
}
