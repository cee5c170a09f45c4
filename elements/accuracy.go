package elements

// Uncertain is implemented by elements whose heat transfer coefficient
// comes from a correlation with a published accuracy: a natural-convection
// surface, a flat plate in a draught, a channel. The accuracy bands of
// results follow from it (package study propagates them to first order
// through the adjoint sensitivities).
type Uncertain interface {
	Element
	// Accuracy returns the correlation's relative accuracy as a ± fraction
	// of its coefficient (0.1 for ±10 %), and where that figure comes
	// from, at s.
	Accuracy(s *State) (float64, string)
	// ScaledBy returns a copy of the element with its coefficient
	// multiplied by k.
	ScaledBy(k float64) Element
}

// slopeStep is the relative change of a coefficient in CoefficientSlope's
// central difference: the flows are smooth in h, so the truncation error
// (order step²) and the round-off (order 1e-16/step of the flows) are both
// far below the accuracies the slopes are multiplied by.
const slopeStep = 1e-5

// CoefficientSlope adds to l.R, for each of u's rows, the derivative of
// its flow with respect to the logarithm of its coefficient, ∂R/∂ln h, at
// s (how much the flows change when h is off by a fraction): the central
// difference (R(h·(1+δ)) − R(h·(1−δ)))/(2δ).
func CoefficientSlope(u Uncertain, s *State, l *Local) {
	up, down := u.ScaledBy(1+slopeStep), u.ScaledBy(1-slopeStep)
	n := len(l.R)
	lu := NewLocal(n, len(up.Vars()), false)
	ld := NewLocal(n, len(down.Vars()), false)
	up.Eval(s, lu)
	down.Eval(s, ld)
	for i := range l.R {
		l.R[i] += (lu.R[i] - ld.R[i]) / (2 * slopeStep)
	}
}

// ScaleCoefficient returns a copy of e with its correlation's coefficient
// multiplied by k, for what-if studies and for checking accuracy bands by
// solving again; ok is false when e has no such coefficient.
func ScaleCoefficient(e Element, k float64) (scaled Element, ok bool) {
	if u, is := e.(Uncertain); is {
		return u.ScaledBy(k), true
	}
	return e, false
}
