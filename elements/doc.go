// Package elements holds the building blocks of a thermal network: the links
// that move heat between nodes and the sources that put heat in.
//
// Each element stamps its own contribution into the network's energy balance,
// as a device does in a circuit simulator: for every node it touches it adds
// the heat flowing into that node (W) and the exact partial derivatives of
// that heat with respect to the temperatures of its nodes (W/K). The network
// sums the stamps into a residual vector and a sparse Jacobian, and Newton's
// method drives the residual of every free node to zero.
//
// Conventions:
//   - temperatures are absolute, in kelvin; all quantities are SI;
//   - heat is positive flowing into a node;
//   - a link between nodes a and b reports positive heat when it flows from
//     a to b;
//   - every link conserves energy: the heat it takes from its nodes equals
//     the heat it gives them, so that the network's energy balance closes.
//
// Elements whose heat flow depends on correlations (air properties at a film
// temperature, Nusselt numbers) evaluate them on dual numbers (package dual),
// which gives exact Jacobian entries without hand-written derivatives. Every
// element is tested against finite differences.
//
// Each element names the source of its formula in its doc comment and, where
// a correlation has a published validity range, reports when it is used
// outside that range (Reporter).
package elements
