package network

import (
	"fmt"
	"math"
	"strings"

	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/elements/viewfactor"
	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// EnclosureSpec is a set of gray diffuse surfaces that exchange radiation
// with each other, solved by the radiosity method.
type EnclosureSpec struct {
	ID       string
	Surfaces []SurfaceSpec
	// View[i][j] is the view factor from surface i to surface j.
	View [][]float64
	// OpenTo is the node that takes, as black surroundings, whatever part
	// of each surface's view the factors leave out; "" for a closed
	// enclosure.
	OpenTo string
	Line   int
}

// SurfaceSpec is one surface of an enclosure.
type SurfaceSpec struct {
	Name       string // unique in the enclosure; the node id by default
	Node       string
	Emissivity float64
	Area       float64 // m²
	Line       int
}

// viewTolerance is how far a row of view factors may be from summing to 1,
// and how far reciprocity may be off, as an absolute view factor.
const viewTolerance = 1e-3

var (
	enclosureKeys = []string{"id", "surfaces", "view_factors", "open_to", "note"}
	surfaceKeys   = []string{"id", "node", "emissivity", "area"}
	viewKeys      = []string{"from", "to", "value", "parallel", "perpendicular", "coaxial_disks"}
	parallelKeys  = []string{"width", "length", "gap"}
	perpKeys      = []string{"edge", "from_width", "to_width"}
	diskKeys      = []string{"from_radius", "to_radius", "gap"}
)

func (r *reader) readEnclosures(n *yaml.Node, ids map[string]nodeRef) []EnclosureSpec {
	var out []EnclosureSpec
	names := sortedKeys(ids)
	seen := map[string]int{}
	for i, item := range r.list(n, "enclosures", "entries with id, surfaces and view_factors") {
		o := r.newObject(item, "enclosures["+itoa(i)+"]")
		if o == nil {
			continue
		}
		o.checkKeys(enclosureKeys, "an enclosure")
		e := EnclosureSpec{Line: item.Line}
		id, ok := o.id("id")
		if !ok {
			continue
		}
		o.path = "enclosures[" + id + "]"
		if line, dup := seen[id]; dup {
			r.addf(o.values["id"], o.field("id"), "enclosure id %q is already used on line %d", id, line)
			continue
		}
		seen[id] = item.Line
		e.ID = id
		if o.has("open_to") {
			e.OpenTo = r.endpoint(o, "open_to", "", ids, names)
			if e.OpenTo != "" {
				r.checkEnd(o, endRule{"open_to", "the surroundings", solidKinds}, "radiation", e.OpenTo, ids[e.OpenTo].kind)
			}
		}
		sv, has := o.values["surfaces"]
		if !has {
			o.missing("surfaces", "a list of {node, emissivity, area}")
			continue
		}
		okAll := r.readSurfaces(o, sv, &e, ids, names)
		vv, has := o.values["view_factors"]
		if !has {
			o.missing("view_factors", "a list of {from, to, value} between surfaces")
			continue
		}
		// The view factors are checked even when a surface had a
		// problem, so that one pass finds everything.
		if r.readViews(o, vv, &e) && okAll {
			out = append(out, e)
			continue
		}
		// Which nodes the enclosure joins is not known: do not guess at
		// nodes without a path to a fixed temperature.
		r.broken = true
	}
	return out
}

// maxSurfaces is the most surfaces an enclosure may have: its view factors
// and radiosity equations grow with the square of the number, and a
// lumped model of a box needs tens, not thousands (a rule of thumb).
const maxSurfaces = 500

// openEps is the smallest part of a surface's view left to open_to that
// counts as exchange with it.
const openEps = 1e-9

// toOpen reports whether surface i of e sees its open_to node.
func (e *EnclosureSpec) toOpen(i int) bool {
	if e.OpenTo == "" {
		return false
	}
	rest := 1.0
	for _, f := range e.View[i] {
		rest -= f
	}
	return rest > openEps
}

// sees reports whether surface i of e sees surface j, another surface.
func (e *EnclosureSpec) sees(i, j int) bool { return i != j && e.View[i][j] > 0 }

func (r *reader) readSurfaces(o *object, n *yaml.Node, e *EnclosureSpec, ids map[string]nodeRef, names []string) bool {
	ok := true
	byName := map[string]bool{}
	items := r.list(n, o.field("surfaces"), "entries with node, emissivity and area")
	if len(items) > maxSurfaces {
		r.addf(n, o.field("surfaces"), "%d surfaces; an enclosure takes 2 to %d (merge small surfaces of one node into one)", len(items), maxSurfaces)
		return false
	}
	for i, item := range items {
		so := r.newObject(item, o.field("surfaces")+"["+itoa(i)+"]")
		if so == nil {
			ok = false
			continue
		}
		so.checkKeys(surfaceKeys, "an enclosure surface")
		s := SurfaceSpec{Line: item.Line}
		s.Node = r.endpoint(so, "node", "", ids, names)
		if s.Node == "" {
			ok = false
		} else {
			r.checkEnd(so, endRule{"node", "a surface", solidKinds}, "radiation", s.Node, ids[s.Node].kind)
		}
		s.Name = s.Node
		if so.has("id") {
			s.Name, _ = so.id("id")
		}
		if s.Name != "" && byName[s.Name] {
			r.addf(item, so.path, "surface %q appears twice; give each surface of one node its own id", s.Name)
			ok = false
		}
		byName[s.Name] = true
		var okE, okA bool
		s.Emissivity, okE = so.fraction("emissivity", true)
		s.Area, okA = so.positive("area", units.Area, true)
		ok = ok && okE && okA && s.Name != ""
		e.Surfaces = append(e.Surfaces, s)
	}
	if len(e.Surfaces) == 0 || (len(e.Surfaces) < 2 && e.OpenTo == "") {
		r.addf(n, o.field("surfaces"), "an enclosure needs at least two surfaces (or one with open_to)")
		ok = false
	}
	return ok
}

// readViews reads the view factors, fills the reverse directions by
// reciprocity, and checks the rows.
func (r *reader) readViews(o *object, n *yaml.Node, e *EnclosureSpec) bool {
	k := len(e.Surfaces)
	index := map[string]int{}
	names := make([]string, k)
	for i, s := range e.Surfaces {
		index[s.Name] = i
		names[i] = s.Name
	}
	given := make([][]bool, k)
	e.View = make([][]float64, k)
	for i := range e.View {
		e.View[i] = make([]float64, k)
		given[i] = make([]bool, k)
	}
	ok := true
	for i, item := range r.list(n, o.field("view_factors"), "entries with from, to and a value or a geometry") {
		vo := r.newObject(item, o.field("view_factors")+"["+itoa(i)+"]")
		if vo == nil {
			ok = false
			continue
		}
		vo.checkKeys(viewKeys, "a view factor")
		from, to := -1, -1
		for _, end := range []struct {
			key string
			at  *int
		}{{"from", &from}, {"to", &to}} {
			name, has := vo.str(end.key)
			if !has {
				if !vo.has(end.key) {
					vo.missing(end.key, "the id of a surface of this enclosure")
				}
				continue
			}
			j, found := index[name]
			if !found {
				r.addf(vo.values[end.key], vo.field(end.key), "unknown surface %q%s (this enclosure has %s)", name, suggest(name, names), strings.Join(names, ", "))
				continue
			}
			*end.at = j
		}
		if from < 0 || to < 0 {
			ok = false
			continue
		}
		f, fok := r.viewValue(vo, e.Surfaces[from], e.Surfaces[to])
		if !fok {
			ok = false
			continue
		}
		if given[from][to] {
			r.addf(item, vo.path, "the view factor from %q to %q is given twice", names[from], names[to])
			ok = false
			continue
		}
		e.View[from][to], given[from][to] = f, true
	}
	if !ok {
		return false
	}
	// The reverse direction by reciprocity, A_i F_ij = A_j F_ji.
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			if given[i][j] && !given[j][i] {
				e.View[j][i] = viewfactor.Reciprocal(e.View[i][j], e.Surfaces[i].Area, e.Surfaces[j].Area)
			}
		}
	}
	for i := 0; i < k; i++ {
		for j := i + 1; j < k; j++ {
			ai, aj := e.Surfaces[i].Area, e.Surfaces[j].Area
			if given[i][j] && given[j][i] && math.Abs(ai*e.View[i][j]-aj*e.View[j][i]) > viewTolerance*math.Max(ai, aj) {
				r.addf(n, o.field("view_factors"), "the view factors between %q and %q break reciprocity: A·F = %.4g m2 one way, %.4g m2 the other (give one direction and let the other follow)",
					names[i], names[j], ai*e.View[i][j], aj*e.View[j][i])
				ok = false
			}
		}
		sum := 0.0
		for j := 0; j < k; j++ {
			sum += e.View[i][j]
		}
		switch {
		case sum > 1+viewTolerance:
			r.addf(n, o.field("view_factors"), "the view factors from %q add up to %.4g, more than 1", names[i], sum)
			ok = false
		case sum < 1-viewTolerance && e.OpenTo == "":
			r.addf(n, o.field("view_factors"), "the view factors from %q add up to %.4g; in a closed enclosure they must add up to 1 (add the missing ones, or name the surroundings that see the rest with open_to)", names[i], sum)
			ok = false
		}
	}
	return ok && r.checkExchange(o, e)
}

// checkExchange reports every surface that sees only itself: with no view
// factor to another surface and nothing of its view left for open_to, it
// exchanges no radiation, and its node may be joined to nothing.
func (r *reader) checkExchange(o *object, e *EnclosureSpec) bool {
	ok := true
	for i, s := range e.Surfaces {
		any := e.toOpen(i)
		for j := range e.Surfaces {
			any = any || e.sees(i, j)
		}
		if any {
			continue
		}
		why := fmt.Sprintf("its view factor to itself is %.4g", e.View[i][i])
		if e.OpenTo != "" {
			why += ", which leaves nothing for open_to"
		}
		r.problems = append(r.problems, Problem{File: r.file, Line: s.Line, Field: o.field("surfaces") + "[" + itoa(i) + "]",
			Message: fmt.Sprintf("surface %q sees only itself (%s), so it exchanges no radiation with any other node; give the view factors from it to the surfaces it sees, or leave it out of the enclosure", s.Name, why)})
		ok = false
	}
	return ok
}

// viewValue reads a view factor given as a value or by a geometry formula.
func (r *reader) viewValue(vo *object, from, to SurfaceSpec) (float64, bool) {
	switch vo.oneOf("value: 0.3, or a geometry: parallel, perpendicular or coaxial_disks", "value", "parallel", "perpendicular", "coaxial_disks") {
	case "value":
		f, ok := vo.quantity("value", units.Dimensionless)
		if ok && !(f >= 0 && f <= 1) {
			r.addf(vo.values["value"], vo.field("value"), "a view factor must lie between 0 and 1, got %g", f)
			return 0, false
		}
		return f, ok
	case "parallel":
		g := r.newObject(vo.values["parallel"], vo.field("parallel"))
		if g == nil {
			return 0, false
		}
		g.checkKeys(parallelKeys, "aligned parallel rectangles")
		w, ok1 := g.positive("width", units.Length, true)
		l, ok2 := g.positive("length", units.Length, true)
		gap, ok3 := g.positive("gap", units.Length, true)
		if !(ok1 && ok2 && ok3) || !r.sameArea(g, from, w*l) || !r.sameArea(g, to, w*l) {
			return 0, false
		}
		return viewfactor.ParallelRectangles(w, l, gap), true
	case "perpendicular":
		g := r.newObject(vo.values["perpendicular"], vo.field("perpendicular"))
		if g == nil {
			return 0, false
		}
		g.checkKeys(perpKeys, "perpendicular rectangles with a common edge")
		x, ok1 := g.positive("edge", units.Length, true)
		y, ok2 := g.positive("from_width", units.Length, true)
		z, ok3 := g.positive("to_width", units.Length, true)
		if !(ok1 && ok2 && ok3) || !r.sameArea(g, from, x*y) || !r.sameArea(g, to, x*z) {
			return 0, false
		}
		return viewfactor.PerpendicularRectangles(x, y, z), true
	case "coaxial_disks":
		g := r.newObject(vo.values["coaxial_disks"], vo.field("coaxial_disks"))
		if g == nil {
			return 0, false
		}
		g.checkKeys(diskKeys, "coaxial parallel disks")
		r1, ok1 := g.positive("from_radius", units.Length, true)
		r2, ok2 := g.positive("to_radius", units.Length, true)
		gap, ok3 := g.positive("gap", units.Length, true)
		if !(ok1 && ok2 && ok3) || !r.sameArea(g, from, math.Pi*r1*r1) || !r.sameArea(g, to, math.Pi*r2*r2) {
			return 0, false
		}
		return viewfactor.CoaxialDisks(r1, r2, gap), true
	}
	return 0, false
}

// sameArea checks that a surface's area matches the geometry a view-factor
// formula assumes for it.
func (r *reader) sameArea(g *object, s SurfaceSpec, area float64) bool {
	if math.Abs(area-s.Area) <= 0.01*s.Area {
		return true
	}
	r.addf(g.node, g.path, "the formula's geometry gives surface %q %.4g m2, but the surface has %.4g m2; the view factor holds only for the geometry it describes",
		s.Name, area, s.Area)
	return false
}

// enclosureLinks solves an enclosure's radiosity equations and returns its
// radiation as links between pairs of nodes.
func (net *Network) enclosureLinks(e EnclosureSpec) ([]Link, error) {
	surfaces := make([]elements.Surface, len(e.Surfaces))
	for i, s := range e.Surfaces {
		surfaces[i] = elements.Surface{Node: net.Index[s.Node], Emissivity: s.Emissivity, Area: s.Area}
	}
	open := -1
	if e.OpenTo != "" {
		open = net.Index[e.OpenTo]
	}
	pairs, err := elements.EnclosureExchange(surfaces, e.View, open)
	if err != nil {
		return nil, err
	}
	name := func(i int) string {
		if i == len(e.Surfaces) {
			return e.OpenTo
		}
		return e.Surfaces[i].Name
	}
	links := make([]Link, len(pairs))
	for k, p := range pairs {
		links[k] = Link{ID: fmt.Sprintf("%s:%s~%s", e.ID, name(p.I), name(p.J)), Kind: "enclosure",
			From: p.Link.A, To: p.Link.B, Line: e.Line, Element: p.Link}
	}
	return links, nil
}
