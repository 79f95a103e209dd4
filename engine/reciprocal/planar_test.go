package reciprocal

import (
	"math/rand/v2"
	"testing"

	"gusset/engine/fault"
)

// TestPlanarMatchesAllPairs checks the grid-bucketed crossing search
// against testing every pair of members (the definition of a plane
// drawing: no two edges meet except at shared end points; common
// practice), on random short segments of which many cross.
func TestPlanarMatchesAllPairs(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	for trial := range 30 {
		n := 10 + rng.IntN(60)
		var xy [][2]float64
		var ends [][2]int
		var ids []string
		for e := range n {
			x, y := 10*rng.Float64(), 10*rng.Float64()
			xy = append(xy, [2]float64{x, y}, [2]float64{x + 2*rng.Float64() - 1, y + 2*rng.Float64() - 1})
			ends = append(ends, [2]int{2 * e, 2*e + 1})
			ids = append(ids, "m")
		}
		// Share some end nodes so that touching at a common node occurs.
		for e := 1; e < n; e += 3 {
			ends[e][0] = ends[e-1][1]
		}
		want := 0
		first := [2]int{-1, -1}
		for i := 0; i < n; i++ {
			for j := i + 1; j < n; j++ {
				if conflict(ends[i], ends[j], xy) {
					if want == 0 {
						first = [2]int{i, j}
					}
					want++
				}
			}
		}
		err := checkPlanar(xy, ends, ids)
		if want == 0 {
			if err != nil {
				t.Errorf("trial %d: %v, want planar", trial, err)
			}
			continue
		}
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.NotPlanar {
			t.Fatalf("trial %d: got %v, want %d crossings", trial, err, want)
		}
		pairs := fe.Detail.([][2]int)
		if pairs[0] != first {
			t.Errorf("trial %d: first pair %v, want %v", trial, pairs[0], first)
		}
		if len(pairs) != min(want, maxCrossingProblems) {
			t.Errorf("trial %d: %d pairs, want %d", trial, len(pairs), min(want, maxCrossingProblems))
		}
	}
}

// TestPlanarLargeGrid injects one crossing member into a large
// triangulated grid, planar by construction, and checks it is the pair
// found.
func TestPlanarLargeGrid(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	xy, ends := gridTruss(60, 60, 0.5, rng)
	ids := make([]string, len(ends)+1)
	if err := checkPlanar(xy, ends, ids[:len(ends)]); err != nil {
		t.Fatal(err)
	}
	// Both diagonals of cell (30, 30): one is already there.
	a, b, c, d := 30*60+30, 30*60+31, 31*60+31, 31*60+30
	extra := [2]int{a, c}
	for _, e := range ends {
		if e == [2]int{a, c} {
			extra = [2]int{b, d}
		}
	}
	ends = append(ends, extra)
	fe, ok := fault.As(checkPlanar(xy, ends, ids))
	if !ok || len(fe.Detail.([][2]int)) != 1 || fe.Detail.([][2]int)[0][1] != len(ends)-1 {
		t.Fatalf("got %v", fe)
	}
}
