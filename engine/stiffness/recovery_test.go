package stiffness

import (
	"context"
	"math"
	"slices"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// TestRecoverForcesTwoBar checks RecoverForces on the two-bar bracket of
// TestTwoBarVirtualWork against statics and virtual work (Hibbeler,
// Structural Analysis, chapter on deflections by energy methods, from
// memory): N_AC = −4P/3, N_BC = 5P/3, δv = −21P/(EA), δh = −16P/(3EA);
// the largest displacement is that of C, the only free node, since a
// bar's displacement is linear along it.
func TestRecoverForcesTwoBar(t *testing.T) {
	const e, a, p = 2e8, 5e-4, 12.0
	b := newBuilder(2, e, 0, a, 0, 0, 0)
	na := b.node(0, 0)
	nb := b.node(0, 3)
	nc := b.node(4, 0)
	b.bar(na, nc)
	b.bar(nb, nc)
	b.fix(na, pinned2...)
	b.fix(nb, pinned2...)
	b.force(nc, [3]float64{0, -p}, [3]float64{})
	r := solve1(t, b.m, Options{Recovery: RecoverForces})
	near(t, "N_AC", r.AxialForce[0], -4*p/3, 1e-12)
	near(t, "N_BC", r.AxialForce[1], 5*p/3, 1e-12)
	near(t, "σ_BC", r.Stress[1], 5*p/(3*a), 1e-12)
	near(t, "R_By", r.Reactions[1].Force[1], p, 1e-12)
	dv, dh := -21*p/(e*a), -16*p/(3*e*a)
	near(t, "max displacement", r.MaxDisplacement.Value, math.Hypot(dv, dh), 1e-12)
	if r.MaxDisplacement.Node != nc || r.MaxDisplacement.Member != -1 {
		t.Errorf("largest displacement at node %d member %d, want node %d", r.MaxDisplacement.Node, r.MaxDisplacement.Member, nc)
	}
	if r.MemberCount() != 0 || r.Utilisation != nil {
		t.Errorf("RecoverForces gave member results (%d) or utilisations (%d)", r.MemberCount(), len(r.Utilisation))
	}
	if u, e := r.MaxUtilisation(); u != -1 || e != -1 {
		t.Errorf("MaxUtilisation without checks = %g at %d, want −1 (never 0 for unchecked)", u, e)
	}
}

// TestRecoverForcesAgrees checks that RecoverForces gives the values
// RecoverAll gives, bit for bit, on a space truss with self-weight (large
// enough for the members to be shared among workers), a loaded 2D frame
// (for both, it must leave the largest displacement and moment unset: they
// lie inside the bars sagging under their weight and inside the beams) and a frame solved to second order (the iterated
// path). The reference values come from RecoverAll, whose own results are
// checked against the beam tables in stations_test.go.
func TestRecoverForcesAgrees(t *testing.T) {
	truss := modelgen.Must(modelgen.SpaceTruss3D(33, 33))
	truss.Cases[0].SelfWeight = true
	frame := modelgen.Must(modelgen.Frame2D(4, 3))
	loadEveryBeam(frame)
	for _, tc := range []struct {
		name string
		m    *model.Model
		opt  Options
	}{
		{"truss/workers=1", truss, Options{Workers: 1}},
		{"truss/workers=2", truss, Options{Workers: 2}},
		{"frame", frame, Options{}},
		{"frame/second-order", frame, Options{SecondOrder: &SecondOrder{}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			all, err := Solve(context.Background(), tc.m, tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			opt := tc.opt
			opt.Recovery = RecoverForces
			forces, err := Solve(context.Background(), tc.m, opt)
			if err != nil {
				t.Fatal(err)
			}
			for i := range all.Cases {
				compareForces(t, tc.m, &all.Cases[i], &forces.Cases[i])
			}
		})
	}
}

// compareForces fails unless got (RecoverForces) holds want's
// (RecoverAll) forces, displacements and sums bit for bit and no member
// results.
func compareForces(t *testing.T, m *model.Model, want, got *CaseResult) {
	t.Helper()
	same := func(what string, a, b []float64) {
		t.Helper()
		if !slices.Equal(a, b) {
			t.Errorf("%s differ", what)
		}
	}
	same("axial forces", want.AxialForce, got.AxialForce)
	same("stresses", want.Stress, got.Stress)
	same("load sums", want.LoadSum, got.LoadSum)
	same("reaction sums", want.ReactionSum, got.ReactionSum)
	for e := range want.EndForces {
		same("end forces", want.EndForces[e], got.EndForces[e])
	}
	for n := range want.Displacements {
		same("displacements", want.Displacements[n], got.Displacements[n])
		same("rotations", want.Rotations[n], got.Rotations[n])
		same("external forces", want.External[n], got.External[n])
	}
	for s := range want.Reactions {
		same("reactions", want.Reactions[s].Force, got.Reactions[s].Force)
		same("reaction moments", want.Reactions[s].Moment, got.Reactions[s].Moment)
	}
	if want.Residual != got.Residual || want.BalanceError != got.BalanceError {
		t.Errorf("residual %g balance %g, want %g %g", got.Residual, got.BalanceError, want.Residual, want.BalanceError)
	}
	if got.MemberCount() != 0 || got.Utilisation != nil {
		t.Error("RecoverForces gave member results or utilisations")
	}
	unset := Peak{Node: -1, Member: -1}
	if m.LinearBetweenEnds() {
		if got.MaxDisplacement != want.MaxDisplacement {
			t.Errorf("largest displacement %+v, want %+v", got.MaxDisplacement, want.MaxDisplacement)
		}
	} else if got.MaxDisplacement != unset {
		t.Errorf("largest displacement %+v of a frame without its members' interiors, want unset", got.MaxDisplacement)
	}
	if got.MaxMoment != unset {
		t.Errorf("largest moment %+v without member results, want unset", got.MaxMoment)
	}
}
