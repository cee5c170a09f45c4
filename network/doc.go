// Package network reads heatgraph model files and assembles them into
// thermal networks ready to solve.
//
// A model file is YAML: ambient conditions, materials, nodes (solid, fixed
// or air), components (the JEDEC two-resistor compact model), links between
// nodes, and radiation enclosures. Values may carry units (package units);
// bare numbers are SI.
//
// The work happens in three steps:
//
//   - ReadFile/Parse check the file and return a Model with every quantity
//     in SI units. Everything wrong is reported in one pass as Problems,
//     each "file:line: field: message" with what would be valid and a
//     suggestion for a misspelt key, kind, material or node name. The file
//     is read through yaml.v3 nodes so that every value keeps its line.
//   - Build turns a Model into a Network: nodes with indices, and for each
//     link an element (package elements) that stamps its heat flows and
//     their exact derivatives.
//   - Network.Steady gives the steady energy balance in the form package
//     solve takes; Network.Solution presents a converged state: every node
//     against its limit, every link's heat, and the energy balance.
//
// Load does the first two steps at once.
package network
