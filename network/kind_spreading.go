package network

import (
	"github.com/heatgraph/heatgraph/elements"
	"github.com/heatgraph/heatgraph/units"
)

func init() {
	registerLinkKind(linkKind{
		name: "spreading", order: 35,
		summary: "spreading resistance from a small source through a plate to its cooled far side",
		help: "Heat entering a plate through a footprint smaller than the plate spreads sideways " +
			"before it crosses; this link carries the spreading and the through-thickness " +
			"resistance from the source's node to the node of the plate's far side. R comes from " +
			"the exact series solution for a uniform-flux disk centred on a disk with an adiabatic " +
			"rim (source and plate taken as disks of their areas), and depends on how well the " +
			"far side is cooled (sink_coefficient over the plate area, or sink_resistance): give " +
			"the far side's cooling as its own link too. `at: centre` refers R to the hottest " +
			"point of the source instead of its mean temperature. The closed form of Lee et al. " +
			"is reported beside it.",
		sources: []string{
			"Song, Lee & Au, Closed-form equation for thermal constriction/spreading resistances with variable resistance boundary condition, IEPS 1994 (series solution; citation from memory)",
			"Lee, Song, Au & Moran, Constriction/spreading resistance model for electronics packaging, ASME/JSME Thermal Engineering Conference 1995 (closed form; formula from memory, checked against the series in the tests)",
		},
		example: "{id: lid-spread, kind: spreading, from: soc-case, to: lid, source_width: 15 mm, source_length: 15 mm,\n" +
			"   plate_width: 120 mm, plate_length: 90 mm, thickness: 3 mm, material: aluminium-diecast, sink_coefficient: 10 W/m2/K}",
		keys: []keySpec{
			{name: "source_area", dim: units.Area, need: "one of source_area, source_width with source_length", help: "the footprint the heat enters through"},
			{name: "source_width", dim: units.Length, need: "with source_length"},
			{name: "source_length", dim: units.Length, need: "with source_width"},
			{name: "plate_area", dim: units.Area, need: "one of plate_area, plate_width with plate_length"},
			{name: "plate_width", dim: units.Length, need: "with plate_length"},
			{name: "plate_length", dim: units.Length, need: "with plate_width"},
			{name: "thickness", dim: units.Length, need: "required", help: "plate thickness"},
			{name: "material", what: "material", need: "one of material, conductivity", help: hintMaterial},
			{name: "conductivity", dim: units.Conductivity, need: "one of material, conductivity"},
			{name: "sink_coefficient", dim: units.HeatTransferCoefficient, need: "one of sink_coefficient, sink_resistance", help: "effective coefficient of the far side's cooling, over the plate area"},
			{name: "sink_resistance", dim: units.ThermalResistance, need: "one of sink_coefficient, sink_resistance", help: "the far side's cooling as a resistance R₀"},
			{name: "at", what: "word", def: "mean", help: "mean or centre: the source temperature R refers to"},
		},
		parse: parseSpreading,
		ends:  []endRule{{"from", "the source's footprint", solidKinds}, {"to", "the plate's far side", solidKinds}},
	})
}

// Spreading is a spreading resistance through a plate.
type Spreading struct {
	Plate elements.SpreadingPlate
}

func (s *Spreading) element(e linkEnv) (elements.Element, error) {
	return elements.NewSpread(e.from, e.to, s.Plate)
}

func parseSpreading(o *object, m *Model) LinkParams {
	s := &Spreading{}
	ok := true
	area := func(areaKey, wKey, lKey, what string) float64 {
		switch o.oneOf("the "+what+"'s area, or its width and length", areaKey, wKey) {
		case areaKey:
			a, okA := o.positive(areaKey, units.Area, true)
			ok = ok && okA
			return a
		case wKey:
			w, okW := o.positive(wKey, units.Length, true)
			l, okL := o.positive(lKey, units.Length, true)
			ok = ok && okW && okL
			return w * l
		}
		ok = false
		return 0
	}
	s.Plate.SourceArea = area("source_area", "source_width", "source_length", "source")
	s.Plate.PlateArea = area("plate_area", "plate_width", "plate_length", "plate")
	var okT, okK bool
	s.Plate.Thickness, okT = o.positive("thickness", units.Length, true)
	s.Plate.Conductivity, okK = conductivity(o, m, "the plate material, e.g. material: aluminium-6063, or conductivity: 200 W/m/K")
	ok = ok && okT && okK
	switch o.oneOf("how well the plate's far side is cooled: sink_coefficient over the plate area, or sink_resistance", "sink_coefficient", "sink_resistance") {
	case "sink_coefficient":
		h, okH := o.positive("sink_coefficient", units.HeatTransferCoefficient, true)
		ok = ok && okH
		if okH && s.Plate.PlateArea > 0 {
			s.Plate.SinkResistance = 1 / (h * s.Plate.PlateArea)
		}
	case "sink_resistance":
		r, okR := o.positive("sink_resistance", units.ThermalResistance, true)
		ok = ok && okR
		s.Plate.SinkResistance = r
	default:
		ok = false
	}
	at, okAt := o.choice("at", "reference point", []string{"mean", "centre"})
	ok = ok && okAt
	s.Plate.Maximum = at == "centre"
	if ok && s.Plate.SourceArea > s.Plate.PlateArea {
		o.r.addf(o.node, o.path, "the source (%.4g mm²) is larger than the plate (%.4g mm²)", s.Plate.SourceArea*1e6, s.Plate.PlateArea*1e6)
		return nil
	}
	if !ok {
		return nil
	}
	return s
}
