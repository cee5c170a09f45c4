// Package solve finds the state at which every equation of a problem
// balances: Newton's method with a pluggable line search and
// pseudo-transient steps, linear solvers in three phases (analyse,
// factorize, solve), and a typed account of why it stopped.
//
// The package knows nothing of thermal models. It works on any Problem: a
// residual F(x) with a sparse Jacobian J(x) = ∂F/∂x, whose unknowns are of
// kinds (Kind) that carry their own unit, scale, step limit and residual
// floor: temperatures, pressures and mass flows of a thermal network, say,
// paired with heat, mass and momentum balances.
//
// Convergence is declared only when, at the current state,
//   - every equation's residual |F_i| is within Settings.ResidualTolerance
//     of that equation's own magnitude (the sum of the absolute terms that
//     meet in it: the heat moving through that node, not through the whole
//     network) plus its kind's ResidualFloor, and
//   - every component of the full, undamped Newton step is within
//     Settings.StepTolerance of its kind's Scale.
//
// A step the line search shortened, or a pseudo-transient step, is never
// taken for convergence. Anything else ends with a StopReason that says
// why, and the caller must not present the state as a solution. Result
// reports the convergence of each kind separately and the worst equation.
package solve
