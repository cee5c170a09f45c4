package elements

import (
	"math"
	"testing"
)

// A reference case computed by hand from the closed form of Lee et al.
// (1995): a 20 × 20 mm source on a 100 × 100
// mm plate, 5 mm thick, k = 200 W/(m K), R₀ = 0.5 K/W: ε = 0.2000,
// τ = 0.08862, Bi = 0.05642, λ = 5.963, Φ = 2.035, ψ_max = 0.9285,
// R_max = 0.2321 K/W, R_avg = 0.1845 K/W (both include t/(kA_p)).
func TestSpreadingReferenceCase(t *testing.T) {
	p := SpreadingPlate{SourceArea: 4e-4, PlateArea: 1e-2, Thickness: 5e-3, Conductivity: 200, SinkResistance: 0.5}
	avg, err := Spreading(p)
	if err != nil {
		t.Fatal(err)
	}
	p.Maximum = true
	mx, _ := Spreading(p)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"epsilon", avg.Epsilon, 0.2000}, {"tau", avg.Tau, 0.08862}, {"Bi", avg.Bi, 0.05642},
		{"lambda", avg.Lambda, 5.963}, {"Phi", avg.Phi, 2.035}, {"psi_max", mx.Psi, 0.9285},
		{"R_max", mx.R, 0.2321}, {"R_avg", avg.R, 0.1845},
	} {
		if math.Abs(c.got-c.want) > 1e-3*c.want {
			t.Errorf("%s = %.5g, want %.5g", c.name, c.got, c.want)
		}
	}
}

// A source covering the whole plate meets only the one-dimensional
// resistance t/(k·A) (Fourier's law), whatever the cooling.
func TestSpreadingFullCoverage(t *testing.T) {
	for _, r0 := range []float64{0.01, 1, 100} {
		p := SpreadingPlate{SourceArea: 1e-2, PlateArea: 1e-2, Thickness: 3e-3, Conductivity: 150, SinkResistance: r0}
		r, err := Spreading(p)
		if err != nil {
			t.Fatal(err)
		}
		if want := 3e-3 / (150 * 1e-2); math.Abs(r.R-want) > 1e-12*want {
			t.Errorf("R0 = %g: R = %.12g, want t/(kA) = %.12g", r0, r.R, want)
		}
	}
}

// Spreading grows as the source shrinks and as the plate conducts worse,
// and the source's centre is always hotter than its mean.
func TestSpreadingTrends(t *testing.T) {
	base := SpreadingPlate{SourceArea: 4e-4, PlateArea: 1e-2, Thickness: 2e-3, Conductivity: 200, SinkResistance: 0.5}
	r0, _ := Spreading(base)
	small := base
	small.SourceArea = 1e-4
	r1, _ := Spreading(small)
	poor := base
	poor.Conductivity = 20
	r2, _ := Spreading(poor)
	peak := base
	peak.Maximum = true
	r3, _ := Spreading(peak)
	if !(r1.R > r0.R && r2.R > r0.R && r3.R > r0.R) {
		t.Errorf("R %g; smaller source %g, poorer plate %g, centre %g", r0.R, r1.R, r2.R, r3.R)
	}
	if _, err := Spreading(SpreadingPlate{SourceArea: 2e-2, PlateArea: 1e-2, Thickness: 1e-3, Conductivity: 1, SinkResistance: 1}); err == nil {
		t.Error("a source larger than its plate must be refused")
	}
}

func TestSpreadJacobian(t *testing.T) {
	s, err := NewSpread(0, 1, SpreadingPlate{SourceArea: 4e-4, PlateArea: 1e-2, Thickness: 5e-3, Conductivity: 200, SinkResistance: 0.5})
	if err != nil {
		t.Fatal(err)
	}
	checkJacobian(t, "spreading", s, []float64{340, 310}, 1e-8)
	checkConserves(t, "spreading", s, []float64{340, 310})
}

// The closed form stays within 10 % (a well-cooled plate here is 8 % off)
// of the exact series solution
// for an isoflux disk centred on a disk with an adiabatic rim and a cooled
// back (the separation-of-variables solution, as in Lee et al. 1995 and
// Yovanovich's papers), computed here from Go's Bessel functions.
func TestSpreadingAgainstSeries(t *testing.T) {
	zeros := besselJ1Zeros(16000)
	series := func(p SpreadingPlate) (avg, mx float64) {
		a := math.Sqrt(p.SourceArea / math.Pi)
		b := math.Sqrt(p.PlateArea / math.Pi)
		eps, tau := a/b, p.Thickness/b
		bi := 1 / (math.Pi * p.Conductivity * b * p.SinkResistance)
		sa, sm := 0.0, 0.0
		for _, d := range zeros {
			th := math.Tanh(d * tau)
			phi := (th + d/bi) / (1 + (d/bi)*th)
			j0 := math.J0(d)
			j1e := math.J1(d * eps)
			sa += j1e * j1e * phi / (d * d * d * j0 * j0)
			sm += j1e * phi / (d * d * j0 * j0)
		}
		base := eps * tau / math.Sqrt(math.Pi)
		psiAvg := base + 4/(math.Sqrt(math.Pi)*eps)*sa
		psiMax := base + 2/math.Sqrt(math.Pi)*sm
		k := math.Sqrt(math.Pi) * p.Conductivity * a
		return psiAvg / k, psiMax / k
	}
	cases := []SpreadingPlate{
		{SourceArea: 4e-4, PlateArea: 1e-2, Thickness: 5e-3, Conductivity: 200, SinkResistance: 0.5},
		{SourceArea: 1e-4, PlateArea: 4e-3, Thickness: 2e-3, Conductivity: 390, SinkResistance: 0.2},
		{SourceArea: 2.5e-3, PlateArea: 1e-2, Thickness: 10e-3, Conductivity: 150, SinkResistance: 1},
		{SourceArea: 9e-4, PlateArea: 2.5e-2, Thickness: 3e-3, Conductivity: 200, SinkResistance: 0.05},
	}
	for i, p := range cases {
		avg, mx := series(p)
		closedAvg, _ := Spreading(p)
		p.Maximum = true
		closedMax, _ := Spreading(p)
		if e := math.Abs(closedAvg.Series-avg) / avg; e > 1e-3 {
			t.Errorf("case %d: the element's series (4000 terms) %.6g against 16000 terms %.6g", i, closedAvg.Series, avg)
		}
		if e := math.Abs(closedMax.Series-mx) / mx; e > 1e-3 {
			t.Errorf("case %d: the element's series at the centre %.6g against 16000 terms %.6g", i, closedMax.Series, mx)
		}
		if e := math.Abs(closedAvg.R-avg) / avg; e > 0.10 {
			t.Errorf("case %d: mean R %.4g against the series' %.4g (%.1f %%)", i, closedAvg.R, avg, 100*e)
		}
		if e := math.Abs(closedMax.R-mx) / mx; e > 0.10 {
			t.Errorf("case %d: maximum R %.4g against the series' %.4g (%.1f %%)", i, closedMax.R, mx, 100*e)
		}
		if i == 0 && (math.Abs(avg-0.1950) > 0.002 || math.Abs(mx-0.2346) > 0.003) {
			// The series values for this case, summed by hand with 300
			// terms: R_avg = 0.1950, R_max ≈ 0.2346 K/W.
			t.Errorf("series R_avg %.4g (notes 0.1950), R_max %.4g (notes ≈0.2346)", avg, mx)
		}
	}
}
