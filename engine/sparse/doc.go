// Package sparse solves sparse symmetric positive definite systems, such as
// the stiffness equations K·u = f of a structure, by a supernodal sparse
// Cholesky factorisation P·A·Pᵀ = L·Lᵀ.
//
// Matrices are stored as their lower triangle compressed by column (Matrix),
// assembled from triplets with a Builder or, for repeated assembly into a
// fixed pattern, with NewPattern and Matrix.Find.
//
// Factorize runs three phases:
//
//   - ordering: a fill-reducing permutation by approximate minimum degree,
//     written for this package from the description in P. R. Amestoy,
//     T. A. Davis and I. S. Duff, "An approximate minimum degree ordering
//     algorithm", SIAM J. Matrix Anal. Appl. 17(4):886–905, 1996: elimination
//     on the quotient graph with element absorption (including aggressive
//     absorption), approximate external degrees, mass elimination and
//     supervariable detection by hashing (Order); on large matrices also
//     nested dissection by level-structure separators (OrderNested, after
//     A. George and J. W. H. Liu, SIAM J. Numer. Anal. 15(5), 1978) whose
//     pieces and separators are numbered by constrained minimum degree,
//     keeping whichever order predicts fewer nonzeros in L;
//   - symbolic: the elimination tree (J. W. H. Liu, "The role of elimination
//     trees in sparse factorization", SIAM J. Matrix Anal. Appl. 11(1), 1990),
//     its postorder, column counts by the skeleton-matrix method of
//     J. R. Gilbert, E. G. Ng and B. W. Peyton (SIAM J. Matrix Anal. Appl.
//     15(4), 1994), fundamental supernodes merged by relaxed amalgamation,
//     and the row structure of every supernode;
//   - numeric: a multifrontal factorisation over the supernodal elimination
//     tree. Each supernode assembles its columns of A and its children's
//     update matrices (scatter-add through relative indices), factorises its
//     diagonal block with LAPACK's Potrf, solves for its off-diagonal block
//     with Trsm and forms its own update matrix with Syrk and Gemm, all
//     through gonum's blas64 and lapack64. Independent subtrees run on
//     separate goroutines; every supernode performs the same floating-point
//     operations in the same order whatever the schedule, so results are
//     bit-identical for any number of workers.
//
// A pivot that is not positive, not finite, or at most the pivot tolerance
// times the largest diagonal entry marks a freedom that the rest of the
// matrix does not restrain (for a stiffness matrix, a mechanism). The
// factorisation replaces it by 1, zeroes the rest of its column of L (holds
// the freedom) and goes on, so all such columns are found: Factorize returns
// them in a *PivotError, or with Options.Regularize lists them through
// Cholesky.Deficient.
//
// Solve, SolveRefined (iterative refinement) and ConditionEstimate (Hager's
// 1-norm estimator) reuse one factorisation for any number of right-hand
// sides; Refactorize reuses the ordering, the analysis and the storage for
// new values in the same pattern.
package sparse
