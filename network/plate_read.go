package network

import (
	"fmt"
	"math"
	"strings"

	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// A plate is a board, spreader, lid or heat-sink base that the network
// meshes into cells when it is built, so that hot spots and the spreading
// of heat from small parts come out of the solve instead of being worked
// out by hand. The model file gives its outline, its stack through the
// thickness and how its faces join the rest of the network:
//
//	plates:
//	  - id: main-board
//	    size: [120 mm, 90 mm]          # x by y
//	    cell: 2 mm                     # in-plane cell size (or cells: [60, 45])
//	    board: {thickness: 1.6 mm, copper: [{thickness: 35 um, coverage: 30 %}, ...]}
//	    limit: 105 degC
//	    faces:
//	      - {face: top, to: box-air, natural: vertical, emissivity: 0.9}
//	      - {face: bottom, region: [10 mm, 10 mm, 40 mm, 40 mm], to: sink, contact: 1 K*cm2/W}
//	    heat:
//	      - {region: [0 mm, 0 mm, 20 mm, 90 mm], power: 1.5 W}
//
// and a component sits on it by position:
//
//	components:
//	  - {id: cpu, power: 6 W, r_jb: 4 K/W, board: main-board, at: [60 mm, 45 mm], footprint: [17 mm, 17 mm]}

// PlateSpec is one entry of the plates list.
type PlateSpec struct {
	ID            string
	Width, Length float64 // m, along x and y
	NX, NY        int     // cells along x and y
	Layers        []PlateLayerSpec
	Faces         []PlateFaceSpec
	Heats         []PlateHeatSpec
	Limit         float64 // highest allowed temperature of any cell, K (when HasLimit)
	HasLimit      bool
	Note, Group   string
	Line          int
}

// Thickness returns the plate's total thickness, m.
func (p *PlateSpec) Thickness() float64 {
	t := 0.0
	for _, l := range p.Layers {
		t += l.Thickness
	}
	return t
}

// PlateLayerSpec is one layer of a plate's stack, bottom first.
type PlateLayerSpec struct {
	Thickness float64 // m
	KIn       float64 // in-plane conductivity, W/(m K)
	KThrough  float64 // through-plane conductivity, W/(m K)
	RhoC      float64 // volumetric heat capacity, J/(m3 K); 0 when not known
	Cells     int     // cells through the layer
	What      string  // the material or "printed board", for reports
	// Board marks a printed board of effective conductivities: joins on
	// its faces act at its cells' centres (see elements.PlateLayer).
	Board bool
	Line  int
}

// PlateFaceSpec joins a face of a plate (or a region of it) to a node.
type PlateFaceSpec struct {
	Face      string     // top, bottom, x_min, x_max, y_min, y_max
	Region    [4]float64 // x0, y0, x1, y1 in the face's coordinates, m, when HasRegion
	HasRegion bool
	To        string
	H         float64 // convection coefficient, W/(m2 K)
	Contact   float64 // area-specific resistance, K m2/W
	Total     float64 // a total conductance shared by area, W/K
	Emiss     float64 // emissivity for radiation to To
	// Natural is natural convection to To: vertical, facing-up or
	// facing-down ("" for none); Height is a vertical face's height, m (0
	// for the region's extent along its second coordinate).
	Natural string
	Height  float64
	Note    string
	Line    int
}

// PlateHeatSpec is heat dissipated in a region of a face of a plate.
type PlateHeatSpec struct {
	Face      string
	Region    [4]float64
	HasRegion bool
	Power     float64
	Profile   Profile
	Note      string
	Line      int
}

// MaxPlateCells is the most cells the plates of one model may have in all:
// a 3-D block of 125³ cells eight times over, or a board at 0.1 mm cells
// over 40 × 50 cm; beyond it the memory of the solve, not the physics,
// decides.
const MaxPlateCells = 16_000_000

var (
	plateKeys     = []string{"id", "size", "cell", "cells", "layers", "faces", "heat", "limit", "note", "group"}
	layerKeys     = []string{"thickness", "material", "conductivity", "through_conductivity", "density", "specific_heat", "board", "through_cells"}
	boardKeys     = []string{"thickness", "copper", "laminate_conductivity", "laminate_through_conductivity"}
	copperKeys    = []string{"thickness", "coverage"}
	plateFaceKeys = []string{"face", "region", "to", "h", "contact", "resistance", "conductance", "natural", "height", "emissivity", "note"}
	// faceNatural are the attitudes a face may have in natural convection.
	faceNatural   = []string{"vertical", "facing-up", "facing-down"}
	plateHeatKeys = []string{"face", "region", "power", "note"}
	plateFaces    = []string{"top", "bottom", "x_min", "x_max", "y_min", "y_max"}
)

// Laminate conductivities a printed board takes unless the file gives its
// own: one glass-fibre epoxy laminate measured by Sarvar, Poole & Witting
// (1990), as in the built-in materials fr4-in-plane and fr4-through-plane.
const (
	laminateKIn      = 1.059
	laminateKThrough = 0.343
	// Volumetric heat capacities, J/(m3 K), from the built-in materials:
	// FR-4 1850 kg/m3 × 1100 J/(kg K) (typical), copper 8933 × 385
	// (Incropera et al., Table A.1).
	laminateRhoC = 1850 * 1100.0
	copperRhoC   = 8933 * 385.0
)

func (r *reader) readPlates(n *yaml.Node, m *Model, ids map[string]nodeRef) []PlateSpec {
	var out []PlateSpec
	total := 0
	for i, item := range r.list(n, "plates", "entries with id, size, cell, a stack (material and thickness, board, or layers) and faces") {
		o := r.newObject(item, "plates["+itoa(i)+"]")
		if o == nil {
			continue
		}
		p := PlateSpec{Line: item.Line}
		id, okID := o.id("id")
		if okID {
			o.path = "plates[" + id + "]"
			okID = r.claim(o, id, Plate, ids)
		}
		p.ID = id
		keys := plateKeys
		if !o.has("layers") {
			keys = append(append([]string{}, plateKeys...), layerKeys...)
		}
		o.checkKeys(keys, "a plate")
		p.Note, _ = o.str("note")
		p.Group, _ = o.str("group")
		p.Limit, p.HasLimit = o.temperature("limit", false)
		size, okSize := o.lengths("size", 2, true)
		if okSize {
			p.Width, p.Length = size[0], size[1]
		}
		if n := r.plateCells(o, &p, okSize); n > 0 {
			total += n
		}
		if o.has("layers") {
			for j, li := range r.list(o.values["layers"], o.field("layers"), "layers from the bottom up, each with thickness and material, conductivity or board") {
				lo := r.newObject(li, o.field("layers")+"["+itoa(j)+"]")
				if lo == nil {
					continue
				}
				lo.checkKeys(layerKeys, "a plate layer")
				if l, ok := r.readLayer(lo, m); ok {
					p.Layers = append(p.Layers, l)
				}
			}
			if len(p.Layers) == 0 && len(r.problems) == 0 {
				r.addf(o.values["layers"], o.field("layers"), "needs at least one layer")
			}
		} else if l, ok := r.readLayer(o, m); ok {
			p.Layers = []PlateLayerSpec{l}
		}
		if through := p.ThroughCells(); through > 0 && p.NX > 0 && p.NY > 0 {
			total += p.NX * p.NY * (through - 1)
		}
		if o.has("faces") {
			for j, fi := range r.list(o.values["faces"], o.field("faces"), "entries with face, to and h, contact, resistance, conductance, natural or emissivity") {
				fo := r.newObject(fi, o.field("faces")+"["+itoa(j)+"]")
				if fo == nil {
					continue
				}
				if f, ok := r.readPlateFace(fo, &p, ids); ok {
					p.Faces = append(p.Faces, f)
				} else {
					// A face dropped for a mistake would make the
					// plate look cut off; say only what is wrong.
					r.broken = true
				}
			}
		}
		if o.has("heat") {
			for j, hi := range r.list(o.values["heat"], o.field("heat"), "entries with power and optionally face and region") {
				ho := r.newObject(hi, o.field("heat")+"["+itoa(j)+"]")
				if ho == nil {
					continue
				}
				ho.checkKeys(plateHeatKeys, "a plate's heat")
				h := PlateHeatSpec{Face: "top", Line: hi.Line}
				if f, ok := ho.choice("face", "face", plateFaces); ok && f != "" {
					h.Face = f
				}
				h.Region, h.HasRegion = r.plateRegion(ho, &p, h.Face)
				h.Power, h.Profile, _ = ho.varying("power", units.Power, true)
				h.Note, _ = ho.str("note")
				p.Heats = append(p.Heats, h)
			}
		}
		if total > MaxPlateCells {
			r.addf(o.node, o.path, "the plates mesh into %d cells, more than the %d a model may have; use a coarser cell", total, MaxPlateCells)
			r.broken = true
		}
		if okID {
			out = append(out, p)
		}
	}
	return out
}

// plateCells reads cell: or cells: and returns the number of cells of one
// layer of the plate, 0 after reporting a problem.
func (r *reader) plateCells(o *object, p *PlateSpec, okSize bool) int {
	switch o.oneOf("the in-plane mesh: cell: 2 mm, or cells: [60, 45]", "cell", "cells") {
	case "cell":
		c, ok := o.positive("cell", units.Length, true)
		if !ok || !okSize {
			return 0
		}
		p.NX, p.NY = cellsAlong(p.Width, c), cellsAlong(p.Length, c)
	case "cells":
		v := o.values["cells"]
		if v.Kind != yaml.SequenceNode || len(v.Content) != 2 {
			r.addf(v, o.field("cells"), "expected two whole numbers, cells along x and along y, e.g. [60, 45]; got %s", describe(v))
			return 0
		}
		var n [2]int
		for k, c := range v.Content {
			var x int
			if _, err := fmt.Sscan(c.Value, &x); err != nil || c.Kind != yaml.ScalarNode || x < 1 || x > 100000 || fmt.Sprint(x) != c.Value {
				r.addf(c, o.field("cells"), "%q must be a whole number from 1 to 100000", c.Value)
				return 0
			}
			n[k] = x
		}
		p.NX, p.NY = n[0], n[1]
	default:
		return 0
	}
	if p.NX*p.NY > MaxPlateCells {
		r.addf(o.node, o.path, "meshes into %d × %d cells, more than the %d a model may have; use a coarser cell", p.NX, p.NY, MaxPlateCells)
		r.broken = true
		return 0
	}
	return p.NX * p.NY
}

// cellsAlong returns the number of cells of about size c that divide a
// length L evenly: the nearest whole number, at least one.
func cellsAlong(L, c float64) int {
	n := math.Round(L / c)
	if n < 1 {
		return 1
	}
	if n > 1e7 {
		return 1e7
	}
	return int(n)
}

// readLayer reads one layer of a plate's stack: a material, a
// conductivity, or a printed board, with its thickness.
func (r *reader) readLayer(o *object, m *Model) (PlateLayerSpec, bool) {
	l := PlateLayerSpec{Cells: 1, Line: o.node.Line}
	if o.has("through_cells") {
		n, ok := o.count("through_cells", 1, 1000)
		if !ok {
			return l, false
		}
		l.Cells = n
	}
	switch o.oneOf("the stack: material: aluminium-6063 with thickness, conductivity: 20 W/(m K) with thickness, or board: {thickness: 1.6 mm, copper: [...]}", "material", "conductivity", "board") {
	case "material":
		t, okT := o.positive("thickness", units.Length, true)
		mat, okM := material(o, m, "")
		for _, k := range []string{"through_conductivity", "density", "specific_heat"} {
			if o.has(k) {
				r.addf(o.values[k], o.field(k), "not used with material (the material gives it; use conductivity: instead, or add a material under materials:)")
				return l, false
			}
		}
		if !okT || !okM {
			return l, false
		}
		l.Thickness, l.KIn, l.KThrough, l.RhoC, l.What = t, mat.Conductivity, mat.Conductivity, mat.Density*mat.SpecificHeat, mat.Name
	case "conductivity":
		t, okT := o.positive("thickness", units.Length, true)
		k, okK := o.positive("conductivity", units.Conductivity, true)
		l.Thickness, l.KIn, l.KThrough, l.What = t, k, k, "given conductivity"
		if o.has("through_conductivity") {
			kt, ok := o.positive("through_conductivity", units.Conductivity, true)
			if !ok {
				return l, false
			}
			l.KThrough = kt
		}
		if o.has("density") || o.has("specific_heat") {
			rho, okR := o.positive("density", units.Density, true)
			c, okC := o.positive("specific_heat", units.SpecificHeat, true)
			if !okR || !okC {
				return l, false
			}
			l.RhoC = rho * c
		}
		if !okT || !okK {
			return l, false
		}
	case "board":
		for _, k := range []string{"thickness", "through_conductivity", "density", "specific_heat"} {
			if o.has(k) {
				r.addf(o.values[k], o.field(k), "give it inside board: (a board's thickness is under board:, its conductivities come from its copper layers)")
				return l, false
			}
		}
		return r.readBoard(o, l)
	default:
		return l, false
	}
	return l, true
}

// readBoard reads a printed board: its thickness and copper layers, which
// give its effective conductivities.
func (r *reader) readBoard(parent *object, l PlateLayerSpec) (PlateLayerSpec, bool) {
	o := r.newObject(parent.values["board"], parent.field("board"))
	if o == nil {
		return l, false
	}
	o.checkKeys(boardKeys, "a printed board")
	t, okT := o.positive("thickness", units.Length, true)
	kin, kth := laminateKIn, laminateKThrough
	if o.has("laminate_conductivity") {
		kin, _ = o.positive("laminate_conductivity", units.Conductivity, true)
	}
	if o.has("laminate_through_conductivity") {
		kth, _ = o.positive("laminate_through_conductivity", units.Conductivity, true)
	}
	var copper []copperLayer
	if o.has("copper") {
		for j, ci := range r.list(o.values["copper"], o.field("copper"), "copper layers, each {thickness: 35 um, coverage: 80 %}") {
			co := r.newObject(ci, o.field("copper")+"["+itoa(j)+"]")
			if co == nil {
				continue
			}
			co.checkKeys(copperKeys, "a copper layer")
			ct, ok1 := co.positive("thickness", units.Length, true)
			cv, ok2 := co.fraction("coverage", true)
			if ok1 && ok2 {
				copper = append(copper, copperLayer{ct, cv, ci.Line})
			}
		}
	} else {
		o.missing("copper", "the copper layers, e.g. copper: [{thickness: 35 um, coverage: 90 %}] (an empty list [] for bare laminate)")
		return l, false
	}
	if !okT || !(kin > 0) || !(kth > 0) {
		return l, false
	}
	sum := 0.0
	for _, c := range copper {
		sum += c.thickness
	}
	if sum >= t {
		r.addf(o.values["copper"], o.field("copper"), "the copper layers add up to %.4g mm, not less than the board's thickness of %.4g mm", sum*1e3, t*1e3)
		return l, false
	}
	kIn, kThrough, rhoC, err := boardStack(kin, kth, t, copper)
	if err != nil {
		r.addf(o.node, o.path, "%v", err)
		return l, false
	}
	l.Thickness, l.KIn, l.KThrough, l.RhoC, l.Board = t, kIn, kThrough, rhoC, true
	l.What = fmt.Sprintf("printed board, %d copper layers", len(copper))
	return l, true
}

// copperLayer is one copper layer of a printed board as read.
type copperLayer struct {
	thickness, coverage float64
	line                int
}

// readPlateFace reads one join of a plate's face to a node.
func (r *reader) readPlateFace(o *object, p *PlateSpec, ids map[string]nodeRef) (PlateFaceSpec, bool) {
	o.checkKeys(plateFaceKeys, "a plate's face")
	f := PlateFaceSpec{Line: o.node.Line}
	face, ok := o.choice("face", "face", plateFaces)
	if !ok {
		return f, false
	}
	if face == "" {
		o.missing("face", "which face: "+strings.Join(plateFaces, ", "))
		return f, false
	}
	f.Face = face
	f.Note, _ = o.str("note")
	f.Region, f.HasRegion = r.plateRegion(o, p, face)
	to, okTo := o.str("to")
	if !okTo {
		if !o.has("to") {
			o.missing("to", "the node the face gives its heat to, e.g. ambient")
		}
		r.broken = true
		return f, false
	}
	ref, known := ids[to]
	if !known {
		r.addf(o.values["to"], o.field("to"), "unknown node %q%s", to, suggest(to, sortedKeys(ids)))
		r.broken = true
		return f, false
	}
	if ref.kind == Plate {
		r.addf(o.values["to"], o.field("to"), "%q is a plate; a face joins a node (join two plates through a node between them, or make them layers of one plate)", to)
		r.broken = true
		return f, false
	}
	if to == p.ID {
		r.addf(o.values["to"], o.field("to"), "a plate's face cannot join the plate itself")
		return f, false
	}
	f.To = to
	conductive := 0
	for _, k := range []string{"h", "contact", "resistance", "conductance", "natural"} {
		if o.has(k) {
			conductive++
		}
	}
	if conductive > 1 {
		r.addf(o.node, o.path, "give one of h, contact, resistance, conductance and natural (and emissivity, if the face also radiates)")
		return f, false
	}
	if conductive == 0 && !o.has("emissivity") {
		r.addf(o.node, o.path, "needs how the face passes heat: h (convection, W/(m2 K)), natural (natural convection: vertical, facing-up or facing-down), contact (K*cm2/W), resistance (K/W) or conductance (W/K) for the whole face or region, and/or emissivity")
		return f, false
	}
	if v := o.values["natural"]; o.has("height") && (v == nil || v.Value != "vertical") {
		r.addf(o.values["height"], o.field("height"), "height goes with natural: vertical (a horizontal face's length is its area over its perimeter, from the region)")
		return f, false
	}
	good := true
	switch {
	case o.has("natural"):
		f.Natural, good = o.choice("natural", "attitude", faceNatural)
		if good && o.has("height") {
			f.Height, good = o.positive("height", units.Length, true)
		}
	case o.has("h"):
		f.H, good = o.positive("h", units.HeatTransferCoefficient, true)
	case o.has("contact"):
		f.Contact, good = o.positive("contact", units.SpecificResistance, true)
	case o.has("resistance"):
		var rr float64
		rr, good = o.positive("resistance", units.ThermalResistance, true)
		if good {
			f.Total = 1 / rr
		}
	case o.has("conductance"):
		f.Total, good = o.positive("conductance", units.Conductance, true)
	}
	if o.has("emissivity") {
		if ref.kind == Air {
			r.addf(o.values["emissivity"], o.field("emissivity"), "%q is an air node, and air does not take radiation; radiate to the walls' node or to ambient (give the convection to the air in an entry of its own)", to)
			return f, false
		}
		e, ok := o.fraction("emissivity", true)
		good = good && ok
		f.Emiss = e
	}
	return f, good
}

// plateRegion reads region: [x0, y0, x1, y1] of a face; without it, the
// whole face.
func (r *reader) plateRegion(o *object, p *PlateSpec, face string) ([4]float64, bool) {
	var out [4]float64
	if !o.has("region") {
		return out, false
	}
	v, ok := o.lengths("region", 4, true)
	if !ok {
		return out, false
	}
	copy(out[:], v)
	if !(out[2] > out[0] && out[3] > out[1]) {
		r.addf(o.values["region"], o.field("region"), "a region is [x0, y0, x1, y1] with x1 > x0 and y1 > y0")
		return out, false
	}
	w, h := p.faceSize(face)
	if w > 0 && h > 0 && (out[0] < -1e-12 || out[1] < -1e-12 || out[2] > w*(1+1e-9) || out[3] > h*(1+1e-9)) {
		r.addf(o.values["region"], o.field("region"), "reaches outside the %s face, which spans [0, 0] to [%.4g mm, %.4g mm]", face, w*1e3, h*1e3)
		return out, false
	}
	return out, true
}

// faceSize returns the extent of a face along its two coordinates, m: x
// and y for top and bottom, y and z for x_min and x_max, x and z for y_min
// and y_max (0 while the stack is not read).
func (p *PlateSpec) faceSize(face string) (float64, float64) {
	switch face {
	case "x_min", "x_max":
		return p.Length, p.Thickness()
	case "y_min", "y_max":
		return p.Width, p.Thickness()
	}
	return p.Width, p.Length
}

// lengths reads a list of n lengths, such as size: [120 mm, 90 mm].
func (o *object) lengths(key string, n int, need bool) ([]float64, bool) {
	v, ok := o.values[key]
	if !ok {
		if need {
			o.missing(key, fmt.Sprintf("a list of %d lengths, e.g. [%s]", n, strings.TrimSuffix(strings.Repeat("10 mm, ", n), ", ")))
		}
		return nil, false
	}
	if v.Kind != yaml.SequenceNode || len(v.Content) != n {
		got := describe(v)
		if v.Kind == yaml.SequenceNode {
			got = fmt.Sprintf("%d", len(v.Content))
		}
		o.r.addf(v, o.field(key), "expected a list of %d lengths, e.g. [%s]; got %s", n, strings.TrimSuffix(strings.Repeat("10 mm, ", n), ", "), got)
		return nil, false
	}
	out := make([]float64, n)
	for i, c := range v.Content {
		c = deref(c)
		if c.Kind != yaml.ScalarNode {
			o.r.addf(c, o.field(key), "expected a length such as \"10 mm\", got %s", describe(c))
			return nil, false
		}
		x, err := units.Parse(c.Value, units.Length)
		if err != nil {
			o.r.addf(c, o.field(key), "%s", unitMessage(err))
			return nil, false
		}
		if math.IsNaN(x) || math.IsInf(x, 0) || x < 0 || x > 1e4 {
			o.r.addf(c, o.field(key), "%q must be a length from 0 to 10 km", c.Value)
			return nil, false
		}
		out[i] = x
	}
	if key == "size" || key == "footprint" {
		for i, x := range out {
			if !(x > 0) {
				o.r.addf(v.Content[i], o.field(key), "%q must be greater than zero", v.Content[i].Value)
				return nil, false
			}
		}
	}
	return out, true
}

// placeParts checks that every part placed on a plate lies on it.
func (r *reader) placeParts(m *Model) {
	for _, c := range m.Components {
		if !c.Placed {
			continue
		}
		p := m.plate(c.Board)
		if p == nil {
			continue
		}
		x0, x1 := c.At[0]-c.Footprint[0]/2, c.At[0]+c.Footprint[0]/2
		y0, y1 := c.At[1]-c.Footprint[1]/2, c.At[1]+c.Footprint[1]/2
		tol := 1e-9 * math.Max(p.Width, p.Length)
		if x0 < -tol || y0 < -tol || x1 > p.Width+tol || y1 > p.Length+tol {
			r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "].at",
				Message: fmt.Sprintf("the footprint spans [%.4g mm, %.4g mm] to [%.4g mm, %.4g mm], outside plate %q, which spans [0, 0] to [%.4g mm, %.4g mm]; all of a part's heat must enter the plate",
					x0*1e3, y0*1e3, x1*1e3, y1*1e3, p.ID, p.Width*1e3, p.Length*1e3)})
		}
	}
}

// plate returns the plate of the given id, nil if there is none.
func (m *Model) plate(id string) *PlateSpec {
	for i := range m.Plates {
		if m.Plates[i].ID == id {
			return &m.Plates[i]
		}
	}
	return nil
}

// Cells returns the number of cells the model's plates mesh into.
func (m *Model) Cells() int {
	n := 0
	for i := range m.Plates {
		p := &m.Plates[i]
		n += p.NX * p.NY * p.ThroughCells()
	}
	return n
}

// ThroughCells returns the plate's cells through its thickness, over all
// its layers.
func (p *PlateSpec) ThroughCells() int {
	n := 0
	for _, l := range p.Layers {
		n += l.Cells
	}
	return n
}
