// Package model holds the compiled numeric model that every engine package
// takes, and the compiler that builds it from a Spec.
//
// A Spec is the model as the host wrote it: string ids, numbers that may be
// expression strings over named parameters. Compile resolves ids to indices,
// compiles each expression once, checks the semantics (duplicate or dangling
// ids, zero-length members, coincident nodes, dimension mismatches,
// non-finite numbers, non-positive stiffness or area, unknown parameters, an
// empty model) and reports every problem it finds with a JSON pointer
// relative to the model object. The result is a Model: indices and float64
// slices. Model.WithParameters re-evaluates only the expressions for new
// parameter values, leaving the topology untouched, which is what a sweep
// does thousands of times.
//
// Conventions: right-handed axes; gravity along −y in 2D and −z in 3D;
// tension positive. Freedom components are numbered X, Y, Z, RX, RY, RZ
// (0..5); a 2D model uses X, Y and RZ only.
package model
