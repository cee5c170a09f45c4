package network

import (
	"fmt"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// builtPlate is a plate of the network: its element, the node that stands
// for it in reports, its first cell's variable, and what each of its joins
// and parts is, for reports.
type builtPlate struct {
	spec  *PlateSpec
	el    *elements.Plate
	view  int // node (and variable) that stands for the plate
	base  int // variable of cell 0
	nz    int
	joins []PlateJoinResult // Heat filled at a solution
	parts []PlateFootprint
	heats []*elements.AreaHeat // parallel to the heat entries of parts
	// partJoin[i] is the join through which part i's heat enters the
	// plate (a component's footprint), or −1 for a heated region.
	partJoin []int
}

// boardStack returns a printed board's effective conductivities and its
// volumetric heat capacity from its laminate and copper layers. Heat
// capacities add, so the board's is the volume-weighted mean of copper's
// and the laminate's.
func boardStack(kin, kthrough, t float64, copper []copperLayer) (float64, float64, float64, error) {
	layers := make([]elements.CopperLayer, len(copper))
	cu := 0.0
	for i, c := range copper {
		layers[i] = elements.CopperLayer{Thickness: c.thickness, Coverage: c.coverage}
		cu += c.thickness * c.coverage
	}
	a, b, err := elements.BoardConductivity(kin, kthrough, t, layers)
	if err != nil {
		return 0, 0, 0, err
	}
	return a, b, (cu*copperRhoC + (t-cu)*laminateRhoC) / t, nil
}

// addPlateNodes adds the node that stands for each plate; they come with
// the other nodes, before any cell.
func (net *Network) addPlateNodes(m *Model, add func(Node) int) {
	for i := range m.Plates {
		s := &m.Plates[i]
		v := add(Node{ID: s.ID, Kind: Plate, Limit: s.Limit, HasLimit: s.HasLimit, Note: s.Note, Line: s.Line})
		net.plates = append(net.plates, &builtPlate{spec: s, view: v})
	}
}

// buildPlates meshes every plate: its cells become variables, and its
// element, heat inputs and the footprints of the parts placed on it join
// the network.
func (net *Network) buildPlates(m *Model) Problems {
	var problems Problems
	for _, bp := range net.plates {
		s := bp.spec
		bp.base = len(net.Vars)
		layers := make([]elements.PlateLayer, len(s.Layers))
		for i, l := range s.Layers {
			layers[i] = elements.PlateLayer{Thickness: l.Thickness, KIn: l.KIn, KThrough: l.KThrough, RhoC: l.RhoC, Cells: l.Cells, FaceAtCentre: l.Board}
		}
		bp.nz = s.ThroughCells()
		cells := s.NX * s.NY * bp.nz
		if len(net.Vars)+cells > cap(net.Vars) {
			net.Vars = append(bigmem.MakeCap[Variable](0, len(net.Vars)+cells), net.Vars...)
		}
		net.Vars = net.Vars[:len(net.Vars)+cells]
		for c := 0; c < cells; c++ {
			net.Vars[bp.base+c] = Variable{Kind: TemperatureVar, Owner: s.ID, Value: m.Ambient.Temperature, Cell: int32(c + 1)}
		}
		pl := elements.Plate{Name: s.ID, Width: s.Width, Length: s.Length, NX: s.NX, NY: s.NY, Layers: layers, Base: bp.base, View: bp.view}
		addJoin := func(j elements.PlateJoin, kind string) {
			pl.Joins = append(pl.Joins, j)
			bp.joins = append(bp.joins, PlateJoinResult{Name: j.Name, Face: j.Face.String(), Node: net.Nodes[j.Node].ID, Kind: kind})
		}
		for _, f := range s.Faces {
			face, _ := elements.ParseFace(f.Face)
			node := net.Index[f.To]
			j := elements.PlateJoin{Face: face, Node: node, NodeGiven: net.Vars[node].Given}
			if f.HasRegion {
				j.Region = elements.Rect{X0: f.Region[0], Y0: f.Region[1], X1: f.Region[2], Y1: f.Region[3]}
			}
			where := f.Face
			if f.HasRegion {
				where += fmt.Sprintf(" %.4g–%.4g × %.4g–%.4g mm", f.Region[0]*1e3, f.Region[2]*1e3, f.Region[1]*1e3, f.Region[3]*1e3)
			}
			name := func(kind string) string { return fmt.Sprintf("%s to %s (%s)", where, f.To, kind) }
			switch {
			case f.H > 0:
				j.PerArea, j.Name = f.H, name("convection")
				addJoin(j, "convection")
			case f.Contact > 0:
				j.PerArea, j.Name = 1/f.Contact, name("contact")
				addJoin(j, "contact")
			case f.Total > 0:
				j.Total, j.Name = f.Total, name("conductance")
				addJoin(j, "conductance")
			case f.Natural != "":
				j.Natural, j.Length, j.Name = true, f.Height, name("natural convection")
				j.Orientation = map[string]elements.Orientation{"vertical": elements.Vertical, "facing-up": elements.FacingUp, "facing-down": elements.FacingDown}[f.Natural]
				addJoin(j, "natural")
			}
			if f.Emiss > 0 {
				r := elements.PlateJoin{Face: face, Region: j.Region, Node: j.Node, NodeGiven: j.NodeGiven, Emissivity: f.Emiss, Name: name("radiation")}
				addJoin(r, "radiation")
			}
		}
		for _, c := range m.Components {
			if !c.Placed || c.Board != s.ID {
				continue
			}
			face, _ := elements.ParseFace(c.Side)
			rect := elements.Rect{X0: c.At[0] - c.Footprint[0]/2, Y0: c.At[1] - c.Footprint[1]/2, X1: c.At[0] + c.Footprint[0]/2, Y1: c.At[1] + c.Footprint[1]/2}
			bp.partJoin = append(bp.partJoin, len(pl.Joins))
			bp.parts = append(bp.parts, PlateFootprint{Name: c.ID, Face: c.Side, X0: rect.X0, Y0: rect.Y0, X1: rect.X1, Y1: rect.Y1})
			addJoin(elements.PlateJoin{Name: c.ID + " footprint", Face: face, Region: rect, Node: net.Index[c.ID], Total: 1 / c.RJB}, "footprint")
		}
		el, err := elements.NewPlate(pl)
		if err != nil {
			problems = append(problems, Problem{File: m.File, Line: s.Line, Field: "plates[" + s.ID + "]", Message: err.Error()})
			continue
		}
		bp.el = el
		for _, h := range s.Heats {
			face, _ := elements.ParseFace(h.Face)
			var rect elements.Rect
			if h.HasRegion {
				rect = elements.Rect{X0: h.Region[0], Y0: h.Region[1], X1: h.Region[2], Y1: h.Region[3]}
			} else {
				w, l := s.faceSize(h.Face)
				rect = elements.Rect{X1: w, Y1: l}
			}
			var of elements.TimeFunc
			if h.Profile != nil {
				of = h.Profile
				net.profiles = append(net.profiles, h.Profile)
			}
			ah, err := elements.NewAreaHeat(el, face, rect, h.Power, of)
			if err != nil {
				problems = append(problems, Problem{File: m.File, Line: h.Line, Field: "plates[" + s.ID + "].heat", Message: err.Error()})
				continue
			}
			net.sources = append(net.sources, ah)
			name := h.Note
			if name == "" {
				name = "heat"
			}
			bp.partJoin = append(bp.partJoin, -1)
			bp.heats = append(bp.heats, ah)
			bp.parts = append(bp.parts, PlateFootprint{Name: name, Face: h.Face, X0: rect.X0, Y0: rect.Y0, X1: rect.X1, Y1: rect.Y1, Power: h.Power})
			net.Nodes[bp.view].Power += h.Power
		}
		to := bp.view
		if len(pl.Joins) > 0 {
			to = pl.Joins[0].Node
		}
		net.Links = append(net.Links, Link{ID: s.ID, Kind: string(Plate), From: bp.view, To: to, Note: s.Note, Line: s.Line, Element: el})
	}
	return problems
}

// refreshViews sets the variable of each plate's node to its hottest
// cell's temperature, in the full variable vector x, and returns each
// plate's summary (in the order of net.plates).
func (net *Network) refreshViews(x []float64) []elements.PlateSummary {
	if len(net.plates) == 0 {
		return nil
	}
	s := &elements.State{X: x, Env: &net.Env}
	out := make([]elements.PlateSummary, len(net.plates))
	for i, bp := range net.plates {
		if bp.el != nil {
			out[i] = bp.el.Summary(s)
			x[bp.view] = out[i].Hottest
		}
	}
	return out
}

// plateResults summarises every plate at the state s, whose plate nodes
// refreshViews has set, returning sums.
func (net *Network) plateResults(s *elements.State, sums []elements.PlateSummary) []PlateResult {
	var out []PlateResult
	margin := net.Model.RequiredMargin
	for i, bp := range net.plates {
		if bp.el == nil {
			continue
		}
		sp := bp.spec
		sum := sums[i]
		r := PlateResult{ID: sp.ID, Line: sp.Line, NX: sp.NX, NY: sp.NY, NZ: bp.nz, Width: sp.Width, Length: sp.Length, Thickness: sp.Thickness(),
			ZEdges: bp.el.ZEdges(), Hottest: sum.Hottest, Mean: sum.Mean, Coolest: sum.Coolest, HotX: sum.HotX, HotY: sum.HotY, HotZ: sum.HotZ,
			Limit: sp.Limit, HasLimit: sp.HasLimit, T: s.X[bp.base : bp.base+sp.NX*sp.NY*bp.nz]}
		if r.HasLimit {
			r.Margin = r.Limit - r.Hottest
			r.Status = verdict(r.Margin, margin)
		}
		q := bp.el.JoinHeat(s)
		r.Joins = append([]PlateJoinResult(nil), bp.joins...)
		for i := range r.Joins {
			r.Joins[i].Heat = q[i]
			if h, c, ok := bp.el.JoinCoefficient(s, i); ok {
				r.Joins[i].Coefficient, r.Joins[i].Correlation = h, c
			}
		}
		r.Parts = append([]PlateFootprint(nil), bp.parts...)
		h := 0
		for i, j := range bp.partJoin {
			if j >= 0 {
				r.Parts[i].Power = -q[j]
				continue
			}
			r.Parts[i].Power = bp.heats[h].Power(s)
			h++
		}
		out = append(out, r)
	}
	return out
}

// verdict judges a margin against the required margin.
func verdict(m, required float64) Status {
	switch {
	case m < 0:
		return Over
	case m < required:
		return Tight
	}
	return OK
}

// varName names variable v for messages; a plate's cell by its position.
func (net *Network) varName(v int) string {
	vr := net.Vars[v]
	if vr.Cell > 0 {
		return "temperature of " + net.cellName(v)
	}
	return vr.Name()
}

// varEquation names the equation of variable v for messages.
func (net *Network) varEquation(v int) string {
	vr := net.Vars[v]
	if vr.Cell > 0 {
		return "heat balance of " + net.cellName(v)
	}
	return vr.Equation()
}

// cellName names the cell whose temperature is variable v: its indices
// and the position of its centre.
func (net *Network) cellName(v int) string {
	for _, bp := range net.plates {
		s := bp.spec
		n := s.NX * s.NY * bp.nz
		if v < bp.base || v >= bp.base+n || bp.el == nil {
			continue
		}
		c := v - bp.base
		i, j, k := c%s.NX, (c/s.NX)%s.NY, c/(s.NX*s.NY)
		x, y, z := bp.el.CellCentre(i, j, k)
		return fmt.Sprintf("cell (%d, %d, %d) of plate %q, at x = %.4g mm, y = %.4g mm, z = %.4g mm", i, j, k, s.ID, x*1e3, y*1e3, z*1e3)
	}
	return fmt.Sprintf("a cell of plate %q", net.Vars[v].Owner)
}
