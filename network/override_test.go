package network

import (
	"os"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/units"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func overrides(t *testing.T, list ...string) []Override {
	t.Helper()
	ovs, err := ParseOverrides(list)
	require.NoError(t, err)
	return ovs
}

func TestOverridesChangeValues(t *testing.T) {
	m, err := ReadFileWith("../examples/outdoor-controller.yaml", overrides(t,
		"ambient.temperature=45degC", "ambient.altitude=3000m", "nodes.board.power=7W",
		"components.cpu.r_jc=0.5K/W", "components.radio.power = 2.5 W", "required_margin=3 K",
		"materials.pad-5w.conductivity=3 W/m/K"))
	require.NoError(t, err)
	assert.InDelta(t, 318.15, m.Ambient.Temperature, 1e-12)
	assert.Equal(t, 3000.0, m.Ambient.Altitude)
	// U.S. Standard Atmosphere 1976: 70.1 kPa at 3000 m (table value).
	assert.InDelta(t, 70.1e3, m.Ambient.Pressure, 0.1e3)
	assert.Equal(t, 3.0, m.RequiredMargin)
	assert.Equal(t, 7.0, m.Nodes[0].Power)
	assert.Equal(t, 0.5, m.Components[0].RJC)
	assert.Equal(t, 2.5, m.Components[2].Power)
	assert.Equal(t, 3.0, m.Materials["pad-5w"].Conductivity)

	// A changed value is checked with the rest of the model: air must
	// balance at every air node.
	_, err = ReadFileWith("../examples/heatsink-module.yaml", overrides(t, "links.exhaust.flow=20CFM"))
	assert.ErrorContains(t, err, "nodes[air-out]: air arrives at 13.37 g/s but leaves at 8.913 g/s")
	m, err = ReadFileWith("../examples/heatsink-module.yaml", overrides(t, "links.exhaust.flow=20CFM",
		"links.fins-front.flow=20CFM", "links.fins-rear.flow=20CFM"))
	require.NoError(t, err)
	base, err := ReadFile("../examples/heatsink-module.yaml")
	require.NoError(t, err)
	for i, l := range m.Links {
		if l.ID == "exhaust" {
			// The same air density, two thirds of the volume flow.
			assert.InDelta(t, 2.0/3, l.Params.(*Stream).MassFlow/base.Links[i].Params.(*Stream).MassFlow, 1e-12)
		}
	}
}

// Pressure and altitude exclude each other: setting one replaces the other.
func TestOverrideReplacesExclusiveKey(t *testing.T) {
	src := "ambient: {temperature: 20 degC, pressure: 90 kPa}\nnodes: [{id: a, power: 1 W}]\nlinks: [{kind: lumped, from: a, to: ambient, resistance: 2 K/W}]\n"
	m, err := ParseWith("box.yaml", []byte(src), overrides(t, "ambient.altitude=0m", "links.a--ambient.conductance=1 W/K"))
	require.NoError(t, err)
	assert.InDelta(t, 101325, m.Ambient.Pressure, 1e-6)
	assert.Equal(t, 1.0, m.Links[0].Params.(*Lumped).Conductance)
}

// A key that comes from a merge key is overridden for one item only.
func TestOverrideMergedKey(t *testing.T) {
	src := `shared:
  w: &w {power: 3 W}
ambient: {temperature: 20 degC}
nodes:
  - {<<: *w, id: a}
  - {<<: *w, id: b}
links:
  - {kind: lumped, from: a, to: ambient, resistance: 2 K/W}
  - {kind: lumped, from: b, to: ambient, resistance: 2 K/W}
`
	m, err := ParseWith("box.yaml", []byte(src), overrides(t, "nodes.a.power=5W"))
	require.NoError(t, err)
	assert.Equal(t, 5.0, m.Nodes[0].Power)
	assert.Equal(t, 3.0, m.Nodes[1].Power)
}

func TestOverrideProblems(t *testing.T) {
	for _, c := range []struct{ set, want string }{
		{"nodes.board.power=7 V", `--set nodes.board.power: unknown unit "V" in "7 V"`},
		{"nodes.board.power=7 mm", `--set nodes.board.power: "7 mm" is a length`},
		{"components.cpu.r_jc=-1 K/W", `--set components.cpu.r_jc: "-1 K/W" must be greater than zero`},
		{"ambient.temperature=-300degC", `--set ambient.temperature: `},
		{"nodes.bord.power=7W", `--set nodes.bord.power: no node "bord" (did you mean "board"?) (nodes: board, cpu-top`},
		{"nodes.board.powr=7W", `--set nodes.board.powr: unknown key "powr" (did you mean "power"?) (a solid node takes: id, kind, power`},
		{"ambient.temprature=7degC", `--set ambient.temprature: unknown key "temprature" (did you mean "temperature"?)`},
		{"node.board.power=7W", `--set node.board.power: unknown part of the model "node" (did you mean "nodes"?)`},
		{"links.cpu-pad-lower.kind=conductoin", `unknown link kind "conductoin" (did you mean "conduction"?)`},
		{"nodes.board=7W", `--set nodes.board: expected nodes.ID.KEY`},
		{"nodes.board.id=x", `--set nodes.board.id: id names the item and cannot be set`},
	} {
		_, err := ReadFileWith("../examples/outdoor-controller.yaml", overrides(t, c.set))
		require.Error(t, err, c.set)
		assert.Contains(t, err.Error(), c.want, c.set)
		if strings.HasPrefix(c.want, "--set") {
			assert.True(t, strings.HasPrefix(err.Error(), c.want), "%s: %s", c.set, err)
		}
	}
	// An unknown path and a bad value: both name their override.
	_, err := ReadFileWith("../examples/outdoor-controller.yaml", overrides(t, "nodes.bord.power=1W", "nodes.board.power=1V"))
	assert.ErrorContains(t, err, "--set nodes.bord.power: no node \"bord\"")
	assert.ErrorContains(t, err, "--set nodes.board.power: unknown unit \"V\"")
	_, err = ParseOverride("nodes.board.power")
	assert.ErrorContains(t, err, "expected PATH=VALUE")
}

// Every parameter listed can be set to its own value, which changes
// nothing, and to another, which is read.
func TestParametersRoundTrip(t *testing.T) {
	for _, file := range exampleFiles(t) {
		data, err := os.ReadFile(file)
		require.NoError(t, err)
		base, err := Parse(file, data)
		require.NoError(t, err)
		ps := Parameters(file, data, nil)
		require.NotEmpty(t, ps, file)
		for _, p := range ps {
			m, err := ParseWith(file, data, p.Overrides(p.Value))
			require.NoError(t, err, "%s %s", file, p.Path)
			assert.Equal(t, len(base.Links), len(m.Links))
			_, err = ParseWith(file, data, []Override{{p.Path, "1 parsec"}})
			require.Error(t, err, p.Path)
			assert.True(t, strings.HasPrefix(err.Error(), "--set "+p.Path+": "), err.Error())
		}
	}
}

func exampleFiles(t *testing.T) []string {
	t.Helper()
	entries, err := os.ReadDir("../examples")
	require.NoError(t, err)
	var out []string
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), ".yaml") {
			out = append(out, "../examples/"+e.Name())
		}
	}
	return out
}

// Values shared through an anchor are one parameter.
func TestParametersShareAnchors(t *testing.T) {
	src := `ambient: {temperature: 20 degC}
nodes:
  - {id: a, power: &w 3 W, limit: 90 degC}
  - {id: b, power: *w}
links:
  - {kind: lumped, from: a, to: ambient, resistance: 2 K/W}
  - {kind: lumped, from: b, to: ambient, resistance: 2 K/W}
`
	ps := Parameters("box.yaml", []byte(src), overrides(t, "links.b--ambient.resistance=5 K/W"))
	require.Len(t, ps, 5)
	assert.Equal(t, Parameter{Path: "ambient.temperature", Kind: units.Temperature, Value: 293.15, Text: "20 degC"}, ps[0])
	assert.Equal(t, "nodes.a.power", ps[1].Path)
	assert.Equal(t, []string{"nodes.b.power"}, ps[1].Also)
	assert.True(t, ps[2].Verdict)
	assert.Equal(t, 5.0, ps[4].Value)
	m, err := ParseWith("box.yaml", []byte(src), ps[1].Overrides(4))
	require.NoError(t, err)
	assert.Equal(t, 4.0, m.Nodes[0].Power)
	assert.Equal(t, 4.0, m.Nodes[1].Power)
	p, ok := ParameterAt("box.yaml", []byte(src), nil, "ambient.altitude")
	assert.True(t, ok)
	assert.Equal(t, units.Length, p.Kind)
	_, ok = ParameterAt("box.yaml", []byte(src), nil, "nodes.c.power")
	assert.False(t, ok)
	p, ok = ParameterAt("box.yaml", []byte(src), nil, "links.a--ambient.conductance")
	assert.True(t, ok)
	assert.Equal(t, units.Conductance, p.Kind)
	_, ok = ParameterAt("box.yaml", []byte(src), nil, "links.a--ambient.kind")
	assert.False(t, ok)
}

// A plate's values, its faces', heat regions' and board's among them, can
// be set by path; a path that names nothing says what would.
func TestOverridePlates(t *testing.T) {
	m, err := ReadFileWith("../examples/camera-board.yaml", overrides(t,
		"plates.spreader.faces.2.h=8 W/(m2 K)", "plates.board.board.thickness=2 mm",
		"plates.board.heat.0.power=1 W", "plates.spreader.thickness=3 mm", "plates.board.limit=95 degC"))
	require.NoError(t, err)
	b, s := m.Plates[0], m.Plates[1]
	assert.Equal(t, 8.0, s.Faces[2].H)
	assert.InDelta(t, 2e-3, b.Thickness(), 1e-15)
	assert.Equal(t, 1.0, b.Heats[0].Power)
	assert.InDelta(t, 3e-3, s.Thickness(), 1e-15)
	assert.InDelta(t, 368.15, b.Limit, 1e-12)
	for path, want := range map[string]string{
		"plates.board.faces.12.h=1W/(m2K)":     "the plate's faces are numbered 0 to 7",
		"plates.board.walls.0.h=1W/(m2K)":      "name faces.N, heat.N, layers.N or board",
		"plates.board.faces.0.hh=1W/(m2K)":     `unknown key "hh" (did you mean "h"?)`,
		"plates.boad.limit=90degC":             `no plate "boad" (did you mean "board"?)`,
		"plates.spreader.board.thickness=1 mm": "the plate has no board: mapping",
	} {
		_, err := ReadFileWith("../examples/camera-board.yaml", overrides(t, path))
		assert.ErrorContains(t, err, want, path)
	}
	var paths []string
	data, err := os.ReadFile("../examples/camera-board.yaml")
	require.NoError(t, err)
	for _, p := range Parameters("../examples/camera-board.yaml", data, nil) {
		paths = append(paths, p.Path)
	}
	for _, p := range []string{"plates.spreader.faces.2.h", "plates.board.faces.4.resistance", "plates.spreader.faces.0.contact", "plates.board.heat.0.power", "plates.board.board.thickness", "plates.spreader.thickness"} {
		assert.Contains(t, paths, p)
	}
}
