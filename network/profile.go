package network

import (
	"fmt"
	"math"
	"sort"
)

// Profile is a given quantity that changes with time during a run: a
// power, a fixed temperature, the ambient temperature, an irradiance. A
// steady solve takes its value at t = 0.
type Profile interface {
	// At returns the value at t seconds from the start of the run (SI).
	At(t float64) float64
	// Jumps returns the times in (from, to] where the value jumps, in
	// increasing order: a run steps exactly onto them.
	Jumps(from, to float64) []float64
	// Describe says what the profile is, in a few words.
	Describe() string
	// Range returns the lowest and the highest value the profile takes.
	Range() (lo, hi float64)
}

// StepProfile is Before until At, After from At on.
type StepProfile struct{ Before, After, Time float64 }

// At implements Profile.
func (p *StepProfile) At(t float64) float64 {
	if t >= p.Time {
		return p.After
	}
	return p.Before
}

// Jumps implements Profile.
func (p *StepProfile) Jumps(from, to float64) []float64 { return within([]float64{p.Time}, from, to) }

// Describe implements Profile.
func (p *StepProfile) Describe() string {
	return fmt.Sprintf("step from %g to %g at %g s", p.Before, p.After, p.Time)
}

// PulseProfile is Base, except Peak from Start for Width.
type PulseProfile struct{ Base, Peak, Start, Width float64 }

// At implements Profile.
func (p *PulseProfile) At(t float64) float64 {
	if t >= p.Start && t < p.Start+p.Width {
		return p.Peak
	}
	return p.Base
}

// Jumps implements Profile.
func (p *PulseProfile) Jumps(from, to float64) []float64 {
	return within([]float64{p.Start, p.Start + p.Width}, from, to)
}

// Describe implements Profile.
func (p *PulseProfile) Describe() string {
	return fmt.Sprintf("pulse of %g (else %g) from %g s for %g s", p.Peak, p.Base, p.Start, p.Width)
}

// DutyProfile repeats every Period: On for the fraction Fraction of it,
// then Off; the first period begins at Start (Off before it).
type DutyProfile struct{ Period, Fraction, On, Off, Start float64 }

// At implements Profile.
func (p *DutyProfile) At(t float64) float64 {
	if t < p.Start {
		return p.Off
	}
	k := math.Floor((t - p.Start) / p.Period)
	if t-p.Start-k*p.Period < p.Fraction*p.Period {
		return p.On
	}
	return p.Off
}

// Jumps implements Profile: every period's start and the end of its on
// time, computed as At computes them.
func (p *DutyProfile) Jumps(from, to float64) []float64 {
	var out []float64
	k0 := math.Max(0, math.Floor((from-p.Start)/p.Period))
	for k := k0; ; k++ {
		on := p.Start + k*p.Period
		if on > to {
			break
		}
		out = append(out, on, on+p.Fraction*p.Period)
	}
	return within(out, from, to)
}

// Describe implements Profile.
func (p *DutyProfile) Describe() string {
	return fmt.Sprintf("%g for %g %% of every %g s, else %g", p.On, 100*p.Fraction, p.Period, p.Off)
}

// TableProfile interpolates linearly between (T[i], V[i]); it holds the
// first value before the first time and the last after the last. Two
// points at the same time make a jump.
type TableProfile struct {
	T, V   []float64
	Source string // the file it was read from, "" when inline
}

// At implements Profile.
func (p *TableProfile) At(t float64) float64 {
	n := len(p.T)
	if t < p.T[0] {
		return p.V[0]
	}
	if t >= p.T[n-1] {
		return p.V[n-1]
	}
	// The first point after t; at a jump, t at the jump takes the later
	// value.
	i := sort.Search(n, func(i int) bool { return p.T[i] > t })
	a, b := i-1, i
	if p.T[b] == p.T[a] {
		return p.V[b]
	}
	f := (t - p.T[a]) / (p.T[b] - p.T[a])
	return p.V[a] + f*(p.V[b]-p.V[a])
}

// Jumps implements Profile.
func (p *TableProfile) Jumps(from, to float64) []float64 {
	var out []float64
	for i := 1; i < len(p.T); i++ {
		if p.T[i] == p.T[i-1] {
			out = append(out, p.T[i])
		}
	}
	return within(out, from, to)
}

// Describe implements Profile.
func (p *TableProfile) Describe() string {
	if p.Source != "" {
		return fmt.Sprintf("table of %d points from %s", len(p.T), p.Source)
	}
	return fmt.Sprintf("table of %d points", len(p.T))
}

// RepeatProfile repeats Of every Period: the value at t is Of's at t
// modulo Period. A table repeated returns linearly from its last point to
// its first value at the end of the period.
type RepeatProfile struct {
	Of     Profile
	Period float64
}

// phase returns t modulo the period and the period's start.
func (p *RepeatProfile) phase(t float64) (float64, float64) {
	k := math.Floor(t / p.Period)
	tau := t - k*p.Period
	if tau < 0 { // round-off
		tau = 0
	}
	return tau, k * p.Period
}

// At implements Profile.
func (p *RepeatProfile) At(t float64) float64 {
	tau, _ := p.phase(t)
	if tb, ok := p.Of.(*TableProfile); ok {
		n := len(tb.T)
		if last := tb.T[n-1]; tau > last && last < p.Period {
			f := (tau - last) / (p.Period - last)
			return tb.V[n-1] + f*(tb.At(0)-tb.V[n-1])
		}
	}
	return p.Of.At(tau)
}

// Jumps implements Profile.
func (p *RepeatProfile) Jumps(from, to float64) []float64 {
	base := p.Of.Jumps(-1, p.Period)
	// A jump of the first value at the period's start: the value just
	// before the end of a period against the value at its start.
	if math.Abs(p.At(math.Nextafter(p.Period, 0))-p.Of.At(0)) > 0 {
		base = append(base, 0)
	}
	sort.Float64s(base)
	var out []float64
	k0 := math.Floor(from / p.Period)
	for k := math.Max(k0, 0); k*p.Period <= to; k++ {
		for _, j := range base {
			if j >= 0 && j < p.Period {
				out = append(out, k*p.Period+j)
			}
		}
	}
	return within(out, from, to)
}

// Describe implements Profile.
func (p *RepeatProfile) Describe() string {
	return fmt.Sprintf("%s, repeated every %g s", p.Of.Describe(), p.Period)
}

// within returns the times of ts in (from, to], sorted, without repeats.
func within(ts []float64, from, to float64) []float64 {
	var out []float64
	for _, t := range ts {
		if t > from && t <= to {
			out = append(out, t)
		}
	}
	sort.Float64s(out)
	k := 0
	for i, t := range out {
		if i == 0 || t != out[k-1] {
			out[k] = t
			k++
		}
	}
	return out[:k]
}

// givenProfile is a given variable that follows a profile.
type givenProfile struct {
	v int
	p Profile
}

// setGiven sets the given variables that follow profiles to their values
// at t, in x (every variable).
func (net *Network) setGiven(x []float64, t float64) {
	for _, g := range net.given {
		x[g.v] = g.p.At(t)
	}
}

// Jumps returns the times in (from, to] at which any profile of the
// network jumps, in increasing order.
func (net *Network) Jumps(from, to float64) []float64 {
	var all []float64
	for _, p := range net.profiles {
		all = append(all, p.Jumps(from, to)...)
	}
	return within(all, from, to)
}

// Profiles reports whether anything in the network changes with time.
func (net *Network) Profiles() bool { return len(net.profiles) > 0 }

// profileLowest returns the lowest value a profile takes (the constant c
// when p is nil).
func profileLowest(p Profile, c float64) float64 {
	if p == nil {
		return c
	}
	lo, _ := p.Range()
	return lo
}

// profileHighest returns the highest value a profile takes (the constant
// c when p is nil).
func profileHighest(p Profile, c float64) float64 {
	if p == nil {
		return c
	}
	_, hi := p.Range()
	return hi
}

// Range implements Profile.
func (p *StepProfile) Range() (float64, float64) {
	return min(p.Before, p.After), max(p.Before, p.After)
}

// Range implements Profile.
func (p *PulseProfile) Range() (float64, float64) { return min(p.Base, p.Peak), max(p.Base, p.Peak) }

// Range implements Profile.
func (p *DutyProfile) Range() (float64, float64) { return min(p.On, p.Off), max(p.On, p.Off) }

// Range implements Profile.
func (p *TableProfile) Range() (float64, float64) {
	lo, hi := p.V[0], p.V[0]
	for _, x := range p.V {
		lo, hi = min(lo, x), max(hi, x)
	}
	return lo, hi
}

// Range implements Profile.
func (p *RepeatProfile) Range() (float64, float64) { return p.Of.Range() }
