// Package stiffness analyses linear-elastic frameworks of bars and beams by
// the direct stiffness method.
//
// Solve numbers the freedoms (translations at every node, rotations only at
// nodes a beam touches, so that pin-jointed nodes of mixed models are not
// singular), assembles the stiffness of the unconstrained freedoms,
// factorises it once (dense Cholesky from gonum for small systems, the
// sparse supernodal Cholesky of package sparse otherwise) and reuses the
// factor for every load case and combination.
//
// The matrix pattern comes from the member connectivity, node by node, and
// element blocks are added straight into its values. Large models use
// Options.Workers goroutines for assembly (each owns a range of nodes and
// adds its entries in member order), for the load cases, for the members
// of a case's recovery and, beside them, for the condition estimate; every
// sum is taken in the same order whatever the workers, so results are
// bit-identical for any number of them.
//
// Elements: bars carry axial force only (EA/L). 2D beams add Euler–Bernoulli
// bending (EI with I = Section.SecondMoment). 3D beams carry axial force,
// bending about local z (SecondMoment) and local y (SecondMomentY), and
// St Venant torsion GJ/L (TorsionConstant, Material.ShearModulus). A
// member's local x runs from its first end to its second; local y is the
// part of Member.Orientation normal to x, by default global z, or global y
// for a vertical member (statics.MemberAxes); local z = x × y. In 2D, local
// y is x turned a quarter turn anticlockwise.
//
// Loads along members are given per unit length of the member, in global
// or local axes. On beams they become consistent fixed-end forces (the
// integrals of the cubic Hermite shape functions against the load), so end
// forces and nodal displacements are exact for Euler–Bernoulli theory. On
// bars every load is carried to the two ends by the lever rule (statically
// equivalent lumping: a transverse load on a bar reaches the nodes as if the
// bar were a simple span, and adds nothing to its axial force); self-weight
// on a bar is thus half to each end. A thermal strain ε in a restrained
// member gives the fixed-end axial force E·A·ε.
//
// Prescribed support displacements (settlement) belong to the supports,
// so they act, unfactored, in every load case and every combination;
// combinations are otherwise the factored sums of their cases.
//
// Members with a one-sided Behaviour (cables, tension-only and
// compression-only bars) and Options.SecondOrder (P-Δ) break
// superposition: such a solve takes each case and combination on its own
// through an iteration (iterate.go, activeset.go) that refactorises K with
// the member state on one symbolic analysis, or updates the last factor by
// the rank-one terms of the few bars that switched (lowrank.go), and
// reports how it converged in CaseResult.Iteration. Pretension, like
// settlement, belongs to its member and acts unfactored in every case.
//
// Sign conventions: tension positive. End forces are the forces the nodes
// exert on the member, in its local axes, so a member in tension N has
// local x end forces −N at end 1 and +N at end 2. Reactions are the forces
// (and moments) the supports exert on the structure.
package stiffness
