package network

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestVariantAddsRemovesAndSets(t *testing.T) {
	m, err := ReadFileWith("../examples/variants/controller-radio-pad.yaml", nil)
	require.NoError(t, err)
	base, err := ReadFile("../examples/outdoor-controller.yaml")
	require.NoError(t, err)
	assert.Equal(t, "../examples/variants/controller-radio-pad.yaml", m.File)
	assert.Equal(t, "Sealed outdoor controller, radio padded to the lid", m.Title)
	assert.Len(t, m.Nodes, len(base.Nodes)+1)
	assert.Len(t, m.Links, len(base.Links)+1)
	assert.Equal(t, "radio-top", m.Components[2].Case)
	assert.Equal(t, 4.0, m.Components[2].RJC)

	m, err = ReadFileWith("../examples/variants/controller-bare-lid.yaml", []Override{{"ambient.temperature", "30degC"}})
	require.NoError(t, err)
	assert.Len(t, m.Nodes, len(base.Nodes)-1)
	assert.Len(t, m.Links, len(base.Links)-1)
	assert.InDelta(t, 303.15, m.Ambient.Temperature, 1e-12)
	ps := Parameters(m.File, mustRead(t, m.File), nil)
	found := false
	for _, p := range ps {
		if p.Path == "links.lid-glow.emissivity" {
			found = true
			assert.Equal(t, 0.1, p.Value)
		}
	}
	assert.True(t, found)
}

func mustRead(t *testing.T, path string) []byte {
	t.Helper()
	data, err := os.ReadFile(path)
	require.NoError(t, err)
	return data
}

// Problems in what a variant adds or sets are reported at its own lines.
func TestVariantProblems(t *testing.T) {
	dir := t.TempDir()
	base, err := filepath.Abs("../examples/outdoor-controller.yaml")
	require.NoError(t, err)
	for _, c := range []struct{ text, want string }{
		{"base: " + base + "\nset:\n  components.cpu.power: 7 V\n", `v.yaml:3: components[cpu].power: unknown unit "V" in "7 V"`},
		{"base: " + base + "\nadd:\n  links:\n    - {id: x, kind: conduction, from: cpu, to: lid, conductivity: 3 W/m/K, area: 1 cm, thickness: 1 mm}\n", `v.yaml:4: links[x].area: "1 cm" is a length`},
		{"base: " + base + "\nremove: [links.brackt]\n", `v.yaml:2: remove: the base has no link "brackt" (did you mean "bracket"?)`},
		{"base: " + base + "\nremove: [nodes.pole]\n", `unknown node "pole"`},
		{"base: " + base + "\nsett: {}\n", `v.yaml:2: sett: unknown key (did you mean "set"?)`},
		{"base: nowhere.yaml\n", `v.yaml:1: base: ` + filepath.Join(dir, "nowhere.yaml") + `: no such file`},
	} {
		path := filepath.Join(dir, "v.yaml")
		require.NoError(t, os.WriteFile(path, []byte(c.text), 0o644))
		_, err := ReadFileWith(path, nil)
		require.Error(t, err, c.text)
		assert.Contains(t, err.Error(), c.want)
	}
}
