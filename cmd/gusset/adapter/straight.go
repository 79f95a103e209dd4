package adapter

import (
	"errors"

	"gusset/engine/model"
	"gusset/protocol"
)

// straight holds a model's nodes and members decoded straight into the
// compiler's input (protocol.DecodeStrictEach), so that a large request
// never holds them twice, as wire structs and as their model.Spec copy
// (on a 270,600-member model those are 45 and 58 MB). Its arrays are
// used only when the decode that filled them succeeded (ok).
type straight struct {
	w       *protocol.Model // the wire model being decoded, for its dimension
	nodes   []model.NodeSpec
	members []model.MemberSpec
	coords  []model.Value // the block nodes' coordinates are cut from
	// ok is set once the decode with the sinks succeeded; nodesSeen and
	// membersSeen count the arrays met, one each at most.
	ok                     bool
	nodesSeen, membersSeen int
}

// errDeclined makes DecodeStrictEach decline an element the fast path
// leaves to the generic one, which locates the problem exactly.
var errDeclined = errors.New("adapter: element left to the generic decode")

// sinks returns the sinks that collect w's nodes and members into s.
func (s *straight) sinks(w *protocol.Model) []protocol.Sink {
	s.w = w
	return []protocol.Sink{
		&protocol.Each[protocol.Node]{Start: s.startNodes, Take: s.takeNode},
		&protocol.Each[protocol.Member]{Start: s.startMembers, Take: s.takeMember},
	}
}

func (s *straight) startNodes(n int) {
	s.nodesSeen++
	s.nodes = make([]model.NodeSpec, 0, n)
	dim := s.w.Dimension // decoded already when the host writes it first
	if dim != 2 {
		dim = 3
	}
	s.coords = make([]model.Value, 0, n*dim)
}

func (s *straight) startMembers(n int) {
	s.membersSeen++
	s.members = make([]model.MemberSpec, 0, n)
}

// takeNode converts a decoded node. A node whose coordinates the schema's
// bounds refuse is left to the generic decode, as is a second array of
// nodes (no params type has one).
func (s *straight) takeNode(n *protocol.Node) error {
	if s.nodesSeen != 1 || (n.At != nil && !nodeBoundsOK(n)) {
		return errDeclined
	}
	var at []model.Value
	if n.At != nil {
		if cap(s.coords)-len(s.coords) < len(n.At) {
			s.coords = make([]model.Value, 0, max(3*slabNodes, len(n.At)))
		}
		start := len(s.coords)
		for _, x := range n.At {
			s.coords = append(s.coords, value(x))
		}
		at = s.coords[start:len(s.coords):len(s.coords)]
	}
	s.nodes = append(s.nodes, model.NodeSpec{ID: n.ID, At: at, Mass: n.Mass})
	return nil
}

// slabNodes is the number of nodes a further block of coordinates holds
// when the first, sized from the array's count, runs out.
const slabNodes = 1024

// takeMember converts a decoded member; one the schema's bounds refuse is
// left to the generic decode.
func (s *straight) takeMember(m *protocol.Member) error {
	if s.membersSeen != 1 || !memberBoundsOK(m) {
		return errDeclined
	}
	s.members = append(s.members, model.MemberSpec{})
	memberSpecOf(&s.members[len(s.members)-1], m)
	return nil
}

// nodeBoundsOK and memberBoundsOK report whether the element's arrays
// have the lengths the schema's minItems and maxItems allow (the bounds
// schema.CheckBounds checks on the generic path; absent arrays are the
// schema's to check). TestStraightBoundsMatchSchema keeps the two lists
// of bounded fields equal.
func nodeBoundsOK(n *protocol.Node) bool {
	return n.At == nil || (len(n.At) >= 2 && len(n.At) <= 3)
}

func memberBoundsOK(m *protocol.Member) bool {
	if m.Ends != nil && len(m.Ends) != 2 || m.Orientation != nil && len(m.Orientation) != 3 {
		return false
	}
	return m.Releases == nil || (len(m.Releases.First) <= 3 && len(m.Releases.Second) <= 3)
}
