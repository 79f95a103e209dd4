package layout

import (
	"testing"

	"gusset/engine/fault"
)

// TestLimitScale checks the range of member areas (force/limit) a layout
// may ask for: under a load of 10, limits of 1e-300 and 1e300 (areas
// 1e301 and 1e-299) are out of range at their own pointers, while 1e-80
// and 1e90 (areas 1e81 and 1e-89) and ordinary steel values pass. The
// areas are hand quotients.
func TestLimitScale(t *testing.T) {
	for _, tc := range []struct {
		tension, compression float64
		path                 string
	}{
		{1e-300, 1, "/tension_limit"},
		{1, 1e300, "/compression_limit"},
		{1e-80, 1e90, ""},
		{2.35e5, 2.35e5, ""},
	} {
		p := &Problem{TensionLimit: tc.tension, CompressionLimit: tc.compression,
			Cases: []Case{{ID: "tip", Loads: []Load{{Node: 0, Force: [3]float64{0, -10}}}}}}
		err := checkLimitScale(p)
		if tc.path == "" {
			if err != nil {
				t.Errorf("limits %g, %g: %v", tc.tension, tc.compression, err)
			}
			continue
		}
		fe, ok := fault.As(err)
		if !ok || fe.Kind != fault.InvalidModel || len(fe.Problems) != 1 || fe.Problems[0].Path != tc.path {
			t.Errorf("limits %g, %g: got %v, want an invalid model at %s", tc.tension, tc.compression, err, tc.path)
		}
	}
}
