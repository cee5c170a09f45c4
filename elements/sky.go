package elements

import (
	"fmt"
	"math"
)

// SwinbankCoefficient is the constant of Swinbank's clear-sky relation in
// the form T_sky = 0.0552·T_air^1.5 (T in K): Swinbank, Long-wave
// radiation from clear skies, Q. J. R. Meteorol. Soc. 89, 1963, as written
// in Duffie & Beckman, Solar Engineering of Thermal Processes, §3.9.
const SwinbankCoefficient = 0.0552

// SwinbankSky returns the effective clear-sky temperature, K, at the air
// temperature tAir (K), and its derivative.
func SwinbankSky(tAir float64) (t, dt float64) {
	r := math.Sqrt(tAir)
	return SwinbankCoefficient * tAir * r, 1.5 * SwinbankCoefficient * r
}

// Sky is long-wave radiation from an outside surface (node Node) of
// emissivity ε and area A to the sky, which it sees with view factor F,
// and to the ground and surroundings (node To, the ambient as a rule),
// which take the rest of its view:
//
//	q = ε·σ·A·[F·(T⁴ − T_sky⁴) + (1 − F)·(T⁴ − T_To⁴)]
//
// the small-surface relation (Incropera et al., Fundamentals of Heat and
// Mass Transfer, eq. 1.7) split between two surroundings. The sky
// temperature is given (constant or a profile in time) or, with
// Swinbank, follows the air temperature of node To by Swinbank's clear-sky
// relation (SwinbankSky). The whole of q is stamped into To: the sky
// belongs to the surroundings that the node To stands for, so the energy
// balance counts heat to the sky as heat leaving through it.
type Sky struct {
	Node, To   int
	Emissivity float64
	Area       float64 // m²
	ViewSky    float64 // view factor to the sky, (0, 1]
	TSky       float64 // K, when Of is nil and not Swinbank
	Of         TimeFunc
	Swinbank   bool
}

// NewSky checks the values and returns the element.
func NewSky(node, to int, eps, area, viewSky float64) (*Sky, error) {
	if err := checkEmissivity(eps); err != nil {
		return nil, err
	}
	if !(area > 0) {
		return nil, fmt.Errorf("area must be greater than zero, got %g", area)
	}
	if !(viewSky > 0 && viewSky <= 1) {
		return nil, fmt.Errorf("view factor to the sky must be in (0, 1], got %g", viewSky)
	}
	return &Sky{Node: node, To: to, Emissivity: eps, Area: area, ViewSky: viewSky}, nil
}

// skyT returns the sky temperature at s and its derivative with respect
// to T_To.
func (k *Sky) skyT(s *State) (float64, float64) {
	switch {
	case k.Swinbank:
		return SwinbankSky(s.X[k.To])
	case k.Of != nil:
		return k.Of.At(s.Time), 0
	}
	return k.TSky, 0
}

// Rows returns the surface and the surroundings.
func (k *Sky) Rows() []int { return []int{k.Node, k.To} }

// Vars returns the surface and the surroundings.
func (k *Sky) Vars() []int { return []int{k.Node, k.To} }

// Eval stamps q with its exact derivatives.
func (k *Sky) Eval(s *State, l *Local) {
	t, tg := s.X[k.Node], s.X[k.To]
	ts, dts := k.skyT(s)
	c := k.Emissivity * StefanBoltzmann * k.Area
	f := k.ViewSky
	t2, tg2, ts2 := t*t, tg*tg, ts*ts
	q := c * (t2*t2 - f*ts2*ts2 - (1-f)*tg2*tg2)
	dq := 4 * c * t2 * t
	dqg := -4 * c * ((1-f)*tg2*tg + f*ts2*ts*dts)
	stampPair(l, q, dq, dqg)
}

// Report gives the sky temperature and the heat to the sky and to the
// ground.
func (k *Sky) Report(s *State) Report {
	t, tg := s.X[k.Node], s.X[k.To]
	ts, _ := k.skyT(s)
	c := k.Emissivity * StefanBoltzmann * k.Area
	return Report{Details: []Detail{
		{Name: "T_sky", Value: ts, Unit: "K"},
		{Name: "to sky", Value: c * k.ViewSky * (math.Pow(t, 4) - math.Pow(ts, 4)), Unit: "W"},
		{Name: "to ground", Value: c * (1 - k.ViewSky) * (math.Pow(t, 4) - math.Pow(tg, 4)), Unit: "W"},
	}}
}
