package stiffness

import (
	"context"
	"fmt"
	"math"
	"testing"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// TestResultsIndependentOfWorkers checks the reproducibility the issue asks
// for (byte-identical output whatever the machine's cores; common
// practice): Solve on models large enough for parallel assembly, load
// cases and recovery gives bit-identical results for one, two and three
// workers.
func TestResultsIndependentOfWorkers(t *testing.T) {
	truss := modelgen.Must(modelgen.SpaceTruss3D(35, 36))
	base := truss.Cases[0]
	for k := range 3 {
		lc := base
		lc.ID = fmt.Sprintf("extra%d", k)
		lc.Nodal = append([]model.NodalLoad(nil), base.Nodal...)
		for i := range lc.Nodal {
			lc.Nodal[i].Force[0] = float64(k + 1)
		}
		truss.Cases = append(truss.Cases, lc)
	}
	frame := modelgen.Must(modelgen.Frame2D(50, 100))
	for _, m := range []*model.Model{truss, frame} {
		var ref *Result
		for _, workers := range []int{1, 2, 3} {
			res, err := Solve(context.Background(), m, Options{Workers: workers})
			if err != nil {
				t.Fatal(err)
			}
			if ref == nil {
				ref = res
				continue
			}
			if len(res.Cases) != len(ref.Cases) {
				t.Fatalf("%d workers: %d cases, want %d", workers, len(res.Cases), len(ref.Cases))
			}
			same := func(a, b []float64) bool {
				if len(a) != len(b) {
					return false
				}
				for i := range a {
					if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
						return false
					}
				}
				return true
			}
			for c := range res.Cases {
				got, want := res.Cases[c], ref.Cases[c]
				ok := same(got.AxialForce, want.AxialForce) && same(got.Stress, want.Stress) &&
					same(got.Utilisation, want.Utilisation) &&
					same([]float64{got.Residual, got.BalanceError}, []float64{want.Residual, want.BalanceError})
				for n := range got.Displacements {
					ok = ok && same(got.Displacements[n], want.Displacements[n]) && same(got.Rotations[n], want.Rotations[n]) &&
						same(got.External[n], want.External[n])
				}
				for e := range got.EndForces {
					ok = ok && same(got.EndForces[e], want.EndForces[e])
				}
				for s := range got.Reactions {
					ok = ok && same(got.Reactions[s].Force, want.Reactions[s].Force) && same(got.Reactions[s].Moment, want.Reactions[s].Moment)
				}
				if !ok {
					t.Errorf("%d workers: case %s differs from one worker's", workers, got.ID)
				}
			}
			if res.Stats.ConditionNumber != ref.Stats.ConditionNumber {
				t.Errorf("%d workers: condition estimate %v, want %v", workers, res.Stats.ConditionNumber, ref.Stats.ConditionNumber)
			}
		}
	}
}
