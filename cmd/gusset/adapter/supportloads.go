package adapter

import (
	"math"

	"gusset/engine/model"
	"gusset/engine/reciprocal"
	"gusset/engine/stiffness"
)

// apartAtSupports splits, at each supported node that also carries a load,
// the node's external force into the applied load and the reaction, so
// that the force diagram, its picture and external_forces show each (as
// solve reports them) rather than their sum: a 5 kN load at a support
// whose reaction is 10 kN is drawn as those two forces, not as a net 5 kN.
// The load is the node's external force less its reactions (stiffness
// results: External = loads + reactions). Nodes are taken in order, so
// the result does not depend on map order.
func apartAtSupports(m *model.Model, cr *stiffness.CaseResult, external [][2]float64) ([][2]float64, []reciprocal.ExternalForce) {
	reaction := make([][2]float64, m.NodeCount())
	supported := make([]bool, m.NodeCount())
	for si, s := range m.Supports {
		f := cr.Reactions[si].Force
		reaction[s.Node][0] += f[0]
		reaction[s.Node][1] += f[1]
		supported[s.Node] = true
	}
	out := append([][2]float64(nil), external...)
	var separate []reciprocal.ExternalForce
	for v := range out {
		if !supported[v] {
			continue
		}
		r := reaction[v]
		load := [2]float64{external[v][0] - r[0], external[v][1] - r[1]}
		scale := math.Hypot(r[0], r[1]) + math.Hypot(external[v][0], external[v][1])
		if math.Hypot(load[0], load[1]) <= 1e-12*scale || math.Hypot(r[0], r[1]) <= 1e-12*scale {
			continue // only one of the two acts: the sum is that force
		}
		out[v] = [2]float64{}
		separate = append(separate, reciprocal.ExternalForce{Node: v, Force: load}, reciprocal.ExternalForce{Node: v, Force: r})
	}
	return out, separate
}
