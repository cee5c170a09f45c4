// Package sparse holds the compressed sparse row (CSR) matrices that the
// network assembles its Jacobian into, and the sparse linear solvers that
// Newton's method uses on them.
//
// # Matrices
//
// A Builder collects the pattern once; the Matrix keeps it and its values
// are re-stamped at every Newton iteration (see Builder and Matrix).
//
// # Solvers
//
// Every solver implements Solver: Analyse (pattern only, once per
// pattern), Factorize (numeric work for the current values, copied from
// the matrix) and Solve. Every one reports a singular or numerically
// singular matrix with an error wrapping ErrSingular, with the row at
// fault. The thermal Jacobians they are meant for are square, structurally
// symmetric, weakly diagonally dominant with a negative diagonal and
// positive off-diagonal entries (J = −(M-matrix) for conduction, convection
// and radiation), and unsymmetric in value where air streams carry heat.
//
//   - AMD: approximate minimum degree ordering of A+Aᵀ, written from the
//     description of Amestoy, Davis & Duff, SIAM J. Matrix Anal. Appl.
//     17(4), 1996, and of T. A. Davis, Direct Methods for Sparse Linear
//     Systems, SIAM 2006, ch. 7 (quotient graph, approximate external
//     degree, element and aggressive absorption, mass elimination,
//     supervariables by hashing, dense rows ordered last).
//   - Symbolic (Analyse, AnalyseWith): elimination tree by Liu's algorithm,
//     its post-order, and column counts from the row subtrees (Davis 2006,
//     ch. 4).
//   - Cholesky: up-looking LDLᵀ of −PAPᵀ (Davis 2006, ch. 4), for
//     symmetric values. D > 0 for a dissipative network; the sign is handled
//     inside, so callers pass J and get the solution of J·x = b.
//   - Supernodal: the same factorisation (as L·Lᵀ of −PAPᵀ, or of PAPᵀ
//     when every diagonal entry is positive, as in a time step's matrix) by
//     fundamental supernodes on the post-ordered elimination tree,
//     left-looking with dense blocks (Ng & Peyton, SIAM J. Sci. Comput. 14,
//     1993); two to three times faster on large factors.
//   - LU: static diagonal pivoting on the same symbolic analysis (L and Uᵀ
//     have the Cholesky pattern of A+Aᵀ), with a pivot-size and multiplier
//     check and a fallback to PivotLU.
//   - PivotLU: left-looking LU with threshold partial pivoting (Gilbert &
//     Peierls, SIAM J. Sci. Stat. Comput. 9, 1988; Davis 2006, ch. 6).
//   - CG (on σ·A, σ the sign of the diagonal: −A for a Jacobian, A for a
//     time step's matrix) and BiCGStab with the preconditioners Jacobi, ILU0 (IC(0)
//     on symmetric values) and AMG, smoothed-aggregation algebraic
//     multigrid (Vaněk, Mandel & Brezina, Computing 56, 1996), after
//     Y. Saad, Iterative Methods for Sparse Linear Systems, 2nd ed., SIAM
//     2003. They implement Iterative:
//     a relative tolerance per solve (inexact Newton, default DefaultTol),
//     a warm start from x, an iteration limit (default DefaultMaxIter), and
//     statistics; failing to converge is an error wrapping ErrNotConverged.
//   - Auto: picks Cholesky or LU by the values at every Factorize, and a
//     direct or a multigrid-preconditioned iterative solver by comparing
//     the factorisation work that AMD predicts with an estimate of the
//     iterative work (see AutoSolver for the rule and its calibration).
//   - ConditionEstimate: Hager's 1-norm estimator in Higham's form, using a
//     factorisation; never computed by Factorize, only on request.
//
// On long vectors (from 2^14 rows) the iterative solvers and the
// multigrid cycle work on two fixed blocks of rows in parallel: products,
// dot products (partial sums added in block order) and a hybrid
// Gauss–Seidel smoother. The blocks depend on the size alone, so a solve
// gives the same bits on every run and machine. These sweeps read the
// matrix with 4-byte column indices (op): the solver narrows a pattern's
// indices once and shares them with the multigrid hierarchy, whose coarse
// levels are built in that form (the Galerkin product row by row of R,
// without storing A·P).
//
// Pivots are judged against DefaultPivotTol times the largest magnitude of
// their row. LU factorisations are not rank-revealing: a singular matrix
// whose pivots all stay large (an air stream with no outlet, say) passes
// Factorize; ConditionEstimate exposes it.
//
// # Measured cost
//
// Processor time of one Factorize and one Solve, iterations, and the size
// of the factor (go test -run - -bench . -benchtime 1x ./sparse, on a
// shared two-core virtual machine where wall times were two to five times
// longer and noisy; the LU and BiCGStab rows use the grids with air
// streams):
//
//	                    2-D grid, 316², 1e5      3-D grid, 46³, 1e5
//	Analyse (AMD etc.)  0.36 s, nnz(L) 3.0e6     0.61 s, nnz(L) 4.3e7
//	Cholesky            0.44 s, 38 MB            111 s, 522 MB
//	Supernodal          0.16 s, 28 MB            25 s, 451 MB
//	LU                  0.61 s, 62 MB            153 s, 869 MB
//	CG, IC(0)           2.1 s, 568 iterations    0.50 s, 137 iterations
//	CG, multigrid       0.38 s, 13 iterations    0.63 s, 12 iterations
//	BiCGStab, ILU(0)    1.05 s, 141 iterations   0.44 s, 63 iterations
//	BiCGStab, multigrid 0.26 s, 8 iterations     0.45 s, 7 iterations
//	Auto                Supernodal               CG with multigrid, 0.49 s
//
// The multigrid set-up allocates about 60 MB (2-D) and 120 MB (3-D). On the
// grids of 1e4 unknowns the supernodal factorisation takes 0.012 s (2-D)
// and 0.14 s (3-D), CG with multigrid 0.024 s and 0.054 s. Direct solving
// thus wins on 2-D grids up to about 1e5 unknowns, while on 3-D grids,
// whose fill grows as n^(4/3), the iterative solvers win from about 1e4;
// AutoSolver's rule was calibrated on these runs.
//
// Inside Newton's method the iterative path costs less than these single
// solves suggest: the hierarchy is built once per solve and lags behind
// the values, and Newton asks for loose tolerances until the end. The
// meshed-plate benchmarks of package solve (go test -run - -bench Plate
// ./solve; processor time of both cores for the whole Newton solve from
// the ambient temperature, and the peak resident memory of the process)
// measured, on the same kind of machine:
//
//	                 cells  Newton  CG iterations  processor  peak
//	board (2-D)      1e5    5       52             0.65 s     74 MB
//	board (2-D)      1e6    4       65             6.6 s      565 MB
//	block (3-D)      1e5    4       47             0.79 s     85 MB
//	block (3-D)      1e6    4       57             8.6 s      768 MB
//
// Within Newton the iterative path matched the direct one on the 2-D board
// of 1e4 cells and won from about 4e4 (0.2 s against 0.3 s at 200²).
package sparse
