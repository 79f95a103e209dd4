package loadpath

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/model"
)

// TestMaxwellRandom checks Maxwell's load-path theorem, Z_T − Z_C = M
// (J. C. Maxwell, "On reciprocal figures, frames and diagrams of forces",
// Trans. Roy. Soc. Edinburgh 26, 1870), on random rigid trusses in 2D and
// 3D, statically determinate and indeterminate, whose forces come from the
// test's own joint-equilibrium solve. It must hold to round-off, and the
// resultant of loads and reactions must vanish.
func TestMaxwellRandom(t *testing.T) {
	for _, tc := range []struct {
		dim, nodes, extra int
	}{
		{2, 4, 0}, {2, 12, 0}, {2, 30, 10}, {2, 120, 40},
		{3, 5, 0}, {3, 15, 0}, {3, 40, 15}, {3, 100, 30},
	} {
		for seed := uint64(1); seed <= 5; seed++ {
			name := fmt.Sprintf("dim=%d/nodes=%d/extra=%d/seed=%d", tc.dim, tc.nodes, tc.extra, seed)
			t.Run(name, func(t *testing.T) {
				rng := rand.New(rand.NewPCG(seed, 7))
				m, fixed, loads := randomTruss(rng, tc.dim, tc.nodes, tc.extra)
				c := equilibrium(t, m, fixed, loads)
				res, err := Compute(m, []Case{c}, Options{})
				if err != nil {
					t.Fatal(err)
				}
				r := res.Cases[0]
				if r.RelativeResidual > 1e-12 {
					t.Errorf("Maxwell residual %g (relative %g): Z_T=%g Z_C=%g M=%g",
						r.Residual, r.RelativeResidual, r.TensionLoadPath, r.CompressionLoadPath, r.Constant)
				}
				if r.RelativeResultant > 1e-12 {
					t.Errorf("resultant %v not zero (relative %g)", r.Resultant, r.RelativeResultant)
				}
				if !scalar.EqualWithinAbsOrRel(r.LoadPath, r.TensionLoadPath+r.CompressionLoadPath, 0, 1e-14) {
					t.Errorf("Z=%g is not Z_T+Z_C=%g", r.LoadPath, r.TensionLoadPath+r.CompressionLoadPath)
				}
			})
		}
	}
}

// TestTwoBar checks the symmetric two-bar truss under a central load P over
// span 2a at depth h: Z = P(a² + h²)/h (derived beside twoBar; a classic of
// optimal-truss theory, A. G. M. Michell, "The limits of economy of material
// in frame-structures", Phil. Mag. 8, 1904), all of it in compression, and
// M = Σ F·r = −P·h − 2·a·P·a/(2h) = −P(a² + h²)/h = −Z, as Maxwell's theorem
// requires with Z_T = 0.
func TestTwoBar(t *testing.T) {
	for _, tc := range []struct{ a, h, P float64 }{
		{1, 1, 1}, {3, 1, 10}, {2, 5, 7.5}, {0.01, 0.3, 1e6}, {4, 4, 100},
	} {
		m, c := twoBar(tc.a, tc.h, tc.P)
		res, err := Compute(m, []Case{c}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		r := res.Cases[0]
		want := tc.P * (tc.a*tc.a + tc.h*tc.h) / tc.h
		const tol = 1e-13
		if !scalar.EqualWithinAbsOrRel(r.LoadPath, want, 0, tol) ||
			!scalar.EqualWithinAbsOrRel(r.CompressionLoadPath, want, 0, tol) ||
			r.TensionLoadPath != 0 ||
			!scalar.EqualWithinAbsOrRel(r.Constant, -want, 0, tol) {
			t.Errorf("%+v: Z=%g Z_T=%g Z_C=%g M=%g, want Z=Z_C=−M=%g", tc, r.LoadPath, r.TensionLoadPath, r.CompressionLoadPath, r.Constant, want)
		}
		if r.RelativeResidual > 1e-14 {
			t.Errorf("%+v: relative residual %g", tc, r.RelativeResidual)
		}
	}
}

// TestPrattBySections checks a rectangular Pratt truss (N panels of width d,
// depth h, load P at each interior bottom node, simply supported) against
// its load path derived by the method of sections. With R = (N−1)P/2 and
// the shear in panel i (left half, 0-based) V_i = R − iP:
//   - diagonal i carries V_i·L_d/h in tension (L_d² = d² + h²), so
//     |N|·L = V_i(d² + h²)/h;
//   - vertical i (i < N/2) carries V_i in compression, |N|·L = V_i·h; the
//     mid-span vertical carries nothing;
//   - with M_k = P·d·k(N − k)/2 the bending moment at panel point k, the
//     bottom chord of panel i carries M_i/h and the top chord M_{i+1}/h.
//
// Σ_{i<N/2} V_i = P·N²/8 and Σ_{k=1}^{N−1} k(N−k) = (N³ − N)/6, so
//
//	Z(h) = (P·d²/h)·[(N³ − N)/6 + N²/4] + P·N²·h/2,
//
// and since loads and reactions act on the bottom chord (y = 0) and are
// vertical, M = 0 and Z_T = Z_C = Z/2. The forces come from the test's
// joint-equilibrium solve, independent of this derivation.
func TestPrattBySections(t *testing.T) {
	for _, tc := range []struct {
		N       int
		d, h, P float64
	}{
		{2, 3, 2, 10}, {4, 2.5, 3, 10}, {6, 1, 0.5, 1}, {8, 4, 6, 35}, {12, 2, 1.7, 3},
	} {
		m, fixed, loads := pratt(tc.N, tc.d, tc.h, tc.P)
		c := equilibrium(t, m, fixed, loads)
		res, err := Compute(m, []Case{c}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		r := res.Cases[0]
		n := float64(tc.N)
		want := tc.P*tc.d*tc.d/tc.h*((n*n*n-n)/6+n*n/4) + tc.P*n*n*tc.h/2
		const tol = 1e-11
		if !scalar.EqualWithinAbsOrRel(r.LoadPath, want, 0, tol) {
			t.Errorf("%+v: Z=%.15g, want %.15g", tc, r.LoadPath, want)
		}
		if !scalar.EqualWithinAbsOrRel(r.TensionLoadPath, want/2, 0, tol) ||
			!scalar.EqualWithinAbsOrRel(r.CompressionLoadPath, want/2, 0, tol) ||
			!scalar.EqualWithinAbsOrRel(r.Constant, 0, want*1e-13, 0) {
			t.Errorf("%+v: Z_T=%g Z_C=%g M=%g, want Z/2, Z/2, 0", tc, r.TensionLoadPath, r.CompressionLoadPath, r.Constant)
		}
	}
}

// TestInvariance checks properties any load path must have (common
// practice: Z is a sum over members of quantities that depend only on
// member forces and lengths): Z, Z_T, Z_C and M do not change when nodes
// and members are renumbered or when the whole structure and its forces are
// moved rigidly (rotated and translated), and M does not change when the
// origin alone moves, because the external forces balance (ΣF = 0, so
// Σ F·(r + t) = Σ F·r).
func TestInvariance(t *testing.T) {
	for _, dim := range []int{2, 3} {
		rng := rand.New(rand.NewPCG(uint64(dim), 99))
		m, fixed, loads := randomTruss(rng, dim, 25, 8)
		c := equilibrium(t, m, fixed, loads)
		base, err := Compute(m, []Case{c}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		b := base.Cases[0]

		// Renumbering.
		pn, pm := rng.Perm(m.NodeCount()), rng.Perm(len(m.Members))
		coords := make([][]float64, m.NodeCount())
		ext := make([][]float64, m.NodeCount())
		for old, nw := range pn {
			coords[nw] = m.Coords[old*dim : (old+1)*dim]
			ext[nw] = c.External[old]
		}
		ends := make([][2]int, len(m.Members))
		force := nanSlice(len(m.Members))
		for old, nw := range pm {
			e := m.Members[old].Ends
			ends[nw] = [2]int{pn[e[1]], pn[e[0]]}
			force[nw] = c.AxialForce[old]
		}
		renumbered := newModel(dim, coords, ends)

		// Rigid motion: a rotation about an axis (z in 2D) and a
		// translation; forces rotate with the structure.
		rot := rotation(dim, 0.7, 0.3)
		shift := []float64{13, -4, 2.5}
		moved := make([][]float64, m.NodeCount())
		movedExt := make([][]float64, m.NodeCount())
		for i := range moved {
			moved[i] = rotate(rot, m.Coords[i*dim:(i+1)*dim])
			movedExt[i] = rotate(rot, c.External[i])
			for k := range moved[i] {
				moved[i][k] += shift[k]
			}
		}
		mEnds := make([][2]int, len(m.Members))
		for e := range mEnds {
			mEnds[e] = m.Members[e].Ends
		}
		rigid := newModel(dim, moved, mEnds)

		// Origin moved, forces unchanged.
		translated := make([][]float64, m.NodeCount())
		for i := range translated {
			translated[i] = append([]float64(nil), m.Coords[i*dim:(i+1)*dim]...)
			for k := range translated[i] {
				translated[i][k] -= 1e3 * shift[k]
			}
		}
		shifted := newModel(dim, translated, mEnds)

		for _, v := range []struct {
			name string
			res  CaseResult
		}{
			{"renumbered", mustCompute(t, renumbered, Case{AxialForce: force, External: ext}).Cases[0]},
			{"rigid motion", mustCompute(t, rigid, Case{AxialForce: c.AxialForce, External: movedExt}).Cases[0]},
			{"origin moved", mustCompute(t, shifted, c).Cases[0]},
		} {
			const tol = 1e-12
			if !scalar.EqualWithinAbsOrRel(v.res.LoadPath, b.LoadPath, 0, tol) ||
				!scalar.EqualWithinAbsOrRel(v.res.TensionLoadPath, b.TensionLoadPath, 0, tol) ||
				!scalar.EqualWithinAbsOrRel(v.res.CompressionLoadPath, b.CompressionLoadPath, 0, tol) {
				t.Errorf("dim=%d %s: Z=%g Z_T=%g Z_C=%g, want %g %g %g", dim, v.name,
					v.res.LoadPath, v.res.TensionLoadPath, v.res.CompressionLoadPath, b.LoadPath, b.TensionLoadPath, b.CompressionLoadPath)
			}
			// M is a difference of large terms once the origin is far away:
			// compare on the scale of Z.
			if !scalar.EqualWithinAbsOrRel(v.res.Constant, b.Constant, 1e-9*b.LoadPath, 0) {
				t.Errorf("dim=%d %s: M=%g, want %g", dim, v.name, v.res.Constant, b.Constant)
			}
		}
	}
}

func mustCompute(t *testing.T, m *model.Model, c Case) *Result {
	t.Helper()
	res, err := Compute(m, []Case{c}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// rotation returns a proper orthogonal matrix: about z by angle a in 2D,
// about z by a then about x by b in 3D.
func rotation(dim int, a, b float64) [][]float64 {
	ca, sa := math.Cos(a), math.Sin(a)
	if dim == 2 {
		return [][]float64{{ca, -sa}, {sa, ca}}
	}
	cb, sb := math.Cos(b), math.Sin(b)
	rz := [][]float64{{ca, -sa, 0}, {sa, ca, 0}, {0, 0, 1}}
	rx := [][]float64{{1, 0, 0}, {0, cb, -sb}, {0, sb, cb}}
	out := make([][]float64, 3)
	for i := range out {
		out[i] = make([]float64, 3)
		for j := range out[i] {
			for k := 0; k < 3; k++ {
				out[i][j] += rx[i][k] * rz[k][j]
			}
		}
	}
	return out
}

func rotate(r [][]float64, v []float64) []float64 {
	out := make([]float64, len(v))
	for i := range out {
		for j := range v {
			out[i] += r[i][j] * v[j]
		}
	}
	return out
}
