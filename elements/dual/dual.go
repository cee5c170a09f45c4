// Package dual implements forward-mode automatic differentiation with dual
// numbers of one direction.
//
// A Num carries a value V and the derivative D of that value along one seed
// direction. Elements whose heat flow goes through correlations (Reynolds,
// Nusselt and Rayleigh numbers, air properties at a film or bulk temperature)
// evaluate those correlations on Nums, once per node temperature they depend
// on, and so stamp exact Jacobian entries without hand-written derivatives.
//
// Branches inside a correlation (regime selection, clamping) are taken on the
// value; the derivative is that of the branch taken.
package dual

import "math"

// Num is a value with its derivative along one seed direction.
type Num struct {
	V float64 // value
	D float64 // derivative along the seed direction
}

// C returns a constant: a value whose derivative is zero.
func C(v float64) Num { return Num{V: v} }

// Var returns an independent variable: a value whose derivative is one.
func Var(v float64) Num { return Num{V: v, D: 1} }

// Add returns a + b.
func (a Num) Add(b Num) Num { return Num{a.V + b.V, a.D + b.D} }

// Sub returns a - b.
func (a Num) Sub(b Num) Num { return Num{a.V - b.V, a.D - b.D} }

// Mul returns a * b.
func (a Num) Mul(b Num) Num { return Num{a.V * b.V, a.D*b.V + a.V*b.D} }

// Div returns a / b.
func (a Num) Div(b Num) Num {
	q := a.V / b.V
	return Num{q, (a.D - q*b.D) / b.V}
}

// Neg returns -a.
func (a Num) Neg() Num { return Num{-a.V, -a.D} }

// AddC returns a + c for a constant c.
func (a Num) AddC(c float64) Num { return Num{a.V + c, a.D} }

// Scale returns c * a for a constant c.
func (a Num) Scale(c float64) Num { return Num{c * a.V, c * a.D} }

// Inv returns 1 / a.
func (a Num) Inv() Num {
	q := 1 / a.V
	return Num{q, -a.D * q * q}
}

// Sqrt returns the square root of a.
func Sqrt(a Num) Num {
	s := math.Sqrt(a.V)
	return Num{s, a.D / (2 * s)}
}

// Pow returns a raised to the constant power p.
func Pow(a Num, p float64) Num {
	switch p {
	case 0:
		return C(1)
	case 1:
		return a
	case 2:
		return a.Mul(a)
	case 0.5:
		return Sqrt(a)
	}
	var v float64
	switch p {
	case 1.5: // Sutherland's law: T^1.5
		v = a.V * math.Sqrt(a.V)
	case 0.25: // laminar natural convection: Ra^¼
		v = math.Sqrt(math.Sqrt(a.V))
	case 1.0 / 3: // turbulent natural convection: Ra^⅓
		v = math.Cbrt(a.V)
	default:
		v = math.Pow(a.V, p)
	}
	if a.D == 0 {
		return Num{V: v}
	}
	if a.V != 0 {
		// d(a^p) = p·a^p/a·da: one power, not two (these sit in the
		// correlations evaluated at every cell of a meshed face).
		return Num{v, p * v / a.V * a.D}
	}
	return Num{v, p * math.Pow(a.V, p-1) * a.D}
}

// PowN returns a raised to the power b, both carrying derivatives. a must be
// positive.
func PowN(a, b Num) Num {
	v := math.Pow(a.V, b.V)
	return Num{v, v * (b.D*math.Log(a.V) + b.V*a.D/a.V)}
}

// Exp returns e raised to a.
func Exp(a Num) Num {
	e := math.Exp(a.V)
	return Num{e, e * a.D}
}

// Log returns the natural logarithm of a.
func Log(a Num) Num { return Num{math.Log(a.V), a.D / a.V} }

// Log10 returns the decimal logarithm of a.
func Log10(a Num) Num { return Num{math.Log10(a.V), a.D / (a.V * math.Ln10)} }

// Tanh returns the hyperbolic tangent of a.
func Tanh(a Num) Num {
	t := math.Tanh(a.V)
	return Num{t, (1 - t*t) * a.D}
}

// Cosh returns the hyperbolic cosine of a.
func Cosh(a Num) Num { return Num{math.Cosh(a.V), math.Sinh(a.V) * a.D} }

// Sinh returns the hyperbolic sine of a.
func Sinh(a Num) Num { return Num{math.Sinh(a.V), math.Cosh(a.V) * a.D} }

// Atan returns the arctangent of a.
func Atan(a Num) Num { return Num{math.Atan(a.V), a.D / (1 + a.V*a.V)} }

// Abs returns |a|; at zero the derivative of the positive branch is used.
func Abs(a Num) Num {
	if a.V < 0 {
		return a.Neg()
	}
	return a
}

// Max returns the operand with the larger value.
func Max(a, b Num) Num {
	if b.V > a.V {
		return b
	}
	return a
}

// Min returns the operand with the smaller value.
func Min(a, b Num) Num {
	if b.V < a.V {
		return b
	}
	return a
}

// Expm1 returns e^a - 1, accurate for small a.
func Expm1(a Num) Num { return Num{math.Expm1(a.V), math.Exp(a.V) * a.D} }

// OneMinusExpNeg returns 1 - e^(-a), accurate for small a. It is the
// effectiveness of a channel at a number of transfer units a.
func OneMinusExpNeg(a Num) Num { return Num{-math.Expm1(-a.V), math.Exp(-a.V) * a.D} }
