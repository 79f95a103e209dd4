package stiffness

import (
	"math"
	"testing"

	"gusset/engine/model"
)

// loadedTriangle builds a 2D triangle A(0,0), B(6,0), C(2.5,3) on a pin at A
// and a roller at B, loaded at C, with member AC (index 0) loaded across
// by a uniform global load and a point load and all members by their own
// weight. kind is AC's kind (a beam is released at both ends); parts > 1
// splits AC into that many beams, released at A and C only. It returns
// the builder and the members that make up AC.
func loadedTriangle(kind model.MemberKind, parts int) (*builder, []int) {
	b := newBuilder(2, beamE, 0, beamA, beamI, 0, 0)
	b.m.Materials[0].WeightDensity = 77
	b.m.Cases[0].SelfWeight = true
	a, bn, c := b.node(0, 0), b.node(6, 0), b.node(2.5, 3)
	l := math.Hypot(2.5, 3)
	nodes := []int{a}
	for k := 1; k < parts; k++ {
		s := float64(k) / float64(parts)
		nodes = append(nodes, b.node(2.5*s, 3*s))
	}
	nodes = append(nodes, c)
	var ac []int
	for k := range parts {
		e := b.member(kind, nodes[k], nodes[k+1])
		ac = append(ac, e)
		b.memberLoad(model.MemberLoad{Member: e, Kind: model.Uniform, Value: [3]float64{1.5, -4}})
		// The point load 4 kN across AC at 0.3·L from A.
		if x := 0.3*l - float64(k)*l/float64(parts); x >= 0 && x < l/float64(parts) {
			b.memberLoad(model.MemberLoad{Member: e, Kind: model.Point, Local: true, Value: [3]float64{0, -4}, Distance: x})
		}
	}
	if kind == model.Beam {
		b.release(ac[0], 0, model.RZ)
		b.release(ac[len(ac)-1], 1, model.RZ)
	}
	b.bar(a, bn)
	b.bar(bn, c)
	b.fix(a, pinned2...)
	b.fix(bn, model.Y)
	b.force(c, [3]float64{3, -12}, [3]float64{})
	return b, ac
}

// TestLoadedBarInTruss checks a loaded bar in a truss, whose ends move
// (so its deflection is the chord's plus the span's own), against the
// same member modelled as a beam released at both ends (whose results the
// beam tables check above and in release_test.go) and as 40 short beams
// in a row, released at the member's ends only: the nodes' displacements,
// the member's peak moment and deflection, its largest displacement and
// its energies agree to round-off.
func TestLoadedBarInTruss(t *testing.T) {
	bar, _ := loadedTriangle(model.Bar, 1)
	rb := solve1(t, bar.m, Options{})
	barR := rb.Member(0, nil)
	for _, parts := range []int{1, 40} {
		beam, ac := loadedTriangle(model.Beam, parts)
		r := solve1(t, beam.m, Options{})
		var mz, vy, disp peak
		var bending float64
		for k, e := range ac {
			mr := r.Member(e, nil)
			offset := float64(k) * math.Hypot(2.5, 3) / float64(parts)
			mz.magnitude(mr.PeakMomentZ.Value, offset+mr.PeakMomentZ.At)
			vy.magnitude(mr.PeakDeflectionY.Value, offset+mr.PeakDeflectionY.At)
			disp.largest(mr.PeakDisplacement.Value, offset+mr.PeakDisplacement.At)
			bending += mr.BendingEnergy
		}
		tol := 1e-9
		near(t, "peak moment", barR.PeakMomentZ.Value, mz.Value, tol)
		near(t, "its place", barR.PeakMomentZ.At, mz.At, 1e-6)
		near(t, "peak deflection", barR.PeakDeflectionY.Value, vy.Value, tol)
		near(t, "largest displacement", barR.PeakDisplacement.Value, disp.Value, tol)
		near(t, "bending energy", barR.BendingEnergy, bending, tol)
		last := r.MemberCount() - 1
		for _, pair := range [][2]int{{1, last - 1}, {2, last}} {
			near(t, "other bars' forces", rb.AxialForce[pair[0]], r.AxialForce[pair[1]], tol)
		}
		near(t, "case's max moment", rb.MaxMoment.Value, r.MaxMoment.Value, tol)
		near(t, "case's max displacement", rb.MaxDisplacement.Value, r.MaxDisplacement.Value, tol)
		if parts == 1 {
			near(t, "axial max", barR.MaxAxial.Value, r.Member(0, nil).MaxAxial.Value, tol)
			near(t, "axial min", barR.MinAxial.Value, r.Member(0, nil).MinAxial.Value, tol)
			near(t, "axial energy", barR.AxialEnergy, r.Member(0, nil).AxialEnergy, tol)
			near(t, "peak deflection's place", barR.PeakDeflectionY.At, r.Member(0, nil).PeakDeflectionY.At, 1e-6)
		}
	}
}
