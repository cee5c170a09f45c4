package network

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// Override changes one value of a model before it is read, as if the
// file said so: Path names the item and its key, Value is written as in
// the file, units and all.
//
// Paths:
//
//	ambient.temperature, ambient.altitude, ambient.pressure
//	required_margin
//	nodes.ID.KEY        e.g. nodes.cpu-top.power
//	components.ID.KEY   e.g. components.soc.r_jc
//	links.ID.KEY        e.g. links.fins.flow (a link without an id is FROM--TO)
//	materials.NAME.KEY  a material the model file defines
//
// Since ids may hold dots, KEY is what follows the last dot. The value is
// put into the model's YAML tree in place of the key's value (or added,
// when the item does not give the key; a key brought in by a merge key is
// overridden for this item only), so it is checked exactly as a value in
// the file; problems with it name the override instead of a line. Setting
// one of two keys that exclude each other (altitude and pressure, flow and
// mass_flow, resistance and conductance, ...) removes the other one.
type Override struct {
	Path  string
	Value string
}

// String writes the override as on the command line, PATH=VALUE.
func (o Override) String() string { return o.Path + "=" + o.Value }

// ParseOverride reads "PATH=VALUE".
func ParseOverride(s string) (Override, error) {
	path, value, ok := strings.Cut(s, "=")
	path, value = strings.TrimSpace(path), strings.TrimSpace(value)
	if !ok || path == "" || value == "" {
		return Override{}, fmt.Errorf("--set %q: expected PATH=VALUE, e.g. ambient.temperature=45degC or nodes.cpu.power=7W", s)
	}
	return Override{Path: path, Value: value}, nil
}

// ParseOverrides reads several "PATH=VALUE" texts.
func ParseOverrides(list []string) ([]Override, error) {
	out := make([]Override, 0, len(list))
	for _, s := range list {
		o, err := ParseOverride(s)
		if err != nil {
			return nil, err
		}
		out = append(out, o)
	}
	return out, nil
}

// ReadFileWith reads and checks a model file with overrides applied.
func ReadFileWith(path string, ovs []Override) (*Model, error) {
	data, msg := readLimited(path, MaxFileSize)
	if msg != "" {
		return nil, Problems{{File: path, Message: msg}}
	}
	return ParseWith(path, data, ovs)
}

// LoadWith reads, checks and assembles a model file with overrides.
func LoadWith(path string, ovs []Override) (*Network, error) {
	m, err := ReadFileWith(path, ovs)
	if err != nil {
		return nil, err
	}
	return Build(m)
}

// ParseWith reads a model from data with overrides applied; file names it
// in messages. A variant (a file with base:, see parseVariant) is read
// as its base with its changes.
func ParseWith(file string, data []byte, ovs []Override) (*Model, error) {
	if isVariant(data) {
		return parseVariant(file, data, ovs)
	}
	if len(ovs) == 0 {
		return Parse(file, data)
	}
	var refused Problems
	hook := func(doc *yaml.Node) {
		root := docRoot(doc)
		if root == nil {
			return
		}
		for i, o := range ovs {
			if msg := applyOverride(root, o, -(i + 1)); msg != "" {
				refused = append(refused, Problem{File: "--set " + o.Path, Message: msg})
			}
		}
	}
	m, err := parseHooked(file, data, hook)
	if len(refused) > 0 {
		if ps, ok := err.(Problems); ok {
			refused = append(refused, relabel(ps, ovs)...)
		}
		return nil, refused
	}
	if err != nil {
		if ps, ok := err.(Problems); ok {
			return nil, relabel(ps, ovs)
		}
		return nil, err
	}
	return m, nil
}

// relabel names the override behind each problem found in an overridden
// value (whose nodes carry the line -(i+1)), and puts them first.
func relabel(ps Problems, ovs []Override) Problems {
	out := make(Problems, 0, len(ps))
	var rest Problems
	for _, p := range ps {
		if p.Line < 0 && -p.Line <= len(ovs) {
			p.File, p.Line, p.Field = "--set "+ovs[-p.Line-1].Path, 0, ""
			out = append(out, p)
			continue
		}
		rest = append(rest, p)
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].File < out[j].File })
	return append(out, rest...)
}

func docRoot(doc *yaml.Node) *yaml.Node {
	if doc == nil || len(doc.Content) == 0 {
		return nil
	}
	n := deref(doc.Content[0])
	if n.Kind != yaml.MappingNode {
		return nil
	}
	return n
}

// exclusive lists keys that exclude each other: setting one removes the
// others from the item.
var exclusive = [][]string{
	{"pressure", "altitude"},
	{"flow", "mass_flow"},
	{"resistance", "conductance", "specific_resistance"},
	{"material", "conductivity"},
	{"thickness", "length"},
}

// sections are the lists of items an override may address, with the key
// that names their items.
var sections = map[string]string{"nodes": "id", "components": "id", "links": "id", "materials": "name", "plates": "id"}

// applyOverride puts o into the model's top mapping; line marks the new
// nodes. It returns a message when the path names nothing.
func applyOverride(root *yaml.Node, o Override, line int) string {
	top := []string{"ambient", "required_margin", "title", "nodes", "components", "links", "materials", "plates"}
	section, rest, hasRest := strings.Cut(o.Path, ".")
	switch section {
	case "required_margin", "title":
		if hasRest {
			return fmt.Sprintf("%s is a single value; use --set %s=VALUE", section, section)
		}
		setKey(root, section, o.Value, line)
		return ""
	case "ambient":
		if !hasRest {
			return fmt.Sprintf("name the value: ambient.KEY, one of %s", strings.Join(prefixed("ambient.", ambientKeys), ", "))
		}
		if !contains(ambientKeys, rest) {
			return fmt.Sprintf("unknown key %q%s (ambient takes: %s)", rest, suggest(rest, ambientKeys), strings.Join(ambientKeys, ", "))
		}
		amb := lookup(root, "ambient")
		if amb == nil || amb.Kind != yaml.MappingNode {
			amb = &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map", Line: line}
			setNode(root, "ambient", amb, line)
		}
		removeExcluded(amb, rest)
		setKey(amb, rest, o.Value, line)
		return ""
	}
	idKey, ok := sections[section]
	if !ok {
		return fmt.Sprintf("unknown part of the model %q%s (a path starts with one of %s)", section, suggest(section, top), strings.Join(top, ", "))
	}
	dot := strings.LastIndex(rest, ".")
	if !hasRest || dot <= 0 || dot == len(rest)-1 {
		return fmt.Sprintf("expected %s.ID.KEY, e.g. %s", section, pathExample(section))
	}
	id, key := rest[:dot], rest[dot+1:]
	var within string // a plate's faces.N, heat.N, layers.N or board
	if section == "plates" {
		if pid, sub, ok := strings.Cut(id, "."); ok {
			id, within = pid, sub
		}
	}
	items := itemsOf(root, section)
	ids := make([]string, 0, len(items))
	var item *yaml.Node
	for _, it := range items {
		ids = append(ids, it.id)
		if it.id == id {
			item = it.node
		}
	}
	if item == nil {
		what := strings.TrimSuffix(section, "s")
		if len(ids) == 0 {
			return fmt.Sprintf("the model has no %s", section)
		}
		return fmt.Sprintf("no %s %q%s (%s: %s)", what, id, suggest(id, ids), section, strings.Join(ids, ", "))
	}
	valid, what := keysOf(section, item)
	if within != "" {
		var msg string
		if item, valid, what, msg = plateWithin(item, within); msg != "" {
			return msg
		}
	}
	if key == idKey && within == "" {
		return fmt.Sprintf("%s names the item and cannot be set", idKey)
	}
	if valid != nil && !contains(valid, key) {
		return fmt.Sprintf("unknown key %q%s (%s takes: %s)", key, suggest(key, valid), what, strings.Join(valid, ", "))
	}
	removeExcluded(item, key)
	setKey(item, key, o.Value, line)
	return ""
}

// removeExcluded takes out of mapping n the keys that key excludes.
func removeExcluded(n *yaml.Node, key string) {
	for _, group := range exclusive {
		if contains(group, key) {
			for _, other := range group {
				if other != key {
					removeKey(n, other)
				}
			}
		}
	}
}

func pathExample(section string) string {
	switch section {
	case "components":
		return "components.soc.r_jc=0.5K/W"
	case "links":
		return "links.fins.flow=20CFM"
	case "materials":
		return "materials.pad-5w.conductivity=3W/m/K"
	}
	return "nodes.cpu.power=7W"
}

// item is one entry of a section with its id.
type item struct {
	id   string
	node *yaml.Node
}

// itemsOf returns the entries of a section that have a usable id, named as
// the reader names them (a link without an id is FROM--TO, #2 ... for
// repeats).
func itemsOf(root *yaml.Node, section string) []item {
	list := lookup(root, section)
	if list == nil || list.Kind != yaml.SequenceNode {
		return nil
	}
	idKey := sections[section]
	var out []item
	seen := map[string]int{}
	for _, n := range list.Content {
		n = deref(n)
		if n.Kind != yaml.MappingNode {
			continue
		}
		id := scalar(lookup(n, idKey))
		if id == "" && section == "links" {
			from, to := scalar(lookup(n, "from")), scalar(lookup(n, "to"))
			if to == "" {
				if k := findLinkKind(scalar(lookup(n, "kind"))); k != nil {
					to = k.defaultTo
				}
			}
			if from == "" || to == "" {
				continue
			}
			id = from + "--" + to
			for k := 2; seen[id] != 0; k++ {
				id = fmt.Sprintf("%s--%s#%d", from, to, k)
			}
		}
		if id == "" {
			continue
		}
		seen[id]++
		out = append(out, item{id, n})
	}
	return out
}

// keysOf returns the keys an item takes and how messages name it (nil when
// its kind is not known, so that the reader reports that).
func keysOf(section string, n *yaml.Node) ([]string, string) {
	switch section {
	case "nodes":
		switch NodeKind(scalar(lookup(n, "kind"))) {
		case Solid, "":
			return append(append([]string{}, solidKeys...), capacityKeys...), "a solid node"
		case Air:
			return append(append([]string{}, airKeys...), airCapacityKeys...), "an air node"
		case Fixed:
			return fixedKeys, "a fixed node"
		}
	case "components":
		return append(append([]string{}, componentKeys...), capacityKeys...), "a component"
	case "links":
		kind := scalar(lookup(n, "kind"))
		if k := findLinkKind(kind); k != nil {
			return append(append([]string{}, commonLinkKeys...), k.keyNames()...), "a " + kind + " link"
		}
	case "materials":
		return materialKeys, "a material"
	case "plates":
		if lookup(n, "layers") != nil {
			return plateKeys, "a plate"
		}
		return append(append([]string{}, plateKeys...), layerKeys...), "a plate"
	}
	return nil, ""
}

// plateWithin finds the part of a plate that an override's path names
// within it: faces.N, heat.N, layers.N (counted from 0) or board.
func plateWithin(plate *yaml.Node, within string) (*yaml.Node, []string, string, string) {
	list, index, hasIndex := strings.Cut(within, ".")
	if !hasIndex {
		if within != "board" {
			return nil, nil, "", fmt.Sprintf("within a plate, name faces.N, heat.N, layers.N or board, e.g. plates.board.faces.0.h=8W/(m2K); got %q", within)
		}
		b := lookup(plate, "board")
		if b == nil || b.Kind != yaml.MappingNode {
			return nil, nil, "", "the plate has no board: mapping"
		}
		return b, boardKeys, "a printed board", ""
	}
	keys := map[string][]string{"faces": plateFaceKeys, "heat": plateHeatKeys, "layers": layerKeys}
	valid, ok := keys[list]
	if !ok {
		return nil, nil, "", fmt.Sprintf("within a plate, name faces.N, heat.N, layers.N or board; got %q", list)
	}
	seq := lookup(plate, list)
	if seq == nil || seq.Kind != yaml.SequenceNode {
		return nil, nil, "", fmt.Sprintf("the plate has no %s: list", list)
	}
	k, err := strconv.Atoi(index)
	if err != nil || k < 0 || k >= len(seq.Content) {
		return nil, nil, "", fmt.Sprintf("%s.%s: the plate's %s are numbered 0 to %d", list, index, list, len(seq.Content)-1)
	}
	n := deref(seq.Content[k])
	if n.Kind != yaml.MappingNode {
		return nil, nil, "", fmt.Sprintf("%s.%d is not a mapping", list, k)
	}
	return n, valid, "a plate's " + strings.TrimSuffix(list, "s") + " entry", ""
}

// lookup returns the value of key in mapping n, also through merge keys
// (the mapping's own keys first, then the merged ones in order), aliases
// followed; nil when absent.
func lookup(n *yaml.Node, key string) *yaml.Node {
	return lookupSeen(deref(n), key, map[*yaml.Node]bool{})
}

func lookupSeen(n *yaml.Node, key string, seen map[*yaml.Node]bool) *yaml.Node {
	if n == nil || n.Kind != yaml.MappingNode || seen[n] {
		return nil
	}
	seen[n] = true
	var merges []*yaml.Node
	for i := 0; i+1 < len(n.Content); i += 2 {
		k := n.Content[i]
		if isMergeKey(k) {
			merges = append(merges, deref(n.Content[i+1]))
			continue
		}
		if k.Kind == yaml.ScalarNode && k.Value == key {
			return deref(n.Content[i+1])
		}
	}
	for _, m := range merges {
		list := []*yaml.Node{m}
		if m.Kind == yaml.SequenceNode {
			list = m.Content
		}
		for _, x := range list {
			if v := lookupSeen(deref(x), key, seen); v != nil {
				return v
			}
		}
	}
	return nil
}

func scalar(n *yaml.Node) string {
	if n == nil || n.Kind != yaml.ScalarNode {
		return ""
	}
	return n.Value
}

// setKey gives key the scalar value in mapping n itself.
func setKey(n *yaml.Node, key, value string, line int) {
	setNode(n, key, &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: value, Line: line}, line)
}

func setNode(n *yaml.Node, key string, v *yaml.Node, line int) {
	for i := 0; i+1 < len(n.Content); i += 2 {
		k := n.Content[i]
		if !isMergeKey(k) && k.Kind == yaml.ScalarNode && k.Value == key {
			n.Content[i+1] = v
			return
		}
	}
	n.Content = append(n.Content, &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: key, Line: line}, v)
}

// removeKey takes key out of mapping n itself.
func removeKey(n *yaml.Node, key string) {
	for i := 0; i+1 < len(n.Content); i += 2 {
		k := n.Content[i]
		if !isMergeKey(k) && k.Kind == yaml.ScalarNode && k.Value == key {
			n.Content = append(n.Content[:i], n.Content[i+2:]...)
			return
		}
	}
}

func contains(list []string, s string) bool {
	for _, v := range list {
		if v == s {
			return true
		}
	}
	return false
}

func prefixed(p string, list []string) []string {
	out := make([]string, len(list))
	for i, s := range list {
		out[i] = p + s
	}
	return out
}

// Parameter is a number of a model that overrides can address: heat
// inputs, given temperatures, resistances, link geometry and
// coefficients, flows, the ambient, and the limits.
type Parameter struct {
	Path string // as for an Override
	// Also lists further paths whose value is the same YAML value (one
	// anchor, several aliases): they change together.
	Also  []string
	Kind  units.Kind // its dimension
	Value float64    // SI
	Text  string     // as written
	// Verdict marks a value that only judges the temperatures (a limit,
	// the required margin): the temperatures do not depend on it.
	Verdict bool
}

// Format writes an SI value of the parameter's kind as an override value.
func (p Parameter) Format(v float64) string {
	s := strconv.FormatFloat(v, 'g', -1, 64)
	if u := p.Kind.SIUnit(); u != "" {
		s += " " + u
	}
	return s
}

// Overrides returns the overrides that set the parameter (every path that
// shares its value) to the SI value v.
func (p Parameter) Overrides(v float64) []Override {
	text := p.Format(v)
	out := []Override{{p.Path, text}}
	for _, a := range p.Also {
		out = append(out, Override{a, text})
	}
	return out
}

// Parameters lists the numeric values of a model file (a valid one: run
// ParseWith first) with the overrides ovs applied, in file order. Values
// given through one anchor form one parameter. Heat capacities, counts and
// words are left out.
func Parameters(file string, data []byte, ovs []Override) []Parameter {
	root := treeOf(file, data, ovs)
	if root == nil {
		return nil
	}
	var out []Parameter
	at := map[*yaml.Node]int{}
	add := func(path string, v *yaml.Node, kind units.Kind, verdict bool) {
		s := scalar(v)
		if s == "" {
			return
		}
		if i, ok := at[v]; ok && out[i].Kind == kind {
			out[i].Also = append(out[i].Also, path)
			return
		}
		x, err := units.Parse(s, kind)
		if err != nil {
			return
		}
		at[v] = len(out)
		out = append(out, Parameter{Path: path, Kind: kind, Value: x, Text: s, Verdict: verdict})
	}
	if amb := lookup(root, "ambient"); amb != nil {
		add("ambient.temperature", lookup(amb, "temperature"), units.Temperature, false)
		add("ambient.altitude", lookup(amb, "altitude"), units.Length, false)
		add("ambient.pressure", lookup(amb, "pressure"), units.Pressure, false)
	}
	add("required_margin", lookup(root, "required_margin"), units.TemperatureDifference, true)
	for _, it := range itemsOf(root, "materials") {
		add("materials."+it.id+".conductivity", lookup(it.node, "conductivity"), units.Conductivity, false)
	}
	for _, it := range itemsOf(root, "nodes") {
		switch NodeKind(scalar(lookup(it.node, "kind"))) {
		case Solid, "":
			add("nodes."+it.id+".power", lookup(it.node, "power"), units.Power, false)
			add("nodes."+it.id+".limit", lookup(it.node, "limit"), units.Temperature, true)
		case Air:
			add("nodes."+it.id+".limit", lookup(it.node, "limit"), units.Temperature, true)
		case Fixed:
			add("nodes."+it.id+".temperature", lookup(it.node, "temperature"), units.Temperature, false)
		}
	}
	for _, it := range itemsOf(root, "components") {
		add("components."+it.id+".power", lookup(it.node, "power"), units.Power, false)
		add("components."+it.id+".r_jc", lookup(it.node, "r_jc"), units.ThermalResistance, false)
		add("components."+it.id+".r_jb", lookup(it.node, "r_jb"), units.ThermalResistance, false)
		add("components."+it.id+".limit", lookup(it.node, "limit"), units.Temperature, true)
	}
	for _, it := range itemsOf(root, "plates") {
		pre := "plates." + it.id + "."
		add(pre+"limit", lookup(it.node, "limit"), units.Temperature, true)
		add(pre+"thickness", lookup(it.node, "thickness"), units.Length, false)
		add(pre+"conductivity", lookup(it.node, "conductivity"), units.Conductivity, false)
		add(pre+"through_conductivity", lookup(it.node, "through_conductivity"), units.Conductivity, false)
		if b := lookup(it.node, "board"); b != nil {
			add(pre+"board.thickness", lookup(b, "thickness"), units.Length, false)
		}
		if seq := lookup(it.node, "faces"); seq != nil && seq.Kind == yaml.SequenceNode {
			for k, f := range seq.Content {
				fp := fmt.Sprintf("%sfaces.%d.", pre, k)
				add(fp+"h", lookup(f, "h"), units.HeatTransferCoefficient, false)
				add(fp+"contact", lookup(f, "contact"), units.SpecificResistance, false)
				add(fp+"resistance", lookup(f, "resistance"), units.ThermalResistance, false)
				add(fp+"conductance", lookup(f, "conductance"), units.Conductance, false)
				add(fp+"emissivity", lookup(f, "emissivity"), units.Dimensionless, false)
			}
		}
		if seq := lookup(it.node, "heat"); seq != nil && seq.Kind == yaml.SequenceNode {
			for k, h := range seq.Content {
				add(fmt.Sprintf("%sheat.%d.power", pre, k), lookup(h, "power"), units.Power, false)
			}
		}
	}
	for _, it := range itemsOf(root, "links") {
		k := findLinkKind(scalar(lookup(it.node, "kind")))
		if k == nil {
			continue
		}
		for _, key := range k.keys {
			if key.what != "" {
				continue
			}
			add("links."+it.id+"."+key.name, lookup(it.node, key.name), key.dim, false)
		}
	}
	return out
}

// treeOf returns the top mapping of a model file (file, data), or of a
// variant's base with its changes, with the overrides ovs applied; nil
// when it cannot be read.
func treeOf(file string, data []byte, ovs []Override) *yaml.Node {
	var root *yaml.Node
	if isVariant(data) {
		v, ps := prepareVariant(file, data, ovs)
		if ps != nil {
			return nil
		}
		return v.tree()
	}
	docs, err := decodeAll(data)
	if err != nil || len(docs) == 0 {
		return nil
	}
	if root = docRoot(docs[0]); root == nil {
		return nil
	}
	for i, o := range ovs {
		applyOverride(root, o, -(i + 1))
	}
	return root
}

// ParameterAt returns the parameter at path of a model file with the
// overrides ovs. A value the file does not give but could (the ambient's
// altitude or pressure, a solid node's or component's power) is returned
// with its default; ok is false when path names no numeric value.
func ParameterAt(file string, data []byte, ovs []Override, path string) (Parameter, bool) {
	for _, p := range Parameters(file, data, ovs) {
		if p.Path == path || contains(p.Also, path) {
			return p, true
		}
	}
	switch {
	case path == "ambient.altitude":
		return Parameter{Path: path, Kind: units.Length}, true
	case path == "ambient.pressure":
		return Parameter{Path: path, Kind: units.Pressure, Value: 101325}, true
	case path == "required_margin":
		return Parameter{Path: path, Kind: units.TemperatureDifference, Verdict: true}, true
	case strings.HasSuffix(path, ".power") && (strings.HasPrefix(path, "nodes.") || strings.HasPrefix(path, "components.")):
		section, rest, _ := strings.Cut(strings.TrimSuffix(path, ".power"), ".")
		if root := treeOf(file, data, ovs); root != nil {
			for _, it := range itemsOf(root, section) {
				if it.id == rest {
					return Parameter{Path: path, Kind: units.Power}, true
				}
			}
		}
	case strings.HasPrefix(path, "links."):
		// A key of the link's kind that the file does not give (a
		// conductance where it gives a resistance).
		rest := strings.TrimPrefix(path, "links.")
		dot := strings.LastIndex(rest, ".")
		root := treeOf(file, data, ovs)
		if dot <= 0 || root == nil {
			break
		}
		for _, it := range itemsOf(root, "links") {
			if it.id != rest[:dot] {
				continue
			}
			if k := findLinkKind(scalar(lookup(it.node, "kind"))); k != nil {
				for _, key := range k.keys {
					if key.name == rest[dot+1:] && key.what == "" {
						return Parameter{Path: path, Kind: key.dim}, true
					}
				}
			}
		}
	}
	return Parameter{}, false
}
