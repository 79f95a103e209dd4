package loadpath

import (
	"fmt"

	"gusset/engine/model"
	"gusset/engine/stiffness"
)

// GivenForces builds the one case of given member axial forces (tension
// positive, one per member of m, in the model's force unit). The external
// force at an unsupported node is the applied nodal load of load case
// caseIndex of m (none when caseIndex < 0); at a supported node it is the
// force that balances the members meeting there, load and reaction
// together. Maxwell's residual of the case then measures the equilibrium
// of the free nodes only. The case's ID is the load case's id, or "given".
// A forces slice of the wrong length is an *InputError at "/forces".
func GivenForces(m *model.Model, forces []float64, caseIndex int) (Case, error) {
	if len(forces) != len(m.Members) {
		return Case{}, &InputError{Path: "/forces",
			Message: fmt.Sprintf("forces has %d entries but the model has %d members; give one axial force per member", len(forces), len(m.Members))}
	}
	c := Case{ID: "given", AxialForce: forces, External: make([][]float64, m.NodeCount())}
	for i := range c.External {
		c.External[i] = make([]float64, m.Dim)
	}
	supported := make([]bool, m.NodeCount())
	for _, s := range m.Supports {
		supported[s.Node] = true
	}
	if caseIndex >= 0 {
		c.ID = m.Cases[caseIndex].ID
		for _, l := range m.Cases[caseIndex].Nodal {
			for k := 0; k < m.Dim; k++ {
				c.External[l.Node][k] += l.Force[k]
			}
		}
	}
	for e, mem := range m.Members {
		a, b := m.Node(mem.Ends[0]), m.Node(mem.Ends[1])
		length := m.Length(e)
		for k := 0; k < m.Dim; k++ {
			u := (b[k] - a[k]) / length
			// A member in tension pulls each end towards the other; the
			// external force at a supported node balances it.
			if supported[mem.Ends[0]] {
				c.External[mem.Ends[0]][k] -= forces[e] * u
			}
			if supported[mem.Ends[1]] {
				c.External[mem.Ends[1]][k] += forces[e] * u
			}
		}
	}
	// At supported nodes the external force is the total that balances the
	// members: take out the load added above (in this order, so results
	// stay bit for bit those of earlier versions).
	if caseIndex >= 0 {
		for _, l := range m.Cases[caseIndex].Nodal {
			if supported[l.Node] {
				for k := 0; k < m.Dim; k++ {
					c.External[l.Node][k] -= l.Force[k]
				}
			}
		}
	}
	return c, nil
}

// Solved returns the load-path cases of a stiffness result: per case the
// mean axial force of each member (CaseResult.MeanAxialForce, the force
// that balances the loads as carried to the nodes) and, as external
// forces, the applied loads (member loads and self-weight carried to the
// nodes) plus the reactions, both computed by the solver independently of
// the member forces, so that Maxwell's residual measures equilibrium.
func Solved(r *stiffness.Result) []Case {
	cases := make([]Case, len(r.Cases))
	for i := range r.Cases {
		c := &r.Cases[i]
		cases[i] = Case{ID: c.ID, AxialForce: c.MeanAxialForce(), External: c.External}
	}
	return cases
}
