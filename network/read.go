package network

import (
	"fmt"
	"math"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// reader collects the problems found while reading one model file.
type reader struct {
	file     string
	problems Problems
	// broken is set when a problem changes which nodes are joined (an
	// unknown node kind, link kind or link end); the check for nodes with
	// no path to a fixed temperature is then skipped, as it would only
	// echo the first problem.
	broken bool
	// budget is how many more keys and list entries the reader may visit.
	// Without aliases a file cannot hold more than its size allows; with
	// them a small file could name the same large value millions of
	// times, so reading stops when the budget runs out.
	budget    int
	exhausted bool
}

// addf records a problem at the line of n (0 when n is nil).
func (r *reader) addf(n *yaml.Node, field, format string, args ...any) {
	line := 0
	if n != nil {
		line = n.Line
	}
	r.problems = append(r.problems, Problem{File: r.file, Line: line, Field: field, Message: fmt.Sprintf(format, args...)})
}

// spend takes n from the budget; it reports false (and the problem, once)
// when the budget is exhausted.
func (r *reader) spend(n int) bool {
	if r.exhausted {
		return false
	}
	r.budget -= n
	if r.budget < 0 {
		r.exhausted = true
		r.broken = true
		r.addf(nil, "", "aliases (*name) and merge keys (<<) repeat values so often that the model would exceed what a file of this size can hold; share fewer values, or write them out")
		return false
	}
	return true
}

// maxProblems is the most problems reported for one file; a file that has
// more is likely not a model at all.
const maxProblems = 200

// finish returns the problems in line order, with long values shortened,
// and at most maxProblems of them.
func (r *reader) finish() Problems {
	ps := r.problems.sorted()
	if len(ps) > maxProblems {
		more := len(ps) - maxProblems
		ps = append(ps[:maxProblems], Problem{File: r.file, Message: fmt.Sprintf("%d more problems not listed (is this a model file?)", more)})
	}
	return ps
}

// deref follows aliases to the value they name.
func deref(n *yaml.Node) *yaml.Node {
	for i := 0; n != nil && n.Kind == yaml.AliasNode && n.Alias != nil && i < 64; i++ {
		n = n.Alias
	}
	return n
}

// object reads one YAML mapping: it hands out values by key, checks their
// types and units, and at the end reports keys nobody asked for.
type object struct {
	r      *reader
	node   *yaml.Node
	path   string
	values map[string]*yaml.Node
	keys   map[string]*yaml.Node
	order  []string
	// misspelt holds the keys that an unknown key was taken to be a
	// misspelling of; their absence is not reported again.
	misspelt map[string]bool
}

// newObject checks that n is a mapping and indexes its keys; duplicate keys
// are reported. Merge keys (<<: *base, or <<: [*a, *b]) bring in the keys
// of other mappings that n does not give itself; where several are merged,
// the first to give a key wins (YAML merge key type, yaml.org/type/merge).
// Merged keys keep the lines where they are written. It returns nil (after
// reporting) when n is not a mapping.
func (r *reader) newObject(n *yaml.Node, path string) *object {
	n = deref(n)
	if n.Kind != yaml.MappingNode {
		r.addf(n, path, "expected a mapping of keys to values, got %s", describe(n))
		return nil
	}
	if !r.spend(len(n.Content)/2 + 1) {
		return nil
	}
	o := &object{r: r, node: n, path: path, values: map[string]*yaml.Node{}, keys: map[string]*yaml.Node{}}
	var merges []*yaml.Node
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], deref(n.Content[i+1])
		if isMergeKey(k) {
			merges = append(merges, v)
			continue
		}
		if k.Kind != yaml.ScalarNode {
			r.addf(k, path, "keys must be plain words, got %s", describe(k))
			continue
		}
		if first, dup := o.keys[k.Value]; dup {
			r.addf(k, o.field(k.Value), "given twice (first on line %d); keep one", first.Line)
			continue
		}
		o.keys[k.Value] = k
		o.values[k.Value] = v
		o.order = append(o.order, k.Value)
	}
	seen := map[*yaml.Node]bool{n: true}
	for _, v := range merges {
		o.merge(v, seen)
	}
	return o
}

// isMergeKey reports whether k is the merge key "<<" (unquoted).
func isMergeKey(k *yaml.Node) bool {
	return k.Kind == yaml.ScalarNode && k.Value == "<<" && k.Style&(yaml.SingleQuotedStyle|yaml.DoubleQuotedStyle) == 0
}

// merge adds the keys of the mapping (or list of mappings) v that o does
// not have yet. seen holds the mappings merged already, which add nothing
// new a second time (and so cannot loop).
func (o *object) merge(v *yaml.Node, seen map[*yaml.Node]bool) {
	v = deref(v)
	switch v.Kind {
	case yaml.SequenceNode:
		for _, item := range v.Content {
			item = deref(item)
			if item.Kind != yaml.MappingNode {
				o.r.addf(item, o.field("<<"), "a merge key takes mappings (e.g. <<: *base, or <<: [*a, *b] where &a and &b name mappings), got %s", describe(item))
				continue
			}
			o.merge(item, seen)
		}
		return
	case yaml.MappingNode:
	default:
		o.r.addf(v, o.field("<<"), "a merge key takes a mapping or a list of mappings (e.g. <<: *base, where &base names a mapping), got %s", describe(v))
		return
	}
	if seen[v] || !o.r.spend(len(v.Content)/2+1) {
		return
	}
	seen[v] = true
	var nested []*yaml.Node
	for i := 0; i+1 < len(v.Content); i += 2 {
		k, val := v.Content[i], deref(v.Content[i+1])
		if isMergeKey(k) {
			nested = append(nested, val)
			continue
		}
		if k.Kind != yaml.ScalarNode {
			continue // reported where the mapping itself is read, if it is
		}
		if _, has := o.keys[k.Value]; has {
			continue
		}
		o.keys[k.Value] = k
		o.values[k.Value] = val
		o.order = append(o.order, k.Value)
	}
	for _, val := range nested {
		o.merge(val, seen)
	}
}

// field returns the path of one key of o.
func (o *object) field(key string) string {
	if o.path == "" {
		return key
	}
	return o.path + "." + key
}

// has reports whether key is present.
func (o *object) has(key string) bool { _, ok := o.values[key]; return ok }

// line returns the line of key's value, or of the object when key is absent.
func (o *object) line(key string) int {
	if v, ok := o.values[key]; ok {
		return v.Line
	}
	return o.node.Line
}

// checkKeys reports every key not in allowed, suggesting the closest
// allowed key.
func (o *object) checkKeys(allowed []string, what string) {
	ok := make(map[string]bool, len(allowed))
	for _, k := range allowed {
		ok[k] = true
	}
	for _, k := range o.order {
		if ok[k] {
			continue
		}
		best := closest(k, allowed)
		hint := ""
		if best != "" {
			hint = fmt.Sprintf(" (did you mean %q?)", best)
			if o.misspelt == nil {
				o.misspelt = map[string]bool{}
			}
			o.misspelt[best] = true
		}
		o.r.addf(o.keys[k], o.field(k), "unknown key%s (%s takes: %s)", hint, what, strings.Join(allowed, ", "))
	}
}

// missing reports a required key that is absent, unless a misspelling of it
// was reported already.
func (o *object) missing(key, hint string) {
	if o.misspelt[key] {
		return
	}
	o.r.addf(o.node, o.field(key), "missing (%s)", hint)
}

// str returns a scalar string value, or ok false (after reporting when the
// value is there but not a scalar).
func (o *object) str(key string) (string, bool) {
	v, ok := o.values[key]
	if !ok {
		return "", false
	}
	if v.Kind != yaml.ScalarNode || v.Tag == "!!null" {
		o.r.addf(v, o.field(key), "expected a single value, got %s", describe(v))
		return "", false
	}
	return v.Value, true
}

var idPattern = regexp.MustCompile(`^[A-Za-z0-9][A-Za-z0-9_.\-]*$`)

// id returns a required identifier.
func (o *object) id(key string) (string, bool) {
	s, ok := o.str(key)
	if !ok {
		if !o.has(key) {
			o.missing(key, "a name made of letters, digits, '_', '-' and '.', e.g. cpu-lid")
		}
		return "", false
	}
	if !idPattern.MatchString(s) {
		o.r.addf(o.values[key], o.field(key), "%q is not a valid name (use letters, digits, '_', '-' and '.', starting with a letter or digit)", s)
		return "", false
	}
	return s, true
}

// quantity returns the SI value of key, read as kind. ok is false when the
// key is absent or its value is invalid (which is reported).
func (o *object) quantity(key string, kind units.Kind) (float64, bool) {
	v, ok := o.values[key]
	if !ok {
		return 0, false
	}
	if v.Kind != yaml.ScalarNode || v.Tag == "!!null" {
		o.r.addf(v, o.field(key), "expected %s such as %q, got %s", withArticle(kind.String()), example(kind), describe(v))
		return 0, false
	}
	x, err := units.Parse(v.Value, kind)
	if err != nil {
		o.r.addf(v, o.field(key), "%s", unitMessage(err))
		return 0, false
	}
	return x, true
}

// required is quantity for a key that must be present.
func (o *object) required(key string, kind units.Kind) (float64, bool) {
	if !o.has(key) {
		o.missing(key, fmt.Sprintf("%s, e.g. %s", withArticle(kind.String()), example(kind)))
		return 0, false
	}
	return o.quantity(key, kind)
}

// positive reads a quantity that must be above zero and, for the kinds in
// sensible, within a range that keeps every value derived from it finite.
func (o *object) positive(key string, kind units.Kind, need bool) (float64, bool) {
	var x float64
	var ok bool
	if need {
		x, ok = o.required(key, kind)
	} else {
		x, ok = o.quantity(key, kind)
	}
	if ok && !(x > 0) {
		o.r.addf(o.values[key], o.field(key), "%q must be greater than zero (%s, e.g. %s)", o.values[key].Value, withArticle(kind.String()), example(kind))
		return 0, false
	}
	if s, has := sensible[kind]; ok && has && (x < s.lo || x > s.hi) {
		o.r.addf(o.values[key], o.field(key), "%q is outside the range a model takes for %s, %s", o.values[key].Value, withArticle(kind.String()), s.text)
		return 0, false
	}
	return x, ok
}

// span is a range of values, with the text that names it in messages.
type span struct {
	lo, hi float64
	text   string
}

// sensible holds, for the kinds of positive quantity, a range wide enough
// for any electronics enclosure and narrow enough that products, quotients
// and reciprocals of the values stay finite (a conductance of 1e-320 W/K
// would make the resistance infinite). The bounds are round numbers chosen
// for that purpose, not physical limits.
var sensible = map[units.Kind]span{
	units.Length:                  {1e-9, 1e4, "1 nm to 10 km"},
	units.Area:                    {1e-12, 1e6, "1e-12 m2 (1 µm2) to 1e6 m2"},
	units.Conductivity:            {1e-5, 1e6, "1e-5 to 1e6 W/m/K"},
	units.ThermalResistance:       {1 / maxConductance, 1 / minConductance, "1e-9 to 1e9 K/W"},
	units.Conductance:             {minConductance, maxConductance, "1e-9 to 1e9 W/K"},
	units.SpecificResistance:      {1e-10, 1, "1e-10 to 1 K*m2/W (1e-6 to 1e4 K*cm2/W)"},
	units.HeatTransferCoefficient: {1e-3, 1e7, "1e-3 to 1e7 W/m2/K"},
	units.Pressure:                {100, 1e7, "100 Pa to 10 MPa"},
	units.VolumeFlow:              {1e-9, 1e3, "1e-9 to 1000 m3/s"},
	units.MassFlow:                {1e-9, 1e3, "1e-9 to 1000 kg/s"},
	units.Velocity:                {1e-4, 1e3, "0.1 mm/s to 1000 m/s"},
	units.Density:                 {1e-3, 1e5, "1e-3 to 1e5 kg/m3"},
	units.SpecificHeat:            {1, 1e5, "1 to 1e5 J/kg/K"},
}

// The range of conductances, given or derived (k·A/L, h·A, A/R″), that a
// linear link may have; its reciprocals bound the resistances.
const (
	minConductance = 1e-9
	maxConductance = 1e9
)

// checkConductance reports a link whose conductance, derived as how (e.g.
// "k·A/L"), falls outside the range a model takes.
func (o *object) checkConductance(g float64, how string) bool {
	if g >= minConductance && g <= maxConductance {
		return true
	}
	o.r.addf(o.node, o.path, "the values give a conductance %s of %.3g W/K (a resistance of %.3g K/W), outside the range a model takes, 1e-9 to 1e9 W/K; check the values and their units", how, g, 1/g)
	return false
}

// Absolute temperatures in a model: the range keeps T⁴ and the air
// properties finite and excludes absolute zero, which a unit slip gives.
const (
	minTemperature = 1     // K
	maxTemperature = 10000 // K
)

// temperature reads an absolute temperature, which must lie between
// minTemperature and maxTemperature.
func (o *object) temperature(key string, need bool) (float64, bool) {
	const valid = "a temperature in a model must lie between 1 K and 10000 K (-272.15 degC to 9726.85 degC)"
	var t float64
	var ok bool
	before := len(o.r.problems)
	if need {
		t, ok = o.required(key, units.Temperature)
	} else {
		t, ok = o.quantity(key, units.Temperature)
	}
	if !ok {
		// A value below absolute zero is refused by units.Parse; add the
		// valid range to its message.
		if len(o.r.problems) > before {
			if p := &o.r.problems[len(o.r.problems)-1]; strings.Contains(p.Message, "below absolute zero") {
				p.Message += "; " + valid
			}
		}
		return 0, false
	}
	var what string
	switch {
	case t <= 0:
		what = "absolute zero"
	case t < minTemperature:
		what = "within 1 K of absolute zero"
	case t > maxTemperature:
		what = "above 10000 K"
	default:
		return t, true
	}
	o.r.addf(o.values[key], o.field(key), "%q is %s; %s, e.g. %s", o.values[key].Value, what, valid, example(units.Temperature))
	return 0, false
}

// maxPower bounds a heat input, W.
const maxPower = 1e6

// power reads a heat input, positive or negative, of at most maxPower.
func (o *object) power(key string, need bool) (float64, bool) {
	var p float64
	var ok bool
	if need {
		p, ok = o.required(key, units.Power)
	} else {
		p, ok = o.quantity(key, units.Power)
	}
	if ok && math.Abs(p) > maxPower {
		o.r.addf(o.values[key], o.field(key), "%q is outside the range a model takes for a heat input, -1 MW to 1 MW", o.values[key].Value)
		return 0, false
	}
	return p, ok
}

// choice reads an optional word that must be one of valid; it returns ""
// when the key is absent, and ok false (after reporting) when the word is
// not valid.
func (o *object) choice(key, what string, valid []string) (string, bool) {
	s, has := o.str(key)
	if !has {
		return "", !o.has(key)
	}
	for _, v := range valid {
		if s == v {
			return s, true
		}
	}
	o.r.addf(o.values[key], o.field(key), "unknown %s %q%s (valid: %s)", what, s, suggest(s, valid), strings.Join(valid, ", "))
	return "", false
}

// flag reads an optional true/false value (false when absent).
func (o *object) flag(key string) (value, ok bool) {
	s, has := o.str(key)
	if !has {
		return false, !o.has(key)
	}
	switch s {
	case "true", "yes":
		return true, true
	case "false", "no":
		return false, true
	}
	o.r.addf(o.values[key], o.field(key), "%q is not true or false", s)
	return false, false
}

// count reads a whole number from least to most.
func (o *object) count(key string, least, most int) (int, bool) {
	s, ok := o.str(key)
	if !ok {
		if !o.has(key) {
			o.missing(key, fmt.Sprintf("a whole number from %d to %d", least, most))
		}
		return 0, false
	}
	n, err := strconv.Atoi(s)
	if err != nil || n < least || n > most {
		o.r.addf(o.values[key], o.field(key), "%q must be a whole number from %d to %d", s, least, most)
		return 0, false
	}
	return n, true
}

// fraction reads a number in (0, 1].
func (o *object) fraction(key string, need bool) (float64, bool) {
	var x float64
	var ok bool
	if need {
		x, ok = o.required(key, units.Dimensionless)
	} else {
		x, ok = o.quantity(key, units.Dimensionless)
	}
	if ok && !(x > 0 && x <= 1) {
		o.r.addf(o.values[key], o.field(key), "%q is outside (0, 1] (a fraction such as 0.85 or 85 %%)", o.values[key].Value)
		return 0, false
	}
	return x, ok
}

// oneOf checks that exactly one of keys is present and returns it ("" after
// reporting otherwise).
func (o *object) oneOf(hint string, keys ...string) string {
	var present []string
	for _, k := range keys {
		if o.has(k) {
			present = append(present, k)
		}
	}
	switch len(present) {
	case 1:
		return present[0]
	case 0:
		for _, k := range keys {
			if o.misspelt[k] {
				return ""
			}
		}
		o.r.addf(o.node, o.path, "needs one of %s (%s)", strings.Join(keys, ", "), hint)
	default:
		o.r.addf(o.values[present[1]], o.field(present[1]), "give only one of %s", strings.Join(present, ", "))
	}
	return ""
}

// list returns the items of a sequence value (aliases followed), or nil
// after reporting when the value is not a sequence.
func (r *reader) list(n *yaml.Node, field, hint string) []*yaml.Node {
	n = deref(n)
	if n.Kind != yaml.SequenceNode {
		if n.Tag == "!!null" {
			return nil
		}
		r.addf(n, field, "expected a list (%s), got %s", hint, describe(n))
		return nil
	}
	if !r.spend(len(n.Content)) {
		return nil
	}
	items := make([]*yaml.Node, len(n.Content))
	for i, item := range n.Content {
		items[i] = deref(item)
	}
	return items
}

// describe names the kind of a YAML node for messages.
func describe(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "a mapping"
	case yaml.SequenceNode:
		return "a list"
	case yaml.AliasNode:
		return "an alias"
	}
	if n.Tag == "!!null" {
		return "nothing"
	}
	return fmt.Sprintf("%q", n.Value)
}

// example gives a valid value of a kind for messages.
func example(k units.Kind) string {
	switch k {
	case units.Length:
		return "1.6 mm"
	case units.Area:
		return "25 mm2"
	case units.Temperature:
		return "35 degC"
	case units.TemperatureDifference:
		return "5 K"
	case units.Power:
		return "12 W"
	case units.Conductivity:
		return "0.3 W/m/K"
	case units.ThermalResistance:
		return "0.8 K/W"
	case units.Conductance:
		return "2 W/K"
	case units.SpecificResistance:
		return "0.5 K*cm2/W"
	case units.HeatTransferCoefficient:
		return "10 W/m2/K"
	case units.Pressure:
		return "101.325 kPa"
	case units.Density:
		return "2700 kg/m3"
	case units.SpecificHeat:
		return "900 J/kg/K"
	case units.Dimensionless:
		return "0.85"
	}
	return "1 " + k.SIUnit()
}

// sortedKeys returns the keys of m in order.
func sortedKeys[V any](m map[string]V) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// withArticle puts "a" or "an" before a noun phrase.
func withArticle(s string) string {
	if s != "" && strings.ContainsRune("aeiou", rune(s[0])) {
		return "an " + s
	}
	return "a " + s
}
