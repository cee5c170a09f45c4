package study

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// Study is a study file as read: the model, the overrides of every point,
// a sweep (a grid of values) and/or Monte Carlo sampling, and what to plot.
type Study struct {
	File      string
	Model     *Model
	Grid      Grid      // nil when the file has no sweep
	Sampling  *Sampling // nil when the file has no montecarlo
	PlotX     string    // the parameter on the plots' x axis
	PlotNodes []string  // the nodes plotted; all with a limit when empty
}

type fileSpec struct {
	Model      string      `yaml:"model"`
	Set        yaml.Node   `yaml:"set"`
	Sweep      []axisSpec  `yaml:"sweep"`
	MonteCarlo *mcSpec     `yaml:"montecarlo"`
	Plot       *plotSpec   `yaml:"plot"`
	Note       interface{} `yaml:"note"`
}

type axisSpec struct {
	Vary   string   `yaml:"vary"`
	From   string   `yaml:"from"`
	To     string   `yaml:"to"`
	Step   string   `yaml:"step"`
	Count  int      `yaml:"count"`
	Scale  string   `yaml:"scale"`
	Values []string `yaml:"values"`
}

type mcSpec struct {
	Samples int        `yaml:"samples"`
	Seed    uint64     `yaml:"seed"`
	Vary    []distSpec `yaml:"vary"`
}

type distSpec struct {
	Vary       string `yaml:"vary"`
	Normal     *struct{ Mean, Sigma string }
	Uniform    *struct{ Low, High string }
	Triangular *struct{ Low, Mode, High string }
}

type plotSpec struct {
	X     string   `yaml:"x"`
	Nodes []string `yaml:"nodes"`
}

// ReadStudy reads a study file; set are further overrides (from the
// command line) applied after the file's own.
func ReadStudy(path string, set []network.Override) (*Study, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		if os.IsNotExist(err) {
			return nil, fmt.Errorf("%s: no such file", path)
		}
		return nil, err
	}
	var tree yaml.Node
	_ = yaml.Unmarshal(data, &tree)
	if len(tree.Content) == 1 && tree.Content[0].Kind == yaml.MappingNode {
		top := tree.Content[0]
		for i := 0; i+1 < len(top.Content); i += 2 {
			if k := top.Content[i].Value; k == "ambient" || k == "nodes" || k == "links" {
				return nil, fmt.Errorf("%s:%d: this is a model file, not a study file: a study file names its model (model: box.yaml) and what to vary (sweep: or montecarlo:), see the README's \"Sweeps and tolerances: study files\"; to vary a model from the command line use --vary", path, top.Content[i].Line)
			}
		}
	}
	var spec fileSpec
	dec := yaml.NewDecoder(bytes.NewReader(data))
	dec.KnownFields(true)
	if err := dec.Decode(&spec); err != nil {
		msg := strings.ReplaceAll(strings.TrimPrefix(err.Error(), "yaml: unmarshal errors:\n  "), "in type study.fileSpec", "(a study file takes model, set, sweep, montecarlo, plot and note)")
		return nil, fmt.Errorf("%s: %s", path, msg)
	}
	fail := func(field, format string, args ...any) error {
		at := path
		if line := lineOf(&tree, field); line > 0 {
			at = fmt.Sprintf("%s:%d", path, line)
		}
		if field == "" {
			return fmt.Errorf("%s: %s", at, fmt.Sprintf(format, args...))
		}
		return fmt.Errorf("%s: %s: %s", at, field, fmt.Sprintf(format, args...))
	}
	if spec.Model == "" {
		return nil, fail("model", "missing: the model file, relative to the study file")
	}
	var ovs []network.Override
	if spec.Set.Kind == yaml.MappingNode {
		for i := 0; i+1 < len(spec.Set.Content); i += 2 {
			ovs = append(ovs, network.Override{Path: spec.Set.Content[i].Value, Value: spec.Set.Content[i+1].Value})
		}
	} else if spec.Set.Kind != 0 {
		return nil, fail("set", "expected a mapping of paths to values, e.g. {ambient.altitude: 3000 m}")
	}
	ovs = append(ovs, set...)
	modelPath := spec.Model
	if !filepath.IsAbs(modelPath) {
		modelPath = filepath.Join(filepath.Dir(path), modelPath)
	}
	m, err := Open(modelPath, ovs)
	if err != nil {
		return nil, err
	}
	st := &Study{File: path, Model: m}
	param := func(field, p string) (network.Parameter, error) {
		if p == "" {
			return network.Parameter{}, fail(field, "missing: a path as for --set, e.g. ambient.temperature")
		}
		q, err := m.Parameter(p)
		if err != nil {
			return q, fail(field, "%v", err)
		}
		return q, nil
	}
	value := func(field, s string, kind units.Kind) (float64, error) {
		v, err := units.Parse(s, kind)
		if err != nil {
			return 0, fail(field, "%v", err)
		}
		return v, nil
	}
	diff := func(k units.Kind) units.Kind {
		if k == units.Temperature {
			return units.TemperatureDifference
		}
		return k
	}
	for i, a := range spec.Sweep {
		f := fmt.Sprintf("sweep[%d]", i)
		q, err := param(f+".vary", a.Vary)
		if err != nil {
			return nil, err
		}
		ax := Axis{Param: q}
		switch {
		case len(a.Values) > 0:
			if a.From != "" || a.To != "" || a.Step != "" || a.Count != 0 {
				return nil, fail(f, "give values, or from and to with step or count, not both")
			}
			for k, s := range a.Values {
				v, err := value(fmt.Sprintf("%s.values[%d]", f, k), s, q.Kind)
				if err != nil {
					return nil, err
				}
				ax.Values = append(ax.Values, v)
			}
		default:
			if a.From == "" || a.To == "" {
				return nil, fail(f, "needs values: [...], or from and to with step or count")
			}
			from, err := value(f+".from", a.From, q.Kind)
			if err != nil {
				return nil, err
			}
			to, err := value(f+".to", a.To, q.Kind)
			if err != nil {
				return nil, err
			}
			var step float64
			if a.Step != "" {
				if step, err = value(f+".step", a.Step, diff(q.Kind)); err != nil {
					return nil, err
				}
			}
			if a.Scale != "" && a.Scale != "linear" && a.Scale != "log" {
				return nil, fail(f+".scale", "%q is not a scale (linear or log)", a.Scale)
			}
			if ax.Values, err = Range(from, to, step, a.Count, a.Scale == "log"); err != nil {
				return nil, fail(f, "%v", err)
			}
		}
		st.Grid = append(st.Grid, ax)
	}
	if st.Grid != nil && st.Grid.Len() > 10_000_000 {
		return nil, fail("sweep", "%d points is more than ten million", st.Grid.Len())
	}
	if mc := spec.MonteCarlo; mc != nil {
		if mc.Samples < 1 || mc.Samples > 10_000_000 {
			return nil, fail("montecarlo.samples", "a number of samples from 1 to ten million is needed")
		}
		s := &Sampling{Samples: mc.Samples, Seed: mc.Seed}
		for i, d := range mc.Vary {
			f := fmt.Sprintf("montecarlo.vary[%d]", i)
			q, err := param(f+".vary", d.Vary)
			if err != nil {
				return nil, err
			}
			dist := Distribution{Param: q}
			n := 0
			if d.Normal != nil {
				n++
				dist.Kind, dist.Mean = "normal", q.Value
				if d.Normal.Mean != "" {
					if dist.Mean, err = value(f+".normal.mean", d.Normal.Mean, q.Kind); err != nil {
						return nil, err
					}
				}
				if dist.Sigma, err = value(f+".normal.sigma", d.Normal.Sigma, diff(q.Kind)); err != nil {
					return nil, err
				}
				if !(dist.Sigma >= 0) {
					return nil, fail(f+".normal.sigma", "must not be negative")
				}
			}
			if d.Uniform != nil {
				n++
				dist.Kind = "uniform"
				if dist.Low, err = value(f+".uniform.low", d.Uniform.Low, q.Kind); err != nil {
					return nil, err
				}
				if dist.High, err = value(f+".uniform.high", d.Uniform.High, q.Kind); err != nil {
					return nil, err
				}
				if !(dist.High > dist.Low) {
					return nil, fail(f+".uniform", "high must be above low")
				}
			}
			if d.Triangular != nil {
				n++
				dist.Kind = "triangular"
				if dist.Low, err = value(f+".triangular.low", d.Triangular.Low, q.Kind); err != nil {
					return nil, err
				}
				if dist.Mode, err = value(f+".triangular.mode", d.Triangular.Mode, q.Kind); err != nil {
					return nil, err
				}
				if dist.High, err = value(f+".triangular.high", d.Triangular.High, q.Kind); err != nil {
					return nil, err
				}
				if !(dist.Low <= dist.Mode && dist.Mode <= dist.High && dist.Low < dist.High) {
					return nil, fail(f+".triangular", "needs low ≤ mode ≤ high, low < high")
				}
			}
			if n != 1 {
				return nil, fail(f, "give one distribution: normal: {sigma: ...}, uniform: {low: ..., high: ...} or triangular: {low: ..., mode: ..., high: ...}")
			}
			s.Dists = append(s.Dists, dist)
		}
		if len(s.Dists) == 0 {
			return nil, fail("montecarlo.vary", "missing: the values to draw and their distributions")
		}
		st.Sampling = s
	}
	if st.Grid == nil && st.Sampling == nil {
		return nil, fail("", "the study has neither a sweep: nor a montecarlo: section")
	}
	if p := spec.Plot; p != nil {
		st.PlotX, st.PlotNodes = p.X, p.Nodes
	}
	return st, nil
}

// lineOf returns the line of the value at field ("sweep[0].to") in a
// decoded YAML document, or of the nearest part of it that exists; 0 when
// not even the top level is there.
func lineOf(doc *yaml.Node, field string) int {
	if len(doc.Content) == 0 {
		return 0
	}
	n := doc.Content[0]
	line := n.Line
	for _, part := range strings.Split(field, ".") {
		if part == "" {
			continue
		}
		key, index := part, -1
		if i := strings.IndexByte(part, '['); i > 0 && strings.HasSuffix(part, "]") {
			key = part[:i]
			if k, err := strconv.Atoi(part[i+1 : len(part)-1]); err == nil {
				index = k
			}
		}
		next := (*yaml.Node)(nil)
		if n.Kind == yaml.MappingNode {
			for i := 0; i+1 < len(n.Content); i += 2 {
				if n.Content[i].Value == key {
					next = n.Content[i+1]
				}
			}
		}
		if next == nil {
			return line
		}
		n, line = next, next.Line
		if index >= 0 {
			if n.Kind != yaml.SequenceNode || index >= len(n.Content) {
				return line
			}
			n, line = n.Content[index], n.Content[index].Line
		}
	}
	return line
}
