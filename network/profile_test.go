package network_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
)

func assembleModel(t *testing.T, name, text string) *network.Network {
	t.Helper()
	m, err := network.Parse(name, []byte(text))
	if err != nil {
		t.Fatalf("parse: %v", err)
	}
	net, err := network.Build(m)
	if err != nil {
		t.Fatalf("build: %v", err)
	}
	return net
}

// The profile shapes, read from a model and evaluated: values at stated
// times and the jumps a run steps onto (definitions of the shapes, in the
// model format's own words).
func TestProfilesReadAndEvaluate(t *testing.T) {
	net := assembleModel(t, "p.yaml", `
ambient: {temperature: {table: [[0 h, 10 degC], [12 h, 30 degC]], repeat: 24 h}}
nodes:
  - {id: a, power: {step: {before: 2 W, after: 12 W, at: 5 min}}}
  - {id: b, power: {pulse: {base: 1 W, peak: 40 W, start: 10 s, width: 2 s}, repeat: 30 s}}
  - {id: c, power: {duty: {period: 1 min, on_fraction: 25 %, on: 8 W, off: 0 W}}}
  - {id: d, kind: fixed, temperature: {table: [[0 s, 300 K], [10 s, 300 K], [10 s, 310 K]]}}
links:
  - {from: a, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: b, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: c, to: d, kind: lumped, conductance: 1 W/K}
`)
	m := net.Model
	at := func(p network.Profile, tt float64) float64 { return p.At(tt) }
	cases := []struct {
		what    string
		p       network.Profile
		t, want float64
	}{
		{"step before", m.Nodes[0].PowerProfile, 299, 2},
		{"step at", m.Nodes[0].PowerProfile, 300, 12},
		{"pulse base", m.Nodes[1].PowerProfile, 9.9, 1},
		{"pulse peak", m.Nodes[1].PowerProfile, 11, 40},
		{"pulse after", m.Nodes[1].PowerProfile, 12, 1},
		{"pulse repeated", m.Nodes[1].PowerProfile, 30*7 + 10.5, 40},
		{"duty on", m.Nodes[2].PowerProfile, 60*3 + 14, 8},
		{"duty off", m.Nodes[2].PowerProfile, 60*3 + 16, 0},
		{"table jump before", m.Nodes[3].TemperatureProfile, 9.999, 300},
		{"table jump at", m.Nodes[3].TemperatureProfile, 10, 310},
		{"ambient at 6 h", m.Ambient.TemperatureProfile, 6 * 3600, 293.15},
		{"ambient at 18 h (back towards the first value)", m.Ambient.TemperatureProfile, 18 * 3600, 293.15},
		{"ambient a day later", m.Ambient.TemperatureProfile, 30 * 3600, 293.15},
	}
	for _, c := range cases {
		if got := at(c.p, c.t); abs(got-c.want) > 1e-9 {
			t.Errorf("%s: at %g s %g, want %g", c.what, c.t, got, c.want)
		}
	}
	// Steady solves take t = 0.
	if got := m.Nodes[0].Power; got != 2 {
		t.Errorf("power at t = 0: %g W, want 2 W", got)
	}
	if got := m.Ambient.Temperature; abs(got-283.15) > 1e-9 {
		t.Errorf("ambient at t = 0: %g K, want 283.15 K", got)
	}
	got := net.Jumps(0, 70)
	want := []float64{10, 12, 15, 40, 42, 60, 70}
	if len(got) != len(want) {
		t.Fatalf("jumps in (0, 70] s: %v, want %v", got, want)
	}
	for i := range want {
		if abs(got[i]-want[i]) > 1e-9 {
			t.Errorf("jumps in (0, 70] s: %v, want %v", got, want)
			break
		}
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// A table from a CSV file with units in its header, relative to the model.
func TestProfileFromCSV(t *testing.T) {
	dir := t.TempDir()
	csv := "# a day of sun on the roof\ntime [h], irradiance [W/m2], ambient [degC]\n0, 0, 12\n6, 0, 14\n12, 800, 28\n18, 0, 22\n"
	if err := os.WriteFile(filepath.Join(dir, "day.csv"), []byte(csv), 0o644); err != nil {
		t.Fatal(err)
	}
	model := filepath.Join(dir, "box.yaml")
	text := `
ambient: {temperature: {file: day.csv, column: ambient, repeat: 24 h}}
nodes: [{id: a, power: 1 W}]
links: [{from: a, to: ambient, kind: lumped, conductance: 1 W/K}]
`
	m, err := network.Parse(model, []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	p := m.Ambient.TemperatureProfile
	// 9 h: halfway from 14 degC to 28 degC; 21 h: halfway from 22 degC back
	// to the first value, 12 degC, at 24 h.
	for _, c := range []struct{ t, want float64 }{{9 * 3600, 294.15}, {21 * 3600, 290.15}, {33 * 3600, 294.15}} {
		if got := p.At(c.t); abs(got-c.want) > 1e-9 {
			t.Errorf("at %g h: %g K, want %g K", c.t/3600, got, c.want)
		}
	}
}

// Bad profiles are reported with their file and line like every other
// problem of the model.
func TestProfileProblems(t *testing.T) {
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "bad.csv"), []byte("time [min], power [W]\n0, 1\n5, 2\n3, 4\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "nounit.csv"), []byte("time, power [W]\n0, 1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	model := filepath.Join(dir, "box.yaml")
	text := `ambient: {temperature: 20 degC}
nodes:
  - {id: a, power: {pulse: {peak: 4 W, width: 0 s}}}
  - {id: b, power: {step: {before: 1 W, after: 2 m, at: 1 s}}}
  - {id: c, power: {table: [[0 s, 1 W], [2 s]]}}
  - {id: d, power: {file: bad.csv}}
  - {id: e, power: {file: nounit.csv}}
  - {id: f, power: {pulse: {peak: 4 W, start: 20 s, width: 20 s}, repeat: 30 s}}
  - {id: g, power: {stair: {}}}
  - {id: h, power: {file: none.csv}}
links:
  - {from: a, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: b, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: c, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: d, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: e, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: f, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: g, to: ambient, kind: lumped, conductance: 1 W/K}
  - {from: h, to: ambient, kind: lumped, conductance: 1 W/K}
`
	_, err := network.Parse(model, []byte(text))
	if err == nil {
		t.Fatal("no problems reported")
	}
	msg := err.Error()
	for _, want := range []string{
		"box.yaml:3: nodes[a].power.pulse.width: \"0 s\" must be greater than zero",
		"box.yaml:4: nodes[b].power.step.after:",
		"box.yaml:5: nodes[c].power.table[1]: expected a [time, value] pair",
		"bad.csv:4: nodes[d].power.file: time 180 s comes before the previous point's 300 s",
		"nounit.csv:1: nodes[e].power.file: header cell \"time\" has no unit in brackets",
		"box.yaml:8: nodes[f].power.repeat: the pulse (start 20 s + width 20 s) does not fit in the period 30 s",
		"box.yaml:9: nodes[g].power.stair: unknown key",
		"box.yaml:10: nodes[h].power.file: cannot read none.csv: no such file",
	} {
		if !strings.Contains(msg, want) {
			t.Errorf("missing problem %q in:\n%s", want, msg)
		}
	}
}

// A fan that steps from 2 g/s to 4 g/s: air through a duct node takes the
// 20 W of a massless heater, so the air leaves T_a + P/(ṁ·c_p) above
// ambient at every instant (the steady-flow energy equation), halving
// when the flow doubles.
func TestFlowProfile(t *testing.T) {
	net := assembleModel(t, "duct.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: heater, power: 20 W}
  - {id: duct, kind: air}
links:
  - {id: fan, kind: stream, from: ambient, to: duct, mass_flow: {step: {before: 2 g/s, after: 4 g/s, at: 100 s}}}
  - {id: exhaust, kind: stream, from: duct, to: ambient, mass_flow: {step: {before: 2 g/s, after: 4 g/s, at: 100 s}}}
  - {from: heater, to: duct, kind: convection, coefficient: 50 W/m2/K, area: 0.02 m2}
`)
	h, err := net.Run(network.RunOptions{End: 200, Interval: 50})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	cp := net.Env.AirCp
	d := net.Index["duct"]
	for k, tt := range h.Times {
		// At the jump itself the output is the state just before it.
		mdot := 0.002
		if tt > 100 {
			mdot = 0.004
		}
		want := 298.15 + 20/(mdot*cp)
		if abs(h.T[k][d]-want) > 1e-6 {
			t.Errorf("t = %g s: air at %.6f K, want %.6f K", tt, h.T[k][d], want)
		}
	}
	// A volume flow's profile is taken at the ambient density, like a
	// constant: the steady solve at t = 0 agrees with a constant flow.
	vol := assembleModel(t, "duct.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: duct, kind: air}
  - {id: heater, power: 20 W}
links:
  - {id: fan, kind: stream, from: ambient, to: duct, flow: {pulse: {base: 3 CFM, peak: 6 CFM, start: 10 s, width: 5 s}}}
  - {id: exhaust, kind: stream, from: duct, to: ambient, flow: {pulse: {base: 3 CFM, peak: 6 CFM, start: 10 s, width: 5 s}}}
  - {from: heater, to: duct, kind: convection, coefficient: 50 W/m2/K, area: 0.02 m2}
`)
	con := assembleModel(t, "duct.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: duct, kind: air}
  - {id: heater, power: 20 W}
links:
  - {id: fan, kind: stream, from: ambient, to: duct, flow: 3 CFM}
  - {id: exhaust, kind: stream, from: duct, to: ambient, flow: 3 CFM}
  - {from: heater, to: duct, kind: convection, coefficient: 50 W/m2/K, area: 0.02 m2}
`)
	if a, b := vol.Vars[len(vol.Vars)-1].Value, con.Vars[len(con.Vars)-1].Value; abs(a-b) > 1e-15 {
		t.Errorf("mass flow at t = 0: %g kg/s from the profile, %g kg/s from the constant", a, b)
	}
}

// Flows that follow different profiles into and out of an air node would
// create or destroy air: the reader finds the first time they part.
func TestFlowProfilesMustBalance(t *testing.T) {
	_, err := network.Parse("duct.yaml", []byte(`ambient: {temperature: 25 degC}
nodes:
  - {id: heater, power: 20 W}
  - {id: duct, kind: air}
links:
  - {id: fan, kind: stream, from: ambient, to: duct, mass_flow: {step: {before: 2 g/s, after: 4 g/s, at: 100 s}}}
  - {id: exhaust, kind: stream, from: duct, to: ambient, mass_flow: 2 g/s}
  - {from: heater, to: duct, kind: convection, coefficient: 50 W/m2/K, area: 0.02 m2}
`))
	want := "duct.yaml:4: nodes[duct]: at t = 100 s air arrives at 4 g/s but leaves at 2 g/s"
	if err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("got %v, want %q", err, want)
	}
	_, err = network.Parse("duct.yaml", []byte(`ambient: {temperature: 25 degC}
nodes: [{id: duct, kind: air}]
links:
  - {id: slow, kind: stream, from: ambient, to: duct, mass_flow: {table: [[0 s, 1 g/s], [10 s, 0 g/s]]}}
  - {id: out, kind: stream, from: duct, to: ambient, mass_flow: 1 g/s}
`))
	want = "duct.yaml:4: links[slow].mass_flow: \"mass_flow\" must be greater than zero at all times (it reaches 0 kg/s)"
	if err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("got %v, want %q", err, want)
	}
}

// A channel's flow follows its profile too: a heat sink whose fan slows
// from 20 to 10 CFM at 60 s runs hotter afterwards, and the run's energy
// balances with the air carrying the heat out.
func TestChannelFlowProfile(t *testing.T) {
	fan := "{step: {before: 20 CFM, after: 10 CFM, at: 60 s}}"
	net := assembleModel(t, "sink.yaml", `
ambient: {temperature: 25 degC}
nodes:
  - {id: base, power: 60 W, capacity: 300 J/K}
  - {id: air-out, kind: air}
links:
  - {id: fins, kind: channel, from: base, inlet: ambient, to: air-out, flow: `+fan+`, length: 100 mm,
     fin_count: 12, fin_thickness: 1.2 mm, fin_height: 30 mm, base_width: 80 mm, material: aluminium-6063}
  - {id: exhaust, kind: stream, from: air-out, to: ambient, flow: `+fan+`}
`)
	h, err := net.Run(network.RunOptions{End: 1200, Interval: 60, Start: network.FromSteady})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Completed() {
		t.Fatalf("run ended: %v (%v)", h.Result.Reason, h.Result.Err)
	}
	base := net.Index["base"]
	if first, last := h.T[1][base], h.T[len(h.T)-1][base]; !(last > first+1) {
		t.Errorf("base at %.3f K at 60 s and %.3f K at the end: the slower fan should leave it hotter", first, last)
	}
	// The channel's correlations make the stages nonlinear: the balance
	// closes to the stage iterations' tolerance, far within
	// EnergyTolerance.
	if r := h.Energy.Relative(); r > 1e-6 {
		t.Errorf("energy imbalance %.3g (relative)", r)
	}
}
