package stiffness

import (
	"strings"
	"testing"

	"gusset/engine/model"
)

// TestStrainEnergy: a simple span under w stores U = w²L⁵/240EI in
// bending (∫(wx(L−x)/2)²/2EI dx); and on a loaded 3D frame the strain
// energy of all members equals half the work of the nodal loads,
// Clapeyron's theorem (Timoshenko & Goodier, Theory of Elasticity, 3rd
// ed., 1970, §91).
func TestStrainEnergy(t *testing.T) {
	const l, w = 10.0, 10.0
	ei := beamE * beamI
	b, _ := simpleSpan(l, 1)
	b.memberLoad(model.MemberLoad{Member: 0, Kind: model.Uniform, Value: [3]float64{0, -w}})
	r := solve1(t, b.m, Options{})
	near(t, "bending energy", r.Member(0, nil).BendingEnergy, w*w*l*l*l*l*l/(240*ei), 1e-12)
	share, member := r.BendingShare()
	near(t, "share", share, 1, 1e-12)
	if member != 0 {
		t.Errorf("member %d, want 0", member)
	}

	b = newBuilder(3, 2.1e8, 8.1e7, 4e-3, 6e-6, 2e-6, 4e-6)
	n0, n1, n2, n3 := b.node(0, 0, 0), b.node(0, 0, 3), b.node(4, 1, 3), b.node(4, 1, 0)
	b.beam(n0, n1)
	b.beam(n1, n2)
	b.beam(n2, n3)
	b.bar(n0, n2)
	b.fix(n0, fixed3...)
	b.fix(n3, fixed3...)
	f1, m1 := [3]float64{3, -2, -5}, [3]float64{0.5, 1, -0.7}
	f2 := [3]float64{-1, 4, -2}
	b.force(n1, f1, m1)
	b.force(n2, f2, [3]float64{})
	r = solve1(t, b.m, Options{})
	var work, energy float64
	for c := range 3 {
		work += f1[c]*r.Displacements[n1][c] + m1[c]*r.Rotations[n1][c] + f2[c]*r.Displacements[n2][c]
	}
	for e := range r.MemberCount() {
		mr := r.Member(e, nil)
		energy += mr.AxialEnergy + mr.BendingEnergy + mr.TorsionEnergy
	}
	near(t, "Clapeyron", energy, work/2, 1e-10)
}

// TestLoadPathCaveat: a beam in bending with no axial force has a load
// path of 0, and the caveat says what it misses instead of leaving a bare
// 0.
func TestLoadPathCaveat(t *testing.T) {
	b := checkedSpan(0, "b")
	r := solve1(t, b.m, Options{})
	s := LoadPathCaveat(b.m, r)
	for _, want := range []string{"100 %", "member \"m0\"", "bending utilisation is 0.532"} {
		if !strings.Contains(s, want) {
			t.Errorf("caveat %q lacks %q", s, want)
		}
	}
	tr, _ := simpleSpan(4, 1)
	tr.m.Members[0].Kind = model.Bar
	tr.force(1, [3]float64{1, 0}, [3]float64{})
	if s := LoadPathCaveat(tr.m, solve1(t, tr.m, Options{})); s != "" {
		t.Errorf("a bar in tension has caveat %q", s)
	}
}
