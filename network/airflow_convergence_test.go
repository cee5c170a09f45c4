package network_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
)

// solveQuiet solves a model from the standard start and reports whether
// it converged, with the iterations it took.
func solveQuiet(t *testing.T, text string) (bool, int, string) {
	t.Helper()
	m, err := network.Parse("sweep.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	net, err := network.Build(m)
	if err != nil {
		t.Fatal(err)
	}
	p := net.Steady()
	r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	return r.Reason.Converged(), r.Iterations, fmt.Sprint(r.Reason, r.Err)
}

// The airflow examples converge from the standard start over the range a
// product sees: fan speeds from a tenth to full, rooms from 0 to 55 °C,
// and a vented box from a trickle of heat to far more than it can shed.
func TestAirflowConvergesAcrossConditions(t *testing.T) {
	rack := readFile(t, "../examples/rack-appliance.yaml")
	for _, speed := range []string{"600 rpm", "1500 rpm", "3000 rpm", "4200 rpm", "6000 rpm"} {
		for _, room := range []string{"0 degC", "35 degC", "55 degC"} {
			text := strings.Replace(rack, "speed: 4200 rpm                  # 70 % PWM, the normal setting", "speed: "+speed, 1)
			text = strings.Replace(text, "temperature: 35 degC ", "temperature: "+room+" ", 1)
			text = strings.Replace(text, "    speed: 4200 rpm\n", "    speed: "+speed+"\n", 1)
			if strings.Count(text, "    speed: "+speed) != 2 || !strings.Contains(text, "temperature: "+room) {
				t.Fatal("the sweep did not change the model")
			}
			if ok, it, why := solveQuiet(t, text); !ok {
				t.Errorf("rack appliance at %s, %s: %s after %d iterations", speed, room, why, it)
			}
		}
	}
	box := readFile(t, "../examples/vented-enclosure.yaml")
	for _, power := range []string{"0.01 W", "1 W", "6 W", "60 W", "300 W"} {
		text := strings.Replace(box, "power: 6 W ", "power: "+power+" ", 1)
		if !strings.Contains(text, "power: "+power) {
			t.Fatal("the sweep did not change the model")
		}
		if ok, it, why := solveQuiet(t, text); !ok {
			t.Errorf("vented box at %s: %s after %d iterations", power, why, it)
		}
	}
	failed := readFile(t, "../examples/rack-appliance-fan-failure.yaml")
	for _, room := range []string{"0 degC", "55 degC"} {
		text := strings.Replace(failed, "temperature: 35 degC ", "temperature: "+room+" ", 1)
		if ok, it, why := solveQuiet(t, text); !ok {
			t.Errorf("failed blower, %s: %s after %d iterations", room, why, it)
		}
	}
}

// A chassis with four fans in a wall (two stopped) feeding six heat sinks
// in parallel, each with a bypass, converges and conserves mass: air
// recirculates through the stopped fans.
func TestFanWallWithStoppedFansConverges(t *testing.T) {
	sol := solveAir(t, fanWallModel())
	for _, id := range []string{"fan1", "fan3"} {
		if f := branchOf(t, sol, id); !(f.MassFlow < 0) {
			t.Errorf("stopped %s: %g kg/s, want air back through it", id, f.MassFlow)
		}
	}
}

// fanWallModel writes the chassis of TestFanWallWithStoppedFansConverges.
func fanWallModel() string {
	var b strings.Builder
	b.WriteString(`
ambient: {temperature: 30 degC}
nodes:
  - {id: front, kind: air}
  - {id: plenum, kind: air}
  - {id: rear, kind: air}
links:
  - {id: inlet, kind: perforated, from: ambient, to: front, area: 120 cm2, open_ratio: 0.5}
  - {id: outlet, kind: perforated, from: rear, to: ambient, area: 120 cm2, open_ratio: 0.5}
`)
	curve := "[[0, 250 Pa], [10 CFM, 200 Pa], [20 CFM, 120 Pa], [30 CFM, 40 Pa], [34 CFM, 0 Pa]]"
	for i := 0; i < 4; i++ {
		state := ""
		if i%2 == 1 {
			state = ", state: stopped, area: 16 cm2"
		}
		fmt.Fprintf(&b, "  - {id: fan%d, kind: fan, from: front, to: plenum, curve: %s%s}\n", i, curve, state)
	}
	for i := 0; i < 6; i++ {
		fmt.Fprintf(&b, "  - {id: sink%d, kind: channel, from: base%d, inlet: plenum, to: out%d, flow: solved, length: 60 mm, fin_count: 10, fin_thickness: 1 mm, fin_height: 20 mm, base_width: 40 mm, material: aluminium-6063}\n", i, i, i)
		fmt.Fprintf(&b, "  - {id: gap%d, kind: loss, from: plenum, to: rear, coefficient: 1.5, area: 1 cm2}\n", i)
		fmt.Fprintf(&b, "  - {id: exit%d, kind: loss, from: out%d, to: rear, coefficient: 1, area: 8 cm2}\n", i, i)
	}
	text := b.String()
	nodes := ""
	for i := 0; i < 6; i++ {
		nodes += fmt.Sprintf("  - {id: base%d, power: %d W}\n  - {id: out%d, kind: air}\n", i, 10+5*i, i)
	}
	text = strings.Replace(text, "links:\n", nodes+"links:\n", 1)
	return text
}
