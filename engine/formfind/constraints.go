package formfind

import (
	"fmt"
	"math"

	"gusset/engine/fault"
)

// throughTarget is a resolved Through.
type throughTarget struct {
	node  int
	at    []float64
	scale float64 // the factor s of the force densities found
}

// target is a resolved Target.
type target struct {
	member int
	length bool // a length target; else a force target
	value  float64
}

// prepareConstraints resolves Through and Targets to indices and checks
// them. fixed tells the fixed nodes.
func (f *finder) prepareConstraints(fixed []bool) error {
	p, m := f.p, f.m
	if p.Through != nil && len(p.Targets) > 0 {
		return fault.At(fault.InvalidModel, "/targets", "through and targets cannot be combined: through scales every force density by one factor, which would undo the targets")
	}
	if t := p.Through; t != nil {
		node := -1
		for i, id := range m.NodeIDs {
			if id == t.Node {
				node = i
			}
		}
		switch {
		case node < 0:
			return fault.At(fault.InvalidModel, "/through/node", "no node is called %q", t.Node)
		case fixed[node]:
			return fault.At(fault.InvalidModel, "/through/node", "node %q is fixed by a support; through needs a free node", t.Node)
		case len(t.At) != m.Dim:
			return fault.At(fault.InvalidModel, "/through/at", "the point has %d coordinates; the model is %dD", len(t.At), m.Dim)
		}
		for k, x := range t.At {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return fault.At(fault.InvalidModel, fmt.Sprintf("/through/at/%d", k), "coordinate must be finite")
			}
		}
		f.through = &throughTarget{node: node, at: t.At, scale: 1}
	}
	index := make(map[string]int, len(m.Members))
	for e, mem := range m.Members {
		index[mem.ID] = e
	}
	seen := map[int]bool{}
	for k, t := range p.Targets {
		path := fmt.Sprintf("/targets/%d", k)
		e, ok := index[t.Member]
		switch {
		case !ok:
			return fault.At(fault.InvalidModel, path+"/member", "no member is called %q", t.Member)
		case seen[e]:
			return fault.At(fault.InvalidModel, path+"/member", "member %q has two targets", t.Member)
		case (t.Length == nil) == (t.Force == nil):
			return fault.At(fault.InvalidModel, path, "give either a length or a force for member %q", t.Member)
		case t.Length != nil && !(*t.Length > 0 && !math.IsInf(*t.Length, 1)):
			return fault.At(fault.InvalidModel, path+"/length", "target length must be positive and finite, not %g", *t.Length)
		case t.Force != nil && (*t.Force == 0 || math.IsNaN(*t.Force) || math.IsInf(*t.Force, 0)):
			return fault.At(fault.InvalidModel, path+"/force", "target force must be non-zero and finite, not %g", *t.Force)
		case f.q[e] == 0:
			return fault.At(fault.InvalidModel, fmt.Sprintf("/force_densities/%d", e), "member %q has a target but a zero force density, which the update cannot change; start it from a non-zero value", t.Member)
		}
		seen[e] = true
		if t.Length != nil {
			f.targets = append(f.targets, target{member: e, length: true, value: *t.Length})
		} else {
			f.targets = append(f.targets, target{member: e, value: *t.Force})
		}
	}
	return nil
}

// achieved returns the current value of target t: the member's length or
// its axial force q·L.
func (f *finder) achieved(t target) float64 {
	if t.length {
		return f.lengths[t.member]
	}
	return f.q[t.member] * f.lengths[t.member]
}

// targetMisfit returns the largest |achieved − target| / |target|.
func (f *finder) targetMisfit() float64 {
	var worst float64
	for _, t := range f.targets {
		worst = max(worst, math.Abs(f.achieved(t)-t.value)/math.Abs(t.value))
	}
	return worst
}

// updateTargets applies one step of the fixed-point force density update
// and reports whether a force density changed. For a target force N*,
// q ← N*/L makes the member carry N* on the present geometry; for a target
// length L*, q ← q·L/L* keeps the member's force and asks for the length
// L* (a member too long gets a larger force density and shortens). Both are
// the update of the iterative force density method as described by
// K. Linkwitz, "Force density method", in S. Adriaenssens et al. (eds.),
// Shell Structures for Architecture, Routledge 2014, ch. 6 (from memory),
// and compared by L. Veenendaal and P. Block, "An overview and comparison
// of structural form finding methods for general networks", International
// Journal of Solids and Structures 49(26):3741–3753, 2012 (from memory).
func (f *finder) updateTargets() bool {
	for _, t := range f.targets {
		L := f.lengths[t.member]
		if L == 0 {
			continue
		}
		if t.length {
			f.q[t.member] *= L / t.value
		} else {
			f.q[t.member] = t.value / L
		}
	}
	return len(f.targets) > 0
}
