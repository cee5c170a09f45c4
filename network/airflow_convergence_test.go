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
