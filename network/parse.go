package network

import (
	"bytes"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/elements/air"
	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// FormatVersion is the model format version this build reads.
const FormatVersion = 1

var topKeys = []string{"heatgraph", "title", "ambient", "required_margin", "materials", "nodes", "components", "links", "enclosures", "plates", "shared"}

// Parse reads a model from data; file names it in messages.
func Parse(file string, data []byte) (*Model, error) { return parseHooked(file, data, nil) }

// parseHooked is Parse; hook, when not nil, may change the YAML document
// before it is read (see ParseWith).
func parseHooked(file string, data []byte, hook func(doc *yaml.Node)) (*Model, error) {
	r := &reader{file: file, budget: len(data)/2 + 100000}
	m := &Model{File: file, Materials: BuiltinMaterials()}
	if line, msg := checkText(data); msg != "" {
		r.problems = append(r.problems, Problem{File: file, Line: line, Message: msg})
		return nil, r.finish()
	}
	if len(bytes.TrimSpace(data)) == 0 {
		r.addf(nil, "", "the model is empty (it needs at least ambient: and nodes:, see the examples folder)")
		return nil, r.finish()
	}
	docs, err := decodeAll(data)
	if err != nil {
		line, msg := syntaxProblem(data, err)
		r.problems = append(r.problems, Problem{File: file, Line: line, Field: "syntax", Message: msg})
		return nil, r.finish()
	}
	if len(docs) == 0 || len(docs[0].Content) == 0 {
		r.addf(nil, "", "the model is empty (it needs at least ambient: and nodes:, see the examples folder)")
		return nil, r.finish()
	}
	if len(docs) > 1 {
		r.addf(docs[1], "syntax", "%s", secondDocument)
	}
	if hook != nil {
		hook(docs[0])
	}
	top := r.newObject(docs[0].Content[0], "")
	if top == nil {
		return nil, r.finish()
	}
	top.checkKeys(topKeys, "the top level")
	if v, ok := top.str("heatgraph"); ok && v != strconv.Itoa(FormatVersion) {
		r.addf(top.values["heatgraph"], "heatgraph", "format version %q is not supported (this build reads version %d)", v, FormatVersion)
	}
	m.Title, _ = top.str("title")
	r.readAmbient(top, m)
	if top.has("required_margin") {
		if x, ok := top.quantity("required_margin", units.TemperatureDifference); ok {
			if x < 0 {
				r.addf(top.values["required_margin"], "required_margin", "must not be negative (a temperature difference such as 5 K)")
			}
			m.RequiredMargin = x
		}
	}
	if n, ok := top.values["materials"]; ok {
		r.readMaterials(n, m.Materials)
	}
	ids := map[string]nodeRef{AmbientID: {kind: Fixed}}
	before := len(r.problems)
	if n, ok := top.values["nodes"]; ok {
		m.Nodes = r.readNodes(n, m, ids)
	}
	if n, ok := top.values["plates"]; ok {
		m.Plates = r.readPlates(n, m, ids)
	}
	if n, ok := top.values["components"]; ok {
		m.Components = r.readComponents(n, m, ids)
	}
	if len(m.Nodes) == 0 && len(m.Components) == 0 && len(m.Plates) == 0 && len(r.problems) == before {
		r.addf(top.node, "nodes", "the model has no nodes (add a nodes: list with at least one solid node)")
	}
	r.resolveComponents(m, ids)
	r.placeParts(m)
	if n, ok := top.values["links"]; ok {
		m.Links = r.readLinks(n, m, ids)
	}
	if n, ok := top.values["enclosures"]; ok {
		m.Enclosures = r.readEnclosures(n, ids)
	}
	if !r.broken {
		r.problems = append(r.problems, m.isolated()...)
		r.problems = append(r.problems, m.unbalancedAir()...)
		r.problems = append(r.problems, m.closedAir()...)
		if len(r.problems) == 0 {
			r.problems = append(r.problems, m.unbalancedAirInTime()...)
		}
	}
	if len(r.problems) > 0 {
		return nil, r.finish()
	}
	return m, nil
}

var ambientKeys = []string{"temperature", "pressure", "altitude"}

func (r *reader) readAmbient(top *object, m *Model) {
	n, ok := top.values["ambient"]
	if !ok {
		top.missing("ambient", "a mapping with temperature and optionally pressure or altitude, e.g. ambient: {temperature: 25 degC}")
		return
	}
	o := r.newObject(n, "ambient")
	if o == nil {
		return
	}
	o.checkKeys(ambientKeys, "ambient")
	m.Ambient.Line = n.Line
	if t, prof, ok := o.varying("temperature", units.Temperature, true); ok {
		m.Ambient.Temperature, m.Ambient.TemperatureProfile = t, prof
	}
	m.Ambient.Pressure = air.SeaLevelP
	if o.has("pressure") && o.has("altitude") {
		r.addf(o.values["altitude"], "ambient.altitude", "give pressure or altitude, not both")
		return
	}
	if p, ok := o.positive("pressure", units.Pressure, false); ok {
		m.Ambient.Pressure = p
	}
	if z, ok := o.quantity("altitude", units.Length); ok {
		_, p, _, err := air.StandardAtmosphere(z)
		if err != nil {
			r.addf(o.values["altitude"], "ambient.altitude", "%v", err)
			return
		}
		m.Ambient.Pressure, m.Ambient.Altitude, m.Ambient.FromAlt = p, z, true
	}
}

var (
	solidKeys = []string{"id", "kind", "power", "limit", "note", "group"}
	fixedKeys = []string{"id", "kind", "temperature", "note", "pressure", "group"}
	airKeys   = []string{"id", "kind", "limit", "note", "height", "group"}
	nodeKinds = []string{string(Solid), string(Fixed), string(Air)}
)

// claim records a new node id, reporting duplicates and the reserved name.
func (r *reader) claim(o *object, id string, kind NodeKind, ids map[string]nodeRef) bool {
	if id == AmbientID {
		r.addf(o.values["id"], o.field("id"), "%q is reserved for the ambient node, which every model has; use it in links without defining it", id)
		return false
	}
	if prev, dup := ids[id]; dup {
		r.addf(o.values["id"], o.field("id"), "%q is already used by the node or component on line %d; ids must be unique", id, prev.line)
		return false
	}
	ids[id] = nodeRef{line: o.line("id"), kind: kind}
	return true
}

// nodeRef is what links need to know of a node while the file is read.
type nodeRef struct {
	line int
	kind NodeKind
}

func (r *reader) readNodes(n *yaml.Node, m *Model, ids map[string]nodeRef) []NodeSpec {
	var out []NodeSpec
	for i, item := range r.list(n, "nodes", "entries with id and kind") {
		o := r.newObject(item, "nodes["+itoa(i)+"]")
		if o == nil {
			continue
		}
		spec := NodeSpec{Kind: Solid, Line: item.Line}
		id, okID := o.id("id")
		if okID {
			o.path = "nodes[" + id + "]"
		}
		if k, ok := o.str("kind"); ok {
			switch NodeKind(k) {
			case Solid, Fixed, Air:
				spec.Kind = NodeKind(k)
			default:
				r.addf(o.values["kind"], o.field("kind"), "unknown node kind %q%s (valid: %s)", k, suggest(k, nodeKinds), strings.Join(nodeKinds, ", "))
				r.broken = true
				if okID {
					r.claim(o, id, Solid, ids)
				}
				continue
			}
		}
		if okID {
			okID = r.claim(o, id, spec.Kind, ids)
		}
		spec.ID = id
		spec.Note, _ = o.str("note")
		spec.Group, _ = o.str("group")
		switch spec.Kind {
		case Solid:
			o.checkKeys(append(solidKeys, capacityKeys...), "a solid node")
			spec.Power, spec.PowerProfile, _ = o.varying("power", units.Power, false)
			spec.Limit, spec.HasLimit = o.temperature("limit", false)
			spec.Capacity = readCapacity(o, m)
		case Air:
			if o.has("power") {
				r.addf(o.values["power"], o.field("power"), "an air node takes no heat input; put the heat on a solid node that convects to it")
			}
			o.checkKeys(append(append(airKeys, "power"), airCapacityKeys...), "an air node")
			spec.Limit, spec.HasLimit = o.temperature("limit", false)
			spec.Capacity = readAirCapacity(o, m)
			if o.has("height") {
				spec.Height, _ = o.quantity("height", units.Length)
			}
		case Fixed:
			if o.has("power") {
				r.addf(o.values["power"], o.field("power"), "a fixed-temperature node cannot take a heat input (its temperature is given); put the heat on a solid node linked to it")
			}
			if o.has("limit") {
				r.addf(o.values["limit"], o.field("limit"), "a fixed-temperature node has no limit to check (its temperature is given)")
			}
			o.checkKeys(append(fixedKeys, "power", "limit"), "a fixed node")
			spec.Temperature, spec.TemperatureProfile, _ = o.varying("temperature", units.Temperature, true)
			if o.has("pressure") {
				spec.Pressure, _ = o.quantity("pressure", units.Pressure)
				// A gauge pressure: a box's fans and vents work with pascals
				// to a few kilopascals (10 kPa is a rule-of-thumb bound).
				if math.Abs(spec.Pressure) > 10e3 {
					r.addf(o.values["pressure"], o.field("pressure"), "%q is a gauge pressure above ambient, at most 10 kPa either way (e.g. 25 Pa); an absolute pressure belongs under ambient:", o.values["pressure"].Value)
				}
			}
		}
		if okID {
			out = append(out, spec)
		}
	}
	return out
}

var componentKeys = []string{"id", "power", "r_jc", "r_jb", "case", "board", "at", "footprint", "side", "limit", "note", "group"}

func (r *reader) readComponents(n *yaml.Node, m *Model, ids map[string]nodeRef) []ComponentSpec {
	var out []ComponentSpec
	for i, item := range r.list(n, "components", "entries with id, power, r_jc/r_jb and the case and board nodes") {
		o := r.newObject(item, "components["+itoa(i)+"]")
		if o == nil {
			continue
		}
		o.checkKeys(append(componentKeys, capacityKeys...), "a component")
		c := ComponentSpec{Line: item.Line}
		id, okID := o.id("id")
		if okID {
			o.path = "components[" + id + "]"
			okID = r.claim(o, id, Junction, ids)
		}
		c.ID = id
		c.Note, _ = o.str("note")
		c.Group, _ = o.str("group")
		c.Power, c.PowerProfile, _ = o.varying("power", units.Power, true)
		c.Limit, c.HasLimit = o.temperature("limit", false)
		c.Capacity = readCapacity(o, m)
		c.Case, _ = o.str("case")
		c.Board, _ = o.str("board")
		if c.Case != "" {
			c.RJC, _ = o.positive("r_jc", units.ThermalResistance, true)
		} else if o.has("r_jc") {
			r.addf(o.values["r_jc"], o.field("r_jc"), "r_jc needs the case node it leads to (add case: <node id>)")
		}
		if c.Board != "" {
			c.RJB, _ = o.positive("r_jb", units.ThermalResistance, true)
		} else if o.has("r_jb") {
			r.addf(o.values["r_jb"], o.field("r_jb"), "r_jb needs the board node it leads to (add board: <node id>)")
		}
		if o.has("at") || o.has("footprint") || o.has("side") {
			c.placing = true
			at, okAt := o.lengths("at", 2, true)
			fp, okFp := o.lengths("footprint", 2, true)
			c.Side = "top"
			if s, ok := o.choice("side", "side", []string{"top", "bottom"}); ok && s != "" {
				c.Side = s
			}
			if okAt && okFp {
				c.At, c.Footprint, c.Placed = [2]float64(at), [2]float64(fp), true
			}
			if c.Board == "" {
				r.addf(o.node, o.path, "at: and footprint: place a part on a plate; add board: <plate id>")
			}
		}
		if c.Case == "" && c.Board == "" && !o.has("r_jc") && !o.has("r_jb") {
			r.addf(o.node, o.path, "needs case: with r_jc, board: with r_jb, or both (the JEDEC two-resistor model)")
		}
		if okID {
			out = append(out, c)
		}
	}
	return out
}

// resolveComponents checks that components name existing nodes.
func (r *reader) resolveComponents(m *Model, ids map[string]nodeRef) {
	names := sortedKeys(ids)
	for _, c := range m.Components {
		for _, end := range []struct{ key, id string }{{"case", c.Case}, {"board", c.Board}} {
			if end.id == "" {
				continue
			}
			if _, ok := ids[end.id]; !ok {
				r.broken = true
				r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "]." + end.key,
					Message: fmt.Sprintf("unknown node %q%s", end.id, suggest(end.id, names))})
			} else if end.id == c.ID {
				r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "]." + end.key,
					Message: "a component cannot be its own case or board node"})
			} else if k := ids[end.id].kind; k == Plate && end.key == "case" {
				r.broken = true
				r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "]." + end.key,
					Message: fmt.Sprintf("%q is a plate; a component's case must be a node (give the case a node and join it to the plate's face under faces:)", end.id)})
			} else if k == Plate && !c.Placed && !c.placing {
				r.broken = true
				r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "].board",
					Message: fmt.Sprintf("%q is a plate: place the part on it with at: [x, y] (the centre of its footprint) and footprint: [width, length]", end.id)})
			} else if k != Plate && c.Placed && end.key == "board" {
				r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "].at",
					Message: fmt.Sprintf("%q is a node, not a plate: at: and footprint: only place parts on plates", end.id)})
			} else if k == Air {
				r.broken = true
				r.problems = append(r.problems, Problem{File: r.file, Line: c.Line, Field: "components[" + c.ID + "]." + end.key,
					Message: fmt.Sprintf("%q is an air node; a component's %s must be a solid or fixed node (link the part to the air with a convection link instead)", end.id, end.key)})
			}
		}
	}
}

func (r *reader) readLinks(n *yaml.Node, m *Model, ids map[string]nodeRef) []LinkSpec {
	var out []LinkSpec
	names := sortedKeys(ids)
	linkIDs := map[string]int{}
	for i, item := range r.list(n, "links", "entries with kind, from, to and the kind's values") {
		o := r.newObject(item, "links["+itoa(i)+"]")
		if o == nil {
			continue
		}
		l := LinkSpec{Line: item.Line}
		explicitID := o.has("id")
		if explicitID {
			id, ok := o.id("id")
			if !ok {
				r.broken = true
				continue
			}
			l.ID = id
			o.path = "links[" + id + "]"
		}
		kindName, ok := o.str("kind")
		if !ok {
			r.broken = true
			if !o.has("kind") {
				o.missing("kind", "one of "+strings.Join(linkKindNames(), ", "))
			}
			continue
		}
		kind := findLinkKind(kindName)
		if kind == nil {
			r.broken = true
			r.addf(o.values["kind"], o.field("kind"), "unknown link kind %q%s (valid: %s)", kindName, suggest(kindName, linkKindNames()), strings.Join(linkKindNames(), ", "))
			continue
		}
		l.Kind = kindName
		o.checkKeys(append(append([]string{}, commonLinkKeys...), kind.keyNames()...), "a "+kindName+" link")
		l.Note, _ = o.str("note")
		l.From = r.endpoint(o, "from", "", ids, names)
		l.To = r.endpoint(o, "to", kind.defaultTo, ids, names)
		if l.From != "" && l.From == l.To {
			r.addf(o.values["to"], o.field("to"), "a link must join two different nodes (from and to are both %q)", l.From)
		}
		for _, rule := range kind.ends {
			id := l.From
			switch rule.key {
			case "to":
				id = l.To
			case "from":
			default:
				id = ""
				if !o.has(rule.key) {
					o.missing(rule.key, "the node that is "+rule.role+", e.g. ambient")
					r.broken = true
				} else {
					id = r.endpoint(o, rule.key, "", ids, names)
				}
				l.Others = append(l.Others, id)
			}
			if id != "" {
				r.checkEnd(o, rule, kindName, id, ids[id].kind)
			}
		}
		l.Params = kind.parse(o, m)
		if !explicitID && l.From != "" && l.To != "" {
			l.ID = l.From + "--" + l.To
			for k := 2; linkIDs[l.ID] != 0; k++ {
				l.ID = fmt.Sprintf("%s--%s#%d", l.From, l.To, k)
			}
		}
		if l.ID != "" {
			if line, dup := linkIDs[l.ID]; dup && explicitID {
				r.addf(o.values["id"], o.field("id"), "link id %q is already used on line %d; ids must be unique", l.ID, line)
				continue
			}
			linkIDs[l.ID] = item.Line
		}
		out = append(out, l)
	}
	return out
}

// checkEnd reports a link end whose node is of a kind the rule excludes.
func (r *reader) checkEnd(o *object, rule endRule, kind, id string, nk NodeKind) {
	for _, k := range rule.kinds {
		if k == nk {
			return
		}
	}
	names := make([]string, len(rule.kinds))
	for i, k := range rule.kinds {
		names[i] = string(k)
	}
	at := o.values[rule.key]
	if at == nil {
		at = o.node
	}
	r.addf(at, o.field(rule.key), "%q is %s node, but %s of a %s link must be %s", id, withArticle(string(nk)), rule.role, kind, orList(names))
	r.broken = true
}

// orList joins words as "a", "a or b", "a, b or c".
func orList(words []string) string {
	if len(words) < 2 {
		return strings.Join(words, "")
	}
	return strings.Join(words[:len(words)-1], ", ") + " or " + words[len(words)-1]
}

// endpoint reads a link end and checks that it names a node.
func (r *reader) endpoint(o *object, key, def string, ids map[string]nodeRef, names []string) string {
	id, ok := o.str(key)
	if !ok {
		if o.has(key) {
			return ""
		}
		if def != "" {
			return def
		}
		o.missing(key, "the id of a node or component")
		r.broken = true
		return ""
	}
	if _, known := ids[id]; !known {
		r.addf(o.values[key], o.field(key), "unknown node %q%s", id, suggest(id, names))
		r.broken = true
		return ""
	}
	if ids[id].kind == Plate {
		r.addf(o.values[key], o.field(key), "%q is a plate, which links do not join: join it to nodes through the plate's faces: list", id)
		r.broken = true
		return ""
	}
	return id
}

func itoa(i int) string { return strconv.Itoa(i) }
