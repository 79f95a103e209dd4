package modes

import (
	"fmt"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// refuseOneSided refuses a model with one-sided members (cables,
// tension-only or compression-only bars) or pretension: the eigenvalue
// problems here take every member as active in K and leave the
// pretension's geometric stiffness out of vibration, so a slack member
// would stiffen the structure and a taut cable would lose its stiffness
// across. The pointer names the member's field.
func refuseOneSided(m *model.Model) error {
	for e := range m.Members {
		mem := &m.Members[e]
		field := ""
		switch {
		case mem.Cable:
			field = "type"
		case mem.Behaviour != model.Both:
			field = "behaviour"
		case mem.Pretension > 0:
			field = "pretension"
		default:
			continue
		}
		return fault.At(fault.InvalidModel, fmt.Sprintf("members/%d/%s", e, field),
			"member %q is a cable, one-sided or pretensioned; buckling and vibration analyses do not handle these yet (solve does, with second_order for the P-Δ effect)", mem.ID)
	}
	return nil
}
