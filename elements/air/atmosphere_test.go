package air

import (
	"errors"
	"testing"
)

func TestStandardAtmosphereTroposphere(t *testing.T) {
	// U.S. Standard Atmosphere 1976 at geometric altitudes, computed by hand
	// from its constants (T0 288.15 K, p0 101 325 Pa, 6.5 K/km, g0 9.80665
	// m/s², R 287.05287 J/(kg K), r0 6 356 766 m; R*/M0 differs by 7e-7).
	// Sea-level ρ0 = 1.225 kg/m³ is the value the standard tabulates.
	for _, c := range []struct{ z, T, p, rho float64 }{
		{0, 288.15, 101325, 1.2250},
		{1000, 281.65, 89876, 1.1117},
		{2000, 275.15, 79501, 1.0066},
		{3000, 268.66, 70121, 0.90925},
		{4000, 262.17, 61660, 0.81935},
	} {
		T, p, rho, err := StandardAtmosphere(c.z)
		if err != nil {
			t.Fatalf("z = %g m: %v", c.z, err)
		}
		if relErr(T, c.T) > 2e-5 || relErr(p, c.p) > 1e-4 || relErr(rho, c.rho) > 1e-4 {
			t.Errorf("z = %g m: T %.6g p %.6g rho %.6g, want %g %g %g", c.z, T, p, rho, c.T, c.p, c.rho)
		}
	}
	// Taking 2000 m as geopotential instead gives 79 495 Pa and 1.0065
	// kg/m³ (hand, same constants).
	_, p, rho, _ := StandardAtmosphere(Geometric(2000))
	if relErr(p, 79495) > 1e-4 || relErr(rho, 1.0065) > 1e-4 {
		t.Errorf("H = 2000 m': p %.6g rho %.6g, want 79495 1.0065", p, rho)
	}
}

func TestStandardAtmosphereLayers(t *testing.T) {
	// Layer base values of the U.S. Standard Atmosphere 1976 at geopotential
	// 11, 20 and 32 km, as quoted from the standard by secondary tables:
	// 216.65 K and 22 632 Pa, 216.65 K and 5 474.89 Pa, 228.65 K and 868.02
	// Pa. The tolerance is half a unit in the last quoted digit.
	for _, c := range []struct{ H, T, p, tol float64 }{
		{11000, 216.65, 22632, 0.5 / 22632},
		{20000, 216.65, 5474.89, 0.005 / 5474.89},
		{32000, 228.65, 868.02, 0.005 / 868.02},
	} {
		T, p, _, err := StandardAtmosphere(Geometric(c.H))
		if err != nil {
			t.Fatalf("H = %g m': %v", c.H, err)
		}
		if relErr(T, c.T) > 1e-9 || relErr(p, c.p) > c.tol {
			t.Errorf("H = %g m': T %.6g p %.7g, want %g %g", c.H, T, p, c.T, c.p)
		}
	}
	// Third layer: +1.0 K/km above 20 km', so 30 km' is 226.65 K (hand).
	if T, _, _, _ := StandardAtmosphere(Geometric(30000)); relErr(T, 226.65) > 1e-9 {
		t.Errorf("H = 30 km': T = %.8g, want 226.65", T)
	}
}

func TestStandardAtmosphereRange(t *testing.T) {
	for _, z := range []float64{MinAltitude - 1, MaxAltitude + 1} {
		if _, _, _, err := StandardAtmosphere(z); !errors.Is(err, ErrAltitude) {
			t.Errorf("z = %g m: err = %v, want ErrAltitude", z, err)
		}
	}
	for _, z := range []float64{MinAltitude, MaxAltitude} {
		if _, _, _, err := StandardAtmosphere(z); err != nil {
			t.Errorf("z = %g m: %v", z, err)
		}
	}
}

func TestPressureAltitude(t *testing.T) {
	// Round trip through each layer, including the layer boundaries.
	for _, z := range []float64{MinAltitude, 0, 2000, Geometric(11000), 15000, Geometric(20000), 25000, MaxAltitude} {
		_, p, _, err := StandardAtmosphere(z)
		if err != nil {
			t.Fatal(err)
		}
		got, err := PressureAltitude(p)
		if err != nil {
			t.Fatalf("p = %g Pa: %v", p, err)
		}
		if d := got - z; d > 1e-6 || d < -1e-6 {
			t.Errorf("z = %g m: pressure altitude %.9g m", z, got)
		}
	}
	for _, p := range []float64{500, 120e3} {
		if _, err := PressureAltitude(p); !errors.Is(err, ErrAltitude) {
			t.Errorf("p = %g Pa: err = %v, want ErrAltitude", p, err)
		}
	}
}
