// Package validity describes the published ranges over which correlations
// hold, so that elements can report when they are used outside them.
package validity

import "fmt"

// Range is the published validity interval of one input of a correlation.
// A zero Max means no upper bound.
type Range struct {
	Name string  // the input, as printed: "Re", "Pr", "Ra", "L/Dh"
	Min  float64 // lowest value the source covers
	Max  float64 // highest value the source covers; 0 for none
}

// Contains reports whether v lies inside r.
func (r Range) Contains(v float64) bool {
	return v >= r.Min && (r.Max == 0 || v <= r.Max)
}

// Check returns "" when v lies inside r, or a short phrase such as
// "Re = 1200 is outside 3000 to 5e+06" when it does not.
func (r Range) Check(v float64) string {
	if r.Contains(v) {
		return ""
	}
	if r.Max == 0 {
		return fmt.Sprintf("%s = %.4g is below %.4g", r.Name, v, r.Min)
	}
	return fmt.Sprintf("%s = %.4g is outside %.4g to %.4g", r.Name, v, r.Min, r.Max)
}
