package elements

import (
	"fmt"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/convection"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/elements/validity"
)

// Orientation is the shape and attitude of a surface in natural convection.
type Orientation int

// Surface orientations.
const (
	// Vertical: a vertical plate; the characteristic length is its height.
	Vertical Orientation = iota
	// FacingUp: a horizontal plate whose exposed face points up (a lid);
	// the characteristic length is area/perimeter.
	FacingUp
	// FacingDown: a horizontal plate whose exposed face points down (the
	// underside of a base); the characteristic length is area/perimeter.
	FacingDown
	// FinArray: vertical parallel fins on a vertical base, open at top and
	// bottom; the characteristic length is the fin spacing.
	FinArray
)

var orientationNames = [...]string{Vertical: "vertical", FacingUp: "facing up", FacingDown: "facing down", FinArray: "vertical fins"}

// String names the orientation.
func (o Orientation) String() string { return orientationNames[o] }

// Fins describes a vertical array of straight rectangular fins for
// natural convection.
type Fins struct {
	Count        int     // number of fins
	Thickness    float64 // m
	Height       float64 // how far a fin stands off the base, m
	Spacing      float64 // clear gap between fins, m
	Conductivity float64 // fin material, W/(m K)
}

// Natural is natural (free) convection from the surface at node Surface to
// the air at node Air, with the coefficient from a published correlation at
// the current temperatures:
//
//	q = h̄·A·(T_s − T_air),   h̄ = Nu·k/L,   Ra = g·β·|T_s − T_air|·L³/(ν·α),
//
// air properties at the film temperature (T_s + T_air)/2 and the ambient
// pressure, β = 1/T_film (ideal gas). Correlations, by orientation:
//
//   - Vertical: Churchill & Chu (1975), the form valid for all Ra (it is
//     continuous; the laminar form is not used, to keep Newton's method
//     free of jumps), L = height.
//   - FacingUp / FacingDown: Lloyd & Moran (1974) for a hot face up or a
//     cold face down, Incropera et al. eq. 9.32 for a hot face down or a
//     cold face up, L = A/P; which applies follows the sign of T_s − T_air.
//   - FinArray: Bar-Cohen & Rohsenow (1984) for symmetric isothermal
//     parallel plates, Nu on the spacing S with El = Ra_S·S/L, L = fin
//     height along the flow (the vertical length); the fins count through
//     their efficiency (straight fin, convecting tip), the base between
//     them at full value.
type Natural struct {
	Surface, Air int
	Orientation  Orientation
	Area         float64 // plate area, m² (unused for FinArray: the fins set the area)
	Length       float64 // characteristic length as above; for FinArray the vertical length, m
	Fins         Fins    // FinArray only
	// hScale multiplies the correlation's h when not zero: the coefficient
	// slope of the accuracy band (CoefficientSlope) varies it.
	hScale float64
}

func (n *Natural) scale() float64 {
	if n.hScale == 0 {
		return 1
	}
	return n.hScale
}

// Accuracy returns the relative accuracy of the correlation in use at s.
func (n *Natural) Accuracy(s *State) (float64, string) {
	switch n.Orientation {
	case Vertical:
		return 0.10, "Churchill & Chu (1975) vertical plate: about ±10 % against the data they fitted (from memory)"
	case FinArray:
		return 0.15, "Bar-Cohen & Rohsenow (1984) fin arrays: about ±15 % (from memory)"
	}
	return 0.20, "horizontal plates (Lloyd & Moran 1974; Incropera eq. 9.32): about ±20 % (from memory)"
}

// ScaledBy returns a copy with h multiplied by k.
func (n *Natural) ScaledBy(k float64) Element { c := *n; c.hScale = k * n.scale(); return &c }

// NewNatural checks and returns a natural-convection link.
func NewNatural(surface, airNode int, o Orientation, area, length float64, fins Fins) (*Natural, error) {
	if err := positive("length", length); err != nil {
		return nil, err
	}
	if o != FinArray {
		if err := positive("area", area); err != nil {
			return nil, err
		}
	} else {
		if fins.Count < 2 {
			return nil, fmt.Errorf("a fin array needs at least 2 fins, got %d", fins.Count)
		}
		if err := positive("fin thickness", fins.Thickness, "fin height", fins.Height, "fin spacing", fins.Spacing, "fin conductivity", fins.Conductivity); err != nil {
			return nil, err
		}
	}
	return &Natural{Surface: surface, Air: airNode, Orientation: o, Area: area, Length: length, Fins: fins}, nil
}

// naturalState is the correlation evaluated at one state.
type naturalState struct {
	ra, nu, h, hA, eta dual.Num
	props              air.Props
	correlation        string
	ranges             []rangeCheck
}

type rangeCheck struct {
	r validity.Range
	v float64
}

// eval computes h·A at the current temperatures with the dual seed on
// T_surface (seed 0), T_air (seed 1), or none (seed −1).
func (n *Natural) eval(s *State, seed int) naturalState {
	return n.evalAt(s, s.X[n.Surface], s.X[n.Air], seed)
}

// evalAt is eval at the surface temperature tsv and air temperature tav
// (K) instead of the state's: a meshed plate's natural-convection join
// evaluates the correlation at every cell of its face.
func (n *Natural) evalAt(s *State, tsv, tav float64, seed int) naturalState {
	ts, ta := dual.C(tsv), dual.C(tav)
	switch seed {
	case 0:
		ts.D = 1
	case 1:
		ta.D = 1
	}
	var ns naturalState
	ns.eta = dual.C(1)
	if n.Orientation != FinArray {
		ns.props, ns.ra, ns.nu, ns.h = n.surface(s, ts, ta)
		ns.hA = ns.h.Scale(n.Area)
		switch {
		case n.Orientation == Vertical:
			ns.correlation = "Churchill-Chu (1975), vertical plate"
			ns.ranges = []rangeCheck{{convection.ChurchillChuRa, ns.ra.V}}
		case risesAway(n.Orientation, ts.V-ta.V):
			ns.correlation = "Lloyd-Moran (1974), buoyant flow leaves the face"
			ns.ranges = []rangeCheck{{convection.HorizontalUpRa, ns.ra.V}, {convection.HorizontalPr, ns.props.Pr.V}}
		default:
			ns.correlation = "Incropera et al. eq. 9.32, buoyant flow trapped under the face"
			ns.ranges = []rangeCheck{{convection.HorizontalDownRa, ns.ra.V}, {convection.HorizontalPr, ns.props.Pr.V}}
		}
		return ns
	}
	p := air.At(ts.Add(ta).Scale(0.5), s.Env.Pressure)
	dT := ts.Sub(ta)
	ns.props = p
	f := n.Fins
	raS := gravityRa(s, p, dT, f.Spacing)
	el := raS.Scale(f.Spacing / n.Length)
	ns.ra = el
	ns.nu = convection.BarCohenSymmetric(el)
	ns.h = ns.nu.Mul(p.K).Scale(n.scale() / f.Spacing)
	ns.eta = convection.FinEfficiency(ns.h, f.Conductivity, f.Thickness, f.Height)
	finArea := 2 * float64(f.Count) * f.Height * n.Length
	baseArea := float64(f.Count-1) * f.Spacing * n.Length
	ns.hA = ns.h.Mul(ns.eta.Scale(finArea).AddC(baseArea))
	ns.correlation = "Bar-Cohen-Rohsenow (1984), isothermal parallel-plate channels"
	raL := raS.V * (n.Length / f.Spacing) * (n.Length / f.Spacing) * (n.Length / f.Spacing)
	ns.ranges = []rangeCheck{{convection.ChannelRaL, raL}}
	return ns
}

// risesAway reports whether the buoyant flow leaves a horizontal face
// with orientation o and surface-minus-air difference dT (a warm face up,
// a cool face down) rather than being trapped against it.
func risesAway(o Orientation, dT float64) bool { return (o == FacingUp) == (dT >= 0) }

// surface returns the air's properties at the film temperature, Ra, Nu
// and h of a plain surface (Vertical, FacingUp, FacingDown) at surface and
// air temperatures ts and ta, with their dual parts. It allocates nothing:
// a meshed face evaluates it at every cell (surfaceH).
func (n *Natural) surface(s *State, ts, ta dual.Num) (p air.Props, ra, nu, h dual.Num) {
	p = air.At(ts.Add(ta).Scale(0.5), s.Env.Pressure)
	dT := ts.Sub(ta)
	ra = gravityRa(s, p, dT, n.Length)
	switch {
	case n.Orientation == Vertical:
		nu = convection.ChurchillChu(ra, p.Pr)
	case risesAway(n.Orientation, dT.V):
		nu = convection.HorizontalUp(ra)
	default:
		nu = convection.HorizontalDown(ra)
	}
	return p, ra, nu, nu.Mul(p.K).Scale(n.scale() / n.Length)
}

// surfaceH returns h of a plain surface at ts and ta (see surface).
func (n *Natural) surfaceH(s *State, ts, ta dual.Num) dual.Num {
	_, _, _, h := n.surface(s, ts, ta)
	return h
}

// gravityRa returns the Rayleigh number g·β·|ΔT|·L³/(ν·α) under the
// network's gravity.
func gravityRa(s *State, p air.Props, dT dual.Num, L float64) dual.Num {
	return p.Beta.Mul(dual.Abs(dT)).Scale(s.Env.Gravity * L * L * L).Div(p.Nu.Mul(p.Alpha))
}

// Rows returns Surface and Air.
func (n *Natural) Rows() []int { return []int{n.Surface, n.Air} }

// Vars returns Surface and Air.
func (n *Natural) Vars() []int { return []int{n.Surface, n.Air} }

// Eval adds q = h·A·(T_s − T_air) with its exact derivatives, h included.
func (n *Natural) Eval(s *State, l *Local) {
	dT := s.X[n.Surface] - s.X[n.Air]
	bySurface := n.eval(s, 0).hA
	byAir := n.eval(s, 1).hA
	q := bySurface.V * dT
	dqs := bySurface.V + bySurface.D*dT
	dqa := -bySurface.V + byAir.D*dT
	stampPair(l, q, dqs, dqa)
}

// Report gives the correlation, Ra (El for fin arrays), Nu, h and the film
// temperature, with warnings outside the correlation's range.
func (n *Natural) Report(s *State) Report {
	ns := n.eval(s, -1)
	raName := "Ra"
	if n.Orientation == FinArray {
		raName = "El"
	}
	d := []Detail{
		{Name: "correlation", Text: ns.correlation},
		{Name: "orientation", Text: n.Orientation.String()},
		{Name: raName, Value: ns.ra.V},
		{Name: "Pr", Value: ns.props.Pr.V},
		{Name: "Nu", Value: ns.nu.V},
		{Name: "h", Value: ns.h.V, Unit: "W/(m2 K)"},
		{Name: "characteristic_length", Value: n.charLength(), Unit: "m"},
		{Name: "film_temperature", Value: (s.X[n.Surface]+s.X[n.Air])/2 - 273.15, Unit: "degC"},
	}
	if n.Orientation == FinArray {
		d = append(d, Detail{Name: "fin_efficiency", Value: ns.eta.V})
	}
	var warn []string
	for _, c := range ns.ranges {
		if w := c.r.Check(c.v); w != "" {
			warn = append(warn, ns.correlation+": "+w)
		}
	}
	warn = append(warn, air.Check((s.X[n.Surface]+s.X[n.Air])/2, s.Env.Pressure)...)
	return Report{Details: d, Warnings: warn}
}

func (n *Natural) charLength() float64 {
	if n.Orientation == FinArray {
		return n.Fins.Spacing
	}
	return n.Length
}
