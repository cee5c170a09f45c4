package elements

import (
	"fmt"

	"github.com/heatgraph/heatgraph/elements/dual"
)

// TableLoss is a part whose pressure drop was measured against the volume
// flow through it, as filter and screen makers publish it: a table of
// (Q_i, Δp_i) read through a monotone cubic (MonotoneCurve, Fritsch &
// Carlson 1980) from (0, 0), with Q = ṁ/ρ at the mean density of the
// branch's ends. Reverse flow takes the same drop the other way
// (Δp(−Q) = −Δp(Q)); its slope at zero is the first segment's, so no
// smoothing is needed. Beyond the last point the drop is continued along
// the end slope, with a warning.
type TableLoss struct {
	Curve MonotoneCurve
}

// NewTableLoss fits the table; flows must increase and drops must be
// positive and must not fall as the flow grows.
func NewTableLoss(q, dp []float64) (*TableLoss, error) {
	if len(q) == 0 || len(q) != len(dp) {
		return nil, fmt.Errorf("a pressure-drop table needs at least one (flow, pressure drop) point")
	}
	x, y := []float64{0}, []float64{0}
	for i := range q {
		if !(q[i] > 0) || !(dp[i] > 0) {
			return nil, fmt.Errorf("point %d: flow and pressure drop must be positive (got %g m³/s, %g Pa)", i+1, q[i], dp[i])
		}
		if dp[i] < y[len(y)-1] {
			return nil, fmt.Errorf("point %d: the pressure drop falls as the flow grows (%g Pa after %g Pa); a passive part's drop rises with its flow", i+1, dp[i], y[len(y)-1])
		}
		x, y = append(x, q[i]), append(y, dp[i])
	}
	c, err := NewMonotoneCurve(x, y)
	if err != nil {
		return nil, err
	}
	return &TableLoss{Curve: c}, nil
}

// drop returns the odd extension of the table at Q.
func (t *TableLoss) drop(q dual.Num) dual.Num {
	if q.V < 0 {
		return t.Curve.At(q.Neg()).Neg()
	}
	return t.Curve.At(q)
}

// Rise returns −Δp(Q).
func (t *TableLoss) Rise(m, tFrom, tTo dual.Num, p float64) dual.Num {
	return t.drop(m.Div(MeanDensity(tFrom, tTo, p))).Neg()
}

// StartFlow is the flow of the table's middle point.
func (t *TableLoss) StartFlow(rho float64) float64 { return rho * t.Curve.X[len(t.Curve.X)/2] }

// LawReport gives the volume flow and warns beyond the table.
func (t *TableLoss) LawReport(m, tFrom, tTo, p float64) Report {
	q := m / MeanDensity(dual.C(tFrom), dual.C(tTo), p).V
	rep := Report{Details: []Detail{{Name: "table_flow", Value: q, Unit: "m3/s"}}}
	if last := t.Curve.X[len(t.Curve.X)-1]; abs(q) > last {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf("flow %.4g m³/s is beyond the last point of the pressure-drop table (%.4g m³/s): the drop is extrapolated", abs(q), last))
	}
	return rep
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
