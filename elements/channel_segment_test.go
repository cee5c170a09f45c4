package elements

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/duct"
)

// split returns the k parts of channels of geometry g cut along the flow:
// each with its share of the length and areas, its Upstream and Downstream.
func split(g ChannelGeometry, k int, o duct.Options) []*Channel {
	part := g
	part.Duct.Length /= float64(k)
	part.PrimeArea /= float64(k)
	part.FinArea /= float64(k)
	var cs []*Channel
	for i := 0; i < k; i++ {
		cs = append(cs, &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: part, Options: o,
			Upstream: float64(i) * part.Duct.Length, Downstream: float64(k-1-i) * part.Duct.Length})
	}
	return cs
}

// However a channel is split along the flow, no part reports a mean Nu below
// the fully developed Nu_T of a uniform-temperature wall (Shah & London
// 1978): the local coefficient falls towards it from above, and h̄·L = ∫h dx.
func TestChannelSegmentNeverBelowDeveloped(t *testing.T) {
	tube, err := Passages(duct.Duct{Shape: duct.Circular, Diameter: 4e-3, Length: 0.05}, 10)
	if err != nil {
		t.Fatal(err)
	}
	for _, g := range []ChannelGeometry{plateFin(t), tube} {
		for _, k := range []int{2, 3, 5, 10, 40} {
			for _, mdot := range []float64{1e-4, 5e-4, 2e-3, 6e-3} {
				s := &State{X: []float64{340, 298, 312, mdot}, Env: airEnv}
				for i, c := range split(g, k, duct.Options{}) {
					rep := c.Report(s)
					if detail(t, rep, "regime").Text[:7] != "laminar" {
						continue
					}
					if nu, fd := detail(t, rep, "Nu").Value, g.Duct.LaminarNuT(); nu < fd*(1-1e-12) {
						t.Errorf("%v, part %d of %d, ṁ %g: Nu %g below the fully developed %g", g.Duct.Shape, i+1, k, mdot, nu, fd)
					}
				}
			}
		}
	}
}

// A channel split in parts pays the entry loss once, on the first part, and
// the exit loss once, on the last, so that the parts' pressure drops add up
// to the whole channel's: Δp = (f·L/Dh + K_c + K_e)·ρV²/2 with the apparent
// friction additive over the length, f̄·L = ∫f dx (Kays & London entry and
// exit coefficients charged once per passage through the sink).
func TestChannelLossesOncePerChannel(t *testing.T) {
	g := plateFin(t)
	s := &State{X: []float64{340, 298, 312, 3e-3}, Env: airEnv}
	whole := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: g}
	want := detail(t, whole.Report(s), "pressure_drop").Value
	for _, k := range []int{2, 3, 4} {
		sum, kSum := 0.0, 0.0
		for i, c := range split(g, k, duct.Options{}) {
			rep := c.Report(s)
			sum += detail(t, rep, "pressure_drop").Value
			kc := detail(t, rep, "loss_coefficient").Value
			kSum += kc
			wantK := 0.0
			if i == 0 {
				wantK += g.KEntry
			}
			if i == k-1 {
				wantK += g.KExit
			}
			if kc != wantK {
				t.Errorf("part %d of %d: loss coefficient %g, want %g", i+1, k, kc, wantK)
			}
		}
		if math.Abs(sum-want) > 1e-9*want {
			t.Errorf("%d parts: pressure drops add to %.8g Pa, whole channel %.8g Pa", k, sum, want)
		}
		if math.Abs(kSum-(g.KEntry+g.KExit)) > 1e-15 {
			t.Errorf("%d parts: loss coefficients add to %g, want %g", k, kSum, g.KEntry+g.KExit)
		}
	}
}

// A gap between two modules is heated on its two long walls only: the
// heated area is theirs, and the fully developed Nu_T is that of a
// rectangle heated on its two long walls, short walls adiabatic, which
// tends to the parallel-plate 7.541 (Shah & London 1978) as the gap
// narrows, above the four-wall value; one long wall heated tends to the
// one-sided plate value 4.861 (Shah & London 1978, from memory).
func TestChannelHeatedWalls(t *testing.T) {
	gap := duct.Duct{Shape: duct.Rectangular, Width: 3e-3, Height: 30e-3, Length: 0.12}
	all, err := Passages(gap, 1)
	if err != nil {
		t.Fatal(err)
	}
	two := gap
	two.Heated = duct.TwoLongWalls
	g2, err := Passages(two, 1)
	if err != nil {
		t.Fatal(err)
	}
	one := gap
	one.Heated = duct.OneLongWall
	g1, err := Passages(one, 1)
	if err != nil {
		t.Fatal(err)
	}
	if want := 2 * 30e-3 * 0.12; math.Abs(g2.PrimeArea-want) > 1e-15 {
		t.Errorf("two long walls: heated area %g m², want %g", g2.PrimeArea, want)
	}
	if want := 30e-3 * 0.12; math.Abs(g1.PrimeArea-want) > 1e-15 {
		t.Errorf("one long wall: heated area %g m², want %g", g1.PrimeArea, want)
	}
	if want := 2 * 33e-3 * 0.12; math.Abs(all.PrimeArea-want) > 1e-15 {
		t.Errorf("all walls: heated area %g m², want %g", all.PrimeArea, want)
	}
	s := &State{X: []float64{340, 298, 305, 2e-4}, Env: airEnv}
	dev := duct.Options{Developed: true}
	nu := func(g ChannelGeometry) (float64, Report) {
		c := &Channel{Wall: 0, Inlet: 1, Outlet: 2, Flow: 3, Geometry: g, Options: dev}
		checkJacobianEnv(t, g.Duct.Heated.String(), c, s.X)
		r := c.Report(s)
		return detail(t, r, "Nu").Value, r
	}
	nuAll, _ := nu(all)
	nuTwo, repTwo := nu(g2)
	nuOne, _ := nu(g1)
	if !(nuOne < nuAll && nuAll < nuTwo && nuTwo < 7.541 && nuOne < 4.861) {
		t.Errorf("α = 0.1: Nu_T one long wall %g, all %g, two long walls %g; want one < all < two < 7.541, one < 4.861", nuOne, nuAll, nuTwo)
	}
	if w := detail(t, repTwo, "heated_walls").Text; w != "two long walls" {
		t.Errorf("heated_walls %q", w)
	}
}

// The new choices keep the channel's exact Jacobian.
func TestChannelJacobianChoices(t *testing.T) {
	fins := plateFin(t)
	gap := duct.Duct{Shape: duct.Rectangular, Width: 3e-3, Height: 30e-3, Length: 0.12, Heated: duct.TwoLongWalls}
	slot, err := Passages(gap, 4)
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name string
		c    *Channel
		mdot float64
	}{
		{"fully developed, laminar", &Channel{Geometry: fins, Options: duct.Options{Developed: true}}, 2e-3},
		{"fully developed, transitional", &Channel{Geometry: fins, Options: duct.Options{Developed: true}}, 2e-2},
		{"turbulent from 2300", &Channel{Geometry: fins, Options: duct.Options{Transition: duct.TransitionTurbulent, Turbulent: duct.DittusBoelter}}, 2e-2},
		{"interpolation to 4000, below", &Channel{Geometry: fins, Options: duct.Options{Transition: duct.TransitionInterpolate4000}}, 1.2e-2},
		{"interpolation to 4000, above", &Channel{Geometry: fins, Options: duct.Options{Transition: duct.TransitionInterpolate4000}}, 3e-2},
		{"thermal entry", &Channel{Geometry: fins, Options: duct.Options{Laminar: duct.ThermalEntry}}, 2e-3},
		{"far downstream part", &Channel{Geometry: fins, Upstream: 1, Downstream: 0.2}, 1e-3},
		{"two long walls", &Channel{Geometry: slot}, 5e-4},
	}
	for _, c := range cases {
		c.c.Wall, c.c.Inlet, c.c.Outlet, c.c.Flow = 0, 1, 2, 3
		checkJacobianEnv(t, c.name, c.c, []float64{340, 298, 312, c.mdot})
	}
}
