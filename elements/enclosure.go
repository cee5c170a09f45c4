package elements

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/elements/viewfactor"
	"gonum.org/v1/gonum/mat"
)

// Surface is one gray diffuse surface of a radiation enclosure.
type Surface struct {
	Node       int     // the node whose temperature the surface has
	Emissivity float64 // in (0, 1]
	Area       float64 // m²
}

// EnclosureExchange solves the radiosity equations of N gray diffuse
// surfaces that see each other with view factors F (F[i][j] from surface i
// to j), and returns the radiation between them as pairwise links: the
// total exchange areas S_ij with q_ij = σ·S_ij·(T_i⁴ − T_j⁴).
//
// The radiosities J solve Σ_j [δ_ij − (1 − ε_i)F_ij] J_j = ε_i σT_i⁴, and
// the net radiation leaving surface i is q_i = A_i Σ_j F_ij (J_i − J_j)
// (Incropera et al., Fundamentals of Heat and Mass Transfer, §13.3;
// Siegel & Howell, Thermal Radiation Heat Transfer). Both are linear in the
// blackbody powers σT⁴, q = G·σT⁴, and G's off-diagonal terms are the
// total exchange areas (Hottel's directed exchange areas), symmetric by
// reciprocity, so the enclosure is exactly a set of two-node T⁴ links.
//
// Pair i of the result joins surfaces I[i] and J[i] (J = len(surfaces)
// for the surroundings).
//
// When surroundings ≥ 0 the enclosure is open: whatever part of a
// surface's view the factors leave out (1 − Σ_j F_ij) goes to black
// surroundings at node surroundings. Otherwise every row must sum to 1.
// View factors must obey reciprocity, A_i F_ij = A_j F_ji. Pairs with an
// exchange area below 1e-12 of the largest are dropped.
func EnclosureExchange(surfaces []Surface, f [][]float64, surroundings int) ([]ExchangePair, error) {
	n := len(surfaces)
	if n < 2 && surroundings < 0 {
		return nil, fmt.Errorf("an enclosure needs at least two surfaces, got %d", n)
	}
	areas := make([]float64, n)
	for i, s := range surfaces {
		if err := checkEmissivity(s.Emissivity); err != nil {
			return nil, fmt.Errorf("surface %d: %w", i+1, err)
		}
		if err := positive("area", s.Area); err != nil {
			return nil, fmt.Errorf("surface %d: %w", i+1, err)
		}
		areas[i] = s.Area
	}
	if err := viewfactor.CheckEnclosure(f, areas, 1e-3, surroundings >= 0); err != nil {
		return nil, err
	}
	// Unknowns: the N radiosities, plus the surroundings' (black, J = σT⁴).
	m := n
	if surroundings >= 0 {
		m++
	}
	view := mat.NewDense(m, m, nil)
	for i := 0; i < n; i++ {
		rest := 1.0
		for j := 0; j < n; j++ {
			view.Set(i, j, f[i][j])
			rest -= f[i][j]
		}
		if surroundings >= 0 {
			view.Set(i, n, math.Max(rest, 0))
		}
	}
	// M·J = E·u with u = σT⁴.
	sys := mat.NewDense(m, m, nil)
	emit := mat.NewDense(m, m, nil)
	for i := 0; i < m; i++ {
		eps := 1.0
		if i < n {
			eps = surfaces[i].Emissivity
		}
		emit.Set(i, i, eps)
		sys.Set(i, i, 1)
		if i < n {
			for j := 0; j < m; j++ {
				sys.Set(i, j, sys.At(i, j)-(1-eps)*view.At(i, j))
			}
		}
	}
	var k mat.Dense // J = K·u
	if err := k.Solve(sys, emit); err != nil {
		return nil, fmt.Errorf("radiosity equations cannot be solved: %w", err)
	}
	// q_i = A_i [(I − F)·J]_i for the surfaces.
	var imf mat.Dense
	imf.Sub(eye(m), view)
	var g mat.Dense
	g.Mul(&imf, &k)
	nodes := make([]int, m)
	for i := 0; i < n; i++ {
		nodes[i] = surfaces[i].Node
	}
	if surroundings >= 0 {
		nodes[n] = surroundings
	}
	exch := func(i, j int) float64 { return -areas[i] * g.At(i, j) }
	largest := 0.0
	for i := 0; i < n; i++ {
		for j := 0; j < m; j++ {
			if i != j {
				largest = math.Max(largest, exch(i, j))
			}
		}
	}
	var out []ExchangePair
	for i := 0; i < n; i++ {
		for j := i + 1; j < m; j++ {
			sij := exch(i, j)
			if j < n {
				// Reciprocity makes G·A symmetric; average the two
				// round-off copies.
				sij = (sij + exch(j, i)) / 2
			}
			if sij <= 1e-12*largest || nodes[i] == nodes[j] {
				continue
			}
			out = append(out, ExchangePair{I: i, J: j, Link: &Radiation{A: nodes[i], B: nodes[j], S: sij}})
		}
	}
	return out, nil
}

// ExchangePair is the radiation between two surfaces of an enclosure.
type ExchangePair struct {
	I, J int        // surface indices; J = number of surfaces for the surroundings
	Link *Radiation // σ·S_ij·(T_i⁴ − T_j⁴) between their nodes
}

func eye(n int) *mat.Dense {
	m := mat.NewDense(n, n, nil)
	for i := 0; i < n; i++ {
		m.Set(i, i, 1)
	}
	return m
}
