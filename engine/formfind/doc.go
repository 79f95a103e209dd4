// Package formfind finds equilibrium forms of pin-jointed networks (cable
// nets, thrust lines, funicular vaults) by the force density method: H.-J.
// Schek, "The force density method for form finding and computation of
// general networks", Computer Methods in Applied Mechanics and Engineering
// 3(1):115–134, 1974.
//
// Each member e carries a force density qₑ = Nₑ/Lₑ (axial force over length,
// tension positive). Equilibrium of free node i under its applied load pᵢ,
// Σₑ qₑ (xⱼ − xᵢ) + pᵢ = 0 over the members e = (i, j) at i, is linear in the
// coordinates once the force densities are chosen: with C the branch–node
// matrix split into its free and fixed columns and Q = diag(q),
//
//	D·x = p − D_f·x_f,   D = Cᵀ·Q·C (free columns),  D_f = Cᵀ·Q·C_f,
//
// one system per axis with the same matrix D. D is symmetric positive
// definite when every q > 0 and every free node is joined to a fixed one,
// negative definite when every q < 0 (the compression network: Find
// factorises −D), and may be indefinite or singular when the signs mix,
// which Find detects through the pivots of the factorisation and reports
// with the nodes and members concerned. D is factorised once per set of
// force densities by engine/sparse's supernodal Cholesky; the ordering and
// symbolic analysis are done once and reused across the axes and every
// iteration.
//
// On the linear method Find builds three iterations a designer asks for:
// scaling the force densities so that one node passes through a given point
// (the thrust line through three points), meeting target lengths or target
// forces of chosen members by the fixed-point force density update, and
// loads that follow the form (self-weight and global member loads per unit
// length re-lumped on the found geometry until the form stops moving: the
// catenary rather than the parabola). The answer carries the found
// coordinates, force densities, member forces and lengths, reactions and the
// equilibrium residual, and Result.Ready turns it into a model that the
// other methods (stiffness, reciprocal, loadpath, sweep) take as is.
//
// Conventions: tension positive; gravity along −y in 2D and −z in 3D;
// forces and lengths in the model's units, force densities in force per
// length.
package formfind
