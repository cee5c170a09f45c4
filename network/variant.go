package network

import (
	"bytes"
	"fmt"
	"path/filepath"
	"sort"
	"strings"

	"gopkg.in/yaml.v3"
)

// A variant is a model file that starts from another:
//
//	base: controller.yaml          # a model file, relative to this one
//	title: Controller, 7 W processor
//	set:                           # values by the paths of overrides
//	  components.cpu.power: 7 W
//	  ambient.altitude: 3000 m
//	remove: [links.lid-glow, nodes.shield]
//	add:                           # entries appended to the base's lists
//	  links:
//	    - {id: fan, kind: stream, from: ambient, to: inside-air, flow: 5 CFM}
//
// The base is read through its YAML tree with the changes made to it (in
// the order remove, add, set), so it is checked as one model; problems in
// what the variant adds or sets are reported at the variant's lines. A
// base may not itself be a variant.
var variantKeys = []string{"base", "title", "set", "remove", "add", "note"}

// variantLine marks a node of a variant file in the base's tree: its Line
// becomes -(variantLine + line).
const variantLine = 1 << 30

// isVariant reports whether data is a variant (its top level has base:).
func isVariant(data []byte) bool {
	if !bytes.Contains(data, []byte("base")) {
		return false // the common case, without decoding the file twice
	}
	var doc yaml.Node
	if yaml.Unmarshal(data, &doc) != nil {
		return false
	}
	root := docRoot(&doc)
	return root != nil && lookup(root, "base") != nil
}

// parseVariant reads the variant file (data) with the overrides ovs.
func parseVariant(file string, data []byte, ovs []Override) (*Model, error) {
	v, ps := prepareVariant(file, data, ovs)
	if ps != nil {
		return nil, ps
	}
	m, err := parseHooked(v.basePath, v.baseData, v.hook)
	if len(v.refused) > 0 {
		return nil, v.refused
	}
	if err != nil {
		if ps, ok := err.(Problems); ok {
			ps = relabel(ps, ovs)
			for i := range ps {
				if ps[i].Line <= -variantLine {
					ps[i].File, ps[i].Line = file, -ps[i].Line-variantLine
				}
			}
			sort.SliceStable(ps, func(a, b int) bool { return ps[a].File == file && ps[b].File != file })
			return nil, ps
		}
		return nil, err
	}
	m.File = file
	return m, nil
}

// variant is a variant file ready to be applied to its base's tree.
type variant struct {
	basePath string
	baseData []byte
	hook     func(doc *yaml.Node)
	refused  Problems
}

// tree returns the base's YAML tree with the variant's changes, or nil.
func (v *variant) tree() *yaml.Node {
	docs, err := decodeAll(v.baseData)
	if err != nil || len(docs) == 0 {
		return nil
	}
	v.hook(docs[0])
	return docRoot(docs[0])
}

// prepareVariant reads a variant file's changes.
func prepareVariant(file string, data []byte, ovs []Override) (*variant, Problems) {
	var doc yaml.Node
	if err := yaml.Unmarshal(data, &doc); err != nil {
		return nil, Problems{{File: file, Field: "syntax", Message: yamlErrorText(err)}}
	}
	root := docRoot(&doc)
	var ps Problems
	at := func(n *yaml.Node, field, format string, args ...any) {
		ps = append(ps, Problem{File: file, Line: n.Line, Field: field, Message: fmt.Sprintf(format, args...)})
	}
	for i := 0; i+1 < len(root.Content); i += 2 {
		if k := root.Content[i].Value; !contains(variantKeys, k) {
			at(root.Content[i], k, "unknown key%s (a variant takes: %s)", suggest(k, variantKeys), strings.Join(variantKeys, ", "))
		}
	}
	baseName := scalar(lookup(root, "base"))
	if baseName == "" {
		at(root, "base", "expected the path of the base model file")
		return nil, ps
	}
	v := &variant{}
	basePath := baseName
	if !filepath.IsAbs(basePath) {
		basePath = filepath.Join(filepath.Dir(file), basePath)
	}
	baseData, msg := readLimited(basePath, MaxFileSize)
	if msg != "" {
		at(lookup(root, "base"), "base", "%s: %s", basePath, msg)
		return nil, ps
	}
	if isVariant(baseData) {
		at(lookup(root, "base"), "base", "%s is itself a variant; a variant's base must be a model file", basePath)
		return nil, ps
	}
	var removes []*yaml.Node
	if r := lookup(root, "remove"); r != nil {
		if r.Kind != yaml.SequenceNode {
			at(r, "remove", "expected a list of items, e.g. [links.lid-glow, nodes.shield]")
		} else {
			removes = r.Content
		}
	}
	add := lookup(root, "add")
	if add != nil && add.Kind != yaml.MappingNode {
		at(add, "add", "expected a mapping of lists, e.g. {links: [...], nodes: [...]}")
		add = nil
	}
	var sets []Override
	var setLines []int
	if s := lookup(root, "set"); s != nil {
		if s.Kind != yaml.MappingNode {
			at(s, "set", "expected a mapping of paths to values, e.g. {components.cpu.power: 7 W}")
		} else {
			for i := 0; i+1 < len(s.Content); i += 2 {
				sets = append(sets, Override{Path: s.Content[i].Value, Value: s.Content[i+1].Value})
				setLines = append(setLines, s.Content[i+1].Line)
			}
		}
	}
	if len(ps) > 0 {
		return nil, ps
	}
	v.basePath, v.baseData = basePath, baseData
	v.hook = func(d *yaml.Node) {
		refused := &v.refused
		*refused = nil
		base := docRoot(d)
		if base == nil {
			return
		}
		for _, r := range removes {
			if msg := removeItem(base, scalar(r)); msg != "" {
				*refused = append(*refused, Problem{File: file, Line: r.Line, Field: "remove", Message: msg})
			}
		}
		if add != nil {
			for i := 0; i+1 < len(add.Content); i += 2 {
				k, v := add.Content[i], add.Content[i+1]
				if _, ok := sections[k.Value]; !ok {
					*refused = append(*refused, Problem{File: file, Line: k.Line, Field: "add." + k.Value, Message: "items can be added to nodes, components, links and materials"})
					continue
				}
				if v.Kind != yaml.SequenceNode {
					*refused = append(*refused, Problem{File: file, Line: v.Line, Field: "add." + k.Value, Message: "expected a list of entries"})
					continue
				}
				mark(v)
				list := lookup(base, k.Value)
				if list == nil || list.Kind != yaml.SequenceNode {
					list = &yaml.Node{Kind: yaml.SequenceNode, Tag: "!!seq"}
					setNode(base, k.Value, list, 0)
				}
				list.Content = append(list.Content, v.Content...)
			}
		}
		if t := lookup(root, "title"); t != nil {
			setKey(base, "title", t.Value, -(variantLine + t.Line))
		}
		for i, o := range sets {
			if msg := applyOverride(base, o, -(variantLine + setLines[i])); msg != "" {
				*refused = append(*refused, Problem{File: file, Line: setLines[i], Field: "set." + o.Path, Message: msg})
			}
		}
		for i, o := range ovs {
			if msg := applyOverride(base, o, -(i + 1)); msg != "" {
				*refused = append(*refused, Problem{File: "--set " + o.Path, Message: msg})
			}
		}
	}
	return v, nil
}

// mark gives every node under n the line that marks it as the variant's.
func mark(n *yaml.Node) {
	if n == nil || n.Line < 0 {
		return
	}
	n.Line = -(variantLine + n.Line)
	for _, c := range n.Content {
		mark(c)
	}
}

// removeItem takes the item "section.id" out of its list.
func removeItem(root *yaml.Node, path string) string {
	section, id, ok := strings.Cut(path, ".")
	if _, known := sections[section]; !ok || !known {
		return fmt.Sprintf("%q: expected SECTION.ID with a section of nodes, components, links, materials", path)
	}
	list := lookup(root, section)
	items := itemsOf(root, section)
	var ids []string
	for _, it := range items {
		ids = append(ids, it.id)
		if it.id != id {
			continue
		}
		for i, n := range list.Content {
			if deref(n) == it.node {
				list.Content = append(list.Content[:i], list.Content[i+1:]...)
				return ""
			}
		}
	}
	return fmt.Sprintf("the base has no %s %q%s (%s: %s)", strings.TrimSuffix(section, "s"), id, suggest(id, ids), section, strings.Join(ids, ", "))
}
