package units

import (
	"strconv"
	"strings"
)

// dimension holds the exponents of the base quantities length, mass, time
// and temperature, in that order.
type dimension [4]int

// The dimensions of the base units and of the quantities in the symbol and
// Kind tables.
var (
	dimLength      = dimension{1, 0, 0, 0}
	dimMass        = dimension{0, 1, 0, 0}
	dimTime        = dimension{0, 0, 1, 0}
	dimTemperature = dimension{0, 0, 0, 1}

	dimArea                    = dimension{2, 0, 0, 0}
	dimVolume                  = dimension{3, 0, 0, 0}
	dimForce                   = dimension{1, 1, -2, 0}
	dimPressure                = dimension{-1, 1, -2, 0}
	dimEnergy                  = dimension{2, 1, -2, 0}
	dimPower                   = dimension{2, 1, -3, 0}
	dimHeatFlux                = dimension{0, 1, -3, 0}
	dimConductivity            = dimension{1, 1, -3, -1}
	dimThermalResistance       = dimension{-2, -1, 3, 1}
	dimConductance             = dimension{2, 1, -3, -1}
	dimSpecificResistance      = dimension{0, -1, 3, 1}
	dimHeatTransferCoefficient = dimension{0, 1, -3, -1}
	dimVolumeFlow              = dimension{3, 0, -1, 0}
	dimMassFlow                = dimension{0, 1, -1, 0}
	dimVelocity                = dimension{1, 0, -1, 0}
	dimDensity                 = dimension{-3, 1, 0, 0}
	dimSpecificHeat            = dimension{2, 0, -2, -1}
	dimHeatCapacity            = dimension{2, 1, -2, -1}
	dimDynamicViscosity        = dimension{-1, 1, -1, 0}
	dimAcceleration            = dimension{1, 0, -2, 0}
)

// addScaled returns d + n·e.
func (d dimension) addScaled(e dimension, n int) dimension {
	for i := range d {
		d[i] += n * e[i]
	}
	return d
}

// String writes d in SI base units, mass first as is usual: "kg m^2 s^-3".
// The dimension of a pure number is "1".
func (d dimension) String() string {
	order := [...]struct {
		index  int
		symbol string
	}{{1, "kg"}, {0, "m"}, {2, "s"}, {3, "K"}}
	var parts []string
	for _, b := range order {
		switch e := d[b.index]; e {
		case 0:
		case 1:
			parts = append(parts, b.symbol)
		default:
			parts = append(parts, b.symbol+"^"+strconv.Itoa(e))
		}
	}
	if parts == nil {
		return "1"
	}
	return strings.Join(parts, " ")
}
