package air

import (
	"errors"
	"fmt"
	"math"
)

// Constants of the U.S. Standard Atmosphere 1976.
const (
	G0          = 9.80665   // standard gravity, m/s²
	EarthRadius = 6356766.0 // r0, m, for the geopotential altitude
	SeaLevelT   = 288.15    // K
	SeaLevelP   = 101325.0  // Pa
)

// Altitude limits of StandardAtmosphere and PressureAltitude, geometric, m.
//
// MaxAltitude, 32 162 m, is the top of the third layer of the 1976
// standard, 32 km geopotential; the layers above are not implemented. MinAltitude, −610 m (−2000 ft),
// is a choice of this package, not of the standard, which is defined from
// −5 km: it covers the lowest dry land (the Dead Sea shore, about −430 m)
// with margin, while a lower value almost always signals an input mistake.
const (
	MinAltitude = -610.0
	MaxAltitude = EarthRadius * 32000 / (EarthRadius - 32000)
)

// ErrAltitude reports an altitude or pressure outside the range of the
// standard atmosphere implemented here.
var ErrAltitude = errors.New("air: outside the standard atmosphere range")

// atmLayer is one layer of the 1976 standard: base geopotential altitude
// (m'), temperature gradient (K/m') and base temperature and pressure.
type atmLayer struct {
	base, lapse, t, p float64
}

// atmLayers holds the layers from sea level to 32 km geopotential: the
// troposphere (−6.5 K/km), the isothermal layer at 216.65 K from 11 km and
// the layer warming at +1.0 K/km from 20 km. Base pressures follow from
// the hydrostatic equation, as in the standard.
var atmLayers = func() []atmLayer {
	l := []atmLayer{
		{base: 0, lapse: -6.5e-3, t: SeaLevelT, p: SeaLevelP},
		{base: 11000, lapse: 0},
		{base: 20000, lapse: 1.0e-3},
	}
	for i := 1; i < len(l); i++ {
		l[i].t, l[i].p = l[i-1].at(l[i].base)
	}
	return l
}()

// at returns temperature and pressure at geopotential altitude h in layer l.
func (l atmLayer) at(h float64) (T, p float64) {
	if l.lapse == 0 {
		return l.t, l.p * math.Exp(-G0*(h-l.base)/(R*l.t))
	}
	T = l.t + l.lapse*(h-l.base)
	return T, l.p * math.Pow(l.t/T, G0/(R*l.lapse))
}

// altitude returns the geopotential altitude at which the pressure in
// layer l equals p.
func (l atmLayer) altitude(p float64) float64 {
	if l.lapse == 0 {
		return l.base - R*l.t*math.Log(p/l.p)/G0
	}
	T := l.t * math.Pow(p/l.p, -R*l.lapse/G0)
	return l.base + (T-l.t)/l.lapse
}

// Geopotential returns the geopotential altitude H = r0 z/(r0 + z), m', of
// the geometric altitude z, m.
func Geopotential(z float64) float64 { return EarthRadius * z / (EarthRadius + z) }

// Geometric returns the geometric altitude z = r0 H/(r0 − H), m, of the
// geopotential altitude H, m'.
func Geometric(H float64) float64 { return EarthRadius * H / (EarthRadius - H) }

// StandardAtmosphere returns temperature (K), pressure (Pa) and density
// (kg/m³) of the U.S. Standard Atmosphere 1976 at geometric altitude z, m.
// It returns an error wrapping ErrAltitude when z lies outside MinAltitude
// to MaxAltitude.
func StandardAtmosphere(z float64) (T, p, rho float64, err error) {
	if !(z >= MinAltitude && z <= MaxAltitude) {
		return 0, 0, 0, fmt.Errorf("%w: altitude %g m is outside %g m to %g m", ErrAltitude, z, MinAltitude, MaxAltitude)
	}
	h := Geopotential(z)
	l := atmLayers[0]
	for _, next := range atmLayers[1:] {
		if h >= next.base {
			l = next
		}
	}
	T, p = l.at(h)
	return T, p, p / (R * T), nil
}

// PressureAltitude returns the geometric altitude, m, at which the U.S.
// Standard Atmosphere 1976 has pressure p, Pa: the inverse of the pressure
// of StandardAtmosphere. It returns an error wrapping ErrAltitude when p
// lies outside the pressures at MaxAltitude and MinAltitude.
func PressureAltitude(p float64) (float64, error) {
	_, pMin, _, _ := StandardAtmosphere(MaxAltitude)
	_, pMax, _, _ := StandardAtmosphere(MinAltitude)
	if !(p >= pMin && p <= pMax) {
		return 0, fmt.Errorf("%w: pressure %g Pa is outside %.6g Pa to %.6g Pa", ErrAltitude, p, pMin, pMax)
	}
	l := atmLayers[0]
	for _, next := range atmLayers[1:] {
		if p <= next.p {
			l = next
		}
	}
	return Geometric(l.altitude(p)), nil
}
