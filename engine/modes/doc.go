// Package modes finds the linear buckling load factors and the natural
// frequencies of a structure, with their mode shapes.
//
// Buckling solves (K + λ·K_G)·φ = 0 for the load factors λ of a load case
// or combination nearest a shift (the lowest by default): K is the
// stiffness of package stiffness and K_G the geometric stiffness of the
// case's axial forces (tension positive): for a bar the string term
// (N/L)·(I − x·xᵀ), for a beam the consistent geometric stiffness of the
// cubic Euler–Bernoulli element in each bending plane (and, in 3D, the
// torsional term of a doubly symmetric section). A negative factor means
// the loads reversed. Lateral-torsional buckling (the coupling of bending
// and twist that a beam's major-axis moment produces) is not modelled, nor
// are members' own buckling between nodes for bars, which the stiffness
// package's utilisation checks.
//
// Vibration solves (K − ω²·M)·φ = 0 for the natural frequencies nearest a
// shift, M being the consistent mass of the members (the material's
// mass_density) plus lumped masses at nodes; mode shapes are
// mass-normalised, and each mode carries its participation factors and
// effective modal masses per direction. A singular K (a mechanism, or a
// structure without enough supports) gives modes of zero frequency,
// reported as mechanisms.
//
// Both use shift-invert Lanczos with full reorthogonalisation and thick
// restarts on the supernodal Cholesky factorisation of package sparse
// (one factorisation of K − σ·B per analysis, reusing the symbolic
// analysis of K's structure), with a convergence test on the residual
// ‖K·φ − λ·B·φ‖ of every mode. All results are those of linear
// (bifurcation and small-vibration) theory for the perfect structure:
// imperfections, nonlinearity and the design codes govern real design,
// and a qualified engineer checks the design against local codes and
// standards.
package modes
