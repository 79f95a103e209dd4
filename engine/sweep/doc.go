// Package sweep runs parameter sweeps: it evaluates a caller's function at
// every point of a one-dimensional list or a two-dimensional grid of
// parameter values, in parallel, streaming each step as it finishes, and
// optionally refines the best step to an optimum of one named metric.
//
// The package knows nothing of mechanics: an Evaluator maps parameter
// values to named metrics. ModelEvaluator builds the structural one (load
// path, volume, mass, carbon, displacement, utilisation) from a compiled
// model and a solver.
//
// Refinement in one dimension brackets the best step between its
// neighbours and applies Brent's minimiser, golden-section search combined
// with successive parabolic interpolation (R. P. Brent, Algorithms for
// Minimization without Derivatives, Prentice-Hall, 1973, ch. 5). In two
// dimensions it starts the simplex method of J. A. Nelder and R. Mead ("A
// simplex method for function minimization", Computer Journal 7, 1965)
// from the best grid point, with points projected onto the bounds.
package sweep
