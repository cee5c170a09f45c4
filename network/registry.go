package network

import (
	"sort"
	"strings"

	"github.com/heatgraph/heatgraph/units"
)

// A link kind registers itself from its own file (kind_<name>.go) with
// registerLinkKind, in an init function: its name, what it models, its
// keys with their dimensions, the nodes its ends may join, the published
// sources of its physics, an example, and the function that reads its
// values. Nothing outside that file names the kind: the model reader, the
// help (heatgraph kinds) and the documentation all come from here.
var registry []linkKind

// registerLinkKind adds a kind; order places it in listings.
func registerLinkKind(k linkKind) {
	for _, old := range registry {
		if old.name == k.name {
			panic("network: link kind " + k.name + " registered twice")
		}
	}
	registry = append(registry, k)
	sort.SliceStable(registry, func(a, b int) bool { return registry[a].order < registry[b].order })
}

// keySpec describes one key of a link kind.
type keySpec struct {
	name string
	dim  units.Kind // the quantity's dimension, when what is ""
	what string     // for values that are not quantities: "word", "count", "flag", "node", "material"
	need string     // "required", "optional", or a condition, e.g. "with fin_count"
	def  string     // the default, when optional
	help string
}

// KeyDoc describes one key of a link kind, for help texts.
type KeyDoc struct {
	Name    string
	Value   string // what the value is: a dimension with its SI unit, or "word", "count", ...
	Need    string // required, optional, or when
	Default string
	Help    string
}

// EndDoc describes one end of a link kind.
type EndDoc struct {
	Key     string   // from, to, inlet ...
	Role    string   // what the node is to the link
	Kinds   []string // the node kinds allowed
	Default string   // the node used when the key is absent
}

// KindDoc describes a link kind for help texts and documentation.
type KindDoc struct {
	Name    string
	Summary string // one line
	Doc     string // what it models and how, a paragraph
	Sources []string
	Ends    []EndDoc
	Keys    []KeyDoc
	Example string // a YAML list item
}

// LinkKinds describes every link kind, in the order the documentation
// presents them.
func LinkKinds() []KindDoc {
	out := make([]KindDoc, len(registry))
	for i := range registry {
		out[i] = registry[i].doc()
	}
	return out
}

// LinkKind describes the kind called name.
func LinkKind(name string) (KindDoc, bool) {
	if k := findLinkKind(name); k != nil {
		return k.doc(), true
	}
	return KindDoc{}, false
}

// LinkKindNames returns the names of every link kind.
func LinkKindNames() []string { return linkKindNames() }

func (k *linkKind) doc() KindDoc {
	d := KindDoc{Name: k.name, Summary: k.summary, Doc: k.help, Sources: k.sources, Example: k.example}
	ends := k.ends
	if len(ends) == 0 {
		ends = []endRule{{"from", "one end", nil}, {"to", "the other end", nil}}
	}
	for _, e := range ends {
		ed := EndDoc{Key: e.key, Role: e.role}
		for _, nk := range e.kinds {
			ed.Kinds = append(ed.Kinds, string(nk))
		}
		if len(ed.Kinds) == 0 {
			ed.Kinds = []string{"any"}
		}
		if e.key == "to" {
			ed.Default = k.defaultTo
		}
		d.Ends = append(d.Ends, ed)
	}
	for _, key := range k.keys {
		kd := KeyDoc{Name: key.name, Need: key.need, Default: key.def, Help: key.help}
		if key.what != "" {
			kd.Value = key.what
		} else {
			kd.Value = key.dim.String() + " (" + key.dim.SIUnit() + ")"
		}
		if kd.Need == "" {
			kd.Need = "optional"
		}
		d.Keys = append(d.Keys, kd)
	}
	return d
}

// keyNames returns the names of the kind's own keys.
func (k *linkKind) keyNames() []string {
	out := make([]string, len(k.keys))
	for i, key := range k.keys {
		out[i] = key.name
	}
	return out
}

func findLinkKind(name string) *linkKind {
	for i := range registry {
		if registry[i].name == name {
			return &registry[i]
		}
	}
	return nil
}

func linkKindNames() []string {
	out := make([]string, len(registry))
	for i, k := range registry {
		out[i] = k.name
	}
	return out
}

// KindInfo describes a link kind in one line for listings.
type KindInfo struct {
	Name    string
	Keys    string // the kind's own keys, comma-separated
	Summary string
}

// LinkKindInfo describes every link kind in one line each, in the order
// the documentation presents them.
func LinkKindInfo() []KindInfo {
	out := make([]KindInfo, len(registry))
	for i := range registry {
		out[i] = KindInfo{Name: registry[i].name, Keys: strings.Join(registry[i].keyNames(), ", "), Summary: registry[i].summary}
	}
	return out
}
