package elements

import "github.com/heatgraph/heatgraph/elements/duct"

// lossCoefficient returns the minor-loss coefficients charged to this
// channel: the entry loss when it starts at the channels' entry (no
// Upstream), the exit loss when it ends at their exit (no Downstream), so
// that a channel split along the flow pays each once.
func (c *Channel) lossCoefficient() float64 {
	k := 0.0
	if c.Upstream <= 0 {
		k += c.Geometry.KEntry
	}
	if c.Downstream <= 0 {
		k += c.Geometry.KExit
	}
	return k
}

// segmentDetails reports the minor losses charged, the heated walls, the
// treatment of the transition range (when used) and the flow development
// assumed.
func (c *Channel) segmentDetails(r duct.Result) []Detail {
	d := []Detail{
		{Name: "loss_coefficient", Value: c.lossCoefficient()},
		{Name: "heated_walls", Text: c.Geometry.Duct.Heated.String()},
		{Name: "development", Text: developmentName(c.Options)},
	}
	if r.Regime == duct.RegimeTransitional {
		d = append(d, Detail{Name: "transition", Text: r.Transition})
	}
	return d
}

// developmentName names the flow development that o assumes.
func developmentName(o duct.Options) string {
	switch {
	case o.Developed:
		return "fully developed"
	case o.Laminar == duct.ThermalEntry:
		return "velocity developed, temperature developing (thermal entry)"
	}
	return "velocity and temperature developing together (combined entry)"
}
