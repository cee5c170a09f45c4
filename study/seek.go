package study

import (
	"errors"
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/network"
)

// Slack is the worst margin of a solved point: the least, over the nodes
// with a limit, of the margin (limit − temperature) less the model's
// required margin, K, and the node where it is least. Every limit holds
// with its required margin when it is zero or more.
func (pt *Point) Slack() (float64, string, error) {
	worst, node := math.Inf(1), ""
	for _, n := range pt.Solution.Nodes {
		if !n.HasLimit {
			continue
		}
		if s := n.Margin - pt.Net.Model.RequiredMargin; s < worst {
			worst, node = s, n.ID
		}
	}
	if node == "" {
		return 0, "", errors.New("the model has no limits to seek against (give nodes or components a limit)")
	}
	return worst, node, nil
}

// Outcome says what a seek found over its range.
type Outcome string

// Outcomes of a seek.
const (
	Bounded Outcome = "bounded" // the limits hold on one side of Value and not on the other
	Holds   Outcome = "holds"   // every limit holds over the whole range
	Fails   Outcome = "fails"   // some limit fails at both ends of the range
)

// SeekResult is the value of one parameter at which the worst margin just
// meets the required margin.
type SeekResult struct {
	Param    network.Parameter
	From, To float64 // SI
	Outcome  Outcome
	// Value is the value nearest the boundary at which every limit holds
	// (Bounded), SI; the boundary lies between Value and Value ± Tolerance
	// on the side of Other.
	Value     float64
	Other     float64 // the nearest value found at which a limit fails
	Tolerance float64 // |Other − Value|
	// Highest is set when the limits hold below the boundary (more is
	// worse: an ambient temperature, a power) and clear when they hold
	// above it (less is worse: a fan's flow, a fin's area).
	Highest bool
	// Limiting is the node with the least margin at Value (and, for Holds
	// and Fails, at the end of the range where the margin is least).
	Limiting string
	Slack    float64 // its margin less the required margin at Value, K
	Solves   int
}

// Seek finds the value of the parameter at path, between from and to (SI),
// at which the worst margin of the model (see Point.Slack) is zero, by
// Brent's method (R. P. Brent, Algorithms for Minimization without
// Derivatives, 1973, ch. 4): inverse quadratic interpolation and secant
// steps, falling back to bisection, on a bracket that always holds a sign
// change, to within tol. When the worst margin changes sign more than once
// in the range, one of the crossings is found.
func (m *Model) Seek(path string, from, to, tol float64) (*SeekResult, error) {
	q, err := m.Parameter(path)
	if err != nil {
		return nil, err
	}
	if !(tol > 0) {
		return nil, errors.New("the tolerance must be greater than zero")
	}
	r := &SeekResult{Param: q, From: from, To: to}
	var last string
	g := func(v float64) (float64, error) {
		r.Solves++
		pt, err := m.Solve(q.Overrides(v)...)
		if err != nil {
			return 0, fmt.Errorf("at %s = %s: %w", path, q.Format(v), err)
		}
		s, node, err := pt.Slack()
		last = node
		return s, err
	}
	ga, err := g(from)
	if err != nil {
		return nil, err
	}
	nodeA := last
	gb, err := g(to)
	if err != nil {
		return nil, err
	}
	nodeB := last
	switch {
	case ga >= 0 && gb >= 0:
		r.Outcome = Holds
		r.Value, r.Limiting, r.Slack = from, nodeA, ga
		if gb < ga {
			r.Value, r.Limiting, r.Slack = to, nodeB, gb
		}
		return r, nil
	case ga < 0 && gb < 0:
		r.Outcome = Fails
		r.Value, r.Limiting, r.Slack = from, nodeA, ga
		if gb < ga {
			r.Value, r.Limiting, r.Slack = to, nodeB, gb
		}
		return r, nil
	}
	r.Outcome = Bounded
	ok, bad, err := brent(g, from, to, ga, gb, tol)
	if err != nil {
		return nil, err
	}
	r.Value, r.Other, r.Tolerance = ok, bad, math.Abs(bad-ok)
	r.Highest = (ga >= 0) == (from < to)
	pt, err := m.Solve(q.Overrides(ok)...)
	if err != nil {
		return nil, err
	}
	r.Solves++
	r.Slack, r.Limiting, err = pt.Slack()
	return r, err
}

// brent finds where g changes sign between a and b (g(a) = ga, g(b) = gb
// of opposite signs, zero counting as positive) to within tol; it returns
// the end of the final bracket where g ≥ 0 and the end where g < 0.
// Brent (1973), ch. 4, the procedure zero.
func brent(g func(float64) (float64, error), a, b, fa, fb, tol float64) (ok, bad float64, err error) {
	const eps = 2.220446049250313e-16
	c, fc := a, fa
	d := b - a
	e := d
	for range 200 {
		if (fb >= 0) == (fc >= 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*eps*math.Abs(b) + 0.5*tol
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			break
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			var p, q float64
			s := fb / fa
			if a == c { // secant
				p = 2 * xm * s
				q = 1 - s
			} else { // inverse quadratic interpolation
				qq, r := fa/fc, fb/fc
				p = s * (2*xm*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e, d = d, p/q
			} else {
				d, e = xm, xm
			}
		} else {
			d, e = xm, xm
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if xm > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		if fb, err = g(b); err != nil {
			return 0, 0, err
		}
	}
	if fb >= 0 {
		if fb == 0 {
			return b, b, nil
		}
		return b, c, nil
	}
	return c, b, nil
}
