// Package statics builds the equilibrium matrix of a framework and counts
// its states of self-stress and its mechanisms.
//
// The equilibrium matrix A maps member forces t to the nodal loads f they
// balance, A·t = f, with one row per unconstrained nodal freedom and one
// column per independent member force; its transpose is the compatibility
// matrix that maps nodal displacements to member extensions (the static–
// kinematic duality set out in S. Pellegrino, "Structural computations with
// the singular value decomposition of the equilibrium matrix", Int. J.
// Solids Struct. 30, 1993, from memory). With r the rank of A, the
// framework has
//
//	s = c − r   states of self-stress (the null space of A), and
//	m = n − r   inextensional mechanisms (the null space of Aᵀ),
//
// where c is the number of columns and n the number of rows, which is
// Maxwell's counting rule in its extended form b − d·j + k = s − m
// (J. C. Maxwell, "On the calculation of the equilibrium and stiffness of
// frames", Phil. Mag. 27, 1864, with s and m as in Pellegrino 1993) for a
// pin-jointed framework of b bars, j joints in d dimensions and k
// kinematic constraints.
//
// Pin-jointed models have one column per bar (its axial force, tension
// positive). Models with beams use the generalised form: a 2D beam has three
// independent member forces (axial force and the two end moments) and a 3D
// beam six (axial force, torque and two end moments about each local
// bending axis); the rows gain the rotational freedoms of the nodes that
// beams touch. Because the stiffness matrix is K = A·D·Aᵀ with D positive
// definite, the rank of this matrix is the rank of the stiffness matrix, so
// the count is the one the stiffness method sees.
//
// Convention for m: every independent inextensional motion of the supported
// structure is counted, including rigid-body motions the supports fail to
// prevent (an unsupported plane triangle has m = 3). Springs are not
// constraints for this count.
package statics
