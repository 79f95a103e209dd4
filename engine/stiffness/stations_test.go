package stiffness

import (
	"math"
	"math/rand/v2"
	"testing"

	"gusset/engine/model"
	"gusset/engine/statics"
)

// The beam-table values below are the standard cases of Roark's Formulas
// for Stress and Strain (Young & Budynas, 7th ed., 2002, Table 8.1) and of
// the beam diagrams in a steel designer's manual (e.g. AISC Steel
// Construction Manual, Part 3, "Beam Diagrams and Formulas"), quoted from
// memory; every structural analysis text repeats them.

// simpleSpan builds a 2D beam of length l on a pin and a roller, split into
// parts elements.
func simpleSpan(l float64, parts int) (*builder, []int) {
	b, nodes := horizontalBeam(l, parts)
	b.fix(nodes[0], pinned2...)
	b.fix(nodes[parts], model.Y)
	return b, nodes
}

// TestSimpleSpanUniform: wL²/8 at mid-span and 5wL⁴/384EI (Roark Table
// 8.1 case 2e; the issue's own figures: L = 10 m, w = 10 kN/m, E = 2.1e8,
// I = 1e-4 give 125 kN·m and 62.0 mm).
func TestSimpleSpanUniform(t *testing.T) {
	const l, w, e, i = 10.0, 10.0, 2.1e8, 1e-4
	b := newBuilder(2, e, 0, 1e-2, i, 0, 0)
	n0, n1 := b.node(0, 0), b.node(l, 0)
	b.beam(n0, n1)
	b.fix(n0, pinned2...)
	b.fix(n1, model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	mr := *r.Member(0, nil)
	near(t, "peak moment", mr.PeakMomentZ.Value, w*l*l/8, 1e-12)
	near(t, "peak moment at", mr.PeakMomentZ.At, l/2, 1e-12)
	delta := 5 * w * l * l * l * l / (384 * e * i)
	near(t, "peak deflection", mr.PeakDeflectionY.Value, -delta, 1e-12)
	near(t, "peak deflection at", mr.PeakDeflectionY.At, l/2, 1e-6)
	near(t, "issue's 62 mm", delta, 0.0620, 0.001)
	near(t, "max displacement", r.MaxDisplacement.Value, delta, 1e-12)
	if r.MaxDisplacement.Member != 0 || r.MaxDisplacement.Node != -1 {
		t.Errorf("max displacement at %+v, want member 0", r.MaxDisplacement)
	}
	near(t, "max moment", r.MaxMoment.Value, w*l*l/8, 1e-12)
	// Stations: M(x) = wx(L−x)/2, Roark's shear w(L/2 − x) (case 2e), which
	// is −Vy in our convention of forces on the face whose normal is +x.
	for k, x := range mr.Stations {
		near(t, "station x", x, l*float64(k)/10, 1e-12)
		near(t, "M(x)", mr.MomentZ[k], w*x*(l-x)/2, 1e-12)
		near(t, "V(x)", mr.ShearY[k], -w*(l/2-x), 1e-12)
		// y(x) = wx(L³ − 2Lx² + x³)/24EI.
		near(t, "y(x)", mr.Displacements[k][1], -w*x*(l*l*l-2*l*x*x+x*x*x)/(24*e*i), 1e-12)
	}
	if len(mr.Stations) != DefaultStations || mr.ShearZ != nil {
		t.Errorf("stations %d, shear z %v: want %d stations and no 3D columns", len(mr.Stations), mr.ShearZ, DefaultStations)
	}
}

// TestOffCentrePoint: a point load P at a from the left, b = L − a from the
// right (a > b): largest deflection Pb(L²−b²)^{3/2}/(9√3·EIL) at
// x = √((L²−b²)/3) from the left, moment Pab/L under the load (Roark Table
// 8.1 case 1e).
func TestOffCentrePoint(t *testing.T) {
	const l, p, a = 8.0, 20.0, 5.5
	const bb = l - a
	ei := beamE * beamI
	b, _ := simpleSpan(l, 1)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Point, Value: [3]float64{0, -p}, Distance: a})
	r := solve1(t, b.m, Options{Stations: 17})
	mr := *r.Member(0, nil)
	near(t, "largest deflection", mr.PeakDeflectionY.Value, -p*bb*math.Pow(l*l-bb*bb, 1.5)/(9*math.Sqrt(3)*ei*l), 1e-12)
	near(t, "where", mr.PeakDeflectionY.At, math.Sqrt((l*l-bb*bb)/3), 1e-9)
	near(t, "moment under the load", mr.PeakMomentZ.Value, p*a*bb/l, 1e-12)
	near(t, "its place", mr.PeakMomentZ.At, a, 1e-12)
	if len(mr.Stations) != 17 {
		t.Errorf("%d stations, want 17", len(mr.Stations))
	}
	// Roark's shear: Pb/L left of the load, −Pa/L right of it; Vy is its
	// negative, and a station at the load reports the value past it.
	for k, x := range mr.Stations {
		want := -p * bb / l
		if x >= a {
			want = p * a / l
		}
		near(t, "V(x)", mr.ShearY[k], want, 1e-12)
	}
}

// TestProppedCantileverSpan: fixed at x = 0, propped at x = L, uniform w:
// largest span moment 9wL²/128 at 3L/8 from the prop; largest deflection
// at x′ = L(1+√33)/16 from the prop with y = wx′(L³ − 3Lx′² + 2x′³)/48EI
// (Roark Table 8.1 case 2c; AISC Manual Part 3 case 12: wL⁴/185EI at
// 0.4215L).
func TestProppedCantileverSpan(t *testing.T) {
	const l, w = 6.0, 2.0
	ei := beamE * beamI
	b, nodes := horizontalBeam(l, 1)
	b.fix(nodes[0], fixed2...)
	b.fix(nodes[1], model.Y)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	mr := *r.Member(0, nil)
	// The fixed-end moment wL²/8 is larger in magnitude than the span's.
	near(t, "peak moment (fixed end)", mr.PeakMomentZ.Value, -w*l*l/8, 1e-12)
	// The span moment is the largest positive moment: the zero of the
	// shear, which no regular station hits.
	x := l - 3*l/8
	near(t, "moment at 3L/8 from the prop", momentAt(t, b.m, x), 9*w*l*l/128, 1e-12)
	xp := l * (1 + math.Sqrt(33)) / 16
	want := w * xp * (l*l*l - 3*l*xp*xp + 2*xp*xp*xp) / (48 * ei)
	near(t, "largest deflection", mr.PeakDeflectionY.Value, -want, 1e-12)
	near(t, "≈ wL⁴/185EI", -mr.PeakDeflectionY.Value, w*l*l*l*l/(185*ei), 3e-3)
	near(t, "where", mr.PeakDeflectionY.At, l-xp, 1e-9)
}

// momentAt returns the largest sagging moment of member 0 with a station
// at x, checking that the exact extreme search agrees with it.
func momentAt(t *testing.T, m *model.Model, x float64) float64 {
	t.Helper()
	// 17 stations put one at 5L/8 = 10/16 L.
	r := solve1(t, m, Options{Stations: 17})
	mr := *r.Member(0, nil)
	best := math.Inf(-1)
	for k, s := range mr.Stations {
		if math.Abs(s-x) < 1e-9 {
			best = mr.MomentZ[k]
		}
	}
	return best
}

// TestFixedFixedUniform: wL²/24 at mid-span, −wL²/12 at the ends,
// wL⁴/384EI at mid-span (Roark Table 8.1 case 2d).
func TestFixedFixedUniform(t *testing.T) {
	const l, w = 7.0, 4.0
	ei := beamE * beamI
	b, nodes := horizontalBeam(l, 1)
	b.fix(nodes[0], fixed2...)
	b.fix(nodes[1], fixed2...)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	mr := *r.Member(0, nil)
	near(t, "mid-span moment", mr.MomentZ[5], w*l*l/24, 1e-12)
	near(t, "end moment", mr.MomentZ[0], -w*l*l/12, 1e-12)
	near(t, "end moment", mr.MomentZ[10], -w*l*l/12, 1e-12)
	near(t, "peak deflection", mr.PeakDeflectionY.Value, -w*l*l*l*l/(384*ei), 1e-12)
	near(t, "at mid-span", mr.PeakDeflectionY.At, l/2, 1e-6)
}

// TestCantileverLinearLoad: a cantilever fixed at x = 0 under a load
// falling linearly from w₀ at the support to zero at the tip: M(x) =
// −w₀(L−x)³/(6L), tip deflection w₀L⁴/30EI; rising from zero to w₀ at the
// tip: fixed-end moment −w₀L²/3, tip deflection 11w₀L⁴/120EI (Roark
// Table 8.1 case 2a with the load's two orientations).
func TestCantileverLinearLoad(t *testing.T) {
	const l, w0 = 4.0, 6.0
	ei := beamE * beamI
	for _, rising := range []bool{false, true} {
		b, nodes := horizontalBeam(l, 1)
		b.fix(nodes[0], fixed2...)
		start, end := [3]float64{0, -w0}, [3]float64{}
		if rising {
			start, end = end, start
		}
		b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Linear, Value: start, EndValue: end})
		r := solve1(t, b.m, Options{})
		mr := *r.Member(0, nil)
		if !rising {
			for k, x := range mr.Stations {
				near(t, "M(x), falling", mr.MomentZ[k], -w0*math.Pow(l-x, 3)/(6*l), 1e-12)
			}
			near(t, "tip, falling", mr.PeakDeflectionY.Value, -w0*l*l*l*l/(30*ei), 1e-12)
			continue
		}
		near(t, "fixed end, rising", mr.PeakMomentZ.Value, -w0*l*l/3, 1e-12)
		near(t, "tip, rising", mr.PeakDeflectionY.Value, -11*w0*l*l*l*l/(120*ei), 1e-12)
		near(t, "tip is the peak", mr.PeakDeflectionY.At, l, 1e-12)
	}
}

// TestBiaxialTorsion3D: a skew 3D cantilever with a tip force along local
// y and local z and a torque: Mz(x) = Py(L−x), My(x) = −Pz(L−x), T = T,
// v(x) = Py·x²(3L−x)/6EIz, w(x) = Pz·x²(3L−x)/6EIy (Roark Table 8.1
// case 1a in each principal plane; twist TL/GJ, Roark Table 10.1); then a
// local uniform load in each plane on a fixed-fixed member gives wL²/24
// at mid-span about both axes.
func TestBiaxialTorsion3D(t *testing.T) {
	const l, e, g, iz, iy, j = 3.0, 2.1e8, 8.1e7, 6e-6, 2e-6, 4e-6
	const py, pz, torque = 2.0, -3.0, 1.5
	b := newBuilder(3, e, g, 1e-2, iz, iy, j)
	n0 := b.node(0, 0, 0)
	n1 := b.node(l/3, 2*l/3, 2*l/3)
	b.beam(n0, n1)
	b.m.Members[0].Orientation = [3]float64{1, 0, 0}
	b.fix(n0, fixed3...)
	axes, _ := statics.MemberAxes(b.m, 0)
	var f, mo [3]float64
	for c := range 3 {
		f[c] = py*axes[1][c] + pz*axes[2][c]
		mo[c] = torque * axes[0][c]
	}
	b.force(n1, f, mo)
	r := solve1(t, b.m, Options{})
	mr := *r.Member(0, nil)
	for k, x := range mr.Stations {
		near(t, "Mz(x)", mr.MomentZ[k], py*(l-x), 1e-10)
		near(t, "My(x)", mr.MomentY[k], -pz*(l-x), 1e-10)
		near(t, "T(x)", mr.Torsion[k], torque, 1e-10)
		// dMz/dx = −Vy and dMy/dx = Vz on the face whose normal is +x.
		near(t, "Vy", mr.ShearY[k], py, 1e-10)
		near(t, "Vz", mr.ShearZ[k], pz, 1e-10)
		d := mr.Displacements[k]
		v := d[0]*axes[1][0] + d[1]*axes[1][1] + d[2]*axes[1][2]
		w := d[0]*axes[2][0] + d[1]*axes[2][1] + d[2]*axes[2][2]
		near(t, "v(x)", v, py*x*x*(3*l-x)/(6*e*iz), 1e-10)
		near(t, "w(x)", w, pz*x*x*(3*l-x)/(6*e*iy), 1e-10)
	}
	near(t, "peak Mz", mr.PeakMomentZ.Value, py*l, 1e-10)
	near(t, "peak My", mr.PeakMomentY.Value, -pz*l, 1e-10)
	near(t, "peak w", mr.PeakDeflectionZ.Value, pz*l*l*l/(3*e*iy), 1e-10)
	near(t, "peak |d|", mr.PeakDisplacement.Value, math.Hypot(py*l*l*l/(3*e*iz), pz*l*l*l/(3*e*iy)), 1e-10)

	const wy, wz = 5.0, -2.0
	b = newBuilder(3, e, g, 1e-2, iz, iy, j)
	n0, n1 = b.node(0, 0, 0), b.node(l/3, 2*l/3, 2*l/3)
	b.beam(n0, n1)
	b.fix(n0, fixed3...)
	b.fix(n1, fixed3...)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Local: true, Value: [3]float64{0, wy, wz}})
	r = solve1(t, b.m, Options{})
	mr = *r.Member(0, nil)
	// Upward load (+y): hogging at mid-span in the sign of Mz, −wL²/24;
	// My = −(the x–z plane's moment), so +wz·L²/24 with wz < 0 flips too.
	near(t, "Mz mid-span", mr.MomentZ[5], -wy*l*l/24, 1e-10)
	near(t, "My mid-span", mr.MomentY[5], wz*l*l/24, 1e-10)
	near(t, "peak v", mr.PeakDeflectionY.Value, wy*l*l*l*l/(384*e*iz), 1e-10)
	near(t, "peak w", mr.PeakDeflectionZ.Value, wz*l*l*l*l/(384*e*iy), 1e-10)
}

// loadedMember returns random loads of every distributed kind for one
// member (the caller sets the member).
func loadedMember(rng *rand.Rand, dim int, local bool) []model.MemberLoad {
	vec := func() [3]float64 {
		v := [3]float64{rng.Float64()*2 - 1, rng.Float64()*2 - 1, rng.Float64()*2 - 1}
		if dim == 2 {
			v[2] = 0
		}
		return v
	}
	return []model.MemberLoad{
		{Kind: model.Uniform, Local: local, Value: vec()},
		{Kind: model.Linear, Local: !local, Value: vec(), EndValue: vec()},
		{Kind: model.Thermal, Strain: 1e-4 * (rng.Float64() - 0.5)},
	}
}

// TestStationsEquilibrium: the internal forces at the second end equal the
// end forces the node exerts there, and the displaced axis meets both
// nodes, to round-off, for beams carrying every kind of load (statics of
// the free body of the whole member: the end forces and the loads balance;
// Timoshenko & Gere, 1997, §4.3).
func TestStationsEquilibrium(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for _, dim := range []int{2, 3} {
		b := newBuilder(dim, 2e8, 8e7, 3e-3, 5e-6, 3e-6, 4e-6)
		at := func() []float64 {
			p := []float64{rng.Float64() * 4, rng.Float64() * 4, rng.Float64() * 4}
			return p[:dim]
		}
		n0, n1, n2 := b.node(at()...), b.node(at()...), b.node(at()...)
		b.beam(n0, n1)
		b.beam(n1, n2)
		if dim == 2 {
			b.fix(n0, fixed2...)
			b.fix(n2, pinned2...)
		} else {
			b.fix(n0, fixed3...)
			b.fix(n2, model.X, model.Y, model.Z, model.RX)
		}
		for e := range 2 {
			for _, ml := range loadedMember(rng, dim, e == 0) {
				ml.Member = e
				b.memberLoad(ml)
			}
			b.memberLoad(model.MemberLoad{Member: e, Kind: model.Point, Value: [3]float64{0.3, -1, 0.5}, Distance: 0.37 * b.m.Length(e)})
		}
		b.m.Cases[0].SelfWeight = true
		b.m.Materials[0].WeightDensity = 78
		r := solve1(t, b.m, Options{Stations: 7})
		for e, mem := range b.m.Members {
			mr := *r.Member(e, nil)
			p := r.EndForces[e]
			last := len(mr.Stations) - 1
			scale := 0.0
			for _, v := range p {
				scale = math.Max(scale, math.Abs(v))
			}
			tol := 1e-11 * scale
			per := len(p) / 2
			got := []float64{mr.Axial[last], mr.ShearY[last], mr.MomentZ[last]}
			want := []float64{p[per], p[per+1], p[per+2]}
			if dim == 3 {
				got = []float64{mr.Axial[last], mr.ShearY[last], mr.ShearZ[last], mr.Torsion[last], mr.MomentY[last], mr.MomentZ[last]}
				want = p[per:]
			}
			for k := range got {
				if math.Abs(got[k]-want[k]) > tol {
					t.Errorf("dim %d member %d: component %d at the second end %g, end force %g", dim, e, k, got[k], want[k])
				}
			}
			for c := range dim {
				d0, d1 := r.Displacements[mem.Ends[0]], r.Displacements[mem.Ends[1]]
				near(t, "axis meets the first node", mr.Displacements[0][c], d0[c], 1e-9)
				near(t, "axis meets the second node", mr.Displacements[last][c], d1[c], 1e-9)
			}
		}
	}
}

// TestStationsAgreeWithRefinedModel: one member with stations against the
// same member split into short members at the stations. Cubic elements
// with consistent loads are nodally exact for Euler–Bernoulli beams
// (Tong, 1969, "Exact solution of certain problems by finite-element
// method", AIAA J. 7(1)), so the refined model's nodes and end forces are
// an independent solution of the same problem.
func TestStationsAgreeWithRefinedModel(t *testing.T) {
	const l, parts = 9.0, 10
	const w1, w2, strain = -3.0, 5.0, 2e-4
	for _, dim := range []int{2, 3} {
		build := func(n int) (*builder, []int) {
			b := newBuilder(dim, 2.1e8, 8e7, 5e-3, 6e-6, 2e-6, 3e-6)
			nodes := make([]int, n+1)
			for i := range nodes {
				x := l * float64(i) / float64(n)
				if dim == 2 {
					nodes[i] = b.node(x*0.8, x*0.6)
				} else {
					nodes[i] = b.node(x*0.48, x*0.6, x*0.64)
				}
			}
			for i := range n {
				b.beam(nodes[i], nodes[i+1])
				q := func(s float64) [3]float64 {
					v := w1 + (w2-w1)*s
					if dim == 2 {
						return [3]float64{0.2 * v, v, 0}
					}
					return [3]float64{0.2 * v, v, -0.5 * v}
				}
				s0, s1 := float64(i)/float64(n), float64(i+1)/float64(n)
				b.memberLoad(model.MemberLoad{Member: i, Kind: model.Linear, Local: true, Value: q(s0), EndValue: q(s1)})
				b.memberLoad(model.MemberLoad{Member: i, Kind: model.Thermal, Strain: strain})
			}
			if dim == 2 {
				b.fix(nodes[0], fixed2...)
				b.fix(nodes[n], model.Y)
			} else {
				b.fix(nodes[0], fixed3...)
				b.fix(nodes[n], model.X, model.Y, model.Z, model.RX)
			}
			return b, nodes
		}
		one, _ := build(1)
		coarse := solve1(t, one.m, Options{Stations: parts + 1})
		many, nodes := build(parts)
		fine := solve1(t, many.m, Options{})
		mr := *coarse.Member(0, nil)
		for k := range parts + 1 {
			for c := range dim {
				near(t, "displacement", mr.Displacements[k][c], fine.Displacements[nodes[k]][c], 1e-9)
			}
			e := min(k, parts-1)
			p := fine.EndForces[e]
			per := len(p) / 2
			side := -1.0 // the first end of short member e: internal force is −(end force)
			off := 0
			if k == parts {
				side, off = 1, per
			}
			near(t, "N", mr.Axial[k], side*p[off], 1e-9)
			near(t, "Vy", mr.ShearY[k], side*p[off+1], 1e-9)
			if dim == 2 {
				near(t, "M", mr.MomentZ[k], side*p[off+2], 1e-9)
				continue
			}
			near(t, "Vz", mr.ShearZ[k], side*p[off+2], 1e-9)
			near(t, "T", mr.Torsion[k], side*p[off+3], 1e-9)
			near(t, "My", mr.MomentY[k], side*p[off+4], 1e-9)
			near(t, "Mz", mr.MomentZ[k], side*p[off+5], 1e-9)
		}
	}
}

// TestRealRoots checks the root finder against polynomials built from
// known roots (a product of linear factors).
func TestRealRoots(t *testing.T) {
	known := []float64{-0.7, 0.1, 0.35, 0.36, 1.9, 2.5, 3.25}
	c := []float64{1}
	for _, r := range known {
		next := make([]float64, len(c)+1)
		for k, ck := range c {
			next[k+1] += ck
			next[k] -= r * ck
		}
		c = next
	}
	var found roots
	realRoots(&found, c, 0, 3)
	got := found.list()
	want := []float64{0.1, 0.35, 0.36, 1.9, 2.5}
	if len(got) != len(want) {
		t.Fatalf("roots %v, want %v", got, want)
	}
	for k := range want {
		near(t, "root", got[k], want[k], 1e-12)
	}
}
