// Package layout finds least-material pin-jointed layouts by the
// ground-structure method of plastic layout optimisation (Dorn, Gomory &
// Greenberg, "Automatic design of optimal structures", Journal de Mécanique
// 3, 1964).
//
// A design domain (in the plane a polygon with holes, in space a convex
// polyhedron with holes that are convex polyhedra, or the caller's own
// nodes) is filled with a grid of nodes; every pair of nodes that can see
// each other inside the domain is a candidate member, except a pair whose
// integer grid steps (dx, dy, dz) have a common divisor, which passes
// through another node. The least-volume layout that carries the loads to
// the supports is the solution of the linear program
//
//	minimise  Σ L_i (T_i/σ_t + C_i/σ_c)
//	subject to B (T − C) = f on the free freedoms,  T, C ≥ 0,
//
// where T_i and C_i are the tension and compression in member i, L_i its
// length and σ_t, σ_c the stress limits. Tension is positive; B_i holds the
// member's unit vector at its second end and its negative at its first end,
// so that Bᵀu is the members' elongation under nodal displacements u.
//
// Large ground structures are solved by member adding (Gilbert & Tyas,
// "Layout optimization of large-scale pin-jointed frames", Engineering
// Computations 20(8), 2003): the linear program is first solved over short
// members only; its dual values are nodal virtual displacements u, and every
// candidate whose virtual strain Bᵢᵀu/L_i exceeds the dual limit 1/σ_t (or
// falls below −1/σ_c) would improve the layout; the most violating ones are
// added and the program is solved again until none violates. The
// candidates are generated node by node whenever they are priced and never
// held all at once: a 20 × 10 × 10 space grid has 2.67 million. The largest
// relative violation left is the optimality gap: the volume found is within
// that fraction of the optimum over all candidates.
//
// Options.Method can instead solve one program over every candidate, by
// the interior-point method or, for small problems, by gonum's dense
// simplex method (gonum.org/v1/gonum/optimize/convex/lp); the tests use the
// latter as a cross-check.
//
// The linear programs are solved by a primal–dual interior-point method with
// Mehrotra's predictor–corrector (Wright, Primal-Dual Interior-Point Methods,
// SIAM 1997) whose normal equations A D Aᵀ are factorised by the supernodal
// sparse Cholesky of engine/sparse in a nested-dissection order taken from
// the node coordinates, each pivot measured against its own diagonal entry.
// A member-adding program with at most a tenth of new members starts from
// the last program's first iterate within 1e-3 of optimal, the new
// columns given a positive slack (a warm start after Gondzio,
// Mathematical Programming 83, 1998), which saves about a fifth of the
// interior-point iterations.
//
// Several load cases are handled in three modes. Alternatives (the default)
// solves the multiple-load-case program: each member's area must carry its
// force in every case, a_i ≥ T_iᵏ/σ_t + C_iᵏ/σ_c for every case k, and Σ L_i a_i
// is minimised. Together adds the cases into one and solves a single case.
// For exactly two alternative cases with equal limits, SingleEquivalent
// solves the two single cases (f¹+f²)/2 and (f¹−f²)/2 and superposes them,
// which gives the same volume as the multiple-load-case program because
// max(|q⁺+q⁻|, |q⁺−q⁻|) = |q⁺| + |q⁻| (Hemp, Optimum Structures, 1973, on two
// load conditions; from memory).
//
// The result keeps the members whose area is at least Options.AreaThreshold
// (relative to the largest area, default 1e-4), merges chains of collinear
// members through unloaded two-member nodes, and corrects the forces by the
// least-norm adjustment that restores nodal equilibrium to round-off, so
// that Maxwell's load-path theorem Σ N_i L_i = Σ F·r (loads and reactions)
// holds to round-off (Maxwell, "On reciprocal figures, frames, and diagrams
// of forces", 1870).
//
// The results are a preliminary design aid: a qualified engineer must check
// the design against the local codes and standards.
package layout
