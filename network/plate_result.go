package network

// PlateResult summarises a meshed plate (or block) at a solution: where it
// is hottest, its mean, the heat through each of its joins, and every
// cell's temperature.
type PlateResult struct {
	ID   string
	Line int
	// Grid: NX × NY cells in the plane (x along Width, y along Length),
	// NZ cells through the thickness, k = 0 at the bottom face.
	NX, NY, NZ               int
	Width, Length, Thickness float64 // m
	// ZEdges are the NZ+1 heights of the cell boundaries through the
	// thickness, m, from 0 at the bottom face.
	ZEdges []float64
	// Hottest, Mean and Coolest are over every cell, K; Mean is weighted
	// by cell volume.
	Hottest, Mean, Coolest float64
	// HotX, HotY, HotZ locate the centre of the hottest cell, m.
	HotX, HotY, HotZ float64
	Limit            float64 // K, when HasLimit: the hottest cell is judged against it
	HasLimit         bool
	Margin           float64 // Limit − Hottest, K, when HasLimit
	Status           Status
	Joins            []PlateJoinResult
	Parts            []PlateFootprint // what sits on or heats the plate, for heat maps
	// T holds every cell's temperature, K: cell (i, j, k) is
	// T[i + NX·(j + NY·k)]. It is a view into the solution, not a copy.
	T []float64
}

// PlateJoinResult is the heat through one join of a plate's faces or edges
// to a node.
type PlateJoinResult struct {
	Name string  // e.g. "top to box-air (convection)"
	Face string  // top, bottom, x_min, x_max, y_min or y_max
	Node string  // the node joined
	Kind string  // convection, radiation, contact, footprint ...
	Heat float64 // W, positive out of the plate into the node
	// Coefficient is a natural-convection join's h at the region's mean
	// temperature, W/(m² K), with the Correlation in use there; 0 and ""
	// for the other joins.
	Coefficient float64
	Correlation string
}

// PlateFootprint is a rectangle on a face of a plate: a component's
// footprint or a heated region. Coordinates are in the plate's plane, m,
// from the corner at x = 0, y = 0.
type PlateFootprint struct {
	Name           string
	Face           string
	X0, Y0, X1, Y1 float64
	Power          float64 // W that enters the plate there
}
