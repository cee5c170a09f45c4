package duct

import "github.com/heatgraph/heatgraph/elements/dual"

// Segment returns Flow for the stretch from upstream to upstream + d.Length
// of a duct whose flow develops from its entry at 0: one part of a channel
// split along the flow. The mean Nusselt number and friction factor of the
// stretch follow from h̄·L = ∫h dx (and likewise for the wall shear),
//
//	Nu_seg = [(x₀ + L)·Nu_m(x₀ + L) − x₀·Nu_m(x₀)]/L,
//
// bounded below by the fully developed values Result.NuDeveloped and
// FDeveloped: the local coefficient of a uniform-temperature wall falls
// towards the fully developed one and never below it, so neither can a
// mean over any stretch. Fitted mean-Nu correlations do not all honour that
// far downstream (Muzychka & Yovanovich's blend approaches the fully
// developed value from above, so its implied local value ends up just below
// it), which the bound corrects. With upstream ≤ 0, no flow or
// o.Developed, Segment is Flow.
func Segment(d Duct, upstream float64, re, pr dual.Num, o Options) Result {
	if upstream <= 0 || o.Developed || !(re.V > 0) || !(pr.V > 0) {
		return Flow(d, re, pr, o)
	}
	l, x0 := d.Length, upstream
	o.wantDeveloped = true
	d.Length = x0 + l
	whole := Flow(d, re, pr, o)
	d.Length = x0
	before := Flow(d, re, pr, o)
	seg := whole
	seg.Nu = atLeast(whole.Nu.Scale(x0+l).Sub(before.Nu.Scale(x0)).Scale(1/l), whole.NuDeveloped)
	seg.F = atLeast(whole.F.Scale(x0+l).Sub(before.F.Scale(x0)).Scale(1/l), whole.FDeveloped)
	return seg
}

// atLeast returns a, or b when a is below it.
func atLeast(a, b dual.Num) dual.Num {
	if a.V < b.V {
		return b
	}
	return a
}
