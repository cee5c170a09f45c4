package units_test

import (
	"fmt"

	"github.com/heatgraph/heatgraph/units"
)

func ExampleParse() {
	for _, q := range []struct {
		text string
		kind units.Kind
	}{
		{"1.6 mm", units.Length},
		{"95 F", units.Temperature},
		{"0.5 K*cm2/W", units.SpecificResistance},
		{"20 CFM", units.VolumeFlow},
		{"25 mm", units.Area},
	} {
		v, err := units.Parse(q.text, q.kind)
		if err != nil {
			fmt.Println("error:", err)
			continue
		}
		fmt.Printf("%s = %.6g %s\n", q.text, v, q.kind.SIUnit())
	}
	// Output:
	// 1.6 mm = 0.0016 m
	// 95 F = 308.15 K
	// 0.5 K*cm2/W = 5e-05 K m2/W
	// 20 CFM = 0.00943895 m3/s
	// error: "25 mm" is a length, but an area is needed (use e.g. mm2, cm2, m2, in2)
}
