package network

import (
	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/elements/dual"
	"github.com/heatgraph/heatgraph/units"
)

// capacityKeys are the keys with which a solid node or a component states
// its heat capacity, and airCapacityKeys those of an air node.
var (
	capacityKeys    = []string{"capacity", "mass", "specific_heat", "volume", "material"}
	airCapacityKeys = []string{"volume"}
)

const capacityHint = "capacity: 40 J/K; or mass: 25 g with specific_heat: 900 J/kg/K or a material; or volume: 4 cm3 with a material"

// readCapacity reads the heat capacity of a solid node or a component, J/K:
// given (capacity), or mass × specific heat (the specific heat given or
// the material's), or volume × density × specific heat of a material
// (lumped capacitance, Incropera et al., Fundamentals of Heat and Mass
// Transfer, §5.1). It returns 0 when none of the keys is there: the node
// then holds no heat (a steady solve needs none).
func readCapacity(o *object, m *Model) float64 {
	has := o.has("capacity") || o.has("mass") || o.has("volume") || o.has("specific_heat") || o.has("material")
	if !has {
		return 0
	}
	switch o.oneOf(capacityHint, "capacity", "mass", "volume") {
	case "capacity":
		for _, k := range []string{"specific_heat", "material"} {
			if o.has(k) {
				o.r.addf(o.values[k], o.field(k), "not used with capacity (give capacity alone, or mass with specific_heat or a material)")
			}
		}
		c, _ := o.positive("capacity", units.HeatCapacity, true)
		return c
	case "mass":
		mass, ok := o.positive("mass", units.Mass, true)
		cp, okC := specificHeat(o, m)
		if ok && okC {
			return mass * cp
		}
	case "volume":
		v, ok := o.positive("volume", units.Volume, true)
		if o.has("specific_heat") {
			o.r.addf(o.values["specific_heat"], o.field("specific_heat"), "not used with volume (a volume takes its density and specific heat from its material)")
			return 0
		}
		mat, okM := material(o, m, "the material that fills the volume, for its density and specific heat")
		if !ok || !okM {
			return 0
		}
		if !(mat.Density > 0 && mat.SpecificHeat > 0) {
			o.r.addf(o.values["material"], o.field("material"), "material %q has no density or specific heat in the table (add them under materials:, or give capacity)", mat.Name)
			return 0
		}
		return v * mat.Density * mat.SpecificHeat
	}
	return 0
}

// specificHeat reads specific_heat or takes it from the material.
func specificHeat(o *object, m *Model) (float64, bool) {
	switch o.oneOf("a specific heat such as 900 J/kg/K, or a material from the table", "specific_heat", "material") {
	case "specific_heat":
		return o.positive("specific_heat", units.SpecificHeat, true)
	case "material":
		mat, ok := material(o, m, "")
		if !ok {
			return 0, false
		}
		if !(mat.SpecificHeat > 0) {
			o.r.addf(o.values["material"], o.field("material"), "material %q has no specific heat in the table (add it under materials:, or give specific_heat)", mat.Name)
			return 0, false
		}
		return mat.SpecificHeat, true
	}
	return 0, false
}

// material looks up the material named by the material key.
func material(o *object, m *Model, hint string) (Material, bool) {
	if !o.has("material") {
		o.missing("material", hint)
		return Material{}, false
	}
	name, ok := o.str("material")
	if !ok {
		return Material{}, false
	}
	mat, found := m.Materials[name]
	if !found {
		o.r.addf(o.values["material"], o.field("material"), "unknown material %q%s (see 'heatgraph materials' for the table, or add it under materials:)", name, suggest(name, sortedKeys(m.Materials)))
		return Material{}, false
	}
	return mat, true
}

// readAirCapacity reads the volume of an air node and returns the heat
// capacity of the air it holds, ρ·V·c_p at the ambient temperature and
// pressure, J/K (0 without a volume).
func readAirCapacity(o *object, m *Model) float64 {
	if !o.has("volume") {
		return 0
	}
	v, ok := o.positive("volume", units.Volume, true)
	if !ok || !(m.Ambient.Temperature > 0) || !(m.Ambient.Pressure > 0) {
		return 0
	}
	t := dual.C(m.Ambient.Temperature)
	return v * air.Density(t, m.Ambient.Pressure).V * air.SpecificHeat(t).V
}
