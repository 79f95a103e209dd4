package model

import (
	"math"
	"strconv"
)

// memberBehaviour sets member i's behaviour and pretension. Both belong
// to axial members: a beam with either is refused (its bending stiffness
// does not switch off with the sense of its axial force, so a one-sense
// beam would need a different element, not a flag), as are a cable other
// than tension-only, a negative or non-finite pretension, and a
// pretension on a compression-only bar (which could never hold it).
func (c *compiler) memberBehaviour(i int) {
	ms, mem := &c.spec.Members[i], &c.m.Members[i]
	// The path is built only for a problem: nearly every member has none.
	at := func() string { return "members/" + strconv.Itoa(i) }
	switch ms.Behaviour {
	case "":
	case "tension-only":
		mem.Behaviour = TensionOnly
	case "compression-only":
		if mem.Cable {
			c.problem(at()+"/behaviour", "member %q is a cable, which is tension-only; remove behaviour %q or make it a bar", ms.ID, ms.Behaviour)
			return
		}
		mem.Behaviour = CompressionOnly
	default:
		c.problem(at()+"/behaviour", "member %q has behaviour %q; use \"tension-only\" or \"compression-only\" (or leave it out for both)", ms.ID, ms.Behaviour)
		return
	}
	if ms.Behaviour != "" && ms.Type == "beam" {
		c.problem(at()+"/behaviour", "member %q is a beam, which takes bending whatever the sense of its axial force; behaviour is for bars and cables", ms.ID)
	}
	if ms.Pretension == nil {
		return
	}
	t := *ms.Pretension
	switch {
	case ms.Type == "beam":
		c.problem(at()+"/pretension", "member %q is a beam; pretension is for bars and cables", ms.ID)
	case !(t >= 0) || math.IsInf(t, 0):
		c.problem(at()+"/pretension", "member %q needs a pretension that is a finite force of at least 0, got %v", ms.ID, t)
	case t > 0 && mem.Behaviour == CompressionOnly:
		c.problem(at()+"/pretension", "member %q is compression-only and cannot hold a pretension (a tension); remove one of them", ms.ID)
	default:
		mem.Pretension = t
	}
}

// NonLinear reports whether m has a member whose behaviour is one-sided
// (tension-only, compression-only, cables): such a model is not solved
// by superposing its load cases.
func (m *Model) NonLinear() bool {
	for i := range m.Members {
		if m.Members[i].Behaviour != Both {
			return true
		}
	}
	return false
}
