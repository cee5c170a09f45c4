package elements

import (
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/convection"
	"github.com/heatgraph/heatgraph/elements/dual"
)

// FlatPlate is forced convection from a flat wall at node Surface to air at
// node Air streaming along it at a given velocity (a wall in a draught or
// in the stream of a fan outside the box):
//
//	q = h̄·A·(T_s − T_air),   h̄ = Nu_L·k/L,   Re_L = V·L/ν,
//
// with the mean Nu over the plate length L from convection.FlatPlate:
// laminar 0.664·Re^½·Pr^⅓ below Re 5×10⁵, mixed laminar–turbulent
// (0.037·Re^0.8 − 871)·Pr^⅓ above (Incropera et al., Fundamentals of Heat
// and Mass Transfer, eqs. 7.30 and 7.38), air properties at the film
// temperature and the ambient pressure.
type FlatPlate struct {
	Surface, Air int
	Velocity     float64 // free-stream velocity, m/s
	Length       float64 // plate length along the flow, m
	Area         float64 // m²
	hScale       float64 // multiplies h when not zero (CoefficientSlope)
}

// NewFlatPlate checks and returns a flat-plate forced-convection link.
func NewFlatPlate(surface, airNode int, velocity, length, area float64) (*FlatPlate, error) {
	if err := positive("velocity", velocity, "length", length, "area", area); err != nil {
		return nil, err
	}
	return &FlatPlate{Surface: surface, Air: airNode, Velocity: velocity, Length: length, Area: area}, nil
}

// eval returns Re, Nu and h at the film temperature film.
func (f *FlatPlate) eval(s *State, film dual.Num) (re, nu, h dual.Num, p air.Props) {
	p = air.At(film, s.Env.Pressure)
	re = p.Nu.Inv().Scale(f.Velocity * f.Length)
	nu = convection.FlatPlate(re, p.Pr)
	h = nu.Mul(p.K).Scale(f.scale() / f.Length)
	return re, nu, h, p
}

func (f *FlatPlate) scale() float64 {
	if f.hScale == 0 {
		return 1
	}
	return f.hScale
}

// Accuracy returns the relative accuracy of the correlation in use at s.
func (f *FlatPlate) Accuracy(s *State) (float64, string) {
	film := (s.X[f.Surface] + s.X[f.Air]) / 2
	re, _, _, _ := f.eval(s, dual.C(film))
	if re.V >= convection.CriticalRe {
		return 0.25, "mixed laminar-turbulent flat plate (Incropera eq. 7.38): the transition point is uncertain, about ±25 % (from memory)"
	}
	return 0.10, "laminar flat plate (Incropera eq. 7.30): exact for the similarity solution; about ±10 % for a real wall in a draught (from memory)"
}

// ScaledBy returns a copy with h multiplied by k.
func (f *FlatPlate) ScaledBy(k float64) Element { c := *f; c.hScale = k * f.scale(); return &c }

// Rows returns Surface and Air.
func (f *FlatPlate) Rows() []int { return []int{f.Surface, f.Air} }

// Vars returns Surface and Air.
func (f *FlatPlate) Vars() []int { return []int{f.Surface, f.Air} }

// Eval adds q = h·A·(T_s − T_air); h depends on both temperatures through
// the film temperature, with derivative ∂h/∂T_film / 2 on each.
func (f *FlatPlate) Eval(s *State, l *Local) {
	ts, ta := s.X[f.Surface], s.X[f.Air]
	_, _, h, _ := f.eval(s, dual.Var((ts+ta)/2))
	dT := ts - ta
	q := h.V * f.Area * dT
	dqs := f.Area * (h.V + h.D*dT/2)
	dqa := f.Area * (-h.V + h.D*dT/2)
	stampPair(l, q, dqs, dqa)
}

// Report gives Re, Nu, h, the regime and warnings outside the range.
func (f *FlatPlate) Report(s *State) Report {
	film := (s.X[f.Surface] + s.X[f.Air]) / 2
	re, nu, h, p := f.eval(s, dual.C(film))
	regime, corr := "laminar", "flat plate, laminar (Incropera eq. 7.30)"
	if re.V >= convection.CriticalRe {
		regime, corr = "mixed laminar-turbulent", "flat plate, mixed (Incropera eq. 7.38)"
	}
	var warn []string
	for _, c := range []rangeCheck{{convection.FlatPlateRe, re.V}, {convection.FlatPlatePr, p.Pr.V}} {
		if w := c.r.Check(c.v); w != "" {
			warn = append(warn, corr+": "+w)
		}
	}
	warn = append(warn, air.Check(film, s.Env.Pressure)...)
	return Report{Details: []Detail{
		{Name: "regime", Text: regime},
		{Name: "correlation", Text: corr},
		{Name: "Re", Value: re.V},
		{Name: "Pr", Value: p.Pr.V},
		{Name: "Nu", Value: nu.V},
		{Name: "h", Value: h.V, Unit: "W/(m2 K)"},
		{Name: "film_temperature", Value: film - 273.15, Unit: "degC"},
	}, Warnings: warn}
}
