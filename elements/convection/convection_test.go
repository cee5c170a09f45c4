package convection

import (
	"math"
	"testing"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// relErr returns |got − want|/|want|.
func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// checkSeed compares f(Var(0)).D with a central finite difference of
// f(C(s)).V about s = 0. Callers build the inputs of a correlation as
// x0·(1 + c·s), so the step is relative. The tolerance is relative 1e-6 of
// the larger of the derivative and the value.
func checkSeed(t *testing.T, name string, f func(s dual.Num) dual.Num) {
	t.Helper()
	const h = 1e-5
	got := f(dual.Var(0))
	fd := (f(dual.C(h)).V - f(dual.C(-h)).V) / (2 * h)
	scale := math.Max(math.Abs(fd), math.Abs(got.V))
	if math.Abs(got.D-fd) > 1e-6*scale {
		t.Errorf("%s: derivative %.10g, finite difference %.10g", name, got.D, fd)
	}
}

// along returns x0·(1 + c·s).
func along(s dual.Num, x0, c float64) dual.Num { return s.Scale(c * x0).AddC(x0) }

// checkTwo runs checkSeed on f(Ra-like, Pr) along the first input, the
// second input, and both at once.
func checkTwo(t *testing.T, name string, f func(a, b dual.Num) dual.Num, a0, b0 float64) {
	t.Helper()
	for _, dir := range [][2]float64{{1, 0}, {0, 1}, {1, -0.7}} {
		checkSeed(t, name, func(s dual.Num) dual.Num {
			return f(along(s, a0, dir[0]), along(s, b0, dir[1]))
		})
	}
}

// checkOne runs checkSeed on f along its input.
func checkOne(t *testing.T, name string, f func(dual.Num) dual.Num, x0 float64) {
	t.Helper()
	checkSeed(t, name, func(s dual.Num) dual.Num { return f(along(s, x0, 1)) })
}

func TestChurchillChu(t *testing.T) {
	// Hand values from the Churchill & Chu (1975) equations, Pr = 0.71.
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"full, Ra 1e6", ChurchillChu(dual.C(1e6), dual.C(0.71)).V, 16.56},
		{"laminar, Ra 1e6", ChurchillChuLaminar(dual.C(1e6), dual.C(0.71)).V, 16.94},
		{"full, Ra 1e9", ChurchillChu(dual.C(1e9), dual.C(0.71)).V, 122.9},
		{"laminar, Ra 1e9", ChurchillChuLaminar(dual.C(1e9), dual.C(0.71)).V, 92.13},
	} {
		if relErr(c.got, c.want) > 1e-3 {
			t.Errorf("%s: Nu = %.5g, want %.5g", c.name, c.got, c.want)
		}
	}
	for _, Ra := range []float64{1, 1e4, 1e6, 1e9, 1e12} {
		checkTwo(t, "ChurchillChu", ChurchillChu, Ra, 0.71)
		checkTwo(t, "ChurchillChuLaminar", ChurchillChuLaminar, Ra, 0.71)
	}
}

func TestZeroRayleigh(t *testing.T) {
	// Ra = 0 with a nonzero seed (ΔT = 0 in a Newton iterate): finite
	// limits (0.825² and 0.68 from the formulas) and zero slope, no NaN.
	ra := dual.Num{V: 0, D: 3}
	pr := dual.C(0.71)
	for _, c := range []struct {
		name string
		got  dual.Num
		want float64
	}{
		{"ChurchillChu", ChurchillChu(ra, pr), 0.825 * 0.825},
		{"ChurchillChuLaminar", ChurchillChuLaminar(ra, pr), 0.68},
		{"HorizontalUp", HorizontalUp(ra), 0},
		{"HorizontalDown", HorizontalDown(ra), 0},
		{"FlatPlate", FlatPlate(ra, pr), 0},
	} {
		if math.Abs(c.got.V-c.want) > 1e-15 || c.got.D != 0 {
			t.Errorf("%s at Ra = 0: %+v, want {%g 0}", c.name, c.got, c.want)
		}
	}
	if got := BarCohenSymmetric(ra); got.V != 0 || relErr(got.D, 3.0/24) > 1e-12 {
		t.Errorf("BarCohenSymmetric at El = 0: %+v, want {0 %g}", got, 3.0/24)
	}
	if got := Elenbaas(ra); got.V != 0 || relErr(got.D, 3.0/24) > 1e-12 {
		t.Errorf("Elenbaas at El = 0: %+v, want {0 %g}", got, 3.0/24)
	}
}

func TestTiltedRa(t *testing.T) {
	// g cos θ: vertical plate unchanged, 60° from vertical halves Ra.
	if got := TiltedRa(dual.C(1e6), 0).V; got != 1e6 {
		t.Errorf("theta 0: %g", got)
	}
	if got := TiltedRa(dual.C(1e6), math.Pi/3).V; relErr(got, 5e5) > 1e-12 {
		t.Errorf("theta 60 deg: %g, want 5e5", got)
	}
	if w := TiltAngle.Check(math.Pi / 2); w == "" {
		t.Error("90 deg from vertical should be outside TiltAngle")
	}
}

func TestHorizontal(t *testing.T) {
	// Hand values: Lloyd & Moran (1974) branches 0.54 Ra^(1/4) and
	// 0.15 Ra^(1/3); Incropera et al. 7th ed. Eq. 9.32, 0.52 Ra^(1/5).
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"up, Ra 1e6 (laminar branch)", HorizontalUp(dual.C(1e6)).V, 17.076},
		{"up, Ra 1e8 (turbulent branch)", HorizontalUp(dual.C(1e8)).V, 69.624},
		{"up, Ra 1e7 (turbulent branch is larger)", HorizontalUp(dual.C(1e7)).V, 32.316},
		{"down, Ra 1e6", HorizontalDown(dual.C(1e6)).V, 8.2414},
		{"L = A/P, 0.2 x 0.1 m", HorizontalLength(0.02, 0.6), 1.0 / 30},
	} {
		if relErr(c.got, c.want) > 1e-4 {
			t.Errorf("%s: %.6g, want %.6g", c.name, c.got, c.want)
		}
	}
	// Continuity at the crossing Ra = 3.6^12.
	cross := math.Pow(3.6, 12)
	lo, hi := HorizontalUp(dual.C(cross*(1-1e-9))).V, HorizontalUp(dual.C(cross*(1+1e-9))).V
	if relErr(lo, hi) > 1e-8 {
		t.Errorf("HorizontalUp jumps at %g: %g to %g", cross, lo, hi)
	}
	for _, Ra := range []float64{2e4, 1e6, 1e8, 1e10} {
		checkOne(t, "HorizontalUp", HorizontalUp, Ra)
		checkOne(t, "HorizontalDown", HorizontalDown, Ra)
	}
}

func TestChannel(t *testing.T) {
	// El = 2.714⁴ = 54.25: Bar-Cohen & Rohsenow symmetric Nu_S = 1.307,
	// Elenbaas 1.294 (hand, from the two formulas).
	el := dual.C(math.Pow(2.714, 4))
	if got := BarCohenSymmetric(el).V; relErr(got, 1.307) > 1e-3 {
		t.Errorf("BarCohenSymmetric(54.25) = %.5g, want 1.307", got)
	}
	if got := Elenbaas(el).V; relErr(got, 1.294) > 1e-3 {
		t.Errorf("Elenbaas(54.25) = %.5g, want 1.294", got)
	}
	// Limits the composite relations are built from: fully developed
	// El/24 (symmetric) and El/12 (one wall adiabatic) at small El; the
	// isolated plate 2.873^(−1/2) El^(1/4) = 0.590 El^(1/4) at large El.
	small, large := 1e-4, 1e10
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"symmetric, small El", BarCohenSymmetric(dual.C(small)).V, small / 24},
		{"asymmetric, small El", BarCohenAsymmetric(dual.C(small)).V, small / 12},
		{"Elenbaas, small El", Elenbaas(dual.C(small)).V, small / 24},
		{"symmetric, large El", BarCohenSymmetric(dual.C(large)).V, math.Pow(large, 0.25) / math.Sqrt(2.873)},
		{"asymmetric, large El", BarCohenAsymmetric(dual.C(large)).V, math.Pow(large, 0.25) / math.Sqrt(2.873)},
	} {
		if relErr(c.got, c.want) > 1e-5 {
			t.Errorf("%s: %.8g, want %.8g", c.name, c.got, c.want)
		}
	}
	for _, El := range []float64{0.1, 10, 54.25, 1e3, 1e5} {
		checkOne(t, "BarCohenSymmetric", BarCohenSymmetric, El)
		checkOne(t, "BarCohenAsymmetric", BarCohenAsymmetric, El)
		checkOne(t, "Elenbaas", Elenbaas, El)
	}
}

func TestOptimumSpacing(t *testing.T) {
	// Air at 300 K, 1 atm (ν 1.569e-5, α 2.220e-5 m²/s, β = 1/300 K, k
	// 0.0263 W/(m K), Incropera Table A.4 and ideal gas), L = 0.1 m,
	// ΔT = 30 K: Ra_L = 2.816e6, S_opt = 6.63 mm, h = 5.19 W/(m² K) (hand,
	// Bar-Cohen & Rohsenow 1984).
	const L, nu, alpha, k = 0.1, 1.569e-5, 2.220e-5, 0.0263
	ra := Rayleigh(dual.C(1.0/300), dual.C(30), L, dual.C(nu), dual.C(alpha))
	if relErr(ra.V, 2.816e6) > 1e-3 {
		t.Errorf("Ra_L = %.5g, want 2.816e6", ra.V)
	}
	s := OptimumSpacing(L, ra).V
	if relErr(s, 6.63e-3) > 1e-3 {
		t.Errorf("S_opt = %.5g m, want 6.63e-3", s)
	}
	el := ra.Scale(math.Pow(s/L, 4))
	if h := BarCohenSymmetric(el).V * k / s; relErr(h, 5.19) > 1e-3 {
		t.Errorf("h at S_opt = %.4g, want 5.19", h)
	}
	// S_opt must maximise the heat per unit base width, which for thin
	// plates is proportional to h/S ∝ Nu_S/S².
	perWidth := func(S float64) float64 {
		return BarCohenSymmetric(ra.Scale(math.Pow(S/L, 4))).V / (S * S)
	}
	for _, f := range []float64{0.98, 1.02} {
		if perWidth(s*f) >= perWidth(s) {
			t.Errorf("spacing %.3g x S_opt dissipates more than S_opt", f)
		}
	}
	checkOne(t, "OptimumSpacing", func(ra dual.Num) dual.Num { return OptimumSpacing(L, ra) }, 2.8e6)
}

func TestRayleighDerivative(t *testing.T) {
	// Seeds on β, ΔT, ν and α together; ΔT negative checks the magnitude.
	for _, dT := range []float64{30, -12} {
		checkSeed(t, "Rayleigh", func(s dual.Num) dual.Num {
			return Rayleigh(along(s, 1.0/320, -0.3), along(s, dT, 1), 0.05, along(s, 1.7e-5, 0.8), along(s, 2.4e-5, 0.9))
		})
	}
	if ra := Rayleigh(dual.C(1.0/300), dual.C(-30), 0.1, dual.C(1.569e-5), dual.C(2.220e-5)); ra.V <= 0 {
		t.Errorf("Rayleigh with negative ΔT = %g, want positive", ra.V)
	}
}

func TestFlatPlate(t *testing.T) {
	// Hand values, Incropera et al. ch. 7: laminar 0.664 Re^½ Pr^⅓ (Eq.
	// 7.30), mixed (0.037 Re^0.8 − 871) Pr^⅓ (Eq. 7.38), tripped turbulent
	// 0.037 Re^0.8 Pr^⅓; Pr = 0.7.
	pr := dual.C(0.7)
	for _, c := range []struct {
		name           string
		got, want, tol float64
	}{
		{"laminar, Re 1e5", FlatPlate(dual.C(1e5), pr).V, 186.44, 1e-4},
		// 871.3 here against the rounded 871: 2e-4 apart at Re = 1e6.
		{"mixed, Re 1e6", FlatPlate(dual.C(1e6), pr).V, 1299.5, 1e-3},
		{"turbulent, Re 1e6", FlatPlateTurbulent(dual.C(1e6), pr).V, 2072.8, 1e-4},
	} {
		if relErr(c.got, c.want) > c.tol {
			t.Errorf("%s: Nu = %.6g, want %.6g", c.name, c.got, c.want)
		}
	}
	// Continuity at Re_c: exact with the computed A; with Incropera's
	// rounded 871 the mixed form is within 0.1 % of the laminar one.
	lam := FlatPlateLaminar(dual.C(CriticalRe), pr).V
	if mix := FlatPlateMixed(dual.C(CriticalRe), pr).V; relErr(mix, lam) > 1e-12 {
		t.Errorf("at Re_c: mixed %.10g, laminar %.10g", mix, lam)
	}
	if rounded := (0.037*math.Pow(CriticalRe, 0.8) - 871) * math.Cbrt(0.7); relErr(rounded, lam) > 1e-3 {
		t.Errorf("at Re_c with A = 871: %.6g, laminar %.6g", rounded, lam)
	}
	for _, Re := range []float64{1e3, 1e5, 4.9e5, 6e5, 1e7} {
		checkTwo(t, "FlatPlate", FlatPlate, Re, 0.7)
		checkTwo(t, "FlatPlateTurbulent", FlatPlateTurbulent, Re, 0.7)
	}
}

func TestFinEfficiency(t *testing.T) {
	// k = 200 W/(m K), h = 25 W/(m² K), t = 1.5 mm, L = 30 mm: m L_c =
	// 0.3970, η_f = 0.9506 (hand, tanh(m L_c)/(m L_c), Incropera ch. 3).
	const k, th, L = 200, 1.5e-3, 30e-3
	if got := FinEfficiency(dual.C(25), k, th, L).V; relErr(got, 0.9506) > 1e-4 {
		t.Errorf("eta_f = %.5g, want 0.9506", got)
	}
	// Limits: η_f → 1 as h → 0 and → 1/(m L_c) for a long fin (here
	// m L_c = 7.9 and tanh(m L_c) = 1 − 3e-7).
	if got := FinEfficiency(dual.C(0), k, th, L); got.V != 1 {
		t.Errorf("eta_f at h = 0: %g, want 1", got.V)
	}
	hLong := 1e4
	mLc := math.Sqrt(2*hLong/(k*th)) * (L + th/2)
	if got := FinEfficiency(dual.C(hLong), k, th, L).V; relErr(got, 1/mLc) > 1e-6 {
		t.Errorf("long fin: %.8g, want %.8g", got, 1/mLc)
	}
	// Both sides of the series switch at (m L_c)² = 1e-6 agree in value
	// and slope.
	hSwitch := 1e-6 * k * th / (2 * (L + th/2) * (L + th/2))
	a, b := FinEfficiency(dual.Var(hSwitch*(1-1e-9)), k, th, L), FinEfficiency(dual.Var(hSwitch*(1+1e-9)), k, th, L)
	if math.Abs(a.V-b.V) > 1e-14 || relErr(a.D, b.D) > 1e-6 {
		t.Errorf("series switch: %+v vs %+v", a, b)
	}
	for _, h := range []float64{hSwitch / 2, hSwitch * 2, 5, 25, 200, 1e4} {
		checkOne(t, "FinEfficiency", func(h dual.Num) dual.Num { return FinEfficiency(h, k, th, L) }, h)
	}
}

func TestOverallEfficiency(t *testing.T) {
	// η_o = 1 − (A_f/A_t)(1 − η_f), hand: A_f/A_t = 0.9, η_f = 0.9506.
	if got := OverallEfficiency(dual.C(0.9506), 0.9, 1).V; relErr(got, 0.95554) > 1e-9 {
		t.Errorf("eta_o = %.8g, want 0.95554", got)
	}
	checkOne(t, "OverallEfficiency", func(e dual.Num) dual.Num { return OverallEfficiency(e, 0.45, 0.5) }, 0.8)
}
