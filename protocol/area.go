package protocol

// AreaLoad is a load spread over a panel: a flat, convex polygon of three
// or more nodes of a 3D model (within 1e-3 of its largest extent of its
// mean plane). Give exactly one of pressure and value. The panel's total
// (intensity × area) and its moment about any point are conserved
// exactly. Spread to the nodes, the panel is split into triangles by a
// fan from the mean of its nodes, each triangle's share going to its
// corners in equal thirds (the consistent load of a flat triangle) and
// the mean's thirds shared equally among the nodes, so a rectangle's
// corners take a quarter each. Spread to the members (a rectangular panel
// whose four edges are members), one way gives the two members across
// the span direction half each as a uniform load; two way gives the
// short edges triangles and the long edges trapezoids by 45° lines from
// the corners.
type AreaLoad struct {
	// Nodes are the panel's node ids in order around it; the normal
	// follows them by the right-hand rule (anticlockwise seen from above
	// means the normal points up).
	Nodes []string `json:"nodes" jsonschema:"minItems=3"`
	// Pressure is a force per area normal to the panel: positive presses
	// on the face the normal points out of (acting along −normal, down on
	// a roof whose nodes run anticlockwise seen from above); negative is
	// suction.
	Pressure *float64 `json:"pressure,omitempty"`
	// Value is a force per area as a global vector (3 entries), per true
	// area of the panel unless projected.
	Value []float64 `json:"value,omitempty" jsonschema:"minItems=3,maxItems=3"`
	// Projected (with value only) gives value per area projected on the
	// plane normal to it, as snow on a pitched roof is given per plan
	// area: the total is value × the projected area.
	Projected bool `json:"projected,omitempty"`
	// To is where the load goes: "nodes" (default) or "members" (the
	// members along the panel's edges, as line loads).
	To string `json:"to,omitempty" jsonschema:"enum=nodes,enum=members"`
	// Span, with to "members", is "one-way" or "two-way".
	Span string `json:"span,omitempty" jsonschema:"enum=one-way,enum=two-way"`
	// SpanDirection, for a one-way panel, is the direction it spans in
	// (3 entries, along one pair of its edges): the load travels along it
	// to the two edge members that run across it.
	SpanDirection []float64 `json:"span_direction,omitempty" jsonschema:"minItems=3,maxItems=3"`
}
