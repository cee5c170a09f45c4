// Package solve finds the state at which every free node of a network is in
// balance: Newton's method with a backtracking line search, the linear
// solvers it uses, and a typed account of why it stopped.
//
// The package knows nothing of thermal models. It works on any Problem: a
// residual F(x) with a sparse Jacobian J(x) = ∂F/∂x. For a thermal network x
// holds the temperatures of the free nodes (K) and F the net heat flowing into
// each of them (W), so F(x) = 0 is the steady state.
//
// Convergence is declared only when both
//   - the largest Newton step is below Settings.StepTolerance (K for a
//     thermal network), and
//   - the largest residual, divided by the scale Problem.Evaluate returns (the total heat
//     moving through the network), is below Settings.ResidualTolerance.
//
// Anything else ends with a StopReason that says why, and the caller must not
// present the state as a solution.
package solve
