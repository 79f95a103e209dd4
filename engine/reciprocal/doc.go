// Package reciprocal computes Maxwell's reciprocal force diagram of a plane
// network of bars in equilibrium, labels it in Bow's notation, lifts the
// network to its polyhedral Airy stress function with the polar reciprocal,
// and goes back from an edited force diagram to the form (design by forces).
//
// Embedding. Build sorts the members round each node by angle and traces
// the faces of the plane drawing; members that cross, touch or overlap
// away from a shared node are refused with a NotPlanar error naming the
// pairs (a uniform grid keeps the check near linear). External forces
// (loads and reactions) are half-lines to infinity in the outer face, drawn
// along their line of action from the node, on the side they push from
// when that side is outside; they split the outer face into spaces. A force
// at a node with no outer corner cannot be drawn and is refused. The
// network must be connected.
//
// Bow's notation. Space A is the space clockwise after the external force
// at the leftmost loaded node (smallest x, then smallest y); the letters
// run clockwise round the boundary (A..Z, AA, AB, ...). Inner faces are
// numbered 1, 2, ... left to right by centroid. A member is named by its
// two spaces, letters first ("B-2"), an external force by the space before
// and after it clockwise ("A-B").
//
// Force diagram. One point per space and face, with space A at the origin;
// for each member or external force, Points[Right] − Points[Left] equals
// the force it exerts on its node (Ends[0] for a member), turned a quarter
// turn counter-clockwise when perpendicular segments are asked for. Read
// clockwise round a joint from the space before to the space after, a
// member's segment is the force on the joint: pointing away from the joint
// for tension, towards it for compression (R. H. Bow, 1873). The points
// are the least-squares fit of all segments, computed from an exact
// spanning-tree placement refined by preconditioned conjugate gradients on
// the face graph's Laplacian, so small closure errors spread evenly.
//
// Airy stress function. Face planes have the force-diagram points turned a
// quarter turn clockwise as gradients; tension members are valleys (convex
// creases), compression members ridges, in agreement with Airy's
// continuum function (see Lift). The polar with respect to the paraboloid
// z = (x² + y²)/2 is the force diagram lifted (see Polar).
//
// Units are the model's: lengths in its length unit, forces in its force
// unit, stress-function heights in force × length. Tension is positive.
package reciprocal
