package model

import "strconv"

// ReleaseBit returns the bit of Member.Releases for rotation component c
// (RX, RY or RZ, in the member's local axes).
func ReleaseBit(c int) uint8 { return 1 << uint(c-RX) }

// Released reports whether rotation component c (RX, RY or RZ, local
// axes) is released at end side (0 first, 1 second) of the member.
func (mem *Member) Released(side, c int) bool { return mem.Releases[side]&ReleaseBit(c) != 0 }

// HasReleases reports whether any end of the member is released.
func (mem *Member) HasReleases() bool { return mem.Releases != [2]uint8{} }

// HasReleases reports whether any member of the model has releases.
func (m *Model) HasReleases() bool {
	for e := range m.Members {
		if m.Members[e].HasReleases() {
			return true
		}
	}
	return false
}

// releaseEnds are the wire names of a member's ends in its releases.
var releaseEnds = [2]string{"first", "second"}

// memberReleases compiles member i's releases: beams only, components
// that exist in the model's dimension ("rz" in 2D; "rx", "ry", "rz" in
// 3D), each at most once per end.
func (c *compiler) memberReleases(i int) {
	ms, mem := &c.spec.Members[i], &c.m.Members[i]
	if len(ms.Releases[0]) == 0 && len(ms.Releases[1]) == 0 {
		return
	}
	path := "members/" + strconv.Itoa(i) + "/releases"
	if ms.Type != "beam" {
		c.problem(path, "member %q is a %s, whose ends carry no moment already; releases apply to beams only: remove them, or make the member a beam",
			ms.ID, typeName(ms.Type))
		return
	}
	for side, list := range ms.Releases {
		for k, name := range list {
			at := path + "/" + releaseEnds[side] + "/" + strconv.Itoa(k)
			comp := -1
			switch name {
			case "rx":
				comp = RX
			case "ry":
				comp = RY
			case "rz":
				comp = RZ
			}
			switch {
			case comp < 0 || (c.dim == 2 && comp != RZ):
				allowed := `"rx", "ry" or "rz"`
				if c.dim == 2 {
					allowed = `"rz" only (a plane beam bends about z alone)`
				}
				c.problem(at, "member %q releases %q at its %s end; a %dD beam releases %s", ms.ID, name, releaseEnds[side], c.dim, allowed)
			case mem.Releases[side]&ReleaseBit(comp) != 0:
				c.problem(at, "member %q releases %q twice at its %s end; list each component once", ms.ID, name, releaseEnds[side])
			default:
				mem.Releases[side] |= ReleaseBit(comp)
			}
		}
	}
}

// typeName returns a member type as the messages name it.
func typeName(t string) string {
	if t == "" {
		return "bar"
	}
	return t
}
