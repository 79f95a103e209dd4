package reciprocal

import (
	"fmt"
	"math"

	"gusset/engine/model"
)

// SelfStressInput returns the Input that reciprocates a state of
// self-stress: state holds one axial force per member (tension positive),
// for example one of the states of self-stress from the null space of the
// equilibrium matrix. A free network's state needs no external forces, so
// the outer face is the single space A. In a supported network a state may
// also load the supports; the reactions it needs there (minus the sum of
// the member forces on each supported node) become the External forces,
// and the unsupported nodes get none. It panics if state is not aligned
// with the members or the model is not 2D.
func SelfStressInput(m *model.Model, state []float64) Input {
	if len(state) != len(m.Members) {
		panic(fmt.Sprintf("reciprocal: self-stress state of %d entries for %d members", len(state), len(m.Members)))
	}
	if m.Dim != 2 {
		panic("reciprocal: self-stress input of a model that is not 2D")
	}
	in := Input{Model: m, AxialForce: state}
	if len(m.Supports) == 0 {
		return in
	}
	in.External = make([][2]float64, m.NodeCount())
	supported := make([]bool, m.NodeCount())
	for _, s := range m.Supports {
		supported[s.Node] = true
	}
	for e, mb := range m.Members {
		i, j := mb.Ends[0], mb.Ends[1]
		if !supported[i] && !supported[j] {
			continue
		}
		dx, dy := m.Coords[2*j]-m.Coords[2*i], m.Coords[2*j+1]-m.Coords[2*i+1]
		l := math.Hypot(dx, dy)
		fx, fy := state[e]*dx/l, state[e]*dy/l
		if supported[i] {
			in.External[i][0] -= fx
			in.External[i][1] -= fy
		}
		if supported[j] {
			in.External[j][0] += fx
			in.External[j][1] += fy
		}
	}
	return in
}
