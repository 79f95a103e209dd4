// Package loadpath computes Maxwell's load path of a pin-jointed structure,
// the member areas that its axial forces need, and the material quantities
// that follow: volume, mass and embodied carbon.
//
// For each case the load path is Z = Σ|N|·L over the members, split into a
// tension part Z_T = Σ N·L over members with N > 0 and a compression part
// Z_C = Σ |N|·L over members with N < 0. The load-path constant is
// M = Σ F·r over the nodes, F being the external force at the node (applied
// loads and reactions together) and r the node's position. Maxwell's
// load-path theorem (J. C. Maxwell, "On reciprocal figures, frames and
// diagrams of forces", Trans. Roy. Soc. Edinburgh 26, 1870) states that
// Z_T − Z_C = M for every set of axial forces in equilibrium with the
// external forces. Proof in one line: at node i, Σ_e N_e (r_j − r_i)/L_e +
// F_i = 0 with tension positive; take the dot product with r_i and sum over
// the nodes; each member appears twice and contributes
// −N_e |r_j − r_i|²/L_e = −N_e L_e, so Σ N·L = Σ F·r. M does not depend on the
// origin when ΣF = 0, which Result reports as the resultant.
//
// Sizing gives every member the smallest area that keeps its stress within
// the material's limit, and, in compression, keeps its Euler buckling load
// π²EI/(kL)² at or above |N| for a declared family of geometrically similar
// sections (I = c·A²). Several cases are enveloped: each member is sized for
// the case that needs the largest area, and that case is named.
//
// Units are the model's: forces in its force unit, lengths in its length
// unit, stresses in force/length², weight density in force/length³. Mass is
// reported in kilograms and embodied carbon in kg CO2e whatever the model's
// units.
package loadpath
