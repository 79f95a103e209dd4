package sweep

import (
	"math"
	"testing"
)

// TestRangeValuesAreShortDecimals checks that range steps are
// from + i·(to − from)/(count − 1) rounded to the shortest decimal within
// a few units in the last place, so that a host sees 0.6 and 2.2 rather
// than 0.6000000000000001 and 2.1999999999999997 (the values of issue 21,
// which the interpolation from both ends produced), that both ends are
// exact, and that no step is a negative zero. The expected values are the
// decimal literals themselves (each parses to the double nearest it,
// IEEE 754-2019 §5.12).
func TestRangeValuesAreShortDecimals(t *testing.T) {
	for _, tc := range []struct {
		from, to float64
		count    int
		want     []float64
	}{
		{0, 3, 6, []float64{0, 0.6, 1.2, 1.8, 2.4, 3}},
		{1, 3, 11, []float64{1, 1.2, 1.4, 1.6, 1.8, 2, 2.2, 2.4, 2.6, 2.8, 3}},
		{-0.3, 0.3, 3, []float64{-0.3, 0, 0.3}},
		{2.5, -2.5, 5, []float64{2.5, 1.25, 0, -1.25, -2.5}},
		{0.1, 0.7, 7, []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7}},
	} {
		got, err := Range(tc.from, tc.to, tc.count)
		if err != nil {
			t.Fatal(err)
		}
		for i, v := range got {
			if math.Float64bits(v) != math.Float64bits(tc.want[i]) {
				t.Errorf("Range(%v, %v, %d)[%d] = %v, want %v", tc.from, tc.to, tc.count, i, v, tc.want[i])
			}
		}
	}
	// A step that no short decimal is near keeps its computed value.
	got, err := Range(0, 1, 4)
	if err != nil {
		t.Fatal(err)
	}
	if want := 1.0 / 3; math.Abs(got[1]-want) > 4*math.Nextafter(want, 1)-4*want {
		t.Errorf("Range(0, 1, 4)[1] = %v, want 1/3 to a few ulps", got[1])
	}
}
