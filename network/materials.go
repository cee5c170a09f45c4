package network

import (
	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// Material holds the bulk properties of a solid near room temperature.
type Material struct {
	Name         string
	Conductivity float64 // W/(m K)
	Density      float64 // kg/m³, 0 when not given
	SpecificHeat float64 // J/(kg K), 0 when not given
	Source       string  // where the values come from
	Line         int     // line in the model file; 0 for the built-in table
}

// Materials maps names to materials.
type Materials map[string]Material

// Where the built-in values come from. Handbook values are typical values
// of the named handbook table, as the table gives them for pure or nearly
// pure materials (recalled, not checked against the printed table here);
// values marked "typical" are design-screening values for a class of
// products.
// Either way, a datasheet for the actual part or lot is better.
const (
	srcIncropera = "Incropera et al., Fundamentals of Heat and Mass Transfer, Table A.1, 300 K: typical handbook value"
	srcSarvar    = "Sarvar, Poole & Witting (1990), PCB glass-fibre laminates: thermal conductivity measurements (one laminate)"
	srcTypical   = "typical value for the class; use the datasheet"
)

// BuiltinMaterials returns the built-in table. Each call returns a fresh
// map that the caller may change.
func BuiltinMaterials() Materials {
	list := []Material{
		{Name: "copper", Conductivity: 401, Density: 8933, SpecificHeat: 385, Source: srcIncropera},
		{Name: "copper-c110", Conductivity: 388, Density: 8890, SpecificHeat: 385, Source: "ETP copper C11000, " + srcTypical},
		{Name: "aluminium", Conductivity: 237, Density: 2702, SpecificHeat: 903, Source: srcIncropera},
		{Name: "aluminium-6061", Conductivity: 167, Density: 2700, SpecificHeat: 896, Source: "6061-T6, " + srcTypical},
		{Name: "aluminium-6063", Conductivity: 200, Density: 2700, SpecificHeat: 900, Source: "6063-T5/T6 extrusion (190–210), " + srcTypical},
		{Name: "aluminium-diecast", Conductivity: 96, Density: 2710, SpecificHeat: 963, Source: "A380/ADC12 class (90–110), " + srcTypical},
		{Name: "brass", Conductivity: 110, Density: 8530, SpecificHeat: 380, Source: "cartridge brass, " + srcIncropera},
		{Name: "steel", Conductivity: 63.9, Density: 7832, SpecificHeat: 434, Source: "AISI 1010 plain carbon steel, " + srcIncropera},
		{Name: "stainless-304", Conductivity: 14.9, Density: 7900, SpecificHeat: 477, Source: "AISI 304, " + srcIncropera},
		{Name: "silicon", Conductivity: 148, Density: 2330, SpecificHeat: 712, Source: srcIncropera},
		{Name: "alumina-96", Conductivity: 24, Density: 3720, SpecificHeat: 880, Source: "96 % Al2O3 substrate (20–30), " + srcTypical},
		{Name: "aluminium-nitride", Conductivity: 170, Density: 3260, SpecificHeat: 740, Source: "AlN substrate (140–180), " + srcTypical},
		{Name: "fr4-in-plane", Conductivity: 1.059, Density: 1850, SpecificHeat: 1100, Source: srcSarvar + "; density and specific heat " + srcTypical},
		{Name: "fr4-through-plane", Conductivity: 0.343, Density: 1850, SpecificHeat: 1100, Source: srcSarvar + "; density and specific heat " + srcTypical},
		{Name: "solder-sac305", Conductivity: 58, Density: 7370, SpecificHeat: 232, Source: "SnAgCu lead-free solder, " + srcTypical},
		{Name: "solder-snpb", Conductivity: 50, Density: 8400, SpecificHeat: 176, Source: "Sn63Pb37 solder, " + srcTypical},
		{Name: "thermal-grease", Conductivity: 2, Source: "silicone grease (0.5–5, commonly 1–3 W/m/K), " + srcTypical},
		{Name: "gap-pad", Conductivity: 3, Source: "filled silicone gap pad (1–6, commonly 1–3 W/m/K), " + srcTypical},
		{Name: "phase-change", Conductivity: 2, Source: "phase-change interface material (0.5–5 W/m/K), " + srcTypical},
		{Name: "thermal-adhesive", Conductivity: 1, Source: "filled epoxy or silicone adhesive (0.5–2 W/m/K), " + srcTypical},
		{Name: "polyimide", Conductivity: 0.12, Density: 1420, SpecificHeat: 1090, Source: "polyimide film, " + srcTypical},
		{Name: "polycarbonate", Conductivity: 0.2, Density: 1200, SpecificHeat: 1200, Source: "enclosure plastic, " + srcTypical},
		{Name: "abs", Conductivity: 0.17, Density: 1050, SpecificHeat: 1400, Source: "enclosure plastic, " + srcTypical},
	}
	m := make(Materials, len(list))
	for _, mat := range list {
		m[mat.Name] = mat
	}
	return m
}

var materialKeys = []string{"name", "conductivity", "density", "specific_heat", "note"}

// readMaterials adds the file's materials to m, overriding built-in ones of
// the same name.
func (r *reader) readMaterials(n *yaml.Node, m Materials) {
	seen := map[string]int{}
	for i, item := range r.list(n, "materials", "entries with name and conductivity") {
		o := r.newObject(item, "materials["+itoa(i)+"]")
		if o == nil {
			continue
		}
		o.checkKeys(materialKeys, "a material")
		name, ok := o.id("name")
		if ok {
			o.path = "materials[" + name + "]"
			if line, dup := seen[name]; dup {
				r.addf(o.values["name"], o.field("name"), "material %q is defined twice (first on line %d)", name, line)
				ok = false
			}
			seen[name] = o.line("name")
		}
		mat := Material{Name: name, Line: item.Line, Source: "model file"}
		var okK bool
		mat.Conductivity, okK = o.positive("conductivity", units.Conductivity, true)
		if note, has := o.str("note"); has {
			mat.Source = note
		}
		okD, okC := true, true
		if o.has("density") {
			mat.Density, okD = o.positive("density", units.Density, true)
		}
		if o.has("specific_heat") {
			mat.SpecificHeat, okC = o.positive("specific_heat", units.SpecificHeat, true)
		}
		if ok && okK && okD && okC {
			m[name] = mat
		}
	}
}
