package elements

import (
	"fmt"
	"math"
	"sort"

	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// PlateLayer is one layer of a meshed plate, bottom to top: a board's
// laminate, a spreader, a heat-sink base. Its conductivity may differ in
// the plane and through the thickness (a printed board's effective values,
// see BoardConductivity).
type PlateLayer struct {
	Thickness float64 // m
	KIn       float64 // in-plane conductivity, W/(m K)
	KThrough  float64 // through-plane conductivity, W/(m K)
	RhoC      float64 // volumetric heat capacity, J/(m³ K); 0 for none
	Cells     int     // cells through this layer, ≥ 1
	// FaceAtCentre makes joins on the layer's top and bottom faces act at
	// its cells' centres, with no half cell of through-plane conduction in
	// series. It is for a printed board taken as one layer of effective
	// conductivities: its surface copper, the parts' pads and the vias
	// spread heat over the face before it crosses the laminate, and a cell
	// through the whole board stands for the board as the board node of
	// the two-resistor model does (JESD15-3). Without it, a small
	// footprint would see half the laminate's through-plane resistance
	// (about 35 K/W under 8 × 8 mm of a 1.6 mm FR-4 board) before any
	// spreading. To resolve the board through its thickness, give its
	// copper and laminate as layers of their own instead.
	FaceAtCentre bool
}

// Face is one of the six faces of a plate.
type Face int

// The faces of a plate: z = 0 (Bottom) and z = thickness (Top), x = 0 and
// x = Width, y = 0 and y = Length.
const (
	Bottom Face = iota
	Top
	XMin
	XMax
	YMin
	YMax
)

var faceNames = [...]string{"bottom", "top", "x_min", "x_max", "y_min", "y_max"}

// String returns the face's name: bottom, top, x_min, x_max, y_min, y_max.
func (f Face) String() string {
	if f < 0 || int(f) >= len(faceNames) {
		return fmt.Sprintf("face(%d)", int(f))
	}
	return faceNames[f]
}

// ParseFace returns the face of a name given by String.
func ParseFace(s string) (Face, error) {
	for i, n := range faceNames {
		if n == s {
			return Face(i), nil
		}
	}
	return 0, fmt.Errorf("unknown face %q: want one of bottom, top, x_min, x_max, y_min, y_max", s)
}

// Rect is a region of a face, m, in the face's own two coordinates: (x, y)
// on Top and Bottom, (y, z) on XMin and XMax, (x, z) on YMin and YMax, z
// from 0 at the bottom face. The zero Rect means the whole face.
type Rect struct{ X0, Y0, X1, Y1 float64 }

// PlateJoin joins a region of one face of a plate to a node: a convective
// or contact conductance per area, a total conductance shared by area (a
// component's junction-to-board leg, a pad), grey radiation to large
// surroundings, or natural convection to the air around the face. Exactly
// one of PerArea, Total, Emissivity and Natural is given.
type PlateJoin struct {
	Name    string
	Face    Face
	Region  Rect
	Node    int     // network variable (temperature) of the node joined
	PerArea float64 // conductance per area, W/(m² K): a convection coefficient h, or 1/R″ of a contact
	// Total is a total conductance, W/K, shared among the covered cells
	// in proportion to their overlap with the region.
	Total float64
	// Emissivity gives grey radiation to the node taken as large
	// black-body surroundings: q = ε·σ·A·(T⁴ − T_n⁴) (Incropera et al.,
	// Fundamentals of Heat and Mass Transfer, eq. 1.7).
	Emissivity float64
	// Natural gives natural convection to the node, the air around the
	// face: every cell of the region takes the coefficient of the
	// correlation for Orientation (Vertical, FacingUp or FacingDown, see
	// Natural) at its own temperature against the node's, with the air's
	// properties at their film temperature, over the whole region's
	// characteristic length. Length is that length: the height of a
	// vertical face (0 for the region's extent along its second
	// coordinate: y on Top and Bottom, z on the edges), area/perimeter
	// of a horizontal one (0 for that of the region). Taking the region's
	// mean coefficient at each cell's own temperature difference is the
	// usual use of a mean correlation on a surface that is not
	// isothermal; on an isothermal face it is exact to the correlation.
	Natural     bool
	Orientation Orientation
	Length      float64
	// NodeGiven tells that the node's temperature is given (ambient, a
	// fixed node): the join then has no Jacobian entries of its own, as
	// neither the node's column nor its row would be used; what it adds
	// to its cells' diagonals stays.
	NodeGiven bool
}

// Plate is a plate or block meshed into NX × NY × NZ cells as one element:
// a finite-volume model of steady and transient conduction (Patankar,
// Numerical Heat Transfer and Fluid Flow, 1980, ch. 4, cell-centred
// control volumes with the harmonic mean of the interface conductances),
// whose rows are the cells' heat balances and the heat balances of the
// nodes it is joined to.
//
// Between neighbouring cells in a layer, the conductance is G = k_in·A/d
// over the centre distance d; through the thickness it is the series of the
// two half-cells, each with its own layer's k_through, which is exact at
// layer interfaces for one-dimensional conduction. Edges are adiabatic
// unless joined. A convective or contact join (PerArea, Total) acts on the
// face: the conduction of the half-cell between the face and the cell's
// centre is in series with it, so that one-dimensional conduction to a
// join is exact too. Radiation acts on the cell's centre temperature (the
// half-cell is left out; Report warns when that matters). Cell (i, j, k) is variable Base + i + NX·(j + NY·k), k = 0
// at the bottom.
type Plate struct {
	Name          string
	Width, Length float64 // x, y extent, m
	NX, NY        int     // cells in x and y, uniform
	Layers        []PlateLayer
	Base          int // network variable of cell 0
	// View is the network variable of the plate's one node in reports and
	// heat-path diagrams (a given variable, never a row), −1 for none.
	View  int
	Joins []PlateJoin

	nz        int
	n         int       // cells
	dx, dy    float64   // in-plane cell sizes, m
	xe, ye    []float64 // cell edges in x and y
	ze        []float64 // cell edges through the thickness
	cellLayer []int     // layer of each cell layer k
	gx, gy    []float64 // in-plane conductances per cell layer, W/K
	gz        []float64 // conductance between cell layers k and k+1, W/K
	cap       []float64 // heat capacity of one cell of each cell layer, J/K
	stores    bool
	nodes     []int // distinct join nodes, in order of first use
	joins     []plateJoin
	lineStart []int // first entry of each line of cells (j, k), and the total of the cell entries last
	nEntries  int
}

// joinKind is how a join moves heat.
type joinKind int

const (
	joinLinear    joinKind = iota // q = g·(T − T_n)
	joinRadiation                 // q = s·(T⁴ − T_n⁴), s = ε·σ·A
	joinNatural                   // q = h(T, T_n)·A·(T − T_n), A the cell's area
)

// plateJoin is a join placed on the mesh: the cells it covers, each with
// its share (W/K for a linear join, ε·σ·A in W/K⁴ for radiation), in
// increasing cell order.
type plateJoin struct {
	kind    joinKind
	node    int // network variable
	pos     int // position of the node among the element's rows, after the cells
	cells   []int32
	share   []float64
	area    float64 // the region's area on the plate, m²
	clipped float64 // area of the region off the face, m²
	du, dv  float64 // the region's extent on the face, m
	entry   int     // first of its entries: (cell, node), (node, cell) per cell, then (node, node); −1 for none (NodeGiven)
	// given is the sum of a linear join's own conductances, before the
	// half-cells in series: PerArea × area, or Total, W/K.
	given float64
	// natural is the correlation of a natural-convection join, for a
	// unit area.
	natural *Natural
}

// maxPlateEntries bounds the Jacobian entries of a plate: they are indexed
// by int32.
const maxPlateEntries = math.MaxInt32

// NewPlate checks the plate and prepares its mesh: cell sizes, the
// conductances of each layer and interface, and each join's cells and
// shares.
func NewPlate(p Plate) (*Plate, error) {
	q := &Plate{Name: p.Name, Width: p.Width, Length: p.Length, NX: p.NX, NY: p.NY,
		Layers: append([]PlateLayer(nil), p.Layers...), Base: p.Base, View: p.View,
		Joins: append([]PlateJoin(nil), p.Joins...)}
	if err := q.prepare(); err != nil {
		if p.Name != "" {
			return nil, fmt.Errorf("plate %q: %w", p.Name, err)
		}
		return nil, fmt.Errorf("plate: %w", err)
	}
	return q, nil
}

func (p *Plate) prepare() error {
	if err := positive("width", p.Width, "length", p.Length); err != nil {
		return err
	}
	if p.NX < 1 {
		return fmt.Errorf("nx (cells along the width) must be at least 1, got %d", p.NX)
	}
	if p.NY < 1 {
		return fmt.Errorf("ny (cells along the length) must be at least 1, got %d", p.NY)
	}
	if len(p.Layers) == 0 {
		return fmt.Errorf("layers: a plate needs at least one layer")
	}
	p.nz = 0
	for i, ly := range p.Layers {
		if err := positive("thickness", ly.Thickness, "k_in", ly.KIn, "k_through", ly.KThrough); err != nil {
			return fmt.Errorf("layer %d: %w", i+1, err)
		}
		if !(ly.RhoC >= 0) || math.IsInf(ly.RhoC, 0) {
			return fmt.Errorf("layer %d: rho_c must be zero or a positive number, got %g", i+1, ly.RhoC)
		}
		if ly.Cells < 1 {
			return fmt.Errorf("layer %d: cells must be at least 1, got %d", i+1, ly.Cells)
		}
		if ly.Cells > maxPlateEntries/8 {
			return fmt.Errorf("layer %d: %d cells through it are too many", i+1, ly.Cells)
		}
		p.nz += ly.Cells
	}
	n := float64(p.NX) * float64(p.NY) * float64(p.nz)
	if 8*n > maxPlateEntries {
		return fmt.Errorf("%d × %d × %d cells are too many (at most about %d)", p.NX, p.NY, p.nz, maxPlateEntries/8)
	}
	p.n = p.NX * p.NY * p.nz
	if p.Base < 0 {
		return fmt.Errorf("base variable must not be negative, got %d", p.Base)
	}
	if p.View < -1 || p.isCell(p.View) {
		return fmt.Errorf("view variable %d must be −1 or a variable outside the cells %d..%d", p.View, p.Base, p.Base+p.n-1)
	}
	p.dx, p.dy = p.Width/float64(p.NX), p.Length/float64(p.NY)
	p.xe = uniformEdges(p.Width, p.NX)
	p.ye = uniformEdges(p.Length, p.NY)
	p.ze = make([]float64, 0, p.nz+1)
	p.ze = append(p.ze, 0)
	z := 0.0
	for li, ly := range p.Layers {
		for c := 1; c <= ly.Cells; c++ {
			p.ze = append(p.ze, z+ly.Thickness*float64(c)/float64(ly.Cells))
			p.cellLayer = append(p.cellLayer, li)
		}
		z += ly.Thickness
		p.ze[len(p.ze)-1] = z
	}
	p.gx = make([]float64, p.nz)
	p.gy = make([]float64, p.nz)
	p.cap = make([]float64, p.nz)
	p.gz = make([]float64, max(p.nz-1, 0))
	area := p.dx * p.dy
	for k := range p.nz {
		ly := p.Layers[p.cellLayer[k]]
		dz := p.ze[k+1] - p.ze[k]
		p.gx[k] = ly.KIn * p.dy * dz / p.dx
		p.gy[k] = ly.KIn * p.dx * dz / p.dy
		p.cap[k] = ly.RhoC * area * dz
		if p.cap[k] > 0 {
			p.stores = true
		}
		if k+1 < p.nz {
			up := p.Layers[p.cellLayer[k+1]]
			dzu := p.ze[k+2] - p.ze[k+1]
			p.gz[k] = area / (dz/(2*ly.KThrough) + dzu/(2*up.KThrough))
		}
	}
	p.lineStart = make([]int, p.NY*p.nz+1)
	for k := range p.nz {
		for j := range p.NY {
			line := j + p.NY*k
			p.lineStart[line+1] = p.lineStart[line] + p.lineEntries(j, k)
		}
	}
	p.nEntries = p.lineStart[len(p.lineStart)-1]
	p.nodes = nil
	p.joins = make([]plateJoin, len(p.Joins))
	for i, jn := range p.Joins {
		pj, err := p.placeJoin(jn)
		if err != nil {
			name := jn.Name
			if name == "" {
				name = jn.Face.String()
			}
			return fmt.Errorf("join %d (%s): %w", i+1, name, err)
		}
		pj.entry = -1
		if !jn.NodeGiven {
			pj.entry = p.nEntries
			p.nEntries += 2*len(pj.cells) + 1
			if p.nEntries > maxPlateEntries {
				return fmt.Errorf("joins: too many Jacobian entries")
			}
		}
		p.joins[i] = pj
	}
	return nil
}

// uniformEdges returns the n+1 edges of n equal cells over [0, l], the last
// exactly l.
func uniformEdges(l float64, n int) []float64 {
	e := make([]float64, n+1)
	for i := range e {
		e[i] = l * float64(i) / float64(n)
	}
	return e
}

// isCell reports whether network variable v is one of the plate's cells.
func (p *Plate) isCell(v int) bool { return v >= p.Base && v < p.Base+p.n }

// lineEntries returns the number of entries of the cells of line (j, k):
// each cell's diagonal and one per neighbour.
func (p *Plate) lineEntries(j, k int) int {
	e := p.perCell(j, k)
	return p.NX*e + 2*(p.NX-1)
}

// perCell returns the entries of a cell of line (j, k) besides its
// neighbours along x: the diagonal and the neighbours in y and z.
func (p *Plate) perCell(j, k int) int {
	e := 1
	if j > 0 {
		e++
	}
	if j < p.NY-1 {
		e++
	}
	if k > 0 {
		e++
	}
	if k < p.nz-1 {
		e++
	}
	return e
}

// inLine returns the offset of the first entry (the diagonal) of cell i of
// a line whose cells have e entries besides their x neighbours.
func (p *Plate) inLine(i, e int) int {
	return i*e + max(i-1, 0) + min(i, p.NX-1)
}

// diagEntry returns the entry of cell c's diagonal.
func (p *Plate) diagEntry(c int) int {
	line := c / p.NX
	i := c - line*p.NX
	k := line / p.NY
	j := line - k*p.NY
	return p.lineStart[line] + p.inLine(i, p.perCell(j, k))
}

// faceGrid returns the cell edges along a face's two coordinates and the
// cell of (u, v) on it.
func (p *Plate) faceGrid(f Face) (ue, ve []float64, cell func(u, v int) int) {
	nx, nxy := p.NX, p.NX*p.NY
	switch f {
	case Bottom:
		return p.xe, p.ye, func(u, v int) int { return u + nx*v }
	case Top:
		return p.xe, p.ye, func(u, v int) int { return u + nx*v + nxy*(p.nz-1) }
	case XMin:
		return p.ye, p.ze, func(u, v int) int { return nx*u + nxy*v }
	case XMax:
		return p.ye, p.ze, func(u, v int) int { return nx - 1 + nx*u + nxy*v }
	case YMin:
		return p.xe, p.ze, func(u, v int) int { return u + nxy*v }
	default: // YMax
		return p.xe, p.ze, func(u, v int) int { return u + nx*(p.NY-1) + nxy*v }
	}
}

// span is a cell's overlap with an interval along one axis.
type span struct {
	i   int
	len float64
}

// overlaps returns the cells of edges that [a, b] overlaps and by how much,
// leaving out overlaps below 1e-9 of a cell (round-off where a region's
// edge falls on a cell's).
func overlaps(edges []float64, a, b float64) []span {
	n := len(edges) - 1
	i := sort.Search(n, func(i int) bool { return edges[i+1] > a })
	var out []span
	for ; i < n && edges[i] < b; i++ {
		lo, hi := math.Max(a, edges[i]), math.Min(b, edges[i+1])
		if d := hi - lo; d > 1e-9*(edges[i+1]-edges[i]) {
			out = append(out, span{i, d})
		}
	}
	return out
}

// region is a region placed on a face: the cells it covers, each with its
// overlap area, in increasing cell order.
type region struct {
	cells   []int32
	area    []float64
	total   float64 // Σ area, m²
	clipped float64 // area of the rectangle off the face, m²
	du, dv  float64 // extent on the face, m
}

// placeRegion places r on face f.
func (p *Plate) placeRegion(f Face, r Rect) (region, error) {
	if f < Bottom || f > YMax {
		return region{}, fmt.Errorf("face %d is not one of bottom, top, x_min, x_max, y_min, y_max", int(f))
	}
	ue, ve, cell := p.faceGrid(f)
	umax, vmax := ue[len(ue)-1], ve[len(ve)-1]
	if r == (Rect{}) {
		r = Rect{0, 0, umax, vmax}
	}
	for _, v := range []float64{r.X0, r.Y0, r.X1, r.Y1} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return region{}, fmt.Errorf("region (%g, %g)–(%g, %g) must be finite", r.X0, r.Y0, r.X1, r.Y1)
		}
	}
	if !(r.X1 > r.X0) || !(r.Y1 > r.Y0) {
		return region{}, fmt.Errorf("region (%g, %g)–(%g, %g) m is empty: its second corner must exceed its first in both coordinates", r.X0, r.Y0, r.X1, r.Y1)
	}
	u0, u1 := math.Max(r.X0, 0), math.Min(r.X1, umax)
	v0, v1 := math.Max(r.Y0, 0), math.Min(r.Y1, vmax)
	if !(u1 > u0) || !(v1 > v0) {
		return region{}, fmt.Errorf("region (%g, %g)–(%g, %g) m lies outside the %s face (0, 0)–(%g, %g) m", r.X0, r.Y0, r.X1, r.Y1, f, umax, vmax)
	}
	us, vs := overlaps(ue, u0, u1), overlaps(ve, v0, v1)
	if len(us) == 0 || len(vs) == 0 {
		return region{}, fmt.Errorf("region (%g, %g)–(%g, %g) m overlaps no cell of the %s face", r.X0, r.Y0, r.X1, r.Y1, f)
	}
	g := region{du: r.X1 - r.X0, dv: r.Y1 - r.Y0,
		cells: bigmem.Make[int32](len(us) * len(vs)), area: bigmem.Make[float64](len(us) * len(vs))}
	// cell(u, v) is linear in u and v on every face.
	c0 := cell(0, 0)
	du, dv := cell(min(1, len(ue)-2), 0)-c0, cell(0, min(1, len(ve)-2))-c0
	q := 0
	for _, sv := range vs {
		row := c0 + dv*sv.i
		for _, su := range us {
			a := su.len * sv.len
			g.cells[q] = int32(row + du*su.i)
			g.area[q] = a
			g.total += a
			q++
		}
	}
	g.clipped = math.Max(g.du*g.dv-(u1-u0)*(v1-v0), 0)
	return g, nil
}

// placeJoin checks a join and places it on its face.
func (p *Plate) placeJoin(jn PlateJoin) (plateJoin, error) {
	set := 0
	for _, v := range []struct {
		name string
		v    float64
	}{{"per_area", jn.PerArea}, {"total", jn.Total}, {"emissivity", jn.Emissivity}, {"length", jn.Length}} {
		if math.IsNaN(v.v) || math.IsInf(v.v, 0) || v.v < 0 {
			return plateJoin{}, fmt.Errorf("%s must be zero or a positive number, got %g", v.name, v.v)
		}
	}
	for _, v := range []float64{jn.PerArea, jn.Total, jn.Emissivity} {
		if v > 0 {
			set++
		}
	}
	if jn.Natural {
		set++
		if jn.Orientation != Vertical && jn.Orientation != FacingUp && jn.Orientation != FacingDown {
			return plateJoin{}, fmt.Errorf("natural convection from a face is vertical, facing up or facing down, not %s", jn.Orientation)
		}
	}
	if set != 1 {
		return plateJoin{}, fmt.Errorf("exactly one of per_area, total, emissivity and natural must be given, got %d", set)
	}
	if jn.Emissivity > 1 {
		return plateJoin{}, fmt.Errorf("emissivity must be at most 1, got %g", jn.Emissivity)
	}
	if jn.Node < 0 || jn.Node == p.View || p.isCell(jn.Node) {
		return plateJoin{}, fmt.Errorf("node variable %d must be a variable outside the cells %d..%d and not the view", jn.Node, p.Base, p.Base+p.n-1)
	}
	g, err := p.placeRegion(jn.Face, jn.Region)
	if err != nil {
		return plateJoin{}, err
	}
	pj := plateJoin{node: jn.Node, cells: g.cells, share: g.area, area: g.total, clipped: g.clipped, du: g.du, dv: g.dv}
	pj.pos = -1
	for i, v := range p.nodes {
		if v == jn.Node {
			pj.pos = i
		}
	}
	if pj.pos < 0 {
		pj.pos = len(p.nodes)
		p.nodes = append(p.nodes, jn.Node)
	}
	if jn.Natural {
		length := jn.Length
		if length == 0 {
			if jn.Orientation == Vertical {
				length = g.dv
			} else {
				length = g.du * g.dv / (2 * (g.du + g.dv))
			}
		}
		pj.kind = joinNatural
		pj.natural = &Natural{Orientation: jn.Orientation, Area: 1, Length: length}
		return pj, nil // the shares are the cells' areas
	}
	for c, a := range g.area {
		switch {
		case jn.PerArea > 0:
			pj.share[c] = jn.PerArea * a
		case jn.Total > 0:
			pj.share[c] = jn.Total * a / g.total
		default:
			pj.kind = joinRadiation
			pj.share[c] = jn.Emissivity * StefanBoltzmann * a
			continue
		}
		pj.given += pj.share[c]
		// The join reaches the face; the cell's temperature is at its
		// centre, half a cell further in: the half-cell's conduction is
		// in series.
		if h := p.halfCell(jn.Face, int(g.cells[c]), a); !math.IsInf(h, 1) {
			pj.share[c] = pj.share[c] * h / (pj.share[c] + h)
		}
	}
	return pj, nil
}

// halfCell returns the conductance from the centre of cell c to the part a
// (m²) of its face f, W/K.
func (p *Plate) halfCell(f Face, c int, a float64) float64 {
	k := c / (p.NX * p.NY)
	ly := p.Layers[p.cellLayer[k]]
	switch f {
	case Bottom, Top:
		if ly.FaceAtCentre {
			return math.Inf(1)
		}
		return 2 * ly.KThrough * a / (p.ze[k+1] - p.ze[k])
	case XMin, XMax:
		return 2 * ly.KIn * a / p.dx
	default:
		return 2 * ly.KIn * a / p.dy
	}
}

// NZ returns the number of cells through the thickness.
func (p *Plate) NZ() int { return p.nz }

// Cells returns the number of cells, NX·NY·NZ.
func (p *Plate) Cells() int { return p.n }

// Index returns the number of cell (i, j, k) among the cells, from 0; its
// network variable is Base + Index(i, j, k).
func (p *Plate) Index(i, j, k int) int { return i + p.NX*(j+p.NY*k) }

// Thickness returns the plate's total thickness, m.
func (p *Plate) Thickness() float64 { return p.ze[p.nz] }

// ZEdges returns the NZ+1 heights of the cell boundaries through the
// thickness, m, from 0 at the bottom face.
func (p *Plate) ZEdges() []float64 { return append([]float64(nil), p.ze...) }

// CellCentre returns the centre of cell (i, j, k), m.
func (p *Plate) CellCentre(i, j, k int) (x, y, z float64) {
	return (p.xe[i] + p.xe[i+1]) / 2, (p.ye[j] + p.ye[j+1]) / 2, (p.ze[k] + p.ze[k+1]) / 2
}

// Stores reports whether the plate holds heat: some layer has a heat
// capacity.
func (p *Plate) Stores() bool { return p.stores }

// HeatCapacity returns the plate's total heat capacity, Σ ρc·V, J/K.
func (p *Plate) HeatCapacity() float64 {
	c := 0.0
	for k := range p.nz {
		c += p.cap[k] * float64(p.NX*p.NY)
	}
	return c
}

// Rows returns the cells' variables in order, then each join node once.
func (p *Plate) Rows() []int {
	r := bigmem.Make[int](p.n + len(p.nodes))
	for c := range p.n {
		r[c] = p.Base + c
	}
	copy(r[p.n:], p.nodes)
	return r
}

// Vars returns the same variables as Rows.
func (p *Plate) Vars() []int { return p.Rows() }

// JoinHeat returns the heat out of the plate through each join at s, W.
func (p *Plate) JoinHeat(s *State) []float64 {
	out := make([]float64, len(p.joins))
	t := s.X[p.Base : p.Base+p.n]
	for i := range p.joins {
		jn := &p.joins[i]
		tn := s.X[jn.node]
		sum := 0.0
		switch jn.kind {
		case joinRadiation:
			tn4 := tn * tn * tn * tn
			for q, c := range jn.cells {
				tc := t[c]
				sum += jn.share[q] * (tc*tc*tc*tc - tn4)
			}
		case joinNatural:
			for q, c := range jn.cells {
				sum += jn.share[q] * jn.natural.surfaceH(s, dual.C(t[c]), dual.C(tn)).V * (t[c] - tn)
			}
		default:
			for q, c := range jn.cells {
				sum += jn.share[q] * (t[c] - tn)
			}
		}
		out[i] = sum
	}
	return out
}

// Paths returns one path per join, from the plate's View to the join's
// node, carrying the heat out through that join; none without a View.
func (p *Plate) Paths(s *State) []Path {
	if p.View < 0 {
		return nil
	}
	q := p.JoinHeat(s)
	out := make([]Path, len(p.joins))
	for i, jn := range p.joins {
		out[i] = Path{From: p.View, To: jn.node, Heat: q[i]}
	}
	return out
}

// PlateSummary is a plate's temperature field in a few numbers.
type PlateSummary struct {
	Hottest, Mean, Coolest float64 // K; Mean is weighted by cell volume
	HotI, HotJ, HotK       int     // the hottest cell
	HotX, HotY, HotZ       float64 // its centre, m
}

// Summary returns the hottest, mean and coolest cell temperatures at s.
func (p *Plate) Summary(s *State) PlateSummary {
	t := s.X[p.Base : p.Base+p.n]
	out := PlateSummary{Hottest: math.Inf(-1), Coolest: math.Inf(1)}
	hot := 0
	nxy := p.NX * p.NY
	sum := 0.0
	for k := range p.nz {
		layer := t[k*nxy : (k+1)*nxy]
		ls := 0.0
		for c, v := range layer {
			ls += v
			if v > out.Hottest {
				out.Hottest, hot = v, k*nxy+c
			}
			out.Coolest = math.Min(out.Coolest, v)
		}
		sum += ls * (p.ze[k+1] - p.ze[k])
	}
	out.Mean = sum / (float64(nxy) * p.ze[p.nz])
	out.HotK = hot / nxy
	out.HotJ = (hot - out.HotK*nxy) / p.NX
	out.HotI = hot - out.HotK*nxy - out.HotJ*p.NX
	out.HotX, out.HotY, out.HotZ = p.CellCentre(out.HotI, out.HotJ, out.HotK)
	return out
}

// joinName returns a join's name for reports.
func (p *Plate) joinName(i int) string {
	if n := p.Joins[i].Name; n != "" {
		return n
	}
	return fmt.Sprintf("%s join %d", p.Joins[i].Face, i+1)
}

// Report gives the hottest, mean and coolest cell temperatures, the mesh,
// the heat through each join, and warnings where the mesh is coarse
// against what it carries.
func (p *Plate) Report(s *State) Report {
	sm := p.Summary(s)
	rep := Report{Details: []Detail{
		{Name: "hottest", Value: sm.Hottest, Unit: "K"},
		{Name: "mean", Value: sm.Mean, Unit: "K"},
		{Name: "coolest", Value: sm.Coolest, Unit: "K"},
		{Name: "hottest_x", Value: sm.HotX, Unit: "m"},
		{Name: "hottest_y", Value: sm.HotY, Unit: "m"},
		{Name: "hottest_z", Value: sm.HotZ, Unit: "m"},
		{Name: "cells", Value: float64(p.n)},
		{Name: "mesh", Text: fmt.Sprintf("%d × %d × %d", p.NX, p.NY, p.nz)},
		{Name: "cell_dx", Value: p.dx, Unit: "m"},
		{Name: "cell_dy", Value: p.dy, Unit: "m"},
	}}
	for i, q := range p.JoinHeat(s) {
		rep.Details = append(rep.Details, Detail{Name: "heat " + p.joinName(i), Value: q, Unit: "W"})
	}
	for i := range p.joins {
		rep.Warnings = append(rep.Warnings, p.regionWarnings("join "+p.joinName(i), p.Joins[i].Face, p.joins[i].du, p.joins[i].dv, p.joins[i].clipped)...)
	}
	rep.Warnings = append(rep.Warnings, p.layerWarnings()...)
	for i := range p.joins {
		if w := p.radiationWarning(i, sm.Hottest); w != "" {
			rep.Warnings = append(rep.Warnings, w)
		}
		if p.joins[i].kind == joinNatural {
			d, w := p.naturalReport(s, i)
			rep.Details = append(rep.Details, d...)
			rep.Warnings = append(rep.Warnings, w...)
		}
	}
	return rep
}

// naturalReport gives a natural-convection join's correlation and its
// coefficient at the region's mean temperature, and warns where a cell's
// Rayleigh number lies outside the correlation's range (judged at the
// region's coolest and hottest cells, between which Ra is monotonic in
// |ΔT| unless the region straddles the air's temperature) and where the
// half-cell left out between centre and face matters.
func (p *Plate) naturalReport(s *State, i int) ([]Detail, []string) {
	pj := &p.joins[i]
	t := s.X[p.Base : p.Base+p.n]
	tn := s.X[pj.node]
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, c := range pj.cells {
		lo, hi = math.Min(lo, t[c]), math.Max(hi, t[c])
	}
	name := p.joinName(i)
	ns := pj.natural.evalAt(s, p.regionMean(s, i), tn, -1)
	d := []Detail{
		{Name: "correlation " + name, Text: ns.correlation + ", " + pj.natural.Orientation.String()},
		{Name: "characteristic_length " + name, Value: pj.natural.Length, Unit: "m"},
		{Name: "h " + name, Value: ns.h.V, Unit: "W/(m2 K)"},
	}
	var w []string
	seen := map[string]bool{}
	for _, tc := range []float64{lo, hi} {
		for _, c := range pj.natural.evalAt(s, tc, tn, -1).ranges {
			if m := c.r.Check(c.v); m != "" && !seen[m] {
				seen[m] = true
				w = append(w, fmt.Sprintf("join %s: at a cell of %.4g °C: %s", name, tc-273.15, m))
			}
		}
	}
	// The half-cell in series, as for radiation (radiationWarning), with
	// h at the hottest cell.
	if m := p.centreWarning(i, "natural convection", pj.natural.surfaceH(s, dual.C(hi), dual.C(tn)).V); m != "" {
		w = append(w, m)
	}
	return d, w
}

// radiationWarning warns when a radiation join's leaving from the cell
// centres, rather than from the face, changes its heat by more than 5 %:
// when the half-cell's conduction resistance is above 5 % of the
// radiation's, h_r·d/(2k) > 0.05 with h_r = 4εσT³ at the hottest cell
// (Incropera et al., eq. 1.9, the radiation coefficient).
func (p *Plate) radiationWarning(i int, hottest float64) string {
	jn, pj := p.Joins[i], p.joins[i]
	if pj.kind != joinRadiation {
		return ""
	}
	hr := 4 * jn.Emissivity * StefanBoltzmann * hottest * hottest * hottest
	return p.centreWarning(i, "radiation", hr)
}

// centreWarning warns when join i, which acts at the cell centres with a
// coefficient h, W/(m² K), leaves out more than 5 % of its own resistance
// in the half cells between centres and face (centreFraction); what names
// the join's kind.
func (p *Plate) centreWarning(i int, what string, h float64) string {
	worst := p.centreFraction(i, h)
	if worst <= 0.05 {
		return ""
	}
	return fmt.Sprintf("join %s: %s leaves from the cell centres; the conduction between a centre and the face is %.2g of the %s's own resistance and is left out, so the heat is overestimated by up to about that fraction; use thinner cells at that face",
		p.joinName(i), what, worst, what)
}

// Accuracy returns the accuracy of the natural-convection correlations on
// the plate's faces (Uncertain): that of the least accurate among them,
// and 0 when the plate has none, so that it takes no part in accuracy
// bands. Its joins' coefficients are scaled together (ScaledBy): the
// bands treat their errors as one, which for the faces of one plate in
// one air space is the likelier case.
func (p *Plate) Accuracy(s *State) (float64, string) {
	acc, src := 0.0, ""
	for i := range p.joins {
		if p.joins[i].kind != joinNatural {
			continue
		}
		if a, text := p.joins[i].natural.Accuracy(s); a > acc {
			acc, src = a, text
		}
	}
	return acc, src
}

// ScaledBy returns a copy of the plate whose natural-convection joins all
// have their coefficient multiplied by k (Uncertain).
func (p *Plate) ScaledBy(k float64) Element {
	c := *p
	c.joins = append([]plateJoin(nil), p.joins...)
	for i := range c.joins {
		if c.joins[i].kind == joinNatural {
			n := *c.joins[i].natural
			n.hScale = k * n.scale()
			c.joins[i].natural = &n
		}
	}
	return &c
}

// JoinCoefficient returns, for a natural-convection join i, its
// coefficient at the region's mean temperature, W/(m² K), and the
// correlation in use there; ok is false for the other joins.
func (p *Plate) JoinCoefficient(s *State, i int) (h float64, correlation string, ok bool) {
	pj := &p.joins[i]
	if pj.kind != joinNatural {
		return 0, "", false
	}
	ns := pj.natural.evalAt(s, p.regionMean(s, i), s.X[pj.node], -1)
	return ns.h.V, ns.correlation, true
}

// regionMean returns the area-weighted mean temperature of join i's cells.
func (p *Plate) regionMean(s *State, i int) float64 {
	pj := &p.joins[i]
	t := s.X[p.Base : p.Base+p.n]
	mean, area := 0.0, 0.0
	for q, c := range pj.cells {
		mean += pj.share[q] * t[c]
		area += pj.share[q]
	}
	if area == 0 {
		return s.X[pj.node]
	}
	return mean / area
}

// centreFraction returns, for a join acting at the cell centres with a
// coefficient h (W/(m² K)), the largest ratio over its cells of the
// half-cell's conduction resistance between centre and face to the join's
// own, h·d/(2k). The half-cell depends on the cell's layer alone: the
// cells run in increasing order, so each layer is worked out once.
func (p *Plate) centreFraction(i int, h float64) float64 {
	worst, nxy, last := 0.0, p.NX*p.NY, -1
	for _, c := range p.joins[i].cells {
		if k := int(c) / nxy; k != last {
			last = k
			worst = math.Max(worst, h/p.halfCell(p.Joins[i].Face, int(c), 1))
		}
	}
	return worst
}

// regionWarnings warns when a region is smaller than the cells that carry
// it, so that its heat is spread over more area than its own, and when part
// of it lies off the face.
func (p *Plate) regionWarnings(what string, f Face, du, dv, clipped float64) []string {
	var w []string
	ue, ve, _ := p.faceGrid(f)
	cu, cv := maxStep(ue), maxStep(ve)
	if du < cu*(1-1e-9) || dv < cv*(1-1e-9) {
		w = append(w, fmt.Sprintf("%s: the region (%.3g × %.3g mm) is smaller than the %s face's cells (%.3g × %.3g mm), so its heat is spread over the larger cells and the temperature under it is underestimated; use finer cells there",
			what, du*1e3, dv*1e3, f, cu*1e3, cv*1e3))
	}
	if clipped > 1e-9*du*dv {
		w = append(w, fmt.Sprintf("%s: %.3g %% of the region lies off the %s face and is left out", what, 100*clipped/(du*dv), f))
	}
	return w
}

// maxStep returns the largest gap between successive edges.
func maxStep(e []float64) float64 {
	m := 0.0
	for i := 1; i < len(e); i++ {
		m = math.Max(m, e[i]-e[i-1])
	}
	return m
}

// layerWarnings warns when a layer's cells are much taller than they are
// wide: the mesh then resolves heat spreading through that layer more
// coarsely than across the plate.
func (p *Plate) layerWarnings() []string {
	var w []string
	side := math.Min(p.dx, p.dy)
	for i, ly := range p.Layers {
		if dz := ly.Thickness / float64(ly.Cells); dz > 2*side {
			w = append(w, fmt.Sprintf("layer %d: its cells are %.3g mm tall, more than twice their width (%.3g mm): spreading through the layer is resolved more coarsely than across the plate; give it more cells", i+1, dz*1e3, side*1e3))
		}
	}
	return w
}

// AreaHeat puts heat into a region of a face of a plate, shared among the
// covered cells in proportion to their overlap with the region: a
// component's dissipation into the board under it, a heated area.
type AreaHeat struct {
	Plate  *Plate
	Face   Face
	Region Rect
	Q      float64  // W
	Of     TimeFunc // when not nil, the heat at the state's time instead of Q
	vars   []int
	frac   []float64 // fraction of the heat into each covered cell
	du, dv float64
	clip   float64
}

// NewAreaHeat returns the heat q (W, or of at the state's time) into region
// r of face f of plate p.
func NewAreaHeat(p *Plate, f Face, r Rect, q float64, of TimeFunc) (*AreaHeat, error) {
	if p == nil {
		return nil, fmt.Errorf("area heat: no plate")
	}
	if math.IsNaN(q) || math.IsInf(q, 0) {
		return nil, fmt.Errorf("area heat: heat must be a finite number, got %g", q)
	}
	g, err := p.placeRegion(f, r)
	if err != nil {
		return nil, fmt.Errorf("area heat on plate %q: %w", p.Name, err)
	}
	h := &AreaHeat{Plate: p, Face: f, Region: r, Q: q, Of: of, du: g.du, dv: g.dv, clip: g.clipped}
	h.vars = bigmem.Make[int](len(g.cells))
	h.frac = bigmem.Make[float64](len(g.cells))
	for i, c := range g.cells {
		h.vars[i] = p.Base + int(c)
		h.frac[i] = g.area[i] / g.total
	}
	return h, nil
}

// Rows returns the covered cells.
func (h *AreaHeat) Rows() []int { return append([]int(nil), h.vars...) }

// Vars returns nothing: the heat depends on no variable.
func (h *AreaHeat) Vars() []int { return nil }

// Power returns the heat at s's time: Q, or the profile's value.
func (h *AreaHeat) Power(s *State) float64 {
	if h.Of != nil && s != nil {
		return h.Of.At(s.Time)
	}
	return h.Q
}

// Eval adds each covered cell's share of the heat.
func (h *AreaHeat) Eval(s *State, l *Local) {
	q := h.Power(s)
	for i, f := range h.frac {
		l.R[i] += q * f
	}
}

// Paths returns none: a source is where heat starts.
func (h *AreaHeat) Paths(*State) []Path { return nil }

// Report gives the heat and the cells it enters, and warns when the region
// is smaller than the cells that carry it.
func (h *AreaHeat) Report(s *State) Report {
	return Report{
		Details: []Detail{
			{Name: "Q", Value: h.Power(s), Unit: "W"},
			{Name: "cells", Value: float64(len(h.vars))},
		},
		Warnings: h.Plate.regionWarnings("heated region", h.Face, h.du, h.dv, h.clip),
	}
}
