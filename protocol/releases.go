package protocol

// MemberReleases lists, per end of a beam, the rotation components
// released there, in the member's local axes (x from its first end to its
// second): "rx" (torsion), "ry" and "rz" (bending about local y and z); a
// 2D beam has "rz" only. A released end carries no moment about those
// axes (the beam's stiffness is condensed on them); a torsion release at
// either end frees the member of torque. A node where every beam is
// released about a rotation is a hinge: that rotation is no freedom of
// the structure (it is reported as zero and takes no moment load).
type MemberReleases struct {
	// First lists the components released at the first end.
	First []string `json:"first,omitempty" jsonschema:"uniqueItems=true,maxItems=3,enum=rx,enum=ry,enum=rz"`
	// Second lists the components released at the second end.
	Second []string `json:"second,omitempty" jsonschema:"uniqueItems=true,maxItems=3,enum=rx,enum=ry,enum=rz"`
}
