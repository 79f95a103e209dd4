// Package modelgen builds deterministic models for tests and benchmarks:
// trusses, space grids and frames of a requested size, each returned as a
// *model.Spec with plain numbers (no expressions) and ids "n0", "n1", ...
// for nodes and "m0", "m1", ... for members, numbered in the order the
// generator creates them. Must compiles a Spec and panics on failure, for
// callers that know the model is valid.
//
// Units are m and kN throughout. Every model uses one material, "steel"
// (E = 2.1e8 kN/m², weight density 77 kN/m³, tension and compression
// limits 2.35e5 kN/m², carbon factor 1.5 kg CO2e/kg), and one section,
// "tube" (area 2e-3 m², second moment 3e-6 m⁴). Generators that take a
// *rand.Rand (math/rand/v2) are deterministic for a given seed.
package modelgen
