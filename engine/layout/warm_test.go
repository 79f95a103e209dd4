package layout

import (
	"context"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestWarmStartedAddingMatchesOneProgram checks member adding, whose
// later programs start from the last program's central iterate, against
// one interior-point program over every candidate: the optimal value of a
// linear program is unique, so the volumes agree to 1e-9 (common
// practice; the one-program volumes are themselves checked against
// gonum's simplex method and closed forms in TestMethodsAgree,
// TestSpaceMethodsAgree, TestThreePointMichell and TestTripod). The cases
// are chosen so that member adding takes warm starts; the test fails if
// it takes none.
func TestWarmStartedAddingMatchesOneProgram(t *testing.T) {
	offCentre := spaceBridge(6)
	offCentre.Cases[0].Loads[0] = Load{Node: -1, At: vec{4.0 / 3, 1.0 / 3, 1.0 / 3}, Force: vec{0.4, -0.3, -1}}
	for _, tc := range []struct {
		name string
		p    Problem
	}{
		{"plane three-point 24 × 12", threePoint(24)},
		{"space bridge 8 × 4 × 4", spaceBridge(8)},
		{"space bridge 6 × 3 × 3, load off the centre", offCentre},
	} {
		t.Run(tc.name, func(t *testing.T) {
			opt := Options{Tolerance: 1e-11}
			adding, err := Optimise(context.Background(), tc.p, opt, nil)
			if err != nil {
				t.Fatal(err)
			}
			checkResult(t, adding)
			opt.Method = AllCandidates
			one, err := Optimise(context.Background(), tc.p, opt, nil)
			if err != nil {
				t.Fatal(err)
			}
			if adding.Stats.WarmStarts == 0 {
				t.Errorf("member adding took no warm start in %d rounds", adding.Stats.Iterations)
			}
			if !scalar.EqualWithinAbsOrRel(adding.Volume, one.Volume, 1e-9, 1e-9) {
				t.Errorf("member adding %.12g (%d rounds, %d warm), one program %.12g", adding.Volume, adding.Stats.Iterations, adding.Stats.WarmStarts, one.Volume)
			}
			t.Logf("rounds %d, warm starts %d, interior-point iterations %d", adding.Stats.Iterations, adding.Stats.WarmStarts, adding.Stats.InteriorPointIterations)
		})
	}
}
