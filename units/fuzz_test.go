package units

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// FuzzParse checks that Parse never panics, that every error is a one-line
// *Error describing the input, and that every result is finite, with
// absolute temperatures at or above zero.
func FuzzParse(f *testing.F) {
	seeds := []string{
		"", "1.6 mm", "35 degC", "95 F", "-40 degC", "12 W", "0.3 W/m/K", "25 mm2",
		"0.5 K*cm2/W", "20 CFM", "1.2e5 Pa", "3 m/s", "2 L/min", "10 BTU/h", "85 %",
		"0.3 W/(m K)", "10 W/(m² K)", "1 m⁻¹", "2mm", "1 inH2O", "1 (m/s)^2", "1 W/m K",
		"abc", "NaN", "1e999 m", "3 W/(m K", "1 m^-12", "−5 C", "1 ((m))", "1 µm", "1 ºC",
	}
	for i, s := range seeds {
		f.Add(s, uint8(i))
	}
	f.Fuzz(func(t *testing.T, s string, kind uint8) {
		k := Kind(int(kind) % (int(Acceleration) + 2)) // includes one undeclared kind
		v, err := Parse(s, k)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("Parse(%q, %v): error %v is a %T", s, k, err, err)
			}
			if msg := err.Error(); msg == "" || strings.ContainsAny(msg, "\n\r") || e.Input != s || e.Kind != k {
				t.Fatalf("Parse(%q, %v): bad error %#v", s, k, e)
			}
			return
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("Parse(%q, %v) = %g", s, k, v)
		}
		if k == Temperature && v < 0 {
			t.Fatalf("Parse(%q, %v) = %g, below absolute zero", s, k, v)
		}
	})
}
