package adapter

import (
	"gusset/protocol"
)

// releasesSpec returns a member's releases as the compiler takes them
// (first, second end), or none.
func releasesSpec(r *protocol.MemberReleases) [2][]string {
	if r == nil {
		return [2][]string{}
	}
	return [2][]string{r.First, r.Second}
}

// releasesWire returns a member's releases for the wire, or nil when it
// has none.
func releasesWire(r [2][]string) *protocol.MemberReleases {
	if len(r[0]) == 0 && len(r[1]) == 0 {
		return nil
	}
	return &protocol.MemberReleases{First: r[0], Second: r[1]}
}
