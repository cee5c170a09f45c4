package network

import "github.com/heatgraph/heatgraph/network/units"

// The link kinds of the model file. Each entry is the kind's whole
// description: the reader, the help and the documentation come from it.

const hintMaterial = "a material name from 'heatgraph materials' or the model's materials:"

func init() {
	registerLinkKind(linkKind{
		name: "conduction", order: 10,
		summary: "conduction through a slab or bar: k·A/L",
		help: "Steady one-dimensional conduction through a plane slab or a bar of one material: " +
			"G = k·A/L, with k from the material table or given. Use it for pads, plates, " +
			"walls, posts and spreaders whose temperature drop is along one direction.",
		sources: []string{"Fourier's law; Incropera et al., Fundamentals of Heat and Mass Transfer, §3.1"},
		example: "{id: pad, kind: conduction, from: cpu, to: lid, material: pad-6w, area: 1 cm2, thickness: 0.5 mm}",
		keys: []keySpec{
			{name: "material", what: "material", need: "one of material, conductivity", help: hintMaterial},
			{name: "conductivity", dim: units.Conductivity, need: "one of material, conductivity", help: "thermal conductivity k"},
			{name: "area", dim: units.Area, need: "required", help: "cross-section normal to the heat flow"},
			{name: "thickness", dim: units.Length, need: "one of thickness, length", help: "slab thickness along the heat flow"},
			{name: "length", dim: units.Length, need: "one of thickness, length", help: "bar length along the heat flow"},
		},
		parse: parseConduction,
		ends:  solidRules,
	})
	registerLinkKind(linkKind{
		name: "contact", order: 20,
		summary: "interface resistance: area-specific resistance over an area, or a total",
		help: "The resistance of an interface between two solids (a bolted joint, a grease or " +
			"gap-filler line): G = A/R″ from an area-specific resistance, or 1/R from a total.",
		sources: []string{"definition of thermal contact resistance; Incropera et al. §3.1.4"},
		example: "{id: screws, kind: contact, from: board, to: lid, specific_resistance: 1 K*cm2/W, area: 2 cm2}",
		keys: []keySpec{
			{name: "specific_resistance", dim: units.SpecificResistance, need: "one of specific_resistance, resistance", help: "area-specific resistance R″ (with area)"},
			{name: "area", dim: units.Area, need: "with specific_resistance", help: "contact area"},
			{name: "resistance", dim: units.ThermalResistance, need: "one of specific_resistance, resistance", help: "total resistance"},
		},
		parse: parseContact,
		ends:  solidRules,
	})
	registerLinkKind(linkKind{
		name: "lumped", order: 30,
		summary: "a resistance (K/W) or conductance (W/K) given directly",
		help: "A fixed thermal resistance or conductance between any two nodes, from a " +
			"datasheet, a measurement or a calculation done elsewhere.",
		sources: []string{"definition of thermal resistance, R = ΔT/q"},
		example: "{id: mount, kind: lumped, from: lid, to: rack, resistance: 2 K/W}",
		keys: []keySpec{
			{name: "resistance", dim: units.ThermalResistance, need: "one of resistance, conductance"},
			{name: "conductance", dim: units.Conductance, need: "one of resistance, conductance"},
		},
		parse: parseLumped,
	})
	registerLinkKind(linkKind{
		name: "convection", order: 40,
		summary: "convection with a given heat transfer coefficient: h·A",
		help: "Convection from a surface to air with a coefficient the user gives: q = h·A·ΔT " +
			"(Newton's law of cooling). heatgraph does not check the coefficient; the natural, " +
			"flat-plate and channel kinds compute it from correlations instead.",
		sources: []string{"Newton's law of cooling; Incropera et al. §1.2.2"},
		example: "{id: skin, kind: convection, from: lid, coefficient: 5 W/m2/K, area: 0.03 m2}",
		keys: []keySpec{
			{name: "coefficient", dim: units.HeatTransferCoefficient, need: "required", help: "heat transfer coefficient h"},
			{name: "area", dim: units.Area, need: "required", help: "wetted area"},
		},
		defaultTo: AmbientID,
		parse:     parseConvection,
	})
	registerLinkKind(linkKind{
		name: "radiation", order: 50,
		summary: "gray radiation to large surroundings, ε·σ·A·F·(T⁴ − T∞⁴), or between two gray surfaces",
		help: "Gray diffuse radiation with the exact T⁴ law. Alone, a small surface radiating to " +
			"large surroundings: q = εσAF(T⁴ − T∞⁴). With to_emissivity and to_area, the " +
			"two-surface exchange σ(T₁⁴ − T₂⁴)/[(1−ε₁)/(ε₁A₁) + 1/(A₁F₁₂) + (1−ε₂)/(ε₂A₂)]. For " +
			"several surfaces that see each other, use an enclosure instead.",
		sources: []string{"Incropera et al. eq. 1.7 and eq. 13.23", "σ = 5.670374419e-8 W/(m² K⁴), CODATA 2018"},
		example: "{id: glow, kind: radiation, from: lid, emissivity: 0.9, area: 0.03 m2}",
		keys: []keySpec{
			{name: "emissivity", dim: units.Dimensionless, need: "required", help: "in (0, 1]"},
			{name: "area", dim: units.Area, need: "required", help: "radiating area"},
			{name: "view_factor", dim: units.Dimensionless, def: "1", help: "from this surface to the other, in (0, 1]"},
			{name: "to_emissivity", dim: units.Dimensionless, need: "with to_area", help: "the other surface's emissivity"},
			{name: "to_area", dim: units.Area, need: "with to_emissivity", help: "the other surface's area"},
		},
		defaultTo: AmbientID,
		parse:     parseRadiation,
		ends:      solidRules,
	})
	registerLinkKind(linkKind{
		name: "stream", order: 60,
		summary: "air carried from one node to the next at a given flow, with its heat",
		help: "Air moving from one air (or fixed) node to the next at a given flow carries its " +
			"enthalpy ṁ·c_p·(T − T_ambient) (upwind): chains of streams and channels make air " +
			"warm along its path. A volume flow is taken at the ambient state, where fans draw " +
			"their air, and converted with the density there.",
		sources: []string{"energy balance of a flowing fluid, upwind (donor-cell) form"},
		example: "{id: exhaust, kind: stream, from: air-out, to: ambient, flow: 12 CFM}",
		keys: []keySpec{
			{name: "flow", dim: units.VolumeFlow, need: "one of flow, mass_flow", help: "volume flow of ambient air, e.g. 12 CFM"},
			{name: "mass_flow", dim: units.MassFlow, need: "one of flow, mass_flow", help: "mass flow, e.g. 6 g/s"},
		},
		parse: parseStream,
		ends:  []endRule{{"from", "the air's origin", airwayKinds}, {"to", "the air's destination", airwayKinds}},
	})
	registerLinkKind(linkKind{
		name: "channel", order: 70,
		summary: "forced convection from a wall to air in parallel channels or a plate-fin heat sink",
		help: "Air forced through N parallel channels along a wall (drilled passages, or the gaps " +
			"of a plate-fin heat sink) takes heat from the wall by the uniform-wall outlet relation " +
			"q = ṁc_p(1 − e^(−NTU))(T_wall − T_in), NTU = h̄A_eff/(ṁc_p), and carries it to the " +
			"outlet air node with the heat the air brought from the inlet. h̄ = Nu·k/D_h at " +
			"Re = ṁD_h/(A·μ) with air properties at the mean bulk temperature: laminar fully " +
			"developed (Shah & London) or developing (Muzychka & Yovanovich for rectangles, " +
			"Stephan for tubes; Hausen with laminar_entry: thermal), turbulent Gnielinski or " +
			"Dittus–Boelter, Gnielinski's blend in between; fins through their efficiency. The " +
			"report gives every number behind h and the pressure drop.",
		sources: []string{
			"Incropera et al., Fundamentals of Heat and Mass Transfer, eq. 8.42b (outlet relation)",
			"Shah & London, Laminar Flow Forced Convection in Ducts, 1978",
			"Muzychka & Yovanovich, J. Heat Transfer 126, 2004 (combined entry)",
			"Gnielinski, Int. Chem. Eng. 16, 1976; Petukhov 1970 (friction)",
			"Dittus & Boelter, 1930",
			"Kays & London, Compact Heat Exchangers (entry and exit losses)",
			"Churchill, Chem. Eng. 84, 1977 (friction factor)",
		},
		example: "{id: fins, kind: channel, from: base, inlet: ambient, to: air-out, flow: 15 CFM, length: 100 mm,\n" +
			"   fin_count: 14, fin_thickness: 1.2 mm, fin_height: 30 mm, base_width: 80 mm, material: aluminium-6063}",
		keys: []keySpec{
			{name: "inlet", what: "node", need: "required", help: "the air or fixed node the air comes from"},
			{name: "flow", dim: units.VolumeFlow, need: "one of flow, mass_flow", help: "volume flow of ambient air"},
			{name: "mass_flow", dim: units.MassFlow, need: "one of flow, mass_flow"},
			{name: "length", dim: units.Length, need: "required", help: "channel length along the flow"},
			{name: "fin_count", what: "count", need: "for a heat sink", help: "number of fins (2 to 1000)"},
			{name: "fin_thickness", dim: units.Length, need: "with fin_count"},
			{name: "fin_height", dim: units.Length, need: "with fin_count", help: "how far the fins stand off the base"},
			{name: "base_width", dim: units.Length, need: "with fin_count", help: "across the fins"},
			{name: "material", what: "material", need: "with fin_count: one of material, conductivity", help: "fin material"},
			{name: "conductivity", dim: units.Conductivity, need: "with fin_count: one of material, conductivity", help: "fin conductivity"},
			{name: "isothermal_fins", what: "flag", def: "false", help: "take the fins at the base temperature (efficiency 1)"},
			{name: "shape", what: "word", need: "for plain channels", help: "rectangular or circular"},
			{name: "width", dim: units.Length, need: "with shape: rectangular"},
			{name: "height", dim: units.Length, need: "with shape: rectangular"},
			{name: "diameter", dim: units.Length, need: "with shape: circular"},
			{name: "count", what: "count", def: "1", help: "number of parallel plain channels"},
			{name: "turbulent", what: "word", def: "gnielinski", help: "gnielinski or dittus-boelter"},
			{name: "laminar_entry", what: "word", def: "combined", help: "combined (hydrodynamic and thermal) or thermal entry"},
			{name: "upstream_length", dim: units.Length, def: "0", help: "length of the same channels before this segment"},
		},
		parse: parseChannel,
		ends: []endRule{{"from", "the wall", solidKinds}, {"inlet", "the inlet air", airwayKinds},
			{"to", "the outlet air", []NodeKind{Air}}},
	})
	registerLinkKind(linkKind{
		name: "natural", order: 80,
		summary: "natural convection from a surface: vertical, facing up, facing down, or vertical fins",
		help: "Natural convection with h̄ from a published correlation at the film temperature: " +
			"vertical plates by Churchill & Chu (all Ra), horizontal plates by Lloyd & Moran where " +
			"the warm air leaves the face and by 0.52·Ra^⅕ where it is trapped under it, vertical " +
			"fin arrays by Bar-Cohen & Rohsenow with fin efficiency. Warns outside each range.",
		sources: []string{
			"Churchill & Chu, Int. J. Heat Mass Transfer 18, 1975",
			"Lloyd & Moran, ASME 74-WA/HT-66, 1974",
			"Incropera et al. eq. 9.32",
			"Bar-Cohen & Rohsenow, J. Heat Transfer 106, 1984",
		},
		example: "{id: lid-top, kind: natural, from: lid, orientation: facing-up, length: 200 mm, width: 150 mm}",
		keys: []keySpec{
			{name: "orientation", what: "word", need: "required", help: "vertical, facing-up, facing-down or fins"},
			{name: "height", dim: units.Length, need: "vertical and fins", help: "vertical extent"},
			{name: "width", dim: units.Length, need: "vertical (or area); facing-up/down", help: "horizontal extent"},
			{name: "length", dim: units.Length, need: "facing-up/down"},
			{name: "area", dim: units.Area, need: "vertical: instead of width"},
			{name: "fin_count", what: "count", need: "fins"},
			{name: "fin_thickness", dim: units.Length, need: "fins"},
			{name: "fin_height", dim: units.Length, need: "fins", help: "how far the fins stand off the base"},
			{name: "fin_spacing", dim: units.Length, need: "fins", help: "clear gap between fins"},
			{name: "material", what: "material", need: "fins: one of material, conductivity"},
			{name: "conductivity", dim: units.Conductivity, need: "fins: one of material, conductivity"},
		},
		defaultTo: AmbientID,
		parse:     parseNatural,
		ends:      surfaceRules,
	})
	registerLinkKind(linkKind{
		name: "flat-plate", order: 90,
		summary: "forced convection from a flat wall in a stream of air of given velocity",
		help: "Forced convection along a flat wall in a draught of given velocity: laminar " +
			"0.664·Re^½·Pr^⅓ below Re 5×10⁵, mixed (0.037·Re^0.8 − 871)·Pr^⅓ above, at the film " +
			"temperature.",
		sources: []string{"Incropera et al. eqs. 7.30 and 7.38"},
		example: "{id: side, kind: flat-plate, from: wall, velocity: 1.5 m/s, length: 200 mm, width: 120 mm}",
		keys: []keySpec{
			{name: "velocity", dim: units.Velocity, need: "required", help: "free-stream velocity"},
			{name: "length", dim: units.Length, need: "required", help: "along the flow"},
			{name: "width", dim: units.Length, need: "one of width, area"},
			{name: "area", dim: units.Area, need: "one of width, area"},
		},
		defaultTo: AmbientID,
		parse:     parseFlatPlate,
		ends:      surfaceRules,
	})
}
